import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { signTestFixture as fixtures } from "../fixtures/signTestFixture";
import { boundRanks, minimumSampleSize, quantileBounds, type QuantileBoundsResult } from "../../src/stats/quantileBounds";
import { quantileTest } from "../../src/stats/quantileTest";
import type { BoundSide } from "../../src/stats/types";
import { TRIOLA_A7, TRIOLA_ALPHAS } from "./signFamilyTables";
import { add, compare, exactBinomial, exactLower, exactUpper, fromNumber, subtract, ONE, toNumber, type Fraction } from "./signFamilyExact";

function bounds(values: ArrayLike<number>, options: Parameters<typeof quantileBounds>[1] = {}): QuantileBoundsResult {
  const r = quantileBounds(values, options);
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

function ranks(n: number, q: number, confidence: number, side: BoundSide) {
  const r = boundRanks(n, q, confidence, side);
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

/** Park–Miller minimal standard generator (1988): deterministic data for the simulation and large-n checks. */
function lcg(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 48271) % 2147483647;
    return s / 2147483647;
  };
}

/** Confidence as an exact fraction: percent / 100 (the decimal a person types), or a double's exact value. */
function exactConfidence(confidence: number): Fraction {
  const percent = confidence * 100;
  const rounded = Math.round(percent * 1e6) / 1e6;
  if (Math.abs(percent - rounded) < 1e-9 && Number.isInteger(rounded * 1e6))
    return { num: BigInt(Math.round(rounded * 1e6)), den: 100_000_000n };
  return fromNumber(confidence);
}

/** Miss allowed per bounded tail, in exact arithmetic: (1 - confidence) / 2 or 1 - confidence. */
function exactAllowance(confidence: number, side: BoundSide): Fraction {
  const miss = subtract(ONE, exactConfidence(confidence));
  return side === "two-sided" ? { num: miss.num, den: miss.den * 2n } : miss;
}

/**
 * Ranks and coverage from exact rational sums for q = a / b and the decimal confidence (the definition, evaluated
 * without rounding). quantileBounds forgives rounding so that decimal coincidences (0.1^2 = 1 - 0.99) count as in
 * exact arithmetic; this is the exact arithmetic it should agree with.
 */
function exactRanks(n: number, a: number, b: number, confidence: number, side: BoundSide) {
  const dist = exactBinomial(n, a, b);
  const allowance = exactAllowance(confidence, side);
  let lower: number | null = null;
  if (side !== "upper") for (let k = 0; k <= n - 1 && compare(exactLower(dist, k), allowance) <= 0; k++) lower = k + 1;
  let upper: number | null = null;
  if (side !== "lower") for (let u = n; u >= 1 && compare(exactUpper(dist, u), allowance) <= 0; u--) upper = u;
  const available = (side === "upper" || lower !== null) && (side === "lower" || upper !== null);
  let coverage: Fraction = ONE;
  if (lower !== null && side !== "upper") coverage = subtract(coverage, exactLower(dist, lower - 1));
  if (upper !== null && side !== "lower") coverage = subtract(coverage, exactUpper(dist, upper));
  return { available, lower: side === "upper" ? null : lower, upper: side === "lower" ? null : upper, coverage, dist, allowance };
}

const SIDES: readonly BoundSide[] = ["two-sided", "lower", "upper"];
const RATIONAL_Q: readonly [number, number][] = [
  [1, 2],
  [1, 4],
  [1, 10],
  [9, 10],
  [2, 3],
  [3, 20],
];

describe("boundRanks against R 4.2 pbinom/qbinom (test/fixtures/signTest.R)", () => {
  const cases = fixtures.bounds;
  it(`gives the same ranks and coverage in ${cases.length} generated cases up to n = 1e6`, () => {
    let worst = 0;
    for (const c of cases) {
      const r = boundRanks(c.n, c.quantile, c.confidence, c.side);
      expect({ ...c, got: r.available }).toEqual({ ...c, got: c.available });
      if (!r.available || c.achievedConfidence === null) continue;
      expect({ ...c, lowerRank: r.lowerRank, upperRank: r.upperRank }).toEqual(c);
      worst = Math.max(worst, Math.abs(r.achievedConfidence - c.achievedConfidence));
    }
    expect(worst).toBeLessThan(1e-12);
  });
});

describe("boundRanks against exact BigInt arithmetic", () => {
  it("ranks and achieved confidence for n <= 90, six rational quantiles, six confidences, every side", () => {
    let worst = 0;
    for (const [a, b] of RATIONAL_Q) {
      for (const confidence of [0.8, 0.9, 0.95, 0.99, 0.999, 0.75]) {
        for (const side of SIDES) {
          for (let n = 1; n <= 90; n++) {
            const want = exactRanks(n, a, b, confidence, side);
            const got = boundRanks(n, a / b, confidence, side);
            expect({ n, a, b, confidence, side, available: got.available }).toEqual({
              n,
              a,
              b,
              confidence,
              side,
              available: want.available,
            });
            if (!got.available) {
              expect(got.minimumN).toBeGreaterThan(n);
              continue;
            }
            expect({ n, a, b, side, lower: got.lowerRank, upper: got.upperRank }).toEqual({
              n,
              a,
              b,
              side,
              lower: want.lower,
              upper: want.upper,
            });
            worst = Math.max(worst, Math.abs(got.achievedConfidence - toNumber(want.coverage)));
          }
        }
      }
    }
    expect(worst).toBeLessThan(1e-14);
  });

  it("minimumN is the smallest n that reaches the level (exact search)", () => {
    for (const [a, b] of RATIONAL_Q) {
      for (const confidence of [0.5, 0.8, 0.95, 0.99, 0.999]) {
        for (const side of SIDES) {
          const m = minimumSampleSize(a / b, confidence, side);
          // 0.5 = 1 - 0.5 and 0.999 are decimal confidences; exactRanks reads them as such.
          expect(exactRanks(m, a, b, confidence, side).available).toBe(true);
          if (m > 1) expect(exactRanks(m - 1, a, b, confidence, side).available).toBe(false);
        }
      }
    }
  });

  it("minimumN for extreme quantiles beyond any spreadsheet", () => {
    // 0.5^n <= 0.025 needs n = 6; (1 - 1e-6)^n <= 0.05 needs n = ceil(log(0.05) / log1p(-1e-6)) = 2 995 731 (hand computation)
    expect(minimumSampleSize(0.5, 0.95)).toBe(6);
    expect(minimumSampleSize(1e-6, 0.95, "lower")).toBe(2_995_731);
    expect(minimumSampleSize(0.9, 0.95, "upper")).toBe(29);
    expect(minimumSampleSize(0.9, 0.95, "lower")).toBe(2);
    expect(minimumSampleSize(1e-12, 0.99, "lower")).toBeGreaterThan(1e12);
  });
});

// Published source: M. F. Triola, "Elementary Statistics", Table A-7 (details beside the table in signFamilyTables.ts).
// A sign test rejecting at two-tailed alpha when the smaller count is <= c has the interval [X(c+1), X(n-c)] as
// its 1 - alpha confidence interval for the median (the test-interval duality, common practice).
describe("median bounds against a published table of sign-test critical values (Triola, Table A-7)", () => {
  it("two-sided ranks at 99%, 98%, 95% and 90%, and minimumN where the table has no entry", () => {
    TRIOLA_ALPHAS.forEach((alpha, column) => {
      const confidence = 1 - alpha;
      let firstN: number | null = null;
      for (const [nText, row] of Object.entries(TRIOLA_A7)) {
        const n = Number(nText);
        const critical = row[column];
        const r = boundRanks(n, 0.5, confidence, "two-sided");
        if (critical === null) {
          expect(r.available).toBe(false);
          continue;
        }
        firstN ??= n;
        expect(r.available && [r.lowerRank, r.upperRank]).toEqual([critical + 1, n - critical]);
      }
      expect(minimumSampleSize(0.5, confidence)).toBe(firstN);
    });
  });

  it("one-sided ranks from the one-tailed columns", () => {
    TRIOLA_ALPHAS.forEach((alpha, column) => {
      const confidence = 1 - alpha / 2;
      for (const [nText, row] of Object.entries(TRIOLA_A7)) {
        const n = Number(nText);
        const critical = row[column];
        const lower = boundRanks(n, 0.5, confidence, "lower");
        const upper = boundRanks(n, 0.5, confidence, "upper");
        if (critical === null) {
          expect(lower.available || upper.available).toBe(false);
          continue;
        }
        expect(lower.available && lower.lowerRank).toBe(critical + 1);
        expect(upper.available && upper.upperRank).toBe(n - critical);
      }
    });
  });
});

describe("quantileBounds on data", () => {
  // Invented readings (test data of our own).
  const readings = [7.1, 3.2, 5.5, 9.8, 4.4, 6.0, 8.3, 2.9, 5.1, 6.6];

  it("returns the order statistics at the exact ranks and does not touch the input", () => {
    const copy = readings.slice();
    const r = bounds(readings);
    expect(readings).toEqual(copy);
    // n = 10: [X(2), X(9)], coverage 1 - 2 × 11/1024 = 0.978515625 (hand computation; Triola Table A-7, n = 10)
    expect([r.lower, r.upper, r.lowerRank, r.upperRank, r.achievedConfidence]).toEqual([3.2, 8.3, 2, 9, 0.978515625]);
    expect([r.n, r.quantile, r.confidence, r.side, r.method, r.interpolation]).toEqual([10, 0.5, 0.95, "two-sided", "exact", null]);
  });

  it("one-sided bounds leave the other end null", () => {
    // One-sided 95% at n = 10: P(B <= 1) = 11/1024 <= 0.05 < P(B <= 2) = 56/1024, so X(2) (hand computation).
    const lower = bounds(readings, { side: "lower" });
    expect([lower.lower, lower.upper, lower.lowerRank, lower.upperRank]).toEqual([3.2, null, 2, null]);
    const upper = bounds(readings, { side: "upper", quantile: 0.25, confidence: 0.9 });
    expect(upper.lower).toBeNull();
    expect(upper.upper).toBe([...readings].sort((x, y) => x - y)[(upper.upperRank as number) - 1]);
  });

  it("matches a published worked example: statpsych ci.median help page (D. G. Bonett), n = 19 -> [10.8, 30.9]", () => {
    // Example data and output as printed in the statpsych R package documentation for ci.median. That page uses a
    // normal-approximation rank, which here picks the same order statistics as the exact ranks (5th and 15th).
    const y = [30.2, 20.4, 15.1, 10.2, 10.5, 60.8, 20.8, 25.0, 20.7, 30.9, 10.8, 5.1, 50.9, 40.0, 20.9, 10.8, 0, 20.5, 50.8];
    const r = bounds(y);
    expect([r.lower, r.upper, r.lowerRank, r.upperRank]).toEqual([10.8, 30.9, 5, 15]);
  });

  it("agrees with a full sort on 300 000 values (any quantile and side)", () => {
    const r = lcg(99);
    const values = Float64Array.from({ length: 300_000 }, () => Math.floor(r() * 1e6) / 100);
    const sorted = values.slice().sort();
    for (const [quantile, side] of [
      [0.5, "two-sided"],
      [0.99, "two-sided"],
      [0.03, "lower"],
      [0.8, "upper"],
    ] as const) {
      const b = bounds(values, { quantile, side, confidence: 0.99 });
      if (b.lowerRank !== null) expect(b.lower).toBe(sorted[b.lowerRank - 1]);
      if (b.upperRank !== null) expect(b.upper).toBe(sorted[b.upperRank - 1]);
    }
  });

  it("is unavailable with minimumN for too few values, and for none", () => {
    const few = quantileBounds([1, 2, 3, 4, 5]);
    expect(few.available).toBe(false);
    if (!few.available) {
      expect([few.reason, few.minimumN]).toEqual(["too-few-values", 6]);
      expect(few.message).toBe("5 values are too few for 95% two-sided bounds for the median: at least 6 are needed.");
    }
    const one = quantileBounds([1], { quantile: 0.9, side: "upper", confidence: 0.8 });
    expect(
      one.available === false && one.minimumN === 16 && /1 value is too few .* upper bound for the 0.9 quantile/.test(one.message),
    ).toBe(true);
    const none = quantileBounds([]);
    expect(none.available === false && none.reason === "no-data" && none.minimumN === 6).toBe(true);
  });

  it("throws RangeError for programming errors", () => {
    expect(() => quantileBounds([1, NaN, 3])).toThrow(RangeError);
    expect(() => quantileBounds([1, Infinity, 3])).toThrow(RangeError);
    expect(() => quantileBounds([1, 2], { quantile: 1 })).toThrow(RangeError);
    expect(() => quantileBounds([1, 2], { confidence: 0 })).toThrow(RangeError);
    expect(() => quantileBounds([1, 2], { side: "both" as BoundSide })).toThrow(RangeError);
    expect(() => quantileBounds([1, 2], { method: "spline" as "exact" })).toThrow(RangeError);
    expect(() => quantileBounds([1, 2], { method: "interpolated", quantile: 0.25 })).toThrow(RangeError);
    expect(() => quantileBounds([1, 2], { method: "interpolated", side: "lower", confidence: 0.5 })).toThrow(RangeError);
    expect(() => boundRanks(2.5, 0.5, 0.9)).toThrow(RangeError);
    expect(() => boundRanks(10, 1, 0.9)).toThrow(RangeError);
    expect(() => minimumSampleSize(0.5, 1)).toThrow(RangeError);
  });

  it("median ranks are symmetric, l + u = n + 1, for n <= 400", () => {
    for (let n = 6; n <= 400; n++) {
      for (const confidence of [0.9, 0.95, 0.99]) {
        const r = boundRanks(n, 0.5, confidence);
        if (r.available) expect((r.lowerRank as number) + (r.upperRank as number)).toBe(n + 1);
      }
    }
  });
});

describe("interpolated median bounds (Hettmansperger & Sheather 1986)", () => {
  const oneToTen = [10, 1, 9, 2, 8, 3, 7, 4, 6, 5];

  it("reproduces the paper's formula by hand at n = 10, 95%", () => {
    // d = 2: gamma_2 = 1 - 2 × 11/1024 = 0.978515625, gamma_3 = 1 - 2 × 56/1024 = 0.890625,
    // I = (gamma_2 - 0.95) / (gamma_2 - gamma_3) = 73/225, lambda = (n - d) I / (d + (n - 2d) I) = 73/111.
    const r = bounds(oneToTen, { method: "interpolated" });
    const lambda = 73 / 111;
    expect(r.interpolation?.weight).toBeCloseTo(lambda, 13);
    expect(r.lower).toBeCloseTo(2 + lambda, 13);
    expect(r.upper).toBeCloseTo(9 - lambda, 13);
    expect([r.lowerRank, r.upperRank, r.achievedConfidence]).toEqual([2, 9, 0.95]);
    expect(r.interpolation?.outerConfidence).toBeCloseTo(0.978515625, 15);
    expect(r.interpolation?.innerConfidence).toBeCloseTo(0.890625, 15);
  });

  it("gives the exact bounds (weight 0) when the confidence equals an exact level", () => {
    const r = bounds(oneToTen, { method: "interpolated", confidence: 0.978515625 });
    expect([r.lower, r.upper, r.lowerRank, r.interpolation?.weight]).toEqual([2, 9, 2, 0]);
  });

  it("a one-sided bound is the end of the two-sided interval at 2 confidence - 1", () => {
    const values = Array.from({ length: 37 }, (_, i) => Math.sqrt(i + 1) * (i % 2 ? 1 : 3));
    const two = bounds(values, { method: "interpolated", confidence: 0.9 });
    const lower = bounds(values, { method: "interpolated", confidence: 0.95, side: "lower" });
    const upper = bounds(values, { method: "interpolated", confidence: 0.95, side: "upper" });
    expect(lower.lower).toBeCloseTo(two.lower as number, 12);
    expect(lower.upper).toBeNull();
    expect(upper.upper).toBeCloseTo(two.upper as number, 12);
    expect(upper.lower).toBeNull();
    expect(lower.interpolation?.outerConfidence).toBeCloseTo(1 - (1 - (two.interpolation?.outerConfidence as number)) / 2, 14);
  });

  it("falls back to the exact bounds when they are already the middle two values", () => {
    // n = 2 at 40%: d = 1 and no order statistic lies further in.
    const r = bounds([5, 3], { method: "interpolated", confidence: 0.4 });
    expect([r.lower, r.upper, r.interpolation]).toEqual([3, 5, null]);
    expect(r.achievedConfidence).toBeCloseTo(0.5, 15); // 1 - 2 × (1/2)^2, hand computation
  });

  it("lies between the exact interval and the next one in (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 6, maxLength: 120 }),
        fc.double({ min: 0.6, max: 0.995, noNaN: true }),
        (xs, confidence) => {
          const r = quantileBounds(xs, { method: "interpolated", confidence });
          const exact = quantileBounds(xs, { confidence });
          if (!r.available || !exact.available) {
            expect(r.available).toBe(exact.available);
            return;
          }
          const sorted = [...xs].sort((x, y) => x - y);
          const d = r.lowerRank as number;
          expect(r.lower as number).toBeGreaterThanOrEqual(sorted[d - 1] - 1e-9);
          expect(r.upper as number).toBeLessThanOrEqual(sorted[xs.length - d] + 1e-9);
          if (r.interpolation) {
            expect(r.lower as number).toBeLessThanOrEqual(sorted[d] + 1e-9);
            expect(r.upper as number).toBeGreaterThanOrEqual(sorted[xs.length - d - 1] - 1e-9);
            expect(r.interpolation.weight).toBeGreaterThanOrEqual(0);
            expect(r.interpolation.weight).toBeLessThanOrEqual(1);
            expect(r.interpolation.innerConfidence).toBeLessThan(confidence);
            expect(r.interpolation.outerConfidence).toBeGreaterThanOrEqual(confidence);
          }
        },
      ),
    );
  });

  it("covers close to the nominal level for symmetric populations, as the paper reports (seeded simulation)", () => {
    // Hettmansperger & Sheather (1986) show the interpolated interval's coverage is very near the nominal level
    // for symmetric populations; 20 000 normal samples of 15 at 95% give a standard error of about 0.0015.
    const random = lcg(2024);
    const normal = () => Math.sqrt(-2 * Math.log(random())) * Math.cos(2 * Math.PI * random());
    let covered = 0;
    let exactCovered = 0;
    const reps = 20_000;
    const sample = new Float64Array(15);
    for (let rep = 0; rep < reps; rep++) {
      for (let i = 0; i < sample.length; i++) sample[i] = normal();
      const r = bounds(sample, { method: "interpolated" });
      if ((r.lower as number) <= 0 && 0 <= (r.upper as number)) covered++;
      const e = bounds(sample);
      if ((e.lower as number) <= 0 && 0 <= (e.upper as number)) exactCovered++;
    }
    expect(Math.abs(covered / reps - 0.95)).toBeLessThan(0.01);
    // The exact interval at n = 15 is [X(4), X(12)] with coverage 0.96484375 (Triola Table A-7, n = 15; hand computation).
    expect(Math.abs(exactCovered / reps - 0.96484375)).toBeLessThan(0.006);
  });
});

describe("quantileBounds properties (fast-check)", () => {
  const rationalQ = fc.constantFrom(...RATIONAL_Q);
  const confidence = fc.double({ min: 0.5, max: 0.999, noNaN: true });
  const side = fc.constantFrom<BoundSide>(...SIDES);

  it("exact coverage is at least the nominal confidence, computed with BigInt, and each bound is the tightest", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 160 }), rationalQ, confidence, side, (n, [a, b], conf, s) => {
        const r = boundRanks(n, a / b, conf, s);
        if (!r.available) return;
        const dist = exactBinomial(n, a, b);
        let coverage: Fraction = ONE;
        let lowerMiss: Fraction = { num: 0n, den: 1n };
        let upperMiss: Fraction = { num: 0n, den: 1n };
        if (r.lowerRank !== null) lowerMiss = exactLower(dist, r.lowerRank - 1);
        if (r.upperRank !== null) upperMiss = exactUpper(dist, r.upperRank);
        coverage = subtract(coverage, add(lowerMiss, upperMiss));
        // At least nominal, up to the documented rounding slack (relative 1e-9 of each tail's allowance plus 2^-52).
        const slack = fromNumber(2 * ((1 - conf) * 1e-9 + Number.EPSILON));
        expect(compare(add(coverage, slack), fromNumber(conf))).toBeGreaterThanOrEqual(0);
        // Tightest: one rank further in would miss more than the allowance.
        const allowance = exactAllowance(conf, s);
        if (r.lowerRank !== null && r.lowerRank < n) expect(compare(exactLower(dist, r.lowerRank), allowance)).toBe(1);
        if (r.upperRank !== null && r.upperRank > 1) expect(compare(exactUpper(dist, r.upperRank - 1), allowance)).toBe(1);
      }),
      { numRuns: 300 },
    );
  });

  // p <= alpha, with the bounds' rounding slack: a p-value that equals alpha in exact arithmetic but exceeds it by
  // a rounding error counts as rejected, as the bounds count such a tail as within the allowance.
  const rejects = (p: number, alpha: number) => p <= alpha * (1 + 1e-9) + 2 * Number.EPSILON;

  it("duality: a value inside the 1 - alpha bounds is never rejected at alpha by the doubling rule, one outside always is", () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: -500, max: 500 }), { minLength: 1, maxLength: 70 }),
        fc.double({ min: 0.3, max: 0.995, noNaN: true }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        (xs, conf, q) => {
          const alpha = 1 - conf;
          const two = quantileBounds(xs, { quantile: q, confidence: conf });
          const low = quantileBounds(xs, { quantile: q, confidence: conf, side: "lower" });
          const high = quantileBounds(xs, { quantile: q, confidence: conf, side: "upper" });
          const sorted = [...xs].sort((x, y) => x - y);
          // Candidate values: between every pair of neighbours and beyond both ends (never a sample value, so no ties).
          const candidates = [sorted[0] - 0.5, ...sorted.map((x) => x + 0.5)];
          for (const v of candidates) {
            const p = (alternative: "two-sided" | "greater" | "less") => {
              const t = quantileTest(xs, v, q, { alternative });
              if (!t.available) throw new Error("unavailable");
              return t.pValue;
            };
            if (two.available) {
              const inside = (two.lower as number) < v && v < (two.upper as number);
              expect({ v, rejected: rejects(p("two-sided"), alpha) }).toEqual({ v, rejected: !inside });
            }
            // One-sided: a lower bound pairs with "greater" (the quantile exceeds v), an upper bound with "less".
            if (low.available) expect({ v, rejected: rejects(p("greater"), alpha) }).toEqual({ v, rejected: v < (low.lower as number) });
            if (high.available) expect({ v, rejected: rejects(p("less"), alpha) }).toEqual({ v, rejected: v > (high.upper as number) });
          }
        },
      ),
      { numRuns: 150 },
    );
  });

  it("coverage grows with the confidence asked (monotone ranks)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 500 }),
        fc.double({ min: 0.02, max: 0.98, noNaN: true }),
        confidence,
        confidence,
        (n, q, c1, c2) => {
          const [lo, hi] = c1 <= c2 ? [c1, c2] : [c2, c1];
          const a = boundRanks(n, q, lo, "two-sided");
          const b = boundRanks(n, q, hi, "two-sided");
          if (!b.available) return;
          expect(a.available).toBe(true);
          if (!a.available) return;
          expect(b.lowerRank as number).toBeLessThanOrEqual(a.lowerRank as number);
          expect(b.upperRank as number).toBeGreaterThanOrEqual(a.upperRank as number);
          expect(b.achievedConfidence).toBeGreaterThanOrEqual(a.achievedConfidence - 1e-15);
        },
      ),
    );
  });
});

// The exact-ranks helper also serves as a check of itself against hand values.
describe("exact helper", () => {
  it("reproduces hand-computed ranks", () => {
    const r = exactRanks(10, 1, 2, 0.95, "two-sided");
    expect([r.lower, r.upper, toNumber(r.coverage)]).toEqual([2, 9, 0.978515625]);
    expect(ranks(10, 0.5, 0.95, "two-sided").achievedConfidence).toBe(0.978515625);
  });
});

describe("confidence near 0", () => {
  it("gives X(1) as the upper bound, never a rank of 0", () => {
    // Exact arithmetic: P(B >= 1) = 1 - (1/2)^3 = 0.875 <= 1 - 1e-11 < P(B >= 0) = 1, so u = 1 and the coverage is 1 - 0.875.
    const r = quantileBounds([3, 1, 2], { confidence: 1e-11, side: "upper" }) as QuantileBoundsResult;
    expect([r.upperRank, r.upper, r.achievedConfidence]).toEqual([1, 1, 0.125]);
    expect((boundRanks(3, 0.5, 1e-11, "upper") as { upperRank: number }).upperRank).toBe(1);
  });
});
