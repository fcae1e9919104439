/**
 * The distinct values of a sample, ascending, with how often each occurs.
 *
 * Method: values recorded to a few decimals repeat a great deal, so they are first counted
 * in a hash table (open addressing with linear probing on the value's 64 bits, multiplied
 * by odd constants as in D. E. Knuth (1998), "The Art of Computer Programming, Vol. 3",
 * 2nd ed., section 6.4, multiplicative hashing, from memory) and only the distinct values
 * are sorted. When more than one value in eight is new the table is abandoned and the whole
 * sample is sorted (radix sort, ranks.ts) and run-length counted instead, which is then the
 * cheaper way. -0 and +0 count as one value (+0).
 *
 * Cost: O(n) expected time plus sorting the distinct values; O(n) memory at worst.
 */
import { sortFloat64 } from "./ranks";

export interface DistinctValues {
  /** Distinct values, ascending. */
  values: Float64Array;
  /** counts[i]: how many times values[i] occurs. */
  counts: Float64Array;
}

const BITS = new Float64Array(1);
const WORDS = new Uint32Array(BITS.buffer);

/** Run-length counts of an ascending array. */
function runLengths(sorted: Float64Array): DistinctValues {
  let p = 0;
  for (let i = 0; i < sorted.length; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) p++;
  const values = new Float64Array(p);
  const counts = new Float64Array(p);
  let d = -1;
  for (let i = 0; i < sorted.length; i++) {
    if (i === 0 || sorted[i] !== sorted[i - 1]) values[++d] = sorted[i] + 0;
    counts[d]++;
  }
  return { values, counts };
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
