/**
 * Exact arithmetic shared by the tests: binomial coefficients as BigInt and
 * the fair-coin tail the sign test rests on, P(X >= k) for X ~ Binomial(n, 1/2)
 * = sum_{j >= k} C(n, j) / 2^n, computed exactly and only then rounded.
 */

/**
 * C(n, k) exactly; each partial product is itself a binomial coefficient, so every division is exact.
 *
 * @example
 * binomialCoefficient(5, 2); // 10n
 */
export function binomialCoefficient(n: number, k: number): bigint {
  let c = 1n;
  for (let i = 1; i <= k; i++) c = (c * BigInt(n - k + i)) / BigInt(i);
  return c;
}

/**
 * sum_{j = k..n} C(n, j) exactly: the numerator of P(X >= k) over 2^n.
 *
 * @example
 * fairCoinUpperCount(2, 3); // 4n (3 + 1)
 */
export function fairCoinUpperCount(k: number, n: number): bigint {
  let sum = 0n;
  for (let j = Math.max(0, k); j <= n; j++) sum += binomialCoefficient(n, j);
  return sum;
}

/**
 * P(X >= k) for X ~ Binomial(n, 1/2), exactly, then as a double.
 *
 * @example
 * fairCoinUpperTail(2, 3); // 0.5
 */
export function fairCoinUpperTail(k: number, n: number): number {
  return Number(fairCoinUpperCount(k, n)) / Number(2n ** BigInt(n));
}
