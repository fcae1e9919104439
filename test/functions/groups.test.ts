/**
 * TWOGROUPS, SHIFT, GROUPS and BYGROUP through the cell layer: the numbers of the core (whose own tests
 * check them against R 4.2 and enumeration), the argument words, and the shapes and messages of failures.
 */
import { describe, expect, it } from "vitest";
import { bygroup, callFunction, groups, shift, twogroups } from "../../src/functions/functions";
import { isCellError } from "../../src/functions/runtime";

const col = (v: unknown[]) => v.map((x) => [x]);

describe("TWOGROUPS", () => {
  it("rank-sum by default: U = 11 of 12 pairs gives 2/35 (exact arithmetic, C(7, 3) = 35)", () => {
    expect(twogroups(col([1.1, 2.4, 3.0]), col([2.9, 4.2, 5.5, 6.1]), null, "greater")).toBeCloseTo(2 / 35, 15);
  });

  it("median method: Fisher on above / not above the pooled median, 1/70 (exact arithmetic)", () => {
    expect(twogroups(col([1, 2, 3, 4]), col([5, 6, 7, 8]), null, "above", "median")).toBeCloseTo(1 / 70, 15);
  });

  it("a shift moves the second group before the test, for both methods", () => {
    const a = twogroups(col([1, 2, 3, 4]), col([15, 16, 17, 18]), 14, "greater");
    expect(a).toBe(twogroups(col([1, 2, 3, 4]), col([1, 2, 3, 4]), 0, "greater"));
    expect(twogroups(col([1, 2, 3, 4]), col([15, 16, 17, 18]), 14, null, "median")).toBe(1);
  });

  it("the at_median rule changes where values equal to the pooled median go", () => {
    const first = col([1, 2, 5, 5]);
    const second = col([5, 8, 9]);
    const lower = twogroups(first, second, null, null, "median");
    const upper = twogroups(first, second, null, null, "median", "join-upper");
    expect(lower).not.toBe(upper);
    expect(twogroups(first, second, null, null, "median", "leave out")).toBeTypeOf("number");
  });

  it("refuses an unknown method with the accepted words, and an empty group with #N/A", () => {
    const bad = twogroups(col([1]), col([2]), null, null, "t-test");
    expect(isCellError(bad) && bad.code === "#VALUE!" && (bad.message ?? "").includes("rank-sum")).toBe(true);
    const empty = twogroups(col(["a"]), col([2]));
    expect(isCellError(empty) && empty.code).toBe("#N/A");
  });
});

describe("SHIFT", () => {
  it("one row: estimate, lower, upper, coverage (the core's documented example)", () => {
    expect(shift(col([10.1, 11.4, 9.8, 10.6, 10.9]), col([11.9, 12.4, 11.1, 12.8, 12.2, 11.6]), 0.9)).toEqual([
      [1.4500000000000002, 11.6 - 10.9, 12.8 - 10.6, 1 - 38 / 462],
    ]);
  });

  it("groups too small for the bounds still give the estimate; the bound cells say why", () => {
    const [row] = shift(col([1, 2]), col([3, 4]));
    expect(row[0]).toBe(2);
    expect(row.slice(1).every((c) => isCellError(c) && c.code === "#N/A" && (c.message ?? "").includes("4 values in each"))).toBe(true);
  });
});

describe("GROUPS", () => {
  it("rank method is Kruskal-Wallis: three separated groups of three give exp(-3.6) (chi-square, 2 df)", () => {
    const p = groups(col([1, 2, 3, 4, 5, 6, 7, 8, 9]), col(["a", "a", "a", "b", "b", "b", "c", "c", "c"]), "rank");
    expect(p).toBeCloseTo(Math.exp(-3.6), 14);
  });

  it("median method by default; one group only is #N/A with a message; shapes must match", () => {
    expect(groups(col([1, 2, 3, 4, 5, 6]), col(["a", "a", "a", "b", "b", "b"]))).toBeTypeOf("number");
    const one = groups(col([1, 2]), col(["a", "A"]));
    expect(isCellError(one) && one.code).toBe("#N/A");
    const shape = groups(col([1, 2]), col(["a"]));
    expect(isCellError(shape) && shape.code === "#VALUE!" && (shape.message ?? "").includes("same shape")).toBe(true);
  });
});

describe("BYGROUP", () => {
  it("a header row, a row per group in order of first appearance, and a last row counting rows without a label", () => {
    const table = bygroup(
      col([48, 49, 50.5, 47, 49.5, 46, 51, 52, 53, 54, 55, 56, 3]),
      col(["B", "B", "B", "B", "B", "B", "A", "A", "A", "a", "A", "A", null]),
      50,
      null,
      0.9,
    );
    expect(table[0]).toEqual(["Group", "Count", "Median", "Lower bound", "Upper bound", "Coverage", "Sign-test p", "Adjusted p"]);
    expect(table[1]).toEqual(["B", 6, 48.5, 46, 50.5, 0.96875, 14 / 64, 14 / 64]);
    expect(table[2]).toEqual(["A", 6, 53.5, 51, 56, 0.96875, 2 / 64, 4 / 64]); // Holm: 2 x 2/64
    expect(table[3]).toEqual(["Rows without a usable label (skipped)", 1, "", "", "", "", "", ""]);
    expect(table.every((row) => row.length === 8)).toBe(true);
  });

  it("a one-sided question leaves the other bound empty; a failure fills one row with the error", () => {
    const table = bygroup(col([51, 52, 53, 54, 55, 56]), col(["A", "A", "A", "A", "A", "A"]), 50, "greater");
    expect(table[1][4]).toBe("");
    expect(table[1][3]).toBeTypeOf("number");
    const failed = bygroup(col([1]), col(["A"]), "fifty");
    expect(failed).toHaveLength(1);
    expect(failed[0].every((c) => isCellError(c) && c.code === "#VALUE!")).toBe(true);
  });

  it("without a hypothesised median gives the counts, medians and bounds, and leaves both p-value columns empty", () => {
    const values = col([48, 49, 50.5, 47, 49.5, 46, 51, 52, 53, 54, 55, 56]);
    const labels = col(["B", "B", "B", "B", "B", "B", "A", "A", "A", "a", "A", "A"]);
    const table = bygroup(values, labels, null, null, 0.9);
    // The same numbers as with a target (the first test above), the p-values left out.
    expect(table[1]).toEqual(["B", 6, 48.5, 46, 50.5, 0.96875, "", ""]);
    expect(table[2]).toEqual(["A", 6, 53.5, 51, 56, 0.96875, "", ""]);
  });

  it("is in the catalogue under its id, as are the other three", () => {
    expect(callFunction("BYGROUP", [col([51]), col(["A"]), 50])).toBeInstanceOf(Array);
    for (const id of ["TWOGROUPS", "SHIFT", "GROUPS"]) expect(() => callFunction(id, [col([1]), col([2])])).not.toThrow();
  });
});
