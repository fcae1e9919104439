/**
 * A confidence sequence for the median or any quantile: bounds that hold at
 * every row count at once, so they may be watched as rows arrive. Reported as
 * the running intersection of the bounds at each row, which narrows and never
 * widens.
 *
 * Method (S. R. Howard and A. Ramdas (2022), "Sequential estimation of
 * quantiles with applications to A/B-testing and best-arm identification",
 * Bernoulli 28(3), 1704-1728): for the true q-quantile Q, the count of values
 * at or below Q among the first t behaves as a Bin(t, q) walk (exactly, for a
 * continuous distribution; with ties, the counts of values below and at or
 * below Q bracket such a walk). The evidence of a count s against q is the
 * uniform mixture of likelihood ratios
 *   M_t(s) = ∫ (θ / q)^s ((1 − θ) / (1 − q))^(t − s) dθ = 1 / ((t + 1) P(Bin(t, q) = s)),
 * a nonnegative martingale under q (H. Robbins (1970), Ann. Math. Statist.
 * 41(5)), so by Ville's inequality it reaches 1/alpha at some row with
 * probability at most alpha. log M_t is convex in s, so the counts it leaves
 * standing at row t form a range [low_t, high_t], and a value x is ruled out
 * at row t when fewer than low_t values are at or below it, or more than
 * high_t lie strictly below it. What is not ruled out at any row is the
 * interval from the running maximum of X(low_t) to the running minimum of
 * X(high_t + 1) (order statistics of the first t values). For the median this
 * is the mixture of the two-sided anytime-valid sign test (anytimeSign.ts): a
 * centre that is not itself a data value lies inside exactly when that test
 * has not rejected it at level alpha.
 *
 * The mixing choice: uniform on θ, which favours no effect size; for a quantile
 * far from 1/2 it spends most of its weight on one side of q, so that side's
 * end is slower to tighten.
 *
 * Computation: the interval at the last row, from two selections (selection.ts),
 * contains the running intersection whenever that is not empty; only the
 * values inside it are sorted. One pass in row order then moves a pointer up
 * through them for the lower end (a candidate is passed once it is ruled out)
 * and one down for the upper end, each carrying the count and M_t of its
 * candidate by one factor a row (no logarithm in the loop).
 *
 * Cost: O(n + m log m) time and O(m) extra memory over n values, m of them
 * between the last row's bounds (about 2 z sqrt(n q (1 − q) log n) for large n;
 * m = n only while an end is still unbounded); at most O(n log n).
 */
import { binomialLogPmf } from "./binomial";
import { selectManyInPlace } from "./selection";
import type { Unavailable } from "./types";
import { unavailable } from "./types";

export interface ConfidenceSequenceResult {
  readonly available: true;
  /** The running intersection's lower end; null while no row has bounded it below. */
  readonly lower: number | null;
  /** The running intersection's upper end; null while no row has bounded it above. */
  readonly upper: number | null;
  /** Values read (rows with a number). */
  readonly rows: number;
  readonly quantile: number;
  readonly confidence: number;
  /** Rows it takes before a lower end exists at this quantile and confidence. */
  readonly rowsForLower: number;
  /** Rows it takes before an upper end exists. */
  readonly rowsForUpper: number;
}

export interface ConfidenceSequenceOptions {
  /** The quantile, strictly between 0 and 1; default 0.5 (the median). */
  quantile?: number;
  /** Strictly between 0 and 1; default 0.95. */
  confidence?: number;
}

/**
 * Natural log of M_t(s) = 1 / ((t + 1) P(Bin(t, q) = s)), the evidence of s values at or below the candidate
 * among t against the quantile level q.
 *
 * @example
 * Math.exp(logQuantileEvidence(0, 3, 0.5)); // 1 / (4 · 1/8) = 2
 */
export function logQuantileEvidence(s: number, t: number, q: number): number {
  return -Math.log(t + 1) - binomialLogPmf(s, t, q);
}

/** The counts left standing at row t: M_t(s) < 1/alpha for low <= s <= high, or null when none is. */
export interface StandingCounts {
  readonly low: number;
  readonly high: number;
}

/**
 * The range of counts s in 0..t with M_t(s) below 1/alpha, by bisection on each side of the minimum of the
 * convex log M_t (at s* = ceil(t q + q − 1), where the ratio M_t(s + 1) / M_t(s) = (s + 1)(1 − q) / ((t − s) q) passes 1).
 *
 * @example
 * standingCounts(10, 0.5, 0.05); // { low: 1, high: 9 }: M_10(0) = 2^10 / 11 ≈ 93 >= 20, M_10(1) = 2^10 / 110 ≈ 9.3 < 20
 */
export function standingCounts(t: number, q: number, alpha: number): StandingCounts | null {
  const limit = Math.log(1 / alpha);
  const stands = (s: number) => logQuantileEvidence(s, t, q) < limit;
  const middle = Math.min(t, Math.max(0, Math.ceil(t * q + q - 1)));
  if (!stands(middle)) return null;
  let from = 0;
  let to = middle; // stands(to); the first standing count lies in [from, to]
  while (from < to) {
    const mid = (from + to) >>> 1;
    if (stands(mid)) to = mid;
    else from = mid + 1;
  }
  const low = to;
  from = middle;
  to = t; // stands(from); the last standing count lies in [from, to]
  while (from < to) {
    const mid = (from + to + 1) >>> 1;
    if (stands(mid)) from = mid;
    else to = mid - 1;
  }
  return { low, high: from };
}

/**
 * The first row count t >= 1 at which a count of 0 (`end` "lower": then X(1) bounds below) or of t
 * ("upper") is ruled out: -log(t + 1) - t log(r) >= log(1/alpha) with r = 1 − q or q. Where that function
 * falls it stays below 0, so the answer lies where it rises, found by doubling and bisection. Infinity when
 * no count of rows a double can hold will do.
 *
 * @example
 * rowsToBound(0.5, 0.05, "lower"); // 8: 2^8 / 9 ≈ 28 >= 20, 2^7 / 8 = 16 < 20
 */
export function rowsToBound(q: number, alpha: number, end: "lower" | "upper"): number {
  const logR = Math.log(end === "lower" ? 1 - q : q);
  const limit = Math.log(1 / alpha);
  const bounded = (t: number) => -Math.log(t + 1) - t * logR >= limit;
  if (bounded(1)) return 1;
  // A level so near 0 or 1 that log r rounds to 0 is never bounded on that side; nor beyond 2^53 rows.
  if (logR === 0) return Infinity;
  let from = Math.max(1, Math.floor(-1 / logR)); // the function rises from here on
  let to = from;
  while (!bounded(to)) {
    if (to > 2 ** 53) return Infinity;
    from = to + 1;
    to *= 2;
  }
  while (from < to) {
    const mid = Math.floor((from + to) / 2);
    if (bounded(mid)) to = mid;
    else from = mid + 1;
  }
  return to;
}

/** The first index of the sorted `d` holding a value >= x. */
function lowerIndex(d: Float64Array, x: number): number {
  let from = 0;
  let to = d.length;
  while (from < to) {
    const mid = (from + to) >>> 1;
    if (d[mid] < x) from = mid + 1;
    else to = mid;
  }
  return from;
}

/** The running values are m × RESCALE^k, k >= 0, so an extreme count cannot overflow. */
const RESCALE = 1e150;

function checkFraction(name: string, x: number): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`${name} must lie strictly between 0 and 1, got ${x}`);
}

/**
 * The confidence sequence for the `quantile` of `values` (in row order), as the running intersection after the
 * last value. No values give Unavailable ("no-data"); an intersection that has become empty (the rows cannot
 * share one fixed quantile, or a rare event: chance at most 1 − confidence) gives Unavailable ("unreachable").
 * Throws a RangeError for NaN values or options outside (0, 1).
 *
 * @example
 * const r = confidenceSequence([49, 53, 50, 52, 48, 51, 47, 54, 46, 55]);
 * // r.lower 47, r.upper 54 (rows 8 to 10 bound it; see the tests)
 */
export function confidenceSequence(values: ArrayLike<number>, options: ConfidenceSequenceOptions = {}): ConfidenceSequenceResult | Unavailable {
  const q = options.quantile ?? 0.5;
  const confidence = options.confidence ?? 0.95;
  checkFraction("quantile", q);
  checkFraction("confidence", confidence);
  const n = values.length;
  if (n === 0) return unavailable("no-data", "No values were given, so there is nothing to bound.");
  for (let i = 0; i < n; i++) if (Number.isNaN(values[i])) throw new RangeError(`confidenceSequence: value ${i} is NaN`);
  const alpha = 1 - confidence;
  const crossed = unavailable(
    "unreachable",
    `The bounds ruled out every value: the rows do not share one fixed ${q === 0.5 ? "median" : "quantile"} (did the process shift?), or a rare event happened (chance at most ${alpha.toPrecision(3)}).`,
  );
  const last = standingCounts(n, q, alpha);
  if (last === null) return crossed;

  // The last row's interval, which holds the running intersection when that is not empty.
  const copy = Float64Array.from(values);
  const ranks: number[] = [];
  if (last.low >= 1) ranks.push(last.low - 1);
  if (last.high + 1 <= n) ranks.push(last.high);
  const picked = ranks.length > 0 ? selectManyInPlace(copy, ranks) : [];
  const lo = last.low >= 1 ? picked[0] : -Infinity;
  const hi = last.high + 1 <= n ? picked[picked.length - 1] : Infinity;
  let m = 0;
  for (let i = 0; i < n; i++) if (values[i] >= lo && values[i] <= hi) copy[m++] = values[i];
  const inside = copy.subarray(0, m).sort();
  let groups = 0; // distinct values, in place
  for (let i = 0; i < m; i++) if (i === 0 || inside[i] !== inside[groups - 1]) inside[groups++] = inside[i];
  const d = inside.subarray(0, groups);
  const arrived = new Int32Array(groups);

  const limit = 1 / alpha;
  const p = q;
  const r = 1 - q;
  // Lower end: candidate d[lowAt] (lowAt = -1: just below lo), lowCount of the values so far at or below it,
  // its evidence lowM × RESCALE^lowK. Upper end: candidate d[highAt] (highAt = groups: just above hi),
  // highCount of the values so far strictly below it, its evidence highM × RESCALE^highK.
  let lowAt = -1;
  let lowCount = 0;
  let lowM = 1;
  let lowK = 0;
  let highAt = groups;
  let highCount = 0;
  let highM = 1;
  let highK = 0;
  for (let t = 0; t < n; t++) {
    const x = values[t];
    const g = x < lo ? -1 : x > hi ? groups : lowerIndex(d, x);
    if (g >= 0 && g < groups) arrived[g]++;
    // t -> t + 1: M_{t+1}(s + 1) = M_t(s) (s + 1) / ((t + 2) q); M_{t+1}(s) = M_t(s) (t + 1 − s) / ((t + 2)(1 − q)).
    if (g <= lowAt) lowM *= (lowCount++ + 1) / ((t + 2) * p);
    else lowM *= (t + 1 - lowCount) / ((t + 2) * r);
    if (g < highAt) highM *= (highCount++ + 1) / ((t + 2) * p);
    else highM *= (t + 1 - highCount) / ((t + 2) * r);
    const rows = t + 1;
    // Lower candidate ruled out: its evidence reaches 1/alpha on the falling side (too few at or below it).
    while ((lowK > 0 || lowM >= limit) && (lowCount + 1) * r < (rows - lowCount) * p) {
      if (++lowAt === groups) return crossed;
      for (let k = arrived[lowAt]; k > 0; k--) {
        lowM *= ((lowCount + 1) * r) / ((rows - lowCount) * p);
        lowCount++;
      }
      if (lowK > 0 && lowM < 1) {
        lowM *= RESCALE;
        lowK--;
      }
    }
    // Upper candidate ruled out: evidence at least 1/alpha on the rising side (too many strictly below it).
    while ((highK > 0 || highM >= limit) && highCount * r > (rows - highCount + 1) * p) {
      if (--highAt < 0) return crossed;
      for (let k = arrived[highAt]; k > 0; k--) {
        highM *= ((rows - highCount + 1) * p) / (highCount * r);
        highCount--;
      }
      if (highK > 0 && highM < 1) {
        highM *= RESCALE;
        highK--;
      }
    }
    if (lowM > RESCALE) {
      lowM /= RESCALE;
      lowK++;
    } else if (lowK > 0 && lowM < 1) {
      lowM *= RESCALE;
      lowK--;
    }
    if (highM > RESCALE) {
      highM /= RESCALE;
      highK++;
    } else if (highK > 0 && highM < 1) {
      highM *= RESCALE;
      highK--;
    }
  }
  // The last row rules out everything below lo and above hi, so the ends are at least that tight (the max and
  // min also absorb a rounding disagreement between the running factors and the log-space counts at a tie).
  const lower = lowAt >= 0 ? Math.max(lo, d[lowAt]) : lo;
  const upper = highAt < groups ? Math.min(hi, d[highAt]) : hi;
  if (lower > upper) return crossed;
  return {
    available: true,
    lower: lower === -Infinity ? null : lower,
    upper: upper === Infinity ? null : upper,
    rows: n,
    quantile: q,
    confidence,
    rowsForLower: rowsToBound(q, alpha, "lower"),
    rowsForUpper: rowsToBound(q, alpha, "upper"),
  };
}
