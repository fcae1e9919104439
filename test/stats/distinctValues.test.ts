import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { distinctValues } from "../../src/stats/distinctValues";

/** Distinct values and counts by sorting and counting runs (brute force). */
function reference(sample: number[]): { values: number[]; counts: number[] } {
  const sorted = sample.map((x) => x + 0).sort((a, b) => a - b);
  const values: number[] = [];
  const counts: number[] = [];
  for (const x of sorted) {
    if (values.length > 0 && values[values.length - 1] === x) counts[counts.length - 1]++;
    else {
      values.push(x);
      counts.push(1);
    }
  }
  return { values, counts };
}

describe("distinctValues", () => {
  it("matches sorting and counting runs, with many repeats (hash table) and with few (full sort)", () => {
    const repeated = fc.array(
      fc.integer({ min: -30, max: 30 }).map((k) => k / 4),
      { maxLength: 3000 },
    );
    const spread = fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { maxLength: 3000 });
    fc.assert(
      fc.property(fc.oneof(repeated, spread), (sample) => {
        const r = distinctValues(sample);
        const expected = reference(sample);
        expect(Array.from(r.values)).toEqual(expected.values);
        expect(Array.from(r.counts)).toEqual(expected.counts);
      }),
      { numRuns: 100 },
    );
  });

  it("counts -0 and +0 as one value and refuses NaN", () => {
    const r = distinctValues([50.2, 49.8, 50.2, -0, 0]);
    expect(Array.from(r.values)).toEqual([0, 49.8, 50.2]);
    expect(Array.from(r.counts)).toEqual([2, 1, 2]);
    expect(() => distinctValues([1, NaN])).toThrow(RangeError);
  });
});
