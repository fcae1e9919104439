import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { differenceMatrix, differenceOrderStatistic, differenceOrderStatistics } from "../../src/stats/differenceSelection";
import { rankSumTest } from "../../src/stats/rankSum";
import { shiftBounds, shiftEstimate, type ShiftResult } from "../../src/stats/shiftBounds";

function available(r: ReturnType<typeof shiftBounds>): ShiftResult {
  if (!r.available) throw new Error(r.message);
  return r;
}

/** All m·n differences second − first, sorted: the brute-force reference. */
function allDifferences(first: number[], second: number[]): number[] {
  const d: number[] = [];
  for (const b of second) for (const a of first) d.push(b - a);
  return d.sort((x, y) => x - y);
}

const sorted = (v: number[]) => Float64Array.from(v).sort();

describe("differenceOrderStatistic against the sorted list of every difference (brute force)", () => {
  it("gives every rank, with and without ties, small and large enough to take the sampling rounds", () => {
    const value = fc.oneof(fc.integer({ min: -20, max: 20 }), fc.double({ min: -1e3, max: 1e3, noNaN: true }));
    fc.assert(
      fc.property(
        fc.array(value, { minLength: 1, maxLength: 250 }),
        fc.array(value, { minLength: 1, maxLength: 250 }),
        fc.nat(),
        (x, y, seed) => {
          const d = allDifferences(x, y);
          const matrix = differenceMatrix(sorted(x), sorted(y));
          const ranks = [1, d.length, 1 + (seed % d.length), Math.ceil(d.length / 2)];
          for (const k of ranks) expect(differenceOrderStatistic(matrix, k)).toBe(d[k - 1]);
          // Several at once, as SHIFT asks for them: close together around the middle, and spread out.
          const middle = Math.ceil(d.length / 2);
          const near = [middle, Math.max(1, middle - 1 - (seed % 50)), Math.min(d.length, middle + 1 + (seed % 70))];
          expect(differenceOrderStatistics(matrix, near)).toEqual(near.map((k) => d[k - 1]));
          expect(differenceOrderStatistics(matrix, ranks)).toEqual(ranks.map((k) => d[k - 1]));
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe("differenceOrderStatistics on samples large enough for the thinned matrix (p + q >= 20,000 distinct values)", () => {
  /** Pairs with second − first below v and at most v, counted over every pair: the definition of the k-th difference. */
  function countsAt(first: Float64Array, second: Float64Array, v: number): { less: number; atMost: number } {
    let less = 0;
    let atMost = 0;
    for (let j = 0; j < second.length; j++) {
      const y = second[j];
      for (let i = 0; i < first.length; i++) {
        const d = y - first[i];
        less += +(d < v);
        atMost += +(d <= v);
      }
    }
    return { less, atMost };
  }

  it("gives the k-th difference (fewer than k pairs below it, at least k at or below it; brute-force count), with and without ties", () => {
    let seed = 11;
    const next = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32;
    const shapes: [string, () => number, () => number][] = [
      ["no repeats", () => 50 + next() * 12, () => 50.3 + next() * 12],
      [
        "two decimals jittered",
        () => 44 + Math.round(next() * 1200) / 100 + next() * 1e-3,
        () => 44.3 + Math.round(next() * 1200) / 100 + next() * 1e-3,
      ],
      [
        "repeats and far outliers",
        () => (next() < 0.01 ? 1e6 * next() : Math.round(next() * 4e5) / 40),
        () => (next() < 0.02 ? -1e5 : Math.round(next() * 3e3) / 3),
      ],
    ];
    for (const [, drawFirst, drawSecond] of shapes) {
      const first = Float64Array.from({ length: 21_000 }, drawFirst);
      const second = Float64Array.from({ length: 1_500 }, drawSecond);
      const matrix = differenceMatrix(first, second);
      expect(matrix.a.values.length + matrix.b.values.length).toBeGreaterThanOrEqual(20_000);
      const pairs = first.length * second.length;
      const middle = pairs / 2;
      const ranks = [1, Math.round(pairs * 0.03), middle - 70_000, middle, middle + 1, pairs];
      const got = differenceOrderStatistics(matrix, ranks);
      ranks.forEach((k, r) => {
        const { less, atMost } = countsAt(first, second, got[r]);
        expect(less).toBeLessThan(k);
        expect(atMost).toBeGreaterThanOrEqual(k);
      });
    }
  });
});

describe("shiftBounds", () => {
  it("gives the documented example (exact arithmetic: 19 of the C(11, 5) = 462 arrangements have U <= 5)", () => {
    const r = available(shiftBounds([10.1, 11.4, 9.8, 10.6, 10.9], [11.9, 12.4, 11.1, 12.8, 12.2, 11.6], { confidence: 0.9 }));
    expect(r.estimate).toBe(1.4500000000000002);
    expect(r.boundRank).toBe(6);
    expect(r.lower).toBe(11.6 - 10.9);
    expect(r.upper).toBe(12.8 - 10.6);
    expect(r.achievedConfidence).toBeCloseTo(1 - 38 / 462, 15);
    expect(r.method).toBe("exact");
  });

  it("estimate is the median of all differences; bounds are the k-th smallest and largest (brute force)", () => {
    const value = fc.integer({ min: -1000, max: 1000 }).map((v) => v / 8);
    fc.assert(
      fc.property(fc.array(value, { minLength: 4, maxLength: 40 }), fc.array(value, { minLength: 4, maxLength: 40 }), (x, y) => {
        const d = allDifferences(x, y);
        const median = d.length % 2 === 1 ? d[(d.length - 1) / 2] : (d[d.length / 2 - 1] + d[d.length / 2]) / 2;
        expect(shiftEstimate(x, y)).toBe(median);
        const r = shiftBounds(x, y, { confidence: 0.9 });
        if (!r.available) return;
        expect(r.estimate).toBe(median);
        expect(r.lower).toBe(d[r.boundRank - 1]);
        expect(r.upper).toBe(d[d.length - r.boundRank]);
        expect(r.achievedConfidence).toBeGreaterThanOrEqual(0.9);
      }),
      { numRuns: 150 },
    );
  });

  it("swapping the groups negates the estimate and swaps and negates the bounds", () => {
    const value = fc.integer({ min: -1000, max: 1000 }).map((v) => v / 4);
    fc.assert(
      fc.property(fc.array(value, { minLength: 5, maxLength: 60 }), fc.array(value, { minLength: 5, maxLength: 60 }), (x, y) => {
        const forward = available(shiftBounds(x, y, { confidence: 0.8 }));
        const back = available(shiftBounds(y, x, { confidence: 0.8 }));
        expect(back.estimate).toBe(-forward.estimate + 0);
        expect(back.lower).toBe(-(forward.upper as number) + 0);
        expect(back.upper).toBe(-(forward.lower as number) + 0);
        expect(back.achievedConfidence).toBe(forward.achievedConfidence);
      }),
      { numRuns: 100 },
    );
  });

  it("adding a constant to the second group moves the estimate and bounds by it (integers: exact arithmetic)", () => {
    const value = fc.integer({ min: -1000, max: 1000 });
    fc.assert(
      fc.property(
        fc.array(value, { minLength: 5, maxLength: 60 }),
        fc.array(value, { minLength: 5, maxLength: 60 }),
        fc.integer({ min: -500, max: 500 }),
        (x, y, c) => {
          const before = available(shiftBounds(x, y));
          const after = available(
            shiftBounds(
              x,
              y.map((v) => v + c),
            ),
          );
          expect(after.estimate).toBe(before.estimate + c);
          expect(after.lower).toBe((before.lower as number) + c);
          expect(after.upper).toBe((before.upper as number) + c);
        },
      ),
      { numRuns: 100 },
    );
  });

  it("bounds and test are dual: shifts just inside the bounds are not rejected at 1 − confidence, just outside they are", () => {
    const value = fc.integer({ min: 0, max: 1_000_000 }).map((v) => v / 1000);
    fc.assert(
      fc.property(
        fc.uniqueArray(value, { minLength: 4, maxLength: 25 }),
        fc.uniqueArray(value, { minLength: 4, maxLength: 25 }),
        (x, y) => {
          const d = allDifferences(x, y);
          if (new Set(d).size !== d.length) return; // continuous case: no tied differences
          const r = shiftBounds(x, y, { confidence: 0.9 });
          if (!r.available) return;
          const alpha = 1 - r.confidence;
          const k = r.boundRank;
          const p = (shift: number) => {
            const t = rankSumTest(x, y, { shift, method: "exact" });
            if (!t.available) throw new Error(t.message);
            return t.pValue;
          };
          const lowInside = (d[k - 1] + d[k]) / 2;
          const highInside = (d[d.length - k - 1] + d[d.length - k]) / 2;
          expect(p(lowInside)).toBeGreaterThan(alpha);
          expect(p(highInside)).toBeGreaterThan(alpha);
          if (k >= 2) expect(p((d[k - 2] + d[k - 1]) / 2)).toBeLessThanOrEqual(alpha);
          if (k >= 2) expect(p((d[d.length - k] + d[d.length - k + 1]) / 2)).toBeLessThanOrEqual(alpha);
          expect(p(d[0] - 1)).toBeLessThanOrEqual(alpha);
        },
      ),
      { numRuns: 60 },
    );
  });

  it("one-sided bounds leave the other end empty; too small groups say how large they need to be", () => {
    const lower = available(shiftBounds([1, 2, 3, 4, 5], [3, 4, 5, 6, 7], { side: "lower" }));
    expect(lower.upper).toBeNull();
    expect(lower.lower).not.toBeNull();
    const tooFew = shiftBounds([1, 2], [3, 4]);
    expect(tooFew.available).toBe(false);
    if (!tooFew.available) expect(tooFew.message).toMatch(/4 values in each/); // 1/C(8, 4) = 1/70 <= 0.025 < 1/C(6, 3) = 1/20
  });

  it("refuses differences beyond the largest double instead of giving an infinite shift", () => {
    expect(shiftBounds([-1.7e308, 0], [1.7e308, 1]).available).toBe(false);
    expect(typeof shiftEstimate([-1.7e308], [1.7e308])).toBe("object");
  });
});
