/**
 * Two records of one file from different builds merge into one: items that start at the same
 * place are one item with the counts added, whatever column each build ends them at. Expected
 * values by exact arithmetic on the hand-made records below; the records' shapes follow
 * istanbul-lib-coverage's FileCoverageData (statementMap/s, fnMap/f, branchMap/b).
 */
import libCoverage, { type FileCoverageData } from "istanbul-lib-coverage";
import { describe, expect, it } from "vitest";
import { mergeData, mergeFile } from "../../scripts/coverageMerge.mjs";

const at = (line: number, column: number, endColumn: number | null) => ({
  start: { line, column },
  end: { line, column: endColumn as number },
});

/** A file with one statement, one function and one two-way `if`, ended at `end` (null: no end, as the unit build writes). */
function record(end: number | null, counts: { s: number; f: number; b: [number, number] }): FileCoverageData {
  return {
    path: "/p/src/a.ts",
    statementMap: { "0": at(3, 2, end) },
    s: { "0": counts.s },
    fnMap: { "0": { name: "a", decl: at(1, 16, 17), loc: at(1, 0, end), line: 1 } },
    f: { "0": counts.f },
    branchMap: { "0": { type: "if", line: 3, loc: at(3, 2, end), locations: [at(3, 2, end), at(3, 2, end)] } },
    b: { "0": counts.b },
  };
}

describe("mergeFile", () => {
  // Fresh records for each use: istanbul-lib-coverage's FileCoverage merges into the object it was given.
  const unit = () => record(null, { s: 2, f: 1, b: [2, 0] });
  const browser = () => record(40, { s: 3, f: 1, b: [0, 3] });

  it("adds the counts of items that start at the same place", () => {
    const merged = mergeFile(unit(), browser());
    expect(merged.s).toEqual({ "0": 5 });
    expect(merged.f).toEqual({ "0": 2 });
    expect(merged.b).toEqual({ "0": [2, 3] });
  });

  it("counts the branch once, where istanbul-lib-coverage's own merge counts it twice", () => {
    const ours = libCoverage.createFileCoverage(mergeFile(unit(), browser())).toSummary();
    expect(ours.branches).toMatchObject({ total: 2, covered: 2 });
    const theirs = libCoverage.createFileCoverage(unit());
    theirs.merge(libCoverage.createFileCoverage(browser()));
    expect(theirs.toSummary().branches.total).toBe(4);
  });

  it("appends an item the first record lacks", () => {
    const other: FileCoverageData = { ...browser(), statementMap: { "0": at(7, 0, 9) }, s: { "0": 1 } };
    expect(mergeFile(unit(), other).s).toEqual({ "0": 2, "1": 1 });
  });
});

describe("mergeData", () => {
  it("keeps files only one side has", () => {
    const unit = record(null, { s: 1, f: 1, b: [1, 0] });
    const onlyBrowser = { ...unit, path: "/p/src/b.ts" };
    expect(Object.keys(mergeData({ [unit.path]: unit }, { [onlyBrowser.path]: onlyBrowser })).sort()).toEqual([
      "/p/src/a.ts",
      "/p/src/b.ts",
    ]);
  });
});
