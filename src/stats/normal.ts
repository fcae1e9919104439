/**
 * Standard normal distribution: both tails and the quantile, each with full
 * relative accuracy far out in the tails.
 *
 * Method
 * - Tails: W. J. Cody (1969), "Rational Chebyshev approximations for the error
 *   function", Mathematics of Computation 23, 631-638 — the three near-minimax
 *   rational functions (|x| <= 0.46875, <= 4, > 4) in the arrangement of Cody's
 *   later portable CALERF routine. The factor exp(-z^2/2) is evaluated as
 *   exp(-h^2/2) * exp(-(z-h)(z+h)/2) with h = z rounded down to 1/16, so that
 *   squaring a large z does not throw away the last digits: relative error stays
 *   near 1e-15 down to the smallest normal double (z ~ 37.5).
 *   The smaller tail is always computed directly; 1 - tail is only formed when
 *   the result is at least 1/2. The same rational functions give the scaled
 *   complementary error function exp(x^2) erfc(x) (used by binomial.ts).
 * - Quantile: M. J. Wichura (1988), "Algorithm AS 241: The percentage points of
 *   the normal distribution", Applied Statistics 37, 477-484 (PPND16, about 16
 *   significant digits).
 *
 * Cost: O(1) per call, a handful of multiplications and at most two exp/log.
 */

/** 1 / sqrt(pi), to 20 digits. */
// eslint-disable-next-line no-loss-of-precision -- a constant to 20 digits; the literal rounds to the nearest double.
const INV_SQRT_PI = 0.56418958354775628695;

/** Beyond this z the upper tail is below the smallest subnormal double. */
const UNDERFLOW_Z = 39;

/** Below this |x| (erf argument) erf itself is approximated; above, exp(x^2) erfc(x). */
const ERF_SPLIT = 0.46875;

/** Evaluates a polynomial with coefficients ordered from the constant term up. */
function polynomial(coefficients: readonly number[], x: number): number {
  let sum = 0;
  for (let i = coefficients.length - 1; i >= 0; i--) sum = sum * x + coefficients[i];
  return sum;
}

/* eslint-disable no-loss-of-precision -- Cody's published coefficients, printed to more digits than a double holds; each literal rounds to the nearest double, as the algorithm's authors intend. */
// Cody (1969), first interval: erf(x) = x P(x^2) / Q(x^2), |x| <= 0.46875.
const ERF_NUM = [3209.37758913846947, 377.485237685302021, 113.864154151050156, 3.1611237438705656, 0.185777706184603153];
const ERF_DEN = [2844.23683343917062, 1282.61652607737228, 244.024637934444173, 23.6012909523441209, 1];

// Second interval: exp(x^2) erfc(x) = P(x) / Q(x), 0.46875 < x <= 4.
const MID_NUM = [
  1230.33935479799725, 2051.07837782607147, 1712.04761263407058, 881.95222124176909, 298.635138197400131, 66.1191906371416295,
  8.88314979438837594, 0.564188496988670089, 2.15311535474403846e-8,
];
const MID_DEN = [
  1230.33935480374942, 3439.36767414372164, 4362.61909014324716, 3290.79923573345963, 1621.38957456669019, 537.181101862009858,
  117.693950891312499, 15.7449261107098347, 1,
];

// Third interval: exp(x^2) erfc(x) = (1/sqrt(pi) - t P(t)/Q(t)) / x with t = 1/x^2, x > 4.
const FAR_NUM = [
  6.58749161529837803e-4, 1.60837851487422766e-2, 1.25781726111229246e-1, 3.60344899949804439e-1, 3.05326634961232344e-1,
  1.63153871373020978e-2,
];
const FAR_DEN = [2.33520497626869185e-3, 6.05183413124413191e-2, 5.27905102951428412e-1, 1.87295284992346047, 2.56852019228982242, 1];
/* eslint-enable no-loss-of-precision */

/** exp(x^2) erfc(x) for x > 0.46875 (the smooth factor left once the Gaussian decay is taken out). */
function erfcRational(x: number): number {
  if (x <= 4) return polynomial(MID_NUM, x) / polynomial(MID_DEN, x);
  const t = 1 / (x * x);
  return (INV_SQRT_PI - (t * polynomial(FAR_NUM, t)) / polynomial(FAR_DEN, t)) / x;
}

/**
 * The scaled complementary error function exp(x^2) erfc(x) for x >= 0, from
 * the same Cody (1969) approximations; it never overflows or underflows (it
 * falls like 1 / (x sqrt(pi))).
 *
 * @throws RangeError for negative or NaN x.
 * @example
 * scaledErfc(0); // 1
 * scaledErfc(10); // 0.05614099274382259
 */
export function scaledErfc(x: number): number {
  if (!(x >= 0)) throw new RangeError(`scaledErfc: x must be >= 0, got ${x}`);
  if (x <= ERF_SPLIT) {
    const x2 = x * x;
    return Math.exp(x2) * (1 - (x * polynomial(ERF_NUM, x2)) / polynomial(ERF_DEN, x2));
  }
  return erfcRational(x);
}

/**
 * exp(-z^2 / 2) for z >= 0 without the rounding error of z*z: h has at most
 * about ten significant bits, so h*h is exact, and (z-h)(z+h) is small.
 */
function gaussianFactor(z: number): number {
  const h = Math.floor(z * 16) / 16;
  return Math.exp((-h * h) / 2) * Math.exp((-(z - h) * (z + h)) / 2);
}

/** P(Z > z) for z > 0.6629 (the erfc branch), as Gaussian decay times the smooth scaled erfc. */
function farTail(absZ: number): number {
  if (absZ > UNDERFLOW_Z) return 0;
  return 0.5 * gaussianFactor(absZ) * erfcRational(absZ * Math.SQRT1_2);
}

/**
 * Upper tail P(Z > z) of the standard normal distribution, computed directly
 * (never as 1 - lower), so that it keeps about 15 significant digits out to
 * z ~ 37.5; beyond ~38.5 it underflows to 0.
 *
 * @example
 * normalUpperTail(1.959963984540054); // ~0.025
 * normalUpperTail(10);                // 7.619853024160527e-24
 */
export function normalUpperTail(z: number): number {
  if (Number.isNaN(z)) return NaN;
  const x = z * Math.SQRT1_2;
  if (Math.abs(x) <= ERF_SPLIT) {
    const x2 = x * x;
    return 0.5 - (0.5 * x * polynomial(ERF_NUM, x2)) / polynomial(ERF_DEN, x2);
  }
  if (z > 0) return farTail(z);
  return 1 - farTail(-z);
}

/**
 * Lower tail P(Z <= z) of the standard normal distribution, with the same
 * relative accuracy as {@link normalUpperTail} for very negative z.
 *
 * @example
 * normalLowerTail(-1.959963984540054); // ~0.025
 * normalLowerTail(0);                  // 0.5
 */
export function normalLowerTail(z: number): number {
  return normalUpperTail(-z);
}

/* eslint-disable no-loss-of-precision -- Wichura's published coefficients, printed to more digits than a double holds; each literal rounds to the nearest double, as the algorithm's authors intend. */
// Wichura (1988) AS 241, PPND16: central region |p - 1/2| <= 0.425.
const CENTRAL_NUM = [
  3.387132872796366608, 1.3314166789178437745e2, 1.9715909503065514427e3, 1.3731693765509461125e4, 4.5921953931549871457e4,
  6.7265770927008700853e4, 3.3430575583588128105e4, 2.5090809287301226727e3,
];
const CENTRAL_DEN = [
  1, 4.2313330701600911252e1, 6.871870074920579083e2, 5.3941960214247511077e3, 2.1213794301586595867e4, 3.930789580009271061e4,
  2.8729085735721942674e4, 5.226495278852854561e3,
];
// Intermediate tail: r = sqrt(-log(min(p, 1-p))) <= 5, polynomial in r - 1.6.
const NEAR_NUM = [
  1.42343711074968357734, 4.6303378461565452959, 5.7694972214606914055, 3.64784832476320460504, 1.27045825245236838258,
  2.4178072517745061177e-1, 2.27238449892691845833e-2, 7.7454501427834140764e-4,
];
const NEAR_DEN = [
  1, 2.05319162663775882187, 1.6763848301838038494, 6.8976733498510000455e-1, 1.4810397642748007459e-1, 1.51986665636164571966e-2,
  5.475938084995344946e-4, 1.05075007164441684324e-9,
];
// Extreme tail: r > 5, polynomial in r - 5.
const EXTREME_NUM = [
  6.6579046435011037772, 5.4637849111641143699, 1.7848265399172913358, 2.9656057182850489123e-1, 2.6532189526576123093e-2,
  1.2426609473880784386e-3, 2.71155556874348757815e-5, 2.01033439929228813265e-7,
];
const EXTREME_DEN = [
  1, 5.9983220655588793769e-1, 1.3692988092273580531e-1, 1.48753612908506148525e-2, 7.868691311456132591e-4, 1.8463183175100546818e-5,
  1.4215117583164458887e-7, 2.04426310338993978564e-15,
];
/* eslint-enable no-loss-of-precision */

/**
 * Standard normal quantile: the z with P(Z <= z) = prob (Wichura 1988, AS 241).
 * prob = 0 and 1 give -Infinity and Infinity. For a small upper-tail
 * probability q, use -normalQuantile(q) rather than normalQuantile(1 - q).
 *
 * @throws RangeError when prob is NaN or outside [0, 1] (a programming error).
 * @example
 * normalQuantile(0.975); // 1.959963984540054
 * normalQuantile(1e-300); // -37.0471...
 */
export function normalQuantile(prob: number): number {
  if (!(prob >= 0 && prob <= 1)) throw new RangeError(`normalQuantile: prob must be in [0, 1], got ${prob}`);
  if (prob === 0) return -Infinity;
  if (prob === 1) return Infinity;
  const q = prob - 0.5;
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (q * polynomial(CENTRAL_NUM, r)) / polynomial(CENTRAL_DEN, r);
  }
  const r = Math.sqrt(-Math.log(q < 0 ? prob : 1 - prob));
  const magnitude =
    r <= 5
      ? polynomial(NEAR_NUM, r - 1.6) / polynomial(NEAR_DEN, r - 1.6)
      : polynomial(EXTREME_NUM, r - 5) / polynomial(EXTREME_DEN, r - 5);
  return q < 0 ? -magnitude : magnitude;
}
