/**
 * Counts of values below, equal to and above a hypothesised centre: the whole
 * of the data a sign test or a quantile test needs.
 *
 * Method: one pass of exact floating-point comparisons (no tolerance: values
 * that should count as ties must already be cleaned, as `differencesFrom` in
 * differences.ts does for spreadsheet arithmetic). -0 and +0 compare equal.
 * Reference: the counting step of the sign test as in J. Arbuthnot (1710), "An
 * argument for Divine Providence, taken from the constant regularity observ'd
 * in the births of both sexes", Philosophical Transactions 27, 186-190.
 *
 * Cost: O(n) time, O(1) extra memory.
 */

/** How many values lie strictly below, exactly at, and strictly above the centre. */
export interface SignCounts {
  readonly below: number;
  readonly tied: number;
  readonly above: number;
}

/**
 * Counts values below, equal to and above `center`.
 *
 * Throws a RangeError when `center` or a value is NaN: the cell layer never
 * passes NaN, so one here is a programming error, and silently dropping it
 * would change the test.
 *
 * @example
 * countSigns([1, 2, 2, 5, -0], 0); // { below: 0, tied: 1, above: 4 }
 * countSigns([1, 2, 2, 5], 2);     // { below: 1, tied: 2, above: 1 }
 */
export function countSigns(values: ArrayLike<number>, center: number): SignCounts {
  if (Number.isNaN(center)) throw new RangeError("countSigns: the centre is NaN");
  let below = 0;
  let above = 0;
  const n = values.length;
  for (let i = 0; i < n; i++) {
    const x = values[i];
    if (x < center) below++;
    else if (x > center) above++;
    else if (x !== center) throw new RangeError(`countSigns: value ${i} is NaN`);
  }
  return { below, tied: n - below - above, above };
}
