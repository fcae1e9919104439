/**
 * Wilcoxon–Mann–Whitney rank-sum test for two independent groups, with a hypothesised
 * shift (second − first).
 *
 * Method
 * - Statistic: the second group is moved by the shift (second − shift, taken to the 15
 *   significant digits the sheet shows, differences.ts) and ranked with the first, tied
 *   values sharing their mid-rank. U = (sum of the second group's ranks) − n(n+1)/2, the
 *   number of pairs in which the moved second value exceeds the first, ties counting
 *   one half: F. Wilcoxon (1945), "Individual comparisons by ranking methods",
 *   Biometrics Bulletin 1, 80-83; H. B. Mann and D. R. Whitney (1947), "On a test of
 *   whether one of two random variables is stochastically larger than the other",
 *   Annals of Mathematical Statistics 18, 50-60.
 * - Exact p-value: without ties the Mann–Whitney distribution, with ties the
 *   conditional distribution given the mid-ranks (rankSumNull.ts). One-sided p-values
 *   are the tail at the observed value; two-sided doubles the smaller tail (at most 1),
 *   as R's wilcox.test does for its exact test.
 * - Normal approximation: mean mn/2, variance (mn/12)((N + 1) − sum(t^3 − t)/(N(N − 1)))
 *   with the usual tie correction, continuity correction 1/2, as R's
 *   wilcox.test(correct = TRUE): E. L. Lehmann (1975), "Nonparametrics: Statistical
 *   Methods Based on Ranks", Holden-Day, ch. 1 (from memory).
 * - `auto` takes the exact distribution below the sizes in EXACT_AUTO_SIZE and
 *   EXACT_AUTO_TIED_SIZE (chosen by measurement, see there), the normal one above;
 *   `method` in the result says which ran.
 *
 * Cost: O(N) after sorting (radix sort, ranks.ts), N = m + n; exact without ties
 * O(min(m, n) m n), with ties O(N min(m, n) m n) at worst (rankSumNull.ts).
 */
import { differencesFrom } from "./differences";
import { normalLowerTail, normalUpperTail } from "./normal";
import { greatestCommonDivisor, mergeRanks, sortFloat64 } from "./ranks";
import { mannWhitneyNullCdf, subsetSumNullCdf } from "./rankSumNull";
import type { Alternative, SignedRankMethod, Unavailable } from "./types";
import { unavailable } from "./types";

/**
 * `auto` is exact without ties while m + n is at most this. Measured with `npx tsx bench/run.ts groups`
 * (2-core machine shared with other work, load average above 10): the slowest case, 200 and 200 at p near 1,
 * took 11-14 ms, 9-13x a bare loop over 200,000 cells; the cumulative counts there are accurate to about
 * 1e-11 against BigInt arithmetic (rankSumNull.ts).
 */
export const EXACT_AUTO_SIZE = 400;

/**
 * `auto` is exact with ties while m + n is at most this: the conditional distribution costs
 * O(N min(m, n) m n). In `npm run bench -- groups`, 80 and 80 (tie pairs, p near 1) take about 13 ms with
 * the WebAssembly step (subsetSumStep.ts), where they took 120 ms before it (and before rows that can no
 * longer reach the final size were skipped), when this limit was 80; 40 and 40 now take under 1 ms.
 */
export const EXACT_AUTO_TIED_SIZE = 160;

/**
 * `exact` is honoured up to these sizes; beyond, the normal method runs and `method` says so. Measured on
 * the same machine: 500 and 500 without ties took 0.4-0.5 s (C(1000, 500) is still a finite double), 100 and
 * 100 with ties about 33 ms (0.9 s before the WebAssembly step; 150 and 150 would take about 170 ms).
 */
export const EXACT_SIZE = 1000;
export const EXACT_TIED_SIZE = 200;

/**
 * The largest m + n for which a method request gives the exact p-value, with or without ties (0 for
 * "normal"): the one rule rankSumTest follows, for callers that state the method without the p-value.
 *
 * @example
 * exactSizeLimit("auto", true); // EXACT_AUTO_TIED_SIZE
 */
export function exactSizeLimit(requested: SignedRankMethod, tiesPresent: boolean): number {
  if (requested === "exact") return tiesPresent ? EXACT_TIED_SIZE : EXACT_SIZE;
  if (requested === "auto") return tiesPresent ? EXACT_AUTO_TIED_SIZE : EXACT_AUTO_SIZE;
  return 0;
}

export interface RankSumResult {
  available: true;
  /** U: pairs in which second − shift exceeds first, ties counting 1/2. */
  statistic: number;
  /** Sum of the mid-ranks of the moved second group in the pooled ranking. */
  rankSum: number;
  pValue: number;
  alternative: Alternative;
  /** Method that ran. */
  method: "exact" | "normal";
  requestedMethod: SignedRankMethod;
  shift: number;
  firstN: number;
  secondN: number;
  /** Whether some pooled values share a rank. */
  tiesPresent: boolean;
  /** Mean of U under the null hypothesis: mn/2. */
  expected: number;
  /** Variance of U under the null hypothesis, tie-corrected. */
  variance: number;
  /** Continuity-corrected standard score (normal method only). */
  z?: number;
}

/** The pooled ranking: U, the tie correction, and the tie groups (for the exact conditional distribution). */
interface PooledRanks {
  twiceRankSum: number;
  tieSum: number;
  /** 2 x mid-rank of each tie group, its size, and how many of it belong to the second group. */
  groupScores: number[];
  groupSizes: number[];
  groupSecond: number[];
}

/** Mid-ranks of the two sorted groups together, in one merge. */
function rankPooled(first: Float64Array, second: Float64Array): PooledRanks {
  const { twiceSecondRankSum, tieSum, groupScores, groupSizes, groupSecond } = mergeRanks(first, second);
  return { twiceRankSum: twiceSecondRankSum, tieSum, groupScores, groupSizes, groupSecond };
}

/** P(U <= c) without ties, summing whichever tail is shorter (U and mn − U have the same distribution). */
function untiedLowerTail(m: number, n: number, c: number): number {
  const top = m * n;
  if (c < 0) return 0;
  if (c >= top) return 1;
  if (c <= top - c - 1) return mannWhitneyNullCdf(m, n, c)[c];
  const other = top - c - 1;
  return 1 - mannWhitneyNullCdf(m, n, other)[other];
}

/** Exact p-value without ties, as R's wilcox.test computes it from pwilcox. */
function untiedPValue(m: number, n: number, u: number, alternative: Alternative): number {
  const top = m * n;
  if (alternative === "less") return untiedLowerTail(m, n, u);
  if (alternative === "greater") return untiedLowerTail(m, n, top - u);
  const smaller = u > top / 2 ? untiedLowerTail(m, n, top - u) : untiedLowerTail(m, n, u);
  return Math.min(1, 2 * smaller);
}

/**
 * Exact p-value given the tied mid-ranks. The subset counted is the smaller group; its score sum
 * is the second group's (or, for the first group, its complement, which reverses the tails).
 */
function tiedPValue(ranks: PooledRanks, m: number, n: number, alternative: Alternative): number {
  const { groupScores, groupSizes, groupSecond } = ranks;
  const countSecond = n <= m;
  const lowest = groupScores[0];
  let divisor = 0;
  for (const s of groupScores) divisor = greatestCommonDivisor(s - lowest, divisor);
  if (divisor === 0) return 1; // every value tied: the statistic cannot vary
  const scores: number[] = [];
  const mirrored: number[] = [];
  const highest = (groupScores[groupScores.length - 1] - lowest) / divisor;
  let observed = 0;
  for (let g = 0; g < groupScores.length; g++) {
    const s = (groupScores[g] - lowest) / divisor;
    for (let k = 0; k < groupSizes[g]; k++) {
      scores.push(s);
      mirrored.push(highest - s);
    }
    observed += (countSecond ? groupSecond[g] : groupSizes[g] - groupSecond[g]) * s;
  }
  const size = countSecond ? n : m;
  const lower = (): number => subsetSumNullCdf(scores, size, observed)[observed]; // P(S <= observed)
  const upper = (): number => {
    const c = size * highest - observed; // S >= observed  <=>  mirrored sum <= c
    return subsetSumNullCdf(mirrored, size, c)[c];
  };
  // Large U means the second group ranks high: its own sum is large, or the first group's small.
  const secondLow = countSecond ? lower : upper;
  const secondHigh = countSecond ? upper : lower;
  if (alternative === "less") return secondLow();
  if (alternative === "greater") return secondHigh();
  // The two tails overlap at the observed value, so they add up to at least 1: once one is at most
  // 1/2 it is the smaller, and the other need not be computed.
  const meanScore = (size * scores.reduce((a, b) => a + b, 0)) / scores.length;
  const firstTail = observed <= meanScore ? lower() : upper();
  if (firstTail <= 0.5) return Math.min(1, 2 * firstTail);
  return Math.min(1, 2 * Math.min(firstTail, observed <= meanScore ? upper() : lower()));
}

function normalPValue(u: number, expected: number, variance: number, alternative: Alternative): { pValue: number; z: number } {
  if (!(variance > 0)) return { pValue: 1, z: 0 }; // every value tied: U cannot differ from its mean
  const deviation = u - expected;
  const correction = alternative === "greater" ? 0.5 : alternative === "less" ? -0.5 : 0.5 * Math.sign(deviation);
  const z = (deviation - correction) / Math.sqrt(variance);
  if (alternative === "greater") return { pValue: normalUpperTail(z), z };
  if (alternative === "less") return { pValue: normalLowerTail(z), z };
  return { pValue: Math.min(1, 2 * normalUpperTail(Math.abs(z))), z };
}

const ALTERNATIVES: readonly Alternative[] = ["two-sided", "greater", "less"];
const METHODS: readonly SignedRankMethod[] = ["auto", "exact", "normal"];

/** Sorted copy of finite values; throws a RangeError naming the group on anything else. */
function sortedCopy(values: ArrayLike<number>, group: string): Float64Array {
  const copy = Float64Array.from(values);
  for (let i = 0; i < copy.length; i++)
    if (copy[i] - copy[i] !== 0) throw new RangeError(`rankSumTest: value ${i} of the ${group} group is not finite (${copy[i]})`);
  return sortFloat64(copy);
}

/**
 * Wilcoxon–Mann–Whitney test of "second − shift and first come from the same distribution".
 * "greater" means the second group tends to exceed the first plus the shift. Returns Unavailable
 * when a group is empty or moving the second group by the shift leaves a value beyond the largest
 * double; throws a RangeError for a non-finite value, a non-finite shift or an unknown option.
 *
 * @example
 * const r = rankSumTest([1.1, 2.4, 3.0], [2.9, 4.2, 5.5, 6.1], { alternative: "greater" });
 * // r.available && r.statistic === 11 (of 12 pairs, all but 3.0 > 2.9), r.method === "exact",
 * // r.pValue === 2/35 (U >= 11 in 2 of the C(7, 3) = 35 arrangements)
 */
export function rankSumTest(
  first: ArrayLike<number>,
  second: ArrayLike<number>,
  options: { shift?: number; alternative?: Alternative; method?: SignedRankMethod } = {},
): RankSumResult | Unavailable {
  const shift = options.shift ?? 0;
  const alternative = options.alternative ?? "two-sided";
  const requestedMethod = options.method ?? "auto";
  if (!Number.isFinite(shift)) throw new RangeError(`rankSumTest: shift must be finite, got ${shift}`);
  if (!ALTERNATIVES.includes(alternative)) throw new RangeError(`rankSumTest: unknown alternative ${String(alternative)}`);
  if (!METHODS.includes(requestedMethod)) throw new RangeError(`rankSumTest: unknown method ${String(requestedMethod)}`);
  const m = first.length;
  const n = second.length;
  if (m === 0 || n === 0) return unavailable("no-data", `Each group needs at least one number; the first has ${m}, the second ${n}.`);
  const x = sortedCopy(first, "first");
  const moved = shift === 0 ? second : differencesFrom(second, shift);
  for (let j = 0; j < n; j++) {
    if (!Number.isFinite(moved[j])) {
      return unavailable(
        "unreachable",
        "A value of the second group less the shift is too large to hold as a number; use a smaller shift or rescale the data.",
      );
    }
  }
  const y = sortedCopy(moved, "second");
  const ranks = rankPooled(x, y);
  const total = m + n;
  const rankSum = ranks.twiceRankSum / 2;
  const u = rankSum - (n * (n + 1)) / 2;
  const expected = (m * n) / 2;
  const variance = ((m * n) / 12) * (total + 1 - ranks.tieSum / (total * (total - 1) || 1));
  const tiesPresent = ranks.tieSum > 0;
  const limit = exactSizeLimit(requestedMethod, tiesPresent);
  const common = {
    available: true as const,
    statistic: u,
    rankSum,
    alternative,
    requestedMethod,
    shift,
    firstN: m,
    secondN: n,
    tiesPresent,
    expected,
    variance,
  };
  if (total <= limit) {
    const pValue = tiesPresent ? tiedPValue(ranks, m, n, alternative) : untiedPValue(m, n, u, alternative);
    return { ...common, pValue, method: "exact" };
  }
  const { pValue, z } = normalPValue(u, expected, variance, alternative);
  return { ...common, pValue, method: "normal", z };
}
