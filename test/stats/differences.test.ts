import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { differencesFrom, pairedDifference, pairedDifferences, spreadsheetDifference } from "../../src/stats/differences";
import { xorshift32 } from "../../src/stats/xorshift";

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

/** Doubles by their bit patterns, to step one ulp at a time past a boundary. */
const BITS = new DataView(new ArrayBuffer(8));
function bitsOf(x: number): bigint {
  BITS.setFloat64(0, x);
  return BITS.getBigUint64(0);
}
function fromBits(bits: bigint): number {
  BITS.setBigUint64(0, BigInt.asUintN(64, bits));
  return BITS.getFloat64(0);
}
/** The double `steps` ulps away from x (towards larger magnitude for positive steps); x finite and non-zero. */
const ulpsAway = (x: number, steps: number) => fromBits(bitsOf(x) + BigInt(steps));

/**
 * Pairs (first, second, shift) meant to find any pair where `pairedDifferences`' fast step could leave the
 * one-pair rounding: typed decimals in every decade the fast step takes (1e-8 to 1e15), scales one ulp
 * either side of each power of ten (where the decade it keeps changes), differences half-way at the 15th
 * digit and scaled differences near 2^48 (where it hands over), a difference that is exactly 0 with a
 * rounding error left over, subnormals, ±0, values up to ±9.99999999999999E+307 and beyond (overflow), and
 * doubles of random bit patterns. Each family is drawn from `u`; the families are shuffled together so that
 * the decade changes from one pair to the next at random.
 */
function adversarialPairs(u: () => number, perFamily: number): { first: Float64Array; second: Float64Array; shifts: number[] } {
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(u() * xs.length)];
  const sign = () => (u() < 0.5 ? -1 : 1);
  const int = (below: number) => Math.floor(u() * below);
  const typed = (e: number) => {
    // 15 significant digits at most, in decade e: units × 10^(e - digits + 1)
    const digits = 1 + int(15);
    const units = 10 ** (digits - 1) + int(9 * 10 ** (digits - 1));
    return sign() * Number(`${units}e${e - digits + 1}`);
  };
  const randomBits = () => {
    let x: number;
    do x = fromBits((BigInt(int(2 ** 32)) << 32n) | BigInt(int(2 ** 32)));
    while (!Number.isFinite(x));
    return x;
  };
  const families: (() => [number, number])[] = [
    () => {
      const e = -8 + int(23);
      return [typed(e), typed(e - int(3))];
    },
    () => {
      const power = Number(`1e${-10 + int(27)}`);
      const a = ulpsAway(power, int(5) - 2) * sign();
      return [a, pick([a + typed(-int(10)), ulpsAway(Math.abs(a), int(9) - 4) * sign(), -a, 0])];
    },
    () => {
      const e = int(15);
      const p = 10 ** (14 - e);
      const a = sign() * (10 ** e + int(9 * 10 ** e));
      const halfWay = (sign() * (int(1000) + 0.5)) / p;
      return [a, pick([a + halfWay, a - halfWay, halfWay, -halfWay])];
    },
    () => {
      const e = int(15);
      const limit = 2 ** 48 / 10 ** (14 - e);
      const a = 10 ** e * (1 + u());
      return [a, a + sign() * ulpsAway(limit, int(7) - 3)];
    },
    () =>
      pick<[number, number]>([
        [5e-324, 0],
        [ulpsAway(2.2250738585072014e-308, int(5) - 2), 2.2250738585072014e-308],
        [int(1000) * 5e-324, -int(1000) * 5e-324],
        [0, -0],
        [-0, 0],
        [9.99999999999999e307, -9.99999999999999e307],
        [-9.99999999999999e307, 9.99999999999999e307],
        [1.7976931348623157e308, -1.7976931348623157e308],
        [9.99999999999999e307, 9.99999999999998e307],
        [1e-300 * (1 + u()), 3e-300],
        [1e300 * (1 + u()), 3e299],
      ]),
    () => {
      const x = randomBits();
      return [x, pick([randomBits(), x * (1 + sign() * u() * 1e-14), ulpsAway(x, int(5) - 2), -x])];
    },
    () => {
      const e = -8 + int(23);
      const a = typed(e);
      return [a, a + typed(e - 14 + int(3))];
    },
  ];
  const pairs: [number, number][] = [];
  for (const family of families) for (let k = 0; k < perFamily; k++) pairs.push(family());
  for (let i = pairs.length - 1; i > 0; i--) {
    const j = int(i + 1);
    [pairs[i], pairs[j]] = [pairs[j], pairs[i]];
  }
  const first = Float64Array.from(pairs, ([a]) => a);
  const second = Float64Array.from(pairs, ([, b]) => b);
  // Shifts: none, typed ones of the pairs' decades, one that makes a difference exactly 0 with an error left.
  const shifts = [0, -0, typed(int(4)), typed(-int(6)), second[0] - first[0], second[1] - first[1], 9.99999999999999e307];
  return { first, second, shifts };
}

describe("pairedDifferences: its fast step against the one-pair rounding", () => {
  it("gives the very double pairedDifference gives, pair by pair, on adversarial and random pairs (property, 1.4 million pairs)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        const { first, second, shifts } = adversarialPairs(xorshift32(seed), 3000);
        for (const shift of shifts) {
          const got = pairedDifferences(first, second, shift);
          for (let i = 0; i < got.length; i++) {
            const want = pairedDifference(first[i], second[i], shift);
            if (!Object.is(got[i], want)) {
              throw new Error(`${second[i]} - ${first[i]} - ${shift}: fast ${got[i]}, one-pair rounding ${want}`);
            }
          }
        }
      }),
      { numRuns: 10 },
    );
  });

  it("keeps the cases where the short rounding needs its exact rewrites (worked by hand)", () => {
    // Half-way at the 15th digit: 1e14 + 0.5 has quantum 1, and half rounds away from zero either way.
    expect(Array.from(pairedDifferences([0, 0, 1e14 + 0.5], [1e14 + 0.5, -(1e14 + 0.5), 0], 0))).toEqual([
      1e14 + 1,
      -(1e14 + 1),
      -(1e14 + 1),
    ]);
    // A tie never comes back as -0, nor does a difference exactly 0 with the subtraction's error left over.
    const ties = pairedDifferences([1.1, 0.1, 2], [2.3, 0.3, 2], 1.2);
    expect(Object.is(ties[0], 0)).toBe(true);
    expect(Object.is(pairedDifferences([0.1], [0.3], 0.3 - 0.1)[0], 0)).toBe(true);
    expect(Object.is(pairedDifferences([-0], [0], 0)[0], 0)).toBe(true);
    // One ulp either side of a power of ten changes the decade, and with it the quantum.
    const below = ulpsAway(100, -1);
    expect(Array.from(pairedDifferences([100, below, 0], [100.05, below + 0.05, 0], 0))).toEqual([
      pairedDifference(100, 100.05, 0),
      pairedDifference(below, below + 0.05, 0),
      0,
    ]);
    // Walking across every power of ten the fast step covers, from below, onto it and above, and back: the
    // decade it keeps must change exactly there (ulps away give digits at the 15th and 16th place).
    for (let e = -9; e <= 16; e++) {
      const power = Number(`1e${e}`);
      const scales = [ulpsAway(power, -1), power, ulpsAway(power, 1), ulpsAway(power, -1), power, ulpsAway(power, -2), power];
      const first: number[] = [];
      const second: number[] = [];
      for (const a of scales) {
        for (let k = -6; k <= 6; k++) {
          first.push(a);
          second.push(ulpsAway(a, k * 3));
        }
      }
      const got = pairedDifferences(first, second, 0);
      first.forEach((a, i) => expect(Object.is(got[i], pairedDifference(a, second[i], 0))).toBe(true));
    }
    // Opposite values near the sheet's limit overflow, and keep their sign.
    expect(
      Array.from(pairedDifferences([-9.99999999999999e307, 9.99999999999999e307], [9.99999999999999e307, -9.99999999999999e307], 0)),
    ).toEqual([Infinity, -Infinity]);
  });
});
