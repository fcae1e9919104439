/**
 * Hodges–Lehmann estimate of the centre of a symmetric distribution (the median
 * of the Walsh averages (x_i + x_j)/2, i <= j) with distribution-free bounds.
 *
 * Method
 * - Estimate: J. L. Hodges and E. L. Lehmann (1963), "Estimates of location
 *   based on rank tests", Annals of Mathematical Statistics 34, 598-611.
 * - Bounds: the k-th smallest and k-th largest Walsh averages, k the largest
 *   rank with P(V <= k - 1) <= (1 - confidence)/2 under the signed-rank null
 *   distribution; they bound the set of centres the two-sided signed-rank test
 *   does not reject: D. F. Bauer (1972), "Constructing confidence sets using
 *   rank statistics", JASA 67, 687-690. Exact distribution (signedRank.ts) up to
 *   EXACT_AUTO_LIMIT values, the continuity-corrected normal approximation above.
 *   The exact bounds assume continuous data (no ties), as R's wilcox.test does
 *   for its exact interval.
 * - Selection: J. F. Monahan (1984), "Algorithm 616: Fast computation of the
 *   Hodges–Lehmann location estimator", ACM Transactions on Mathematical
 *   Software 10, 265-270. The Walsh averages form a matrix with sorted rows and
 *   columns once the data are sorted; a pivot among the averages still in play
 *   is counted against in O(n) along the matrix's staircase, and the rows'
 *   candidate ranges shrink around the wanted rank. Here each round brackets the
 *   rank between two values of a random sample of the candidates, as R. W. Floyd
 *   and R. L. Rivest (1975), "Expected time bounds for selection", CACM 18,
 *   165-172, do for plain selection, so a round keeps about an eighth of the
 *   candidates instead of about three quarters. When few remain they are
 *   gathered and selected directly (selection.ts). The n(n+1)/2 averages are
 *   never built.
 *
 * Cost: O(n log n) expected time (sorting, then O(log n) rounds of O(n)), O(n)
 * memory; the exact rank adds O(n^3) at worst, for n <= EXACT_AUTO_LIMIT.
 */
import { boundRank, type BoundRank } from "./boundRank";
import { confidenceWords } from "./quantileBounds";
import { sortFloat64 } from "./ranks";
import { selectInPlace } from "./selection";
import { EXACT_AUTO_LIMIT, signedRankNullCdf } from "./signedRank";
import { unavailable, type BoundSide, type Unavailable } from "./types";
import { xorshift32 as xorshift } from "./xorshift";

export interface HodgesLehmannResult {
  available: true;
  /** Median of the Walsh averages. */
  estimate: number;
  /** k-th smallest Walsh average, or null for an upper one-sided bound. */
  lower: number | null;
  /** k-th largest Walsh average, or null for a lower one-sided bound. */
  upper: number | null;
  /** Coverage of [lower, upper] under the signed-rank null distribution used; >= confidence. */
  achievedConfidence: number;
  /** Confidence asked for. */
  confidence: number;
  /** Which bounds: both ends, or one end at the full confidence. */
  side: BoundSide;
  n: number;
  /** Where k came from: the exact signed-rank distribution or its normal approximation. */
  method: "exact" | "normal";
  /** Rank k of the bounds among the n(n+1)/2 Walsh averages. */
  boundRank: number;
}

/** Below this many candidates (or 4n, if larger) the remaining averages are gathered and selected directly. */
const GATHER_MIN = 4096;

/** Candidates drawn per round; the bracket kept is about 4 sqrt(SAMPLE) of them wide, so each round keeps ~1/8. */
const SAMPLE = 1024;
/** Half-width of the bracket in sample ranks: 2 sqrt(SAMPLE), four standard deviations of the target's sample rank. */
const BRACKET = 64;

/**
 * The averages still in play: row i (sums terms[i] + terms[j], j >= i) keeps columns left[i]..right[i].
 * Everything left of left[i] is known to lie below the wanted value, everything right of right[i] above,
 * so right[i] >= left[i] - 1 at all times.
 */
interface Candidates {
  left: Int32Array;
  right: Int32Array;
  count: number;
  /** Averages known to be smaller than the wanted one. */
  below: number;
}

/** `size` candidates drawn at random (with replacement), as sums, sorted ascending. */
function sampleCandidates(terms: Float64Array, c: Candidates, size: number, random: () => number): Float64Array {
  const positions = new Float64Array(size);
  for (let s = 0; s < size; s++) positions[s] = Math.floor(random() * c.count);
  positions.sort();
  const sample = new Float64Array(size);
  let row = 0;
  let before = 0; // candidates in rows before `row`
  for (let s = 0; s < size; s++) {
    while (positions[s] - before >= c.right[row] - c.left[row] + 1) {
      before += c.right[row] - c.left[row] + 1;
      row++;
    }
    sample[s] = terms[row] + terms[c.left[row] + positions[s] - before];
  }
  return sample.sort();
}

/**
 * For every row, the first column whose sum is >= value (strict = false) or > value (strict = true), written
 * to `ends`; returns how many sums lie before those columns in total. One walk down the staircase: the
 * boundary column can only move left as the row's first term grows.
 */
function countBelow(terms: Float64Array, value: number, strict: boolean, ends: Int32Array): number {
  const n = terms.length;
  let j = n;
  let total = 0;
  for (let i = 0; i < n; i++) {
    const hi = terms[i];
    if (strict) while (j > i && hi + terms[j - 1] > value) j--;
    else while (j > i && hi + terms[j - 1] >= value) j--;
    const end = j > i ? j : i;
    ends[i] = end;
    total += end - i;
  }
  return total;
}

/** Keeps, in each row, only the columns in [from[i], to[i]) (either bound optional), and recounts. */
function narrow(c: Candidates, from: Int32Array | null, to: Int32Array | null): void {
  const n = c.left.length;
  let count = 0;
  let below = 0;
  for (let i = 0; i < n; i++) {
    if (from !== null && c.left[i] < from[i]) c.left[i] = from[i];
    if (to !== null && c.right[i] >= to[i]) c.right[i] = to[i] - 1;
    count += c.right[i] - c.left[i] + 1;
    below += c.left[i] - i;
  }
  c.count = count;
  c.below = below;
}

/**
 * The k-th smallest (1-based) of the sums terms[i] + terms[j], i <= j, for `terms` sorted ascending.
 * Each sum rounds monotonically in both terms, which is all the staircase counts rely on. Each round
 * draws a sample of the candidates, brackets the wanted rank between two sample values (as Floyd and
 * Rivest do for plain selection) and keeps what lies between them.
 */
function selectWalsh(terms: Float64Array, k: number): number {
  const n = terms.length;
  const c: Candidates = { left: new Int32Array(n), right: new Int32Array(n), count: (n * (n + 1)) / 2, below: 0 };
  for (let i = 0; i < n; i++) {
    c.left[i] = i;
    c.right[i] = n - 1;
  }
  const lowEnds = new Int32Array(n);
  const highEnds = new Int32Array(n);
  const random = xorshift(0x9e3779b9 ^ n ^ k);
  const gatherAt = Math.max(GATHER_MIN, 4 * n);
  while (c.count > gatherAt) {
    const sample = sampleCandidates(terms, c, SAMPLE, random);
    const target = ((k - c.below) / c.count) * SAMPLE;
    const low = sample[Math.max(0, Math.floor(target - BRACKET))];
    const high = sample[Math.min(SAMPLE - 1, Math.ceil(target + BRACKET))];
    const lessThanLow = countBelow(terms, low, false, lowEnds);
    const atMostHigh = countBelow(terms, high, true, highEnds);
    const before = c.count;
    if (k <= lessThanLow) narrow(c, null, lowEnds);
    else if (k > atMostHigh) narrow(c, highEnds, null);
    else if (low === high) return low;
    else narrow(c, lowEnds, highEnds);
    if (c.count === before) {
      // Ties can make the bracket hold every candidate; a single pivot at the sample median always makes progress.
      const pivot = sample[SAMPLE >> 1];
      const less = countBelow(terms, pivot, false, lowEnds);
      const atMost = countBelow(terms, pivot, true, highEnds);
      if (k > less && k <= atMost) return pivot;
      if (k <= less) narrow(c, null, lowEnds);
      else narrow(c, highEnds, null);
    }
  }
  const pool = new Float64Array(c.count);
  let p = 0;
  for (let i = 0; i < n; i++) for (let j = c.left[i]; j <= c.right[i]; j++) pool[p++] = terms[i] + terms[j];
  return selectInPlace(pool, k - c.below - 1);
}

/** The (k+1)-th smallest sum given the k-th, `value`: one staircase walk instead of a second selection. */
function nextWalsh(terms: Float64Array, value: number, k: number): number {
  const n = terms.length;
  const ends = new Int32Array(n);
  if (countBelow(terms, value, true, ends) >= k + 1) return value;
  let next = Infinity;
  for (let i = 0; i < n; i++) if (ends[i] < n && terms[i] + terms[ends[i]] < next) next = terms[i] + terms[ends[i]];
  return next;
}

/**
 * The data sorted, and the factor that turns a sum of two of them into a Walsh average. Normally the
 * values themselves with factor 1/2, so that each average is (x_i + x_j)/2 exactly as R forms it; values
 * so large that a sum could overflow are halved first instead (factor 1).
 */
interface WalshTerms {
  terms: Float64Array;
  factor: number;
}

/** Largest magnitude whose pairwise sums cannot overflow. */
const SUM_SAFE = 2 ** 1022;

/** Sorted terms for the Walsh averages; throws a RangeError on a non-finite value. */
function walshTerms(values: ArrayLike<number>, caller: string): WalshTerms {
  const n = values.length;
  const terms = new Float64Array(n);
  let largest = 0;
  for (let i = 0; i < n; i++) {
    const x = values[i];
    if (x - x !== 0) throw new RangeError(`${caller}: value ${i} is not finite (${x})`);
    terms[i] = x;
    largest = Math.max(largest, Math.abs(x));
  }
  if (largest < SUM_SAFE) return { terms: sortFloat64(terms), factor: 0.5 };
  for (let i = 0; i < n; i++) terms[i] /= 2;
  return { terms: sortFloat64(terms), factor: 1 };
}

/** The k-th smallest Walsh average; -0 and +0 tie in every order, so the answer is always +0. */
function walshAt(t: WalshTerms, k: number): number {
  return selectWalsh(t.terms, k) * t.factor + 0;
}

function middleOf(a: number, b: number): number {
  const m = (a + b) / 2;
  return Number.isFinite(m) ? m : a / 2 + b / 2;
}

function walshMedian(t: WalshTerms): number {
  const count = (t.terms.length * (t.terms.length + 1)) / 2;
  if (count % 2 === 1) return walshAt(t, (count + 1) / 2);
  const lowerMiddle = selectWalsh(t.terms, count / 2);
  return middleOf(lowerMiddle * t.factor, nextWalsh(t.terms, lowerMiddle, count / 2) * t.factor) + 0;
}

/**
 * The k-th smallest (1-based) Walsh average (x_i + x_j)/2, i <= j, of finite values, without building the
 * n(n+1)/2 averages. Throws a RangeError for k outside 1..n(n+1)/2 or a non-finite value.
 *
 * @example
 * walshAverageOrderStatistic([1, 3, 10], 2); // 2: the averages are 1, 2, 3, 5.5, 6.5, 10
 */
export function walshAverageOrderStatistic(values: ArrayLike<number>, k: number): number {
  const n = values.length;
  const count = (n * (n + 1)) / 2;
  if (!Number.isInteger(k) || k < 1 || k > count)
    throw new RangeError(`walshAverageOrderStatistic: k must be an integer from 1 to ${count}, got ${k}`);
  return walshAt(walshTerms(values, "walshAverageOrderStatistic"), k);
}

/**
 * The Hodges–Lehmann estimate alone (median of the Walsh averages), for when the bounds are not reachable.
 * Throws a RangeError for an empty input or a non-finite value.
 *
 * @example
 * hodgesLehmannEstimate([1, 3, 10]); // 4.25: the median of 1, 2, 3, 5.5, 6.5, 10
 */
export function hodgesLehmannEstimate(values: ArrayLike<number>): number {
  if (values.length === 0) throw new RangeError("hodgesLehmannEstimate: no values");
  return walshMedian(walshTerms(values, "hodgesLehmannEstimate"));
}

/** The rank of the Walsh-average bounds: the signed-rank null distribution of n values. */
function boundRankFor(n: number, confidence: number, tails: 1 | 2): BoundRank | null {
  const count = (n * (n + 1)) / 2;
  const sd = Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24);
  const scores = (): number[] => Array.from({ length: n }, (_, i) => i + 1);
  const exactCdf = n <= EXACT_AUTO_LIMIT ? (cap: number) => signedRankNullCdf(scores(), cap) : undefined;
  return boundRank({ count, sd, exactCdf }, confidence, tails);
}

/** Smallest n whose extreme Walsh averages reach the confidence: k = 1 needs P(V <= 0) = 2^-n <= the allowance. */
function smallestSufficientN(confidence: number, tails: 1 | 2): number {
  let n = 1;
  while (2 ** -n > (1 - confidence) / tails) n++;
  return n;
}

/**
 * Hodges–Lehmann estimate with distribution-free bounds (default: two-sided at confidence 0.95). A one-sided
 * `side` ("lower" or "upper") gives that bound alone, at the full confidence, and null for the other end,
 * as one-sided order-statistic bounds do. Returns Unavailable for no values, or when n is too small for the
 * confidence (with the n that would do). Throws a RangeError for a confidence outside (0, 1), an unknown side
 * or a non-finite value.
 *
 * @example
 * const r = hodgesLehmann([1.2, 3.4, -0.5, 2.2, 5.1, 0.7, 2.9, 4.4], { confidence: 0.9 });
 * // r.available && r.estimate === 2.425, r.lower === 0.95, r.upper === 3.9000000000000004 ((3.4 + 4.4) / 2
 * // in binary), r.boundRank === 6, r.achievedConfidence === 0.921875 (exact: 1 - 2 * 10/256)
 * hodgesLehmann([1.2, 3.4, -0.5, 2.2, 5.1, 0.7, 2.9, 4.4], { confidence: 0.9, side: "lower" });
 * // lower bound only: rank 9 (P(V <= 8) = 24/256 <= 0.1 < P(V <= 9) = 29/256), achievedConfidence 1 - 24/256
 */
export function hodgesLehmann(
  values: ArrayLike<number>,
  options: { confidence?: number; side?: BoundSide } = {},
): HodgesLehmannResult | Unavailable {
  const confidence = options.confidence ?? 0.95;
  const side = options.side ?? "two-sided";
  if (!(confidence > 0 && confidence < 1))
    throw new RangeError(`hodgesLehmann: confidence must lie strictly between 0 and 1, got ${confidence}`);
  if (side !== "two-sided" && side !== "lower" && side !== "upper") throw new RangeError(`hodgesLehmann: unknown side ${String(side)}`);
  const tails = side === "two-sided" ? 2 : 1;
  const n = values.length;
  if (n === 0) return unavailable("no-data", "There are no values to estimate from.");
  const terms = walshTerms(values, "hodgesLehmann");
  const rank = boundRankFor(n, confidence, tails);
  if (rank === null) {
    const needed = smallestSufficientN(confidence, tails);
    const level = confidenceWords(confidence); // 29%, not 28.999999999999996%; never a rounded 100%
    const what = side === "two-sided" ? `Bounds at ${level} confidence need` : `A one-sided ${side} bound at ${level} confidence needs`;
    return unavailable("unreachable", `${what} at least ${needed} values; there are ${n}.`, needed);
  }
  const count = (n * (n + 1)) / 2;
  return {
    available: true,
    estimate: walshMedian(terms),
    lower: side === "upper" ? null : walshAt(terms, rank.k),
    upper: side === "lower" ? null : walshAt(terms, count - rank.k + 1),
    achievedConfidence: rank.achieved,
    confidence,
    side,
    n,
    method: rank.method,
    boundRank: rank.k,
  };
}
