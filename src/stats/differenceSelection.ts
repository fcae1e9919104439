/**
 * Order statistics of the m·n differences second[j] − first[i] of two samples, without
 * forming them.
 *
 * Method: with both samples in order, the differences form a matrix whose rows (one per
 * first value) increase along the columns and whose columns decrease down the rows, so
 * the number of differences below any value is counted in one walk along the matrix's
 * staircase: D. B. Johnson and T. Mizoguchi (1978), "Selecting the Kth element in X + Y
 * and X1 + X2 + ... + Xm", SIAM Journal on Computing 7(2), 147-153 (pages from memory).
 * Each round brackets the wanted rank between two values of a random sample of the
 * differences still in play, as R. W. Floyd and R. L. Rivest (1975), "Expected time bounds
 * for selection", CACM 18, 165-172, do for plain selection, and the rows' candidate ranges
 * shrink to the bracket; when few remain they are gathered and selected directly. This is
 * the one-sample module's Walsh-average selection (hodgesLehmann.ts) on another matrix.
 * Equal values are merged first (distinctValues.ts), each distinct value carrying its count,
 * so the matrix has one row and one column per distinct value and every walk costs the
 * number of distinct values: measurements recorded to a few decimals (the usual spreadsheet
 * column) repeat a great deal. Floating-point subtraction is monotone in each operand, which is all the
 * counts need.
 *
 * Cost: O((p + q) log(p + q)) expected time per selection once the distinct values are
 * found, p and q their numbers (at most m and n); O(m + n) memory.
 */
import { distinctValues } from "./distinctValues";
import { selectInPlace } from "./selection";
import { xorshift32 as xorshift } from "./xorshift";

/** Distinct values of a sample with their counts, and the running totals of the counts. */
interface Distinct {
  values: Float64Array;
  counts: Float64Array;
  /** before[j]: how many sample values lie before distinct value j (length + 1 entries). */
  before: Float64Array;
}

function distinct(sample: ArrayLike<number>): Distinct {
  const { values, counts } = distinctValues(sample);
  const before = new Float64Array(values.length + 1);
  for (let j = 0; j < values.length; j++) before[j + 1] = before[j] + counts[j];
  return { values, counts, before };
}

/**
 * The differences still in play: row i (second values less the i-th distinct first value) keeps
 * distinct columns left[i]..right[i]. `count` weighs each cell by how many pairs it stands for.
 */
interface Candidates {
  left: Int32Array;
  right: Int32Array;
  /** Pairs in play. */
  count: number;
  /** Cells (distinct pairs) in play. */
  cells: number;
  /** Pairs known to be smaller than the wanted one. */
  below: number;
}

/**
 * Candidates drawn per round: about half the distinct values, from 256 to 4096, so that drawing and sorting
 * the sample costs about as much as the walks it saves. The bracket kept is 4 sqrt(size) sample ranks wide
 * (four standard deviations of the target's sample rank each side), so a round keeps 1/4 to 1/16.
 */
function sampleSize(distinctValues: number): number {
  let size = 256;
  while (size < 4096 && 2 * size <= distinctValues / 2) size *= 2;
  return size;
}
/** Below this many cells in play (or (p + q)/4, if larger) they are gathered: a further round costs walks of p + q steps. */
const GATHER_MIN = 2048;

/** First column c in [lo, hi] with before[c + 1] > offset (a binary search over the running counts). */
function columnAt(before: Float64Array, lo: number, hi: number, offset: number): number {
  let a = lo;
  let b = hi;
  while (a < b) {
    const mid = (a + b) >>> 1;
    if (before[mid + 1] > offset) b = mid;
    else a = mid + 1;
  }
  return a;
}

/** `size` pairs drawn at random (with replacement) from those in play, as differences, sorted ascending. */
function sampleCandidates(a: Distinct, b: Distinct, c: Candidates, size: number, random: () => number): Float64Array {
  const positions = new Float64Array(size);
  for (let s = 0; s < size; s++) positions[s] = Math.floor(random() * c.count);
  positions.sort();
  const sample = new Float64Array(size);
  let row = 0;
  let start = 0; // pairs in play in rows before `row`
  let width = c.right[0] >= c.left[0] ? a.counts[0] * (b.before[c.right[0] + 1] - b.before[c.left[0]]) : 0;
  for (let s = 0; s < size; s++) {
    while (positions[s] - start >= width) {
      start += width;
      row++;
      width = c.right[row] >= c.left[row] ? a.counts[row] * (b.before[c.right[row] + 1] - b.before[c.left[row]]) : 0;
    }
    const offset = Math.floor((positions[s] - start) / a.counts[row]) + b.before[c.left[row]];
    sample[s] = b.values[columnAt(b.before, c.left[row], c.right[row], offset)] - a.values[row];
  }
  return sample.sort();
}

/**
 * For every row, the first column whose difference is >= value (written to `lessEnds`) and the first whose
 * difference is > value (`atMostEnds`); returns how many pairs lie before each. Both boundaries only move
 * right as the row's first value grows, so one merge-like walk visits every row; the second boundary
 * starts from the first and, without ties, stays there after one comparison. `padded` is the distinct
 * second values with +Infinity appended, which stops every row at the last column without a bounds test.
 */
function countAround(
  a: Distinct,
  padded: Float64Array,
  before: Float64Array,
  value: number,
  lessEnds: Int32Array,
  atMostEnds: Int32Array,
): { less: number; atMost: number } {
  const first = a.values;
  const p = first.length;
  let j = 0;
  let k = 0;
  let less = 0;
  let atMost = 0;
  for (let i = 0; i < p; i++) {
    const x = first[i];
    while (padded[j] - x < value) j++;
    if (k < j) k = j;
    while (padded[k] - x <= value) k++;
    lessEnds[i] = j;
    atMostEnds[i] = k;
    less += a.counts[i] * before[j];
    atMost += a.counts[i] * before[k];
  }
  return { less, atMost };
}

/** Keeps, in each row, only the columns in [from[i], to[i]) (either bound optional), and recounts. */
function narrow(a: Distinct, b: Distinct, c: Candidates, from: Int32Array | null, to: Int32Array | null): void {
  const p = c.left.length;
  let count = 0;
  let cells = 0;
  let below = 0;
  for (let i = 0; i < p; i++) {
    if (from !== null && c.left[i] < from[i]) c.left[i] = from[i];
    if (to !== null && c.right[i] >= to[i]) c.right[i] = to[i] - 1;
    if (c.right[i] >= c.left[i]) {
      count += a.counts[i] * (b.before[c.right[i] + 1] - b.before[c.left[i]]);
      cells += c.right[i] - c.left[i] + 1;
    }
    below += a.counts[i] * b.before[c.left[i]];
  }
  c.count = count;
  c.cells = cells;
  c.below = below;
}

function withStop(values: Float64Array): Float64Array {
  const padded = new Float64Array(values.length + 1);
  padded.set(values);
  padded[values.length] = Infinity;
  return padded;
}

/** The cells in play, selected directly: sorted by value, their pair counts summed up to the wanted rank. */
function selectGathered(a: Distinct, b: Distinct, c: Candidates, k: number): number {
  const values = new Float64Array(c.cells);
  const weights = new Float64Array(c.cells);
  let at = 0;
  for (let i = 0; i < c.left.length; i++) {
    for (let j = c.left[i]; j <= c.right[i]; j++) {
      values[at] = b.values[j] - a.values[i];
      weights[at++] = a.counts[i] * b.counts[j];
    }
  }
  let single = true; // no repeated value anywhere in play: plain selection, no weights to carry
  for (let i = 0; i < at && single; i++) single = weights[i] === 1;
  if (single) return selectInPlace(values, k - c.below - 1);
  const order = Array.from({ length: at }, (_, i) => i).sort((x, y) => values[x] - values[y]);
  let reached = c.below;
  for (const i of order) {
    reached += weights[i];
    if (reached >= k) return values[i];
  }
  throw new Error("differenceOrderStatistic: the rank lies outside the gathered cells");
}

/** Two sorted samples with their equal values merged: the implicit matrix of differences, ready for selection. */
export interface DifferenceMatrix {
  readonly a: Distinct;
  readonly b: Distinct;
  /** m·n, the number of differences. */
  readonly pairs: number;
  /** The distinct second values with +Infinity appended. */
  readonly padded: Float64Array;
}

/**
 * The implicit matrix of second[j] − first[i] for samples of finite values (in any order), for any number
 * of selections (distinctValues.ts: O(m + n) with many repeats, a sort otherwise).
 *
 * @example
 * differenceMatrix([4, 1], [9, 2, 3]).pairs; // 6
 */
export function differenceMatrix(first: ArrayLike<number>, second: ArrayLike<number>): DifferenceMatrix {
  const b = distinct(second);
  return { a: distinct(first), b, pairs: first.length * second.length, padded: withStop(b.values) };
}

/** Scratch arrays and sampling settings of one selection. */
interface Walks {
  lowEnds: Int32Array;
  highEnds: Int32Array;
  lowAtMostEnds: Int32Array;
  highAtMostEnds: Int32Array;
  random: () => number;
  gatherAt: number;
  size: number;
  bracket: number;
}

function walksFor(matrix: DifferenceMatrix, seed: number): Walks {
  const p = matrix.a.values.length;
  const q = matrix.b.values.length;
  const size = sampleSize(p + q);
  return {
    lowEnds: new Int32Array(p),
    highEnds: new Int32Array(p),
    lowAtMostEnds: new Int32Array(p),
    highAtMostEnds: new Int32Array(p),
    random: xorshift(0x9e3779b9 ^ p ^ (q << 7) ^ seed),
    gatherAt: Math.max(GATHER_MIN, (p + q) >> 2),
    size,
    bracket: 2 * Math.sqrt(size),
  };
}

function allCandidates(matrix: DifferenceMatrix): Candidates {
  const p = matrix.a.values.length;
  const q = matrix.b.values.length;
  return { left: new Int32Array(p), right: new Int32Array(p).fill(q - 1), count: matrix.pairs, cells: p * q, below: 0 };
}

/** The k-th smallest difference among the candidates (which must hold it), narrowing them in place. */
function selectAmong(matrix: DifferenceMatrix, c: Candidates, k: number, w: Walks): number {
  const { a, b, padded } = matrix;
  while (c.cells > w.gatherAt) {
    const sample = sampleCandidates(a, b, c, w.size, w.random);
    const target = ((k - c.below) / c.count) * w.size;
    const low = sample[Math.max(0, Math.floor(target - w.bracket))];
    const high = sample[Math.min(w.size - 1, Math.ceil(target + w.bracket))];
    // Each bracket end is a candidate and is either returned or left out, so every round makes progress
    // even when ties make many differences equal to an end.
    const atLow = countAround(a, padded, b.before, low, w.lowEnds, w.lowAtMostEnds);
    if (k <= atLow.less) {
      narrow(a, b, c, null, w.lowEnds);
      continue;
    }
    if (k <= atLow.atMost) return low;
    const atHigh = countAround(a, padded, b.before, high, w.highEnds, w.highAtMostEnds);
    if (k <= atHigh.less) narrow(a, b, c, w.lowAtMostEnds, w.highEnds);
    else if (k <= atHigh.atMost) return high;
    else narrow(a, b, c, w.highAtMostEnds, null);
  }
  return selectGathered(a, b, c, k);
}

/**
 * The k-th smallest (1-based) difference of the matrix, without forming the m·n differences. The caller
 * checks k and that the extreme differences are finite.
 *
 * @example
 * differenceOrderStatistic(differenceMatrix([1, 4], [2, 3, 9]), 2); // -1: the differences are 1, 2, 8, -2, -1, 5
 */
export function differenceOrderStatistic(matrix: DifferenceMatrix, k: number): number {
  return selectAmong(matrix, allCandidates(matrix), k, walksFor(matrix, k));
}

/**
 * Several order statistics at once (ranks 1-based, in any order), answered in the order asked. Bounds and
 * the estimate lie close together among the m·n differences, so the first rounds narrow the candidates
 * around all of them together (each round keeps what lies strictly between two sample values bracketing
 * the lowest and the highest rank), while that still halves them; each rank is then selected on its own
 * from a copy of what is left.
 *
 * @example
 * differenceOrderStatistics(differenceMatrix([1, 4], [2, 3, 9]), [5, 2]); // [5, -1]
 */
export function differenceOrderStatistics(matrix: DifferenceMatrix, ranks: readonly number[]): number[] {
  const { a, b, padded } = matrix;
  const lowest = Math.min(...ranks);
  const highest = Math.max(...ranks);
  const shared = allCandidates(matrix);
  const w = walksFor(matrix, lowest ^ highest);
  while (shared.cells > w.gatherAt) {
    const sample = sampleCandidates(a, b, shared, w.size, w.random);
    const low = sample[Math.max(0, Math.floor(((lowest - shared.below) / shared.count) * w.size - w.bracket))];
    const high = sample[Math.min(w.size - 1, Math.ceil(((highest - shared.below) / shared.count) * w.size + w.bracket))];
    const atLow = countAround(a, padded, b.before, low, w.lowEnds, w.lowAtMostEnds);
    const atHigh = countAround(a, padded, b.before, high, w.highEnds, w.highAtMostEnds);
    if (!(atLow.atMost < lowest && highest <= atHigh.less)) break; // a rank at or beyond an end: finish one by one
    const before = shared.cells;
    narrow(a, b, shared, w.lowAtMostEnds, w.highEnds);
    if (2 * shared.cells > before) break; // the ranks' own spread now bounds the band
  }
  return ranks.map((k) => {
    const own: Candidates = { ...shared, left: shared.left.slice(), right: shared.right.slice() };
    return selectAmong(matrix, own, k, w);
  });
}

/** The (k+1)-th smallest difference given the k-th, `value`: one staircase walk instead of a second selection. */
export function nextDifference(matrix: DifferenceMatrix, value: number, k: number): number {
  const { a, b } = matrix;
  const lessEnds = new Int32Array(a.values.length);
  const ends = new Int32Array(a.values.length);
  if (countAround(a, matrix.padded, b.before, value, lessEnds, ends).atMost >= k + 1) return value;
  let next = Infinity;
  for (let i = 0; i < a.values.length; i++)
    if (ends[i] < b.values.length && b.values[ends[i]] - a.values[i] < next) next = b.values[ends[i]] - a.values[i];
  return next;
}
