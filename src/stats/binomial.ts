/**
 * Binomial distribution X ~ Bin(n, p): point probability, both tails (also as
 * logarithms, which stay exact where the probability underflows) and the
 * quantile, for any integer n up to 1e9.
 *
 * Method
 * - Point probability: the saddle-point form of C. Loader (2000), "Fast and
 *   accurate computation of binomial probabilities" (technical note):
 *   log pmf = stirlerr(n) - stirlerr(k) - stirlerr(n-k) - bd0(k, np)
 *   - bd0(n-k, nq) - log(2 pi k (n-k) / n) / 2, where stirlerr is the error of
 *   Stirling's formula (a table below 16, the asymptotic series above) and
 *   bd0(x, M) = x log(x/M) + M - x is the deviance, summed as a series near
 *   x = M. Unlike the usual implementation, np is carried as an exact
 *   two-part product (T. J. Dekker 1971, "A floating-point technique for
 *   extending the available precision"), so k - np is exact and the rounded
 *   q = 1 - p never enters a difference: the result depends only on the
 *   double p given. (R 4.2 rounds n*p; in deep tails at n >= 1e7 its
 *   dbinom/pbinom then differ from exact arithmetic by up to ~1e-10, see the
 *   tests.)
 * - Tails: the side beyond the centre (n+1) p is the regularised incomplete
 *   beta function, P(X >= k+1) = I_p(k+1, n-k) and P(X <= k) = I_q(n-k, k+1),
 *   computed directly; the other side is 1 minus it, and that complement is
 *   only taken of values below about 0.64, so no small tail comes from
 *   cancellation. I_x(a, b) is pmf x (p or q) x a continued fraction written
 *   in lambda = (k+1) - (n+1) p (exact, again by the two-part product), as in
 *   A. R. Didonato & A. H. Morris (1992), "Algorithm 708: Significant digit
 *   computation of the incomplete beta function ratios", ACM TOMS 18,
 *   360-373 (BFRAC); the classical form used by most libraries cancels to
 *   lambda near the centre and loses about log10(sqrt(n x / (1-x))) digits.
 *   Within 5 standard deviations of the centre with min(a, b) >= 1000, where
 *   the fraction needs O(n^(1/3)) steps, Temme's uniform asymptotic expansion
 *   (N. M. Temme 1987, SIAM J. Math. Anal. 18, 1638-1663; BASYM in the same
 *   algorithm) takes over, at about 4 to 16 terms.
 * - Fair coin, n <= 53: p = 1/2 probabilities are sums of binomial
 *   coefficients over 2^n, held exactly in doubles (Pascal's triangle), so
 *   the sign test's small-sample p-values are exact to the last bit.
 * - Quantile: a Cornish-Fisher start, then doubling steps and bisection on the
 *   lower tail.
 *
 * Cost: the pmf is O(1). A tail is O(1): at most about 100 fraction steps or
 * 20 series terms. The quantile takes O(log n) tail evaluations.
 *
 * p = 0 and p = 1 are accepted as the degenerate point masses at 0 and at n.
 * Programmer errors throw RangeError: n not an integer in 0..1e9, k not an
 * integer, p outside [0, 1], prob outside [0, 1].
 */
import { normalQuantile, scaledErfc } from "./normal";

/** Largest number of trials accepted: the range over which the tails are tested (to 1e9 against R and exact arithmetic). */
export const BINOMIAL_MAX_N = 1e9;

// eslint-disable-next-line no-loss-of-precision -- log(2 pi) to 20 digits; the literal rounds to the nearest double.
const LN_2PI = 1.8378770664093454836;

/** stirlerr(m) = log(m!) - log(sqrt(2 pi m) (m/e)^m) for m = 0..15, computed from the definition with 40-digit arithmetic (mpmath). */
/* eslint-disable no-loss-of-precision -- the table keeps its 20 computed digits; each literal rounds to the nearest double. */
const STIRLING_TABLE = [
  0, 0.08106146679532725822, 0.041340695955409294094, 0.027677925684998339149, 0.020790672103765093112, 0.016644691189821192163,
  0.013876128823070747999, 0.011896709945891770095, 0.010411265261972096497, 0.0092554621827127329177, 0.0083305634333628712565,
  0.007573675487951840795, 0.0069428401072095298657, 0.0064089941880042070684, 0.0059513701127588477356, 0.005554733551962801371,
];
/* eslint-enable no-loss-of-precision */

// Asymptotic series stirlerr(m) ~ sum B_2j / (2j (2j-1) m^(2j-1)).
const S0 = 1 / 12;
const S1 = 1 / 360;
const S2 = 1 / 1260;
const S3 = 1 / 1680;
const S4 = 1 / 1188;
const S5 = 691 / 360360;
const S6 = 1 / 156;

/** Error of Stirling's approximation to log(m!) for an integer m >= 0; the first omitted series term is below 3e-17. */
function stirlingError(m: number): number {
  if (m <= 15) return STIRLING_TABLE[m];
  const r = 1 / (m * m);
  if (m > 500) return (S0 - S1 * r) / m;
  if (m > 80) return (S0 - (S1 - S2 * r) * r) / m;
  if (m > 35) return (S0 - (S1 - (S2 - S3 * r) * r) * r) / m;
  return (S0 - (S1 - (S2 - (S3 - (S4 - (S5 - S6 * r) * r) * r) * r) * r) * r) / m;
}

/** Veltkamp's splitting constant 2^27 + 1. */
const SPLITTER = 134217729;

/** The rounding error of hi = a * b, so that a * b = hi + result exactly (Dekker's two-product). */
function productError(a: number, b: number, hi: number): number {
  const ca = SPLITTER * a;
  const aHigh = ca - (ca - a);
  const aLow = a - aHigh;
  const cb = SPLITTER * b;
  const bHigh = cb - (cb - b);
  const bLow = b - bHigh;
  return aHigh * bHigh - hi + aHigh * bLow + aLow * bHigh + aLow * bLow;
}

/**
 * |x - M| / (x + M) below which bd0 is summed as a series. Loader uses 0.1;
 * the series has no cancellation to speak of for any |v| < 1, while the closed
 * form loses up to a digit between 0.1 and 0.5, so the series is kept up to
 * 0.5 (at most ~27 terms).
 */
const SERIES_LIMIT = 0.5;

/**
 * Deviance term bd0(x, M) = x log(x/M) + M - x >= 0, given d = x - M exactly.
 * Near x = M both terms are large and nearly cancel, so Loader's series
 * d v + 2x sum_{j>=1} v^(2j+1)/(2j+1) with v = d/(x+M) is summed instead.
 */
function deviance(x: number, mean: number, d: number): number {
  if (Math.abs(d) < SERIES_LIMIT * (x + mean)) {
    let v = d / (x + mean);
    let sum = d * v;
    let term = 2 * x * v;
    v *= v;
    for (let j = 3; ; j += 2) {
      term *= v;
      const next = sum + term / j;
      if (next === sum) return next;
      sum = next;
    }
  }
  const ratio = x / mean;
  // A mean below ~1e-300 (p near the smallest doubles) would overflow the ratio.
  const logRatio = Number.isFinite(ratio) ? Math.log(ratio) : Math.log(x) - Math.log(mean);
  return x * logRatio - d;
}

/** log P(X = k) for 0 <= k <= n, n >= 1, 0 < p < 1. */
function logPmfInRange(k: number, n: number, p: number): number {
  if (k === 0) return n * Math.log1p(-p);
  if (k === n) return n * Math.log(p);
  const np = n * p;
  const npError = productError(n, p, np);
  const d = k - np - npError; // k - n p, exact where it matters (k near np)
  const nq = n - np - npError;
  const stirling = stirlingError(n) - stirlingError(k) - stirlingError(n - k);
  const devianceSum = deviance(k, np, d) + deviance(n - k, nq, -d);
  const logScale = LN_2PI + Math.log(k) + Math.log1p(-k / n);
  return stirling - devianceSum - 0.5 * logScale;
}

/**
 * Continued fraction r with I_x(a, b) = x^a y^b / B(a, b) * r, y = 1 - x, for
 * x below the mean a/(a+b) of Beta(a, b), in the form of Didonato & Morris
 * (1992), "Algorithm 708: Significant digit computation of the incomplete
 * beta function ratios", ACM TOMS 18, 360-373 (their BFRAC). It is written in
 * lambda = a - (a+b) x >= 0, supplied exactly by the caller. Near the centre
 * the odd partial terms of the classical fraction approach -1, so every
 * 1 + term cancels down to about lambda / a and about log10(sqrt(n x / y))
 * digits are lost; here lambda enters directly, all terms before step b are
 * positive, and the fraction terminates by itself at step b.
 */
function betaFraction(a: number, b: number, x: number, y: number, lambda: number): number {
  const c = 1 + lambda;
  const c0 = b / a;
  const inverseA = 1 / a;
  const c1 = 1 + inverseA;
  const yPlus1 = y + 1;
  let previousNumerator = 0;
  let previousDenominator = 1;
  let numerator = 1;
  let denominator = c / c1;
  let ratio = c1 / c;
  let pk = 1;
  let inverseS = 1 / (a + 1); // 1 / (a + 2 step - 1)
  for (let step = 1; ; step++) {
    const t = step * inverseA;
    const w = step * (b - step) * x;
    const inverseNextS = 1 / (a + 2 * step + 1);
    const e = a * inverseS;
    const alpha = pk * (pk + c0) * e * e * (w * x);
    // (t + 1) / (c1 + 2t) = (a + step) / (a + 2 step + 1)
    const beta = step + w * inverseS + (a + step) * inverseNextS * (c + step * yPlus1);
    pk = t + 1;
    inverseS = inverseNextS;
    const nextNumerator = alpha * previousNumerator + beta * numerator;
    // Rescaling by the new denominator each step keeps the recurrences from overflowing or underflowing.
    const scale = 1 / (alpha * previousDenominator + beta * denominator);
    const previousRatio = ratio;
    ratio = nextNumerator * scale;
    if (Math.abs(ratio - previousRatio) <= Number.EPSILON * ratio) return ratio;
    previousNumerator = numerator * scale;
    previousDenominator = denominator * scale;
    numerator = ratio;
    denominator = 1;
  }
}

const TWO_OVER_SQRT_PI = 1.1283791670955126;
const LN_TWO_OVER_SQRT_PI = 0.12078223763524522;
const TWO_TO_MINUS_THREE_HALVES = 0.3535533905932738;
/** Terms of the asymptotic series (an even number). */
const ASYMPTOTIC_TERMS = 20;
// Scratch coefficient arrays of the series, reused by every call (each call overwrites what it reads).
const SERIES_A = new Float64Array(ASYMPTOTIC_TERMS + 1);
const SERIES_B = new Float64Array(ASYMPTOTIC_TERMS + 1);
const SERIES_C = new Float64Array(ASYMPTOTIC_TERMS + 1);
const SERIES_D = new Float64Array(ASYMPTOTIC_TERMS + 1);

/**
 * log I_x(a, b) for large a and b near the centre, where the fraction needs
 * O((ab/(a+b))^(1/3)) steps: N. M. Temme's uniform asymptotic expansion
 * (Temme 1987, "Incomplete Laplace integrals: uniform asymptotic expansion
 * with application to the incomplete beta function", SIAM J. Math. Anal. 18,
 * 1638-1663) in the form of Didonato & Morris (1992), BASYM. lambda = a -
 * (a+b) x >= 0 as for betaFraction; the exponent is our deviance, so it keeps
 * the exactness of lambda.
 */
function betaAsymptoticLog(a: number, b: number, lambda: number): number {
  const exponent = deviance(a, a - lambda, lambda) + deviance(b, b + lambda, -lambda);
  const z0 = Math.sqrt(exponent);
  const z2 = exponent + exponent;
  const small = Math.min(a, b);
  const h = small / Math.max(a, b);
  const r0 = 1 / (h + 1);
  const r1 = (b - a) / Math.max(a, b);
  const w0 = 1 / Math.sqrt(small * (h + 1));
  const a0 = SERIES_A;
  const b0 = SERIES_B;
  const c = SERIES_C;
  const d = SERIES_D;
  a0[0] = (2 / 3) * r1;
  c[0] = -0.5 * a0[0];
  d[0] = -c[0];
  let j0 = (0.5 / TWO_OVER_SQRT_PI) * scaledErfc(z0);
  let j1 = TWO_TO_MINUS_THREE_HALVES;
  let sum = j0 + d[0] * w0 * j1;
  let s = 1;
  const h2 = h * h;
  let hn = 1;
  let w = w0;
  let zPrevious = (0.5 * z0) / TWO_TO_MINUS_THREE_HALVES;
  let zCurrent = z2;
  for (let n = 2; n <= ASYMPTOTIC_TERMS; n += 2) {
    hn *= h2;
    a0[n - 1] = (2 * r0 * (h * hn + 1)) / (n + 2);
    s += hn;
    a0[n] = (2 * r1 * s) / (n + 3);
    for (let i = n; i <= n + 1; i++) {
      const r = -0.5 * (i + 1);
      b0[0] = r * a0[0];
      for (let m = 2; m <= i; m++) {
        let bsum = 0;
        for (let j = 1; j <= m - 1; j++) bsum += (j * r - (m - j)) * a0[j - 1] * b0[m - j - 1];
        b0[m - 1] = r * a0[m - 1] + bsum / m;
      }
      c[i - 1] = b0[i - 1] / (i + 1);
      let dsum = 0;
      for (let j = 1; j <= i - 1; j++) dsum += d[i - j - 1] * c[j - 1];
      d[i - 1] = -(dsum + c[i - 1]);
    }
    j0 = TWO_TO_MINUS_THREE_HALVES * zPrevious + (n - 1) * j0;
    j1 = TWO_TO_MINUS_THREE_HALVES * zCurrent + n * j1;
    zPrevious *= z2;
    zCurrent *= z2;
    w *= w0;
    const t0 = d[n - 1] * w * j0;
    w *= w0;
    const t1 = d[n] * w * j1;
    sum += t0 + t1;
    if (Math.abs(t0) + Math.abs(t1) <= Number.EPSILON * sum) break;
  }
  const correction = stirlingError(a) + stirlingError(b) - stirlingError(a + b);
  return LN_TWO_OVER_SQRT_PI - exponent - correction + Math.log(sum);
}

/** log(1 - e^x) for x <= 0, accurate at both ends (Maechler 2012, "Accurately computing log(1 - exp(-|a|))"). */
function logOneMinusExp(x: number): number {
  return x > -Math.LN2 ? Math.log(-Math.expm1(x)) : Math.log1p(-Math.exp(x));
}

/**
 * Where Bin(n, p) is cut between k and k + 1 (0 <= k < n, 0 < p < 1): the log
 * of the side computed directly, and which side that is. The other side is
 * 1 minus it, and the direct side is never more than about 0.64.
 */
interface Cut {
  logDirect: number;
  directIsUpper: boolean;
}

/**
 * Smallest min(a, b) for the asymptotic expansion. Below it the fraction needs
 * at most ~80 steps near the centre, about what the expansion costs; above
 * it the fraction's O((ab/(a+b))^(1/3)) steps (2000 at n = 1e8) dominate.
 */
const ASYMPTOTIC_MIN = 1000;

/** Whether I_x(a, b) is taken from the asymptotic expansion: both large, and x within 5 sd of the centre (lambda^2 <= 25 ab/(a+b)). */
function nearCentre(a: number, b: number, lambda: number): boolean {
  return Math.min(a, b) >= ASYMPTOTIC_MIN && lambda * lambda <= (25 * a * b) / (a + b);
}

function cutAt(k: number, n: number, p: number): Cut {
  const q = 1 - p; // rounded when p < 1/2, but only ever used as a factor, never in a difference
  // lambda = (k+1) - (n+1) p, exact to rounding: (n+1) p is carried as a two-part product.
  const mean = (n + 1) * p;
  const lambda = k + 1 - mean - productError(n + 1, p, mean);
  if (lambda >= 0) {
    // k + 1 at or above (n+1) p: P(X >= k+1) = I_p(k+1, n-k) = (k+1) pmf(k+1) q r.
    if (nearCentre(k + 1, n - k, lambda)) return { logDirect: betaAsymptoticLog(k + 1, n - k, lambda), directIsUpper: true };
    const fraction = betaFraction(k + 1, n - k, p, q, lambda);
    return { logDirect: logPmfInRange(k + 1, n, p) + Math.log1p(-p) + Math.log((k + 1) * fraction), directIsUpper: true };
  }
  // Otherwise P(X <= k) = I_q(n-k, k+1) = (n-k) pmf(k) p r.
  if (nearCentre(n - k, k + 1, -lambda)) return { logDirect: betaAsymptoticLog(n - k, k + 1, -lambda), directIsUpper: false };
  const fraction = betaFraction(n - k, k + 1, q, p, -lambda);
  return { logDirect: logPmfInRange(k, n, p) + Math.log(p) + Math.log((n - k) * fraction), directIsUpper: false };
}

/** P(X <= k) (or P(X > k) when `upper`) at a cut, as a probability. */
function sideValue(cut: Cut, upper: boolean): number {
  return cut.directIsUpper === upper ? Math.exp(cut.logDirect) : -Math.expm1(cut.logDirect);
}

/** The logarithm of the same. */
function sideLog(cut: Cut, upper: boolean): number {
  return cut.directIsUpper === upper ? cut.logDirect : logOneMinusExp(cut.logDirect);
}

function checkTrials(n: number, caller: string): void {
  if (!Number.isInteger(n) || n < 0 || n > BINOMIAL_MAX_N) {
    throw new RangeError(`${caller}: n must be an integer from 0 to ${BINOMIAL_MAX_N}, got ${n}`);
  }
}

function checkProbability(p: number, caller: string, name = "p"): void {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`${caller}: ${name} must be in [0, 1], got ${p}`);
}

function checkArguments(k: number, n: number, p: number, caller: string): void {
  if (!Number.isInteger(k)) throw new RangeError(`${caller}: k must be an integer, got ${k}`);
  checkTrials(n, caller);
  checkProbability(p, caller);
}

/** The count a degenerate distribution (p = 0 or 1, or n = 0) sits on, or undefined when it is not degenerate. */
function pointMass(n: number, p: number): number | undefined {
  if (n === 0 || p === 0) return 0;
  if (p === 1) return n;
  return undefined;
}

/**
 * Up to this n, every partial sum of a row of Pascal's triangle is an integer
 * below 2^53, so fair-coin probabilities (p = 1/2, the sign test's null
 * distribution) are dyadic rationals a double holds exactly: 67/1024 comes
 * back as 67/1024, not an ulp away, and a p-value equal to alpha is not
 * decided by rounding.
 */
const FAIR_EXACT_MAX_N = 53;

/** FAIR_CUMULATIVE[n][k] = C(n,0) + ... + C(n,k), exact; built once by Pascal's rule (O(53^2)). */
const FAIR_CUMULATIVE: readonly Float64Array[] = (() => {
  const rows: Float64Array[] = [];
  let coefficients = new Float64Array([1]);
  for (let n = 0; n <= FAIR_EXACT_MAX_N; n++) {
    if (n > 0) {
      const next = new Float64Array(n + 1);
      for (let k = 0; k <= n; k++) next[k] = (k > 0 ? coefficients[k - 1] : 0) + (k < n ? coefficients[k] : 0);
      coefficients = next;
    }
    const cumulative = new Float64Array(n + 1);
    let sum = 0;
    for (let k = 0; k <= n; k++) cumulative[k] = sum += coefficients[k];
    rows.push(cumulative);
  }
  return rows;
})();

function isFairExact(n: number, p: number): boolean {
  return p === 0.5 && n <= FAIR_EXACT_MAX_N;
}

/** P(X <= k) at p = 1/2 for 0 <= k <= n <= FAIR_EXACT_MAX_N, exactly. */
function fairLowerTail(k: number, n: number): number {
  return FAIR_CUMULATIVE[n][k] * 2 ** -n;
}

/** P(X = k) at p = 1/2 for 0 <= k <= n <= FAIR_EXACT_MAX_N, exactly. */
function fairPmf(k: number, n: number): number {
  const row = FAIR_CUMULATIVE[n];
  return (k > 0 ? row[k] - row[k - 1] : row[0]) * 2 ** -n;
}

/**
 * Natural logarithm of P(X = k); -Infinity for k outside 0..n. Finite and
 * accurate even where P(X = k) itself underflows.
 *
 * @example
 * binomialLogPmf(0, 1e9, 0.5); // -693147180.5599453 (= 1e9 log(1/2))
 */
export function binomialLogPmf(k: number, n: number, p: number): number {
  checkArguments(k, n, p, "binomialLogPmf");
  if (k < 0 || k > n) return -Infinity;
  const mass = pointMass(n, p);
  if (mass !== undefined) return k === mass ? 0 : -Infinity;
  if (isFairExact(n, p)) return Math.log(fairPmf(k, n));
  return logPmfInRange(k, n, p);
}

/**
 * P(X = k) for X ~ Bin(n, p); 0 for k outside 0..n.
 *
 * @example
 * binomialPmf(3, 10, 0.5); // 0.1171875 (= 120 / 1024)
 */
export function binomialPmf(k: number, n: number, p: number): number {
  checkArguments(k, n, p, "binomialPmf");
  if (k < 0 || k > n) return 0;
  const mass = pointMass(n, p);
  if (mass !== undefined) return k === mass ? 1 : 0;
  if (isFairExact(n, p)) return fairPmf(k, n);
  return Math.exp(logPmfInRange(k, n, p));
}

/**
 * Lower tail P(X <= k). A small tail is computed directly, never as 1 - upper.
 *
 * @example
 * binomialLowerTail(2, 10, 0.5); // 0.0546875 (= 56 / 1024)
 */
export function binomialLowerTail(k: number, n: number, p: number): number {
  checkArguments(k, n, p, "binomialLowerTail");
  if (k < 0) return 0;
  if (k >= n) return 1;
  const mass = pointMass(n, p);
  if (mass !== undefined) return mass <= k ? 1 : 0;
  if (isFairExact(n, p)) return fairLowerTail(k, n);
  return sideValue(cutAt(k, n, p), false);
}

/**
 * Upper tail P(X >= k), INCLUSIVE of k, as a sign-test p-value needs.
 *
 * @example
 * binomialUpperTail(8, 10, 0.5); // 0.0546875 (= 56 / 1024)
 * binomialUpperTail(600, 1000, 0.5); // 1.3642e-10
 */
export function binomialUpperTail(k: number, n: number, p: number): number {
  checkArguments(k, n, p, "binomialUpperTail");
  if (k <= 0) return 1;
  if (k > n) return 0;
  const mass = pointMass(n, p);
  if (mass !== undefined) return mass >= k ? 1 : 0;
  if (isFairExact(n, p)) return fairLowerTail(n - k, n);
  return sideValue(cutAt(k - 1, n, p), true);
}

/**
 * log P(X <= k); stays finite and accurate where the tail underflows.
 *
 * @example
 * binomialLogLowerTail(0, 2000, 0.5); // -1386.29... (= 2000 log(1/2))
 */
export function binomialLogLowerTail(k: number, n: number, p: number): number {
  checkArguments(k, n, p, "binomialLogLowerTail");
  if (k < 0) return -Infinity;
  if (k >= n) return 0;
  const mass = pointMass(n, p);
  if (mass !== undefined) return mass <= k ? 0 : -Infinity;
  if (isFairExact(n, p)) return Math.log(fairLowerTail(k, n));
  return sideLog(cutAt(k, n, p), false);
}

/**
 * log P(X >= k) (inclusive); stays finite and accurate where the tail underflows.
 *
 * @example
 * binomialLogUpperTail(2000, 2000, 0.5); // -1386.29... (= 2000 log(1/2))
 */
export function binomialLogUpperTail(k: number, n: number, p: number): number {
  checkArguments(k, n, p, "binomialLogUpperTail");
  if (k <= 0) return 0;
  if (k > n) return -Infinity;
  const mass = pointMass(n, p);
  if (mass !== undefined) return mass >= k ? 0 : -Infinity;
  if (isFairExact(n, p)) return Math.log(fairLowerTail(n - k, n));
  return sideLog(cutAt(k - 1, n, p), true);
}

/**
 * Relative slack in the quantile search: a prob that equals a distribution
 * value exactly (1/2 for odd n at p = 1/2) must find that count although the
 * computed tail may be an ulp or two below it.
 */
const QUANTILE_SLACK = 1 - 64 * Number.EPSILON;

/**
 * Smallest k with P(X <= k) >= prob (the usual left-continuous inverse);
 * 0 for prob = 0 and n for prob = 1. Computed tails within 64 machine epsilons
 * (relative) of prob count as reaching it.
 *
 * @example
 * binomialQuantile(0.5, 10, 0.5);   // 5
 * binomialQuantile(0.025, 100, 0.5); // 40
 */
export function binomialQuantile(prob: number, n: number, p: number): number {
  checkProbability(prob, "binomialQuantile", "prob");
  checkTrials(n, "binomialQuantile");
  checkProbability(p, "binomialQuantile");
  if (prob === 0) return 0;
  const mass = pointMass(n, p);
  if (mass !== undefined) return mass;
  if (prob === 1) return n;
  const target = prob * QUANTILE_SLACK;
  const reaches = (k: number): boolean => k >= n || sideValue(cutAt(k, n, p), false) >= target;
  // Cornish-Fisher start: normal quantile corrected for skewness.
  const sd = Math.sqrt(n * p * (1 - p));
  const z = normalQuantile(prob);
  const skew = (1 - 2 * p) / sd;
  const start = Math.floor(n * p + sd * (z + (skew * (z * z - 1)) / 6) + 0.5);
  const guess = Math.min(n, Math.max(0, Number.isFinite(start) ? start : 0));
  // Invariant: reaches(high) and not reaches(low); low = -1 stands for "below 0".
  let low: number;
  let high: number;
  if (reaches(guess)) {
    high = guess;
    low = guess - 1;
    for (let step = 1; low >= 0 && reaches(low); step *= 2) {
      high = low;
      low = high - 2 * step;
    }
    low = Math.max(low, -1);
  } else {
    low = guess;
    high = guess + 1;
    for (let step = 1; !reaches(high); step *= 2) {
      low = high;
      high = Math.min(n, low + 2 * step);
    }
  }
  while (high - low > 1) {
    const middle = Math.floor((low + high) / 2);
    if (reaches(middle)) high = middle;
    else low = middle;
  }
  return high;
}
