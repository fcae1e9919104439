import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { selectInPlace, selectManyInPlace, valuesAtRanks } from "../../src/stats/selection";

// Reference for every check: the fully sorted array (Float64Array.prototype.sort, numeric order).
function sortedCopy(a: ArrayLike<number>): Float64Array {
  return Float64Array.from(a).sort();
}

/** Numeric equality (-0 equals +0: selection may place either of two equal values). */
function expectSame(actual: number, expected: number): void {
  if (!(actual === expected)) expect(actual).toBe(expected);
}

function expectSameList(actual: ArrayLike<number>, expected: ArrayLike<number>): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expectSame(actual[i], expected[i]);
}

/** Checks that data[index] is the sorted value and that the array is partitioned around it. */
function expectPlaced(data: Float64Array, index: number, sorted: Float64Array): void {
  expectSame(data[index], sorted[index]);
  for (let i = 0; i < index; i++) if (data[i] > data[index]) throw new Error(`data[${i}] > data[${index}]`);
  for (let i = index + 1; i < data.length; i++) if (data[i] < data[index]) throw new Error(`data[${i}] < data[${index}]`);
}

/** A small deterministic generator (Park–Miller minimal standard, 1988) for large structured inputs. */
function lcg(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 48271) % 2147483647;
    return s / 2147483647;
  };
}

const patterns: Record<string, (n: number) => Float64Array> = {
  random: (n) => {
    const r = lcg(7);
    return Float64Array.from({ length: n }, () => r() * 1000 - 500);
  },
  ascending: (n) => Float64Array.from({ length: n }, (_, i) => i),
  descending: (n) => Float64Array.from({ length: n }, (_, i) => n - i),
  allEqual: (n) => new Float64Array(n).fill(3.5),
  twoValues: (n) => Float64Array.from({ length: n }, (_, i) => (i % 3 === 0 ? 1 : 2)),
  organPipe: (n) => Float64Array.from({ length: n }, (_, i) => Math.min(i, n - 1 - i)),
  sawtooth: (n) => Float64Array.from({ length: n }, (_, i) => i % 97),
  fewDistinct: (n) => {
    const r = lcg(11);
    return Float64Array.from({ length: n }, () => Math.floor(r() * 5));
  },
  signedZeros: (n) => Float64Array.from({ length: n }, (_, i) => (i % 2 === 0 ? -0 : 0) + (i % 5 === 0 ? 1 : 0)),
  sortedWithOutlier: (n) => Float64Array.from({ length: n }, (_, i) => (i === 0 ? 1e9 : i)),
};

describe("selectInPlace", () => {
  it("places the k-th smallest and partitions around it, for small arrays (property)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: true, noDefaultInfinity: false }), { minLength: 1, maxLength: 80 }), fc.nat(), (xs, k0) => {
        const data = Float64Array.from(xs);
        const k = k0 % data.length;
        const sorted = sortedCopy(data);
        expectSame(selectInPlace(data, k), sorted[k]);
        expectPlaced(data, k, sorted);
        expectSameList(sortedCopy(data), sorted); // a permutation of the input
      }),
    );
  });

  it("works on sub-ranges and leaves the rest alone", () => {
    const data = Float64Array.from([9, 8, 7, 6, 5, 4, 3, 2, 1]);
    expect(selectInPlace(data, 4, 2, 6)).toBe(5);
    expect(Array.from(data.subarray(0, 2))).toEqual([9, 8]);
    expect(Array.from(data.subarray(7))).toEqual([2, 1]);
  });

  for (const [name, make] of Object.entries(patterns)) {
    it(`handles large ${name} input (sampling branch, n = 60 001)`, () => {
      const n = 60_001;
      const base = make(n);
      const sorted = sortedCopy(base);
      for (const k of [0, 1, 599, Math.floor(n / 2) - 250, Math.floor(n / 2), n - 2, n - 1]) {
        const data = base.slice();
        expectSame(selectInPlace(data, k), sorted[k]);
        expectPlaced(data, k, sorted);
      }
    });
  }

  it("rejects an index outside the range", () => {
    const data = new Float64Array(5);
    expect(() => selectInPlace(data, 5)).toThrow(RangeError);
    expect(() => selectInPlace(data, -1)).toThrow(RangeError);
    expect(() => selectInPlace(data, 1.5)).toThrow(RangeError);
    expect(() => selectInPlace(data, 1, 2, 4)).toThrow(RangeError);
    expect(() => selectInPlace(new Float64Array(0), 0)).toThrow(RangeError);
  });
});

describe("selectManyInPlace", () => {
  it("returns the sorted values at every requested index, in request order (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 120 }),
        fc.array(fc.nat(), { minLength: 1, maxLength: 6 }),
        (xs, raw) => {
          const data = Float64Array.from(xs);
          const indices = raw.map((i) => i % data.length);
          const sorted = sortedCopy(data);
          expectSameList(
            selectManyInPlace(data, indices),
            indices.map((i) => sorted[i]),
          );
          // Every requested position is placed, so each stretch between them holds its sorted values.
          for (const i of indices) expectPlaced(data, i, sorted);
        },
      ),
    );
  });

  it("places a pair of ranks on a large array (the confidence-bound case)", () => {
    const n = 200_001;
    const base = patterns.random(n);
    const sorted = sortedCopy(base);
    const data = base.slice();
    const lo = 99_555;
    const hi = 100_445;
    expectSameList(selectManyInPlace(data, [hi, lo]), [sorted[hi], sorted[lo]]);
    expectPlaced(data, lo, sorted);
    expectPlaced(data, hi, sorted);
  });

  it("rejects an index outside the array", () => {
    expect(() => selectManyInPlace(new Float64Array(3), [0, 3])).toThrow(RangeError);
  });
});

describe("valuesAtRanks (read-only, bracketed on long arrays)", () => {
  /** Reference: the ranks read off a full sort (the definition of an order statistic). */
  const bySorting = (values: ArrayLike<number>, ranks: number[]) => {
    const sorted = Float64Array.from(values).sort();
    return ranks.map((r) => sorted[r]);
  };
  const n = 40_000; // above the length from which the bracket is tried
  const shapes: Record<string, (i: number) => number> = {
    "scrambled two-decimal values": (i) => Math.round(((i * 7919) % 10007) * 1.3) / 100,
    sorted: (i) => i / 7,
    reversed: (i) => -i,
    "organ pipe": (i) => Math.abs(i - n / 2),
    "period equal to the sample spacing": (i) => (i % 34 === 0 ? 0 : 1 + (i % 5)),
    "five distinct values": (i) => i % 5,
    constant: () => 3,
  };
  for (const [name, shape] of Object.entries(shapes)) {
    it(`agrees with a full sort and leaves the input as it was: ${name}`, () => {
      const values = Float64Array.from({ length: n }, (_, i) => shape(i));
      const before = values.slice();
      const ranks = [0, 1, 19_500, 19_999, 20_000, 20_400, n - 2, n - 1, 20_000];
      for (const set of [ranks, [19_600, 20_399], [20_000], [n - 1], [0, n - 1]]) {
        expect(valuesAtRanks(values, set)).toEqual(bySorting(values, set));
      }
      expect(values).toEqual(before);
    });
  }

  it("agrees with a full sort on random short and long arrays (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 30_000 }),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 4 }),
        (size, seed, at) => {
          let s = seed | 1;
          const values = Float64Array.from({ length: size }, () => ((s = (Math.imul(s, 48271) >>> 0) % 2147483647) % 1000) / 10);
          const ranks = at.map((a) => Math.min(size - 1, Math.floor(a * size)));
          expect(valuesAtRanks(values, ranks)).toEqual(bySorting(values, ranks));
        },
      ),
      { numRuns: 40 },
    );
  });

  it("refuses ranks outside the array and values that are not finite numbers", () => {
    expect(() => valuesAtRanks([1, 2, 3], [3])).toThrow(RangeError);
    for (const bad of [NaN, Infinity, -Infinity]) {
      const long = Float64Array.from({ length: n }, (_, i) => i);
      long[n - 7] = bad;
      expect(() => valuesAtRanks(long, [n / 2])).toThrow(/value 39993 is not a finite number/);
      expect(() => valuesAtRanks([1, bad, 3], [1])).toThrow(RangeError);
    }
  });
});
