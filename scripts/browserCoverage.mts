/**
 * Chromium's JS coverage of the bundles, mapped back to the files of src/, and figures per folder.
 *
 * Method: each recorded script (V8 function and block ranges over a bundle served from the
 * development build) is converted by ast-v8-to-istanbul, the converter @vitest/coverage-v8 uses
 * for the unit tests, with the bundle's acorn AST and its webpack source map; the map's
 * `webpack://<name>/./src/...` sources are rewritten to paths in the project first, so the
 * result is keyed like the unit report and merges with it (scripts/coverageMerge.mts, which
 * also joins the records of a module that two bundles hold). Cost: one parse per bundle, then
 * linear in its ranges.
 */
import { existsSync, readFileSync } from "node:fs";
import { dirname, join, relative, sep } from "node:path";
import { pathToFileURL } from "node:url";
import { parse } from "acorn";
import astV8ToIstanbul from "ast-v8-to-istanbul";
import libCoverage, { type CoverageMap, type CoverageMapData, type CoverageSummary, type FileCoverageData } from "istanbul-lib-coverage";
import type { Profiler } from "node:inspector";
import { mergeData } from "./coverageMerge.mjs";

/** One script's coverage as test/browser/browser.ts records it. */
export interface RecordedScript {
  readonly file: string;
  readonly url: string;
  readonly functions: Profiler.FunctionCoverage[];
}

interface Bundle {
  readonly code: string;
  readonly ast: ReturnType<typeof parse>;
  readonly sourceMap: { version: number; sources: string[]; mappings: string; names: string[]; sourcesContent?: string[] };
}

/**
 * The project path of a webpack source: `webpack://evensplit/./src/a.ts` → `<project>/src/a.ts`;
 * webpack's own runtime (`webpack://evensplit/webpack/...`) stays outside src/ and is dropped later.
 *
 * @example
 * projectSource("webpack://evensplit/./src/demo/grid.ts", "/work/main"); // "/work/main/src/demo/grid.ts"
 */
export function projectSource(source: string, project: string): string {
  const path = source.replace(/^webpack:\/\/[^/]*\//, "").replace(/^\.\//, "");
  return join(project, path);
}

function loadBundle(file: string, project: string): Bundle | null {
  if (!existsSync(`${file}.map`)) return null; // a script built without a map (legacy-check.js) cannot be mapped
  const code = readFileSync(file, "utf8");
  const map = JSON.parse(readFileSync(`${file}.map`, "utf8")) as Bundle["sourceMap"] & { sourceRoot?: string };
  const sourceMap = { ...map, sourceRoot: "", sources: map.sources.map((s) => projectSource(s, project)) };
  return { code, ast: parse(code, { ecmaVersion: "latest", sourceType: "script", locations: true }), sourceMap };
}

/**
 * The record without the items that start past the file's last line: the metadata plugin
 * appends its `CustomFunctions.associate` calls to functions.ts in the build only.
 *
 * @example
 * withinLines(functionsRecord, 1096); // the record of the 1,096 lines in the file
 */
export function withinLines(file: FileCoverageData, lines: number): FileCoverageData {
  const keep = <T, C>(map: Record<string, T>, counts: Record<string, C>, start: (item: T) => number) => {
    const ids = Object.keys(map).filter((id) => start(map[id]) <= lines);
    return { map: Object.fromEntries(ids.map((id) => [id, map[id]])), counts: Object.fromEntries(ids.map((id) => [id, counts[id]])) };
  };
  const statements = keep(file.statementMap, file.s, (range) => range.start.line);
  const functions = keep(file.fnMap, file.f, (fn) => fn.loc.start.line);
  const branches = keep(file.branchMap, file.b, (branch) => branch.loc.start.line);
  return {
    ...file,
    statementMap: statements.map,
    s: statements.counts,
    fnMap: functions.map,
    f: functions.counts,
    branchMap: branches.map,
    b: branches.counts,
  };
}

/**
 * Istanbul coverage of the src/ files the recorded scripts ran, one record per file.
 *
 * @example
 * const map = await mapScripts(JSON.parse(readFileSync(raw, "utf8")), "/work/main");
 * map.fileCoverageFor("/work/main/src/demo/grid.ts").toSummary().lines.pct; // e.g. 87.5
 */
export async function mapScripts(scripts: readonly RecordedScript[], project: string): Promise<CoverageMap> {
  const bundles = new Map<string, Bundle | null>();
  let result: CoverageMapData = {};
  const src = join(project, "src") + sep;
  for (const script of scripts) {
    if (!bundles.has(script.file)) bundles.set(script.file, loadBundle(script.file, project));
    const bundle = bundles.get(script.file);
    if (!bundle) continue;
    const data: CoverageMapData = await astV8ToIstanbul({
      code: bundle.code,
      ast: bundle.ast as Parameters<typeof astV8ToIstanbul>[0]["ast"],
      sourceMap: bundle.sourceMap,
      coverage: { functions: script.functions, url: pathToFileURL(script.file).href },
    });
    const inSrc = Object.fromEntries(
      Object.entries(data)
        .filter(([path]) => path.startsWith(src) && existsSync(path))
        .map(([path, file]) => [path, withinLines(file, readFileSync(path, "utf8").split("\n").length)]),
    );
    result = mergeData(result, inSrc);
  }
  return libCoverage.createCoverageMap(result);
}

/** Line and branch figures of one folder (or of a set of folders). */
export interface FolderFigure {
  readonly folder: string;
  readonly lines: { covered: number; total: number; pct: number };
  readonly branches: { covered: number; total: number; pct: number };
}

function figure(folder: string, summary: CoverageSummary): FolderFigure {
  const { lines, branches } = summary;
  return {
    folder,
    lines: { covered: lines.covered, total: lines.total, pct: lines.pct },
    branches: { covered: branches.covered, total: branches.total, pct: branches.pct },
  };
}

/**
 * Figures per folder of src/ (by the folder each file is in), then everything outside
 * src/demo/, then all of src/.
 *
 * @example
 * folderFigures(map, "/work/main").at(-2); // { folder: "src/ outside src/demo/", lines: { pct: 91.3, ... }, ... }
 */
export function folderFigures(map: CoverageMap, project: string): FolderFigure[] {
  const folders = new Map<string, CoverageSummary>();
  const outsideDemo = libCoverage.createCoverageSummary();
  const all = libCoverage.createCoverageSummary();
  for (const path of map.files()) {
    const summary = map.fileCoverageFor(path).toSummary();
    const folder = relative(project, dirname(path)).split(sep).join("/");
    if (!folders.has(folder)) folders.set(folder, libCoverage.createCoverageSummary());
    folders.get(folder)?.merge(summary);
    if (folder !== "src/demo" && !folder.startsWith("src/demo/")) outsideDemo.merge(summary);
    all.merge(summary);
  }
  return [
    ...[...folders.keys()].sort().map((folder) => figure(folder, folders.get(folder) as CoverageSummary)),
    figure("src/ outside src/demo/", outsideDemo),
    figure("src/", all),
  ];
}
