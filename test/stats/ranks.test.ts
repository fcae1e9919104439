import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { greatestCommonDivisor, mergeRanks, midranks, sortFloat64 } from "../../src/stats/ranks";

/** Reference order: Float64Array.prototype.sort without a comparator (ECMA-262: numeric, -0 before +0). */
const referenceSort = (x: number[]) => Float64Array.from(x).sort();

const awkward = fc.constantFrom(0, -0, Infinity, -Infinity, 5e-324, -5e-324, 2.2250738585072014e-308, -1e308, 1e308, 1, -1);
const values = fc.oneof(
  { weight: 3, arbitrary: fc.double({ noNaN: true }) },
  { weight: 2, arbitrary: fc.integer({ min: -50, max: 50 }) },
  { weight: 1, arbitrary: awkward },
);

function sameBits(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

describe("sortFloat64", () => {
  it("orders like the built-in typed-array sort, short arrays and radix-sized ones", () => {
    fc.assert(
      fc.property(fc.array(values, { maxLength: 300 }), (x) => {
        expect(sameBits(sortFloat64(Float64Array.from(x)), referenceSort(x))).toBe(true);
      }),
      { numRuns: 300 },
    );
    // Radix-sized arrays of the same awkward mixture (-0, subnormals of both signs, infinities).
    fc.assert(
      fc.property(fc.array(values, { minLength: 1100, maxLength: 2500 }), (x) => {
        expect(sameBits(sortFloat64(Float64Array.from(x)), referenceSort(x))).toBe(true);
      }),
      { numRuns: 40 },
    );
    // Radix path: long arrays of several shapes (random doubles, two-decimal data that skip low digits, mixed signs).
    let seed = 7;
    const next = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32;
    const shapes = [
      () => (next() - 0.5) * 1e6,
      () => Math.round(next() * 20000) / 100,
      () => (next() < 0.5 ? -1 : 1) * Math.round(next() * 50),
      () => (next() < 0.01 ? -0 : next() < 0.02 ? Infinity : -(next() * 1e-300)),
      // Measurements with more digits than the high 32 bits hold apart: the high passes and an insertion pass.
      () => 44 + Math.round(next() * 1200) / 100 + next() * 1e-3,
      // Values sharing their high 32 bits, most of them: the insertion pass gives up and all six passes run.
      () => (next() < 0.5 ? -1 : 1) * (1 + next() * 1e-9),
    ];
    for (const shape of shapes) {
      const x = Array.from({ length: 50_000 }, shape);
      expect(sameBits(sortFloat64(Float64Array.from(x)), referenceSort(x))).toBe(true);
    }
  });

  it("sorts in place, returns its argument, and rejects NaN", () => {
    const a = new Float64Array([3, -1, 2.5, -Infinity]);
    expect(sortFloat64(a)).toBe(a);
    expect(Array.from(a)).toEqual([-Infinity, -1, 2.5, 3]);
    expect(() => sortFloat64(new Float64Array([1, NaN]))).toThrow(RangeError);
    expect(() => sortFloat64(new Float64Array(10_000).fill(NaN))).toThrow(RangeError);
  });

  it("sorts a view into a larger buffer without touching the rest", () => {
    const buffer = new Float64Array(10_002).map((_, i) => 10_002 - i);
    const view = buffer.subarray(1, 10_001);
    sortFloat64(view);
    expect(buffer[0]).toBe(10_002);
    expect(buffer[10_001]).toBe(1);
    expect(view[0]).toBe(2);
    expect(view[9_999]).toBe(10_001);
  });
});

describe("midranks", () => {
  it("equals the definition (Kendall 1945): number below + (number tied + 1) / 2", () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(fc.integer({ min: -5, max: 5 }), fc.double({ noNaN: true })), { maxLength: 200 }), (x) => {
        const got = midranks(x);
        x.forEach((v, i) => {
          const below = x.filter((w) => w < v).length;
          const tied = x.filter((w) => w === v).length;
          expect(got[i]).toBe(below + (tied + 1) / 2);
        });
      }),
      { numRuns: 200 },
    );
  });

  it("worked example", () => {
    expect(Array.from(midranks([10, 30, 20, 30]))).toEqual([1, 3.5, 2, 3.5]);
  });
});

describe("mergeRanks", () => {
  /** Brute force: pool, give every value the average of the positions it occupies (Kendall's mid-ranks), sum the second sample's. */
  function pooledReference(first: number[], second: number[], before: number) {
    const pooled = [...first, ...second].sort((a, b) => a - b);
    const midrank = (v: number) => {
      const lo = pooled.indexOf(v);
      const hi = pooled.lastIndexOf(v);
      return before + (lo + hi + 2) / 2;
    };
    const counts = new Map<number, number>();
    for (const v of pooled) counts.set(v, (counts.get(v) ?? 0) + 1);
    let tieSum = 0;
    for (const t of counts.values()) tieSum += t * t * t - t;
    return { twiceSecondRankSum: 2 * second.reduce((s, v) => s + midrank(v), 0), tieSum, groups: counts.size };
  }

  it("equals brute-force mid-ranks of the pooled samples, with ties across and within them (Kendall, 1945)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 6 }), { maxLength: 12 }),
        fc.array(fc.integer({ min: 0, max: 6 }), { maxLength: 12 }),
        fc.integer({ min: 0, max: 5 }),
        (a, b, before) => {
          const first = Float64Array.from(a).sort();
          const second = Float64Array.from(b).sort();
          const merged = mergeRanks(first, second, before);
          const expected = pooledReference(a, b, before);
          expect(merged.twiceSecondRankSum).toBe(expected.twiceSecondRankSum);
          expect(merged.tieSum).toBe(expected.tieSum);
          expect(merged.groupScores.length).toBe(expected.groups);
          expect(merged.groupSizes.reduce((s, t) => s + t, 0)).toBe(a.length + b.length);
          expect(merged.groupSecond.reduce((s, t) => s + t, 0)).toBe(b.length);
          expect(mergeRanks(first, second, before, false).groupScores).toEqual([]);
        },
      ),
    );
  });

  it("matches its documented example, and Euclid's divisor", () => {
    expect(mergeRanks(Float64Array.of(1, 3), Float64Array.of(3, 4))).toEqual({
      twiceSecondRankSum: 13,
      tieSum: 6,
      groupScores: [2, 5, 8],
      groupSizes: [1, 2, 1],
      groupSecond: [0, 1, 1],
    });
    expect(greatestCommonDivisor(12, 18)).toBe(6);
    expect(greatestCommonDivisor(7, 0)).toBe(7);
  });
});
