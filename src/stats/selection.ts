/**
 * Order statistics without sorting: puts the value of a given rank in its
 * sorted position, smaller values before it and larger after, in place.
 *
 * Method: R. W. Floyd and R. L. Rivest (1975), "Algorithm 489: The algorithm
 * SELECT — for finding the ith smallest of n elements", Communications of the
 * ACM 18(3), 173. A sample of about n^(2/3) values, gathered from evenly
 * spaced positions (no random numbers), is selected recursively to give a
 * pivot that lands within a few places of the target, so one partition of the
 * whole range almost always suffices. As in
 * D. R. Musser (1997), "Introspective sorting and selection algorithms",
 * Software: Practice and Experience 27(8), 983-993, a range that keeps failing
 * to shrink is finished by sorting, which bounds the worst case.
 *
 * Several ranks are placed by taking the outermost two first (they split the
 * array so that the rest lie in the short stretch between them).
 *
 * Ranks close together in a long array that must not be changed (confidence
 * bounds) are found without moving it (`valuesAtRanks`): the ranks of a small
 * evenly spaced sample give two values that bracket them with high probability
 * (the idea of Floyd and Rivest's sample, used as a filter as in R. Motwani and
 * P. Raghavan (1995), "Randomized Algorithms", Cambridge University Press,
 * section 3.3, "LazySelect", from memory); one read-only pass counts the
 * values below the bracket and gathers the few inside it, where the ranks are
 * then selected. A bracket that misses (an unlucky sample) costs one more pass
 * and a copy, never a wrong answer.
 *
 * Cost: O(n) expected time (about n + min(k, n - k) comparisons for one rank),
 * O(n log n) worst case, O(log n) stack, no allocation in place; valuesAtRanks
 * reads the array once and keeps about 3 n^(2/3) values.
 */

/** Above this range length the Floyd–Rivest sample is taken (the constant of the 1975 algorithm). */
const SAMPLE_ABOVE = 600;

function swap(data: Float64Array, i: number, j: number): void {
  const t = data[i];
  data[i] = data[j];
  data[j] = t;
}

function checkIndex(name: string, value: number, low: number, high: number): void {
  if (!Number.isInteger(value) || value < low || value > high) {
    throw new RangeError(`${name} must be an integer from ${low} to ${high}, got ${value}`);
  }
}

/** Moves the median of data[a], data[b], data[c] to position k. */
function medianOfThreeTo(data: Float64Array, a: number, b: number, c: number, k: number): void {
  const x = data[a];
  const y = data[b];
  const z = data[c];
  const m = x < y ? (y < z ? b : x < z ? c : a) : x < z ? a : y < z ? c : b;
  swap(data, m, k);
}

/**
 * Brings values from evenly spaced positions of data[left..left+size-1] into
 * the sample stretch. The 1975 algorithm samples the stretch as it lies,
 * which assumes random order; sorted, reversed or organ-pipe columns, common
 * in spreadsheets, would otherwise give a sample from the wrong part of the
 * distribution and a pivot far from the target.
 */
function spreadSample(data: Float64Array, left: number, size: number, sampleLeft: number, sampleRight: number): void {
  const m = sampleRight - sampleLeft + 1;
  for (let t = 0; t < m; t++) swap(data, sampleLeft + t, left + Math.floor((t * size) / m));
}

/** Floyd–Rivest on data[left..right] (inclusive); the caller has checked the indices. */
function floydRivest(data: Float64Array, left: number, right: number, k: number): void {
  // Musser's guard: a partition that keeps more than 3/4 of the range counts as a miss;
  // after a logarithmic number of misses the range is sorted instead.
  let misses = 0;
  const missLimit = 2 * Math.ceil(Math.log2(right - left + 2)) + 4;
  while (right > left) {
    const size = right - left + 1;
    if (misses > missLimit) {
      data.subarray(left, right + 1).sort();
      return;
    }
    if (size > SAMPLE_ABOVE) {
      // Sample of about size^(2/3) values around the target's expected position,
      // offset by about one standard deviation towards the nearer end.
      const i = k - left + 1;
      const z = Math.log(size);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (size - s)) / size) * (i < size / 2 ? -1 : 1);
      const sampleLeft = Math.max(left, Math.floor(k - (i * s) / size + sd));
      const sampleRight = Math.min(right, Math.floor(k + ((size - i) * s) / size + sd));
      spreadSample(data, left, size, sampleLeft, sampleRight);
      floydRivest(data, sampleLeft, sampleRight, k);
    } else {
      // Short ranges are left in whatever order earlier partitions made, often runs in order or
      // reversed, where data[k] can be an extreme; the median of three is a pivot that halves them.
      medianOfThreeTo(data, left, (left + right) >> 1, right, k);
    }
    const pivot = data[k];
    let i = left;
    let j = right;
    swap(data, left, k);
    if (data[right] > pivot) swap(data, left, right);
    while (i < j) {
      swap(data, i, j);
      i++;
      j--;
      while (data[i] < pivot) i++;
      while (data[j] > pivot) j--;
    }
    if (data[left] === pivot) swap(data, left, j);
    else {
      j++;
      swap(data, j, right);
    }
    const before = right - left;
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
    if (4 * (right - left) > 3 * before) misses++;
  }
}

/**
 * Rearranges `data[from..to]` (inclusive) so that `data[index]` holds the value
 * it would hold if that range were sorted ascending, with no larger value
 * before it and no smaller value after it. Returns that value.
 *
 * `index` is zero-based: index 0 is the minimum. NaN in the range gives an
 * unspecified order (callers reject NaN first). Throws RangeError for an index
 * outside the range.
 *
 * @example
 * const a = Float64Array.from([5, 1, 4, 2, 3]);
 * selectInPlace(a, 1); // 2, and a[0] === 1
 */
export function selectInPlace(data: Float64Array, index: number, from = 0, to = data.length - 1): number {
  checkIndex("from", from, 0, Math.max(0, data.length - 1));
  checkIndex("to", to, from, data.length - 1);
  checkIndex("index", index, from, to);
  floydRivest(data, from, to, index);
  return data[index];
}

/**
 * Places several zero-based ranks at once and returns their values, in the
 * order of `indices` (which may be unsorted and repeat). After the call every
 * requested position holds its sorted value, and each stretch between two
 * requested positions holds exactly the values of that stretch of the sorted
 * array (in some order).
 *
 * The two outermost ranks are placed first, over the whole array and then over
 * the part beyond the first; the others are then placed inside the stretch
 * between them, which for confidence bounds is short.
 *
 * @example
 * const a = Float64Array.from([9, 3, 7, 1, 5]);
 * selectManyInPlace(a, [1, 3]); // [3, 7]
 */
export function selectManyInPlace(data: Float64Array, indices: readonly number[]): number[] {
  for (const index of indices) checkIndex("index", index, 0, data.length - 1);
  const sorted = Array.from(new Set(indices)).sort((a, b) => a - b);
  placeSpan(data, sorted, 0, sorted.length - 1, 0, data.length - 1);
  return indices.map((index) => data[index]);
}

/** Places sorted[first..last] within data[from..to], outermost ranks first. */
function placeSpan(data: Float64Array, sorted: readonly number[], first: number, last: number, from: number, to: number): void {
  if (first > last) return;
  const low = sorted[first];
  floydRivest(data, from, to, low);
  if (first === last) return;
  const high = sorted[last];
  floydRivest(data, low + 1, to, high);
  placeSpan(data, sorted, first + 1, last - 1, low + 1, high - 1);
}

/** From this length on, valuesAtRanks tries the bracket before copying the whole array. */
const BRACKET_FROM = 1 << 14;

/** Runs the bracket's sample is read in (see `bracketed`). */
const SAMPLE_BLOCKS = 256;

/**
 * The values that the zero-based `ranks` would hold if `values` were sorted ascending, in the order of
 * `ranks` (which may repeat); `values` is not modified. Throws RangeError for a rank outside [0, n - 1]
 * or a value that is not a finite number.
 *
 * @example
 * valuesAtRanks([9, 3, 7, 1, 5], [1, 3]); // [3, 7]
 */
export function valuesAtRanks(values: ArrayLike<number>, ranks: readonly number[]): number[] {
  const n = values.length;
  for (const rank of ranks) checkIndex("rank", rank, 0, n - 1);
  if (ranks.length === 0) return [];
  if (n >= BRACKET_FROM) {
    const picked = bracketed(values, ranks);
    if (picked !== null) return picked;
  }
  return selectManyInPlace(finiteCopy(values), ranks);
}

/**
 * Throws RangeError naming the first value that is not a finite number: a caller's error (the cell layer
 * drops such values), checked by valuesAtRanks and by callers that end before selecting.
 *
 * @example
 * checkFinite([1, 2]);        // returns
 * checkFinite([1, Infinity]); // throws RangeError: value 1 is not a finite number (Infinity)
 */
export function checkFinite(values: ArrayLike<number>): void {
  for (let i = 0; i < values.length; i++) {
    const x = values[i];
    if (!Number.isFinite(x)) throw new RangeError(`value ${i} is not a finite number (${x})`);
  }
}

/** One copy of the data, its values checked to be finite. */
function finiteCopy(values: ArrayLike<number>): Float64Array {
  checkFinite(values);
  return Float64Array.from(values);
}

/**
 * The bracket: a sample of about n^(2/3) values from evenly spaced positions, the sample ranks three
 * standard deviations (of a sample rank, at most sqrt(s)/2) outside those expected for the lowest and the
 * highest wanted rank, and one pass. Null when the bracket misses or gathers far more than expected.
 */
function bracketed(values: ArrayLike<number>, ranks: readonly number[]): number[] | null {
  const n = values.length;
  const lowest = Math.min(...ranks);
  const highest = Math.max(...ranks);
  // The sample is read in SAMPLE_BLOCKS runs of neighbouring values at evenly spaced places: one cache miss
  // per run instead of one per value (scattered reads cost as much as the whole pass at n = 10^6). Even on
  // sorted data a run's values span only n / SAMPLE_BLOCKS ranks, well inside the margin below.
  const run = Math.ceil(n ** (2 / 3) / SAMPLE_BLOCKS);
  const size = run * SAMPLE_BLOCKS;
  const sample = new Float64Array(size);
  for (let b = 0, t = 0; b < SAMPLE_BLOCKS; b++) {
    const start = Math.floor((b * (n - run)) / (SAMPLE_BLOCKS - 1));
    for (let j = 0; j < run; j++) sample[t++] = values[start + j];
  }
  const margin = Math.ceil(1.5 * Math.sqrt(size));
  const lowRank = Math.floor((lowest * size) / n) - margin;
  const highRank = Math.ceil((highest * size) / n) + margin;
  const wantedInSample = [lowRank, highRank].filter((r) => r >= 0 && r < size);
  const [first, second] = selectManyInPlace(sample, wantedInSample);
  const low = lowRank >= 0 ? first : -Infinity;
  const high = highRank < size ? (lowRank >= 0 ? second : first) : Infinity;
  // Room for four times the share the sample leaves between the two values, at least a few thousand.
  const room = Math.max(4096, Math.ceil((4 * n * (Math.min(highRank, size - 1) - Math.max(lowRank, 0) + 1)) / size));
  const inside = new Float64Array(room + 1);
  let below = 0;
  let count = 0;
  let nonFinite = 0;
  let i = 0;
  while (i < n) {
    // A stretch short enough that `inside` cannot fill up within it, so the loop needs no check.
    const end = Math.min(n, i + room - count);
    if (end === i) return null; // far more inside than the sample promised: give up on the bracket
    // Branch-free: every value is written at the end of `inside`, which only advances past values between
    // the two; the side of a value is unpredictable, a branch on it would cost more than the write. Four
    // values a step spare loop overhead; x - x is 0 for a finite x and NaN otherwise.
    for (; i + 4 <= end; i += 4) {
      const x0 = values[i];
      const x1 = values[i + 1];
      const x2 = values[i + 2];
      const x3 = values[i + 3];
      const b0 = +(x0 < low);
      const b1 = +(x1 < low);
      const b2 = +(x2 < low);
      const b3 = +(x3 < low);
      below = (below + (b0 + b1) + (b2 + b3)) | 0;
      inside[count] = x0;
      count += 1 - (b0 | +(x0 > high));
      inside[count] = x1;
      count += 1 - (b1 | +(x1 > high));
      inside[count] = x2;
      count += 1 - (b2 | +(x2 > high));
      inside[count] = x3;
      count += 1 - (b3 | +(x3 > high));
      nonFinite |= +(x0 - x0 + (x1 - x1) + (x2 - x2) + (x3 - x3) !== 0);
    }
    for (; i < end; i++) {
      const x = values[i];
      const isBelow = +(x < low);
      below += isBelow;
      inside[count] = x;
      count += 1 - (isBelow | +(x > high));
      nonFinite |= +(x - x !== 0);
    }
  }
  if (nonFinite !== 0) checkFinite(values); // throws, naming the first such value
  if (below > lowest || below + count <= highest) return null;
  return selectManyInPlace(
    inside.subarray(0, count),
    ranks.map((rank) => rank - below),
  );
}
