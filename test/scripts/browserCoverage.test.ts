/**
 * The webpack source names of the development build's maps become paths in the project, so the
 * browser's coverage is keyed like the unit report's (and merges with it). Expected values: the
 * source names webpack 5 writes with `devtool: "source-map"` (`webpack://<package name>/./<path>`),
 * read from a build's demo.js.map. withinLines: exact arithmetic on a hand-made record.
 */
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import type { FileCoverageData } from "istanbul-lib-coverage";
import { projectSource, withinLines } from "../../scripts/browserCoverage.mjs";

describe("projectSource", () => {
  it("maps a module of the project to its file", () => {
    expect(projectSource("webpack://evensplit/./src/demo/grid.ts", "/p")).toBe(join("/p", "src", "demo", "grid.ts"));
  });
  it("leaves webpack's runtime outside src/", () => {
    expect(projectSource("webpack://evensplit/webpack/runtime/define property getters", "/p")).toBe(
      join("/p", "webpack", "runtime", "define property getters"),
    );
  });
});

describe("withinLines", () => {
  const line = (n: number) => ({ start: { line: n, column: 0 }, end: { line: n, column: 9 } });
  it("drops what the build added past the file's last line and keeps the rest", () => {
    const file: FileCoverageData = {
      path: "/p/src/functions/functions.ts",
      statementMap: { "0": line(2), "1": line(5) },
      s: { "0": 1, "1": 4 },
      fnMap: { "0": { name: "f", decl: line(2), loc: line(2), line: 2 } },
      f: { "0": 1 },
      branchMap: { "0": { type: "if", line: 5, loc: line(5), locations: [line(5), line(5)] } },
      b: { "0": [1, 0] },
    };
    const kept = withinLines(file, 3);
    expect(kept.s).toEqual({ "0": 1 });
    expect(kept.f).toEqual({ "0": 1 });
    expect(kept.b).toEqual({});
  });
});
