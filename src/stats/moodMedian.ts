/**
 * Mood's median test: do several independent groups share one median?
 *
 * Method: A. M. Mood (1950), "Introduction to the Theory of Statistics", McGraw-Hill,
 * ch. 16 (from memory). The pooled median of all values splits each group into the
 * values above it and the values not above it, giving a 2×k table of counts.
 * - Two groups: Fisher's exact test on the 2×2 table (fisherExact.ts); "greater" means
 *   the second group has more values above the pooled median than the margins lead one
 *   to expect (its median tends to be higher).
 * - k groups: Pearson's chi-square statistic on the 2×k table with k − 1 degrees of
 *   freedom (chiSquare.ts); when some expected count is below 5 (W. G. Cochran (1954),
 *   "Some methods for strengthening the common χ² tests", Biometrics 10, 417-451, from
 *   memory) `auto` gives instead, up to MONTE_CARLO_MAX_VALUES values, a seeded Monte Carlo p-value: REPLICATES random tables
 *   with the same margins (each group's count drawn in turn from its hypergeometric
 *   distribution), p = (1 + the number of tables whose statistic reaches the observed
 *   one) / (REPLICATES + 1), as R's chisq.test(simulate.p.value = TRUE) counts them. The
 *   seed is fixed, so a recalculation gives the same p-value.
 * - Values equal to the pooled median (compared at the 15 significant digits the sheet
 *   shows, differences.ts): common practice varies, so the rule is chosen: "join-lower"
 *   (the default, Mood's own "above / not above"), "join-upper" (counted with the
 *   values above), or "leave-out" (left out of the table; the median stays the pooled
 *   median of every value).
 *
 * Cost: O(N) for the median (selection) and the counts; Monte Carlo O(REPLICATES × N)
 * at worst; chi-square O(k).
 */
import { chiSquareUpperTail } from "./chiSquare";
import { fisherExactPValue, hypergeometricDraw } from "./fisherExact";
import { selectInPlace } from "./selection";
import { countSigns } from "./signCounts";
import type { Alternative, Unavailable } from "./types";
import { unavailable } from "./types";
import { xorshift32 } from "./xorshift";

/** Where values equal to the pooled median go. */
export type MedianTieRule = "join-lower" | "join-upper" | "leave-out";

/** How the p-value is computed; `auto` picks by the size of the expected counts. */
export type MedianTestMethod = "auto" | "chi-square" | "monte-carlo";

/** Random tables drawn for the Monte Carlo p-value. */
export const REPLICATES = 10000;

/** Expected counts below this send `auto` to the Monte Carlo p-value (Cochran's rule, common practice). */
const SMALL_EXPECTED = 5;

/**
 * `auto` simulates only up to this many values in the table: a replicate costs O(N), so 10,000 of them
 * stay near 10^7 steps. Beyond it (a small group among large ones) the chi-square p-value is given and
 * `method` says so.
 */
export const MONTE_CARLO_MAX_VALUES = 1000;

export interface MoodMedianResult {
  available: true;
  pooledMedian: number;
  /** Per group, in the order given: values counted above the pooled median. */
  above: number[];
  /** Per group: values counted not above (below, plus the equal ones under "join-lower"). */
  notAbove: number[];
  /** Values equal to the pooled median, all groups together (left out under "leave-out"). */
  equal: number;
  ties: MedianTieRule;
  /** Pearson's chi-square statistic of the table (also given for two groups). */
  statistic: number;
  degreesOfFreedom: number;
  pValue: number;
  /** Two groups: "fisher"; more: "chi-square" or "monte-carlo". */
  method: "fisher" | "chi-square" | "monte-carlo";
  /** The alternative (two groups only; more groups are always two-sided). */
  alternative: Alternative;
  /** The smallest expected count in the table. */
  smallestExpected: number;
}

/** The median of all values of all groups (mean of the two middle values for an even count). */
function pooledMedianOf(groups: readonly ArrayLike<number>[], total: number): number {
  const pooled = new Float64Array(total);
  let p = 0;
  for (const g of groups) for (let i = 0; i < g.length; i++) pooled[p++] = g[i];
  const upper = selectInPlace(pooled, total >> 1);
  if (total % 2 === 1) return upper;
  let lower = -Infinity;
  for (let i = 0; i < total >> 1; i++) if (pooled[i] > lower) lower = pooled[i];
  const mid = (lower + upper) / 2;
  return Number.isFinite(mid) ? mid : lower / 2 + upper / 2;
}

/** Pearson's statistic of the 2×k table with first-row counts `top` and column totals `sizes`. */
function pearson(top: ArrayLike<number>, sizes: ArrayLike<number>, topTotal: number, total: number): number {
  if (topTotal === 0 || topTotal === total) return 0; // one row empty: the table shows no difference
  let statistic = 0;
  for (let j = 0; j < sizes.length; j++) {
    const expectedTop = (sizes[j] * topTotal) / total;
    const expectedBottom = sizes[j] - expectedTop;
    const d = top[j] - expectedTop;
    statistic += (d * d) / expectedTop + (d * d) / expectedBottom;
  }
  return statistic;
}

/** Monte Carlo p-value over random tables with the observed margins. */
function monteCarloPValue(sizes: number[], topTotal: number, total: number, observed: number): number {
  const random = xorshift32(0x5eed ^ total ^ (topTotal << 11));
  const top = new Float64Array(sizes.length);
  const reach = observed * (1 - 64 * Number.EPSILON); // equal statistics computed in another order still count
  let atLeast = 0;
  for (let r = 0; r < REPLICATES; r++) {
    let remainingTop = topTotal;
    let remaining = total;
    for (let j = 0; j < sizes.length; j++) {
      const x = j === sizes.length - 1 ? remainingTop : hypergeometricDraw(sizes[j], remainingTop, remaining, random());
      top[j] = x;
      remainingTop -= x;
      remaining -= sizes[j];
    }
    if (pearson(top, sizes, topTotal, total) >= reach) atLeast++;
  }
  return (1 + atLeast) / (REPLICATES + 1);
}

/**
 * Mood's median test on two or more groups of finite values (each with at least one). Returns Unavailable
 * for fewer than two non-empty groups or when "leave-out" leaves a group empty; throws a RangeError on NaN
 * or an unknown option.
 *
 * @example
 * const r = moodMedianTest([[1, 2, 3, 4], [5, 6, 7, 8]], { alternative: "greater" });
 * // pooled median 4.5; the second group has all 4 above, the first none: r.pValue === 1/70 (Fisher, exact)
 */
export function moodMedianTest(
  groups: readonly ArrayLike<number>[],
  options: { ties?: MedianTieRule; alternative?: Alternative; method?: MedianTestMethod } = {},
): MoodMedianResult | Unavailable {
  const ties = options.ties ?? "join-lower";
  const alternative = options.alternative ?? "two-sided";
  const requested = options.method ?? "auto";
  if (ties !== "join-lower" && ties !== "join-upper" && ties !== "leave-out")
    throw new RangeError(`moodMedianTest: unknown tie rule ${String(ties)}`);
  if (alternative !== "two-sided" && alternative !== "greater" && alternative !== "less")
    throw new RangeError(`moodMedianTest: unknown alternative ${String(alternative)}`);
  if (requested !== "auto" && requested !== "chi-square" && requested !== "monte-carlo")
    throw new RangeError(`moodMedianTest: unknown method ${String(requested)}`);
  const filled = groups.filter((g) => g.length > 0);
  if (filled.length < 2)
    return unavailable(
      "too-few-values",
      `The median test needs at least two groups with numbers; there ${filled.length === 1 ? "is 1" : `are ${filled.length}`}.`,
    );
  let total = 0;
  for (const g of filled) total += g.length;
  const pooledMedian = pooledMedianOf(filled, total);
  const above: number[] = [];
  const notAbove: number[] = [];
  let equal = 0;
  for (const g of filled) {
    const c = countSigns(g, pooledMedian);
    equal += c.tied;
    above.push(c.above + (ties === "join-upper" ? c.tied : 0));
    notAbove.push(c.below + (ties === "join-lower" ? c.tied : 0));
  }
  const sizes = above.map((a, j) => a + notAbove[j]);
  if (sizes.some((s) => s === 0)) {
    return unavailable(
      "too-few-values",
      "Leaving out the values equal to the pooled median leaves a group empty; count them with the lower or upper values instead.",
    );
  }
  const counted = sizes.reduce((s, x) => s + x, 0);
  const topTotal = above.reduce((s, x) => s + x, 0);
  const statistic = pearson(above, sizes, topTotal, counted);
  let smallestExpected = Infinity;
  for (const s of sizes) smallestExpected = Math.min(smallestExpected, (s * topTotal) / counted, (s * (counted - topTotal)) / counted);
  const common = {
    available: true as const,
    pooledMedian,
    above,
    notAbove,
    equal,
    ties,
    statistic,
    degreesOfFreedom: sizes.length - 1,
    smallestExpected,
  };
  if (sizes.length === 2) {
    // Rows: second group, first group; columns: above, not above. "greater": the second group sits higher.
    const pValue = fisherExactPValue(above[1], notAbove[1], above[0], notAbove[0], alternative);
    return { ...common, pValue, method: "fisher", alternative };
  }
  const simulate = smallestExpected < SMALL_EXPECTED && counted <= MONTE_CARLO_MAX_VALUES;
  const method = requested === "auto" ? (simulate ? "monte-carlo" : "chi-square") : requested;
  const pValue =
    method === "chi-square" ? chiSquareUpperTail(statistic, sizes.length - 1) : monteCarloPValue(sizes, topTotal, counted, statistic);
  return { ...common, pValue, method, alternative: "two-sided" };
}
