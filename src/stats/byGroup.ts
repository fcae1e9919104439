/**
 * One median question asked of every group at once: per group the count, the median, exact
 * order-statistic bounds for the median with their coverage, and the sign-test p-value
 * against a hypothesised median, plus the p-values adjusted across the groups.
 *
 * Method: each group on its own as the one-sample functions treat a range: the sign test
 * (signTest.ts: exact binomial, values equal to the hypothesised median dropped), the bounds
 * (the exact order-statistic ranks of quantileBounds.ts: two-sided for a two-sided question, the
 * one bound that matters for a one-sided one), found with the median in one multi-rank selection
 * (selection.ts). The p-values of the groups
 * that have one are then adjusted together (adjust.ts: Holm by default), so that a group
 * picked out because its p-value is small is judged knowing how many groups were looked at.
 *
 * Cost: O(N) expected time over all groups (selection and counting; no sort), O(N) memory.
 */
import { adjustPValues } from "./adjust";
import { boundRanks } from "./quantileBounds";
import { selectManyInPlace } from "./selection";
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

/**
 * The median and the order statistics of the given one-based ranks (null for none), in one multi-rank
 * selection on the values, which it reorders (they belong to the caller's scratch copy).
 */
function medianAndRanks(
  values: Float64Array,
  lowerRank: number | null,
  upperRank: number | null,
): { median: number; lower: number | null; upper: number | null } {
  const n = values.length;
  const middle = n % 2 === 1 ? [(n - 1) / 2] : [n / 2 - 1, n / 2];
  const ends = [lowerRank, upperRank].filter((r): r is number => r !== null).map((r) => r - 1);
  const found = selectManyInPlace(values, [...middle, ...ends]);
  const mid = middle.length === 1 ? found[0] : (found[0] + found[1]) / 2;
  const median = Number.isFinite(mid) ? mid : found[0] / 2 + found[1] / 2;
  const at = middle.length;
  return { median, lower: lowerRank === null ? null : found[at], upper: upperRank === null ? null : found[found.length - 1] };
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
    const ranks = boundRanks(n, 0.5, confidence, side);
    const noBounds: Missing = { missing: ranks.available ? "" : ranks.message };
    const picked = ranks.available ? medianAndRanks(values, ranks.lowerRank, ranks.upperRank) : medianAndRanks(values, null, null);
    if (test.available) pValues[g] = test.pValue;
    rows.push({
      n,
      median: picked.median,
      lower: ranks.available ? picked.lower : noBounds,
      upper: ranks.available ? picked.upper : noBounds,
      coverage: ranks.available ? ranks.achievedConfidence : noBounds,
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
