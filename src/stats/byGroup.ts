/**
 * One median question asked of every group at once: per group the count, the median, exact
 * order-statistic bounds for the median with their coverage, and the sign-test p-value
 * against a hypothesised median, plus the p-values adjusted across the groups.
 *
 * Method: each group on its own as the one-sample functions treat a range: the sign test
 * (signTest.ts: exact binomial, values equal to the hypothesised median dropped), the bounds
 * (quantileBounds.ts: exact, two-sided for a two-sided question, the one bound that matters
 * for a one-sided one), the median by selection (selection.ts). The p-values of the groups
 * that have one are then adjusted together (adjust.ts: Holm by default), so that a group
 * picked out because its p-value is small is judged knowing how many groups were looked at.
 *
 * Cost: O(N) expected time over all groups (selection and counting; no sort), O(N) memory.
 */
import { adjustPValues } from "./adjust";
import { quantileBounds } from "./quantileBounds";
import { selectInPlace } from "./selection";
import { countSigns } from "./signCounts";
import { signTest } from "./signTest";
import type { AdjustMethod, Alternative, BoundSide } from "./types";

/** A value a row cannot give, with the reason in words. */
export interface Missing {
  missing: string;
}

export interface GroupRow {
  n: number;
  median: number | Missing;
  /** Lower bound, null when the question is one-sided the other way. */
  lower: number | null | Missing;
  upper: number | null | Missing;
  /** Exact coverage of the bounds. */
  coverage: number | Missing;
  pValue: number | Missing;
  adjustedPValue: number | Missing;
}

export interface ByGroupResult {
  rows: GroupRow[];
  side: BoundSide;
  alternative: Alternative;
  adjust: AdjustMethod;
  /** Groups whose p-value entered the adjustment. */
  tested: number;
}

export interface ByGroupOptions {
  alternative?: Alternative;
  confidence?: number;
  adjust?: AdjustMethod;
}

/** The bounds that answer the question: both for two-sided, the lower one for "greater", the upper one for "less". */
function sideFor(alternative: Alternative): BoundSide {
  return alternative === "greater" ? "lower" : alternative === "less" ? "upper" : "two-sided";
}

/** Median of the values, reordering them (they belong to the caller's scratch copy). */
function medianInPlace(values: Float64Array): number {
  const n = values.length;
  const upper = selectInPlace(values, n >> 1);
  if (n % 2 === 1) return upper;
  let lower = -Infinity;
  for (let i = 0; i < n >> 1; i++) if (values[i] > lower) lower = values[i];
  const mid = (lower + upper) / 2;
  return Number.isFinite(mid) ? mid : lower / 2 + upper / 2;
}

/**
 * Per-group summary and tests against `center`. Each group's values are reordered in place (the caller
 * passes its own copies, as groupedCells.ts provides them). Throws a RangeError for a NaN centre, a
 * confidence outside (0, 1) or an unknown option.
 *
 * @example
 * const r = summariseGroups([Float64Array.of(51, 52, 53, 54, 55, 56), Float64Array.of(48, 49, 50.5, 47, 49.5, 46)], 50, { confidence: 0.9 });
 * // r.rows[0]: n 6, median 53.5, lower 51 and upper 56 (at 90% six values need ranks 1 and 6), coverage 0.96875
 * // (1 - 2/64), pValue 0.03125 (6 of 6 above: 2/64), adjustedPValue 0.0625 (Holm: 2 x 0.03125)
 */
export function summariseGroups(groups: readonly Float64Array[], center: number, options: ByGroupOptions = {}): ByGroupResult {
  const alternative = options.alternative ?? "two-sided";
  const confidence = options.confidence ?? 0.95;
  const adjust = options.adjust ?? "holm";
  if (Number.isNaN(center)) throw new RangeError("summariseGroups: the hypothesised median is NaN");
  const side = sideFor(alternative);
  const rows: GroupRow[] = [];
  const pValues = new Float64Array(groups.length).fill(NaN);
  for (let g = 0; g < groups.length; g++) {
    const values = groups[g];
    const n = values.length;
    if (n === 0) {
      const none = { missing: "No numbers in this group." };
      rows.push({ n, median: none, lower: none, upper: none, coverage: none, pValue: none, adjustedPValue: none });
      continue;
    }
    const test = signTest(countSigns(values, center), { alternative });
    const bounds = quantileBounds(values, { confidence, side });
    const noBounds: Missing = { missing: bounds.available ? "" : bounds.message };
    if (test.available) pValues[g] = test.pValue;
    rows.push({
      n,
      median: medianInPlace(values),
      lower: bounds.available ? bounds.lower : noBounds,
      upper: bounds.available ? bounds.upper : noBounds,
      coverage: bounds.available ? bounds.achievedConfidence : noBounds,
      pValue: test.available ? test.pValue : { missing: test.message },
      // filled in below, once every group's p-value is known
      adjustedPValue: test.available ? NaN : { missing: test.message },
    });
  }
  const adjusted = adjustPValues(pValues, adjust);
  let tested = 0;
  for (let g = 0; g < groups.length; g++) {
    if (Number.isNaN(pValues[g])) continue;
    rows[g].adjustedPValue = adjusted[g];
    tested++;
  }
  return { rows, side, alternative, adjust, tested };
}
