/**
 * Multiple-comparison adjustment of a set of p-values.
 *
 * Method (m = number of p-values that are not NaN; p_(1) <= ... <= p_(m)):
 * - bonferroni: min(1, m p). C. E. Bonferroni (1936), "Teoria statistica delle
 *   classi e calcolo delle probabilità", Pubbl. R. Ist. Sup. Sci. Econ. Commerc. Firenze 8.
 * - holm: running maximum of (m - i + 1) p_(i) from the smallest up, capped at 1.
 *   S. Holm (1979), "A simple sequentially rejective multiple test procedure",
 *   Scandinavian Journal of Statistics 6, 65-70.
 * - hochberg: running minimum of (m - i + 1) p_(i) from the largest down. Y. Hochberg
 *   (1988), "A sharper Bonferroni procedure for multiple tests of significance",
 *   Biometrika 75, 800-802.
 * - bh: running minimum of (m / i) p_(i) from the largest down. Y. Benjamini and
 *   Y. Hochberg (1995), "Controlling the false discovery rate", JRSS B 57, 289-300.
 * - by: bh times sum_{j<=m} 1/j. Y. Benjamini and D. Yekutieli (2001), "The control
 *   of the false discovery rate in multiple testing under dependency", Annals of
 *   Statistics 29, 1165-1188.
 * The adjusted values match R's p.adjust (checked against it in the tests).
 *
 * Cost: O(m log m) time (one sort), O(m) memory.
 */
import type { AdjustMethod } from "./types";

const METHODS: readonly AdjustMethod[] = ["holm", "bonferroni", "hochberg", "bh", "by"];

/**
 * Adjusted p-values in the input order. NaN entries stay NaN and do not count in m.
 * Throws a RangeError for a p-value outside [0, 1] or an unknown method.
 *
 * @example
 * adjustPValues([0.01, 0.04, 0.03, NaN], "holm"); // Float64Array [0.03, 0.06, 0.06, NaN]
 * adjustPValues([0.01, 0.04, 0.03], "bh");         // Float64Array [0.03, 0.04, 0.04]
 */
export function adjustPValues(pValues: ArrayLike<number>, method: AdjustMethod = "holm"): Float64Array {
  if (!METHODS.includes(method)) throw new RangeError(`adjustPValues: unknown method ${String(method)}`);
  const out = new Float64Array(pValues.length).fill(NaN);
  const present: number[] = [];
  for (let i = 0; i < pValues.length; i++) {
    const p = pValues[i];
    if (Number.isNaN(p)) continue;
    if (!(p >= 0 && p <= 1)) throw new RangeError(`adjustPValues: p-value ${i} is ${p}, outside [0, 1]`);
    present.push(i);
  }
  const m = present.length;
  if (m === 0) return out;
  if (method === "bonferroni") {
    for (const i of present) out[i] = Math.min(1, m * pValues[i]);
    return out;
  }
  const order = present.sort((a, b) => pValues[a] - pValues[b]); // ascending p
  if (method === "holm") {
    let running = 0;
    for (let r = 0; r < m; r++) {
      running = Math.max(running, (m - r) * pValues[order[r]]);
      out[order[r]] = Math.min(1, running);
    }
    return out;
  }
  let harmonic = 1;
  if (method === "by") {
    harmonic = 0;
    for (let j = 1; j <= m; j++) harmonic += 1 / j;
  }
  let running = Infinity;
  for (let r = m - 1; r >= 0; r--) {
    const rank = r + 1;
    const p = pValues[order[r]];
    const scaled = method === "hochberg" ? (m - rank + 1) * p : ((harmonic * m) / rank) * p;
    running = Math.min(running, scaled);
    out[order[r]] = Math.min(1, running);
  }
  return out;
}
