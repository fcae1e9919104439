/**
 * Hodges–Lehmann estimate of the shift between two independent groups (the median of
 * all differences second − first) with distribution-free bounds and their coverage.
 *
 * Method
 * - Estimate: J. L. Hodges and E. L. Lehmann (1963), "Estimates of location based on
 *   rank tests", Annals of Mathematical Statistics 34, 598-611.
 * - Bounds: the k-th smallest and k-th largest differences, k the largest rank with
 *   P(U <= k - 1) <= (1 - confidence)/2 under the Mann–Whitney null distribution
 *   (rankSumNull.ts); they bound the shifts the two-sided rank-sum test does not reject,
 *   and cover the true shift with probability 1 - 2 P(U <= k - 1) when the two groups
 *   differ by a shift only and are continuous: E. L. Lehmann (1963), "Nonparametric
 *   confidence intervals for a shift parameter", Annals of Mathematical Statistics 34,
 *   1507-1512 (from memory). The exact distribution is used up to EXACT_AUTO_SIZE values
 *   in all, the continuity-corrected normal approximation above; as in R's wilcox.test,
 *   the exact bounds assume no ties.
 * - Selection over the implicitly sorted differences (differenceSelection.ts); the m·n
 *   differences are never formed.
 *
 * Cost: O(m + n) to find the distinct values (distinctValues.ts), then a few selections of O((p + q) log(p + q))
 * expected time, p and q the numbers of distinct values; O(m + n) memory; the exact rank adds O(min(m, n) m n) at worst,
 * for m + n <= EXACT_AUTO_SIZE.
 */
import { differenceMatrix, differenceOrderStatistics, type DifferenceMatrix } from "./differenceSelection";
import { boundRank, type BoundRank } from "./boundRank";
import { confidenceWords } from "./quantileBounds";
import { EXACT_AUTO_SIZE } from "./rankSum";
import { mannWhitneyNullCdf } from "./rankSumNull";
import { unavailable, type BoundSide, type Unavailable } from "./types";

export interface ShiftResult {
  available: true;
  /** Median of the m·n differences second − first. */
  estimate: number;
  /** k-th smallest difference, or null for an upper one-sided bound. */
  lower: number | null;
  /** k-th largest difference, or null for a lower one-sided bound. */
  upper: number | null;
  /** Coverage of the bounds under the null distribution used; >= confidence. */
  achievedConfidence: number;
  confidence: number;
  side: BoundSide;
  firstN: number;
  secondN: number;
  /** Where k came from: the exact Mann–Whitney distribution or its normal approximation. */
  method: "exact" | "normal";
  /** Rank k of the bounds among the m·n differences. */
  boundRank: number;
}

/** Throws a RangeError naming the group of a value that is not finite. */
function checkFinite(first: ArrayLike<number>, second: ArrayLike<number>, caller: string): void {
  for (let i = 0; i < first.length; i++)
    if (first[i] - first[i] !== 0) throw new RangeError(`${caller}: value ${i} of the first group is not finite`);
  for (let j = 0; j < second.length; j++)
    if (second[j] - second[j] !== 0) throw new RangeError(`${caller}: value ${j} of the second group is not finite`);
}

/** Whether every difference fits in a double (values near ±1E+308 on opposite sides do not). */
function differencesFit(matrix: DifferenceMatrix): boolean {
  const a = matrix.a.values;
  const b = matrix.b.values;
  return Number.isFinite(b[b.length - 1] - a[0]) && Number.isFinite(b[0] - a[a.length - 1]);
}

const TOO_LARGE =
  "A difference between the groups is too large to hold as a number (values near ±1E+308 on opposite sides); rescale the data (other units).";

/** Ranks of the middle differences: the median's alone for an odd count, the two it averages for an even one. */
function middleRanks(count: number): number[] {
  return count % 2 === 1 ? [(count + 1) / 2] : [count / 2, count / 2 + 1];
}

/** The median of the differences from the middle ones (middleRanks). */
function medianOf(middle: readonly number[]): number {
  if (middle.length === 1) return middle[0] + 0;
  const m = (middle[0] + middle[1]) / 2;
  return (Number.isFinite(m) ? m : middle[0] / 2 + middle[1] / 2) + 0;
}

/**
 * The shift estimate alone (median of second − first over all pairs), for when bounds are not reachable.
 * Returns Unavailable for an empty group or differences beyond the largest double; throws a RangeError
 * on a non-finite value.
 *
 * @example
 * shiftEstimate([1, 4], [2, 3, 9]); // 1.5: the median of -2, -1, 1, 2, 5, 8
 */
export function shiftEstimate(first: ArrayLike<number>, second: ArrayLike<number>): number | Unavailable {
  if (first.length === 0 || second.length === 0)
    return unavailable("no-data", `Each group needs at least one number; the first has ${first.length}, the second ${second.length}.`);
  checkFinite(first, second, "shiftEstimate");
  const matrix = differenceMatrix(first, second);
  if (!differencesFit(matrix)) return unavailable("unreachable", TOO_LARGE);
  return medianOf(differenceOrderStatistics(matrix, middleRanks(matrix.pairs)));
}

/** The rank of the shift's bounds: the Mann–Whitney null distribution of the m·n differences. */
function boundRankFor(m: number, n: number, confidence: number, tails: 1 | 2): BoundRank | null {
  const count = m * n;
  const sd = Math.sqrt((count * (m + n + 1)) / 12);
  const exactCdf = m + n <= EXACT_AUTO_SIZE ? (cap: number) => mannWhitneyNullCdf(m, n, cap) : undefined;
  return boundRank({ count, sd, exactCdf }, confidence, tails);
}

/** Smallest equal group size whose extreme differences reach the confidence: 1/C(2s, s) <= the allowance. */
function smallestEqualSize(confidence: number, tails: 1 | 2): number {
  let s = 1;
  let arrangements = 2;
  while (1 / arrangements > (1 - confidence) / tails) {
    s++;
    arrangements = (arrangements * (2 * s) * (2 * s - 1)) / (s * s);
  }
  return s;
}

/**
 * Hodges–Lehmann shift (second − first) with distribution-free bounds (default: two-sided at 0.95). A
 * one-sided `side` gives that bound alone at the full confidence. Returns Unavailable for an empty group,
 * differences beyond the largest double, or groups too small for the confidence; throws a RangeError for a
 * confidence outside (0, 1), an unknown side or a non-finite value.
 *
 * @example
 * const r = shiftBounds([10.1, 11.4, 9.8, 10.6, 10.9], [11.9, 12.4, 11.1, 12.8, 12.2, 11.6], { confidence: 0.9 });
 * // r.available && r.estimate === 1.4500000000000002 (median of the 30 differences, in binary),
 * // r.boundRank === 6 (P(U <= 5) = 19/462 <= 0.05 < P(U <= 6) = 26/462), r.lower === 0.6999999999999993 (11.6 − 10.9),
 * // r.upper === 2.200000000000001 (12.8 − 10.6), r.achievedConfidence === 1 - 38/462
 */
export function shiftBounds(
  first: ArrayLike<number>,
  second: ArrayLike<number>,
  options: { confidence?: number; side?: BoundSide } = {},
): ShiftResult | Unavailable {
  const confidence = options.confidence ?? 0.95;
  const side = options.side ?? "two-sided";
  if (!(confidence > 0 && confidence < 1))
    throw new RangeError(`shiftBounds: confidence must lie strictly between 0 and 1, got ${confidence}`);
  if (side !== "two-sided" && side !== "lower" && side !== "upper") throw new RangeError(`shiftBounds: unknown side ${String(side)}`);
  const m = first.length;
  const n = second.length;
  if (m === 0 || n === 0) return unavailable("no-data", `Each group needs at least one number; the first has ${m}, the second ${n}.`);
  checkFinite(first, second, "shiftBounds");
  const matrix = differenceMatrix(first, second);
  if (!differencesFit(matrix)) return unavailable("unreachable", TOO_LARGE);
  const tails = side === "two-sided" ? 2 : 1;
  const rank = boundRankFor(m, n, confidence, tails);
  if (rank === null) {
    const needed = smallestEqualSize(confidence, tails);
    const what =
      side === "two-sided"
        ? `Bounds at ${confidenceWords(confidence)} confidence need`
        : `A one-sided ${side} bound at ${confidenceWords(confidence)} confidence needs`;
    return unavailable("unreachable", `${what} larger groups (for example ${needed} values in each); there are ${m} and ${n}.`, needed);
  }
  const count = m * n;
  // The bounds and the estimate are selected together: they lie close together among the m·n differences.
  const middle = middleRanks(count);
  const ranks = [...middle, ...(side === "upper" ? [] : [rank.k]), ...(side === "lower" ? [] : [count - rank.k + 1])];
  const selected = differenceOrderStatistics(matrix, ranks);
  const ends = selected.slice(middle.length);
  return {
    available: true,
    estimate: medianOf(selected.slice(0, middle.length)),
    lower: side === "upper" ? null : ends[0] + 0,
    upper: side === "lower" ? null : ends[ends.length - 1] + 0,
    achievedConfidence: rank.achieved,
    confidence,
    side,
    firstN: m,
    secondN: n,
    method: rank.method,
    boundRank: rank.k,
  };
}
