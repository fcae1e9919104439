/**
 * `npm run coverage:all`: line and branch coverage of src/ by the unit tests and the browser
 * tests together, in test-output/coverage-all/ (index.html, coverage-summary.json,
 * coverage-final.json) and as a table per folder on the console.
 *
 * Steps: the unit project under @vitest/coverage-v8 (JSON report into unit/); a development
 * build with source maps into a private folder (never ./dist, which other runs read); the
 * browser project on that build with EVENSPLIT_COVERAGE=1, so each page writes Chromium's
 * coverage into browser-raw/; then scripts/browserCoverage.mts maps it to src/ and
 * scripts/coverageMerge.mts merges both. A failing test does not stop the report (the figure
 * of the rest still counts); the exit status is non-zero when any step failed.
 */
import { spawnSync } from "node:child_process";
import { existsSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import libCoverage, { type CoverageMapData } from "istanbul-lib-coverage";
import libReport from "istanbul-lib-report";
import reports from "istanbul-reports";
import { folderFigures, mapScripts, type RecordedScript } from "./browserCoverage.mjs";
import { mergeData } from "./coverageMerge.mjs";

const PROJECT = fileURLToPath(new URL("..", import.meta.url));
const OUT = join(PROJECT, "test-output", "coverage-all");
const UNIT = join(OUT, "unit");
const RAW = join(OUT, "browser-raw");
const DIST = join(tmpdir(), "evensplit-coverage-dist");

function step(title: string, command: string, args: string[], env: Record<string, string> = {}): boolean {
  console.log(`\n== ${title}`);
  const run = spawnSync(command, args, { cwd: PROJECT, stdio: "inherit", env: { ...process.env, ...env } });
  return run.status === 0;
}

const npx = process.platform === "win32" ? "npx.cmd" : "npx";
rmSync(OUT, { recursive: true, force: true });
const unitOk = step("unit tests with V8 coverage", npx, [
  "vitest",
  "run",
  "--project",
  "unit",
  "--coverage",
  "--coverage.reporter=json",
  `--coverage.reportsDirectory=${UNIT}`,
]);
const buildOk = step(`development build with source maps into ${DIST}`, npx, ["webpack", "--mode", "development"], {
  EVENSPLIT_DIST: DIST,
});
const browserOk =
  buildOk &&
  step("browser tests recording Chromium's coverage", npx, ["vitest", "run", "--project", "browser"], {
    EVENSPLIT_DIST: DIST,
    EVENSPLIT_COVERAGE: "1",
  });

const unitFile = join(UNIT, "coverage-final.json");
const unit: CoverageMapData = existsSync(unitFile) ? JSON.parse(readFileSync(unitFile, "utf8")) : {};
const scripts: RecordedScript[] = existsSync(RAW)
  ? readdirSync(RAW).flatMap((name) => JSON.parse(readFileSync(join(RAW, name), "utf8")) as RecordedScript[])
  : [];
const merged = libCoverage.createCoverageMap(mergeData(unit, (await mapScripts(scripts, PROJECT)).toJSON()));

const context = libReport.createContext({ dir: OUT, coverageMap: merged, defaultSummarizer: "nested" });
for (const name of ["html", "json-summary", "json"] as const) reports.create(name).execute(context);

console.log(`\n== unit and browser coverage together (${scripts.length} recorded scripts), report in ${OUT}`);
console.log("folder                      lines                  branches");
for (const f of folderFigures(merged, PROJECT)) {
  const cell = (x: { covered: number; total: number; pct: number }) => `${x.pct.toFixed(1)}% (${x.covered}/${x.total})`.padEnd(23);
  console.log(`${f.folder.padEnd(28)}${cell(f.lines)}${cell(f.branches)}`);
}
if (!unitOk || !browserOk) {
  console.log("\nSome step failed (see above): the figures count only what ran.");
  process.exitCode = 1;
}
