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
 * Computation: the interval at the last row contains the running intersection
 * whenever that is not empty. It is placed by a sorted sample, one pass that
 * collects a range around it, and selection (selection.ts) within that range;
 * only the values inside the interval are sorted. One pass in row order follows the standing
 * counts by one factor a row for each end (no logarithm in the loop), and
 * moves a pointer up through the sorted values for the lower end (a
 * candidate is passed once too few values lie at or below it) and one down
 * for the upper end.
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

function checkFraction(name: string, x: number): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`${name} must lie strictly between 0 and 1, got ${x}`);
}

/** The last row's bounds and the distinct values between them. */
interface Window {
  /** X(lowRank), or -Infinity when no lower end is asked. */
  readonly lo: number;
  /** X(highRank), or Infinity when no upper end is asked. */
  readonly hi: number;
  /** The distinct values from lo to hi, ascending. */
  readonly distinct: Float64Array;
}

/**
 * Working space of windowAround, grown (and kept) when a sample needs more: a fresh array the size of the
 * data at every recalculation costs its zeroing and a garbage collection later. Only the returned `distinct`
 * view lives on, and it is copied out before the next call can overwrite it.
 */
let SCRATCH = new Float64Array(4096);

/** Values in the sample that locates the window. */
const SAMPLE_SIZE = 2048;

/**
 * The order statistics X(lowRank) and X(highRank) (1-based; a rank of 0 or n + 1 asks for no end) and the
 * distinct values between them. A sorted sample of every k-th value gives a wider range expected to hold
 * both (four standard deviations of a sample position on each side); one pass collects the values in that
 * range and counts those outside it, which checks the guess (when it fails, rare, the range is everything);
 * selection (selection.ts) then places the two ranks among the collected values, and only the values
 * between them are sorted. Throws a RangeError for NaN.
 */
function windowAround(values: ArrayLike<number>, lowRank: number, highRank: number): Window {
  const n = values.length;
  if (SCRATCH.length < n) SCRATCH = new Float64Array(Math.max(n, 2 * SCRATCH.length));
  const scratch = SCRATCH;
  const step = Math.max(1, Math.floor(n / SAMPLE_SIZE));
  let size = 0;
  for (let i = 0; i < n; i += step) scratch[size++] = values[i];
  const sample = scratch.subarray(0, size).sort(); // a NaN sorts last, and the pass below refuses it
  const spread = (rank: number) => 4 * Math.sqrt(size * (rank / n) * (1 - rank / n)) + 1;
  const lowGuess = Math.floor((lowRank / n) * size - spread(lowRank));
  const highGuess = Math.ceil((highRank / n) * size + spread(highRank));
  let wideLo = lowRank < 1 || lowGuess < 0 ? -Infinity : sample[lowGuess];
  let wideHi = highRank > n || highGuess >= size ? Infinity : sample[highGuess];
  let collected = collect(values, wideLo, wideHi, scratch);
  if ((lowRank >= 1 && collected.below > lowRank - 1) || (highRank <= n && collected.above > n - highRank)) {
    wideLo = -Infinity;
    wideHi = Infinity;
    collected = collect(values, wideLo, wideHi, scratch);
  }
  const inside = scratch.subarray(0, collected.count);
  const ranks: number[] = [];
  if (lowRank >= 1) ranks.push(lowRank - 1 - collected.below);
  if (highRank <= n) ranks.push(highRank - 1 - collected.below);
  const placed = selectManyInPlace(inside, ranks);
  const lo = lowRank >= 1 ? placed[0] : -Infinity;
  const hi = highRank <= n ? placed[placed.length - 1] : Infinity;
  let m = 0;
  for (let i = 0; i < inside.length; i++) if (inside[i] >= lo && inside[i] <= hi) inside[m++] = inside[i];
  const between = inside.subarray(0, m).sort();
  let groups = 0;
  for (let i = 0; i < m; i++) if (i === 0 || between[i] !== between[groups - 1]) between[groups++] = between[i];
  return { lo, hi, distinct: between.slice(0, groups) };
}

/** Copies the values from lo to hi to the front of `into`, counting those below and above; throws on NaN. */
function collect(values: ArrayLike<number>, lo: number, hi: number, into: Float64Array): { count: number; below: number; above: number } {
  let count = 0;
  let below = 0;
  let above = 0;
  const n = values.length;
  // Branch-free: whether a value falls inside is unpredictable, so every value is written and the count
  // advances only for those inside (`into` has room for all of them).
  for (let i = 0; i < n; i++) {
    const x = values[i];
    const isBelow = +(x < lo);
    const isAbove = +(x > hi);
    below += isBelow;
    above += isAbove;
    into[count] = x;
    count += +(x === x) & (1 - isBelow) & (1 - isAbove);
  }
  if (count + below + above < n) {
    for (let i = 0; i < n; i++) if (values[i] !== values[i]) throw new RangeError(`confidenceSequence: value ${i} is NaN`);
  }
  return { count, below, above };
}

/** Where the two pointers of the pass stopped: the running ends as indices into the distinct values. */
interface RunningEnds {
  /** -1: nothing ruled out at or above lo. */
  readonly lowAt: number;
  /** d.length: nothing ruled out at or below hi. */
  readonly highAt: number;
}

/** Rows between re-anchorings of the followed evidence in log space, so rounding cannot build up (a power of 2: tested with a mask, not a division). */
const ANCHOR_EVERY = 4096;

/**
 * The pass in row order. The counts left standing, [low, high], are followed row by row: neither end ever
 * moves down (M_t(s) for s below t q grows with t, and for s above it shrinks), so each row takes one factor
 * for M_t(low) and one for M_t(high + 1), M_{t+1}(s) = M_t(s) (t + 1 − s) / ((t + 2)(1 − q)), and a step
 * M_t(s + 1) = M_t(s) (s + 1)(1 − q) / ((t − s) q) whenever an end moves. Lower end: candidate d[lowAt]
 * (lowAt = -1: just below lo) with lowCount values so far at or below it, passed while lowCount < low.
 * Upper end: candidate d[highAt] (highAt = d.length: just above hi) with highCount values so far strictly
 * below it, passed while highCount > high. Null when every count is ruled out or a pointer runs off the
 * interval: the intersection is empty. At the last row the counts are `last`, computed in log space, which
 * placed the window, so a rounding difference in the followed factors cannot leave a pointer outside it.
 */
function runningEnds(
  values: ArrayLike<number>,
  lo: number,
  hi: number,
  d: Float64Array,
  q: number,
  alpha: number,
  last: StandingCounts,
): RunningEnds | null {
  const groups = d.length;
  const arrived = new Int32Array(groups);
  const limit = 1 / alpha;
  const p = q;
  const r = 1 - q;
  let low = 0;
  let lowM = 1; // M_t(low)
  let high = 0; // high === t: every count stands, and highM is not followed
  let highM = 0; // M_t(high + 1) while high < t
  let lowAt = -1;
  let lowCount = 0;
  let highAt = groups;
  let highCount = 0;
  const n = values.length;
  for (let t = 0; t < n; t++) {
    const rows = t + 1;
    // The standing counts from row t to row t + 1 (the same for every data set of this length: no data here).
    const step = 1 / ((t + 2) * r); // one division a row, shared by both ends
    lowM *= (t + 1 - low) * step;
    while (lowM >= limit) {
      if (low === rows) return null;
      lowM *= ((low + 1) * r) / ((rows - low) * p);
      low++;
    }
    if (high === t) {
      highM = Math.exp(logQuantileEvidence(rows, rows, q));
      if (highM < limit) high = rows;
    } else {
      highM *= (t - high) * step;
      while (highM < limit) {
        high++;
        if (high === rows) break;
        highM *= ((high + 1) * r) / ((rows - high) * p);
      }
    }
    if ((rows & (ANCHOR_EVERY - 1)) === 0) {
      lowM = Math.exp(logQuantileEvidence(low, rows, q));
      if (high < rows) highM = Math.exp(logQuantileEvidence(high + 1, rows, q));
    }
    if (rows === n) {
      // The last row's counts as computed in log space, which placed the window.
      low = last.low;
      high = last.high;
    }
    // The data. Branch-free for the values outside the last row's interval (nearly all): which side a value
    // lies on is unpredictable, and a mispredicted branch costs more than the arithmetic. Below lo a value is
    // at or below both candidates; above hi, at or below neither.
    const x = values[t];
    const isBelow = +(x < lo);
    const isAbove = +(x > hi);
    let toLow = isBelow;
    let toHigh = 1 - isAbove;
    if ((isBelow | isAbove) === 0) {
      const g = lowerIndex(d, x);
      arrived[g]++;
      toLow = +(g <= lowAt);
      toHigh = +(g < highAt);
    }
    lowCount += toLow;
    highCount += toHigh;
    while (lowCount < low) {
      if (++lowAt === groups) return null;
      lowCount += arrived[lowAt];
    }
    while (highCount > high) {
      if (--highAt < 0) return null;
      highCount -= arrived[highAt];
    }
  }
  return { lowAt, highAt };
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
export function confidenceSequence(
  values: ArrayLike<number>,
  options: ConfidenceSequenceOptions = {},
): ConfidenceSequenceResult | Unavailable {
  const q = options.quantile ?? 0.5;
  const confidence = options.confidence ?? 0.95;
  checkFraction("quantile", q);
  checkFraction("confidence", confidence);
  const n = values.length;
  if (n === 0) return unavailable("no-data", "No values were given, so there is nothing to bound.");
  const alpha = 1 - confidence;
  const crossed = unavailable(
    "unreachable",
    `The bounds ruled out every value: the rows do not share one fixed ${q === 0.5 ? "median" : "quantile"} (did the process shift?), or a rare event happened (chance at most ${alpha.toPrecision(3)}).`,
  );
  const last = standingCounts(n, q, alpha);
  if (last === null) {
    collect(values, -Infinity, Infinity, new Float64Array(n)); // refuses NaN here too
    return crossed;
  }
  // A window holding the last row's bounds X(low) and X(high + 1), and so the running intersection when that
  // is not empty.
  const { lo, hi, distinct: d } = windowAround(values, last.low, last.high + 1);
  const ends = runningEnds(values, lo, hi, d, q, alpha, last);
  if (ends === null) return crossed;
  const { lowAt, highAt } = ends;
  const lower = lowAt >= 0 ? d[lowAt] : -Infinity;
  const upper = highAt < d.length ? d[highAt] : Infinity;
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
