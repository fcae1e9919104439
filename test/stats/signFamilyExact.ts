/**
 * Exact rational binomial arithmetic with BigInt, the outside source for the
 * sign-test, quantile-test and bound tests: P(X <= k) for X ~ Bin(n, a/b) is
 * sum_j C(n, j) a^j (b - a)^(n - j) / b^n, with no rounding anywhere until a
 * value is turned into a double (correctly rounded to within one unit).
 *
 * Cost: O(n) big-integer terms per (n, a, b), cached.
 */

/** An exact fraction num / den with den > 0. */
export interface Fraction {
  readonly num: bigint;
  readonly den: bigint;
}

/** Exact binomial distribution Bin(n, a/b): terms C(n, j) a^j (b-a)^(n-j) over b^n. */
export interface ExactBinomial {
  readonly n: number;
  readonly den: bigint;
  /** terms[j] = C(n, j) a^j (b - a)^(n - j). */
  readonly terms: readonly bigint[];
  /** cumulative[j] = terms[0] + ... + terms[j]. */
  readonly cumulative: readonly bigint[];
}

const cache = new Map<string, ExactBinomial>();

export function exactBinomial(n: number, a: number, b: number): ExactBinomial {
  const key = `${n}/${a}/${b}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const A = BigInt(a);
  const Q = BigInt(b - a);
  const terms: bigint[] = [];
  const cumulative: bigint[] = [];
  // C(n, j) a^j q^(n-j) built from powers rather than a ratio recurrence, so every term is an exact integer.
  const aPow: bigint[] = [1n];
  const qPow: bigint[] = [1n];
  for (let j = 1; j <= n; j++) {
    aPow.push(aPow[j - 1] * A);
    qPow.push(qPow[j - 1] * Q);
  }
  let choose = 1n;
  let sum = 0n;
  for (let j = 0; j <= n; j++) {
    if (j > 0) choose = (choose * BigInt(n - j + 1)) / BigInt(j);
    const t = choose * aPow[j] * qPow[n - j];
    terms.push(t);
    sum += t;
    cumulative.push(sum);
  }
  const result = { n, den: BigInt(b) ** BigInt(n), terms, cumulative };
  cache.set(key, result);
  return result;
}

/** P(X <= k) exactly. */
export function exactLower(dist: ExactBinomial, k: number): Fraction {
  if (k < 0) return { num: 0n, den: 1n };
  if (k >= dist.n) return { num: 1n, den: 1n };
  return { num: dist.cumulative[k], den: dist.den };
}

/** P(X >= k) exactly (inclusive). */
export function exactUpper(dist: ExactBinomial, k: number): Fraction {
  if (k <= 0) return { num: 1n, den: 1n };
  if (k > dist.n) return { num: 0n, den: 1n };
  return { num: dist.den - dist.cumulative[k - 1], den: dist.den };
}

/** P(X = k) exactly. */
export function exactPmf(dist: ExactBinomial, k: number): Fraction {
  if (k < 0 || k > dist.n) return { num: 0n, den: 1n };
  return { num: dist.terms[k], den: dist.den };
}

function bitLength(x: bigint): number {
  return x === 0n ? 0 : x.toString(2).length;
}

/** The double nearest num / den (error below one unit in the last place). */
export function toNumber(f: Fraction): number {
  if (f.num === 0n) return 0;
  const negative = f.num < 0n;
  const num = negative ? -f.num : f.num;
  const shift = bitLength(f.den) - bitLength(num) + 64;
  const scaled = shift >= 0 ? (num << BigInt(shift)) / f.den : num / (f.den << BigInt(-shift));
  let x = Number(scaled);
  let s = shift;
  while (s > 1000) {
    x *= 2 ** -1000;
    s -= 1000;
  }
  while (s < -1000) {
    x *= 2 ** 1000;
    s += 1000;
  }
  x *= 2 ** -s;
  return negative ? -x : x;
}

/** The exact value of a finite double as a fraction. */
export function fromNumber(x: number): Fraction {
  if (!Number.isFinite(x)) throw new RangeError("fromNumber needs a finite double");
  if (x === 0) return { num: 0n, den: 1n };
  let den = 1n;
  let v = x;
  while (!Number.isInteger(v)) {
    v *= 2;
    den *= 2n;
  }
  return { num: BigInt(v), den };
}

export function add(a: Fraction, b: Fraction): Fraction {
  return { num: a.num * b.den + b.num * a.den, den: a.den * b.den };
}

export function subtract(a: Fraction, b: Fraction): Fraction {
  return { num: a.num * b.den - b.num * a.den, den: a.den * b.den };
}

export function times(a: Fraction, b: Fraction): Fraction {
  return { num: a.num * b.num, den: a.den * b.den };
}

/** Sign of a - b: -1, 0 or 1. */
export function compare(a: Fraction, b: Fraction): number {
  const d = a.num * b.den - b.num * a.den;
  return d < 0n ? -1 : d > 0n ? 1 : 0;
}

export const ONE: Fraction = { num: 1n, den: 1n };
export const HALF: Fraction = { num: 1n, den: 2n };

/** |computed - exact| / |exact| (0 when both are 0). */
export function relativeError(computed: number, exact: Fraction): number {
  const e = toNumber(exact);
  if (e === 0) return computed === 0 ? 0 : Infinity;
  return Math.abs(computed - e) / Math.abs(e);
}
