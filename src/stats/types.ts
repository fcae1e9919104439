/**
 * Vocabulary shared by every test in `src/stats/`.
 *
 * The words are the trade's own; the cell-function layer maps the synonyms a
 * person may type (">", "above", "both", ...) onto these canonical values.
 */

/** Direction of the alternative hypothesis about the location parameter. */
export type Alternative = "two-sided" | "greater" | "less";

/** What the sign test does with observations equal to the hypothesised value. */
export type TieRule = "drop" | "split" | "conservative";

/** How the sign-test p-value is computed from the binomial count. */
export type SignTestMethod = "exact" | "midp" | "normal";

/** How the signed-rank p-value is computed; `auto` picks exact when feasible. */
export type SignedRankMethod = "auto" | "exact" | "normal";

/** Whether zero differences are dropped before ranking (Wilcoxon) or ranked and then left out of V (Pratt). */
export type ZeroRule = "drop" | "pratt";

/** Which ends of a confidence interval are wanted. */
export type BoundSide = "two-sided" | "lower" | "upper";

/** Order-statistic bounds as they are, or interpolated between neighbours (Hettmansperger & Sheather 1986). */
export type BoundMethod = "exact" | "interpolated";

/** Multiple-comparison adjustments. */
export type AdjustMethod = "holm" | "bonferroni" | "hochberg" | "bh" | "by";

/**
 * An ordinary data condition under which a statistic cannot be given
 * (nothing left after ties, too few values for the confidence asked, ...).
 * It is a value to show, never an exception.
 */
export interface Unavailable {
  readonly available: false;
  /** Machine-readable cause. */
  readonly reason: "no-data" | "too-few-values" | "unreachable";
  /** One sentence for a spreadsheet user: what is missing and, where it helps, what would suffice. */
  readonly message: string;
  /** Smallest sample size that would give an answer, where one exists. */
  readonly minimumN?: number;
}

export function unavailable(reason: Unavailable["reason"], message: string, minimumN?: number): Unavailable {
  return minimumN === undefined ? { available: false, reason, message } : { available: false, reason, message, minimumN };
}
