/**
 * Exact test that a population quantile equals a given value (the quantile
 * test; the sign test is the case q = 1/2).
 *
 * Method: under H0 the q-quantile is `value`, so each value not equal to it
 * lies below it with probability q and the count below is Bin(used, q)
 * (W. J. Conover (1999), "Practical Nonparametric Statistics", 3rd ed., Wiley,
 * section 3.2, the quantile test; cited from memory). Values equal to `value` are dropped. The
 * two-sided p-value is either the smaller tail doubled (consistent with the
 * equal-tailed bounds of quantileBounds.ts: a value inside the bounds at
 * confidence 1 - α is never rejected at α, one outside always is) or the
 * minimum-likelihood rule of R's binom.test: the total probability of counts
 * no more likely than the one observed, with a relative slack of 1e-7 so that
 * counts of equal probability are not lost to rounding.
 *
 * Cost: O(n) to count, then O(log n) binomial evaluations (the probability
 * mass is unimodal, so the cut-off on the far side is found by bisection).
 */
import { binomialLogPmf, binomialLowerTail, binomialUpperTail } from "./binomial";
import { countSigns } from "./signCounts";
import type { Alternative, Unavailable } from "./types";
import { unavailable } from "./types";

/** Relative slack of the minimum-likelihood rule, as in R's binom.test (relErr <- 1 + 1e-7). */
const LIKELIHOOD_SLACK = Math.log1p(1e-7);

export type TwoSidedRule = "doubling" | "minimum-likelihood";

export interface QuantileTestResult {
  readonly available: true;
  /** Values strictly below `value`. */
  readonly below: number;
  /** Values equal to `value` (left out). */
  readonly tied: number;
  /** Values strictly above `value`. */
  readonly above: number;
  /** below + above: the number of binomial trials. */
  readonly used: number;
  readonly quantile: number;
  readonly value: number;
  /** The count below `value`. */
  readonly statistic: number;
  /** used × quantile: the count below expected under H0. */
  readonly expected: number;
  readonly pValue: number;
  /** "greater": the true q-quantile exceeds `value` (then fewer values fall below it than expected). */
  readonly alternative: Alternative;
  readonly twoSidedRule: TwoSidedRule;
}

export interface QuantileTestOptions {
  /** Default "two-sided". */
  alternative?: Alternative;
  /** Default "doubling". */
  twoSidedRule?: TwoSidedRule;
}

/**
 * Largest k in [low, high] with holds(k), for a predicate true up to a point and false after;
 * low - 1 when it never holds.
 */
function lastHolding(holds: (k: number) => boolean, low: number, high: number): number {
  let yes = low - 1;
  let no = high + 1;
  while (no - yes > 1) {
    const mid = yes + Math.floor((no - yes) / 2);
    if (holds(mid)) yes = mid;
    else no = mid;
  }
  return yes;
}

/**
 * R's binom.test two-sided p-value: P(X <= x) plus the far tail of counts whose
 * probability is at most (1 + 1e-7) times that of x (or the mirror image when x
 * is above the mean); 1 when x equals the mean n q.
 */
function minimumLikelihood(x: number, n: number, q: number): number {
  const mean = n * q;
  if (x === mean) return 1;
  const limit = binomialLogPmf(x, n, q) + LIKELIHOOD_SLACK;
  const unlikely = (k: number) => binomialLogPmf(k, n, q) <= limit;
  if (x < mean) {
    // The mass falls from ceil(mean) to n: find the first k there that is no more likely than x.
    const first = Math.ceil(mean);
    const lastLikely = lastHolding((k) => !unlikely(k), first, n);
    const far = lastLikely + 1 > n ? 0 : binomialUpperTail(lastLikely + 1, n, q);
    return Math.min(1, binomialLowerTail(x, n, q) + far);
  }
  // The mass rises from 0 to floor(mean): the unlikely counts there form the stretch 0..lastUnlikely.
  const lastUnlikely = lastHolding(unlikely, 0, Math.floor(mean));
  const far = lastUnlikely < 0 ? 0 : binomialLowerTail(lastUnlikely, n, q);
  return Math.min(1, binomialUpperTail(x, n, q) + far);
}

/**
 * Tests H0: the population `quantile` equals `value`, from the values below and
 * above it (values equal to it are dropped). The count below is Bin(used, q)
 * under H0:
 * - "greater" (the true quantile exceeds `value`): p = P(count <= below);
 * - "less": p = P(count >= below);
 * - "two-sided": `doubling` (default) min(1, 2 × the smaller of those), or
 *   `minimum-likelihood` as R's binom.test.
 *
 * Unavailable ("no-data") when no value differs from `value`. Throws
 * RangeError for a quantile outside (0, 1) or a NaN value.
 *
 * @example
 * // 20 readings, 18 of them below 10 and 2 above: is the 0.9 quantile above 10?
 * quantileTest(readings, 10, 0.9, { alternative: "greater" }); // pValue = P(Bin(20, 0.9) <= 18) ≈ 0.608
 */
export function quantileTest(
  values: ArrayLike<number>,
  value: number,
  quantile: number,
  options: QuantileTestOptions = {},
): QuantileTestResult | Unavailable {
  const alternative = options.alternative ?? "two-sided";
  const twoSidedRule = options.twoSidedRule ?? "doubling";
  if (!(quantile > 0 && quantile < 1)) throw new RangeError(`quantile must lie strictly between 0 and 1, got ${quantile}`);
  if (alternative !== "two-sided" && alternative !== "greater" && alternative !== "less") {
    throw new RangeError(`unknown alternative ${String(alternative)}`);
  }
  if (twoSidedRule !== "doubling" && twoSidedRule !== "minimum-likelihood")
    throw new RangeError(`unknown two-sided rule ${String(twoSidedRule)}`);
  const { below, tied, above } = countSigns(values, value);
  const used = below + above;
  if (used === 0) {
    return unavailable(
      "no-data",
      tied > 0
        ? `Every value equals ${value}, so no value falls below or above it to test the quantile with.`
        : "No values were given, so there is nothing to test the quantile with.",
    );
  }
  const lowerTail = () => binomialLowerTail(below, used, quantile);
  const upperTail = () => binomialUpperTail(below, used, quantile);
  let pValue: number;
  if (alternative === "greater") pValue = lowerTail();
  else if (alternative === "less") pValue = upperTail();
  else if (twoSidedRule === "doubling") pValue = Math.min(1, 2 * Math.min(lowerTail(), upperTail()));
  else pValue = minimumLikelihood(below, used, quantile);
  return {
    available: true,
    below,
    tied,
    above,
    used,
    quantile,
    value,
    statistic: below,
    expected: used * quantile,
    pValue,
    alternative,
    twoSidedRule,
  };
}
