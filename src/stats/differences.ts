/**
 * Differences as a person reading the sheet sees them: binary floating point
 * makes 2.3 - 1.1 come out as 1.1999999999999997, not 1.2, so 2.3 - 1.1 - 1.2 is
 * not an exact zero and a tie would be missed. Each difference is therefore
 * rounded to 15 significant digits of its operands' scale, the precision a
 * spreadsheet displays (common practice), before any comparison or ranking.
 *
 * Method: with s = max |operand| and e = floor(log10 s), the difference is
 * rounded half away from zero to a multiple of 10^(e - 14). The subtraction and
 * the scaling by 10^(14 - e) are carried exactly as pairs of doubles (the TwoSum
 * error term: D. E. Knuth (1997), "The Art of Computer Programming, Vol. 2", 3rd
 * ed., section 4.2.2, from memory; TwoProduct: T. J. Dekker (1971), "A
 * floating-point technique for extending the available precision", Numerische
 * Mathematik 18, 224-242), so only the operands' own decimal-to-binary errors
 * remain, and those are below half the quantum. The division by the
 * exact power of ten 10^(14 - e) (exact for exponents up to 22) returns the
 * double nearest to the decimal result, so equal decimals give identical doubles
 * whatever their operands; outside that range the decimal is parsed, which is
 * also correctly rounded (ECMA-262, Number value for a numeric literal).
 * Reference for correctly rounded decimal conversion: W. D. Clinger (1990),
 * "How to read floating point numbers accurately", Proc. ACM PLDI '90, 92-101.
 *
 * The same rounding is the one tie rule of every function: a value equals a
 * hypothesised centre when their difference rounds to zero (`compareAsShown`),
 * whether the value came from a range (sign test, quantile test, counts) or is
 * itself a difference (paired and signed-rank tests). Excel keeps 15 significant
 * digits (Microsoft, "Floating-point arithmetic may give inaccurate results in
 * Excel", Microsoft Learn troubleshooting article, from memory), so two numbers
 * that agree in those digits read the same on the sheet and are a tie here.
 *
 * Cost: O(1) per difference, O(n) for an array; no allocation beyond the result. `pairedDifferences` finds
 * the decimal exponent once per decade rather than per pair and rounds without data-dependent branches
 * (see ROUNDER), handing the rare pair it cannot settle that way to the general rounding.
 * A comparison costs two raw comparisons outside a narrow window around the
 * centre (`tieWindow`), and one rounding inside it.
 */

/** 10^k for k = -325..309, each the correctly rounded double (exact for 0 <= k <= 22). */
const POW10_OFFSET = 325;
const POW10 = Array.from({ length: 635 }, (_, i) => Number(`1e${i - POW10_OFFSET}`));

/** Largest k for which 10^k is exactly representable, so that x / 10^k is correctly rounded. */
const EXACT_POW10 = 22;

/** A double and its two 32-bit halves, to read the binary exponent without a logarithm. */
const BITS = new Float64Array(1);
const WORDS = new Uint32Array(BITS.buffer);
const HIGH_WORD = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1 ? 1 : 0;
const LOG10_2 = 0.3010299956639812;

/**
 * floor(log10 s) for finite s > 0. The binary exponent b gives floor(b log10 2), which is the answer or
 * one less; one comparison with the power of ten settles it (Math.log10 costs several times more).
 */
function decimalExponent(s: number): number {
  BITS[0] = s;
  const biased = WORDS[HIGH_WORD] >>> 20; // sign bit is 0 for s > 0
  if (biased === 0) return Math.floor(Math.log10(s)); // subnormal: rare, and log10 is accurate enough there
  const e = Math.floor((biased - 1023) * LOG10_2);
  return s >= POW10[e + 1 + POW10_OFFSET] ? e + 1 : e;
}

/** Rounds half away from zero, so that a - b and b - a round to opposite values. */
function roundHalfAway(x: number): number {
  return x < 0 ? -Math.round(-x) : Math.round(x);
}

/** The rounding error of s = fl(a + b), exactly: a + b = s + error (Knuth's TwoSum). */
function sumError(a: number, b: number, s: number): number {
  const bPart = s - a;
  return a - (s - bPart) + (b - bPart);
}

/** 2^27 + 1: splits a double into two halves whose products are exact (Dekker 1971). */
const SPLITTER = 134217729;

/** The rounding error of p = fl(a * b), exactly: a * b = p + error (Dekker's TwoProduct). */
function productError(a: number, b: number, p: number): number {
  let t = SPLITTER * a;
  const aHigh = t - (t - a);
  const aLow = a - aHigh;
  t = SPLITTER * b;
  const bHigh = t - (t - b);
  const bLow = b - bHigh;
  return aHigh * bHigh - p + aHigh * bLow + aLow * bHigh + aLow * bLow;
}

/** The integer nearest to hi + lo (half away from zero), for |hi| < 2^52 and |lo| small: hi - round(hi) is exact. */
function roundPair(hi: number, lo: number): number {
  const r = roundHalfAway(hi);
  return r + roundHalfAway(hi - r + lo);
}

/** Below this magnitude the scaling and the addition of lo round off less than 1/16 of the quantum together. */
const FAST_SCALED = 2 ** 48;

/**
 * Rounds the exact difference hi + lo (a double-double, so the subtraction adds no error) to a multiple
 * of 10^(e - 14), e the decimal exponent of `scale`. Returns +0 for a tie and `hi` itself when it is not
 * finite. With at most 15 significant digits in the operands at that scale, their decimal-to-binary errors
 * (half an ulp each, at most three operands) stay below a third of the quantum; the scaling by the power of
 * ten is made exact (TwoProduct) whenever its own rounding could add more than 1/16, so the total stays under
 * one half and the result is the double nearest the decimal difference.
 * Kept small so that it inlines into the loops; unusual magnitudes go to `roundFar`.
 */
function roundToScale(hi: number, lo: number, scale: number): number {
  if (hi === 0 || hi - hi !== 0) return hi === 0 ? 0 : hi;
  const k = 14 - decimalExponent(scale); // decimal places kept
  if (k < 0 || k > EXACT_POW10) return roundFar(hi, lo, k);
  const p = POW10[k + POW10_OFFSET];
  const scaled = hi * p;
  const m =
    scaled < FAST_SCALED && scaled > -FAST_SCALED
      ? roundHalfAway(scaled + lo * p)
      : roundPair(scaled, productError(hi, p, scaled) + lo * p);
  return m === 0 ? 0 : m / p; // m and p exact: the quotient is correctly rounded
}

/** `roundToScale` for operands below 1e-8 or from 1e15 up, where 10^k is not a single exact double. */
function roundFar(hi: number, lo: number, k: number): number {
  let m: number;
  if (k < 0 && -k <= EXACT_POW10) {
    const p = POW10[-k + POW10_OFFSET];
    const q = hi / p;
    const back = q * p;
    const remainder = hi - back - productError(q, p, back) + lo; // hi - back is exact (Sterbenz)
    m = roundPair(q, remainder / p);
    return m === 0 ? 0 : m * p;
  }
  if (k > 0) {
    // Tiny operands: scale up in exact steps of at most 10^22, carrying the error terms.
    let h = hi;
    let l = lo;
    for (let left = k; left > 0; left -= EXACT_POW10) {
      const p = POW10[Math.min(left, EXACT_POW10) + POW10_OFFSET];
      const scaled = h * p;
      const error = productError(h, p, scaled) + l * p;
      h = scaled + error;
      l = error - (h - scaled);
    }
    m = roundPair(h, l);
  } else {
    // Above 1e36 the division is not compensated; such magnitudes do not occur in spreadsheets in practice.
    m = roundHalfAway(hi / POW10[-k + POW10_OFFSET]);
  }
  return m === 0 ? 0 : Number(`${m}e${-k}`); // parsing is correctly rounded
}

/**
 * minuend - subtrahend, rounded to 15 significant digits of the larger operand's scale; +0 for a tie (never -0).
 *
 * @example
 * spreadsheetDifference(2.3, 1.1);                          // 1.2 (raw: 1.1999999999999997)
 * spreadsheetDifference(spreadsheetDifference(2.3, 1.1), 1.2); // 0
 * spreadsheetDifference(1, 1);                              // 0, never -0
 */
export function spreadsheetDifference(minuend: number, subtrahend: number): number {
  const hi = minuend - subtrahend;
  return roundToScale(hi, sumError(minuend, -subtrahend, hi), Math.max(Math.abs(minuend), Math.abs(subtrahend)));
}

/**
 * second - first - shift for one pair, rounded to 15 significant digits at the scale max(|first|, |second|,
 * |shift|) by `roundToScale`: the definition `pairedDifferences` follows pair by pair (with a faster step
 * where it gives the same double), and the reference its tests compare it with; +0 for a tie (never -0).
 *
 * @example
 * pairedDifference(1.1, 2.3, 1.2); // 0 (raw: 2.3 - 1.1 - 1.2 = -2.220446049250313e-16)
 */
export function pairedDifference(first: number, second: number, shift: number): number {
  const step = second - first;
  const hi = step - shift;
  const lo = sumError(second, -first, step) + sumError(step, -shift, hi);
  return roundToScale(hi, lo, Math.max(Math.abs(first), Math.abs(second), Math.abs(shift)));
}

/**
 * 1.5 × 2^52, for the rounding step of `pairedDifferences`: it is `roundToScale`'s common branch (k = 14 - e
 * in 0..22, |hi × p| < 2^48) with exact rewrites that spare the loop data-dependent branches (the sign of a
 * difference, and which way it rounds, is a coin toss in real data; V8's Math.round branches on the latter):
 * - the nearest integer to x as (x + ROUNDER) - ROUNDER: for |x| < 2^51 every sum lies in [2^52, 2^53), where
 *   the doubles are the integers, so the addition rounds x to the nearest one (ties to even; IEEE 754-2019,
 *   section 4.3.1) and the subtraction is exact; a half-way x (m - x = ±1/2, and m - x is exact for
 *   |x| < 2^48) then moves away from zero, x ± 1/2, also exact, as `roundHalfAway` rounds;
 * - no test for a zero m, which `roundToScale` turns into +0: (x + ROUNDER) - ROUNDER is a difference of two
 *   equal doubles then, which is +0 in round-to-nearest (IEEE 754-2019, section 6.3), never -0;
 * - no test for hi = 0, where `roundToScale` returns 0 at once: then |lo| is at most half an ulp of a number
 *   below 2 × 10^(e + 1), so |lo × p| < 2 × 10^15 × 2^-53 < 0.23, which rounds to 0 here too.
 * The decimal exponent comes from the decade bounds POW10[e] <= scale < POW10[e + 1], the comparisons
 * `decimalExponent` makes. test/stats/differences.test.ts checks the loop against `roundToScale` pair by pair.
 */
const ROUNDER = 6755399441055744;

/**
 * second[i] - first[i] - shift for each pair, rounded as in `spreadsheetDifference` at the scale
 * max(|first[i]|, |second[i]|, |shift|). Throws a RangeError when the lengths differ.
 *
 * Cost: the decimal exponent of the scale is looked up once per decade, not per pair: values of a column
 * mostly share one, so the loop keeps the bounds of the last decade, 10^e <= scale < 10^(e + 1) (the
 * correctly rounded powers of `POW10`, the same comparisons `decimalExponent` makes), and finds the exponent
 * again only when a scale falls outside. Pairs the short rounding cannot settle go to `roundToScale`.
 *
 * @example
 * pairedDifferences([1.1, 5], [2.3, 4], 1.2); // Float64Array [0, -2.2]
 */
export function pairedDifferences(first: ArrayLike<number>, second: ArrayLike<number>, shift: number): Float64Array {
  const n = first.length;
  if (second.length !== n) throw new RangeError(`pairedDifferences: ${n} values against ${second.length}`);
  const out = new Float64Array(n);
  const shiftSize = Math.abs(shift);
  // The decade last seen, decadeLow <= scale < decadeHigh, and its p = 10^(14 - e) (NaN when 10^(14 - e) is
  // not exact, which sends every difference of that decade to roundToScale); empty until a scale sets it.
  let decadeLow = Infinity;
  let decadeHigh = -Infinity;
  let p = NaN;
  for (let i = 0; i < n; i++) {
    const a = first[i];
    const b = second[i];
    const step = b - a;
    const hi = step - shift;
    const lo = sumError(b, -a, step) + sumError(step, -shift, hi);
    const scale = Math.max(Math.max(Math.abs(a), Math.abs(b)), shiftSize);
    if (!(scale >= decadeLow && scale < decadeHigh) && scale > 0 && scale < Infinity) {
      const e = decimalExponent(scale);
      decadeLow = POW10[e + POW10_OFFSET];
      decadeHigh = POW10[e + 1 + POW10_OFFSET];
      p = 14 - e >= 0 && 14 - e <= EXACT_POW10 ? POW10[14 - e + POW10_OFFSET] : NaN;
    }
    const scaled = hi * p;
    if (scaled < FAST_SCALED && scaled > -FAST_SCALED && scale >= decadeLow && scale < decadeHigh) {
      // roundToScale's common branch, rewritten exactly without its data-dependent branches (see ROUNDER).
      const x = scaled + lo * p;
      let m = x + ROUNDER - ROUNDER;
      const off = m - x;
      if (off === 0.5 || off === -0.5) m = x < 0 ? x - 0.5 : x + 0.5; // half-way: rare, so the branch is predicted
      out[i] = m / p; // m and p exact: the quotient is correctly rounded
    } else out[i] = roundToScale(hi, lo, scale);
  }
  return out;
}

/**
 * values[i] - center for each value, rounded as in `spreadsheetDifference`.
 *
 * @example
 * differencesFrom([0.3, 0.1 + 0.2, 1], 0.3); // Float64Array [0, 0, 0.7]
 */
export function differencesFrom(values: ArrayLike<number>, center: number): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  const centerSize = Math.abs(center);
  for (let i = 0; i < n; i++) {
    const x = values[i];
    const hi = x - center;
    out[i] = roundToScale(hi, sumError(x, -center, hi), Math.max(Math.abs(x), centerSize));
  }
  return out;
}

/**
 * How `value` compares with `center` as the sheet shows them: -1 below, 0 a tie, 1 above. It is the sign of
 * `spreadsheetDifference(value, center)`, so 0.1 + 0.2 ties with 0.3; equal doubles (±Infinity included, and
 * -0 with +0) always tie. NaN gives NaN.
 *
 * @example
 * compareAsShown(0.1 + 0.2, 0.3); // 0
 * compareAsShown(0.31, 0.3);      // 1
 */
export function compareAsShown(value: number, center: number): number {
  if (value === center) return 0;
  return Math.sign(spreadsheetDifference(value, center));
}

/**
 * Raw comparison decides outside [low, high]: a value below `low` is below `center` as the sheet shows them,
 * one above `high` is above; only values inside need `compareAsShown`.
 */
export interface TieWindow {
  readonly low: number;
  readonly high: number;
}

/**
 * Relative half-width of the window: a difference rounds to zero only when it is under half a quantum,
 * 0.5 × 10^(e - 14) <= 0.5e-14 × max(|value|, |center|), and any |value - center| >= 1e-13 × |center| is at
 * least that (when |value| > |center|, max <= |center| + |value - center|). The factor of 20 also covers the
 * rounding of center ± the half-width itself (an ulp, about 1.1e-16 relative).
 */
const WINDOW_RELATIVE = 1e-13;

/**
 * The window around `center` outside which raw comparison agrees with `compareAsShown`; for centre 0 it is
 * [0, 0], since a non-zero value never rounds to zero at its own scale, and likewise [center, center] for an
 * infinite centre.
 *
 * @example
 * const w = tieWindow(50); // { low: 49.999999999995, high: 50.000000000005 }
 * // 49.9 < w.low: below without rounding; 50 + 1e-14 lies inside: compareAsShown decides (a tie)
 */
export function tieWindow(center: number): TieWindow {
  if (center - center !== 0) return { low: center, high: center }; // ±Infinity (or NaN): no finite window
  const halfWidth = Math.abs(center) * WINDOW_RELATIVE;
  return { low: center - halfWidth, high: center + halfWidth };
}
