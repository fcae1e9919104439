/**
 * Upper tail of the chi-square distribution with a whole number of degrees of freedom.
 *
 * Method: the finite sums for integer degrees of freedom (M. Abramowitz and I. A. Stegun
 * (1964), "Handbook of Mathematical Functions", 26.4.4 and 26.4.5, from memory):
 * - even ν: Q(x) = e^(−x/2) sum_{i < ν/2} (x/2)^i / i!  (a Poisson tail);
 * - odd ν:  Q(x) = 2 Φ̄(√x) + 2 φ(√x) sum_{r = 1..(ν−1)/2} x^(r − 1/2) / (1·3···(2r − 1)).
 * Every term is positive, so nothing cancels; each is formed from its logarithm and the
 * sum taken relative to the largest term, so no term overflows or underflows before it
 * has to (x of many thousands, ν of many thousands). Φ̄ is normal.ts's upper tail.
 *
 * Cost: O(ν) time, O(1) memory.
 */
import { normalUpperTail } from "./normal";

/** log of the sum of exp(terms[i]) for terms given by `term(i)`, i = from..to, without overflow. */
function logSumOf(from: number, to: number, term: (i: number) => number): number {
  let largest = -Infinity;
  for (let i = from; i <= to; i++) largest = Math.max(largest, term(i));
  if (largest === -Infinity) return -Infinity;
  let sum = 0;
  for (let i = from; i <= to; i++) sum += Math.exp(term(i) - largest);
  return largest + Math.log(sum);
}

/**
 * P(X >= x) for X chi-square with `df` degrees of freedom (a whole number from 1). Throws a RangeError
 * for another df or a NaN x.
 *
 * @example
 * chiSquareUpperTail(2, 2);      // e^-1 = 0.36787944117144233
 * chiSquareUpperTail(3.841458820694124, 1); // 0.05 (1.96^2, nearly)
 */
export function chiSquareUpperTail(x: number, df: number): number {
  if (!Number.isInteger(df) || df < 1) throw new RangeError(`chiSquareUpperTail: df must be a whole number from 1, got ${df}`);
  if (Number.isNaN(x)) throw new RangeError("chiSquareUpperTail: x is NaN");
  if (x <= 0) return 1;
  if (x === Infinity) return 0;
  const half = x / 2;
  const logHalf = Math.log(half);
  if (df % 2 === 0) {
    // log of e^(-x/2) (x/2)^i / i!, built up term by term
    const logTerms = new Float64Array(df / 2);
    let running = -half;
    for (let i = 0; i < df / 2; i++) {
      if (i > 0) running += logHalf - Math.log(i);
      logTerms[i] = running;
    }
    return Math.min(1, Math.exp(logSumOf(0, df / 2 - 1, (i) => logTerms[i])));
  }
  const root = Math.sqrt(x);
  const normalPart = 2 * normalUpperTail(root);
  if (df === 1) return normalPart;
  const count = (df - 1) / 2;
  const logTerms = new Float64Array(count + 1);
  // log of 2 φ(√x) x^(r − 1/2) / (1·3···(2r − 1)), r = 1..count
  let running = Math.log(2) - half - 0.5 * Math.log(2 * Math.PI) + 0.5 * Math.log(x);
  for (let r = 1; r <= count; r++) {
    if (r > 1) running += Math.log(x) - Math.log(2 * r - 1);
    logTerms[r] = running;
  }
  return Math.min(1, normalPart + Math.exp(logSumOf(1, count, (r) => logTerms[r])));
}
