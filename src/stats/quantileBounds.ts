/**
 * Distribution-free confidence bounds for a quantile from order statistics,
 * with their exact achieved confidence.
 *
 * Method: if B counts the values at or below the true q-quantile, B ~ Bin(n, q)
 * for a continuous population, so the r-th smallest value X(r) lies at or below
 * the quantile with probability P(B >= r). The lower bound X(l) takes the
 * largest l with P(B <= l - 1) within the allowed miss, the upper bound X(u)
 * the smallest u with P(B >= u) within it (W. R. Thompson (1936), "On
 * confidence ranges for the median and other expectation distributions for
 * populations of unknown distribution form", Annals of Mathematical Statistics
 * 7, 122-128). Two-sided bounds are equal-tailed: each tail gets at most
 * (1 - confidence) / 2, so the coverage is at least the nominal confidence
 * (up to rounding: see `withinAllowance`).
 * With tied values the closed interval covers at least as often.
 *
 * Interpolated bounds for the median: T. P. Hettmansperger and S. J. Sheather
 * (1986), "Confidence intervals based on interpolated order statistics",
 * Statistics & Probability Letters 4, 75-79 (see `quantileBounds`).
 *
 * The order statistics come from Floyd–Rivest selection on one copy of the
 * data (selection.ts), never a full sort; the ranks from a galloping search
 * over exact binomial tails (binomial.ts) started at the normal approximation.
 *
 * Cost: O(n) expected time: on long samples one read-only pass (selection.ts, valuesAtRanks), otherwise
 * one n-value copy; O(log n) tail evaluations.
 */
import { BINOMIAL_MAX_N, binomialLowerTail, binomialUpperTail } from "./binomial";
import { normalQuantile } from "./normal";
import { checkFinite, valuesAtRanks } from "./selection";
import type { BoundMethod, BoundSide, Unavailable } from "./types";
import { unavailable } from "./types";

/** How the interpolated bounds were formed (Hettmansperger & Sheather 1986). */
export interface BoundInterpolation {
  /** Weight λ on the inner order statistic: bound = (1 - λ) X(outer) + λ X(inner). */
  readonly weight: number;
  /** Exact confidence of the outer order statistics (the wider exact bounds). */
  readonly outerConfidence: number;
  /** Exact confidence of the next order statistics inwards (always below the nominal confidence). */
  readonly innerConfidence: number;
}

export interface QuantileBoundsResult {
  readonly available: true;
  /** Lower bound, or null for an upper one-sided bound. */
  readonly lower: number | null;
  /** Upper bound, or null for a lower one-sided bound. */
  readonly upper: number | null;
  /**
   * Exact method: the exact probability, for a continuous population, that the
   * bounds hold the quantile (at least the nominal confidence). Interpolated
   * method: the nominal confidence, which Hettmansperger & Sheather show is
   * very nearly attained for symmetric populations; the exact coverage lies
   * between `interpolation.innerConfidence` and `interpolation.outerConfidence`.
   */
  readonly achievedConfidence: number;
  /** Nominal confidence asked for. */
  readonly confidence: number;
  readonly quantile: number;
  readonly side: BoundSide;
  readonly method: BoundMethod;
  /** Number of values. */
  readonly n: number;
  /** One-based rank of the order statistic giving the lower bound (the outer one when interpolated). */
  readonly lowerRank: number | null;
  /** One-based rank of the order statistic giving the upper bound (the outer one when interpolated). */
  readonly upperRank: number | null;
  /**
   * Interpolation details, or null: always null for the exact method, and null
   * for the interpolated method when the exact bounds are already the middle
   * two values (no order statistic lies further in to interpolate towards);
   * the exact bounds and their exact confidence are then given.
   */
  readonly interpolation: BoundInterpolation | null;
}

/** Ranks of exact order-statistic bounds and their exact coverage. */
export interface BoundRanks {
  readonly available: true;
  readonly lowerRank: number | null;
  readonly upperRank: number | null;
  /** P(lower <= quantile <= upper) for a continuous population, from the binomial tails. */
  readonly achievedConfidence: number;
}

function checkProbability(name: string, value: number): void {
  if (!(value > 0 && value < 1)) throw new RangeError(`${name} must lie strictly between 0 and 1, got ${value}`);
}

function checkSide(side: BoundSide): void {
  if (side !== "two-sided" && side !== "lower" && side !== "upper") throw new RangeError(`unknown side ${String(side)}`);
}

/** Miss probability allowed in each bounded tail. */
function tailAllowance(confidence: number, side: BoundSide): number {
  return side === "two-sided" ? (1 - confidence) / 2 : 1 - confidence;
}

/** Relative slack of `withinAllowance`: far above the binomial tails' error (about 1e-12), far below any real difference. */
const ALLOWANCE_SLACK = 1e-9;

/**
 * Whether a miss probability stays within the allowance. Rounding is forgiven:
 * a relative 1e-9 for the tail's own rounding, and 2^-52 for the rounding of
 * 1 - confidence. Otherwise decimal coincidences that hold exactly would be
 * decided by the last bit: 0.1^2 = 1 - 0.99 (the 2nd smallest of two values is
 * an exact 99% upper bound for the 0.1 quantile) and 0.1 = 1 - 0.9 both fail in
 * plain double arithmetic. The coverage is then at least the nominal
 * confidence to within that slack.
 */
function withinAllowance(tail: number, allowance: number): boolean {
  return tail <= allowance * (1 + ALLOWANCE_SLACK) + Number.EPSILON;
}

/**
 * Largest k in [low, high] with `holds(k)`, for a predicate that holds up to
 * some point and fails after it; low - 1 when it never holds. Gallops from
 * `guess` and then bisects, so a good guess costs two or three evaluations.
 */
function lastHolding(holds: (k: number) => boolean, low: number, high: number, guess: number): number {
  const start = Math.min(high, Math.max(low, guess));
  let yes: number; // holds here (or low - 1)
  let no: number; // fails here (or high + 1)
  if (holds(start)) {
    yes = start;
    let step = 1;
    no = start + step;
    while (no <= high && holds(no)) {
      yes = no;
      step *= 2;
      no = start + step;
    }
    no = Math.min(no, high + 1);
  } else {
    no = start;
    let step = 1;
    yes = start - step;
    while (yes >= low && !holds(yes)) {
      no = yes;
      step *= 2;
      yes = start - step;
    }
    yes = Math.max(yes, low - 1);
  }
  while (no - yes > 1) {
    const mid = yes + Math.floor((no - yes) / 2);
    if (holds(mid)) yes = mid;
    else no = mid;
  }
  return yes;
}

/** Normal-approximation start n q + z sd for the rank searches (the searches themselves are exact). */
function normalGuess(n: number, quantile: number, z: number): number {
  return Math.floor(n * quantile + z * Math.sqrt(n * quantile * (1 - quantile)));
}

/** Largest l with P(B <= l - 1) <= allowance, or null when even l = 1 misses too often. */
function lowerRankFor(n: number, quantile: number, allowance: number): number | null {
  const guess = normalGuess(n, quantile, normalQuantile(allowance)) - 1;
  const k = lastHolding((j) => withinAllowance(binomialLowerTail(j, n, quantile), allowance), 0, n - 1, guess);
  return k < 0 ? null : k + 1;
}

/** Smallest u with P(B >= u) <= allowance, or null when even u = n misses too often. */
function upperRankFor(n: number, quantile: number, allowance: number): number | null {
  const guess = normalGuess(n, quantile, -normalQuantile(allowance)) + 1;
  const k = lastHolding((j) => !withinAllowance(binomialUpperTail(j, n, quantile), allowance), 0, n, guess);
  // At a confidence near 0 the slack of withinAllowance admits even P(B >= 0) = 1, which would make the rank 0;
  // X(1) is then the answer (its tail is no larger), and there is no X(0) to select.
  return k + 1 > n ? null : Math.max(1, k + 1);
}

/**
 * Smallest n with tail(n) <= allowance, where tail(n) = r^n is P(B <= 0) (r = 1 - q)
 * or P(B >= n) (r = q): the condition for the outermost order statistic to serve.
 * `logRatio` is log r, passed in so that log(1 - q) can be formed as log1p(-q).
 */
function smallestReaching(logRatio: number, allowance: number, tail: (n: number) => number): number {
  const estimate = Math.max(1, Math.ceil(Math.log(allowance) / logRatio));
  if (estimate > BINOMIAL_MAX_N / 2) return estimate;
  // The log estimate can be off by one through rounding; confirm with the same tail the ranks use.
  return 1 + lastHolding((n) => !withinAllowance(tail(n), allowance), 1, BINOMIAL_MAX_N, estimate - 1);
}

/**
 * Smallest sample size for which order-statistic bounds with this quantile,
 * confidence and side exist (every larger size has them too).
 *
 * @example
 * minimumSampleSize(0.5, 0.95, "two-sided"); // 6: (1/2)^6 <= 0.025 < (1/2)^5
 * minimumSampleSize(0.9, 0.95, "upper");     // 29: 0.9^29 < 0.05 < 0.9^28
 * minimumSampleSize(0.9, 0.95, "lower");     // 2: 0.1^2 <= 0.05 < 0.1
 */
export function minimumSampleSize(quantile: number, confidence: number, side: BoundSide = "two-sided"): number {
  checkProbability("quantile", quantile);
  checkProbability("confidence", confidence);
  checkSide(side);
  const allowance = tailAllowance(confidence, side);
  const forLower = smallestReaching(Math.log1p(-quantile), allowance, (n) => binomialLowerTail(0, n, quantile));
  const forUpper = smallestReaching(Math.log(quantile), allowance, (n) => binomialUpperTail(n, n, quantile));
  if (side === "lower") return forLower;
  if (side === "upper") return forUpper;
  return Math.max(forLower, forUpper);
}

/**
 * Ranks of the exact order-statistic bounds for n values, and their exact
 * coverage; Unavailable (with minimumN) when n is too small.
 *
 * @example
 * boundRanks(10, 0.5, 0.95, "two-sided");
 * // { available: true, lowerRank: 2, upperRank: 9, achievedConfidence: 0.978515625 }
 */
export function boundRanks(n: number, quantile: number, confidence: number, side: BoundSide = "two-sided"): BoundRanks | Unavailable {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`n must be a non-negative integer, got ${n}`);
  checkProbability("quantile", quantile);
  checkProbability("confidence", confidence);
  checkSide(side);
  const allowance = tailAllowance(confidence, side);
  const lowerRank = side === "upper" || n === 0 ? null : lowerRankFor(n, quantile, allowance);
  const upperRank = side === "lower" || n === 0 ? null : upperRankFor(n, quantile, allowance);
  if (n === 0 || (side !== "upper" && lowerRank === null) || (side !== "lower" && upperRank === null)) {
    // Never below n + 1, so the hint stays true even if rounding made the two searches disagree at a boundary.
    return tooFew(n, quantile, confidence, side, Math.max(minimumSampleSize(quantile, confidence, side), n + 1));
  }
  const lowerMiss = lowerRank === null ? 0 : binomialLowerTail(lowerRank - 1, n, quantile);
  const upperMiss = upperRank === null ? 0 : binomialUpperTail(upperRank, n, quantile);
  return { available: true, lowerRank, upperRank, achievedConfidence: 1 - lowerMiss - upperMiss };
}

/**
 * A confidence as a percent for messages: six significant digits, but never rounded up to 100% (a confidence
 * below 1 that would show as 100% is shown as the fraction it is).
 *
 * @example
 * confidenceWords(0.95);               // "95%"
 * confidenceWords(0.9999999999999999); // "0.9999999999999999"
 */
export function confidenceWords(x: number): string {
  const shown = Number((x * 100).toPrecision(6));
  return shown >= 100 ? String(x) : `${shown}%`;
}

/** Sizes beyond this are no sample a sheet can hold (the binomial core is exact up to here). */
const LARGEST_SAMPLE = BINOMIAL_MAX_N;

function quantileName(quantile: number): string {
  return quantile === 0.5 ? "the median" : `the ${quantile} quantile`;
}

function tooFew(n: number, quantile: number, confidence: number, side: BoundSide, minimumN: number): Unavailable {
  const what = `${confidenceWords(confidence)} ${side === "two-sided" ? "two-sided bounds" : `${side} bound`} for ${quantileName(quantile)}`;
  if (!(minimumN <= LARGEST_SAMPLE)) {
    return unavailable(
      n === 0 ? "no-data" : "too-few-values",
      `The ${quantile} quantile is too extreme for ${side === "two-sided" ? "" : "a "}${what.replace(` for ${quantileName(quantile)}`, "")} from a sample of any size a sheet can hold: more than ${LARGEST_SAMPLE.toLocaleString("en-US")} values would be needed. Choose a quantile further from 0 and 1, or a lower confidence.`,
    );
  }
  if (n === 0) return unavailable("no-data", `No numbers were given; ${what} need at least ${minimumN} values.`, minimumN);
  return unavailable(
    "too-few-values",
    `${n} value${n === 1 ? " is" : "s are"} too few for ${what}: at least ${minimumN} are needed.`,
    minimumN,
  );
}

export interface QuantileBoundsOptions {
  /** Which quantile, strictly between 0 and 1; default 0.5 (the median). */
  quantile?: number;
  /** Nominal confidence, strictly between 0 and 1; default 0.95. */
  confidence?: number;
  /** Default "two-sided". */
  side?: BoundSide;
  /** Default "exact". */
  method?: BoundMethod;
}

/**
 * Confidence bounds for a population quantile from the sample's order
 * statistics. The input is not modified (one copy is made).
 *
 * - `exact`: the bounds are sample values; `achievedConfidence` is their exact
 *   coverage (>= `confidence`) for any continuous population.
 * - `interpolated` (median only; another quantile throws RangeError, so the
 *   cell layer must offer it for the median only): the Hettmansperger–Sheather
 *   bounds (1 - λ) X(d) + λ X(d+1) and (1 - λ) X(n-d+1) + λ X(n-d), where
 *   [X(d), X(n-d+1)] is the exact interval, γ_d and γ_(d+1) the exact
 *   confidences of it and of the next interval in, I = (γ_d - γ)/(γ_d - γ_(d+1)) and
 *   λ = (n - d) I / (d + (n - 2d) I). Their coverage is not exact: it is
 *   between γ_(d+1) and γ_d for any continuous population and close to the
 *   nominal γ for symmetric ones, so `achievedConfidence` reports γ itself. A
 *   one-sided interpolated bound at confidence γ is the matching end of the
 *   two-sided interpolated interval at 2γ - 1 (the exact one-sided bound is
 *   the end of the exact two-sided interval at 2γ - 1 in the same way), so it
 *   needs γ > 1/2 (RangeError otherwise).
 *
 * Too few values (or none) give Unavailable with `minimumN`.
 *
 * @example
 * quantileBounds([7.1, 3.2, 5.5, 9.8, 4.4, 6.0, 8.3, 2.9, 5.1, 6.6]);
 * // lower 3.2 (2nd smallest), upper 8.3 (9th), achievedConfidence 0.978515625
 * quantileBounds(values, { quantile: 0.9, confidence: 0.9, side: "lower" });
 */
export function quantileBounds(values: ArrayLike<number>, options: QuantileBoundsOptions = {}): QuantileBoundsResult | Unavailable {
  const quantile = options.quantile ?? 0.5;
  const confidence = options.confidence ?? 0.95;
  const side = options.side ?? "two-sided";
  const method = options.method ?? "exact";
  checkProbability("quantile", quantile);
  checkProbability("confidence", confidence);
  checkSide(side);
  if (method !== "exact" && method !== "interpolated") throw new RangeError(`unknown method ${String(method)}`);
  if (method === "interpolated") {
    if (quantile !== 0.5) throw new RangeError("interpolated bounds are defined for the median (quantile 0.5) only");
    if (side !== "two-sided" && !(confidence > 0.5)) throw new RangeError("a one-sided interpolated bound needs confidence above 0.5");
  }
  const n = values.length;
  const base = { available: true as const, confidence, quantile, side, method, n };

  if (method === "exact") {
    const ranks = boundRanks(n, quantile, confidence, side);
    if (!ranks.available) {
      checkFinite(values); // a non-finite value is a caller's error whether or not the ranks exist
      return ranks;
    }
    const wanted = [ranks.lowerRank, ranks.upperRank].filter((r): r is number => r !== null).map((r) => r - 1);
    const picked = valuesAtRanks(values, wanted); // the values are not changed; non-finite ones throw RangeError
    return {
      ...base,
      lower: ranks.lowerRank === null ? null : picked[0],
      upper: ranks.upperRank === null ? null : picked[picked.length - 1],
      achievedConfidence: ranks.achievedConfidence,
      lowerRank: ranks.lowerRank,
      upperRank: ranks.upperRank,
      interpolation: null,
    };
  }
  return interpolatedBounds(values, confidence, side, base);
}

/** Hettmansperger–Sheather bounds for the median (the values are not changed). */
function interpolatedBounds(
  values: ArrayLike<number>,
  confidence: number,
  side: BoundSide,
  base: Pick<QuantileBoundsResult, "available" | "confidence" | "quantile" | "side" | "method" | "n">,
): QuantileBoundsResult | Unavailable {
  const n = values.length;
  const twoSidedConfidence = side === "two-sided" ? confidence : 2 * confidence - 1;
  const ranks = boundRanks(n, 0.5, twoSidedConfidence, "two-sided");
  if (!ranks.available) {
    checkFinite(values);
    // Report the size needed for the bound actually asked (the same n, stated in the caller's terms).
    return tooFew(n, 0.5, confidence, side, ranks.minimumN ?? n + 1);
  }
  const d = ranks.lowerRank as number;
  const wantLower = side !== "upper";
  const wantUpper = side !== "lower";
  const outerLow = d - 1; // zero-based X(d)
  const outerHigh = n - d; // zero-based X(n-d+1)
  const hasInner = d + 1 <= n - d;
  const wanted = [outerLow, outerHigh];
  if (hasInner) wanted.push(d, n - d - 1);
  const [lowOuter, highOuter, lowInner, highInner] = valuesAtRanks(values, wanted);

  const allowance = (1 - twoSidedConfidence) / 2;
  const outerMiss = binomialLowerTail(d - 1, n, 0.5);
  const oneOrTwo = side === "two-sided" ? 2 : 1;
  const rankFields = { lowerRank: wantLower ? d : null, upperRank: wantUpper ? n - d + 1 : null };
  if (!hasInner) {
    return {
      ...base,
      ...rankFields,
      lower: wantLower ? lowOuter : null,
      upper: wantUpper ? highOuter : null,
      achievedConfidence: 1 - oneOrTwo * outerMiss,
      interpolation: null,
    };
  }
  const innerMiss = binomialLowerTail(d, n, 0.5);
  // I = (γ_d - γ)/(γ_d - γ_(d+1)) with γ_j = 1 - 2 P(B <= j - 1), written with the tails to avoid cancellation
  // near 1; clamped because withinAllowance lets the outer miss exceed the allowance by rounding.
  const share = Math.min(1, Math.max(0, (allowance - outerMiss) / (innerMiss - outerMiss)));
  const weight = ((n - d) * share) / (d + (n - 2 * d) * share);
  const lower = (1 - weight) * lowOuter + weight * lowInner;
  const upper = (1 - weight) * highOuter + weight * highInner;
  return {
    ...base,
    ...rankFields,
    lower: wantLower ? lower : null,
    upper: wantUpper ? upper : null,
    achievedConfidence: confidence,
    interpolation: { weight, outerConfidence: 1 - oneOrTwo * outerMiss, innerConfidence: 1 - oneOrTwo * innerMiss },
  };
}
