/**
 * The distinct values of a sample, ascending, with how often each occurs.
 *
 * Method: values recorded to a few decimals repeat a great deal, so they are first counted
 * in a hash table (open addressing with linear probing on the value's 64 bits, multiplied
 * by odd constants as in D. E. Knuth (1998), "The Art of Computer Programming, Vol. 3",
 * 2nd ed., section 6.4, multiplicative hashing, from memory) and only the distinct values
 * are sorted. When more than one value in eight is new the table is abandoned and the whole
 * sample is sorted (radix sort, ranks.ts) and run-length counted instead, which is then the
 * cheaper way; a long sample whose first 1,024 values are mostly new goes that way at once.
 * -0 and +0 count as one value (+0).
 *
 * Cost: O(n) expected time plus sorting the distinct values; O(n) memory at worst.
 */
import { sortFloat64 } from "./ranks";

export interface DistinctValues {
  /** Distinct values, ascending. */
  values: Float64Array;
  /** counts[i]: how many times values[i] occurs. Read only: when no value repeats it is a shared run of ones. */
  counts: Float64Array;
}

/** Longest run of ones kept for samples without repeats (8 MB); a longer one is made for its call. */
const KEPT_ONES = 1 << 20;
let ones = new Float64Array(0);

/** n ones, shared between calls up to KEPT_ONES: allocating them afresh each time costs a collection of the engine's heap now and then. */
function onesOf(n: number): Float64Array {
  if (n > KEPT_ONES) return new Float64Array(n).fill(1);
  if (ones.length < n) ones = new Float64Array(n).fill(1);
  return ones.subarray(0, n);
}

const BITS = new Float64Array(1);
const WORDS = new Uint32Array(BITS.buffer);

/** Run-length counts of an ascending array (which becomes the values, -0 read as +0, when none repeats). */
function runLengths(sorted: Float64Array): DistinctValues {
  let p = 0;
  for (let i = 0; i < sorted.length; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) p++;
  if (p === sorted.length) {
    for (let i = 0; i < p; i++) sorted[i] += 0;
    return { values: sorted, counts: onesOf(p) };
  }
  const values = new Float64Array(p);
  const counts = new Float64Array(p);
  let d = -1;
  for (let i = 0; i < sorted.length; i++) {
    if (i === 0 || sorted[i] !== sorted[i - 1]) values[++d] = sorted[i] + 0;
    counts[d]++;
  }
  return { values, counts };
}

/** Values read to decide, for a long sample, whether counting in a table can pay. */
const PROBE = 1024;

/**
 * Whether the first PROBE values repeat so seldom that the sample likely holds more than n/8 distinct
 * values (the point where the table is abandoned): among r draws from D equally common values about
 * r²/(2D) repeat, so D > n/8 shows as fewer than 4r²/n repeats. Then the sample is sorted at once.
 */
function mostlyNew(sample: ArrayLike<number>): boolean {
  const keys = new Float64Array(2 * PROBE);
  const used = new Uint8Array(2 * PROBE);
  let found = 0;
  for (let i = 0; i < PROBE; i++) {
    const x = sample[i] + 0;
    BITS[0] = x;
    let slot = Math.imul(WORDS[0] ^ Math.imul(WORDS[1], 0x9e3779b1), 0x85ebca6b) >>> 21; // 11 bits: 2 * PROBE slots
    while (used[slot] !== 0 && keys[slot] !== x) slot = (slot + 1) & (2 * PROBE - 1);
    if (used[slot] === 0) {
      used[slot] = 1;
      keys[slot] = x;
      found++;
    }
  }
  return PROBE - found < (4 * PROBE * PROBE) / sample.length;
}

/**
 * Distinct values and their counts. Throws a RangeError on NaN.
 *
 * @example
 * distinctValues([50.2, 49.8, 50.2, -0, 0]); // values Float64Array [0, 49.8, 50.2], counts [2, 1, 2]
 */
export function distinctValues(sample: ArrayLike<number>): DistinctValues {
  const n = sample.length;
  for (let i = 0; i < n; i++) if (sample[i] !== sample[i]) throw new RangeError(`distinctValues: value ${i} is NaN`);
  if (n >= 8 * PROBE && mostlyNew(sample)) return runLengths(sortFloat64(Float64Array.from(sample)));
  const limit = Math.max(64, n >> 3);
  let bits = 6;
  while (1 << bits < 2 * limit) bits++;
  const size = 1 << bits;
  const mask = size - 1;
  const keys = new Float64Array(size);
  const counts = new Float64Array(size); // 0 marks an empty slot
  let found = 0;
  for (let i = 0; i < n; i++) {
    const x = sample[i] + 0;
    BITS[0] = x;
    let slot = Math.imul(WORDS[0] ^ Math.imul(WORDS[1], 0x9e3779b1), 0x85ebca6b) >>> (32 - bits);
    while (counts[slot] !== 0 && keys[slot] !== x) slot = (slot + 1) & mask;
    if (counts[slot] === 0) {
      if (++found > limit) return runLengths(sortFloat64(Float64Array.from(sample)));
      keys[slot] = x;
    }
    counts[slot]++;
  }
  const values = new Float64Array(found);
  for (let s = 0, d = 0; s < size; s++) if (counts[s] !== 0) values[d++] = keys[s];
  sortFloat64(values);
  const ordered = new Float64Array(found);
  for (let d = 0; d < found; d++) {
    const x = values[d];
    BITS[0] = x;
    let slot = Math.imul(WORDS[0] ^ Math.imul(WORDS[1], 0x9e3779b1), 0x85ebca6b) >>> (32 - bits);
    while (keys[slot] !== x) slot = (slot + 1) & mask;
    ordered[d] = counts[slot];
  }
  return { values, counts: ordered };
}
