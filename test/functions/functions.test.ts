/**
 * The catalogue functions from source (src/functions/functions.ts), without
 * Office: each function's wiring, cell semantics and error mapping. Expected
 * values come from exact arithmetic done here: brute-force enumeration of all
 * sign patterns (signed-rank), all pairwise averages (Hodges–Lehmann), exact
 * binomial sums in BigInt (sign test, power), and the adjustment rules applied
 * by hand (Holm 1979; Bonferroni).
 */
import { describe, expect, it } from "vitest";
import { GENERIC_MESSAGE } from "../../src/functions/errors";
import {
  FUNCTION_IDS,
  adjust,
  bounds,
  callFunction,
  counts,
  hodgeslehmann,
  paired,
  pairedcounts,
  pairedhodgeslehmann,
  power,
  pvalue,
  report,
  samplesize,
  signrank,
  signrankstatistic,
  statistic,
} from "../../src/functions/functions";
import type { CellError } from "../../src/functions/runtime";

function col(...cells: unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

function expectError(value: unknown, code: string, pattern: RegExp): void {
  expect(value).toMatchObject({ code });
  expect((value as CellError).message).toMatch(pattern);
}

/** P(X >= k) for X ~ Bin(n, a/b), as an exact fraction turned into a double at the end. */
function exactUpperTail(k: number, n: number, a: bigint, b: bigint): number {
  let numerator = 0n;
  let choose = 1n;
  for (let j = 0; j <= n; j++) {
    if (j > 0) choose = (choose * BigInt(n - j + 1)) / BigInt(j);
    if (j >= k) numerator += choose * a ** BigInt(j) * (b - a) ** BigInt(n - j);
  }
  return Number((numerator * 10n ** 30n) / b ** BigInt(n)) / 1e30;
}

/** One-sided signed-rank p-value P(V >= v) by enumerating all 2^n sign patterns (no ties, no zeros). */
function bruteSignedRankGreater(values: number[]): number {
  const ranks = values.map((v) => values.filter((w) => Math.abs(w) < Math.abs(v)).length + 1);
  const v = values.reduce((s, x, i) => s + (x > 0 ? ranks[i] : 0), 0);
  let atLeast = 0;
  for (let mask = 0; mask < 2 ** values.length; mask++) {
    let sum = 0;
    for (let i = 0; i < values.length; i++) if (mask & (1 << i)) sum += ranks[i];
    if (sum >= v) atLeast++;
  }
  return atLeast / 2 ** values.length;
}

describe("sign-test functions", () => {
  // Invented thicknesses (µm) around a 50 µm target.
  const panels = col(51.2, 49.4, 53.0, 50, null, "repaint", 52.7, true, 50.9, -0, 48.8);

  it("count below, tied and above, skipping what is not a number; -0 equals 0", () => {
    expect(counts(panels, 50)).toEqual([[3, 1, 4, 7]]);
    expect(counts(col(-0, 0, 1), 0)).toEqual([[0, 2, 1, 1]]);
  });

  it("give exact binomial p-values (BigInt sums) and the statistic for each alternative", () => {
    // Above 50: 51.2, 53.0, 52.7, 50.9 (4); below: 49.4, -0, 48.8 (3); one tie dropped.
    const used = 7;
    expect(pvalue(panels, 50, "greater")).toBeCloseTo(exactUpperTail(4, used, 1n, 2n), 14);
    expect(pvalue(panels, 50, "less")).toBeCloseTo(exactUpperTail(3, used, 1n, 2n), 14);
    expect(pvalue(panels, 50)).toBeCloseTo(1, 14);
    expect(statistic(panels, 50, "greater")).toBe(4);
    expect(statistic(panels, 50, "less")).toBe(3);
    expect(statistic(panels, 50, "two-sided")).toBe(4);
  });

  it("pair cells by position and test second − first − shift", () => {
    const before = col(50.1, 49.8, 51.0, "lost", 50.4, 49.9);
    const after = col(49.0, 49.8, 49.5, 48.0, null, 48.7);
    // After − before: -1.1, 0 (tie), -1.5, (skipped), (skipped), -1.2.
    expect(pairedcounts(before, after)).toEqual([[3, 1, 0, 3, 2]]);
    expect(paired(before, after, 0, "less")).toBeCloseTo(exactUpperTail(3, 3, 1n, 2n), 14);
    // 2.3 − 1.1 − 1.2 is a tie to a person reading the sheet, not a tiny negative number.
    expect(pairedcounts(col(1.1), col(2.3), 1.2)).toEqual([[0, 1, 0, 0, 0]]);
  });

  it("say why there is no answer when every value is a tie", () => {
    expectError(pvalue(col(50, 50, "x"), 50), "#N/A", /\w/);
  });
});

describe("bounds", () => {
  it("leave the end not asked for empty", () => {
    const data = col(...Array.from({ length: 20 }, (_, i) => 40 + i));
    const [[lower, upper, achieved]] = bounds(data, 0.95, "lower");
    expect(typeof lower).toBe("number");
    expect(upper).toBe("");
    expect(achieved as number).toBeGreaterThanOrEqual(0.95);
  });

  it("refuse a one-sided Hettmansperger–Sheather bound at confidence 0.5 or less, in every cell", () => {
    const row = bounds(col(1, 2, 3, 4, 5, 6, 7, 8, 9, 10), 0.5, "upper", "hettmansperger-sheather")[0];
    expect(row).toHaveLength(3);
    for (const cell of row) expectError(cell, "#VALUE!", /^A one-sided Hettmansperger–Sheather bound needs a confidence above 0\.5/);
  });
});

describe("signed-rank and Hodges–Lehmann functions", () => {
  const differences = [1.5, -0.5, 2, 3, 0.25, 4, -2.25, 3.5];

  it("match enumeration of every sign pattern", () => {
    const data = col(...differences.map((d) => 50 + d), "n/a", null);
    expect(signrank(data, 50, "greater", "exact")).toBeCloseTo(bruteSignedRankGreater(differences), 14);
    // V = ranks of the positive differences among |d| = 0.25 0.5 1.5 2 2.25 3 3.5 4.
    expect(signrankstatistic(data, 50)).toBe(1 + 3 + 4 + 6 + 7 + 8);
  });

  it("refuse the exact method beyond the size the core enumerates, instead of quietly approximating", () => {
    const big = col(...Array.from({ length: 1500 }, (_, i) => 50 + (i % 2 === 0 ? 1 : -1) * (1 + i / 1000)));
    expectError(
      signrank(big, 50, "two-sided", "exact"),
      "#N/A",
      /exact signed-rank p-value is worked out for up to \d+ non-zero differences; these have 1500/,
    );
    expect(typeof signrank(big, 50, "two-sided", "auto")).toBe("number");
  });

  it("estimate the centre as the median of all pairwise averages", () => {
    const values = [49.1, 50.6, 51.3, 48.7, 52.2, 50.0, 50.8];
    const walsh: number[] = [];
    for (let i = 0; i < values.length; i++) for (let j = i; j < values.length; j++) walsh.push((values[i] + values[j]) / 2);
    walsh.sort((a, b) => a - b);
    const median = walsh.length % 2 ? walsh[(walsh.length - 1) / 2] : (walsh[walsh.length / 2 - 1] + walsh[walsh.length / 2]) / 2;
    const [[estimate, lower, upper, achieved]] = hodgeslehmann(col(...values), 0.9);
    expect(estimate).toBeCloseTo(median, 12);
    expect(lower as number).toBeLessThanOrEqual(estimate as number);
    expect(upper as number).toBeGreaterThanOrEqual(estimate as number);
    expect(achieved as number).toBeGreaterThanOrEqual(0.9);
    const [[pairedEstimate]] = pairedhodgeslehmann(col(...values.map(() => 0)), col(...values), 0.9);
    expect(pairedEstimate).toBeCloseTo(median, 12);
  });
});

describe("planning functions", () => {
  it("give the exact power of the one-sided sign test (BigInt sums)", () => {
    // n = 10, alpha 0.05, greater: P(X >= 9 | 1/2) = 11/1024 <= 0.05 < P(X >= 8 | 1/2) = 56/1024, so reject at 9 or more.
    expect(power(10, 0.75, 0.05, "greater")).toBeCloseTo(exactUpperTail(9, 10, 3n, 4n), 12);
  });

  it("find a sample size that reaches the power, refusing impossible targets", () => {
    const n = samplesize(0.75, 0.8, 0.05, "greater") as number;
    expect(Number.isInteger(n)).toBe(true);
    expect(power(n, 0.75, 0.05, "greater") as number).toBeGreaterThanOrEqual(0.8);
    expect(power(n - 1, 0.75, 0.05, "greater") as number).toBeLessThan(0.8);
    expectError(power(0, 0.75), "#VALUE!", /^Argument n must be a whole number/);
    expectError(samplesize(0.75, 80), "#VALUE!", /For 80% write 0\.8/);
  });
});

describe("ADJUST", () => {
  it("adjusts by hand-checked rules, keeps the shape, leaves blank cells blank", () => {
    // Holm: sorted 0.01, 0.03, 0.04 -> 3×0.01, max(0.03, 2×0.03), max(0.06, 1×0.04).
    expect(
      adjust(
        [
          [0.01, null],
          [0.04, ""],
          [0.03, null],
        ],
        "holm",
      ),
    ).toEqual([
      [0.03, ""],
      [0.06, ""],
      [0.06, ""],
    ]);
    expect(adjust(col(0.01, 0.04, 0.5), "bonferroni")).toEqual(col(0.03, 0.12, 1));
  });

  it("refuses a number that is not a p-value, naming its cell, in every cell", () => {
    const out = adjust(col(0.2, 1.5), null);
    expect(out).toHaveLength(2);
    for (const [cell] of out) expectError(cell, "#VALUE!", /row 2, column 1 of the range holds 1\.5/);
    for (const [cell] of adjust(col(0.2), "sidak")) expectError(cell, "#VALUE!", /^For method, "sidak" is not accepted/);
  });

  it("never shrinks the number of tests: a text, logical or error cell is refused, naming its place", () => {
    // Left out, "0.02" would make Holm adjust 0.01 as one of three tests (0.03) instead of four (0.04): by hand, Holm (1979).
    for (const row of adjust(col(0.01, "0.02", 0.04, 0.03), "holm")) {
      expectError(row[0], "#VALUE!", /row 2, column 1 of the range holds the text "0\.02".*fewer tests/);
    }
    expectError(adjust([[0.01, true]], "bh")[0][1], "#VALUE!", /row 1, column 2 of the range holds the logical value TRUE/);
    expectError(adjust(col(0.01, { code: "#N/A" }), "holm")[0][0], "#VALUE!", /row 2, column 1 of the range holds the error #N\/A/);
    expect(adjust(col(0.01, null, 0.04, 0.03), "holm")).toEqual(col(0.03, "", 0.06, 0.06));
  });
});

describe("REPORT and calling by id", () => {
  it("answers with two columns, and a bad argument as a pair of errors", () => {
    const block = report(col(51, 49, 53, 52, 50.5, 48), 50, "greater");
    expect(block.length).toBeGreaterThan(10);
    for (const row of block) expect(row).toHaveLength(2);
    expect(block.find((r) => r[0] === "Sign statistic (count above)")?.[1]).toBe(4);
    const refused = report(col(1, 2), 0, "two-sided", null, null, col(1));
    expect(refused).toHaveLength(1);
    for (const cell of refused[0]) expectError(cell, "#VALUE!", /same shape/);
  });

  it("reaches every catalogue function by id and refuses unknown ids", () => {
    expect([...FUNCTION_IDS].sort()).toEqual([
      "ADJUST",
      "BOUNDS",
      "BYGROUP",
      "COUNTPVALUE",
      "COUNTS",
      "GROUPS",
      "HODGESLEHMANN",
      "LABELEDSHIFT",
      "LABELEDTWOGROUPS",
      "LABELEDTWOGROUPSSTATISTIC",
      "ORDERRANKS",
      "PAIRED",
      "PAIREDBOUNDS",
      "PAIREDCOUNTS",
      "PAIREDHODGESLEHMANN",
      "PAIREDSIGNRANK",
      "PAIREDSIGNRANKSTATISTIC",
      "PAIREDSPRT",
      "PAIREDSTATISTIC",
      "PAIREDWATCHBOUNDS",
      "PAIREDWATCHPVALUE",
      "POWER",
      "PVALUE",
      "QUANTILEBOUNDS",
      "QUANTILEPVALUE",
      "REPORT",
      "SAMPLESIZE",
      "SHIFT",
      "SIGNRANK",
      "SIGNRANKSTATISTIC",
      "SPRT",
      "STATISTIC",
      "TWOGROUPS",
      "TWOGROUPSSTATISTIC",
      "WATCHBOUNDS",
      "WATCHPVALUE",
    ]);
    expect(callFunction("COUNTS", [col(52, 49, 55), 50])).toEqual([[1, 0, 2, 3]]);
    expect(() => callFunction("toString", [])).toThrow(RangeError);
    expect(() => callFunction("MEDIAN", [])).toThrow(RangeError);
  });

  it("keeps internal failures calm", () => {
    const row = new Proxy([1, 2], {
      get(target, key) {
        if (key === "length") throw new Error("secret internals");
        return Reflect.get(target, key);
      },
    });
    expect(pvalue([row], 0)).toEqual({ code: "#VALUE!", message: GENERIC_MESSAGE });
  });
});
