/**
 * The sign test for a median, from the counts below, at and above the
 * hypothesised value.
 *
 * Method: under H0 each value not counted as a tie lies above the median with
 * probability 1/2, so the count above is Bin(used, 1/2) (W. J. Dixon and A. M.
 * Mood (1946), "The statistical sign test", Journal of the American Statistical
 * Association 41, 557-566). Exact p-values are binomial tails, two-sided as
 * min(1, 2 × smaller tail); the mid-p variant subtracts half the probability of
 * the observed count (H. O. Lancaster (1961), "Significance tests in discrete
 * distributions", JASA 56, 223-234); the normal approximation uses a continuity
 * correction of 1/2. Tails come from binomial.ts (exact to about 1e-12 at any n).
 *
 * Cost: O(1) after counting (a few binomial tail evaluations).
 */
import { binomialPmf, binomialUpperTail } from "./binomial";
import { normalUpperTail } from "./normal";
import type { SignCounts } from "./signCounts";
import type { Alternative, SignTestMethod, TieRule, Unavailable } from "./types";
import { unavailable } from "./types";

export interface SignTestResult {
  readonly available: true;
  /** The counts as given, before the tie rule. */
  readonly counts: SignCounts;
  /** Values the test counts: below + above after the tie rule. */
  readonly used: number;
  /** Values counted as below the hypothesised median, after the tie rule. */
  readonly below: number;
  /** Values counted as above the hypothesised median, after the tie rule. */
  readonly above: number;
  /** Count above ("greater"), count below ("less"), or the larger of the two ("two-sided"). */
  readonly statistic: number;
  readonly pValue: number;
  readonly alternative: Alternative;
  readonly ties: TieRule;
  readonly method: SignTestMethod;
  /** How many tied values the tie rule counted as below. */
  readonly tiesToBelow: number;
  /** How many tied values the tie rule counted as above. */
  readonly tiesToAbove: number;
  /** Tied values left out (all of them under "drop", at most one under "split", none under "conservative"). */
  readonly tiesDropped: number;
  /** used / 2: the count expected on each side under H0. */
  readonly expected: number;
  /** Which side holds more of the counted values. */
  readonly majority: "below" | "above" | "neither";
  /** The continuity-corrected standard normal score of the statistic ("normal" method only). */
  readonly z: number | null;
}

export interface SignTestOptions {
  /** "greater": the median exceeds the hypothesised value. Default "two-sided". */
  alternative?: Alternative;
  /** Default "drop". */
  ties?: TieRule;
  /** Default "exact". */
  method?: SignTestMethod;
}

function checkCount(name: string, value: number): void {
  if (!Number.isInteger(value) || value < 0) throw new RangeError(`${name} must be a non-negative integer, got ${value}`);
}

/** Ties given to each side under a rule; the rest are dropped. */
function assignTies(counts: SignCounts, ties: TieRule, alternative: Alternative): { toBelow: number; toAbove: number } {
  const { below, tied, above } = counts;
  if (ties === "drop") return { toBelow: 0, toAbove: 0 };
  if (ties === "split") {
    const half = Math.floor(tied / 2);
    return { toBelow: half, toAbove: half };
  }
  // Conservative: every tie counts against the alternative. For "greater" (evidence: many above) they
  // count as below, and the reverse for "less". Two-sided p-values fall as the larger side grows, so the
  // ties go to the smaller side until the two sides are level and are then shared, the odd one to below:
  // that makes the larger side as small as it can be and hence the p-value as large as it can be.
  if (ties === "conservative") {
    if (alternative === "greater") return { toBelow: tied, toAbove: 0 };
    if (alternative === "less") return { toBelow: 0, toAbove: tied };
    const levelling = Math.min(tied, Math.abs(below - above));
    const rest = tied - levelling;
    const toBelow = (below < above ? levelling : 0) + Math.ceil(rest / 2);
    return { toBelow, toAbove: tied - toBelow };
  }
  throw new RangeError(`unknown tie rule ${String(ties)}`);
}

/** One-sided p-value P(S >= s) for S ~ Bin(n, 1/2), by the chosen method. */
function oneSided(s: number, n: number, method: SignTestMethod): number {
  if (method === "exact") return binomialUpperTail(s, n, 0.5);
  if (method === "midp") return binomialUpperTail(s, n, 0.5) - 0.5 * binomialPmf(s, n, 0.5);
  return normalUpperTail(continuityZ(s, n));
}

/** (s - 1/2 - n/2) / (sqrt(n)/2): the normal score of P(S >= s) with the continuity correction. */
function continuityZ(s: number, n: number): number {
  return (2 * s - 1 - n) / Math.sqrt(n);
}

/**
 * Two-sided p-value from the larger count m: the one-sided p-value in the
 * direction of the data doubled, capped at 1 — so it is exactly
 * min(1, 2 × min(p greater, p less)).
 */
function twoSided(m: number, n: number, method: SignTestMethod): number {
  return Math.min(1, 2 * oneSided(m, n, method));
}

/**
 * Sign test of H0: the median equals the value the counts were taken about.
 *
 * Ties (values equal to the hypothesised median):
 * - `drop` (default): left out; the test uses below + above values.
 * - `split`: shared evenly between the sides; with an odd number, one is left out.
 * - `conservative`: all kept and counted against the alternative — as below for
 *   "greater", as above for "less"; for "two-sided" assigned so that the
 *   p-value is as large as possible, which means levelling the two sides
 *   (ties go to the smaller side first, then alternately, the odd one below).
 *
 * Methods: `exact` binomial tail (two-sided: min(1, 2 × smaller tail)); `midp`
 * (exact minus half the probability of the observed count, doubled for
 * two-sided, capped at 1); `normal` (continuity-corrected; two-sided equals R's
 * prop.test with correct = TRUE).
 *
 * No value left after the tie rule gives Unavailable ("no-data").
 *
 * @example
 * signTest({ below: 2, tied: 1, above: 9 });
 * // used 11, statistic 9, pValue 2 × P(Bin(11, 1/2) >= 9) = 0.0654296875
 * signTest({ below: 2, tied: 1, above: 9 }, { alternative: "greater", ties: "conservative" });
 * // below 3, above 9, pValue P(Bin(12, 1/2) >= 9) = 0.072998046875
 */
export function signTest(counts: SignCounts, options: SignTestOptions = {}): SignTestResult | Unavailable {
  const alternative = options.alternative ?? "two-sided";
  const ties = options.ties ?? "drop";
  const method = options.method ?? "exact";
  checkCount("below", counts.below);
  checkCount("tied", counts.tied);
  checkCount("above", counts.above);
  if (alternative !== "two-sided" && alternative !== "greater" && alternative !== "less") {
    throw new RangeError(`unknown alternative ${String(alternative)}`);
  }
  if (method !== "exact" && method !== "midp" && method !== "normal") throw new RangeError(`unknown method ${String(method)}`);
  const { toBelow, toAbove } = assignTies(counts, ties, alternative);
  const below = counts.below + toBelow;
  const above = counts.above + toAbove;
  const used = below + above;
  if (used === 0) {
    return unavailable(
      "no-data",
      counts.tied > 0
        ? "Every value equals the hypothesised median, so the sign test has nothing above or below it to count."
        : "No values were given, so the sign test has nothing to count.",
    );
  }
  const statistic = alternative === "greater" ? above : alternative === "less" ? below : Math.max(below, above);
  const pValue = alternative === "two-sided" ? twoSided(statistic, used, method) : oneSided(statistic, used, method);
  return {
    available: true,
    counts: { below: counts.below, tied: counts.tied, above: counts.above },
    used,
    below,
    above,
    statistic,
    pValue,
    alternative,
    ties,
    method,
    tiesToBelow: toBelow,
    tiesToAbove: toAbove,
    tiesDropped: counts.tied - toBelow - toAbove,
    expected: used / 2,
    majority: below > above ? "below" : above > below ? "above" : "neither",
    z: method === "normal" ? continuityZ(statistic, used) : null,
  };
}
