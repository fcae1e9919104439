/**
 * Exact-arithmetic references for the binomial tests (not a test file itself).
 *
 * - `exactBinomial(n, a, c)`: every point mass and both tails of Bin(n, a/c) as
 *   exact BigInt rationals over c^n, for rational p = a/c; O(n) big products.
 * - `fixedPointLogs(k, n, p)`: log pmf and log tails of Bin(n, p) for the
 *   double p taken as the exact dyadic rational it is, in 256-bit fixed-point
 *   BigInt arithmetic (logs by atanh series, factorials by Stirling's series
 *   with eight Bernoulli terms, the smaller tail by summing exact term ratios).
 *   This serves where n is too large for exact sums (n up to 1e9), and is used
 *   to decide cases where our value and R's disagree.
 */

/** A positive rational turned into a double and into its natural logarithm. */
export interface ExactValue {
  value: number;
  log: number;
}

function bitLength(x: bigint): number {
  return x === 0n ? 0 : x.toString(2).length;
}

/** num / den (num >= 0, den > 0) correctly rounded enough for 1e-17 comparisons, plus its log (also where it underflows). */
export function ratioValue(num: bigint, den: bigint): ExactValue {
  if (num === 0n) return { value: 0, log: -Infinity };
  const shift = Math.max(0, bitLength(den) - bitLength(num) + 70);
  const quotient = (num << BigInt(shift)) / den;
  const bits = bitLength(quotient);
  const mantissa = Number(quotient) / 2 ** bits; // in [0.5, 1]
  let value = Number(quotient);
  for (let rest = shift; rest > 0; rest -= 1000) value *= 2 ** -Math.min(rest, 1000);
  return { value, log: Math.log(mantissa) + (bits - shift) * Math.LN2 };
}

export interface ExactBinomial {
  pmf: ExactValue[];
  lower: ExactValue[]; // P(X <= k)
  upper: ExactValue[]; // P(X >= k)
}

/** Exact Bin(n, a/c): term k is C(n,k) a^k (c-a)^(n-k) / c^n. */
export function exactBinomial(n: number, a: number, c: number): ExactBinomial {
  const A = BigInt(a);
  const B = BigInt(c - a);
  const powersA: bigint[] = [1n];
  const powersB: bigint[] = [1n];
  for (let i = 1; i <= n; i++) {
    powersA.push(powersA[i - 1] * A);
    powersB.push(powersB[i - 1] * B);
  }
  const den = BigInt(c) ** BigInt(n);
  const terms: bigint[] = [];
  let choose = 1n;
  for (let k = 0; k <= n; k++) {
    terms.push(choose * powersA[k] * powersB[n - k]);
    choose = (choose * BigInt(n - k)) / BigInt(k + 1);
  }
  const lowerSums: bigint[] = [];
  let sum = 0n;
  for (let k = 0; k <= n; k++) lowerSums.push((sum += terms[k]));
  const upperSums: bigint[] = new Array<bigint>(n + 1);
  sum = 0n;
  for (let k = n; k >= 0; k--) upperSums[k] = sum += terms[k];
  return {
    pmf: terms.map((t) => ratioValue(t, den)),
    lower: lowerSums.map((t) => ratioValue(t, den)),
    upper: upperSums.map((t) => ratioValue(t, den)),
  };
}

// ---- 256-bit fixed point -------------------------------------------------------------------------

const BITS = 256n;
const ONE = 1n << BITS;

/** atanh(num/den) in fixed point, |num/den| <= 1/3. */
function atanhFixed(num: bigint, den: bigint): bigint {
  if (num < 0n) return -atanhFixed(-num, den); // keeps the shifts below rounding toward zero
  const z = (num << BITS) / den;
  const z2 = (z * z) >> BITS;
  let power = z;
  let sum = 0n;
  for (let j = 1n; power !== 0n; j += 2n) {
    sum += power / j;
    power = (power * z2) >> BITS;
  }
  return sum;
}

const LN2 = 2n * atanhFixed(1n, 3n);

/** arctan(1/x) in fixed point for an integer x >= 2. */
function arctanInverse(x: bigint): bigint {
  let power = ONE / x;
  const x2 = x * x;
  let sum = 0n;
  for (let j = 1n, sign = 1n; power !== 0n; j += 2n, sign = -sign) {
    sum += (sign * power) / j;
    power /= x2;
  }
  return sum;
}

/** Machin's formula pi = 16 arctan(1/5) - 4 arctan(1/239). */
const HALF_LN_2PI = (() => {
  const twoPi = 2n * (16n * arctanInverse(5n) - 4n * arctanInverse(239n));
  return lnFixed(twoPi, ONE) / 2n;
})();

/** ln(num/den) in fixed point, num, den > 0. */
function lnFixed(num: bigint, den: bigint): bigint {
  // Scale by 2^e so that m = num / (den 2^e) lies in [2/3, 4/3), then ln m = 2 atanh((m-1)/(m+1)).
  let e = bitLength(num) - bitLength(den);
  let scaledDen = e >= 0 ? den << BigInt(e) : den;
  let scaledNum = e >= 0 ? num : num << BigInt(-e);
  while (3n * scaledNum >= 4n * scaledDen) {
    scaledDen <<= 1n;
    e++;
  }
  while (3n * scaledNum < 2n * scaledDen) {
    scaledNum <<= 1n;
    e--;
  }
  return BigInt(e) * LN2 + 2n * atanhFixed(scaledNum - scaledDen, scaledNum + scaledDen);
}

// Bernoulli numbers B_2 .. B_16 as [numerator, denominator].
const BERNOULLI: [bigint, bigint][] = [
  [1n, 6n],
  [-1n, 30n],
  [1n, 42n],
  [-1n, 30n],
  [5n, 66n],
  [-691n, 2730n],
  [7n, 6n],
  [-3617n, 510n],
];

/** ln(m!) in fixed point: exact for m < 2000, Stirling's series beyond (error far below 2^-200). */
function lnFactorial(m: number): bigint {
  if (m < 2000) {
    let f = 1n;
    for (let j = 2n; j <= BigInt(m); j++) f *= j;
    return lnFixed(f, 1n);
  }
  const M = BigInt(m);
  let result = ((2n * M + 1n) * lnFixed(M, 1n)) / 2n - M * ONE + HALF_LN_2PI;
  BERNOULLI.forEach(([num, den], index) => {
    const j = BigInt(index + 1);
    result += (num * ONE) / (den * 2n * j * (2n * j - 1n) * M ** (2n * j - 1n));
  });
  return result;
}

function toNumber(x: bigint): number {
  return Number(x) / 2 ** 256;
}

export interface FixedPointLogs {
  logPmf: number;
  logLower: number; // log P(X <= k)
  logAbove: number; // log P(X > k)
}

/** The double p as an exact fraction pn / 2^s, with qn = 2^s - pn. */
function dyadic(p: number): { pn: bigint; qn: bigint; s: bigint } {
  let x = p;
  let s = 0n;
  while (!Number.isInteger(x)) {
    x *= 2;
    s++;
  }
  return { pn: BigInt(x), qn: (1n << s) - BigInt(x), s };
}

/** High-precision logs of Bin(n, p) at k (0 <= k < n); the smaller tail is summed exactly, the other is its complement. */
export function fixedPointLogs(k: number, n: number, p: number): FixedPointLogs {
  const { pn, qn, s } = dyadic(p);
  const K = BigInt(k);
  const N = BigInt(n);
  const lnP = lnFixed(pn, 1n << s);
  const lnQ = lnFixed(qn, 1n << s);
  const logPmf = lnFactorial(n) - lnFactorial(k) - lnFactorial(n - k) + K * lnP + (N - K) * lnQ;
  // Sum the tail on the side away from the mean, relative to pmf(k) or pmf(k+1); its term ratios fall below 1.
  const lowerIsSmall = k < n * p;
  let sum = ONE;
  let term = ONE;
  let logSmall: bigint;
  if (lowerIsSmall) {
    for (let j = K; j >= 1n; j--) {
      term = (term * j * qn) / ((N - j + 1n) * pn);
      sum += term;
      if (term < sum >> 90n) break;
    }
    logSmall = logPmf + lnFixed(sum, ONE);
  } else {
    // P(X > k) = pmf(k+1) (1 + ...); pmf(k+1) = pmf(k) (n-k) p / ((k+1) q).
    const first = lnFixed((N - K) * pn, (K + 1n) * qn);
    for (let j = K + 1n; j < N; j++) {
      term = (term * (N - j) * pn) / ((j + 1n) * qn);
      sum += term;
      if (term < sum >> 90n) break;
    }
    logSmall = logPmf + first + lnFixed(sum, ONE);
  }
  const small = toNumber(logSmall);
  const other = Math.log1p(-Math.exp(small));
  return lowerIsSmall
    ? { logPmf: toNumber(logPmf), logLower: small, logAbove: other }
    : { logPmf: toNumber(logPmf), logLower: other, logAbove: small };
}
