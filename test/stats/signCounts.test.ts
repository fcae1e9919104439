import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compareAsShown, differencesFrom, tieWindow } from "../../src/stats/differences";
import { countSigns } from "../../src/stats/signCounts";

describe("countSigns", () => {
  it("counts below, tied and above (definition of the sign test's counts, common practice)", () => {
    expect(countSigns([1, 2, 2, 5, 0.5], 2)).toEqual({ below: 2, tied: 2, above: 1 });
    expect(countSigns(new Float64Array([-3, 4, 0]), 0)).toEqual({ below: 1, tied: 1, above: 1 });
    expect(countSigns([], 7)).toEqual({ below: 0, tied: 0, above: 0 });
  });

  it("treats -0 and +0 as equal (IEEE 754 comparison)", () => {
    expect(countSigns([-0, 0, 1e-300, -1e-300], 0)).toEqual({ below: 1, tied: 2, above: 1 });
    expect(countSigns([0, -0], -0)).toEqual({ below: 0, tied: 2, above: 0 });
  });

  it("ties values equal to the centre at the sheet's 15 significant digits, as the paired functions do (exact decimals)", () => {
    // 0.1 + 0.2 = 0.30000000000000004 and 0.7 - 0.4 = 0.29999999999999993 both read 0.3 on the sheet;
    // 0.31, 0.32 and 0.29 differ from 0.3 in the second decimal.
    const values = [0.1 + 0.2, 0.7 - 0.4, 0.31, 0.32, 0.29];
    expect(countSigns(values, 0.3)).toEqual({ below: 1, tied: 2, above: 2 });
    expect(countSigns([2.3 - 1.1], 1.2)).toEqual({ below: 0, tied: 1, above: 0 });
    // A difference in the 15th significant digit is not a tie: 50.0000000000001 - 50 = 1e-13 exactly in decimals.
    expect(countSigns([50.0000000000001, 49.9999999999999], 50)).toEqual({ below: 1, tied: 0, above: 1 });
  });

  it("settles any number of ties and near-ties, in every position of a long array (exact decimals)", () => {
    // 0.1 + 0.2 reads 0.3; 0.3 + 1e-14 reads 0.30000000000001, above 0.3.
    const xs = Array.from({ length: 9001 }, (_, i) => [0.1 + 0.2, 0.3, 0.3 + 1e-14, 0.2, 0.4][i % 5]);
    expect(countSigns(xs, 0.3)).toEqual({ below: 1800, tied: 3601, above: 3600 });
    expect(countSigns(new Float64Array(xs), 0.3)).toEqual({ below: 1800, tied: 3601, above: 3600 });
  });

  it("agrees with the signs of differencesFrom, the signed-rank functions' differences (property)", () => {
    // Values near the centre, within a few ulps to a few units in the 15th digit, exercise the window's edge.
    const near = (c: number) =>
      fc.oneof(
        fc.integer({ min: -40, max: 40 }).map((k) => c + k * Math.abs(c) * 1e-16),
        fc.integer({ min: -40, max: 40 }).map((k) => c + k * Math.abs(c) * 1e-14),
        fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }),
      );
    const centre = fc.oneof(
      fc.constantFrom(0, 0.3, 50, -7.25, 1e-9, 123456.789),
      fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e9, max: 1e9 }),
    );
    fc.assert(
      fc.property(
        centre.chain((c) => fc.tuple(fc.constant(c), fc.array(near(c), { maxLength: 40 }))),
        ([c, xs]) => {
          const d = Array.from(differencesFrom(xs, c));
          expect(countSigns(xs, c)).toEqual({
            below: d.filter((x) => x < 0).length,
            tied: d.filter((x) => x === 0).length,
            above: d.filter((x) => x > 0).length,
          });
        },
      ),
      { numRuns: 500 },
    );
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

describe("compareAsShown and tieWindow", () => {
  it("is the sign of the difference at 15 significant digits (exact decimals)", () => {
    expect(compareAsShown(0.1 + 0.2, 0.3)).toBe(0);
    expect(compareAsShown(0.7 - 0.4, 0.3)).toBe(0);
    expect(compareAsShown(0.31, 0.3)).toBe(1);
    expect(compareAsShown(0.29, 0.3)).toBe(-1);
    expect(compareAsShown(-0, 0)).toBe(0);
    expect(compareAsShown(Infinity, Infinity)).toBe(0);
    expect(compareAsShown(1, Infinity)).toBe(-1);
  });

  it("leaves outside its window only values whose raw order is their order on the sheet (property)", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: -3000, max: 3000 }), (c, k) => {
        const x = c + k * Math.abs(c) * 1e-16;
        const { low, high } = tieWindow(c);
        if (x < low) expect(compareAsShown(x, c)).toBe(-1);
        if (x > high) expect(compareAsShown(x, c)).toBe(1);
      }),
      { numRuns: 2000 },
    );
  });
});
