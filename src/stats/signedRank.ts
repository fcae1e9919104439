/**
 * Wilcoxon signed-rank test on differences already taken (x - m, or paired differences).
 *
 * Method
 * - Ranks: absolute differences ranked with midranks for ties. Zeros are either
 *   dropped before ranking (Wilcoxon's rule) or ranked with the rest and then left
 *   out of the statistic (J. W. Pratt (1959), "Remarks on zeros and ties in the
 *   Wilcoxon signed rank procedures", JASA 54, 655-667). Statistic V = sum of the
 *   ranks of the positive differences: F. Wilcoxon (1945), "Individual
 *   comparisons by ranking methods", Biometrics Bulletin 1, 80-83.
 * - Exact p-value: the permutation (conditional) null distribution given the
 *   observed ranks, each sign + or - with probability 1/2. Scores 2 x midrank are
 *   integers, so the distribution of the score sum follows from the subset-sum
 *   recursion f_k(w) = f_{k-1}(w) + f_{k-1}(w - s_k) over the scores (divided by
 *   their common divisor); with ties and Pratt's zeros this is still exact. Only
 *   the smaller tail is summed, using the symmetry of the distribution. Two
 *   savings make it several times cheaper than the plain recursion: every
 *   intermediate distribution is symmetric about half its total, so only its
 *   lower half is built (the rest is read in mirror); and the scores are dealt
 *   alternately into two sets whose distributions are built separately, so
 *   each recursion runs over half the scores and a quarter of the total, and
 *   P(W <= q) = sum_x P(A = x) P(B <= q - x) joins them in one O(q) pass (B is
 *   built in units of its scores' common divisor: 2 for untied ranks). When q is
 *   within four standard deviations of the mean, each table leaves out its far
 *   lower tail as it grows (at most 1e-25 of the distribution, by Hoeffding's
 *   inequality; see lowerHalf), which saves about a third of the work at n = 1,000.
 * - Normal approximation: mean and variance of V given the ranks (with the
 *   usual tie correction sum(t^3 - t)/48), continuity correction 1/2, as R's
 *   wilcox.test(correct = TRUE): E. L. Lehmann (1975), "Nonparametrics:
 *   Statistical Methods Based on Ranks", Holden-Day, ch. 3 (from memory).
 * - `auto` uses the exact distribution for up to EXACT_AUTO_LIMIT non-zero
 *   differences, `exact` for up to EXACT_LIMIT; see those constants for the timing.
 *
 * Cost: ranking O(n) (radix sort, ranks.ts); exact distribution O(n * c) time and
 * O(c) memory, c <= n(n+1)/2 the tail cut-off (O(n^3) at worst, about n^3/24 additions
 * with both savings against n^3/6 for the plain recursion, each a step of subsetSumStep.ts, which runs in
 * WebAssembly where it can); normal O(1) after ranking.
 */
import { normalLowerTail, normalUpperTail } from "./normal";
import { greatestCommonDivisor, mergeRanks, sortFloat64 } from "./ranks";
import { subsetSumEngine, type SubsetSumEngine } from "./subsetSumStep";
import type { Alternative, SignedRankMethod, ZeroRule } from "./types";
import { unavailable, type Unavailable } from "./types";

/**
 * `auto` is exact up to this many non-zero differences, as far as `exact` goes. Chosen by measurement
 * with `npm run bench -- signedRank` (2-core machine): the slowest exact case at 1,000 (tie pairs
 * making every score odd, p near 1) takes about 14 ms with the WebAssembly step (subsetSumStep.ts)
 * and about 85 ms where only the JavaScript step runs; without ties about 5 ms, a ninth of R 4.2's
 * wilcox.test(exact = TRUE) on the same data (bench/signedRankVsR.ts). At 1,000 the
 * continuity-corrected normal p-value is still off by 0.2% at p = 0.01, 1% at 0.001 and 7% at 1e-6
 * (same bench), so up to here exactness is worth its cost. (It was 400 while the step ran in
 * JavaScript only. The Hodges-Lehmann bounds keep their own limit for the exact rank,
 * hodgesLehmann.ts.)
 */
export const EXACT_AUTO_LIMIT = 1000;

/**
 * `exact` is honoured up to this many non-zero differences: the slowest case takes about 14 ms with
 * the WebAssembly step and 85 ms with the JavaScript one (same bench), and the cost grows as n^3.
 * Above it the normal approximation is used under `auto` and `exact` answers #N/A, saying so (at 1,000
 * the approximation is off by 0.2% at p = 0.01 and 1% at 0.001).
 */
export const EXACT_LIMIT = 1000;

export interface SignedRankResult {
  available: true;
  /** V: sum of the ranks of the positive differences (midranks; may end in .5 with ties). */
  statistic: number;
  pValue: number;
  alternative: Alternative;
  /** Method actually used. */
  method: "exact" | "normal";
  requestedMethod: SignedRankMethod;
  zeros: ZeroRule;
  /** Differences ranked: non-zero ones, plus the zeros under Pratt's rule. */
  n: number;
  nonZero: number;
  zeroCount: number;
  /** Whether some non-zero absolute differences share a rank. */
  tiesPresent: boolean;
  /** Standardised statistic with continuity correction (normal method only). */
  z?: number;
  /** Mean of V under the null hypothesis, given the ranks. */
  expected: number;
  /** Variance of V under the null hypothesis, given the ranks (tie-corrected). */
  variance: number;
}

/** Multiplies x by 2^e without overflow or premature underflow of the power itself. */
function timesPowerOfTwo(x: number, e: number): number {
  let y = x;
  let k = e;
  while (k < -1000) {
    y *= 2 ** -1000;
    k += 1000;
  }
  while (k > 1000) {
    y *= 2 ** 1000;
    k -= 1000;
  }
  return y * 2 ** k;
}

/** Scores beyond this could not be summed in a 32-bit integer index. */
const MAX_SCORE = 2 ** 30;

/**
 * Items between rescalings of a count table: counts grow by at most 2 per item, so a table's total stays
 * below 2^420 and the product of two tables' totals (signedRankLowerTail) below 2^840, far from overflow.
 */
const RESCALE_EVERY = 400;

/**
 * P(W <= w) for w = 0..cap, where W is the sum of a random subset of the positive integer
 * `scores`, each score in with probability 1/2 independently: the null distribution of
 * the signed-rank statistic in score units. Throws a RangeError on a non-positive or
 * non-integer score or a negative cap.
 *
 * @example
 * // Scores 1, 2, 3 (ranks without ties): sums 0,1,2,3,3,4,5,6 each with probability 1/8.
 * signedRankNullCdf([1, 2, 3], 3); // Float64Array [0.125, 0.25, 0.375, 0.625]
 */
export function signedRankNullCdf(scores: ArrayLike<number>, cap: number): Float64Array {
  if (!Number.isInteger(cap) || cap < 0) throw new RangeError(`signedRankNullCdf: cap must be a non-negative integer, got ${cap}`);
  const sorted = Int32Array.from(scores, (s) => {
    if (!Number.isInteger(s) || s <= 0 || s > MAX_SCORE)
      throw new RangeError(`signedRankNullCdf: scores must be positive integers, got ${s}`);
    return s;
  }).sort(); // small scores first: the reachable range grows slowly
  const engine = subsetSumEngine();
  const [counts] = engine.tables([cap + 1]);
  counts.fill(0, 0, cap + 1);
  counts[0] = 1;
  let reach = 0;
  let exponent = 0; // counts are scaled by 2^-exponent to stay in range
  for (let k = 0; k < sorted.length; k++) {
    const s = sorted[k];
    reach = Math.min(cap, reach + s);
    engine.step(counts, s, reach, s);
    if ((k + 1) % RESCALE_EVERY === 0) {
      let largest = 0;
      for (let w = 0; w <= reach; w++) if (counts[w] > largest) largest = counts[w];
      const shift = Math.floor(Math.log2(largest));
      const factor = 2 ** -shift;
      for (let w = 0; w <= reach; w++) counts[w] *= factor;
      exponent += shift;
    }
  }
  const cdf = new Float64Array(cap + 1);
  let running = 0;
  for (let w = 0; w <= cap; w++) {
    running += counts[w];
    cdf[w] = timesPowerOfTwo(running, exponent - sorted.length);
  }
  return cdf;
}

/**
 * The lower half of the distribution of a random subset sum of `scores` (ascending positive integers):
 * counts[w] for w = floor..limit, limit = min(cap, floor(total / 2)), scaled by 2^-exponent; a count above
 * the limit is the count at total - w (the distribution is symmetric about total / 2), and a count below
 * `floor` (or, in mirror, above total - floor) is left out as negligible (see lowerHalf).
 */
interface LowerHalf {
  readonly counts: Float64Array;
  readonly limit: number;
  readonly total: number;
  readonly exponent: number;
  readonly floor: number;
}

/**
 * A Float64Array kept between calls and grown when a call needs more: at n = 200-300 allocating and zeroing
 * a fresh one took a noticeable share of a call (bench/signedRankVsR.ts). Nothing is kept but the memory:
 * every call writes the entries it reads. (The half-tables come from the step's engine, which keeps them the
 * same way, in memory its WebAssembly can reach.)
 */
class KeptTable {
  private array = new Float64Array(0);
  atLeast(length: number): Float64Array {
    if (this.array.length < length) this.array = new Float64Array(Math.max(length, 2 * this.array.length));
    return this.array;
  }
}

/** B's running total (signedRankLowerTail), reused by every call. */
const CUMULATIVE_TABLE = new KeptTable();

/** Entries the half-table of `scores` needs for P(W <= cap): up to min(cap, floor(total / 2)). */
function halfTableLength(scores: Int32Array, cap: number): number {
  let total = 0;
  for (let k = 0; k < scores.length; k++) total += scores[k];
  return Math.min(cap, Math.floor(total / 2)) + 1;
}

/**
 * The subset-sum recursion, keeping at every step only the lower half of the symmetric distribution so far:
 * the values above the old half that the step needs are read in mirror first. With `negligible` > 0, the
 * far lower tail is left out as the sums grow: after k scores, sums below mean − t_k, with
 * t_k = sqrt(sum s_i² · ln(K / negligible) / 2) (K scores in all), hold at most a fraction negligible / K of
 * the 2^k subsets by Hoeffding's inequality (W. Hoeffding (1963), "Probability inequalities for sums of
 * bounded random variables", JASA 58, 13-30, theorem 2), and every subset left out stands for the same share
 * of the final count as it did then, so all that is left out is at most `negligible` of the whole
 * distribution. The table then only spans the last 2 t_k below the middle: about half of the work at 1,000
 * scores.
 */
function lowerHalf(scores: Int32Array, cap: number, negligible: number, counts: Float64Array, engine: SubsetSumEngine): LowerHalf {
  let total = 0;
  for (let k = 0; k < scores.length; k++) total += scores[k];
  const finalLimit = Math.min(cap, Math.floor(total / 2));
  // Every entry the recursion reads it has written first (an entry above the old half is set in mirror before
  // the step adds into it, and nothing below the floor is read), so a kept table needs no clearing.
  counts[0] = 1;
  const spread = negligible > 0 ? Math.log(scores.length / negligible) / 2 : 0;
  let reach = 0; // total of the scores so far
  let limit = 0; // counts[floor..limit] hold the distribution of the scores so far
  let floor = 0;
  let squares = 0;
  let exponent = 0;
  for (let k = 0; k < scores.length; k++) {
    const s = scores[k];
    const nextLimit = Math.min(finalLimit, Math.floor((reach + s) / 2));
    // Counts of the scores so far above their half: by symmetry, or zero beyond their total (or in the left-out tail).
    for (let w = limit + 1; w <= nextLimit; w++) counts[w] = w <= reach && reach - w >= floor ? counts[reach - w] : 0;
    squares += s * s;
    const tail = negligible > 0 ? Math.ceil((reach + s) / 2 - Math.sqrt(squares * spread)) : 0;
    const nextFloor = Math.min(nextLimit, Math.max(floor, tail));
    // Below floor + s the step would add counts already left out, that is nothing.
    engine.step(counts, Math.max(s, floor + s, nextFloor), nextLimit, s);
    reach += s;
    limit = nextLimit;
    floor = nextFloor;
    if ((k + 1) % RESCALE_EVERY === 0) {
      let largest = 0;
      for (let w = floor; w <= limit; w++) if (counts[w] > largest) largest = counts[w];
      const shift = Math.floor(Math.log2(largest));
      const factor = 2 ** -shift;
      for (let w = floor; w <= limit; w++) counts[w] *= factor;
      exponent += shift;
    }
  }
  return { counts, limit, total, exponent, floor };
}

/**
 * How much of the distribution lowerHalf may leave out for P(W <= q): 1e-25 when the normal approximation
 * puts q no further than four standard deviations below the mean (then P(W <= q) is above about 1e-5, so
 * what is left out changes it by less than 1e-19 of itself, far below rounding), nothing otherwise (a far
 * tail is the part that counts; the cap at q keeps that table short anyway).
 */
function negligibleFor(scores: Int32Array, q: number): number {
  let total = 0;
  let squares = 0;
  for (let k = 0; k < scores.length; k++) {
    total += scores[k];
    squares += scores[k] * scores[k];
  }
  const z = (q + 0.5 - total / 2) / Math.sqrt(squares / 4);
  return z >= -4 ? 1e-25 : 0;
}

/**
 * P(W <= q), W the sum of a random subset of the positive integer `scores` (each in with probability 1/2):
 * the scores, in ascending order, are dealt alternately into two sets A and B of near-equal totals, and
 * P(W <= q) = sum over x of P(A = x) P(B <= q - x). `engine` runs the recursion's steps (subsetSumStep.ts):
 * the shared one by default; the tests and the bench pass each engine in turn, and both give the same bits.
 *
 * @example
 * signedRankLowerTail([1, 2, 3], 3); // 0.625 (sums 0, 1, 2, 3, 3 of the eight)
 */
export function signedRankLowerTail(scores: ArrayLike<number>, q: number, engine = subsetSumEngine()): number {
  if (!Number.isInteger(q)) throw new RangeError(`signedRankLowerTail: q must be an integer, got ${q}`);
  const sorted = Int32Array.from(scores, (s) => {
    if (!Number.isInteger(s) || s <= 0 || s > MAX_SCORE)
      throw new RangeError(`signedRankLowerTail: scores must be positive integers, got ${s}`);
    return s;
  }).sort();
  return lowerTailOfAscending(sorted, q, engine);
}

/** signedRankLowerTail on scores already checked and in ascending order. */
function lowerTailOfAscending(sorted: Int32Array, q: number, engine: SubsetSumEngine): number {
  if (q < 0) return 0;
  const first = new Int32Array((sorted.length + 1) >> 1);
  const second = new Int32Array(sorted.length >> 1);
  for (let k = 0; k < sorted.length; k++) {
    if (k % 2 === 0) first[k >> 1] = sorted[k];
    else second[k >> 1] = sorted[k];
  }
  const negligible = negligibleFor(sorted, q);
  // B in units of its scores' common divisor: untied ranks deal the even scores to B, which halves its table.
  let unit = 0;
  for (let k = 0; k < second.length; k++) unit = greatestCommonDivisor(second[k], unit);
  unit = Math.max(1, unit);
  if (unit > 1) for (let k = 0; k < second.length; k++) second[k] /= unit;
  const [aTable, bTable] = engine.tables([halfTableLength(first, q), halfTableLength(second, Math.floor(q / unit))]);
  const a = lowerHalf(first, q, negligible, aTable, engine);
  const b = lowerHalf(second, Math.floor(q / unit), negligible, bTable, engine);
  // P(B <= y units) for y = 0..min(q / unit, total of B), in B's scale (zero in the left-out tails).
  const top = Math.min(Math.floor(q / unit), b.total);
  const cumulative = CUMULATIVE_TABLE.atLeast(top + 1);
  const bCounts = b.counts;
  let running = 0;
  for (let y = 0; y <= top; y++) {
    const at = y <= b.limit ? y : b.total - y;
    cumulative[y] = running += at < b.floor ? 0 : bCounts[at];
  }
  let sum = 0;
  // A's counts are zero below its floor and above total - floor (the left-out tails); above the limit in mirror.
  const aCounts = a.counts;
  const end = Math.min(q, a.total, a.total - a.floor);
  const direct = Math.min(end, a.limit);
  let x = a.floor;
  for (; x <= direct; x++) sum += aCounts[x] * cumulative[Math.min(Math.floor((q - x) / unit), top)];
  for (; x <= end; x++) sum += aCounts[a.total - x] * cumulative[Math.min(Math.floor((q - x) / unit), top)];
  return timesPowerOfTwo(sum, a.exponent + b.exponent - sorted.length);
}

/** The ranked data a signed-rank test needs: V, the null moments, and the score groups for the exact distribution. */
interface RankedDifferences {
  statistic: number;
  nonZero: number;
  zeroCount: number;
  ranked: number;
  tiesPresent: boolean;
  expected: number;
  variance: number;
  /** 2 x midrank of each tie group of non-zero |d| (integers), and how many in the group and how many positive. */
  groupScores: number[];
  groupSizes: number[];
  groupPositives: number[];
}

/** How many differences are positive and how many negative; throws a RangeError on NaN. */
function countSignsOf(differences: ArrayLike<number>): { positives: number; negatives: number } {
  let positives = 0;
  let negatives = 0;
  for (let i = 0; i < differences.length; i++) {
    const d = differences[i];
    if (d > 0) positives++;
    else if (d < 0) negatives++;
    else if (d !== 0) throw new RangeError(`signedRankTest: difference ${i} is NaN`);
  }
  return { positives, negatives };
}

function rankDifferences(
  differences: ArrayLike<number>,
  positives: number,
  negatives: number,
  zeros: ZeroRule,
  keepGroups: boolean,
): RankedDifferences {
  const n = differences.length;
  const above = new Float64Array(positives);
  const below = new Float64Array(negatives);
  for (let i = 0, p = 0, q = 0; i < n; i++) {
    const d = differences[i];
    if (d > 0) above[p++] = d;
    else if (d < 0) below[q++] = -d;
  }
  sortFloat64(above);
  sortFloat64(below);
  const zeroCount = n - positives - negatives;
  const nonZero = positives + negatives;
  const offset = zeros === "pratt" ? zeroCount : 0; // Pratt: the zeros hold ranks 1..zeroCount
  // Below first, above second: the second sample's rank sum is V.
  const merged = mergeRanks(below, above, offset, keepGroups);
  const tieSum = merged.tieSum; // sum of t^3 - t over tie groups of non-zero |d|
  const total = offset + nonZero;
  // Sums over the non-zero ranks of r and r^2: all ranks 1..total, less the zeros' 1..offset, less the tie reduction.
  const sumRanks = (total * (total + 1) - offset * (offset + 1)) / 2;
  const sumSquares = (total * (total + 1) * (2 * total + 1) - offset * (offset + 1) * (2 * offset + 1)) / 6 - tieSum / 12;
  return {
    statistic: merged.twiceSecondRankSum / 2,
    nonZero,
    zeroCount,
    ranked: zeros === "pratt" ? n : nonZero,
    tiesPresent: tieSum > 0,
    expected: sumRanks / 2,
    variance: sumSquares / 4,
    groupScores: merged.groupScores,
    groupSizes: merged.groupSizes,
    groupPositives: merged.groupSecond,
  };
}

/** Exact p-value from the conditional null distribution of the score sum. */
function exactPValue(ranked: RankedDifferences, alternative: Alternative): number {
  const { groupScores, groupSizes, groupPositives } = ranked;
  let divisor = 0;
  for (const s of groupScores) divisor = greatestCommonDivisor(s, divisor);
  // The groups come in increasing score, so the scores are already in the order the recursion wants.
  const scores = new Int32Array(ranked.nonZero);
  let observed = 0;
  let total = 0;
  for (let g = 0, k = 0; g < groupScores.length; g++) {
    const s = groupScores[g] / divisor;
    scores.fill(s, k, (k += groupSizes[g]));
    observed += groupPositives[g] * s;
    total += groupSizes[g] * s;
  }
  // P(W <= c), summing whichever tail is shorter; W and total - W have the same distribution.
  const engine = subsetSumEngine();
  const lowerTail = (c: number): number => {
    if (c < 0) return 0;
    if (c >= total) return 1;
    if (c <= total - c - 1) return lowerTailOfAscending(scores, c, engine);
    return 1 - lowerTailOfAscending(scores, total - c - 1, engine);
  };
  if (alternative === "less") return lowerTail(observed);
  if (alternative === "greater") return lowerTail(total - observed);
  return Math.min(1, 2 * lowerTail(Math.min(observed, total - observed)));
}

function normalPValue(ranked: RankedDifferences, alternative: Alternative): { pValue: number; z: number } {
  const deviation = ranked.statistic - ranked.expected;
  const correction = alternative === "greater" ? 0.5 : alternative === "less" ? -0.5 : 0.5 * Math.sign(deviation);
  const z = (deviation - correction) / Math.sqrt(ranked.variance);
  if (alternative === "greater") return { pValue: normalUpperTail(z), z };
  if (alternative === "less") return { pValue: normalLowerTail(z), z };
  return { pValue: 2 * normalUpperTail(Math.abs(z)), z };
}

const ALTERNATIVES: readonly Alternative[] = ["two-sided", "greater", "less"];
const METHODS: readonly SignedRankMethod[] = ["auto", "exact", "normal"];
const ZERO_RULES: readonly ZeroRule[] = ["drop", "pratt"];

/**
 * Wilcoxon signed-rank test of "the differences are symmetric about 0".
 * "greater" means the differences tend to be positive. NaN differences throw a RangeError
 * (the cell layer never produces them), as do option values outside their types.
 *
 * @example
 * const r = signedRankTest([1.5, -0.5, 2, 3, 0.25, 4], { alternative: "greater" });
 * // r.available && r.statistic === 19 (ranks 3 + 4 + 5 + 1 + 6), r.method === "exact", r.pValue === 0.046875 (3/64)
 */
export function signedRankTest(
  differences: ArrayLike<number>,
  options: { alternative?: Alternative; method?: SignedRankMethod; zeros?: ZeroRule } = {},
): SignedRankResult | Unavailable {
  const alternative = options.alternative ?? "two-sided";
  const requestedMethod = options.method ?? "auto";
  const zeros = options.zeros ?? "drop";
  if (!ALTERNATIVES.includes(alternative)) throw new RangeError(`signedRankTest: unknown alternative ${String(alternative)}`);
  if (!METHODS.includes(requestedMethod)) throw new RangeError(`signedRankTest: unknown method ${String(requestedMethod)}`);
  if (!ZERO_RULES.includes(zeros)) throw new RangeError(`signedRankTest: unknown zero rule ${String(zeros)}`);
  if (differences.length === 0) return unavailable("no-data", "There are no differences to rank.");
  const limit = requestedMethod === "exact" ? EXACT_LIMIT : requestedMethod === "auto" ? EXACT_AUTO_LIMIT : 0;
  const { positives, negatives } = countSignsOf(differences);
  const exact = positives + negatives <= limit; // decides whether the score groups are worth keeping
  const ranked = rankDifferences(differences, positives, negatives, zeros, exact);
  if (ranked.nonZero === 0) {
    return unavailable(
      "too-few-values",
      "Every difference is zero, so there is nothing to rank: at least one non-zero difference is needed.",
    );
  }
  const common = {
    available: true as const,
    statistic: ranked.statistic,
    alternative,
    requestedMethod,
    zeros,
    n: ranked.ranked,
    nonZero: ranked.nonZero,
    zeroCount: ranked.zeroCount,
    tiesPresent: ranked.tiesPresent,
    expected: ranked.expected,
    variance: ranked.variance,
  };
  if (exact) return { ...common, pValue: exactPValue(ranked, alternative), method: "exact" };
  const { pValue, z } = normalPValue(ranked, alternative);
  return { ...common, pValue, method: "normal", z };
}
