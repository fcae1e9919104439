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
  const blocked = n - (n & 3);
  let steps: Int32Array = STEPS;
  let unsettled = 0;
  // Branch-free counting, four values a step: which side a value lies on is unpredictable in real data, and
  // a mispredicted branch costs several times the comparison. A step holding a value inside the narrow tie
  // window (a tie, a near-tie or NaN: rare) is only noted, and settled by the shared rounding after the
  // loop, which keeps the loop small enough for the engine to hold everything in registers. The int32 sums
  // (| 0) spare it the overflow checks; n < 2^31 for any array.
  for (let i = 0; i < blocked; i += 4) {
    const x0 = values[i];
    const x1 = values[i + 1];
    const x2 = values[i + 2];
    const x3 = values[i + 3];
    const b0 = +(x0 < low);
    const b1 = +(x1 < low);
    const b2 = +(x2 < low);
    const b3 = +(x3 < low);
    const a0 = +(x0 > high);
    const a1 = +(x1 > high);
    const a2 = +(x2 > high);
    const a3 = +(x3 > high);
    below = (below + (b0 + b1) + (b2 + b3)) | 0;
    above = (above + (a0 + a1) + (a2 + a3)) | 0;
    if (((b0 | a0) & (b1 | a1) & (b2 | a2) & (b3 | a3)) === 0) {
      if (unsettled === steps.length) steps = grownSteps(steps);
      steps[unsettled++] = i;
    }
  }
  for (let i = blocked; i < n; i++) {
    below += +(values[i] < low);
    above += +(values[i] > high);
  }
  // The noted steps, and the last n mod 4 values, settled by the shared rounding.
  for (let s = 0; s <= unsettled; s++) {
    const from = s < unsettled ? steps[s] : blocked;
    const settled = settleStep(values, from, s < unsettled ? from + 4 : n, center, low, high);
    below += settled >> 3;
    above += settled & 7;
  }
  return { below, tied: n - below - above, above };
}

/** Where steps to settle are noted; grown (and kept) when a sample needs more. */
let STEPS = new Int32Array(1024);

function grownSteps(steps: Int32Array): Int32Array {
  const bigger = new Int32Array(steps.length * 2);
  bigger.set(steps);
  STEPS = bigger;
  return bigger;
}

/**
 * Counts below and above among values[from..to) (at most four) that lie inside the tie window, by the shared
 * rounding, packed as 8 × below + above. A NaN value is a caller's error.
 */
function settleStep(values: ArrayLike<number>, from: number, to: number, center: number, low: number, high: number): number {
  let packed = 0;
  for (let k = from; k < to; k++) {
    const x = values[k];
    if (x < low || x > high) continue; // already counted by the caller's comparisons
    const sign = compareAsShown(x, center);
    if (sign < 0) packed += 8;
    else if (sign > 0) packed += 1;
    else if (sign !== 0) throw new RangeError(`countSigns: value ${k} is NaN`);
  }
  return packed;
}
