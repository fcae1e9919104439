/**
 * The EVENSPLIT cell functions (namespace EVENSPLIT in manifest.xml).
 *
 * Each function here only turns cells into numbers (src/stats/cells.ts),
 * checks its options (vocabulary.ts, argumentChecks.ts), calls the
 * statistics core and turns the answer into cell values: a number, one row,
 * or a cell error with a message (errors.ts). The JSDoc of each function is
 * its help in the spreadsheet's function picker; custom-functions-metadata-plugin
 * turns it into dist/functions.json and appends the registration
 * (`CustomFunctions.associate`) of every function at build time.
 *
 * The argument types are `unknown` on purpose: the spreadsheet then passes
 * values as they are (type "any"), and the checks here give the messages.
 * Omitted optional arguments arrive as null and mean the default (Microsoft,
 * "Custom functions parameter options", Office Add-ins documentation).
 *
 * Cost: one pass over the cells, plus the cost of the core routine (see its header).
 */
import { blockValue, reportCell, resultBlockRows, type BlockInputs, type BlockRequest } from "../report/resultBlock";
import { adjustPValues } from "../stats/adjust";
import { anytimeSignTest } from "../stats/anytimeSign";
import { pairedDifferencesInArrivalOrder, withNumbersInArrivalOrder } from "../stats/arrivalOrder";
import {
  boundedNumbersFromCells,
  cellsFromValues,
  numbersFromCells,
  pairedDifferencesFromCells,
  signCountsFromCells,
} from "../stats/cells";
import { differencesFrom } from "../stats/differences";
import { confidenceSequence, type ConfidenceSequenceResult } from "../stats/confidenceSequence";
import { hodgesLehmann, hodgesLehmannEstimate } from "../stats/hodgesLehmann";
import { signTestPower, signTestSampleSize } from "../stats/power";
import { boundRanks, quantileBounds } from "../stats/quantileBounds";
import { quantileTest } from "../stats/quantileTest";
import { countSigns, type SignCounts } from "../stats/signCounts";
import { EXACT_LIMIT, signedRankTest, type SignedRankResult } from "../stats/signedRank";
import { signTest } from "../stats/signTest";
import { sprt as sequentialRatioTest, type SprtOptions, type SprtResult } from "../stats/sprt";
import { unavailable, type BoundMethod, type BoundSide, type Unavailable } from "../stats/types";
import {
  cellsArgument,
  fractionArgument,
  LARGEST_N,
  numberArgument,
  pairedCellsArgument,
  probabilityArgument,
  sampleSizeArgument,
  type Cells,
} from "./argumentChecks";
import { BadArgument, errorFor, oneRow, scalar, unavailableError, type RowCell } from "./errors";
import type { CellError } from "./runtime";
import {
  ADJUST_ACROSS_GROUPS,
  ADJUST_METHOD,
  ALTERNATIVE,
  AT_MEDIAN,
  BOUND_METHOD,
  MANY_GROUP_METHOD,
  SIDE,
  SIGNED_RANK_METHOD,
  SIGN_METHOD,
  TIES,
  TWO_GROUP_METHOD,
  ZEROS,
  chooseWord,
  type Vocabulary,
} from "./vocabulary";

// ---------------------------------------------------------------------------
// From cells to the core's inputs

function numbersOf(data: unknown): Float64Array {
  return numbersFromCells(cellsArgument("data", data)).values;
}

/** The paired differences second − first − shift, and how many pairs were left out. */
function differencesOf(first: unknown, second: unknown, shift: number): { differences: Float64Array; pairsSkipped: number } {
  const ranges = pairedCellsArgument(first, second);
  return pairedDifferencesFromCells(ranges.first, ranges.second, shift);
}

/** How many values the sign test uses under a tie rule: below + above, plus the ties it keeps. */
function usedUnder(c: SignCounts, ties: unknown): number {
  const result = signTest(c, { ties: chooseWord(TIES, ties) });
  return result.available ? result.used : 0;
}

/**
 * Differences beyond the largest double (about ±1.8E+308; the sheet holds values up to ±9.99999999999999E+307)
 * keep their sign but lose their size: enough for a sign test, not for ranks, averages or bounds.
 */
function oversizedDifference(differences: ArrayLike<number>): Unavailable | null {
  for (let i = 0; i < differences.length; i++) {
    if (!Number.isFinite(differences[i])) {
      return unavailable(
        "unreachable",
        "A difference is too large to hold as a number (values near ±1E+308 on opposite sides): ranks, averages and bounds need its size. Check the data, or rescale it (other units).",
      );
    }
  }
  return null;
}

function shiftOf(shift: unknown): number {
  return numberArgument("shift", shift, 0);
}

/** Counts of the data below, at and above the centre, taken in the one pass that reads the cells. */
function countsOf(data: unknown, center: number): SignCounts {
  return signCountsFromCells(cellsArgument("data", data), center).counts;
}

function signTestOf(counts: SignCounts, alternative: unknown, ties: unknown, method?: unknown) {
  return signTest(counts, {
    alternative: chooseWord(ALTERNATIVE, alternative),
    ties: chooseWord(TIES, ties),
    method: chooseWord(SIGN_METHOD, method),
  });
}

/**
 * The signed-rank test as asked. The core falls back to the normal
 * approximation when "exact" is asked of more differences than it will
 * enumerate; a cell cannot say which method gave its number, so that case is
 * answered with #N/A and the way out instead.
 */
function signedRankOf(
  differences: ArrayLike<number>,
  alternative: unknown,
  method: unknown,
  zeros: unknown,
): SignedRankResult | Unavailable {
  const requested = chooseWord(SIGNED_RANK_METHOD, method);
  const oversized = oversizedDifference(differences);
  if (oversized !== null) return oversized;
  const result = signedRankTest(differences, {
    alternative: chooseWord(ALTERNATIVE, alternative),
    method: requested,
    zeros: chooseWord(ZEROS, zeros),
  });
  if (result.available && requested === "exact" && result.method !== "exact") {
    return unavailable(
      "unreachable",
      `The exact signed-rank p-value is worked out for up to ${EXACT_LIMIT} non-zero differences; these have ${result.nonZero}. Use "auto" or "normal" for the method.`,
    );
  }
  return result;
}

/** Bounds for the median (or another quantile) as one row: lower, upper, exact coverage; "" for an end not asked for. */
function boundsRow(
  values: ArrayLike<number>,
  quantile: number,
  confidence: number,
  side: BoundSide,
  method: BoundMethod,
): RowCell[] | CellError {
  if (method === "interpolated" && side !== "two-sided" && !(confidence > 0.5)) {
    throw new BadArgument(`A one-sided Hettmansperger–Sheather bound needs a confidence above 0.5; got ${confidence}.`);
  }
  const oversized = oversizedDifference(values);
  if (oversized !== null) return unavailableError(oversized);
  const result = quantileBounds(values, { quantile, confidence, side, method });
  if (!result.available) return unavailableError(result);
  return [result.lower ?? "", result.upper ?? "", result.achievedConfidence];
}

/**
 * Estimate, lower, upper, exact coverage. Too few values for the bounds
 * still give the estimate (it needs one value): only the bound cells say why
 * they are empty, so what can be given is not lost with what cannot.
 */
function hodgesLehmannRow(values: ArrayLike<number>, confidence: number, side: BoundSide): RowCell[] | CellError {
  const oversized = oversizedDifference(values);
  if (oversized !== null) return unavailableError(oversized);
  const result = hodgesLehmann(values, { confidence, side });
  if (result.available) return [result.estimate, result.lower ?? "", result.upper ?? "", result.achievedConfidence];
  if (values.length === 0) return unavailableError(result);
  const missing = unavailableError(result);
  return [hodgesLehmannEstimate(values), missing, missing, missing];
}

// ---------------------------------------------------------------------------
// Sign test

/**
 * Counts the numbers below, equal to and above a hypothesised median. Returns one row: below, tied, above, used (the values the sign test uses: below + above, or with ties given, the count after that tie rule). Blank cells, text and logical values are skipped.
 * @customfunction COUNTS
 * @param data Range with the measurements, such as A2:A40 or Table1[Thickness].
 * @param hypothesized_median The median under test, such as 50.
 * @param [ties] The tie rule for the last column: "drop" (default: ties left out), "split" or "conservative" (ties kept).
 * @returns One row: below, tied, above, used.
 * @helpurl https://localhost:3000/help/counts.html
 * @example =EVENSPLIT.COUNTS(Panels[Thickness], 50) counts the panels thinner than, exactly at and thicker than 50 µm.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function counts(data: unknown[][], hypothesized_median: unknown, ties?: unknown): unknown[][] {
  return oneRow(4, () => {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    const c = countsOf(data, center);
    return [c.below, c.tied, c.above, usedUnder(c, ties)];
  });
}

/**
 * Sign-test p-value for the median of the data. Needs no assumption about the shape of the distribution.
 * @customfunction PVALUE
 * @param data Range with the measurements, such as A2:A40 or Table1[Thickness].
 * @param hypothesized_median The median under test, such as 50.
 * @param [alternative] "two-sided" (default), "greater" (the median is above the hypothesised one) or "less".
 * @param [ties] Values equal to the hypothesised median: "drop" (default), "split" or "conservative".
 * @param [method] "exact" (default, binomial), "midp" or "normal" (approximation).
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/pvalue.html
 * @example =EVENSPLIT.PVALUE(Panels[Thickness], 50, "greater") asks whether the median thickness is above 50 µm.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function pvalue(
  data: unknown[][],
  hypothesized_median: unknown,
  alternative?: unknown,
  ties?: unknown,
  method?: unknown,
): number | CellError {
  return scalar(() => {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    const result = signTestOf(countsOf(data, center), alternative, ties, method);
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Sign-test statistic: the count above the hypothesised median for "greater", the count below for "less", the larger of the two for "two-sided", after the tie rule.
 * @customfunction STATISTIC
 * @param data Range with the measurements.
 * @param hypothesized_median The median under test, such as 50.
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @param [ties] "drop" (default), "split" or "conservative".
 * @returns The statistic.
 * @helpurl https://localhost:3000/help/statistic.html
 * @example =EVENSPLIT.STATISTIC(Panels[Thickness], 50, "greater") gives the count of panels above 50 µm that PVALUE uses.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function statistic(data: unknown[][], hypothesized_median: unknown, alternative?: unknown, ties?: unknown): number | CellError {
  return scalar(() => {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    const result = signTestOf(countsOf(data, center), alternative, ties);
    return result.available ? result.statistic : unavailableError(result);
  });
}

/**
 * Paired sign-test p-value on the differences second − first − shift (for example after − before). Pairs with a blank or non-number on either side are skipped.
 * @customfunction PAIRED
 * @param first Range with the first measurement of each pair (such as before).
 * @param second Range with the second measurement, same shape as first (such as after).
 * @param [shift] The median difference under test; default 0.
 * @param [alternative] "two-sided" (default), "greater" (second tends to exceed first + shift) or "less".
 * @param [ties] Zero differences: "drop" (default), "split" or "conservative".
 * @param [method] "exact" (default), "midp" or "normal".
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/paired.html
 * @example =EVENSPLIT.PAIRED(Nozzle[Before], Nozzle[After], 0, "less") asks whether the nozzle change made panels thinner.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function paired(
  first: unknown[][],
  second: unknown[][],
  shift?: unknown,
  alternative?: unknown,
  ties?: unknown,
  method?: unknown,
): number | CellError {
  return scalar(() => {
    const { differences } = differencesOf(first, second, shiftOf(shift));
    const result = signTestOf(countSigns(differences, 0), alternative, ties, method);
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Paired sign-test statistic on the differences second − first − shift, as STATISTIC does for one range.
 * @customfunction PAIREDSTATISTIC
 * @param first Range with the first measurement of each pair.
 * @param second Range with the second measurement, same shape as first.
 * @param [shift] The median difference under test; default 0.
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @param [ties] "drop" (default), "split" or "conservative".
 * @returns The statistic.
 * @helpurl https://localhost:3000/help/pairedstatistic.html
 * @example =EVENSPLIT.PAIREDSTATISTIC(Nozzle[Before], Nozzle[After], 0, "less") gives the sign statistic of After - Before.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function pairedstatistic(
  first: unknown[][],
  second: unknown[][],
  shift?: unknown,
  alternative?: unknown,
  ties?: unknown,
): number | CellError {
  return scalar(() => {
    const { differences } = differencesOf(first, second, shiftOf(shift));
    const result = signTestOf(countSigns(differences, 0), alternative, ties);
    return result.available ? result.statistic : unavailableError(result);
  });
}

/**
 * Counts the paired differences second − first − shift below, equal to and above zero. Returns one row: below, tied, above, used (as COUNTS), pairs skipped.
 * @customfunction PAIREDCOUNTS
 * @param first Range with the first measurement of each pair.
 * @param second Range with the second measurement, same shape as first.
 * @param [shift] The median difference under test; default 0.
 * @param [ties] The tie rule for the used column: "drop" (default), "split" or "conservative".
 * @returns One row: below, tied, above, used, pairs skipped.
 * @helpurl https://localhost:3000/help/pairedcounts.html
 * @example =EVENSPLIT.PAIREDCOUNTS(Nozzle[Before], Nozzle[After]) counts the panels that got thinner, stayed the same and got thicker.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function pairedcounts(first: unknown[][], second: unknown[][], shift?: unknown, ties?: unknown): unknown[][] {
  return oneRow(5, () => {
    const { differences, pairsSkipped } = differencesOf(first, second, shiftOf(shift));
    const c = countSigns(differences, 0);
    return [c.below, c.tied, c.above, usedUnder(c, ties), pairsSkipped];
  });
}

// ---------------------------------------------------------------------------
// Bounds and the quantile test

/**
 * Distribution-free confidence bounds for the median from the sorted data. Returns one row: lower, upper, exact coverage of these bounds (at least the confidence asked for with the exact method).
 * @customfunction BOUNDS
 * @param data Range with the measurements.
 * @param [confidence] Confidence, such as 0.95 (default).
 * @param [side] "two-sided" (default), "lower" (a lower bound only) or "upper".
 * @param [method] "exact" (default: bounds are data values) or "hettmansperger-sheather" (between neighbouring values, coverage closer to the confidence asked; Hettmansperger and Sheather, 1986).
 * @returns One row: lower, upper, exact coverage.
 * @helpurl https://localhost:3000/help/bounds.html
 * @example =EVENSPLIT.BOUNDS(Panels[Thickness], 0.95) gives the range of median thicknesses these panels are consistent with.
 * @see W. R. Thompson (1936), "On confidence ranges for the median and other expectation distributions for populations of unknown distribution form", Annals of Mathematical Statistics 7, 122-128.
 */
export function bounds(data: unknown[][], confidence?: unknown, side?: unknown, method?: unknown): unknown[][] {
  return oneRow(3, () =>
    boundsRow(
      numbersOf(data),
      0.5,
      fractionArgument("confidence", confidence, 0.95),
      chooseWord(SIDE, side),
      chooseWord(BOUND_METHOD, method),
    ),
  );
}

/**
 * Distribution-free confidence bounds for the median of the paired differences second − first. Returns one row: lower, upper, exact coverage.
 * @customfunction PAIREDBOUNDS
 * @param first Range with the first measurement of each pair.
 * @param second Range with the second measurement, same shape as first.
 * @param [confidence] Confidence, such as 0.95 (default).
 * @param [side] "two-sided" (default), "lower" or "upper".
 * @param [method] "exact" (default) or "hettmansperger-sheather".
 * @returns One row: lower, upper, exact coverage.
 * @helpurl https://localhost:3000/help/pairedbounds.html
 * @example =EVENSPLIT.PAIREDBOUNDS(Nozzle[Before], Nozzle[After], 0.95) bounds the median change After - Before.
 * @see W. R. Thompson (1936), "On confidence ranges for the median and other expectation distributions for populations of unknown distribution form", Annals of Mathematical Statistics 7, 122-128.
 */
export function pairedbounds(first: unknown[][], second: unknown[][], confidence?: unknown, side?: unknown, method?: unknown): unknown[][] {
  return oneRow(3, () => {
    const level = fractionArgument("confidence", confidence, 0.95);
    const chosenSide = chooseWord(SIDE, side);
    const chosenMethod = chooseWord(BOUND_METHOD, method);
    return boundsRow(differencesOf(first, second, 0).differences, 0.5, level, chosenSide, chosenMethod);
  });
}

/**
 * P-value for the hypothesis that a quantile of the population (such as the 0.9 quantile) equals a value. Values equal to it are left out.
 * @customfunction QUANTILEPVALUE
 * @param data Range with the measurements.
 * @param value The hypothesised value of the quantile, such as 58.
 * @param quantile Which quantile, between 0 and 1 (0.5 is the median, 0.9 the value 90% fall below).
 * @param [alternative] "two-sided" (default: twice the smaller one-sided p-value, at most 1), "greater" (the quantile is above value) or "less".
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/quantilepvalue.html
 * @example =EVENSPLIT.QUANTILEPVALUE(Panels[Thickness], 58, 0.9, "less") asks whether nine panels in ten stay under 58 µm.
 * @see W. J. Conover (1999), "Practical Nonparametric Statistics", 3rd ed., Wiley, chapter 3 (from memory).
 */
export function quantilepvalue(data: unknown[][], value: unknown, quantile: unknown, alternative?: unknown): number | CellError {
  return scalar(() => {
    const at = numberArgument("value", value, undefined, "58");
    const q = fractionArgument("quantile", quantile, undefined, "0.9");
    const result = quantileTest(numbersOf(data), at, q, { alternative: chooseWord(ALTERNATIVE, alternative) });
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Distribution-free confidence bounds for a quantile of the population. Returns one row: lower, upper, exact coverage.
 * @customfunction QUANTILEBOUNDS
 * @param data Range with the measurements.
 * @param quantile Which quantile, between 0 and 1, such as 0.9.
 * @param [confidence] Confidence, such as 0.95 (default).
 * @param [side] "two-sided" (default), "lower" or "upper".
 * @returns One row: lower, upper, exact coverage.
 * @helpurl https://localhost:3000/help/quantilebounds.html
 * @example =EVENSPLIT.QUANTILEBOUNDS(Panels[Thickness], 0.9, 0.95, "upper") gives a thickness the 0.9 quantile stays below with 95% confidence.
 * @see W. R. Thompson (1936), "On confidence ranges for the median and other expectation distributions for populations of unknown distribution form", Annals of Mathematical Statistics 7, 122-128.
 */
export function quantilebounds(data: unknown[][], quantile: unknown, confidence?: unknown, side?: unknown): unknown[][] {
  return oneRow(3, () => {
    const q = fractionArgument("quantile", quantile, undefined, "0.9");
    return boundsRow(numbersOf(data), q, fractionArgument("confidence", confidence, 0.95), chooseWord(SIDE, side), "exact");
  });
}

// ---------------------------------------------------------------------------
// Wilcoxon signed-rank and Hodges–Lehmann

/**
 * Wilcoxon signed-rank p-value for the centre of the data. Assumes the data are symmetric about their centre.
 * @customfunction SIGNRANK
 * @param data Range with the measurements.
 * @param hypothesized_median The centre under test, such as 50.
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @param [method] "auto" (default: exact for small samples), "exact" or "normal" (with continuity and tie corrections).
 * @param [zeros] Values equal to the centre: "drop" (default) or "pratt" (ranked, then left out).
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/signrank.html
 * @example =EVENSPLIT.SIGNRANK(Panels[Thickness], 50, "greater") asks whether the centre of the thicknesses is above 50 µm.
 * @see F. Wilcoxon (1945), "Individual comparisons by ranking methods", Biometrics Bulletin 1, 80-83.
 */
export function signrank(
  data: unknown[][],
  hypothesized_median: unknown,
  alternative?: unknown,
  method?: unknown,
  zeros?: unknown,
): number | CellError {
  return scalar(() => {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    const result = signedRankOf(differencesFrom(numbersOf(data), center), alternative, method, zeros);
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Wilcoxon signed-rank p-value on the paired differences second − first − shift.
 * @customfunction PAIREDSIGNRANK
 * @param first Range with the first measurement of each pair.
 * @param second Range with the second measurement, same shape as first.
 * @param [shift] The centre of the differences under test; default 0.
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @param [method] "auto" (default), "exact" or "normal".
 * @param [zeros] Zero differences: "drop" (default) or "pratt".
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/pairedsignrank.html
 * @example =EVENSPLIT.PAIREDSIGNRANK(Nozzle[Before], Nozzle[After], 0, "less") asks whether the nozzle change made panels thinner.
 * @see F. Wilcoxon (1945), "Individual comparisons by ranking methods", Biometrics Bulletin 1, 80-83.
 */
export function pairedsignrank(
  first: unknown[][],
  second: unknown[][],
  shift?: unknown,
  alternative?: unknown,
  method?: unknown,
  zeros?: unknown,
): number | CellError {
  return scalar(() => {
    const { differences } = differencesOf(first, second, shiftOf(shift));
    const result = signedRankOf(differences, alternative, method, zeros);
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Signed-rank statistic V: the sum of the ranks of the values above the hypothesised centre (ranks of distances from it).
 * @customfunction SIGNRANKSTATISTIC
 * @param data Range with the measurements.
 * @param hypothesized_median The centre under test, such as 50.
 * @param [zeros] "drop" (default) or "pratt".
 * @returns V.
 * @helpurl https://localhost:3000/help/signrankstatistic.html
 * @example =EVENSPLIT.SIGNRANKSTATISTIC(Panels[Thickness], 50) gives V, the sum of the ranks of the panels above 50 µm.
 * @see F. Wilcoxon (1945), "Individual comparisons by ranking methods", Biometrics Bulletin 1, 80-83.
 */
export function signrankstatistic(data: unknown[][], hypothesized_median: unknown, zeros?: unknown): number | CellError {
  return scalar(() => {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    // V does not depend on how the p-value is computed; "normal" skips the exact distribution.
    const result = signedRankOf(differencesFrom(numbersOf(data), center), null, "normal", zeros);
    return result.available ? result.statistic : unavailableError(result);
  });
}

/**
 * Signed-rank statistic V on the paired differences second − first − shift.
 * @customfunction PAIREDSIGNRANKSTATISTIC
 * @param first Range with the first measurement of each pair.
 * @param second Range with the second measurement, same shape as first.
 * @param [shift] The centre of the differences under test; default 0.
 * @param [zeros] "drop" (default) or "pratt".
 * @returns V.
 * @helpurl https://localhost:3000/help/pairedsignrankstatistic.html
 * @example =EVENSPLIT.PAIREDSIGNRANKSTATISTIC(Nozzle[Before], Nozzle[After]) gives V on the changes After - Before.
 * @see F. Wilcoxon (1945), "Individual comparisons by ranking methods", Biometrics Bulletin 1, 80-83.
 */
export function pairedsignrankstatistic(first: unknown[][], second: unknown[][], shift?: unknown, zeros?: unknown): number | CellError {
  return scalar(() => {
    const { differences } = differencesOf(first, second, shiftOf(shift));
    const result = signedRankOf(differences, null, "normal", zeros);
    return result.available ? result.statistic : unavailableError(result);
  });
}

/**
 * Hodges–Lehmann estimate of the centre (the median of all pairwise averages) with distribution-free bounds. Returns one row: estimate, lower, upper, exact coverage; with side "lower" or "upper" the other end is left empty.
 * @customfunction HODGESLEHMANN
 * @param data Range with the measurements.
 * @param [confidence] Confidence of the bounds, such as 0.95 (default).
 * @param [side] "two-sided" (default), "lower" (a lower bound only) or "upper".
 * @returns One row: estimate, lower, upper, exact coverage.
 * @helpurl https://localhost:3000/help/hodgeslehmann.html
 * @example =EVENSPLIT.HODGESLEHMANN(Panels[Thickness], 0.95) estimates the centre of the thicknesses with its bounds.
 * @see J. L. Hodges and E. L. Lehmann (1963), "Estimates of location based on rank tests", Annals of Mathematical Statistics 34, 598-611.
 */
export function hodgeslehmann(data: unknown[][], confidence?: unknown, side?: unknown): unknown[][] {
  return oneRow(4, () => {
    const level = fractionArgument("confidence", confidence, 0.95);
    return hodgesLehmannRow(numbersOf(data), level, chooseWord(SIDE, side));
  });
}

/**
 * Hodges–Lehmann estimate and bounds for the centre of the paired differences second − first. Returns one row: estimate, lower, upper, exact coverage.
 * @customfunction PAIREDHODGESLEHMANN
 * @param first Range with the first measurement of each pair.
 * @param second Range with the second measurement, same shape as first.
 * @param [confidence] Confidence of the bounds, such as 0.95 (default).
 * @param [side] "two-sided" (default), "lower" or "upper".
 * @returns One row: estimate, lower, upper, exact coverage.
 * @helpurl https://localhost:3000/help/pairedhodgeslehmann.html
 * @example =EVENSPLIT.PAIREDHODGESLEHMANN(Nozzle[Before], Nozzle[After]) estimates the typical change After - Before with its bounds.
 * @see J. L. Hodges and E. L. Lehmann (1963), "Estimates of location based on rank tests", Annals of Mathematical Statistics 34, 598-611.
 */
export function pairedhodgeslehmann(first: unknown[][], second: unknown[][], confidence?: unknown, side?: unknown): unknown[][] {
  return oneRow(4, () => {
    const level = fractionArgument("confidence", confidence, 0.95);
    const chosenSide = chooseWord(SIDE, side);
    return hodgesLehmannRow(differencesOf(first, second, 0).differences, level, chosenSide);
  });
}

// ---------------------------------------------------------------------------
// Planning and several tests

/**
 * Exact power of the sign test: the chance it rejects at alpha when each value lies above the hypothesised median with probability p_above.
 * @customfunction POWER
 * @param n Number of values (ties left out), such as 30.
 * @param p_above Probability that a value lies above the hypothesised median under the alternative, such as 0.75.
 * @param [alpha] Significance level, such as 0.05 (default).
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @returns The power.
 * @helpurl https://localhost:3000/help/power.html
 * @example =EVENSPLIT.POWER(30, 0.75, 0.05, "greater") gives the chance that 30 panels show the median is above 50 µm when three panels in four come out above it.
 * @see W. J. Conover (1999), "Practical Nonparametric Statistics", 3rd ed., Wiley, chapter 3 (from memory).
 */
export function power(n: unknown, p_above: unknown, alpha?: unknown, alternative?: unknown): number | CellError {
  return scalar(() => {
    const size = sampleSizeArgument("n", n);
    const pAbove = probabilityArgument("p_above", p_above, "0.75");
    const level = fractionArgument("alpha", alpha, 0.05, "0.05");
    return signTestPower(size, pAbove, { alpha: level, alternative: chooseWord(ALTERNATIVE, alternative) }).power;
  });
}

/**
 * Smallest number of values (ties left out) at which the sign test reaches the power asked for.
 * @customfunction SAMPLESIZE
 * @param p_above Probability that a value lies above the hypothesised median under the alternative, such as 0.75.
 * @param [power] Power wanted, such as 0.8 (default).
 * @param [alpha] Significance level, such as 0.05 (default).
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @returns The sample size.
 * @helpurl https://localhost:3000/help/samplesize.html
 * @example =EVENSPLIT.SAMPLESIZE(0.75, 0.8, 0.05, "greater") gives the fewest panels for 80% power in that situation.
 * @see W. J. Conover (1999), "Practical Nonparametric Statistics", 3rd ed., Wiley, chapter 3 (from memory).
 */
export function samplesize(p_above: unknown, power?: unknown, alpha?: unknown, alternative?: unknown): number | CellError {
  return scalar(() => {
    const pAbove = probabilityArgument("p_above", p_above, "0.75");
    const target = fractionArgument("power", power, 0.8, "0.8");
    const level = fractionArgument("alpha", alpha, 0.05, "0.05");
    const result = signTestSampleSize(pAbove, { power: target, alpha: level, alternative: chooseWord(ALTERNATIVE, alternative) });
    return result.available ? result.n : unavailableError(result);
  });
}

/** How a cell that is neither blank nor a number is named in a message. */
function cellDescription(cell: unknown): string {
  if (typeof cell === "string") return `the text "${cell}"`;
  if (typeof cell === "boolean") return `the logical value ${cell ? "TRUE" : "FALSE"}`;
  if (typeof cell === "object" && cell !== null && typeof (cell as { code?: unknown }).code === "string")
    return `the error ${(cell as { code: string }).code}`;
  return "a value that is not a number";
}

/**
 * A p-value cell for ADJUST: NaN for a blank cell (not a test; left out), the number for a p-value, and a
 * refusal for anything else. Leaving out a text, logical or error cell would adjust as if fewer tests had
 * been run, which makes every other adjusted p-value smaller than it should be.
 */
function pValueCell(cell: unknown, row: number, column: number): number {
  if (cell === null || cell === undefined || cell === "") return NaN;
  const where = `the cell in row ${row + 1}, column ${column + 1} of the range`;
  if (typeof cell !== "number") {
    throw new BadArgument(
      `The range pvalues must hold p-values and blank cells only; ${where} holds ${cellDescription(cell)}. Type the p-value as a number, or clear the cell if it is not a test: leaving it out would adjust for fewer tests than were run.`,
    );
  }
  if (cell >= 0 && cell <= 1) return cell;
  throw new BadArgument(`The range pvalues must hold numbers from 0 to 1; ${where} holds ${cell}.`);
}

/**
 * Adjusts several p-values for multiple testing. Returns a range of the same shape; blank cells stay blank and do not count, and any other cell that is not a p-value is refused.
 * @customfunction ADJUST
 * @param pvalues Range with the p-values.
 * @param [method] "holm" (default), "bonferroni", "hochberg", "bh" (Benjamini–Hochberg) or "by" (Benjamini–Yekutieli).
 * @returns The adjusted p-values, same shape.
 * @helpurl https://localhost:3000/help/adjust.html
 * @example =EVENSPLIT.ADJUST(F2:F6, "holm") adjusts the p-values of five paint lines tested at once.
 * @see S. Holm (1979), "A simple sequentially rejective multiple test procedure", Scandinavian Journal of Statistics 6, 65-70.
 */
export function adjust(pvalues: unknown[][], method?: unknown): unknown[][] {
  let cells: Cells = [[null]];
  try {
    cells = cellsArgument("pvalues", pvalues);
    const chosen = chooseWord(ADJUST_METHOD, method);
    // One pass reads the p-values (NaN for a blank cell); the first cell that is not one is refused with its message.
    const read = boundedNumbersFromCells(cells, 0, 1);
    if (read.refused !== null) pValueCell(read.refused.cell, read.refused.row, read.refused.column);
    // adjustPValues keeps NaN (blank) in place and every other value in [0, 1].
    return cellsFromValues(cells, adjustPValues(read.values, chosen), "");
  } catch (thrown) {
    const error = errorFor(thrown);
    return cells.map((row) => row.map(() => error));
  }
}

// ---------------------------------------------------------------------------
// The result block

/** Where REPORT's ranges sit among its arguments, for `invocation.parameterAddresses` (one address per argument, in order). */
const REPORT_DATA_ARGUMENT = 0;
const REPORT_SECOND_ARGUMENT = 5;

/**
 * The addresses of REPORT's ranges as Excel gives them when the metadata asks for parameter addresses
 * (CustomFunctionsRuntime 1.3: Microsoft, "CustomFunctions.Invocation interface", parameterAddresses; the
 * format is SheetName!A1, as "Custom functions parameter options" shows it). Anything else (no invocation,
 * an older host, an argument that is not a reference) leaves the audit row to give the ranges' sizes.
 */
function addressesGiven(invocation: CustomFunctions.Invocation | undefined, isPaired: boolean): BlockInputs["addresses"] {
  const given = invocation?.parameterAddresses;
  const address = (at: number): string | undefined => {
    const text: unknown = given?.[at];
    return typeof text === "string" && text.includes("!") ? text : undefined;
  };
  const data = address(REPORT_DATA_ARGUMENT);
  if (data === undefined) return undefined;
  if (!isPaired) return { data };
  const second = address(REPORT_SECOND_ARGUMENT);
  return second === undefined ? undefined : { data, second };
}

/**
 * The full result of a sign test as a block of two columns, label and value: hypotheses, counts, statistic, p-value, decision, bounds and cautions. Give second for a paired test of second − first.
 * @customfunction REPORT
 * @param data Range with the measurements (the first measurement of each pair for a paired test).
 * @param hypothesized_median The median under test (for a paired test: the median difference, usually 0).
 * @param [alternative] "two-sided" (default), "greater" or "less".
 * @param [alpha] Significance level for the decision, such as 0.05 (default).
 * @param [confidence] Confidence of the bounds, such as 0.95 (default).
 * @param [second] For a paired test: range with the second measurement, same shape as data.
 * @param invocation Filled in by Excel: the addresses of the ranges, which the audit row names.
 * @returns Two columns: label, value.
 * @requiresParameterAddresses
 * @helpurl https://localhost:3000/help/report.html
 * @example =EVENSPLIT.REPORT(Panels[Thickness], 50, "greater") writes the whole sign-test result for the panels as label and value.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 * @see W. R. Thompson (1936), "On confidence ranges for the median and other expectation distributions for populations of unknown distribution form", Annals of Mathematical Statistics 7, 122-128.
 */
export function report(
  data: unknown[][],
  hypothesized_median: unknown,
  alternative?: unknown,
  alpha?: unknown,
  confidence?: unknown,
  second?: unknown[][],
  invocation?: CustomFunctions.Invocation,
): unknown[][] {
  try {
    const isPaired = second !== null && second !== undefined;
    const inputs = isPaired ? pairedCellsArgument(data, second) : { first: cellsArgument("data", data), second: undefined };
    const request: BlockRequest = {
      test: "sign",
      paired: isPaired,
      center: numberArgument(isPaired ? "hypothesized_median (the shift)" : "hypothesized_median", hypothesized_median),
      alternative: chooseWord(ALTERNATIVE, alternative),
      alpha: fractionArgument("alpha", alpha, 0.05, "0.05"),
      confidence: fractionArgument("confidence", confidence, 0.95),
    };
    const cellsIn = { data: inputs.first, second: inputs.second, passedAsArgument: true, addresses: addressesGiven(invocation, isPaired) };
    return resultBlockRows(request).map((row) => {
      const value = reportCell(row.format, blockValue(row.value, cellsIn, callFunction));
      return [row.label, value === null || value === undefined ? "" : value];
    });
  } catch (thrown) {
    const error = errorFor(thrown);
    return [[error, error]];
  }
}

// ---------------------------------------------------------------------------
// Looking again as rows arrive: the sequential versions, where row order matters

/** Calls `use` with the numbers of a range in the order they arrived: down the rows, then across the columns. */
function withArrivingNumbers<T>(data: unknown, use: (values: Float64Array) => T): T {
  return withNumbersInArrivalOrder(cellsArgument("data", data), use);
}

/** One end of the watched bounds: the value, or #N/A saying from which row it will exist. */
function watchedEnd(value: number | null, rowsNeeded: number, rows: number, end: "lower" | "upper"): RowCell {
  if (value !== null) return value;
  const message =
    rowsNeeded === Infinity
      ? `No ${end} bound: this quantile is too close to ${end === "lower" ? 0 : 1} to be bounded ${end === "lower" ? "below" : "above"} at this confidence.`
      : `No ${end} bound yet: at this confidence and quantile the first one comes with row ${rowsNeeded}; there ${rows === 1 ? "is 1 row" : `are ${rows} rows`}.`;
  return unavailableError(unavailable("too-few-values", message, Number.isFinite(rowsNeeded) ? rowsNeeded : undefined));
}

/**
 * Sign-test p-value that may be looked at again after every new row, and acted on the first time it falls below alpha, without raising the false-alarm rate (an ordinary p-value watched that way does). Rows count in order: down the rows, then across the columns.
 * @customfunction WATCHPVALUE
 * @param data Range with the measurements in the order they arrived, such as A2:A400 or Table1[Thickness].
 * @param hypothesized_median The median under test, such as 50.
 * @param [alternative] "two-sided" (default), "greater" (the median is above the hypothesised one) or "less".
 * @param [ties] Values equal to the hypothesised median: "drop" (default), "split" (taken in pairs, one below and one above) or "conservative".
 * @returns The p-value after the last row.
 * @helpurl https://localhost:3000/help/watchpvalue.html
 * @example =EVENSPLIT.WATCHPVALUE(Panels[Thickness], 50, "greater") may be checked after every new panel.
 * @see S. R. Howard, A. Ramdas, J. McAuliffe and J. Sekhon (2021), "Time-uniform, nonparametric, nonasymptotic confidence sequences", Annals of Statistics 49, 1055-1080.
 */
export function watchpvalue(data: unknown[][], hypothesized_median: unknown, alternative?: unknown, ties?: unknown): number | CellError {
  return scalar(() => {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    const options = { alternative: chooseWord(ALTERNATIVE, alternative), ties: chooseWord(TIES, ties) };
    const result = withArrivingNumbers(data, (values) => anytimeSignTest(values, center, options));
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Bounds for the median (or another quantile) that hold at every row count at once, so they may be watched as rows arrive; they only ever narrow. Returns one row: lower, upper, rows used.
 * @customfunction WATCHBOUNDS
 * @param data Range with the measurements in the order they arrived, such as A2:A400 or Table1[Thickness].
 * @param [confidence] Confidence that the bounds hold at every row at once, such as 0.95 (default).
 * @param [quantile] The quantile to bound, such as 0.9; default 0.5 (the median).
 * @returns One row: lower, upper, rows used.
 * @helpurl https://localhost:3000/help/watchbounds.html
 * @example =EVENSPLIT.WATCHBOUNDS(Panels[Thickness], 0.95) gives bounds for the median thickness that may be checked after every new panel.
 * @see S. R. Howard, A. Ramdas, J. McAuliffe and J. Sekhon (2021), "Time-uniform, nonparametric, nonasymptotic confidence sequences", Annals of Statistics 49, 1055-1080.
 */
export function watchbounds(data: unknown[][], confidence?: unknown, quantile?: unknown): unknown[][] {
  return oneRow(3, () => {
    const level = fractionArgument("confidence", confidence, 0.95);
    const q = fractionArgument("quantile", quantile, 0.5, "0.9");
    return watchedBoundsRow(withArrivingNumbers(data, (values) => confidenceSequence(values, { quantile: q, confidence: level })));
  });
}

/** Lower, upper, rows used of a confidence sequence; an end not bounded yet is #N/A saying from which row it comes. */
function watchedBoundsRow(result: ConfidenceSequenceResult | Unavailable): RowCell[] | CellError {
  if (!result.available) return unavailableError(result);
  return [
    watchedEnd(result.lower, result.rowsForLower, result.rows, "lower"),
    watchedEnd(result.upper, result.rowsForUpper, result.rows, "upper"),
    result.rows,
  ];
}

/**
 * Wald's sequential test for the median, read row by row: "continue" while the rows so far cannot decide, then "reject" (the median differs, as p_above states) or "accept" (it is the hypothesised one) at the first row that can; later rows are not read. Set p_above, alpha and beta before the first row. Returns one row: decision, rows used, log likelihood ratio, accept limit, reject limit.
 * @customfunction SPRT
 * @param data Range with the measurements in the order they arrived; values equal to the hypothesised median are left out.
 * @param hypothesized_median The median under test, such as 50.
 * @param p_above The chance that a value lies above the hypothesised median under the alternative to detect, such as 0.75 (or 0.25 for a median below it); not 0.5.
 * @param [alpha] Chance of rejecting when the median is the hypothesised one, such as 0.05 (default).
 * @param [beta] Chance of accepting when values lie above with chance p_above, such as 0.2 (default).
 * @returns One row: decision, rows used (numbers read up to the decision), log likelihood ratio, accept limit, reject limit.
 * @helpurl https://localhost:3000/help/sprt.html
 * @example =EVENSPLIT.SPRT(Panels[Thickness], 50, 0.75) reads the panels in order until it can decide whether the median is 50 µm or values lie above it three times in four.
 * @see A. Wald (1945), "Sequential tests of statistical hypotheses", Annals of Mathematical Statistics 16, 117-186.
 */
export function sprt(data: unknown[][], hypothesized_median: unknown, p_above: unknown, alpha?: unknown, beta?: unknown): unknown[][] {
  try {
    const center = numberArgument("hypothesized_median", hypothesized_median);
    const options = sprtOptions(p_above, alpha, beta);
    return sprtRow(withArrivingNumbers(data, (values) => sequentialRatioTest(values, center, options)));
  } catch (thrown) {
    const error = errorFor(thrown);
    return [[error, error, error, error, error]];
  }
}

/** The SPRT's options from its cells: p_above not 0.5, alpha and beta adding up to less than 1. */
function sprtOptions(p_above: unknown, alpha: unknown, beta: unknown): SprtOptions {
  const pAbove = fractionArgument("p_above", p_above, undefined, "0.75");
  if (pAbove === 0.5)
    throw new BadArgument(
      "Argument p_above must differ from 0.5, the chance under the hypothesised median: give the chance to detect, such as 0.75.",
    );
  const errorI = fractionArgument("alpha", alpha, 0.05, "0.05");
  const errorII = fractionArgument("beta", beta, 0.2, "0.2");
  if (errorI + errorII >= 1)
    throw new BadArgument(`Arguments alpha and beta must add up to less than 1, such as 0.05 and 0.2; got ${errorI} + ${errorII}.`);
  return { pAbove, alpha: errorI, beta: errorII };
}

/** The SPRT's one row: decision, rows (or pairs) read up to it, log likelihood ratio, accept limit, reject limit. */
function sprtRow(r: SprtResult): unknown[][] {
  return [[r.decision, r.rowsUsed, r.logLikelihoodRatio, r.limits.acceptAt, r.limits.rejectAt]];
}

/**
 * The paired differences second − first − shift in the order the pairs arrived (down the rows, then across the
 * columns), by the pairing and rounding rules of the other paired functions.
 */
function arrivingDifferencesOf(first: unknown, second: unknown, shift: number): Float64Array {
  const ranges = pairedCellsArgument(first, second);
  return pairedDifferencesInArrivalOrder(ranges.first, ranges.second, shift).differences;
}

/**
 * Paired sign-test p-value on the differences second − first − shift that may be looked at again after every new pair, and acted on the first time it falls below alpha, without raising the false-alarm rate. Pairs count in order: down the rows, then across the columns; pairs with a blank or non-number on either side are skipped.
 * @customfunction PAIREDWATCHPVALUE
 * @param first Range with the first measurement of each pair (such as before), in the order the pairs arrived.
 * @param second Range with the second measurement, same shape as first (such as after).
 * @param [shift] The median difference under test; default 0.
 * @param [alternative] "two-sided" (default), "greater" (second tends to exceed first + shift) or "less".
 * @param [ties] Differences equal to the shift: "drop" (default), "split" (taken two at a time, one below and one above) or "conservative".
 * @returns The p-value after the last pair.
 * @helpurl https://localhost:3000/help/pairedwatchpvalue.html
 * @example =EVENSPLIT.PAIREDWATCHPVALUE(Nozzle[Before], Nozzle[After], 0, "less") may be checked after every new panel measured before and after the nozzle change.
 * @see S. R. Howard, A. Ramdas, J. McAuliffe and J. Sekhon (2021), "Time-uniform, nonparametric, nonasymptotic confidence sequences", Annals of Statistics 49, 1055-1080.
 */
export function pairedwatchpvalue(
  first: unknown[][],
  second: unknown[][],
  shift?: unknown,
  alternative?: unknown,
  ties?: unknown,
): number | CellError {
  return scalar(() => {
    const moved = shiftOf(shift);
    const options = { alternative: chooseWord(ALTERNATIVE, alternative), ties: chooseWord(TIES, ties) };
    const result = anytimeSignTest(arrivingDifferencesOf(first, second, moved), 0, options);
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Bounds for the median (or another quantile) of the paired differences second − first that hold at every pair count at once, so they may be watched as pairs arrive; they only ever narrow. Returns one row: lower, upper, pairs used.
 * @customfunction PAIREDWATCHBOUNDS
 * @param first Range with the first measurement of each pair, in the order the pairs arrived.
 * @param second Range with the second measurement, same shape as first.
 * @param [confidence] Confidence that the bounds hold at every pair at once, such as 0.95 (default).
 * @param [quantile] The quantile of the differences to bound, such as 0.9; default 0.5 (the median).
 * @returns One row: lower, upper, pairs used.
 * @helpurl https://localhost:3000/help/pairedwatchbounds.html
 * @example =EVENSPLIT.PAIREDWATCHBOUNDS(Nozzle[Before], Nozzle[After], 0.95) bounds the median change After - Before, and may be checked after every new panel.
 * @see S. R. Howard, A. Ramdas, J. McAuliffe and J. Sekhon (2021), "Time-uniform, nonparametric, nonasymptotic confidence sequences", Annals of Statistics 49, 1055-1080.
 */
export function pairedwatchbounds(first: unknown[][], second: unknown[][], confidence?: unknown, quantile?: unknown): unknown[][] {
  return oneRow(3, () => {
    const level = fractionArgument("confidence", confidence, 0.95);
    const q = fractionArgument("quantile", quantile, 0.5, "0.9");
    const differences = arrivingDifferencesOf(first, second, 0);
    const oversized = oversizedDifference(differences);
    if (oversized !== null) return unavailableError(oversized);
    return watchedBoundsRow(confidenceSequence(differences, { quantile: q, confidence: level }));
  });
}

/**
 * Wald's sequential test for the median of the paired differences second − first − shift, read pair by pair: "continue" while the pairs so far cannot decide, then "reject" or "accept" at the first pair that can; later pairs are not read. Set p_above, alpha and beta before the first pair. Returns one row: decision, pairs used, log likelihood ratio, accept limit, reject limit.
 * @customfunction PAIREDSPRT
 * @param first Range with the first measurement of each pair, in the order the pairs arrived; pairs with a blank or non-number on either side are skipped.
 * @param second Range with the second measurement, same shape as first.
 * @param shift The median difference under test, usually 0 (left empty: 0); differences equal to it are left out.
 * @param p_above The chance that a difference lies above the shift under the alternative to detect, such as 0.75 (or 0.25 for one below it); not 0.5.
 * @param [alpha] Chance of rejecting when the median difference is the shift, such as 0.05 (default).
 * @param [beta] Chance of accepting when differences lie above with chance p_above, such as 0.2 (default).
 * @returns One row: decision, pairs used (pairs read up to the decision), log likelihood ratio, accept limit, reject limit.
 * @helpurl https://localhost:3000/help/pairedsprt.html
 * @example =EVENSPLIT.PAIREDSPRT(Nozzle[Before], Nozzle[After], 0, 0.25) reads the panels in order until it can decide whether the nozzle change leaves the thickness alone or makes three panels in four thinner.
 * @see A. Wald (1945), "Sequential tests of statistical hypotheses", Annals of Mathematical Statistics 16, 117-186.
 */
export function pairedsprt(
  first: unknown[][],
  second: unknown[][],
  shift: unknown,
  p_above: unknown,
  alpha?: unknown,
  beta?: unknown,
): unknown[][] {
  try {
    const moved = shiftOf(shift);
    const options = sprtOptions(p_above, alpha, beta);
    return sprtRow(sequentialRatioTest(arrivingDifferencesOf(first, second, moved), 0, options));
  } catch (thrown) {
    const error = errorFor(thrown);
    return [[error, error, error, error, error]];
  }
}

// ---------------------------------------------------------------------------
// Calling the catalogue by id (REPORT, and the demo page's formula evaluator)

type CatalogueFunction = (...args: unknown[]) => unknown;

const CATALOGUE: Readonly<Record<string, CatalogueFunction>> = {
  COUNTS: counts as CatalogueFunction,
  PVALUE: pvalue as CatalogueFunction,
  STATISTIC: statistic as CatalogueFunction,
  PAIRED: paired as CatalogueFunction,
  PAIREDSTATISTIC: pairedstatistic as CatalogueFunction,
  PAIREDCOUNTS: pairedcounts as CatalogueFunction,
  BOUNDS: bounds as CatalogueFunction,
  PAIREDBOUNDS: pairedbounds as CatalogueFunction,
  QUANTILEPVALUE: quantilepvalue as CatalogueFunction,
  QUANTILEBOUNDS: quantilebounds as CatalogueFunction,
  SIGNRANK: signrank as CatalogueFunction,
  PAIREDSIGNRANK: pairedsignrank as CatalogueFunction,
  SIGNRANKSTATISTIC: signrankstatistic as CatalogueFunction,
  PAIREDSIGNRANKSTATISTIC: pairedsignrankstatistic as CatalogueFunction,
  HODGESLEHMANN: hodgeslehmann as CatalogueFunction,
  PAIREDHODGESLEHMANN: pairedhodgeslehmann as CatalogueFunction,
  POWER: power as CatalogueFunction,
  SAMPLESIZE: samplesize as CatalogueFunction,
  ADJUST: adjust as CatalogueFunction,
  REPORT: report as CatalogueFunction,
  WATCHPVALUE: watchpvalue as CatalogueFunction,
  WATCHBOUNDS: watchbounds as CatalogueFunction,
  SPRT: sprt as CatalogueFunction,
  PAIREDWATCHPVALUE: pairedwatchpvalue as CatalogueFunction,
  PAIREDWATCHBOUNDS: pairedwatchbounds as CatalogueFunction,
  PAIREDSPRT: pairedsprt as CatalogueFunction,
  COUNTPVALUE: countpvalue as CatalogueFunction,
  ORDERRANKS: orderranks as CatalogueFunction,
  TWOGROUPS: twogroups as CatalogueFunction,
  SHIFT: shift as CatalogueFunction,
  GROUPS: groups as CatalogueFunction,
  BYGROUP: bygroup as CatalogueFunction,
  LABELEDTWOGROUPS: labeledtwogroups as CatalogueFunction,
  LABELEDSHIFT: labeledshift as CatalogueFunction,
  TWOGROUPSSTATISTIC: twogroupsstatistic as CatalogueFunction,
  LABELEDTWOGROUPSSTATISTIC: labeledtwogroupsstatistic as CatalogueFunction,
};

/** Every catalogue id, as registered under the EVENSPLIT namespace. */
export const FUNCTION_IDS: readonly string[] = Object.keys(CATALOGUE);

/**
 * Runs a catalogue function by id (without the namespace) on cell matrices,
 * numbers and words, as the spreadsheet would (missing trailing arguments
 * mean their defaults, as omitted ones do). Returns a number, a matrix, or a
 * cell error. An unknown id is a programming error (RangeError).
 *
 * @example
 * callFunction("PVALUE", [[[52], [49], [55]], 50, "greater"]); // 0.5
 * callFunction("COUNTS", [[[52], [49], [55]], 50]);             // [[1, 0, 2, 3]]
 */
export function callFunction(id: string, args: readonly unknown[]): unknown {
  const fn = Object.prototype.hasOwnProperty.call(CATALOGUE, id) ? CATALOGUE[id] : undefined;
  if (fn === undefined) throw new RangeError(`no EVENSPLIT function ${id}`);
  return fn(...args);
}

// ---------------------------------------------------------------------------
// Two groups and many groups

import { summariseGroups, type Missing } from "../stats/byGroup";
import { groupCells, type GroupedCells } from "../stats/groupedCells";
import { kruskalWallisTest } from "../stats/kruskalWallis";
import { moodMedianTest } from "../stats/moodMedian";
import { exactSizeLimit, rankSumTest } from "../stats/rankSum";
import { shiftBounds, shiftEstimate } from "../stats/shiftBounds";
import { cellError } from "./runtime";

/** The numbers of one group's range (any shape; blank and non-number cells are skipped). */
function groupNumbers(name: string, raw: unknown): Float64Array {
  return numbersFromCells(cellsArgument(name, raw)).values;
}

/** Values and labels grouped; the two ranges must have the same shape, position by position. */
function groupsOf(values: unknown, labels: unknown): GroupedCells {
  const v = cellsArgument("values", values);
  const l = cellsArgument("labels", labels);
  if (v.length !== l.length || v[0].length !== l[0].length) {
    const shape = (c: Cells) => `${c.length} row${c.length === 1 ? "" : "s"} × ${c[0].length} column${c[0].length === 1 ? "" : "s"}`;
    throw new BadArgument(
      `Arguments values and labels must have the same shape, the label of each value beside it: values is ${shape(v)}, labels is ${shape(l)}.`,
    );
  }
  return groupCells(v, l);
}

/**
 * P-value comparing two independent groups (not pairs: different items in each), such as two lines or two suppliers. The rank-sum method compares whole distributions; it speaks of a shift of medians only when the groups have the same shape.
 * @customfunction TWOGROUPS
 * @param first Range with the first group's measurements.
 * @param second Range with the second group's measurements; any size.
 * @param [shift] The shift second − first under test; default 0.
 * @param [alternative] "two-sided" (default), "greater" (second tends to exceed first + shift) or "less".
 * @param [method] "rank-sum" (default: Wilcoxon–Mann–Whitney, exact for small groups) or "median" (Mood's test, Fisher exact on above / not above the pooled median).
 * @param [at_median] Median method only, values equal to the pooled median: "join-lower" (default: counted as not above), "join-upper" (counted as above) or "leave-out".
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/twogroups.html
 * @example =EVENSPLIT.TWOGROUPS(LineA[Thickness], LineB[Thickness]) compares panels from two paint lines (invented tables LineA and LineB).
 * @see H. B. Mann and D. R. Whitney (1947), "On a test of whether one of two random variables is stochastically larger than the other", Annals of Mathematical Statistics 18, 50-60.
 * @see A. M. Mood (1950), "Introduction to the Theory of Statistics", McGraw-Hill (the median test).
 */
export function twogroups(
  first: unknown[][],
  second: unknown[][],
  shift?: unknown,
  alternative?: unknown,
  method?: unknown,
  at_median?: unknown,
): number | CellError {
  return scalar(() => {
    const x = groupNumbers("first", first);
    const options = twoGroupOptions(shift, alternative, method, at_median);
    return twoGroupPValue(x, groupNumbers("second", second), options);
  });
}

/**
 * The rank-sum statistic U of two groups (the pairs in which second − shift exceeds first, a tie counting 1/2) and the method TWOGROUPS' rank-sum p-value uses on them: "exact" or "normal". Returns one row: U, method.
 * @customfunction TWOGROUPSSTATISTIC
 * @param first Range with the first group's measurements.
 * @param second Range with the second group's measurements; any size.
 * @param [shift] The shift second − first under test; default 0.
 * @returns One row: U, method.
 * @helpurl https://localhost:3000/help/twogroupsstatistic.html
 * @example =EVENSPLIT.TWOGROUPSSTATISTIC(LineA[Thickness], LineB[Thickness]) counts the pairs of panels in which line B's is the thicker and says whether TWOGROUPS' p-value is exact.
 * @see H. B. Mann and D. R. Whitney (1947), "On a test of whether one of two random variables is stochastically larger than the other", Annals of Mathematical Statistics 18, 50-60.
 */
export function twogroupsstatistic(first: unknown[][], second: unknown[][], shift?: unknown): unknown[][] {
  return oneRow(2, () => {
    const x = groupNumbers("first", first);
    const moved = shiftOf(shift);
    return rankSumRow(x, groupNumbers("second", second), moved);
  });
}

/** U and the method the rank-sum p-value uses (rankSum.ts decides it from the size and the ties). */
function rankSumRow(x: Float64Array, y: Float64Array, moved: number): RowCell[] | CellError {
  // "normal" gives U and whether values tie without the exact distribution, which U does not need.
  const result = rankSumTest(x, y, { shift: moved, method: "normal" });
  if (!result.available) return unavailableError(result);
  return [result.statistic, x.length + y.length <= exactSizeLimit("auto", result.tiesPresent) ? "exact" : "normal"];
}

/** The canonical words of a vocabulary. */
type WordOf<V> = V extends Vocabulary<infer T> ? T : never;

/** TWOGROUPS' options, checked. */
interface TwoGroupOptions {
  moved: number;
  alternative: WordOf<typeof ALTERNATIVE>;
  method: WordOf<typeof TWO_GROUP_METHOD>;
  rule: WordOf<typeof AT_MEDIAN>;
}

function twoGroupOptions(shift: unknown, alternative: unknown, method: unknown, at_median: unknown): TwoGroupOptions {
  return {
    moved: shiftOf(shift),
    alternative: chooseWord(ALTERNATIVE, alternative),
    method: chooseWord(TWO_GROUP_METHOD, method),
    rule: chooseWord(AT_MEDIAN, at_median),
  };
}

/** The p-value TWOGROUPS gives for two groups' numbers (LABELEDTWOGROUPS gives the same). */
function twoGroupPValue(x: Float64Array, y: Float64Array, options: TwoGroupOptions): number | CellError {
  if (options.method === "rank-sum") {
    const result = rankSumTest(x, y, { shift: options.moved, alternative: options.alternative });
    return result.available ? result.pValue : unavailableError(result);
  }
  const moved = options.moved;
  const result = moodMedianTest([x, moved === 0 ? y : differencesFrom(y, moved)], { ties: options.rule, alternative: options.alternative });
  return result.available ? result.pValue : unavailableError(result);
}

/**
 * Hodges–Lehmann shift between two independent groups (the median of all differences second − first) with distribution-free bounds. Returns one row: estimate, lower, upper, coverage (exact for continuous data differing by a shift).
 * @customfunction SHIFT
 * @param first Range with the first group's measurements.
 * @param second Range with the second group's measurements; any size.
 * @param [confidence] Confidence of the bounds, such as 0.95 (default).
 * @returns One row: estimate, lower, upper, coverage.
 * @helpurl https://localhost:3000/help/shift.html
 * @example =EVENSPLIT.SHIFT(LineA[Thickness], LineB[Thickness], 0.95) estimates how much thicker line B paints than line A, with bounds.
 * @see J. L. Hodges and E. L. Lehmann (1963), "Estimates of location based on rank tests", Annals of Mathematical Statistics 34, 598-611.
 */
export function shift(first: unknown[][], second: unknown[][], confidence?: unknown): unknown[][] {
  return oneRow(4, () => {
    const x = groupNumbers("first", first);
    const y = groupNumbers("second", second);
    return shiftRow(x, y, fractionArgument("confidence", confidence, 0.95));
  });
}

/** The row SHIFT gives for two groups' numbers (LABELEDSHIFT gives the same). */
function shiftRow(x: Float64Array, y: Float64Array, level: number): RowCell[] | CellError {
  const result = shiftBounds(x, y, { confidence: level });
  if (result.available) return [result.estimate, result.lower ?? "", result.upper ?? "", result.achievedConfidence];
  const estimate = shiftEstimate(x, y);
  if (typeof estimate !== "number") return unavailableError(estimate);
  const missing = unavailableError(result);
  return [estimate, missing, missing, missing];
}

/**
 * P-value for "all groups share one median" (median method) or "all groups come from one distribution" (rank method), for a column of values and a column of group labels.
 * @customfunction GROUPS
 * @param values Range with the measurements, such as B2:B200.
 * @param labels Range with each value's group label beside it, same shape, such as A2:A200. Rows with a blank label are skipped.
 * @param [method] "median" (default: Mood's median test; chi-square, or a seeded simulation when counts are small) or "rank" (Kruskal–Wallis, tie-corrected).
 * @param [at_median] Median method only, values equal to the pooled median: "join-lower" (default), "join-upper" or "leave-out".
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/groups.html
 * @example =EVENSPLIT.GROUPS(Panels[Thickness], Panels[Line]) asks whether every paint line shares one median thickness (Line: an invented column naming each panel's line).
 * @see A. M. Mood (1950), "Introduction to the Theory of Statistics", McGraw-Hill (the median test).
 * @see W. H. Kruskal and W. A. Wallis (1952), "Use of ranks in one-criterion variance analysis", Journal of the American Statistical Association 47, 583-621.
 */
export function groups(values: unknown[][], labels: unknown[][], method?: unknown, at_median?: unknown): number | CellError {
  return scalar(() => {
    const chosen = chooseWord(MANY_GROUP_METHOD, method);
    const rule = chooseWord(AT_MEDIAN, at_median);
    const grouped = groupsOf(values, labels).groups.map((g) => g.values);
    const result = chosen === "rank" ? kruskalWallisTest(grouped) : moodMedianTest(grouped, { ties: rule });
    return result.available ? result.pValue : unavailableError(result);
  });
}

/** The header row of BYGROUP. */
const BY_GROUP_HEADER = ["Group", "Count", "Median", "Lower bound", "Upper bound", "Coverage", "Sign-test p", "Adjusted p"];

/** A cell of a BYGROUP row: the number, empty for a bound not asked for, or #N/A saying why. */
function groupCell(value: number | null | Missing): number | string | CellError {
  if (value === null) return "";
  if (typeof value === "number") return value;
  return cellError("#N/A", value.missing);
}

/**
 * Per group: count, median, distribution-free bounds for the median with their coverage, the sign-test p-value against a hypothesised median and the p-values adjusted across groups. Returns a table with a header row and a row per group, in order of first appearance.
 * @customfunction BYGROUP
 * @param values Range with the measurements, such as B2:B200.
 * @param labels Range with each value's group label beside it, same shape, such as A2:A200. Rows with a blank label are skipped and counted in a last row.
 * @param [hypothesized_median] The median under test for every group, such as 50. Leave it out (nothing between the commas) for the counts, medians and bounds alone: the two p-value columns are then empty.
 * @param [alternative] "two-sided" (default: two-sided bounds), "greater" (a lower bound) or "less" (an upper bound).
 * @param [confidence] Confidence of the bounds, such as 0.95 (default).
 * @param [adjust] Adjustment across groups: "holm" (default), "bonferroni", "hochberg", "bh" or "by".
 * @returns A table: header row, then one row per group.
 * @helpurl https://localhost:3000/help/bygroup.html
 * @example =EVENSPLIT.BYGROUP(Panels[Thickness], Panels[Line], 50) gives, for each paint line, its count, median, bounds and sign-test p-value against 50 µm.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 * @see W. R. Thompson (1936), "On confidence ranges for the median and other expectation distributions for populations of unknown distribution form", Annals of Mathematical Statistics 7, 122-128.
 * @see S. Holm (1979), "A simple sequentially rejective multiple test procedure", Scandinavian Journal of Statistics 6, 65-70.
 */
export function bygroup(
  values: unknown[][],
  labels: unknown[][],
  hypothesized_median?: unknown,
  alternative?: unknown,
  confidence?: unknown,
  adjust?: unknown,
): unknown[][] {
  try {
    // Left out: no test against a target; the summary still needs a centre, and its p-values are not shown.
    const tested = hypothesized_median !== null && hypothesized_median !== undefined && hypothesized_median !== "";
    const center = tested ? numberArgument("hypothesized_median", hypothesized_median) : 0;
    const chosenAlternative = chooseWord(ALTERNATIVE, alternative);
    const level = fractionArgument("confidence", confidence, 0.95);
    const method = chooseWord(ADJUST_ACROSS_GROUPS, adjust);
    const grouped = groupsOf(values, labels);
    if (grouped.groups.length === 0) return [BY_GROUP_HEADER.map(() => cellError("#N/A", "No row has both a group label and a value."))];
    const summary = summariseGroups(
      grouped.groups.map((g) => g.values),
      center,
      { alternative: chosenAlternative, confidence: level, adjust: method },
    );
    const rows: unknown[][] = summary.rows.map((row, g) => [
      grouped.groups[g].label,
      row.n,
      ...[row.median, row.lower, row.upper, row.coverage].map(groupCell),
      ...(tested ? [row.pValue, row.adjustedPValue].map(groupCell) : ["", ""]),
    ]);
    const skipped = grouped.blankLabels + grouped.labelErrors;
    if (skipped > 0) rows.push(["Rows without a usable label (skipped)", skipped, "", "", "", "", "", ""]);
    return [BY_GROUP_HEADER, ...rows];
  } catch (thrown) {
    return [BY_GROUP_HEADER.map(() => errorFor(thrown))];
  }
}

/** A group label given as an argument: one cell's value or a typed label, never blank. */
function labelArgument(name: string, raw: unknown): string | number | boolean {
  const cell = Array.isArray(raw) && raw.length === 1 && Array.isArray(raw[0]) && raw[0].length === 1 ? (raw[0] as unknown[])[0] : raw;
  if (typeof cell === "string" && cell !== "") return cell;
  if (typeof cell === "number" || typeof cell === "boolean") return cell;
  throw new BadArgument(`Argument ${name} must be a group label as the labels column shows it, such as "Line A" or a cell holding one.`);
}

/** Whether a label of the column is the label asked for, by groupCells' rule: text ignoring case, numbers and logical values as they are. */
function sameLabel(found: string | number | boolean, wanted: string | number | boolean): boolean {
  if (typeof found === "string" && typeof wanted === "string") return found.toLowerCase() === wanted.toLowerCase();
  return found === wanted;
}

/** A label as a message quotes it. */
function shownLabel(label: string | number | boolean): string {
  if (typeof label === "string") return `"${label}"`;
  if (typeof label === "boolean") return label ? "TRUE" : "FALSE";
  return String(label);
}

/** The labels found, for a message: the first few, and how many more. */
function labelsFound(grouped: GroupedCells): string {
  const shown = grouped.groups.slice(0, 6).map((g) => shownLabel(g.label));
  const more = grouped.groups.length - shown.length;
  if (shown.length === 0) return "no labels";
  return shown.join(", ") + (more > 0 ? ` and ${more} more` : "");
}

/** The numbers of the group with one label; #N/A naming the label when no value carries it. */
function labeledGroup(grouped: GroupedCells, name: string, wanted: string | number | boolean): Float64Array | CellError {
  const group = grouped.groups.find((g) => sameLabel(g.label, wanted));
  if (group === undefined) {
    const textTwin = typeof wanted === "number" && grouped.groups.some((g) => g.label === String(wanted));
    const hint = textTwin ? ` The column holds ${shownLabel(String(wanted))} as text: give ${name} as text too.` : "";
    return cellError("#N/A", `Label ${shownLabel(wanted)} (${name}) was not found in labels; found ${labelsFound(grouped)}.${hint}`);
  }
  if (group.values.length === 0) return cellError("#N/A", `Label ${shownLabel(wanted)} (${name}) has no numbers beside it in values.`);
  return group.values;
}

/** The two groups named by their labels, in the order asked: first, second. */
function labeledPair(
  values: unknown,
  labels: unknown,
  first_label: unknown,
  second_label: unknown,
): { x: Float64Array; y: Float64Array } | CellError {
  const firstLabel = labelArgument("first_label", first_label);
  const secondLabel = labelArgument("second_label", second_label);
  if (sameLabel(firstLabel, secondLabel)) {
    throw new BadArgument(
      `Arguments first_label and second_label name the same group (${shownLabel(firstLabel)}): give two different labels.`,
    );
  }
  const grouped = groupsOf(values, labels);
  const x = labeledGroup(grouped, "first_label", firstLabel);
  if (!(x instanceof Float64Array)) return x;
  const y = labeledGroup(grouped, "second_label", secondLabel);
  if (!(y instanceof Float64Array)) return y;
  return { x, y };
}

/**
 * P-value comparing two groups picked by their labels from a column of values and a column of group labels; the same p-value as TWOGROUPS on the two groups' values. The rank-sum method compares whole distributions; it speaks of a shift of medians only when the groups have the same shape.
 * @customfunction LABELEDTWOGROUPS
 * @param values Range with the measurements, such as B2:B200.
 * @param labels Range with each value's group label beside it, same shape, such as A2:A200. Rows with a blank label are skipped; text labels match ignoring case.
 * @param first_label Label of the first group as the labels column shows it, such as Line A (in quotes when typed), or a cell holding it.
 * @param second_label Label of the second group, such as Line B (in quotes when typed), or a cell holding it.
 * @param [shift] The shift second − first under test; default 0.
 * @param [alternative] "two-sided" (default), "greater" (second tends to exceed first + shift) or "less".
 * @param [method] "rank-sum" (default: Wilcoxon–Mann–Whitney, exact for small groups) or "median" (Mood's test, Fisher exact on above / not above the pooled median).
 * @param [at_median] Median method only, values equal to the pooled median: "join-lower" (default: counted as not above), "join-upper" (counted as above) or "leave-out".
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/labeledtwogroups.html
 * @example =EVENSPLIT.LABELEDTWOGROUPS(Panels[Thickness], Panels[Line], "Line A", "Line B") compares the panels of two paint lines kept in one table (Line: an invented column naming each panel's line).
 * @see H. B. Mann and D. R. Whitney (1947), "On a test of whether one of two random variables is stochastically larger than the other", Annals of Mathematical Statistics 18, 50-60.
 * @see A. M. Mood (1950), "Introduction to the Theory of Statistics", McGraw-Hill (the median test).
 */
export function labeledtwogroups(
  values: unknown[][],
  labels: unknown[][],
  first_label: unknown,
  second_label: unknown,
  shift?: unknown,
  alternative?: unknown,
  method?: unknown,
  at_median?: unknown,
): number | CellError {
  return scalar(() => {
    const options = twoGroupOptions(shift, alternative, method, at_median);
    const pair = labeledPair(values, labels, first_label, second_label);
    return "x" in pair ? twoGroupPValue(pair.x, pair.y, options) : pair;
  });
}

/**
 * Hodges–Lehmann shift between two groups picked by their labels from a column of values and a column of group labels (the median of all differences second − first) with distribution-free bounds; the same row as SHIFT on the two groups' values. Returns one row: estimate, lower, upper, coverage.
 * @customfunction LABELEDSHIFT
 * @param values Range with the measurements, such as B2:B200.
 * @param labels Range with each value's group label beside it, same shape, such as A2:A200. Rows with a blank label are skipped; text labels match ignoring case.
 * @param first_label Label of the first group as the labels column shows it, such as Line A (in quotes when typed), or a cell holding it.
 * @param second_label Label of the second group, such as Line B (in quotes when typed), or a cell holding it.
 * @param [confidence] Confidence of the bounds, such as 0.95 (default).
 * @returns One row: estimate, lower, upper, coverage.
 * @helpurl https://localhost:3000/help/labeledshift.html
 * @example =EVENSPLIT.LABELEDSHIFT(Panels[Thickness], Panels[Line], "Line A", "Line B", 0.95) estimates how much thicker line B paints than line A, with bounds, from one table of panels.
 * @see J. L. Hodges and E. L. Lehmann (1963), "Estimates of location based on rank tests", Annals of Mathematical Statistics 34, 598-611.
 */
export function labeledshift(
  values: unknown[][],
  labels: unknown[][],
  first_label: unknown,
  second_label: unknown,
  confidence?: unknown,
): unknown[][] {
  return oneRow(4, () => {
    const level = fractionArgument("confidence", confidence, 0.95);
    const pair = labeledPair(values, labels, first_label, second_label);
    return "x" in pair ? shiftRow(pair.x, pair.y, level) : pair;
  });
}

/**
 * The rank-sum statistic U and the method of LABELEDTWOGROUPS' rank-sum p-value, for two groups picked by their labels from a column of values and a column of group labels; the same row as TWOGROUPSSTATISTIC on the two groups' values. Returns one row: U, method.
 * @customfunction LABELEDTWOGROUPSSTATISTIC
 * @param values Range with the measurements, such as B2:B200.
 * @param labels Range with each value's group label beside it, same shape, such as A2:A200. Rows with a blank label are skipped; text labels match ignoring case.
 * @param first_label Label of the first group as the labels column shows it, such as Line A (in quotes when typed), or a cell holding it.
 * @param second_label Label of the second group, such as Line B (in quotes when typed), or a cell holding it.
 * @param [shift] The shift second − first under test; default 0.
 * @returns One row: U, method.
 * @helpurl https://localhost:3000/help/labeledtwogroupsstatistic.html
 * @example =EVENSPLIT.LABELEDTWOGROUPSSTATISTIC(Panels[Thickness], Panels[Line], "Line A", "Line B") counts the pairs of panels in which line B's is the thicker, from one table of panels (Line: an invented column naming each panel's line).
 * @see H. B. Mann and D. R. Whitney (1947), "On a test of whether one of two random variables is stochastically larger than the other", Annals of Mathematical Statistics 18, 50-60.
 */
export function labeledtwogroupsstatistic(
  values: unknown[][],
  labels: unknown[][],
  first_label: unknown,
  second_label: unknown,
  shift?: unknown,
): unknown[][] {
  return oneRow(2, () => {
    const moved = shiftOf(shift);
    const pair = labeledPair(values, labels, first_label, second_label);
    return "x" in pair ? rankSumRow(pair.x, pair.y, moved) : pair;
  });
}

// ---------------------------------------------------------------------------
// From counts: the sign test and the ranks of the bounds without the values, for data summarised elsewhere
// (a report of counts, a pivot table, a database that returns the counts and two order statistics)

/** A count of values: a whole number from 0 to LARGEST_N. */
function countArgument(name: string, raw: unknown): number {
  const x = numberArgument(name, raw, undefined, "18");
  if (Number.isInteger(x) && x >= 0 && x <= LARGEST_N) return x;
  throw new BadArgument(`Argument ${name} must be a whole number of values from 0 to 1,000,000,000, such as 18; got ${x}.`);
}

/**
 * Sign-test p-value from counts: how many values lie above and below the hypothesised median, values equal to it already left out. Gives the same p-value as PVALUE on the values themselves.
 * @customfunction COUNTPVALUE
 * @param above How many values lie above the hypothesised median, such as 18.
 * @param below How many values lie below it, such as 7. Leave out values equal to it.
 * @param [alternative] "two-sided" (default), "greater" (the median is above the hypothesised one) or "less".
 * @param [method] "exact" (default, binomial), "midp" or "normal" (approximation).
 * @returns The p-value.
 * @helpurl https://localhost:3000/help/countpvalue.html
 * @example =EVENSPLIT.COUNTPVALUE(14, 4, "greater") gives the sign-test p-value when 14 panels came out above 50 µm and 4 below.
 * @see W. J. Dixon and A. M. Mood (1946), "The statistical sign test", Journal of the American Statistical Association 41, 557-566.
 */
export function countpvalue(above: unknown, below: unknown, alternative?: unknown, method?: unknown): number | CellError {
  return scalar(() => {
    const counts: SignCounts = { below: countArgument("below", below), tied: 0, above: countArgument("above", above) };
    if (counts.below + counts.above > LARGEST_N) {
      throw new BadArgument(
        `Arguments above and below may add up to at most 1,000,000,000 values; they add up to ${counts.below + counts.above}.`,
      );
    }
    const result = signTestOf(counts, alternative, null, method);
    return result.available ? result.pValue : unavailableError(result);
  });
}

/**
 * Which order statistics bound the median (or another quantile) of n values, and their exact coverage: fetch the bounds as SMALL(range, lower rank) and SMALL(range, upper rank), or with a window function in a database. Returns one row: lower rank, upper rank, exact coverage; "" for an end not asked for.
 * @customfunction ORDERRANKS
 * @param n Number of values, such as 40.
 * @param [confidence] Confidence, such as 0.95 (default).
 * @param [quantile] Which quantile, between 0 and 1: 0.5 (default) is the median, 0.9 the value 90% fall below.
 * @param [side] "two-sided" (default), "lower" (a lower bound only) or "upper".
 * @returns One row: lower rank, upper rank, exact coverage.
 * @helpurl https://localhost:3000/help/orderranks.html
 * @example =EVENSPLIT.ORDERRANKS(30, 0.95) gives which sorted positions of 30 panels bound their median thickness, and the exact coverage.
 * @see W. R. Thompson (1936), "On confidence ranges for the median and other expectation distributions for populations of unknown distribution form", Annals of Mathematical Statistics 7, 122-128.
 */
export function orderranks(n: unknown, confidence?: unknown, quantile?: unknown, side?: unknown): unknown[][] {
  return oneRow(3, () => {
    const size = sampleSizeArgument("n", n);
    const level = fractionArgument("confidence", confidence, 0.95);
    const q = fractionArgument("quantile", quantile, 0.5, "0.9");
    const result = boundRanks(size, q, level, chooseWord(SIDE, side));
    if (!result.available) return unavailableError(result);
    return [result.lowerRank ?? "", result.upperRank ?? "", result.achievedConfidence];
  });
}
