import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { differencesFrom, pairedDifferences, spreadsheetDifference } from "../../src/stats/differences";

/**
 * Exact-arithmetic reference: a decimal A / 10^d held as BigInt numerator and scale, the exact decimal
 * difference formed with BigInt, and its nearest double obtained by parsing the decimal string
 * (correctly rounded: ECMA-262 StringToNumber).
 */
interface Decimal {
  units: bigint;
  places: number;
}
const toNumber = (x: Decimal) => Number(`${x.units}e-${x.places}`);
function exactDifference(...terms: Decimal[]): number {
  // terms[0] - terms[1] - terms[2] ...
  const places = Math.max(...terms.map((t) => t.places));
  const scaled = terms.map((t) => t.units * 10n ** BigInt(places - t.places));
  const units = scaled.slice(1).reduce((acc, v) => acc - v, scaled[0]);
  return units === 0n ? 0 : Number(`${units}e-${places}`);
}
// Up to 15 digits and 6 decimal places; `fits` keeps the operand sets whose digits all lie within 15
// significant digits of the largest operand, the precision the rounding promises to keep.
const decimal = fc.record({ units: fc.bigInt({ min: -(10n ** 15n) + 1n, max: 10n ** 15n - 1n }), places: fc.integer({ min: 0, max: 6 }) });
/** floor(log10 |units / 10^places|), from the digit count (units != 0). */
const exponent = (x: Decimal) => (x.units < 0n ? -x.units : x.units).toString().length - 1 - x.places;
const fits = (...terms: Decimal[]) => {
  const nonZero = terms.filter((t) => t.units !== 0n);
  return nonZero.length === 0 || Math.max(...nonZero.map(exponent)) - 14 <= -Math.max(...terms.map((t) => t.places));
};

describe("spreadsheetDifference", () => {
  it("the sums a person checks by hand come out exact", () => {
    // 2.3 - 1.1 = 1.2 in decimal; binary floating point gives 1.1999999999999997.
    expect(2.3 - 1.1).not.toBe(1.2);
    expect(spreadsheetDifference(2.3, 1.1)).toBe(1.2);
    expect(spreadsheetDifference(spreadsheetDifference(2.3, 1.1), 1.2)).toBe(0);
    expect(spreadsheetDifference(0.1 + 0.2, 0.3)).toBe(0);
    expect(Object.is(spreadsheetDifference(1, 1), 0)).toBe(true);
    expect(Object.is(spreadsheetDifference(-0, 0), 0)).toBe(true);
    expect(spreadsheetDifference(1e10 + 0.5, 1e10)).toBe(0.5);
  });

  it("equals the correctly rounded exact decimal difference (BigInt arithmetic)", () => {
    fc.assert(
      fc.property(decimal, decimal, (a, b) => {
        fc.pre(fits(a, b));
        const got = spreadsheetDifference(toNumber(a), toNumber(b));
        const want = exactDifference(a, b);
        expect(Object.is(got, want === 0 ? 0 : want)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("stays exact for tiny operands (scaled up in several exact steps)", () => {
    const tiny = fc.record({
      units: fc.bigInt({ min: -(10n ** 11n) + 1n, max: 10n ** 11n - 1n }),
      places: fc.integer({ min: 12, max: 40 }),
    });
    fc.assert(
      fc.property(tiny, tiny, (a, b) => {
        fc.pre(fits(a, b));
        expect(Object.is(spreadsheetDifference(toNumber(a), toNumber(b)), exactDifference(a, b))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("is antisymmetric and never returns -0", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.double({ noNaN: true, noDefaultInfinity: true }), (a, b) => {
        const d = spreadsheetDifference(a, b);
        const e = spreadsheetDifference(b, a);
        expect(Object.is(d, -0)).toBe(false);
        if (Number.isFinite(d)) expect(d === 0 ? e === 0 : e === -d).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("keeps 15 significant digits at extreme scales; overflow passes through", () => {
    expect(spreadsheetDifference(3e-300, 1e-300)).toBe(2e-300);
    expect(spreadsheetDifference(1e300, 3e299)).toBe(7e299);
    expect(spreadsheetDifference(5e-324, 0)).toBe(5e-324);
    expect(spreadsheetDifference(1e308, -1e308)).toBe(Infinity);
    // A difference below the 15th significant digit of the operands is a tie.
    expect(spreadsheetDifference(100, 99.99999999999999)).toBe(0);
  });
});

describe("pairedDifferences and differencesFrom", () => {
  it("second - first - shift and x - center, each exact in decimal (BigInt arithmetic)", () => {
    // Operands sharing their decimal places, up to 15 significant digits each: they always fit.
    const aligned = fc.integer({ min: 0, max: 6 }).chain((places) => {
      const d = fc.bigInt({ min: -(10n ** 15n) + 1n, max: 10n ** 15n - 1n }).map((units): Decimal => ({ units, places }));
      return fc.tuple(fc.array(fc.tuple(d, d), { maxLength: 20 }), d);
    });
    fc.assert(
      fc.property(aligned, ([pairs, shift]) => {
        const first = pairs.map(([a]) => toNumber(a));
        const second = pairs.map(([, b]) => toNumber(b));
        const got = pairedDifferences(first, second, toNumber(shift));
        const from = differencesFrom(second, toNumber(shift));
        pairs.forEach(([a, b], i) => {
          expect(got[i]).toBe(exactDifference(b, a, shift));
          expect(from[i]).toBe(exactDifference(b, shift));
        });
      }),
      { numRuns: 500 },
    );
  });

  it("worked examples, and a RangeError for unequal lengths", () => {
    expect(Array.from(pairedDifferences([1.1, 5], [2.3, 4], 1.2))).toEqual([0, -2.2]);
    expect(Array.from(differencesFrom([0.3, 0.1 + 0.2, 1], 0.3))).toEqual([0, 0, 0.7]);
    expect(() => pairedDifferences([1, 2], [1], 0)).toThrow(RangeError);
  });
});
