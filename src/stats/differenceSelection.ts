/**
 * Order statistics of the m·n differences second[j] − first[i] of two samples, without
 * forming them.
 *
 * Method: with both samples sorted, the differences form a matrix whose rows (one per
 * first value) increase along the columns and whose columns decrease down the rows, so
 * the number of differences below any value is counted in O(m + n) along the matrix's
 * staircase: D. B. Johnson and T. Mizoguchi (1978), "Selecting the Kth element in X + Y
 * and X1 + X2 + ... + Xm", SIAM Journal on Computing 7(2), 147-153 (pages from memory). Each round brackets
 * the wanted rank between two values of a random sample of the differences still in play,
 * as R. W. Floyd and R. L. Rivest (1975), "Expected time bounds for selection", CACM 18,
 * 165-172, do for plain selection, and the rows' candidate ranges shrink to the bracket;
 * when few remain they are gathered and selected directly (selection.ts). This is the
 * one-sample module's Walsh-average selection (hodgesLehmann.ts) on another matrix.
 * Floating-point subtraction is monotone in each operand, which is all the counts need.
 *
 * Cost: O((m + n) log(m + n)) expected time after sorting, O(m + n) memory.
 */
import { selectInPlace } from "./selection";
import { xorshift32 as xorshift } from "./xorshift";

/** The differences still in play: row i (second[j] − first[i]) keeps columns left[i]..right[i]. */
interface Candidates {
  left: Int32Array;
  right: Int32Array;
  count: number;
  /** Differences known to be smaller than the wanted one. */
  below: number;
}

/** Candidates drawn per round; the bracket kept is about 4 sqrt(SAMPLE) of them wide, so a round keeps about 1/16. */
const SAMPLE = 4096;
/** Half-width of the bracket in sample ranks: 2 sqrt(SAMPLE), four standard deviations of the target's sample rank. */
const BRACKET = 128;
/** Below this many candidates (or (m + n)/4, if larger) the remaining differences are gathered: a further round costs two walks of m + n steps. */
const GATHER_MIN = 8192;

/** `size` candidates drawn at random (with replacement), sorted ascending. */
function sampleCandidates(first: Float64Array, second: Float64Array, c: Candidates, size: number, random: () => number): Float64Array {
  const positions = new Float64Array(size);
  for (let s = 0; s < size; s++) positions[s] = Math.floor(random() * c.count);
  positions.sort();
  const sample = new Float64Array(size);
  let row = 0;
  let before = 0;
  for (let s = 0; s < size; s++) {
    while (positions[s] - before >= c.right[row] - c.left[row] + 1) {
      before += c.right[row] - c.left[row] + 1;
      row++;
    }
    sample[s] = second[c.left[row] + positions[s] - before] - first[row];
  }
  return sample.sort();
}

/**
 * For every row, the first column whose difference is >= value (strict = false) or > value (strict = true),
 * written to `ends`; returns how many differences lie before those columns. The boundary only moves right
 * as the row's first value grows, so one merge-like walk of m + n steps visits every row. `padded` is the
 * second sample with +Infinity appended, which stops every row at the last column without a bounds test.
 * (A branch-free version of this walk measured 1.4 times slower.)
 */
function countBelow(first: Float64Array, padded: Float64Array, value: number, strict: boolean, ends: Int32Array): number {
  const m = first.length;
  let j = 0;
  let total = 0;
  for (let i = 0; i < m; i++) {
    const a = first[i];
    if (strict) while (padded[j] - a <= value) j++;
    else while (padded[j] - a < value) j++;
    ends[i] = j;
    total += j;
  }
  return total;
}

/** The second sample with +Infinity appended (the walk's stop). */
function withStop(second: Float64Array): Float64Array {
  const padded = new Float64Array(second.length + 1);
  padded.set(second);
  padded[second.length] = Infinity;
  return padded;
}

/** Keeps, in each row, only the columns in [from[i], to[i]) (either bound optional), and recounts. */
function narrow(c: Candidates, from: Int32Array | null, to: Int32Array | null): void {
  const m = c.left.length;
  let count = 0;
  let below = 0;
  for (let i = 0; i < m; i++) {
    if (from !== null && c.left[i] < from[i]) c.left[i] = from[i];
    if (to !== null && c.right[i] >= to[i]) c.right[i] = to[i] - 1;
    count += c.right[i] - c.left[i] + 1;
    below += c.left[i];
  }
  c.count = count;
  c.below = below;
}

/**
 * The k-th smallest (1-based) of second[j] − first[i] for ascending-sorted finite arrays, without forming
 * the m·n differences. The caller checks k and that the extreme differences are finite.
 *
 * @example
 * differenceOrderStatistic(Float64Array.of(1, 4), Float64Array.of(2, 3, 9), 2); // -1: the differences are 1, 2, 8, -2, -1, 5
 */
export function differenceOrderStatistic(first: Float64Array, second: Float64Array, k: number): number {
  const m = first.length;
  const n = second.length;
  const c: Candidates = { left: new Int32Array(m), right: new Int32Array(m).fill(n - 1), count: m * n, below: 0 };
  const lowEnds = new Int32Array(m);
  const highEnds = new Int32Array(m);
  const padded = withStop(second);
  const random = xorshift(0x9e3779b9 ^ m ^ (n << 7) ^ k);
  const gatherAt = Math.max(GATHER_MIN, (m + n) >> 2);
  const atMostEnds = new Int32Array(m);
  while (c.count > gatherAt) {
    const sample = sampleCandidates(first, second, c, SAMPLE, random);
    const target = ((k - c.below) / c.count) * SAMPLE;
    const low = sample[Math.max(0, Math.floor(target - BRACKET))];
    const high = sample[Math.min(SAMPLE - 1, Math.ceil(target + BRACKET))];
    // Each bracket end is a candidate and is either returned or left out, so every round makes progress
    // even when ties make many differences equal to an end.
    if (k <= countBelow(first, padded, low, false, lowEnds)) {
      narrow(c, null, lowEnds);
      continue;
    }
    if (k <= countBelow(first, padded, low, true, atMostEnds)) return low;
    if (k <= countBelow(first, padded, high, false, highEnds)) {
      narrow(c, atMostEnds, highEnds);
      continue;
    }
    if (k <= countBelow(first, padded, high, true, atMostEnds)) return high;
    narrow(c, atMostEnds, null);
  }
  const pool = new Float64Array(c.count);
  let p = 0;
  for (let i = 0; i < m; i++) {
    const a = first[i];
    for (let j = c.left[i]; j <= c.right[i]; j++) pool[p++] = second[j] - a;
  }
  return selectInPlace(pool, k - c.below - 1);
}

/** The (k+1)-th smallest difference given the k-th, `value`: one staircase walk instead of a second selection. */
export function nextDifference(first: Float64Array, second: Float64Array, value: number, k: number): number {
  const m = first.length;
  const n = second.length;
  const ends = new Int32Array(m);
  if (countBelow(first, withStop(second), value, true, ends) >= k + 1) return value;
  let next = Infinity;
  for (let i = 0; i < m; i++) if (ends[i] < n && second[ends[i]] - first[i] < next) next = second[ends[i]] - first[i];
  return next;
}
