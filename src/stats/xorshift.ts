/**
 * A small deterministic generator of uniform numbers in [0, 1): the 32-bit
 * xorshift with shifts 13, 17, 5 (G. Marsaglia (2003), "Xorshift RNGs",
 * Journal of Statistical Software 8(14)). Used for pivots in selection, where
 * reproducible runs matter more than statistical quality, and for the
 * generated data of tests and benchmarks.
 *
 * Cost: O(1) a draw.
 *
 * @example
 * const next = xorshift32(42);
 * next(); // a number in [0, 1), the same for every run seeded with 42
 */
export function xorshift32(seed: number): () => number {
  let state = seed >>> 0 || 1;
  return () => {
    state ^= state << 13;
    state >>>= 0;
    state ^= state >>> 17;
    state ^= state << 5;
    state >>>= 0;
    return state / 4294967296;
  };
}
