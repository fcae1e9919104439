/**
 * Fisher's exact test on a 2×2 table of counts.
 *
 * Method: given the margins, the top-left count X is hypergeometric. Its probabilities
 * are built from the mode outwards by the ratio
 * P(x + 1)/P(x) = (r − x)(c − x) / ((x + 1)(N − r − c + x + 1)), r and c the first row's and
 * first column's totals, and normalised by their sum, so no factorial is ever formed.
 * One-sided p-values are tails of X; the two-sided p-value sums the probabilities of every
 * table no more likely than the observed one, allowing a relative 1e-7 for rounding, as
 * R's fisher.test does: R. A. Fisher (1935), "The logic of inductive inference", JRSS 98,
 * 39-82 (from memory); the two-sided rule is common practice.
 *
 * Cost: O(min(r, c)) time and memory.
 */
import type { Alternative } from "./types";

/** The probabilities of X = lo..hi and the support's ends. */
function hypergeometric(rowTotal: number, columnTotal: number, total: number): { lo: number; probabilities: Float64Array } {
  const lo = Math.max(0, rowTotal + columnTotal - total);
  const hi = Math.min(rowTotal, columnTotal);
  const weights = new Float64Array(hi - lo + 1);
  const ratioUp = (x: number) => ((rowTotal - x) * (columnTotal - x)) / ((x + 1) * (total - rowTotal - columnTotal + x + 1));
  // The mode: the largest x whose ratio from x - 1 is at least 1.
  const mode = Math.min(hi, Math.max(lo, Math.floor(((rowTotal + 1) * (columnTotal + 1)) / (total + 2))));
  weights[mode - lo] = 1;
  for (let x = mode; x < hi; x++) weights[x + 1 - lo] = weights[x - lo] * ratioUp(x);
  for (let x = mode; x > lo; x--) weights[x - 1 - lo] = weights[x - lo] / ratioUp(x - 1);
  let sum = 0;
  for (let i = 0; i < weights.length; i++) sum += weights[i];
  for (let i = 0; i < weights.length; i++) weights[i] /= sum;
  return { lo, probabilities: weights };
}

/**
 * Fisher's exact p-value for the table [[a, b], [c, d]] of non-negative whole numbers. "greater" means the
 * odds ratio ad/bc exceeds 1 (a large), as in R's fisher.test. Throws a RangeError for a count that is not
 * a non-negative whole number or an unknown alternative.
 *
 * @example
 * fisherExactPValue(3, 1, 1, 3, "greater"); // 17/70 = 0.24285714285714285
 * fisherExactPValue(3, 1, 1, 3);            // 34/70 (tables with a = 0, 1, 3, 4)
 */
export function fisherExactPValue(a: number, b: number, c: number, d: number, alternative: Alternative = "two-sided"): number {
  for (const v of [a, b, c, d])
    if (!Number.isInteger(v) || v < 0) throw new RangeError(`fisherExactPValue: counts must be non-negative whole numbers, got ${v}`);
  if (alternative !== "two-sided" && alternative !== "greater" && alternative !== "less")
    throw new RangeError(`fisherExactPValue: unknown alternative ${String(alternative)}`);
  const { lo, probabilities } = hypergeometric(a + b, a + c, a + b + c + d);
  const at = a - lo;
  let p = 0;
  if (alternative === "greater") for (let i = at; i < probabilities.length; i++) p += probabilities[i];
  else if (alternative === "less") for (let i = 0; i <= at; i++) p += probabilities[i];
  else {
    const limit = probabilities[at] * (1 + 1e-7);
    for (let i = 0; i < probabilities.length; i++) if (probabilities[i] <= limit) p += probabilities[i];
  }
  return Math.min(1, p);
}

/**
 * One draw of X, the top-left count of a random 2×2 table with the given margins (inverse of the
 * distribution function), from a uniform number in [0, 1). For the seeded Monte Carlo of moodMedian.ts.
 *
 * @example
 * hypergeometricDraw(2, 2, 4, 0.1); // 0 (P(X = 0) = 1/6)
 */
export function hypergeometricDraw(rowTotal: number, columnTotal: number, total: number, uniform: number): number {
  const lo = Math.max(0, rowTotal + columnTotal - total);
  const hi = Math.min(rowTotal, columnTotal);
  // P(X = lo) by the product of ratios from the mode would cost as much; start from the log of P(lo) instead.
  let logP = logChoose(columnTotal, lo) + logChoose(total - columnTotal, rowTotal - lo) - logChoose(total, rowTotal);
  let p = Math.exp(logP);
  let cumulative = p;
  let x = lo;
  while (cumulative <= uniform && x < hi) {
    logP += Math.log(((rowTotal - x) * (columnTotal - x)) / ((x + 1) * (total - rowTotal - columnTotal + x + 1)));
    p = Math.exp(logP);
    cumulative += p;
    x++;
  }
  return x;
}

/** log C(n, k) by summing logarithms: O(min(k, n − k)), exact enough for the small tables simulated. */
function logChoose(n: number, k: number): number {
  const r = Math.min(k, n - k);
  let s = 0;
  for (let i = 1; i <= r; i++) s += Math.log((n - r + i) / i);
  return s;
}
