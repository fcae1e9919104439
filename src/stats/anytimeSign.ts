/**
 * The anytime-valid sign test: a p-value that may be looked at after every
 * row, and acted on the first time it drops below alpha, without raising the
 * false-alarm rate above alpha.
 *
 * Method: the signs are taken in row order (ties by the tie rule, below). With
 * s values above and f below among the first t counted, the evidence against
 * H0 (P(above) = 1/2) is the likelihood ratio of Bin(t, θ) against
 * Bin(t, 1/2), averaged over θ uniform on [0, 1] (two-sided) or on [1/2, 1]
 * ("greater"; [0, 1/2] for "less"):
 *   two-sided  M_t = 2^t s! f! / (t + 1)!          = 1 / ((t + 1) P(Bin(t, 1/2) = s)),
 *   "greater"  M_t = 2 M_t(two-sided) P(Bin(t + 1, 1/2) <= s),
 * the second because P(Beta(s + 1, f + 1) > 1/2) = P(Bin(t + 1, 1/2) <= s).
 * Each is a nonnegative martingale under H0 starting at 1 (a mixture of
 * likelihood ratios, H. Robbins (1970), "Statistical methods related to the
 * law of the iterated logarithm", Ann. Math. Statist. 41(5), 1397-1409), and
 * the one-sided one is a supermartingale under every P(above) <= 1/2, so it
 * tests the composite one-sided hypothesis. By Ville's inequality
 * P(sup_t M_t >= 1/alpha) <= alpha, so p_t = min(1, 1 / max_{u <= t} M_u) is
 * valid at every t at once, and at any stopping time (A. Ramdas, P. Grünwald,
 * V. Vovk and G. Shafer (2023), "Game-theoretic statistics and safe
 * anytime-valid inference", Statist. Sci. 38(4), 576-601; S. R. Howard,
 * A. Ramdas, J. McAuliffe and J. Sekhon (2021), "Time-uniform, nonparametric,
 * nonasymptotic confidence sequences", Ann. Statist. 49(2), 1055-1080).
 *
 * The mixing choice: the uniform weight on θ favours no effect size. It pays
 * for not knowing the effect about (1/2) log t in log evidence against a test
 * told the true θ, so a small effect is found later than by a fixed-sample test
 * planned for it, and a large one early. It is the same mixture the confidence
 * sequence for the median uses (confidenceSequence.ts), so the median lies in
 * those bounds exactly when this two-sided test has not rejected it.
 *
 * Ties in row order: "drop" leaves them out; "split" holds a tie until a second
 * one arrives and counts the pair as one below and one above (the product of
 * the two factors does not depend on their order; an unpaired last tie is left
 * out); "conservative" counts each tie against the alternative (below for
 * "greater", above for "less", and for "two-sided" on the side with fewer so
 * far, below when level), as the fixed-sample sign test does.
 *
 * Cost: O(n) time, O(1) extra memory: the running value is updated by one
 * factor a row in scaled double arithmetic (no logarithm in the loop); a
 * binomial tail is taken only at rows that may set a new one-sided maximum,
 * and the reported maximum is evaluated once, in log space, from its counts
 * (binomial.ts: Loader's saddle point, exact to about 1e-13).
 */
import { binomialLogLowerTail, binomialLogPmf, binomialLowerTail } from "./binomial";
import { compareAsShown, tieWindow } from "./differences";
import type { Alternative, TieRule, Unavailable } from "./types";
import { unavailable } from "./types";

export interface AnytimeSignResult {
  readonly available: true;
  /** min(1, 1 / the largest evidence so far): valid whenever it is looked at. */
  readonly pValue: number;
  /** Natural log of the largest value of the evidence over the rows so far (0 before any evidence). */
  readonly logLargestEvidence: number;
  /** Natural log of the evidence after the last row. */
  readonly logEvidence: number;
  /** The position (1-based, among the numbers in row order) at which the largest evidence was reached; 0 if never above its start. */
  readonly rowOfLargest: number;
  /** Values counted (below + above after the tie rule). */
  readonly used: number;
  readonly below: number;
  readonly above: number;
  /** Tied values left out by the tie rule. */
  readonly tiesDropped: number;
  readonly alternative: Alternative;
  readonly ties: TieRule;
}

export interface AnytimeSignOptions {
  /** Default "two-sided". */
  alternative?: Alternative;
  /** Default "drop". */
  ties?: TieRule;
}

/**
 * Natural log of the evidence after `above` and `below` counted signs: the
 * closed forms of the header.
 *
 * @example
 * Math.exp(logSignEvidence(3, 0, "two-sided")); // 2^3 · 3! · 0! / 4! = 2
 * Math.exp(logSignEvidence(3, 0, "greater"));   // 2 · 2 · P(Bin(4, 1/2) <= 3) = 3.75
 */
export function logSignEvidence(above: number, below: number, alternative: Alternative): number {
  const t = above + below;
  const towards = alternative === "less" ? below : above;
  const twoSided = -Math.log(t + 1) - binomialLogPmf(towards, t, 0.5);
  if (alternative === "two-sided") return twoSided;
  return Math.LN2 + twoSided + binomialLogLowerTail(towards, t + 1, 0.5);
}

/** Scaling step of the running value: it stays within 1e±150 (times 2) of its scale. */
const SCALE = 1e150;
const SCALE_UP = 1e150;
const SCALE_DOWN = 1e-150;

/**
 * Beyond this z² / 2 (Hoeffding: P(Bin(t + 1, 1/2) > s) <= exp(-z² / 2)), the
 * one-sided factor P(Bin(t + 1, 1/2) <= s) is 1 to within 1e-16 and need not be evaluated.
 */
const TAIL_IS_ONE = 37;

function checkOptions(alternative: Alternative, ties: TieRule): void {
  if (alternative !== "two-sided" && alternative !== "greater" && alternative !== "less")
    throw new RangeError(`unknown alternative ${String(alternative)}`);
  if (ties !== "drop" && ties !== "split" && ties !== "conservative") throw new RangeError(`unknown tie rule ${String(ties)}`);
}

/**
 * The anytime-valid sign test of H0: the median equals `center`, over `values` in row order.
 *
 * No value left after the tie rule gives Unavailable ("no-data").
 * Throws a RangeError when `center` or a value is NaN (the cell layer never passes NaN).
 *
 * @example
 * anytimeSignTest([51, 52, 53, 54, 55, 56, 57, 58], 50, { alternative: "greater" }).pValue;
 * // 1 / (2 · 2^8 · 8! / 9! · P(Bin(9, 1/2) <= 8)) = 9 / 511 ≈ 0.0176
 */
export function anytimeSignTest(
  values: ArrayLike<number>,
  center: number,
  options: AnytimeSignOptions = {},
): AnytimeSignResult | Unavailable {
  const alternative = options.alternative ?? "two-sided";
  const ties = options.ties ?? "drop";
  checkOptions(alternative, ties);
  if (Number.isNaN(center)) throw new RangeError("anytimeSignTest: the centre is NaN");
  const { low, high } = tieWindow(center);
  const oneSided = alternative !== "two-sided";
  let above = 0;
  let below = 0;
  let tiesDropped = 0;
  let tiePending = false;
  // The running two-sided value is m × SCALE^scale; the largest value of the tested quantity is held at its own
  // scale and read at the current one through `threshold`, recomputed only when either scale changes.
  let m = 1;
  let scale = 0;
  let best = 1;
  let bestScale = 0;
  let threshold = 1;
  let bestRow = 0;
  let bestAbove = 0;
  let bestBelow = 0;
  const n = values.length;
  for (let i = 0; i < n; i++) {
    const x = values[i];
    // Branch-free for the values clear of the centre (nearly all): their side is unpredictable, and a
    // mispredicted branch costs more than the arithmetic. Values in the narrow tie window take the branch.
    let up = +(x > high);
    let down = +(x < low);
    if ((up | down) === 0) {
      const sign = compareAsShown(x, center);
      if (sign !== sign) throw new RangeError(`anytimeSignTest: value ${i} is NaN`);
      up = +(sign > 0);
      down = +(sign < 0);
      if (sign === 0) {
        if (ties === "drop") {
          tiesDropped++;
          continue;
        }
        if (ties === "split") {
          tiePending = !tiePending;
          if (tiePending) continue;
          // The pair: one below, then one above, as one step (the product does not depend on the order).
          m *= (2 * (below + 1)) / (above + below + 2);
          below++;
          up = 1;
        } else if (alternative === "greater") down = 1;
        else if (alternative === "less") up = 1;
        else if (above < below) up = 1;
        else down = 1;
      }
    }
    // One factor a counted sign: M_{t+1} / M_t = 2 (s + 1) / (t + 2) for a value above, 2 (f + 1) / (t + 2) below.
    m *= (2 * (up * (above + 1) + down * (below + 1))) / (above + below + 2);
    above += up;
    below += down;
    if (m > SCALE_UP || m < SCALE_DOWN) {
      const step = m > SCALE_UP ? 1 : -1;
      m = step > 0 ? m / SCALE : m * SCALE;
      scale += step;
      threshold = best * Math.pow(SCALE, bestScale - scale);
    }
    let candidate = m;
    if (oneSided) {
      // The one-sided value is at most 1 while the signs lean the other way (each mixed ratio is then <= 1),
      // and at least m once they lean its way; only then can it set a new maximum.
      const towards = alternative === "greater" ? above : below;
      const away = above + below - towards;
      if (towards <= away || 2 * m <= threshold) continue;
      const t1 = above + below + 1;
      const z = (2 * towards + 2 - t1) / Math.sqrt(t1);
      candidate = z * z > 2 * TAIL_IS_ONE ? 2 * m : 2 * m * binomialLowerTail(towards, t1, 0.5);
    }
    if (candidate > threshold) {
      best = threshold = candidate;
      bestScale = scale;
      bestRow = i + 1;
      bestAbove = above;
      bestBelow = below;
    }
  }
  if (tiePending) tiesDropped++;
  const used = above + below;
  if (used === 0) {
    return unavailable(
      "no-data",
      n > 0
        ? "Every value equals the hypothesised median, so the sign test has nothing above or below it to count."
        : "No values were given, so the sign test has nothing to count.",
    );
  }
  const logLargestEvidence = bestRow === 0 ? 0 : logSignEvidence(bestAbove, bestBelow, alternative);
  return {
    available: true,
    pValue: Math.min(1, Math.exp(-logLargestEvidence)),
    logLargestEvidence,
    logEvidence: logSignEvidence(above, below, alternative),
    rowOfLargest: bestRow,
    used,
    below,
    above,
    tiesDropped,
    alternative,
    ties,
  };
}
