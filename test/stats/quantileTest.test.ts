import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { signTestFixture as fixtures, type QuantileCase as QuantileFixture } from "../fixtures/signTestFixture";
import { quantileTest, type QuantileTestResult, type TwoSidedRule } from "../../src/stats/quantileTest";
import { signTest } from "../../src/stats/signTest";
import type { Alternative } from "../../src/stats/types";
import {
  add,
  compare,
  exactBinomial,
  exactLower,
  exactPmf,
  exactUpper,
  fromNumber,
  relativeError,
  times,
  type Fraction,
} from "./signFamilyExact";

/** A sample with the given counts below and above `value` = 1 (and ties at 1). */
function sample(below: number, above: number, tied = 0): Float64Array {
  const values = new Float64Array(below + tied + above).fill(2, below + tied);
  return values.fill(1, below, below + tied);
}

function run(
  values: ArrayLike<number>,
  value: number,
  quantile: number,
  options: Parameters<typeof quantileTest>[3] = {},
): QuantileTestResult {
  const r = quantileTest(values, value, quantile, options);
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

function relErr(a: number, b: number): number {
  return a === b ? 0 : Math.abs(a - b) / Math.abs(b);
}

describe("quantileTest against R 4.2 binom.test (test/fixtures/signTest.R)", () => {
  const cases = fixtures.quantile;
  it(`matches ${cases.length} generated cases: both one-sided, doubling and minimum likelihood`, () => {
    let worst = 0;
    const checks: [Alternative, TwoSidedRule, keyof QuantileFixture][] = [
      ["greater", "doubling", "greater"], // R: alternative = "less" on the count below
      ["less", "doubling", "less"], // R: alternative = "greater"
      ["two-sided", "doubling", "doubling"],
      ["two-sided", "minimum-likelihood", "minimumLikelihood"], // R's own two-sided rule
    ];
    for (const c of cases) {
      if (c.below + c.above === 0) continue;
      const values = sample(c.below, c.above);
      for (const [alternative, twoSidedRule, key] of checks) {
        const got = run(values, 1, c.quantile, { alternative, twoSidedRule }).pValue;
        const e = relErr(got, c[key]);
        worst = Math.max(worst, e);
        if (e > 1e-11) expect({ ...c, alternative, twoSidedRule, got }).toEqual({ ...c, alternative, twoSidedRule, got: c[key] });
      }
    }
    expect(worst).toBeLessThan(1e-11);
  });
});

/** Rational quantiles for exact checks: q = a / b. */
const RATIONAL_Q: readonly [number, number][] = [
  [1, 3],
  [1, 4],
  [7, 10],
  [1, 2],
  [19, 20],
];

/** Exact p-value of the quantile test by BigInt sums (the minimum-likelihood rule by enumerating all counts). */
function exactP(below: number, n: number, a: number, b: number, alternative: Alternative, rule: TwoSidedRule): Fraction {
  const dist = exactBinomial(n, a, b);
  if (alternative === "greater") return exactLower(dist, below);
  if (alternative === "less") return exactUpper(dist, below);
  const one: Fraction = { num: 1n, den: 1n };
  const cap = (f: Fraction) => (compare(f, one) > 0 ? one : f);
  if (rule === "doubling") {
    const lower = exactLower(dist, below);
    const upper = exactUpper(dist, below);
    return cap(times({ num: 2n, den: 1n }, compare(lower, upper) < 0 ? lower : upper));
  }
  // R's binom.test: 1 when x equals n p; otherwise sum P(X = k) over k with P(X = k) <= P(X = x) (1 + 1e-7).
  if (compare({ num: BigInt(below) * BigInt(b), den: 1n }, { num: BigInt(n) * BigInt(a), den: 1n }) === 0) return one;
  const limit = times(exactPmf(dist, below), fromNumber(1 + 1e-7));
  let sum: Fraction = { num: 0n, den: 1n };
  for (let k = 0; k <= n; k++) if (compare(exactPmf(dist, k), limit) <= 0) sum = add(sum, exactPmf(dist, k));
  return cap(sum);
}

describe("quantileTest against exact BigInt binomial sums", () => {
  it("agrees to 1e-12 for every count with n <= 40 at rational quantiles, all rules", () => {
    let worst = 0;
    for (const [a, b] of RATIONAL_Q) {
      for (let n = 1; n <= 40; n++) {
        for (let below = 0; below <= n; below++) {
          const values = sample(below, n - below);
          for (const [alternative, rule] of [
            ["greater", "doubling"],
            ["less", "doubling"],
            ["two-sided", "doubling"],
            ["two-sided", "minimum-likelihood"],
          ] as const) {
            const got = run(values, 1, a / b, { alternative, twoSidedRule: rule }).pValue;
            // a / b as a double differs from the rational by < 1e-16 relative, far below the tolerance.
            worst = Math.max(worst, relativeError(got, exactP(below, n, a, b, alternative, rule)));
          }
        }
      }
    }
    expect(worst).toBeLessThan(1e-12);
  });
});

describe("quantileTest behaviour", () => {
  it("drops values equal to the hypothesised quantile and reports the counts", () => {
    const r = run([0.5, 1, 1, 3, 4, 5, 1], 1, 0.25);
    expect([r.below, r.tied, r.above, r.used, r.statistic]).toEqual([1, 3, 3, 4, 1]);
    expect(r.expected).toBe(1);
    expect([r.quantile, r.value, r.alternative, r.twoSidedRule]).toEqual([0.25, 1, "two-sided", "doubling"]);
  });

  it("'greater' means the true quantile exceeds the value: few values below give a small p", () => {
    // 0 of 20 below 1 when the 0.3 quantile is 1: P(Bin(20, 0.3) <= 0) = 0.7^20, hand computation
    const r = run(sample(0, 20), 1, 0.3, { alternative: "greater" });
    expect(relErr(r.pValue, 0.7 ** 20)).toBeLessThan(1e-13);
    expect(run(sample(0, 20), 1, 0.3, { alternative: "less" }).pValue).toBe(1);
  });

  it("equals the sign test at q = 1/2 (the sign test is the median's quantile test)", () => {
    for (let n = 1; n <= 60; n++) {
      for (let below = 0; below <= n; below++) {
        for (const alternative of ["greater", "less", "two-sided"] as const) {
          const q = run(sample(below, n - below), 1, 0.5, { alternative }).pValue;
          const s = signTest({ below, tied: 0, above: n - below }, { alternative });
          if (!s.available) throw new Error("unavailable");
          expect(relErr(q, s.pValue)).toBeLessThan(1e-14);
        }
      }
    }
  });

  it("minimum likelihood gives 1 at the expected count and matches R's rule at large n", () => {
    expect(run(sample(3, 7), 1, 0.3, { twoSidedRule: "minimum-likelihood" }).pValue).toBe(1);
    const big = run(sample(310_400, 689_600), 1, 0.31, { twoSidedRule: "minimum-likelihood" });
    const doubled = run(sample(310_400, 689_600), 1, 0.31);
    // Far from the centre the two rules agree to first order (the distribution is nearly symmetric there, common practice).
    expect(relErr(big.pValue, doubled.pValue)).toBeLessThan(0.05);
  });

  it("is unavailable without values away from the hypothesised quantile", () => {
    const tied = quantileTest([2, 2, 2], 2, 0.9);
    expect(tied.available === false && tied.reason === "no-data" && /Every value equals 2/.test(tied.message)).toBe(true);
    const none = quantileTest([], 2, 0.9);
    expect(none.available === false && none.reason === "no-data").toBe(true);
  });

  it("throws RangeError for a quantile outside (0, 1), a NaN or an unknown option", () => {
    expect(() => quantileTest([1, 2], 1, 0)).toThrow(RangeError);
    expect(() => quantileTest([1, 2], 1, 1)).toThrow(RangeError);
    expect(() => quantileTest([1, 2], 1, NaN)).toThrow(RangeError);
    expect(() => quantileTest([1, NaN], 1, 0.5)).toThrow(RangeError);
    expect(() => quantileTest([1, 2], 1, 0.5, { alternative: "up" as Alternative })).toThrow(RangeError);
    expect(() => quantileTest([1, 2], 1, 0.5, { twoSidedRule: "fisher" as TwoSidedRule })).toThrow(RangeError);
  });
});

describe("quantileTest properties (fast-check)", () => {
  const quantile = fc.double({ min: 0.01, max: 0.99, noNaN: true });
  const counts = fc.tuple(fc.nat({ max: 300 }), fc.nat({ max: 300 })).filter(([b, a]) => b + a > 0);
  const rule = fc.constantFrom<TwoSidedRule>("doubling", "minimum-likelihood");

  it("p lies in [0, 1]", () => {
    fc.assert(
      fc.property(
        counts,
        quantile,
        fc.constantFrom<Alternative>("greater", "less", "two-sided"),
        rule,
        ([b, a], q, alternative, twoSidedRule) => {
          const p = run(sample(b, a), 1, q, { alternative, twoSidedRule }).pValue;
          expect(p >= 0 && p <= 1).toBe(true);
        },
      ),
    );
  });

  it("reflection symmetry: negating the data and using 1 - q swaps greater and less", () => {
    fc.assert(
      fc.property(counts, quantile, rule, ([b, a], q, twoSidedRule) => {
        const values = sample(b, a);
        const mirrored = values.map((x) => -x);
        const greater = run(values, 1, q, { alternative: "greater" }).pValue;
        const mirroredLess = run(mirrored, -1, 1 - q, { alternative: "less" }).pValue;
        expect(relErr(mirroredLess, greater)).toBeLessThan(1e-11);
        const two = run(values, 1, q, { twoSidedRule }).pValue;
        const mirroredTwo = run(mirrored, -1, 1 - q, { twoSidedRule }).pValue;
        expect(relErr(mirroredTwo, two)).toBeLessThan(1e-11);
      }),
    );
  });

  it("two-sided is at least the one-sided p-value in the direction of the data", () => {
    fc.assert(
      fc.property(counts, quantile, rule, ([b, a], q, twoSidedRule) => {
        const values = sample(b, a);
        const smaller = Math.min(run(values, 1, q, { alternative: "greater" }).pValue, run(values, 1, q, { alternative: "less" }).pValue);
        expect(run(values, 1, q, { twoSidedRule }).pValue).toBeGreaterThanOrEqual(smaller);
      }),
    );
  });

  it("p is monotone in the count below", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 400 }), fc.nat(), quantile, (n, raw, q) => {
        const below = raw % n;
        const p = (k: number, alternative: Alternative) => run(sample(k, n - k), 1, q, { alternative }).pValue;
        expect(p(below + 1, "greater")).toBeGreaterThanOrEqual(p(below, "greater"));
        expect(p(below + 1, "less")).toBeLessThanOrEqual(p(below, "less"));
      }),
    );
  });
});
