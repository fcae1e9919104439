/**
 * Counts of values below, equal to and above a hypothesised centre: the whole
 * of the data a sign test or a quantile test needs.
 *
 * Method: one pass comparing each value with the centre as the sheet shows
 * them (the shared tie rule, `compareAsShown` in differences.ts: equal at 15
 * significant digits), so the counts are the signs of `differencesFrom(values,
 * center)` and agree with the paired and signed-rank functions. Two raw
 * comparisons against the edges of `tieWindow(center)` settle all but the
 * values within about 1e-13 of the centre, which are rounded one by one.
 * -0 and +0 compare equal.
 * Reference: the counting step of the sign test as in J. Arbuthnot (1710), "An
 * argument for Divine Providence, taken from the constant regularity observ'd
 * in the births of both sexes", Philosophical Transactions 27, 186-190.
 *
 * Cost: O(n) time (two comparisons per value), O(1) extra memory.
 */
import { compareAsShown, tieWindow } from "./differences";

/** How many values lie below, at and above the centre as the sheet shows them. */
export interface SignCounts {
  readonly below: number;
  readonly tied: number;
  readonly above: number;
}

/**
 * Counts values below, equal to and above `center`, ties taken at the 15 significant digits the sheet shows.
 *
 * Throws a RangeError when `center` or a value is NaN: the cell layer never
 * passes NaN, so one here is a programming error, and silently dropping it
 * would change the test.
 *
 * @example
 * countSigns([1, 2, 2, 5, -0], 0); // { below: 0, tied: 1, above: 4 }
 * countSigns([1, 2, 2, 5], 2);     // { below: 1, tied: 2, above: 1 }
 * countSigns([0.1 + 0.2, 0.31], 0.3); // { below: 0, tied: 1, above: 1 }
 */
export function countSigns(values: ArrayLike<number>, center: number): SignCounts {
  if (Number.isNaN(center)) throw new RangeError("countSigns: the centre is NaN");
  const { low, high } = tieWindow(center);
  let below = 0;
  let above = 0;
  const n = values.length;
  for (let i = 0; i < n; i++) {
    const x = values[i];
    // Branch-free counting: which side a value lies on is unpredictable in real data, and a mispredicted
    // branch costs several times the comparison. Only values inside the narrow tie window (rare) branch.
    const isBelow = +(x < low);
    const isAbove = +(x > high);
    below += isBelow;
    above += isAbove;
    if ((isBelow | isAbove) === 0) {
      const sign = compareAsShown(x, center); // the shared rounding decides; NaN for a NaN value
      if (sign < 0) below++;
      else if (sign > 0) above++;
      else if (sign !== 0) throw new RangeError(`countSigns: value ${i} is NaN`);
    }
  }
  return { below, tied: n - below - above, above };
}
