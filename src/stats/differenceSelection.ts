/**
 * Order statistics of the m·n differences second[j] − first[i] of two samples, without
 * forming them.
 *
 * Method: with both samples in order, the differences form a matrix whose rows (one per
 * first value) increase along the columns and whose columns decrease down the rows, so
 * the number of differences below any value is counted in one walk along the matrix's
 * staircase: D. B. Johnson and T. Mizoguchi (1978), "Selecting the Kth element in X + Y
 * and X1 + X2 + ... + Xm", SIAM Journal on Computing 7(2), 147-153 (pages from memory).
 * Equal values are merged first (distinctValues.ts), each distinct value carrying its count,
 * so the matrix has one row and one column per distinct value and every walk costs the
 * number of distinct values: measurements recorded to a few decimals (the usual spreadsheet
 * column) repeat a great deal. Floating-point subtraction is monotone in each operand, which
 * is all the counts need.
 * - Many distinct values (20,000 or more in all): the samples are thinned to one value in ten
 *   (drawn at random from each block of ten consecutive ones, weighted by the block), the
 *   thinned matrix's differences a few standard errors either side of each wanted rank are
 *   selected (by the same method, a tenth of the size), and one walk per rank over the full
 *   matrix counts at those two values and gathers the cells between them, among which the
 *   rank is selected. Without repeats that is one walk per rank instead of several rounds.
 * - Otherwise, and whenever a bracket misses: rounds that bracket the wanted rank between two
 *   values of a stratified random sample of the differences still in play, as R. W. Floyd and
 *   R. L. Rivest (1975), "Expected time bounds for selection", CACM 18, 165-172, do for plain
 *   selection, the rows' candidate ranges shrinking to the bracket; when few remain they are
 *   gathered and selected directly. On data with many repeats the one-sample Walsh averages
 *   (hodgesLehmann.ts) are bracketed by this module too, as differences x_j − (−x_i).
 *
 * Cost: O((p + q) log(p + q)) expected time per selection once the distinct values are
 * found, p and q their numbers (at most m and n), and in practice a few walks of p + q steps;
 * O(m + n) memory. */
import { distinctValues } from "./distinctValues";
import { selectInPlace } from "./selection";
import { xorshift32 as xorshift } from "./xorshift";

/** Distinct values of a sample with their counts, and the running totals of the counts. */
interface Distinct {
  values: Float64Array;
  counts: Float64Array;
  /** before[j]: how many sample values lie before distinct value j (length + 1 entries). */
  before: Float64Array;
  /** Whether every count is 1 (no value repeats). */
  single: boolean;
}

/** Longest run 0, 1, 2, ... kept for samples without repeats (8 MB). */
const KEPT_COUNTS = 1 << 20;
let naturals = new Float64Array(0);

function distinct(sample: ArrayLike<number>): Distinct {
  const { values, counts } = distinctValues(sample);
  const p = values.length;
  const single = p === sample.length;
  if (single && p < KEPT_COUNTS) {
    // Without repeats before[j] is j: one shared run serves every call (fresh memory outside the engine's heap makes it collect).
    if (naturals.length <= p) naturals = Float64Array.from({ length: 2 * p + 1 }, (_, j) => j);
    return { values, counts, before: naturals.subarray(0, p + 1), single };
  }
  const before = new Float64Array(p + 1);
  for (let j = 0; j < p; j++) before[j + 1] = before[j] + counts[j];
  return { values, counts, before, single };
}

/**
 * The differences still in play: row i (second values less the i-th distinct first value) keeps distinct
 * columns left[i] up to (not including) stop[i], and every difference in play lies strictly between `low`
 * and `high`. `count` weighs each cell by how many pairs it stands for.
 */
interface Candidates {
  left: Int32Array;
  stop: Int32Array;
  /** Pairs in play. */
  count: number;
  /** Cells (distinct pairs) in play. */
  cells: number;
  /** Pairs known to be smaller than every one in play. */
  below: number;
  /** −∞ and +∞ until that side has been cut. */
  low: number;
  high: number;
}

/**
 * Candidates drawn per sampling round: about half the distinct values, from 256 to 4096, so that drawing and
 * sorting the sample costs about as much as the walks it saves. The bracket kept is 4 sqrt(size) sample ranks
 * wide (four standard deviations of the target's sample rank each side), so a round keeps 1/4 to 1/16.
 */
function sampleSize(distinctValues: number): number {
  let size = 256;
  while (size < 4096 && 2 * size <= distinctValues / 2) size *= 2;
  return size;
}
/** Below this many cells in play (or (p + q)/4, if larger) they are gathered: a further round costs a walk over p rows. */
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

/** Pairs in play in row i. */
function rowPairs(a: Distinct, b: Distinct, c: Candidates, i: number): number {
  return c.stop[i] > c.left[i] ? a.counts[i] * (b.before[c.stop[i]] - b.before[c.left[i]]) : 0;
}

/**
 * `sample.length` pairs drawn at random from those in play, one from each of as many equal stretches of
 * them in row order (a stratified sample: its quantiles err less than those of independent draws, and its
 * positions come in order, so no sorting is needed), written as differences into `sample`.
 */
function sampleCandidates(a: Distinct, b: Distinct, c: Candidates, sample: Float64Array, random: () => number): void {
  const size = sample.length;
  const stretch = c.count / size;
  let row = 0;
  let start = 0; // pairs in play in rows before `row`
  let width = rowPairs(a, b, c, 0);
  for (let s = 0; s < size; s++) {
    const position = Math.min(c.count - 1, Math.floor((s + random()) * stretch));
    while (position - start >= width) {
      start += width;
      row++;
      width = rowPairs(a, b, c, row);
    }
    const offset = Math.floor((position - start) / a.counts[row]) + b.before[c.left[row]];
    sample[s] = b.values[columnAt(b.before, c.left[row], c.stop[row] - 1, offset)] - a.values[row];
  }
}

/** What one walk found about a value: pairs below it and at most it, and cells in play on either side. */
interface Count {
  less: number;
  atMost: number;
  cellsBelow: number;
  cellsAbove: number;
}

/**
 * For every row, the first column whose difference is >= value (written to `lessEnds`) and the first whose
 * difference is > value (`atMostEnds`). `value` must lie strictly between c.low and c.high, so both
 * boundaries lie among the row's columns in play or just after them: the walk starts at the row's first
 * column in play and stops at its stop. Both boundaries only move right as the row's first value grows,
 * so a walk also starts where the row above ended: the walks cost at most p + q for the whole matrix, and
 * about p once the rows in play are narrow.
 */
function countAround(a: Distinct, b: Distinct, c: Candidates, value: number, lessEnds: Int32Array, atMostEnds: Int32Array): Count {
  const first = a.values;
  const weights = a.counts;
  const second = b.values;
  const before = b.before;
  const left = c.left;
  const stop = c.stop;
  const p = first.length;
  let j = 0;
  let k = 0;
  let less = 0;
  let atMost = 0;
  let cellsBelow = 0;
  let cellsAbove = 0;
  for (let i = 0; i < p; i++) {
    const x = first[i];
    const start = left[i];
    const end = stop[i];
    if (j < start) j = start;
    while (j < end && second[j] - x < value) j++;
    if (k < j) k = j;
    while (k < end && second[k] - x <= value) k++;
    lessEnds[i] = j;
    atMostEnds[i] = k;
    less += weights[i] * before[j];
    atMost += weights[i] * before[k];
    if (end > start) {
      cellsBelow += j - start;
      cellsAbove += end - k;
    }
  }
  return { less, atMost, cellsBelow, cellsAbove };
}

/** The cells in play, selected directly: sorted by value, their pair counts summed up to the wanted rank. */
function selectGathered(a: Distinct, b: Distinct, c: Candidates, k: number): number {
  const values = new Float64Array(c.cells);
  let at = 0;
  for (let i = 0; i < c.left.length; i++) {
    const x = a.values[i];
    for (let j = c.left[i]; j < c.stop[i]; j++) values[at++] = b.values[j] - x;
  }
  if (a.single && b.single) return selectInPlace(values, k - c.below - 1); // every cell one pair: plain selection
  const weights = new Float64Array(c.cells);
  at = 0;
  for (let i = 0; i < c.left.length; i++) for (let j = c.left[i]; j < c.stop[i]; j++) weights[at++] = a.counts[i] * b.counts[j];
  return selectWeighted(values, weights, c.below, k);
}

/**
 * The k-th pair among gathered cells that stand for `weights` pairs each, `below` pairs lying below them
 * all: selection by three-way partition around the middle of three values, keeping the side whose weight
 * holds rank k (C. A. R. Hoare (1961), "Algorithm 65: Find", CACM 4, 321-322). Expected O(cells); the
 * arrays are reordered.
 */
function selectWeighted(values: Float64Array, weights: Float64Array, below: number, k: number): number {
  let from = 0;
  let to = values.length; // exclusive
  let reached = below; // pairs before values[from]
  while (to - from > 1) {
    const pivot = medianOfThree(values[from], values[(from + to) >>> 1], values[to - 1]);
    // [from, lt): < pivot, [lt, i): = pivot, [gt, to): > pivot
    let lt = from;
    let i = from;
    let gt = to;
    while (i < gt) {
      const v = values[i];
      if (v < pivot) swap(values, weights, lt++, i++);
      else if (v > pivot) swap(values, weights, i, --gt);
      else i++;
    }
    let lessWeight = 0;
    for (let t = from; t < lt; t++) lessWeight += weights[t];
    let equalWeight = 0;
    for (let t = lt; t < gt; t++) equalWeight += weights[t];
    if (k <= reached + lessWeight) to = lt;
    else if (k <= reached + lessWeight + equalWeight) return pivot;
    else {
      reached += lessWeight + equalWeight;
      from = gt;
    }
  }
  if (to - from === 1 && k <= reached + weights[from]) return values[from];
  throw new Error("differenceOrderStatistic: the rank lies outside the gathered cells");
}

function medianOfThree(x: number, y: number, z: number): number {
  return Math.max(Math.min(x, y), Math.min(Math.max(x, y), z));
}

function swap(values: Float64Array, weights: Float64Array, i: number, j: number): void {
  const v = values[i];
  values[i] = values[j];
  values[j] = v;
  const w = weights[i];
  weights[i] = weights[j];
  weights[j] = w;
}

/** Two sorted samples with their equal values merged: the implicit matrix of differences, ready for selection. */
export interface DifferenceMatrix {
  readonly a: Distinct;
  readonly b: Distinct;
  /** m·n, the number of differences. */
  readonly pairs: number;
  /** Four rows of p column indices that every selection on this matrix reuses (the cuts swap them about). */
  readonly rows: readonly Int32Array[];
}

/**
 * The implicit matrix of second[j] − first[i] for samples of finite values (in any order), for any number
 * of selections (distinctValues.ts: O(m + n) with many repeats, a sort otherwise).
 *
 * @example
 * differenceMatrix([4, 1], [9, 2, 3]).pairs; // 6
 */
export function differenceMatrix(first: ArrayLike<number>, second: ArrayLike<number>): DifferenceMatrix {
  return matrixOf(distinct(first), distinct(second), first.length * second.length);
}

function matrixOf(a: Distinct, b: Distinct, pairs: number): DifferenceMatrix {
  const p = a.values.length;
  return { a, b, pairs, rows: [new Int32Array(p), new Int32Array(p), new Int32Array(p), new Int32Array(p)] };
}

/** Scratch rows and search settings of one selection; a cut swaps its rows with the candidates' (no copying). */
interface Walks {
  lessEnds: Int32Array;
  atMostEnds: Int32Array;
  random: () => number;
  gatherAt: number;
  sample: Float64Array;
  bracket: number;
}

function walksFor(matrix: DifferenceMatrix, seed: number): Walks {
  const p = matrix.a.values.length;
  const q = matrix.b.values.length;
  const size = sampleSize(p + q);
  return {
    lessEnds: matrix.rows[0],
    atMostEnds: matrix.rows[1],
    random: xorshift(0x9e3779b9 ^ p ^ (q << 7) ^ seed),
    gatherAt: Math.max(GATHER_MIN, (p + q) >> 2),
    sample: new Float64Array(size),
    bracket: 2 * Math.sqrt(size),
  };
}

/** Every difference in play, in the matrix's third and fourth rows (the walks use the first two). */
function allCandidates(matrix: DifferenceMatrix): Candidates {
  const c: Candidates = { left: matrix.rows[2], stop: matrix.rows[3], count: 0, cells: 0, below: 0, low: 0, high: 0 };
  return reset(matrix, c);
}

/** Puts every difference back in play, in the rows the candidates hold. */
function reset(matrix: DifferenceMatrix, c: Candidates): Candidates {
  const q = matrix.b.values.length;
  c.left.fill(0);
  c.stop.fill(q);
  c.count = matrix.pairs;
  c.cells = matrix.a.values.length * q;
  c.below = 0;
  c.low = -Infinity;
  c.high = Infinity;
  return c;
}

/** Keeps the candidates below the value just counted: the walk's lessEnds become the rows' stops. */
function keepBelow(c: Candidates, w: Walks, at: Count, value: number): void {
  [c.stop, w.lessEnds] = [w.lessEnds, c.stop];
  c.count = at.less - c.below;
  c.cells = at.cellsBelow;
  c.high = value;
}

/** Keeps the candidates above the value just counted: the walk's atMostEnds become the rows' starts. */
function keepAbove(c: Candidates, w: Walks, at: Count, value: number): void {
  [c.left, w.atMostEnds] = [w.atMostEnds, c.left];
  c.count = c.below + c.count - at.atMost;
  c.below = at.atMost;
  c.cells = at.cellsAbove;
  c.low = value;
}

/**
 * Two values in play that bracket the ranks lowest..highest (1-based, among all pairs) with high probability,
 * selected from a sample of the cells in play at the ranks' sample positions less and plus the bracket.
 */
function sampledPivots(matrix: DifferenceMatrix, c: Candidates, lowest: number, highest: number, w: Walks): number[] {
  const sample = w.sample;
  const size = sample.length;
  sampleCandidates(matrix.a, matrix.b, c, sample, w.random);
  const lowAt = Math.max(0, Math.floor(((lowest - c.below) / c.count) * size - w.bracket));
  const highAt = Math.max(lowAt, Math.min(size - 1, Math.ceil(((highest - c.below) / c.count) * size + w.bracket)));
  const low = selectInPlace(sample, lowAt);
  return [low, selectInPlace(sample, highAt, lowAt, size - 1)];
}

/**
 * Narrows the candidates in place around the ranks lowest..highest (which they must hold) until at most
 * w.gatherAt cells remain or, for several ranks, a round no longer halves them. A round cuts at two values
 * meant to bracket the ranks, `first` when given (the first round), otherwise read from a random sample of
 * the cells in play. A cut among the ranks is skipped; every other cut leaves out at least the cells at its
 * value, so a sampled round always makes progress. Returns the value when a single rank is found at a cut,
 * otherwise null.
 */
function narrowAround(matrix: DifferenceMatrix, c: Candidates, lowest: number, highest: number, w: Walks, first?: number[]): number | null {
  const { a, b } = matrix;
  let pivots = first;
  while (c.cells > w.gatherAt) {
    const cellsBefore = c.cells;
    const [low, high] = pivots ?? sampledPivots(matrix, c, lowest, highest, w);
    pivots = undefined;
    for (const value of low === high ? [low] : [low, high]) {
      if (!(c.low < value && value < c.high)) continue;
      const at = countAround(a, b, c, value, w.lessEnds, w.atMostEnds);
      if (highest <= at.less) keepBelow(c, w, at, value);
      else if (at.atMost < lowest) keepAbove(c, w, at, value);
      else if (lowest === highest) return value; // less < k <= atMost: the k-th difference is this value
    }
    if (lowest < highest && 2 * c.cells > cellsBefore) break; // the ranks' own spread now bounds the band
  }
  return null;
}

/** The k-th smallest difference among the candidates (which must hold it), narrowing them in place. */
function selectAmong(matrix: DifferenceMatrix, c: Candidates, k: number, w: Walks, first?: number[]): number {
  return narrowAround(matrix, c, k, k, w, first) ?? selectGathered(matrix.a, matrix.b, c, k);
}

/** From this many distinct values in all, the ranks' first brackets come from a thinned matrix (thinnedGroups). */
const THIN_FROM = 20_000;
/** Distinct values per block of the thinned matrix. */
const THIN_STRIDE = 10;

/**
 * One value drawn at random from each block of `stride` consecutive distinct values, carrying the block's
 * count: a sample standing for the whole, whose difference matrix has the same number of pairs.
 */
function thinOut(d: Distinct, stride: number, random: () => number): Distinct {
  const blocks = Math.ceil(d.values.length / stride);
  const values = new Float64Array(blocks);
  const counts = new Float64Array(blocks);
  const before = new Float64Array(blocks + 1);
  for (let u = 0; u < blocks; u++) {
    const start = u * stride;
    const size = Math.min(stride, d.values.length - start);
    values[u] = d.values[start + Math.floor(random() * size)];
    counts[u] = d.before[start + size] - d.before[start];
    before[u + 1] = before[u] + counts[u];
  }
  return { values, counts, before, single: stride === 1 && d.single };
}

/** Ranks close enough to share one band (their brackets overlap), with the two values bracketing them. */
interface RankGroup {
  ranks: number[];
  low: number;
  high: number;
}

/**
 * Brackets for the ranks from a thinned matrix: every block of THIN_STRIDE consecutive distinct values of
 * each sample stands in for the block (one member drawn at random, weighted by the block's count), and the
 * thinned matrix's differences at ranks lowest − margin and highest + margin of each group of close ranks
 * are selected (recursively, so by the same method at a tenth of the size). Counting pairs below a value in
 * the thinned matrix errs, for the rows, by the spread of the counts within each block of rows, at random
 * in sign: about stride² / sqrt(12) pairs per block at the middle, sqrt(p / stride) blocks' worth in all;
 * likewise for the columns. The margin is three of those standard errors, so the two values usually
 * bracket the ranks among the full matrix's differences within a band small enough to gather at once:
 * about 2·10^4 cells for two samples of 10^5 distinct values. Null for smaller matrices.
 */
function thinnedGroups(matrix: DifferenceMatrix, ranks: readonly number[], random: () => number): RankGroup[] | null {
  const p = matrix.a.values.length;
  const q = matrix.b.values.length;
  if (p + q < THIN_FROM || Math.min(p, q) < THIN_STRIDE * THIN_STRIDE) return null;
  const thin = matrixOf(thinOut(matrix.a, THIN_STRIDE, random), thinOut(matrix.b, THIN_STRIDE, random), matrix.pairs);
  const pairsPerCell = matrix.pairs / (p * q);
  const spread = (THIN_STRIDE * THIN_STRIDE) / Math.sqrt(12);
  const margin = Math.ceil(3 * pairsPerCell * spread * Math.hypot(Math.sqrt(p / THIN_STRIDE), Math.sqrt(q / THIN_STRIDE)));
  const groups: number[][] = [];
  for (const k of [...new Set(ranks)].sort((x, y) => x - y)) {
    const last = groups[groups.length - 1];
    if (last !== undefined && k - last[last.length - 1] <= 2 * margin) last.push(k);
    else groups.push([k]);
  }
  const ends = groups.flatMap((g) => [Math.max(1, g[0] - margin), Math.min(matrix.pairs, g[g.length - 1] + margin)]);
  const values = differenceOrderStatistics(thin, ends);
  // A bracket reaching past the first or last difference is open on that side, so that it holds the extreme ranks too.
  return groups.map((g, r) => ({
    ranks: g,
    low: g[0] - margin < 1 ? -Infinity : values[2 * r],
    high: g[g.length - 1] + margin > matrix.pairs ? Infinity : values[2 * r + 1],
  }));
}

/** The cells strictly between a group's two values, and the pairs at or below the lower and below the upper. */
interface Band {
  values: Float64Array;
  weights: Float64Array | null;
  atMostLow: number;
  lessHigh: number;
}

/**
 * One walk over the rows: the count of pairs at or below `low` and below `high` (two boundaries per row,
 * each moving only right as the rows go), and the cells between them, gathered as it goes. Null when the
 * cells pass `cap` (the rounds then take over). Costs 2 (p + q) steps and the cells gathered.
 */
function gatherBand(matrix: DifferenceMatrix, low: number, high: number, cap: number): Band | null {
  const { a, b } = matrix;
  const first = a.values;
  const second = b.values;
  const before = b.before;
  const p = first.length;
  const q = second.length;
  const single = a.single && b.single;
  let values: Float64Array = new Float64Array(1024);
  let weights: Float64Array | null = single ? null : new Float64Array(1024);
  let size = 0;
  let j = 0;
  let h = 0;
  let atMostLow = 0;
  let lessHigh = 0;
  for (let i = 0; i < p; i++) {
    const x = first[i];
    while (j < q && second[j] - x <= low) j++;
    if (h < j) h = j;
    while (h < q && second[h] - x < high) h++;
    const weight = a.counts[i];
    atMostLow += weight * before[j];
    lessHigh += weight * before[h];
    if (h === j) continue;
    if (size + h - j > values.length) {
      if (size + h - j > cap) return null;
      values = grown(values, size + h - j);
      if (weights !== null) weights = grown(weights, size + h - j);
    }
    if (weights !== null) for (let c = j, at = size; c < h; c++) weights[at++] = weight * b.counts[c];
    for (let c = j; c < h; c++) values[size++] = second[c] - x;
  }
  return { values: values.subarray(0, size), weights: weights === null ? null : weights.subarray(0, size), atMostLow, lessHigh };
}

/** A copy of `array` with room for at least `needed` values (doubling). */
function grown(array: Float64Array, needed: number): Float64Array {
  let length = array.length;
  while (length < needed) length *= 2;
  const bigger = new Float64Array(length);
  bigger.set(array);
  return bigger;
}

/**
 * The k-th smallest (1-based) difference of the matrix, without forming the m·n differences. The caller
 * checks k and that the extreme differences are finite.
 *
 * @example
 * differenceOrderStatistic(differenceMatrix([1, 4], [2, 3, 9]), 2); // -1: the differences are 1, 2, 8, -2, -1, 5
 */
export function differenceOrderStatistic(matrix: DifferenceMatrix, k: number): number {
  return differenceOrderStatistics(matrix, [k])[0];
}

/**
 * Several order statistics at once (ranks 1-based, in any order), answered in the order asked. For large
 * samples the ranks, grouped where close, get brackets from a thinned matrix (thinnedGroups), and one walk
 * over the rows per group counts at its bracket and gathers the cells inside (gatherBand): each rank a bracket
 * holds is selected among its gathered cells; any other starts the rounds from its bracket's values.
 * Otherwise the bounds and the estimate, which lie close together among the m·n differences, are first
 * narrowed together, while that still halves the cells, and each rank is then selected on its own from a
 * copy of what is left.
 *
 * @example
 * differenceOrderStatistics(differenceMatrix([1, 4], [2, 3, 9]), [5, 2]); // [5, -1]
 */
export function differenceOrderStatistics(matrix: DifferenceMatrix, ranks: readonly number[]): number[] {
  const lowest = Math.min(...ranks);
  const highest = Math.max(...ranks);
  const w = walksFor(matrix, lowest ^ highest);
  const groups = thinnedGroups(matrix, ranks, w.random);
  if (groups !== null) {
    const found = new Map<number, number>();
    let c: Candidates | null = null;
    groups.forEach((group) => {
      const band = gatherBand(matrix, group.low, group.high, 8 * w.gatherAt);
      for (const k of group.ranks) {
        if (band !== null && band.atMostLow < k && k <= band.lessHigh) {
          found.set(
            k,
            band.weights === null
              ? selectInPlace(band.values, k - band.atMostLow - 1)
              : selectWeighted(band.values, band.weights, band.atMostLow, k),
          );
        } else {
          c = c === null ? allCandidates(matrix) : reset(matrix, c);
          found.set(k, selectAmong(matrix, c, k, w, [group.low, group.high]));
        }
      }
    });
    return ranks.map((k) => found.get(k) as number);
  }
  const shared = allCandidates(matrix);
  if (lowest < highest) narrowAround(matrix, shared, lowest, highest, w);
  return ranks.map((k) => selectAmong(matrix, { ...shared, left: shared.left.slice(), stop: shared.stop.slice() }, k, w));
}
