import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { countSigns } from "../../src/stats/signCounts";

describe("countSigns", () => {
  it("counts below, tied and above by exact comparison (definition of the sign test's counts, common practice)", () => {
    expect(countSigns([1, 2, 2, 5, 0.5], 2)).toEqual({ below: 2, tied: 2, above: 1 });
    expect(countSigns(new Float64Array([-3, 4, 0]), 0)).toEqual({ below: 1, tied: 1, above: 1 });
    expect(countSigns([], 7)).toEqual({ below: 0, tied: 0, above: 0 });
  });

  it("treats -0 and +0 as equal (IEEE 754 comparison)", () => {
    expect(countSigns([-0, 0, 1e-300, -1e-300], 0)).toEqual({ below: 1, tied: 2, above: 1 });
    expect(countSigns([0, -0], -0)).toEqual({ below: 0, tied: 2, above: 0 });
  });

  it("uses no tolerance: neighbouring doubles are not ties", () => {
    const next = 0.1 + 2 ** -56;
    expect(next).not.toBe(0.1);
    expect(countSigns([0.1, next], 0.1)).toEqual({ below: 0, tied: 1, above: 1 });
  });

  it("accepts infinite values and centres", () => {
    expect(countSigns([-Infinity, 3, Infinity], 3)).toEqual({ below: 1, tied: 1, above: 1 });
    expect(countSigns([1, 2], Infinity)).toEqual({ below: 2, tied: 0, above: 0 });
  });

  it("throws RangeError for NaN (a caller's error: the cell layer never passes NaN)", () => {
    expect(() => countSigns([1, NaN], 0)).toThrow(RangeError);
    expect(() => countSigns([1], NaN)).toThrow(RangeError);
  });

  it("agrees with filtering by brute force (property)", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -5, max: 5 }), { maxLength: 60 }), fc.integer({ min: -5, max: 5 }), (xs, c) => {
        const counts = countSigns(xs, c);
        expect(counts).toEqual({
          below: xs.filter((x) => x < c).length,
          tied: xs.filter((x) => x === c).length,
          above: xs.filter((x) => x > c).length,
        });
      }),
    );
  });
});
