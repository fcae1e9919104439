/**
 * Wald's sequential probability ratio test for the sign test: after each row,
 * continue, accept H0 (P(above) = 1/2: the median is the hypothesised one) or
 * reject it for the stated alternative P(above) = p_above, with error rates
 * alpha and beta chosen in advance.
 *
 * Method (A. Wald (1945), "Sequential tests of statistical hypotheses", Ann.
 * Math. Statist. 16(2), 117-186): a counted value adds log(2 p_above) to the log
 * likelihood ratio when above the hypothesised median and log(2 (1 − p_above))
 * when below; values equal to it (as the sheet shows them, the shared tie rule)
 * are left out, as by the sign test's default "drop". The test rejects H0 the
 * first time the ratio reaches log((1 − beta) / alpha) and accepts it the
 * first time it falls to log(beta / (1 − alpha)). Wald's inequalities bound the
 * achieved error rates by alpha / (1 − beta) and beta / (1 − alpha), and their
 * sum by alpha + beta.
 *
 * Operating characteristic (the chance of accepting H0 when P(above) = p) and
 * average sample number: exact by dynamic programming over the count above
 * while the test continues (the continuing counts at each row form a range of
 * fixed width (A − B) / |log(p_above / (1 − p_above))| + 1), summed until the
 * undecided chance is below 1e-15; where that would take more than 5e7 steps
 * (judged from Wald's average sample number, the chance falling by about e
 * every such stretch), Wald's approximations (the same paper: L(p) = (e^{hA} − 1) / (e^{hA} − e^{hB})
 * with h ≠ 0 solving p e^{hu} + (1 − p) e^{hv} = 1, and E N = (L B + (1 − L) A) / E z).
 * The result says which was used.
 *
 * Cost: the test O(n) over n values; the exact characteristic O(width × rows
 * until decided), at most 5e7 steps; Wald's approximation O(1) (a bisection for h).
 */
import { compareAsShown, tieWindow } from "./differences";

export type SprtDecision = "continue" | "accept" | "reject";

/** The two limits of the log likelihood ratio and its step for a value above and below. */
export interface SprtLimits {
  /** log(beta / (1 − alpha)): at or below it, accept H0. */
  readonly acceptAt: number;
  /** log((1 − beta) / alpha): at or above it, reject H0. */
  readonly rejectAt: number;
  /** log(2 p_above). */
  readonly stepAbove: number;
  /** log(2 (1 − p_above)). */
  readonly stepBelow: number;
}

export interface SprtResult {
  readonly decision: SprtDecision;
  /** Numbers read up to and including the deciding one (ties included), or all of them while the test continues. */
  readonly rowsUsed: number;
  readonly above: number;
  readonly below: number;
  /** The log likelihood ratio after the last row used. */
  readonly logLikelihoodRatio: number;
  readonly limits: SprtLimits;
}

export interface SprtOptions {
  /** P(above) under the alternative, in (0, 1) and not 1/2. */
  pAbove: number;
  /** Chance of rejecting a true H0; default 0.05. */
  alpha?: number;
  /** Chance of accepting H0 when P(above) = p_above; default 0.2. */
  beta?: number;
}

function checkFraction(name: string, x: number): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`${name} must lie strictly between 0 and 1, got ${x}`);
}

/**
 * Wald's limits for the sign test.
 *
 * @example
 * sprtLimits(0.75, 0.05, 0.2); // { acceptAt: log(0.2/0.95) ≈ −1.558, rejectAt: log(16) ≈ 2.773, stepAbove: log 1.5, stepBelow: log 0.5 }
 */
export function sprtLimits(pAbove: number, alpha = 0.05, beta = 0.2): SprtLimits {
  checkFraction("p_above", pAbove);
  checkFraction("alpha", alpha);
  checkFraction("beta", beta);
  if (pAbove === 0.5) throw new RangeError("p_above must differ from 1/2, the value under H0");
  if (alpha + beta >= 1) throw new RangeError(`alpha + beta must be below 1, got ${alpha + beta}`);
  return {
    acceptAt: Math.log(beta / (1 - alpha)),
    rejectAt: Math.log((1 - beta) / alpha),
    stepAbove: Math.log(2 * pAbove),
    stepBelow: Math.log(2 * (1 - pAbove)),
  };
}

/**
 * Runs the test over `values` in row order against `center`; it stops at the first decision.
 * Throws a RangeError for NaN, options outside (0, 1), p_above = 1/2, or alpha + beta >= 1.
 *
 * @example
 * sprt([51, 52, 53, 49, 54, 55, 56], 50, { pAbove: 0.75 });
 * // above 6, below 1 after 7 rows: 6 log 1.5 + log 0.5 ≈ 1.74 < 2.77: { decision: "continue", rowsUsed: 7, ... }
 */
export function sprt(values: ArrayLike<number>, center: number, options: SprtOptions): SprtResult {
  const limits = sprtLimits(options.pAbove, options.alpha ?? 0.05, options.beta ?? 0.2);
  if (Number.isNaN(center)) throw new RangeError("sprt: the centre is NaN");
  const { low, high } = tieWindow(center);
  let above = 0;
  let below = 0;
  let llr = 0;
  const n = values.length;
  for (let i = 0; i < n; i++) {
    const x = values[i];
    const sign = x < low ? -1 : x > high ? 1 : compareAsShown(x, center);
    if (sign !== sign) throw new RangeError(`sprt: value ${i} is NaN`);
    if (sign === 0) continue;
    if (sign > 0) above++;
    else below++;
    // From the counts, not a running sum, so no rounding accumulates over many rows.
    llr = above * limits.stepAbove + below * limits.stepBelow;
    if (llr >= limits.rejectAt) return { decision: "reject", rowsUsed: i + 1, above, below, logLikelihoodRatio: llr, limits };
    if (llr <= limits.acceptAt) return { decision: "accept", rowsUsed: i + 1, above, below, logLikelihoodRatio: llr, limits };
  }
  return { decision: "continue", rowsUsed: n, above, below, logLikelihoodRatio: llr, limits };
}

export interface SprtCharacteristic {
  /** P(the test accepts H0) when each counted value lies above with probability p. */
  readonly accept: number;
  /** P(the test rejects H0). */
  readonly reject: number;
  /** P(still undecided after maxRows): 0 for Wald's approximation, below 1e-15 unless maxRows stopped the sum. */
  readonly undecided: number;
  /** The average number of counted values, E min(N, maxRows). */
  readonly averageRows: number;
  readonly method: "exact" | "wald";
}

/** Steps of the exact sum beyond which Wald's approximation is used instead. */
const EXACT_WORK_LIMIT = 5e7;
const NEGLIGIBLE = 1e-15;

/**
 * The operating characteristic and average sample number at P(above) = p.
 * `maxRows` stops the exact sum after that many counted values (for checks by enumeration); without it the sum
 * runs until the undecided chance is negligible, or Wald's approximation is used where that is too long.
 *
 * @example
 * const l = sprtLimits(0.75, 0.05, 0.2);
 * sprtCharacteristic(0.5, l).reject;  // the achieved alpha, at most 0.05 / 0.8
 * sprtCharacteristic(0.75, l).accept; // the achieved beta, at most 0.2 / 0.95
 */
export function sprtCharacteristic(p: number, limits: SprtLimits, maxRows = Infinity): SprtCharacteristic {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`p must lie between 0 and 1, got ${p}`);
  const { acceptAt, rejectAt, stepAbove: u, stepBelow: v } = limits;
  const width = Math.ceil((rejectAt - acceptAt) / Math.abs(u - v)) + 1;
  const wald = sprtWaldApproximation(p, limits);
  // The undecided chance falls geometrically, by e about every average sample number: some 40 of those
  // leave less than 1e-15. Where that is out of reach, Wald's approximation is answered at once.
  const rowsNeeded = Math.min(maxRows, 40 * wald.averageRows + width);
  if (width * rowsNeeded > EXACT_WORK_LIMIT) return wald;
  return exactCharacteristic(p, limits, maxRows, Math.max(1, Math.floor(EXACT_WORK_LIMIT / width))) ?? wald;
}

/** The dynamic programme over the count above, or null when it would need more than `maxSteps` rows. */
function exactCharacteristic(p: number, limits: SprtLimits, maxRows: number, maxSteps: number): SprtCharacteristic | null {
  const { acceptAt, rejectAt, stepAbove: u, stepBelow: v } = limits;
  // probs[j] = P(continuing after k counted values with start + j of them above).
  let probs = new Float64Array([1]);
  let start = 0;
  let accept = 0;
  let reject = 0;
  let averageRows = 0;
  let alive = 1;
  for (let k = 0; k < maxRows && alive > NEGLIGIBLE; k++) {
    if (k >= maxSteps) return null;
    averageRows += alive; // P(N > k)
    const next = new Float64Array(probs.length + 1);
    for (let j = 0; j < probs.length; j++) {
      next[j] += probs[j] * (1 - p);
      next[j + 1] += probs[j] * p;
    }
    // Sort the new states (k + 1 counted, start + j above) into decided and continuing; the continuing ones are
    // an unbroken range of j, since the ratio is monotone in the count above.
    let first = -1;
    let last = -2;
    alive = 0;
    for (let j = 0; j < next.length; j++) {
      const above = start + j;
      const llr = above * u + (k + 1 - above) * v;
      if (llr >= rejectAt) reject += next[j];
      else if (llr <= acceptAt) accept += next[j];
      else {
        if (first < 0) first = j;
        last = j;
        alive += next[j];
      }
    }
    probs = first < 0 ? new Float64Array(0) : next.slice(first, last + 1);
    start += Math.max(first, 0);
  }
  return { accept, reject, undecided: alive, averageRows, method: "exact" };
}

/**
 * Wald's approximations to the operating characteristic and the average sample number, which ignore the
 * overshoot of the limits (so the achieved error rates are usually a little below them).
 *
 * @example
 * sprtWaldApproximation(0.5, sprtLimits(0.75, 0.05, 0.2)).accept; // (16 − 1) / (16 − 0.2/0.95) ≈ 0.9500 (h = 1)
 */
export function sprtWaldApproximation(p: number, limits: SprtLimits): SprtCharacteristic {
  const { acceptAt: b, rejectAt: a, stepAbove: u, stepBelow: v } = limits;
  const drift = p * u + (1 - p) * v;
  const spread = p * u * u + (1 - p) * v * v;
  // Near zero drift h -> 0 and the formulas take their limits: L = a / (a − b), E N = −a b / E z².
  if (Math.abs(drift) < 1e-12 * spread) {
    const accept = a / (a - b);
    return { accept, reject: 1 - accept, undecided: 0, averageRows: (-a * b) / spread, method: "wald" };
  }
  const h = waldExponent(p, u, v, drift);
  // L(p) = (e^{ha} − 1) / (e^{ha} − e^{hb}), written to stay finite for large |h|.
  const accept = h > 0 ? -Math.expm1(-h * a) / (1 - Math.exp(h * (b - a))) : Math.expm1(h * a) / (Math.exp(h * a) - Math.exp(h * b));
  return { accept, reject: 1 - accept, undecided: 0, averageRows: (accept * b + (1 - accept) * a) / drift, method: "wald" };
}

/** The root h ≠ 0 of p e^{hu} + (1 − p) e^{hv} = 1; its sign is opposite to the drift p u + (1 − p) v. */
function waldExponent(p: number, u: number, v: number, drift: number): number {
  const f = (h: number) => p * Math.exp(h * u) + (1 - p) * Math.exp(h * v) - 1;
  const direction = drift < 0 ? 1 : -1;
  let near = 0;
  let far = direction * 1e-3;
  // A root exists unless p is 0 or 1 (then f stays below 0 on this side): the doubling stops at |h| = 2^40 / 1000.
  while (f(far) < 0 && Math.abs(far) < 1e9) {
    near = far;
    far *= 2;
  }
  for (let i = 0; i < 200; i++) {
    const mid = (near + far) / 2;
    if (mid === near || mid === far) break;
    if (f(mid) < 0) near = mid;
    else far = mid;
  }
  return (near + far) / 2;
}
