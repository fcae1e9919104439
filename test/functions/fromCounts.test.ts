/**
 * The functions that take counts instead of values: COUNTPVALUE and ORDERRANKS.
 * Reference values: R 4.2 through test/fixtures/counts.json (written by counts.R from binom.test, qbinom and
 * pbinom); exact arithmetic where stated; and agreement with PVALUE and BOUNDS on values with those counts.
 */
import { describe, expect, it } from "vitest";
import { bounds, callFunction, countpvalue, orderranks, pvalue } from "../../src/functions/functions";
import type { CellError } from "../../src/functions/runtime";
import fixture from "../fixtures/counts.json";

function expectError(value: unknown, code: string, pattern: RegExp): void {
  expect(value).toMatchObject({ code });
  expect((value as CellError).message).toMatch(pattern);
}

/** Smallest normal double: below it both sides have lost their digits (R prints 5e-324 for 2 x 2^-25000). */
const SMALLEST_NORMAL = 2.2250738585072014e-308;

/** Relative difference, or the absolute one where the expected value is not a normal double. */
function relativeDifference(actual: number, expected: number): number {
  return expected < SMALLEST_NORMAL ? Math.abs(actual - expected) : Math.abs(actual - expected) / Math.abs(expected);
}

describe("COUNTPVALUE", () => {
  it("agrees with R 4.2's binom.test on every fixture case", () => {
    expect(fixture.countPValue.length).toBeGreaterThan(150);
    for (const c of fixture.countPValue) {
      const p = countpvalue(c.above, c.below, c.alternative);
      expect(typeof p, JSON.stringify(c)).toBe("number");
      expect(relativeDifference(p as number, c.pValue), JSON.stringify(c)).toBeLessThan(1e-9);
    }
  });

  it("equals PVALUE on values with those counts, ties left out, for every method", () => {
    // 7 values below 50, 3 ties, 18 above (an invented paint-line tally).
    const values = [...Array(7).fill(48), ...Array(3).fill(50), ...Array(18).fill(53)].map((v) => [v]);
    for (const alternative of ["two-sided", "greater", "less"]) {
      for (const method of ["exact", "midp", "normal"]) {
        expect(countpvalue(18, 7, alternative, method)).toBe(pvalue(values, 50, alternative, null, method));
      }
    }
  });

  it("gives 1/8 for three above and none below, one-sided (exact: 2^-3)", () => {
    expect(countpvalue(3, 0, "greater")).toBe(0.125);
    expect(callFunction("COUNTPVALUE", [3, 0, "greater"])).toBe(0.125);
  });

  it("refuses counts that are not whole numbers of values, and answers #N/A for no values", () => {
    expectError(countpvalue(2.5, 3), "#VALUE!", /above must be a whole number/);
    expectError(countpvalue(3, -1), "#VALUE!", /below must be a whole number/);
    expectError(countpvalue("18", 7), "#VALUE!", /above must be a number/);
    expectError(countpvalue(6e8, 6e8), "#VALUE!", /add up to at most/);
    expectError(countpvalue(1, 1, "sideways"), "#VALUE!", /sideways/);
    expect(countpvalue(0, 0)).toMatchObject({ code: "#N/A" });
  });
});

describe("ORDERRANKS", () => {
  it("agrees with R 4.2's qbinom/pbinom ranks and coverage on every fixture case", () => {
    expect(fixture.orderRanks.length).toBeGreaterThan(500);
    for (const c of fixture.orderRanks) {
      const row = orderranks(c.n, c.confidence, c.quantile, c.side)[0];
      if (c.coverage === null) {
        expect(row[0], JSON.stringify(c)).toMatchObject({ code: "#N/A" });
        continue;
      }
      expect(row[0], JSON.stringify(c)).toBe(c.lowerRank ?? "");
      expect(row[1], JSON.stringify(c)).toBe(c.upperRank ?? "");
      expect(Math.abs((row[2] as number) - c.coverage), JSON.stringify(c)).toBeLessThan(1e-12);
    }
  });

  it("names the order statistics BOUNDS returns (SMALL of those ranks)", () => {
    const values = [51.2, 49.8, 50.6, 52.1, 48.9, 50.3, 51.7, 49.5, 50.9, 53.0, 50.1, 49.2];
    const sorted = [...values].sort((a, b) => a - b);
    for (const side of ["two-sided", "lower", "upper"]) {
      const [lowerRank, upperRank, coverage] = orderranks(values.length, 0.9, null, side)[0];
      const [lower, upper, achieved] = bounds(
        values.map((v) => [v]),
        0.9,
        side,
      )[0];
      expect(lower).toBe(lowerRank === "" ? "" : sorted[(lowerRank as number) - 1]);
      expect(upper).toBe(upperRank === "" ? "" : sorted[(upperRank as number) - 1]);
      expect(achieved).toBe(coverage);
    }
  });

  it("gives ranks 2 and 9 of 10 with coverage 1002/1024 (exact: 1 - 2 (1 + 10) / 2^10)", () => {
    expect(callFunction("ORDERRANKS", [10])).toEqual([[2, 9, 1 - (2 * 11) / 1024]]);
  });

  it("answers #N/A with the smallest n that reaches the confidence, and refuses bad arguments", () => {
    // (1/2)^5 = 0.03125 > 0.025, so five values cannot give 95% two-sided bounds; six can (exact arithmetic).
    const row = orderranks(5)[0];
    for (const cell of row) expectError(cell, "#N/A", /6/);
    for (const cell of orderranks(0)[0]) expectError(cell, "#VALUE!", /whole number/);
    for (const cell of orderranks(10, 95)[0]) expectError(cell, "#VALUE!", /0\.95/);
    for (const cell of orderranks(10, 0.95, 1)[0]) expectError(cell, "#VALUE!", /quantile/);
    for (const cell of orderranks(10, 0.95, 0.5, "both ends")[0]) expectError(cell, "#VALUE!", /side/);
  });
});
