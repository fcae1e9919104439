/**
 * Kruskal–Wallis test: do several independent groups come from one distribution?
 *
 * Method: W. H. Kruskal and W. A. Wallis (1952), "Use of ranks in one-criterion variance
 * analysis", JASA 47, 583-621. All values are ranked together, tied values sharing their
 * mid-rank (ranks.ts); H = 12/(N(N + 1)) sum R_j²/n_j − 3(N + 1), divided by the tie
 * correction 1 − sum(t³ − t)/(N³ − N); the p-value is the chi-square upper tail with
 * k − 1 degrees of freedom (chiSquare.ts), as R's kruskal.test gives it.
 *
 * Cost: O(N log N) (sorting, and the mid-ranks by binary search, ranks.ts), O(N) memory.
 */
import { chiSquareUpperTail } from "./chiSquare";
import { midranks, sortFloat64 } from "./ranks";
import type { Unavailable } from "./types";
import { unavailable } from "./types";

export interface KruskalWallisResult {
  available: true;
  /** H, tie-corrected. */
  statistic: number;
  degreesOfFreedom: number;
  pValue: number;
  /** Mean mid-rank of each non-empty group, in the order given. */
  meanRanks: number[];
  /** The tie correction factor 1 − sum(t³ − t)/(N³ − N) (1 without ties). */
  tieCorrection: number;
  /** Values ranked. */
  n: number;
}

/**
 * Kruskal–Wallis test on two or more groups of finite values; empty groups are left out. Returns
 * Unavailable for fewer than two non-empty groups or when every value is the same; throws a RangeError
 * on a non-finite value.
 *
 * @example
 * const r = kruskalWallisTest([[1, 2, 3], [4, 5, 6], [7, 8, 9]]);
 * // r.available, r.statistic 7.2 (7.200000000000003 in binary), r.degreesOfFreedom === 2, r.pValue about exp(-3.6) = 0.0273 (chi-square, 2 df)
 */
export function kruskalWallisTest(groups: readonly ArrayLike<number>[]): KruskalWallisResult | Unavailable {
  const filled = groups.filter((g) => g.length > 0);
  if (filled.length < 2)
    return unavailable(
      "too-few-values",
      `The rank test needs at least two groups with numbers; there ${filled.length === 1 ? "is 1" : `are ${filled.length}`}.`,
    );
  let n = 0;
  for (const g of filled) n += g.length;
  const sorted = new Float64Array(n);
  let p = 0;
  for (const g of filled) {
    for (let i = 0; i < g.length; i++) {
      if (g[i] - g[i] !== 0) throw new RangeError(`kruskalWallisTest: value ${i} of a group is not finite`);
      sorted[p++] = g[i];
    }
  }
  const ranks = midranks(sorted); // in the pooled order: the groups one after another
  sortFloat64(sorted);
  let tieSum = 0;
  for (let i = 0; i < n;) {
    let j = i + 1;
    while (j < n && sorted[j] === sorted[i]) j++;
    const t = j - i;
    if (t > 1) tieSum += t * t * t - t;
    i = j;
  }
  const tieCorrection = 1 - tieSum / (n * n * n - n);
  if (!(tieCorrection > 0)) return unavailable("too-few-values", "Every value is the same, so there is nothing to rank.");
  let weighted = 0;
  const meanRanks: number[] = [];
  let at = 0;
  for (const g of filled) {
    let rankSum = 0;
    for (let i = 0; i < g.length; i++) rankSum += ranks[at++];
    meanRanks.push(rankSum / g.length);
    weighted += (rankSum * rankSum) / g.length;
  }
  const h = ((12 / (n * (n + 1))) * weighted - 3 * (n + 1)) / tieCorrection;
  const statistic = Math.max(0, h);
  const degreesOfFreedom = filled.length - 1;
  return {
    available: true,
    statistic,
    degreesOfFreedom,
    pValue: chiSquareUpperTail(statistic, degreesOfFreedom),
    meanRanks,
    tieCorrection,
    n,
  };
}
