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
 *   EXACT_RANK_LIMIT values, the continuity-corrected normal approximation above.
 *   The exact bounds assume continuous data (no ties), as R's wilcox.test does
 *   for its exact interval.
 * - Selection, mostly distinct data: J. F. Monahan (1984), "Algorithm 616: Fast
 *   computation of the Hodges–Lehmann location estimator", ACM Transactions on
 *   Mathematical Software 10, 265-270. The Walsh averages form a matrix with
 *   sorted rows and columns once the data are sorted; a pivot among the averages
 *   still in play is counted against in O(n) along the matrix's staircase, and
 *   the rows' candidate ranges shrink around the wanted rank. Here each round
 *   brackets the rank between two values of a random sample of the candidates,
 *   as R. W. Floyd and R. L. Rivest (1975), "Expected time bounds for
 *   selection", CACM 18, 165-172, do for plain selection, so a round keeps about
 *   an eighth of the candidates. When few remain they are gathered and selected
 *   directly (selection.ts).
 * - Selection, data where at most half the values are distinct: the Walsh sums
 *   x_i + x_j, i <= j, are the upper triangle of the full n x n matrix of sums,
 *   which is the matrix of differences x_j - (-x_i) (the same values exactly),
 *   whose order statistics differenceSelection.ts selects with equal values
 *   merged (a walk costs the number of distinct values, not n). Every Walsh sum
 *   off the diagonal appears twice in the full matrix and each diagonal one
 *   once, so the full matrix's sums at ranks max(k, 2k - n) and min(2k, n^2)
 *   bracket the k-th Walsh sum with at most n sums between them; one walk along
 *   the triangle's staircase counts at both and gathers those between. The
 *   estimate and both bounds are selected together.
 *   The n(n+1)/2 averages are never built.
 *
 * Cost: O(n log n) expected time (sorting, then O(log n) rounds of O(n), or the
 * difference selection and one O(n) walk per rank), O(n) memory; the exact rank adds O(n^3) at worst, for
 * n <= EXACT_RANK_LIMIT.
 */
import { boundRank, type BoundRank } from "./boundRank";
import { confidenceWords } from "./quantileBounds";
import { differenceMatrix, differenceOrderStatistics } from "./differenceSelection";
import { sortFloat64 } from "./ranks";
import { selectInPlace } from "./selection";
import { signedRankNullCdf } from "./signedRank";
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
 * The Walsh sums terms[i] + terms[j], i <= j, at the given ranks (1-based, among the n(n+1)/2), for `terms`
 * sorted ascending, answered in the order asked. Each is first bracketed by two order statistics of the full
 * n x n matrix of sums (see fullMatrixRanks), selected together by differenceSelection.ts as differences
 * terms[j] - (-terms[i]) (exactly the sums: subtracting a negated value is adding it), and then found with one
 * walk over the rows between its two brackets (walshInBracket).
 */
function walshSums(terms: Float64Array, ranks: readonly number[]): number[] {
  const n = terms.length;
  const matrix = differenceMatrix(
    terms.map((x) => -x),
    terms,
  );
  const brackets = differenceOrderStatistics(
    matrix,
    ranks.flatMap((k) => fullMatrixRanks(n, k)),
  );
  return ranks.map((k, r) => walshInBracket(terms, k, brackets[2 * r], brackets[2 * r + 1]));
}

/**
 * Ranks among the n^2 sums of the full matrix (every ordered pair, so each Walsh sum off the diagonal twice,
 * each diagonal one once) whose values bracket the k-th Walsh sum w. With F(t) the full matrix's sums <= t and
 * D(t) the diagonal's, the Walsh sums <= t number (F(t) + D(t)) / 2, and D(t) <= min(F(t), n). Below the
 * value a of rank max(k, 2k - n), F < max(k, 2k - n), so F + D < 2k: fewer than k Walsh sums, hence w >= a.
 * At the value b of rank min(2k, n^2), F >= 2k (or b is the largest sum), hence w <= b. At most n sums of
 * the full matrix, so at most n Walsh sums, lie strictly between a and b.
 */
function fullMatrixRanks(n: number, k: number): [number, number] {
  return [Math.max(k, 2 * k - n), Math.min(2 * k, n * n)];
}

/**
 * The k-th smallest Walsh sum, given values low <= it <= high: one walk down the staircase counts the sums
 * at most `low` and below `high` in each row (both boundaries can only move left as the row's first term
 * grows) and gathers the sums strictly between, among which the rank is selected (selection.ts).
 */
function walshInBracket(terms: Float64Array, k: number, low: number, high: number): number {
  if (low === high) return low;
  const n = terms.length;
  const band = new Float64Array(n);
  let size = 0;
  let atMostLow = 0;
  let belowHigh = 0;
  let a = n;
  let b = n;
  for (let i = 0; i < n; i++) {
    const x = terms[i];
    while (a > i && x + terms[a - 1] > low) a--;
    while (b > i && x + terms[b - 1] >= high) b--;
    const endLow = a > i ? a : i;
    const endHigh = b > i ? b : i;
    atMostLow += endLow - i;
    belowHigh += endHigh - i;
    if (size + endHigh - endLow > n) throw new Error("walshInBracket: more sums between the brackets than the bound allows");
    for (let j = endLow; j < endHigh; j++) band[size++] = x + terms[j];
  }
  if (k <= atMostLow) return low;
  if (k > belowHigh) return high;
  return selectInPlace(band.subarray(0, size), k - atMostLow - 1);
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

/** The Walsh averages at the given ranks (1-based), in the order asked; -0 and +0 tie in every order, so a zero is always +0. */
function walshAverages(t: WalshTerms, ranks: readonly number[]): number[] {
  const sums = repeatsOften(t.terms) ? walshSums(t.terms, ranks) : walshSumsByRounds(t.terms, ranks);
  return sums.map((sum) => sum * t.factor + 0);
}

/**
 * Whether at most half the sorted terms are distinct. Then the difference selection, which merges equal
 * values, is the faster way (measured: 6x on 10^5 values of 1,201 distinct ones); on mostly distinct data
 * the rounds over the triangle alone are as fast or faster.
 */
function repeatsOften(terms: Float64Array): boolean {
  let distinct = terms.length > 0 ? 1 : 0;
  for (let i = 1; i < terms.length; i++) if (terms[i] !== terms[i - 1]) distinct++;
  return 2 * distinct <= terms.length;
}

/** The Walsh sums at the given ranks by the rounds (selectWalsh), a rank just after the one before by one walk (nextWalsh). */
function walshSumsByRounds(terms: Float64Array, ranks: readonly number[]): number[] {
  const sums: number[] = [];
  ranks.forEach((k, r) => sums.push(r > 0 && k === ranks[r - 1] + 1 ? nextWalsh(terms, sums[r - 1], k - 1) : selectWalsh(terms, k)));
  return sums;
}

function middleOf(a: number, b: number): number {
  const m = (a + b) / 2;
  return Number.isFinite(m) ? m : a / 2 + b / 2;
}

/** The ranks whose Walsh averages the median is: the middle one, or the two middle ones, of n(n+1)/2. */
function middleRanks(n: number): number[] {
  const count = (n * (n + 1)) / 2;
  return count % 2 === 1 ? [(count + 1) / 2] : [count / 2, count / 2 + 1];
}

/** The median from the averages at middleRanks. */
function medianOf(middle: readonly number[]): number {
  return middle.length === 1 ? middle[0] : middleOf(middle[0], middle[1]) + 0;
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
  return walshAverages(walshTerms(values, "walshAverageOrderStatistic"), [k])[0];
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
  return medianOf(walshAverages(walshTerms(values, "hodgesLehmannEstimate"), middleRanks(values.length)));
}

/**
 * The bounds' rank comes from the exact signed-rank distribution up to this many values, from the normal
 * approximation above. It stays at 400 while the signed-rank p-value's `auto` limit rose to 1,000
 * (signedRank.ts): the rank needs the whole lower distribution up to the bound, not one tail sum, and at
 * 1,000 values that took 35 ms against 2 ms for the estimate and bounds themselves (measured on this
 * machine with signedRankNullCdf over ranks 1..1,000 up to 232,000, the 95% bound's neighbourhood).
 */
export const EXACT_RANK_LIMIT = 400;

/** The rank of the Walsh-average bounds: the signed-rank null distribution of n values. */
function boundRankFor(n: number, confidence: number, tails: 1 | 2): BoundRank | null {
  const count = (n * (n + 1)) / 2;
  const sd = Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24);
  const scores = (): number[] => Array.from({ length: n }, (_, i) => i + 1);
  const exactCdf = n <= EXACT_RANK_LIMIT ? (cap: number) => signedRankNullCdf(scores(), cap) : undefined;
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
  // The median and the bounds lie close together among the averages: one selection brackets them all.
  const count = (n * (n + 1)) / 2;
  const middle = middleRanks(n);
  const bounds = [side === "upper" ? null : rank.k, side === "lower" ? null : count - rank.k + 1];
  const averages = walshAverages(terms, [...middle, ...bounds.filter((k) => k !== null)]);
  const [lower, upper] =
    side === "upper" ? [null, averages[middle.length]] : [averages[middle.length], averages[middle.length + 1] ?? null];
  return {
    available: true,
    estimate: medianOf(averages.slice(0, middle.length)),
    lower,
    upper,
    achievedConfidence: rank.achieved,
    confidence,
    side,
    n,
    method: rank.method,
    boundRank: rank.k,
  };
}
