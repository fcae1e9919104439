/**
 * Sorting and ranking of doubles, for the rank tests and the Walsh-average selection.
 *
 * Method
 * - Sort: least-significant-digit radix sort on the 64-bit patterns, 11 bits per
 *   pass (six passes, 2,048 buckets; the high word's three first, finished by an
 *   insertion pass, when values seldom share their high 32 bits), through the order-preserving key map of
 *   P. M. Herf (2001), "Radix tricks" (flip every bit of a negative number, only
 *   the sign bit of a positive one), so that unsigned order of the keys is
 *   numeric order. A pass whose digit is
 *   the same for every key is skipped: integer-valued or short-decimal data often
 *   leave the low mantissa bits constant. The radix sort itself: H. H. Seward
 *   (1954), "Information sorting in the application of electronic digital
 *   computers to business operations", MIT report R-232 (counting sort per digit).
 *   Short arrays use the engine's typed-array sort, which wins below about a thousand.
 * - Midranks: the average of the ranks a tied group occupies, the usual treatment
 *   of ties in rank tests: M. G. Kendall (1945), "The treatment of ties in ranking
 *   problems", Biometrika 33, 239-251.
 *
 * Cost: sort O(n) time (six passes at most) with O(n) extra memory; midranks
 * O(n log n).
 */

/** Below this length the built-in sort is faster than the radix passes (measured crossover: about 1,000 values). */
const RADIX_MIN_LENGTH = 1024;

/** Digits of 11, 11 and 10 bits in each 32-bit half: 2,048 buckets keep the scatter within the cache. */
const PASSES = 6;
const BUCKETS = 2048;
const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;
/** Index of the low and high 32-bit halves of a double inside a Uint32Array view. */
const LO = LITTLE_ENDIAN ? 0 : 1;
const HI = 1 - LO;

/** Longest sort whose second buffer is kept for the next call (8 MB). */
const KEPT_SCRATCH = 1 << 20;
/**
 * The second buffer of the radix passes, kept between calls up to KEPT_SCRATCH values: a fresh buffer on
 * every call is memory outside the engine's heap, and enough of it makes the engine collect its whole heap,
 * which costs more than the sort when a sheet's ranges are held there.
 */
let scratch = new Float64Array(0);

/**
 * LSD radix sort of the doubles by their order-preserving keys (Herf 2001): for a negative number every bit
 * is flipped, for a positive one only the sign bit. The keys are computed on the fly from each double's
 * halves and never stored, so only real values are moved (as doubles): a stored key could look like a
 * NaN, whose bits an engine is free to change. When the low 32 bits would need passes, the three passes
 * of the high 32 bits (sign, exponent and 20 bits of fraction) come first alone: measurements with more
 * digits than that seldom share a high word, so an insertion pass then finishes the order in a few moves
 * per value; should it need more, all six passes run.
 */
function radixSort(values: Float64Array): void {
  const n = values.length;
  const words = new Uint32Array(values.buffer, values.byteOffset, 2 * n);
  const counts = new Uint32Array(PASSES * BUCKETS);
  for (let i = 0; i < n; i++) {
    const h = words[2 * i + HI];
    const flip = h >> 31; // all ones for a negative number
    const lo = (words[2 * i + LO] ^ flip) >>> 0;
    const hi = (h ^ (flip | 0x80000000)) >>> 0;
    counts[lo & 0x7ff]++;
    counts[BUCKETS + ((lo >>> 11) & 0x7ff)]++;
    counts[2 * BUCKETS + (lo >>> 22)]++;
    counts[3 * BUCKETS + (hi & 0x7ff)]++;
    counts[4 * BUCKETS + ((hi >>> 11) & 0x7ff)]++;
    counts[5 * BUCKETS + (hi >>> 22)]++;
  }
  if (scratch.length < n && n <= KEPT_SCRATCH) scratch = new Float64Array(n);
  const spare: Float64Array = n <= KEPT_SCRATCH ? scratch.subarray(0, n) : new Float64Array(n);
  let lowNeeded = false;
  for (let pass = 0; pass < 3; pass++) lowNeeded ||= !oneDigit(values, counts, pass);
  if (lowNeeded) {
    radixPasses(values, spare, counts.slice(), 3);
    if (finishedByInsertion(values, 8 * n)) return;
  }
  radixPasses(values, spare, counts, lowNeeded ? 0 : 3);
}

/** Whether every key has the same digit in this pass (then the pass would leave the order as it is). */
function oneDigit(values: Float64Array, counts: Uint32Array, pass: number): boolean {
  const bits = new Uint32Array(values.buffer, values.byteOffset, 2);
  const flip = bits[HI] >> 31;
  const key = pass < 3 ? bits[LO] ^ flip : bits[HI] ^ (flip | 0x80000000);
  return counts[pass * BUCKETS + ((key >>> ((pass % 3) * 11)) & 0x7ff)] === values.length;
}

/** The LSD passes from `firstPass` to the last, skipping digits every key shares; the order ends up in `values`. */
function radixPasses(values: Float64Array, spare: Float64Array, counts: Uint32Array, firstPass: number): void {
  const n = values.length;
  let source: Float64Array = values;
  let target: Float64Array = spare;
  for (let pass = firstPass; pass < PASSES; pass++) {
    const base = pass * BUCKETS;
    const word = pass < 3 ? LO : HI;
    const shift = (pass % 3) * 11;
    if (oneDigit(source, counts, pass)) continue; // one digit everywhere: order unchanged
    const bits = new Uint32Array(source.buffer, source.byteOffset, 2 * n);
    let offset = 0;
    for (let d = 0; d < BUCKETS; d++) {
      const c = counts[base + d];
      counts[base + d] = offset;
      offset += c;
    }
    if (word === LO) {
      for (let i = 0; i < n; i++) {
        const d = (((bits[2 * i + LO] ^ (bits[2 * i + HI] >> 31)) >>> shift) & 0x7ff) + base;
        target[counts[d]++] = source[i];
      }
    } else {
      for (let i = 0; i < n; i++) {
        const h = bits[2 * i + HI];
        const d = (((h ^ ((h >> 31) | 0x80000000)) >>> shift) & 0x7ff) + base;
        target[counts[d]++] = source[i];
      }
    }
    const swap = source;
    source = target;
    target = swap;
  }
  if (source !== values) values.set(source);
}

/** Insertion sort of nearly sorted values in place; false (still a permutation) once it would take more than `budget` moves. */
function finishedByInsertion(values: Float64Array, budget: number): boolean {
  let moves = 0;
  for (let k = 1; k < values.length; k++) {
    const x = values[k];
    if (!(x < values[k - 1])) continue;
    let j = k - 1;
    while (j >= 0 && values[j] > x) {
      values[j + 1] = values[j];
      j--;
    }
    values[j + 1] = x;
    moves += k - 1 - j;
    if (moves > budget) return false;
  }
  return true;
}

/**
 * Sorts `values` ascending in place and returns it. Throws a RangeError on NaN (which has no place in an order).
 * -0 sorts before +0, as in `Float64Array.prototype.sort`; the two still compare equal.
 *
 * @example
 * sortFloat64(new Float64Array([3, -1, 2.5, -Infinity])); // Float64Array [-Infinity, -1, 2.5, 3]
 */
export function sortFloat64(values: Float64Array): Float64Array {
  const n = values.length;
  for (let i = 0; i < n; i++) if (values[i] !== values[i]) throw new RangeError(`sortFloat64: value ${i} is NaN`);
  if (n < RADIX_MIN_LENGTH) values.sort();
  else radixSort(values);
  return values;
}

/** First index in sorted[0..n) whose value is >= x (or > x when `strict`). */
function bound(sorted: Float64Array, x: number, strict: boolean): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid] < x || (strict && sorted[mid] === x)) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Ranks 1..n of the values in their original order, tied values sharing the mean of the ranks they occupy.
 * Throws a RangeError on NaN.
 *
 * @example
 * midranks([10, 30, 20, 30]); // Float64Array [1, 3.5, 2, 3.5]
 */
export function midranks(values: ArrayLike<number>): Float64Array {
  const sorted = sortFloat64(Float64Array.from(values));
  const n = sorted.length;
  const ranks = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = values[i];
    const below = bound(sorted, x, false);
    const atOrBelow = bound(sorted, x, true);
    ranks[i] = (below + 1 + atOrBelow) / 2;
  }
  return ranks;
}

/** Two sorted samples ranked together, by tie group: what the rank-sum and signed-rank tests need. */
export interface MergedRanks {
  /** Twice the sum of the mid-ranks of the second sample: an integer, so exact in a double up to 2^53. */
  readonly twiceSecondRankSum: number;
  /** Sum of t^3 - t over the tie groups (t values sharing one value), for the tie-corrected variance. */
  readonly tieSum: number;
  /** Per tie group, in increasing value: twice its mid-rank, its size, and how many of it come from the second sample (empty unless kept). */
  readonly groupScores: number[];
  readonly groupSizes: number[];
  readonly groupSecond: number[];
}

/**
 * Ranks two ascending samples as one, in a single merge: the values equal
 * across both samples form one tie group sharing its mid-rank (Kendall,
 * 1945). Ranks start after `ranksBefore` (the zeros Pratt's rule ranks
 * first). Cost O(m + n); the groups are kept only when asked for.
 *
 * @example
 * mergeRanks(Float64Array.of(1, 3), Float64Array.of(3, 4));
 * // { twiceSecondRankSum: 13, tieSum: 6, groupScores: [2, 5, 8], groupSizes: [1, 2, 1], groupSecond: [0, 1, 1] }
 */
export function mergeRanks(first: Float64Array, second: Float64Array, ranksBefore = 0, keepGroups = true): MergedRanks {
  const m = first.length;
  const n = second.length;
  const groupScores: number[] = [];
  const groupSizes: number[] = [];
  const groupSecond: number[] = [];
  let rank = ranksBefore;
  let twiceSecondRankSum = 0;
  let tieSum = 0;
  let i = 0;
  let j = 0;
  while (i < m || j < n) {
    const v = i < m && (j >= n || first[i] <= second[j]) ? first[i] : second[j];
    let tFirst = 0;
    while (i < m && first[i] === v) {
      i++;
      tFirst++;
    }
    let tSecond = 0;
    while (j < n && second[j] === v) {
      j++;
      tSecond++;
    }
    const t = tFirst + tSecond;
    const score = 2 * rank + t + 1; // twice the mid-rank of ranks rank+1..rank+t
    twiceSecondRankSum += tSecond * score;
    if (t > 1) tieSum += t * t * t - t;
    if (keepGroups) {
      groupScores.push(score);
      groupSizes.push(t);
      groupSecond.push(tSecond);
    }
    rank += t;
  }
  return { twiceSecondRankSum, tieSum, groupScores, groupSizes, groupSecond };
}

/**
 * Greatest common divisor of two non-negative integers held in doubles
 * (Euclid), to scale doubled mid-rank scores down to the smallest grid the
 * exact distributions need.
 *
 * @example
 * greatestCommonDivisor(12, 18); // 6
 */
export function greatestCommonDivisor(a: number, b: number): number {
  let x = a;
  let y = b;
  while (y !== 0) {
    const r = x % y;
    x = y;
    y = r;
  }
  return x;
}
