/**
 * Which order statistic of the pairwise averages or differences bounds a
 * Hodges–Lehmann estimate: the rank k with P(T <= k - 1) within the
 * confidence's allowance, T the rank statistic under the null hypothesis
 * (symmetric about count / 2), and the exact coverage of bounds at that rank.
 *
 * Method: the exact null distribution up to a cap when it is affordable,
 * otherwise the normal approximation with continuity correction.
 * References: Hodges and Lehmann (1963), Ann. Math. Statist. 34(2), 598–611;
 * the interval ranks as in Hollander, Wolfe and Chicken, Nonparametric
 * Statistical Methods, 3rd ed. (2014), chapters 3 and 4 (from memory).
 *
 * Cost: one exact distribution up to the cap (its own cost), or O(1).
 */
import { normalLowerTail, normalQuantile } from "./normal";

/** The rank of the bounds, their coverage, and how it was worked out. */
export interface BoundRank {
  readonly k: number;
  readonly achieved: number;
  readonly method: "exact" | "normal";
}

/** The null distribution of a rank statistic on 0..count, symmetric about count / 2. */
export interface RankNull {
  /** Number of pairs (or Walsh averages): the statistic's largest value. */
  readonly count: number;
  /** Its standard deviation under the null hypothesis. */
  readonly sd: number;
  /** P(T <= t) for t = 0..cap, when the exact distribution is affordable. */
  readonly exactCdf?: (cap: number) => Float64Array;
}

/**
 * Rank k of the bounds and their coverage, or null when even k = 1 does not
 * reach the confidence. `tails` is 2 for two-sided bounds (each tail may miss
 * (1 - confidence) / 2) and 1 for a one-sided bound.
 *
 * @example
 * // Five values: Walsh averages 0..15, exact P(V <= 0) = 1/32.
 * boundRank({ count: 15, sd: Math.sqrt(13.75), exactCdf: (cap) => signedRankNullCdf([1, 2, 3, 4, 5], cap) }, 0.9, 2);
 * // { k: 1, achieved: 0.9375, method: "exact" }
 */
export function boundRank(distribution: RankNull, confidence: number, tails: 1 | 2): BoundRank | null {
  const { count, sd, exactCdf } = distribution;
  const allowance = (1 - confidence) / tails;
  const mean = count / 2;
  const zq = normalQuantile(allowance);
  if (exactCdf) {
    const half = Math.floor(count / 2);
    // The exact quantile lies within a small fraction of an sd of the normal one, so the distribution
    // is worked out to one sd (plus a few units, for small samples) beyond it; should that fall short, to the full half.
    let cap = Math.min(half, Math.max(0, Math.ceil(mean + zq * sd + sd + 10)));
    let cdf = exactCdf(cap);
    if (cdf[cap] <= allowance && cap < half) {
      cap = half;
      cdf = exactCdf(cap);
    }
    if (cdf[0] > allowance) return null;
    let x = 0;
    while (x + 1 <= cap && cdf[x + 1] <= allowance) x++;
    return { k: x + 1, achieved: 1 - tails * cdf[x], method: "exact" };
  }
  const k = Math.floor(mean + 0.5 + zq * sd);
  if (k < 1) return null;
  return { k, achieved: 1 - tails * normalLowerTail((k - 0.5 - mean) / sd), method: "normal" };
}
