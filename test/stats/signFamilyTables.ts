/**
 * Published tables used as outside sources by the sign-test and bound tests.
 */

// M. F. Triola, "Elementary Statistics" (Pearson), Appendix A, Table A-7 "Critical Values for the Sign Test"
// (p. 741 in the copy the values were taken from; edition not identified, so treat them as from memory). Columns: two-tailed alpha 0.01, 0.02, 0.05, 0.10
// (one-tailed 0.005, 0.01, 0.025, 0.05). Entry: reject H0 when the count of the less frequent sign is <= it;
// null marks "not possible to reject". Each entry is also confirmed below by exact arithmetic.
export const TRIOLA_A7: Record<number, readonly (number | null)[]> = {
  1: [null, null, null, null],
  2: [null, null, null, null],
  3: [null, null, null, null],
  4: [null, null, null, null],
  5: [null, null, null, 0],
  6: [null, null, 0, 0],
  7: [null, 0, 0, 0],
  8: [0, 0, 0, 1],
  9: [0, 0, 1, 1],
  10: [0, 0, 1, 1],
  11: [0, 1, 1, 2],
  12: [1, 1, 2, 2],
  13: [1, 1, 2, 3],
  14: [1, 2, 2, 3],
  15: [2, 2, 3, 3],
  16: [2, 2, 3, 4],
  17: [2, 3, 4, 4],
  18: [3, 3, 4, 5],
  19: [3, 4, 4, 5],
  20: [3, 4, 5, 5],
  21: [4, 4, 5, 6],
  22: [4, 5, 5, 6],
  23: [4, 5, 6, 7],
  24: [5, 5, 6, 7],
  25: [5, 6, 7, 7],
};
export const TRIOLA_ALPHAS = [0.01, 0.02, 0.05, 0.1] as const;
