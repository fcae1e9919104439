/**
 * The installation check's reference cases: calls of the cell functions whose answers are known from outside
 * Evensplit, each with its expected value, where that value comes from, and how far the answer may lie from it.
 * A lab that must show the installed software computes correctly (installation and operational qualification
 * are common practice under quality systems) runs them through the same function layer the cells use.
 *
 * Method: each case is evaluated by the catalogue's `callFunction` (src/functions/functions.ts), or any
 * stand-in with its signature, so a broken function fails its cases; the difference is answer − expected and
 * the case passes when its size is at most the tolerance. Sources are exact arithmetic (the sum is written
 * out), a published table named with its edition ("from memory" where recalled), or R 4.2 through the
 * committed fixtures.
 *
 * Cost: the cost of the calls, all on at most 25 values: well under a millisecond each.
 */
import type { CatalogueCall } from "./resultBlock";

/** One reference case. */
export interface ReferenceCase {
  /** Short stable name, for the record. */
  readonly id: string;
  /** What is computed, in words. */
  readonly what: string;
  /** Catalogue id without the namespace, such as "PVALUE". */
  readonly fn: string;
  /** The arguments as a cell passes them: ranges as rows of cells, numbers, words. */
  readonly args: readonly unknown[];
  /** 1-based position in a one-row answer; absent for a single value. */
  readonly column?: number;
  readonly expected: number;
  /** Where the expected value comes from. */
  readonly source: string;
  /** Largest accepted |answer − expected|. */
  readonly tolerance: number;
}

/** How a case came out on this installation. */
export interface CaseOutcome {
  readonly reference: ReferenceCase;
  /** The answer, or the code of the error it gave (such as "#N/A"). */
  readonly actual: number | string;
  /** answer − expected, or null when there was no number. */
  readonly difference: number | null;
  readonly passed: boolean;
}

const column = (...values: number[]): number[][] => values.map((v) => [v]);

/** Twenty-five invented batch results (µm): 18 above 50, 7 below, none at 50. */
const BATCHES = column(51, 52, 53, 54, 55, 56, 57, 58, 59, 60, 61, 62, 63, 64, 65, 66, 67, 68, 41, 42, 43, 44, 45, 46, 47);
/** Ten invented paired differences: only 8 positive, so T+ = 8. */
const DIFFERENCES = column(-1, -2, -3, -4, -5, -6, -7, 8, -9, -10);

/** Exact sign-test tail P(X >= 18), X ~ Bin(25, 1/2). */
const TAIL_18_OF_25 = 363103 / 16777216;

/**
 * The reference cases, in the order a check lists them.
 *
 * @example
 * REFERENCE_CASES[0]; // { id: "sign-3-of-3", fn: "PVALUE", expected: 0.125, tolerance: 1e-15, ... }
 */
export const REFERENCE_CASES: readonly ReferenceCase[] = [
  {
    id: "sign-3-of-3",
    what: "Sign test, three values all above 50, one-sided",
    fn: "PVALUE",
    args: [column(51, 52, 53), 50, "greater"],
    expected: 0.125,
    source: "Exact arithmetic: (1/2)^3 = 1/8",
    tolerance: 1e-15,
  },
  {
    id: "sign-2-of-10",
    what: "Sign test, 2 of 10 values below 50, two-sided",
    fn: "PVALUE",
    args: [column(48, 49, 51, 52, 53, 54, 55, 56, 57, 58), 50, "two-sided"],
    expected: 0.109375,
    source: "Exact arithmetic: 2 (C(10,0) + C(10,1) + C(10,2)) / 2^10 = 112/1024",
    tolerance: 1e-15,
  },
  {
    id: "sign-18-of-25",
    what: "Sign test on 25 values, 18 above 50, one-sided",
    fn: "PVALUE",
    args: [BATCHES, 50, "greater"],
    expected: TAIL_18_OF_25,
    source:
      'Exact arithmetic: (C(25,18) + … + C(25,25)) / 2^25 = 363103/16777216; R 4.2 binom.test(18, 25, alternative = "greater") agrees (test/fixtures/counts.json)',
    tolerance: 1e-15,
  },
  {
    id: "counts-18-7",
    what: "Sign test from counts 18 above, 7 below, one-sided",
    fn: "COUNTPVALUE",
    args: [18, 7, "greater"],
    expected: TAIL_18_OF_25,
    source: "Exact arithmetic: (C(25,18) + … + C(25,25)) / 2^25 = 363103/16777216",
    tolerance: 1e-15,
  },
  {
    id: "counts-18-7-midp",
    what: "Mid-p sign test from counts 18 above, 7 below, one-sided",
    fn: "COUNTPVALUE",
    args: [18, 7, "greater", "midp"],
    expected: 15183 / 1048576,
    source: "Exact arithmetic: (C(25,19) + … + C(25,25)) / 2^25 + C(25,18) / 2^26 = 15183/1048576",
    tolerance: 1e-15,
  },
  {
    id: "counts-18-7-normal",
    what: "Normal approximation with continuity correction, 18 above, 7 below, one-sided",
    fn: "COUNTPVALUE",
    args: [18, 7, "greater", "normal"],
    expected: 0.02275013194817922,
    source:
      "Exact arithmetic to the normal tail: z = (18 − 12.5 − 0.5) / 2.5 = 2; 1 − Φ(2) = erfc(√2)/2 = 0.0227501319481792; a normal table gives Φ(2.00) = 0.9772 (from memory)",
    tolerance: 1e-12,
  },
  {
    id: "ranks-10",
    what: "Ranks of the 95% bounds for the median of 10 values: lower",
    fn: "ORDERRANKS",
    args: [10],
    column: 1,
    expected: 2,
    source: "Exact arithmetic: P(X <= 1) = 11/1024 <= 0.025 < P(X <= 2) = 56/1024, X ~ Bin(10, 1/2)",
    tolerance: 0,
  },
  {
    id: "ranks-10-upper",
    what: "Ranks of the 95% bounds for the median of 10 values: upper",
    fn: "ORDERRANKS",
    args: [10],
    column: 2,
    expected: 9,
    source: "Exact arithmetic: by symmetry, 10 + 1 − 2",
    tolerance: 0,
  },
  {
    id: "bounds-10-coverage",
    what: "Coverage of the median bounds from the 2nd and 9th of 10 values",
    fn: "BOUNDS",
    args: [column(5.5, 1.5, 9.5, 3.5, 7.5, 2.5, 10.5, 4.5, 8.5, 6.5), 0.95],
    column: 3,
    expected: 1002 / 1024,
    source: "Exact arithmetic: 1 − 2 (C(10,0) + C(10,1)) / 2^10 = 1002/1024",
    tolerance: 1e-15,
  },
  {
    id: "bounds-10-lower",
    what: "Lower 95% bound for the median of 10 values: the 2nd smallest",
    fn: "BOUNDS",
    args: [column(5.5, 1.5, 9.5, 3.5, 7.5, 2.5, 10.5, 4.5, 8.5, 6.5), 0.95],
    column: 1,
    expected: 2.5,
    source: "Exact arithmetic: the 2nd smallest of the ten values",
    tolerance: 0,
  },
  {
    id: "bounds-10-upper",
    what: "Upper 95% bound for the median of 10 values: the 9th smallest",
    fn: "BOUNDS",
    args: [column(5.5, 1.5, 9.5, 3.5, 7.5, 2.5, 10.5, 4.5, 8.5, 6.5), 0.95],
    column: 2,
    expected: 9.5,
    source: "Exact arithmetic: the 9th smallest of the ten values",
    tolerance: 0,
  },
  {
    id: "signed-rank-5",
    what: "Signed-rank test, five values all above 0, one-sided",
    fn: "SIGNRANK",
    args: [column(1, 2, 3, 4, 5), 0, "greater", "exact"],
    expected: 1 / 32,
    source: "Exact arithmetic: only 1 of the 2^5 sign patterns gives T+ = 15",
    tolerance: 1e-15,
  },
  {
    id: "signed-rank-10",
    what: "Signed-rank test, ten differences with T+ = 8, one-sided",
    fn: "PAIREDSIGNRANK",
    args: [column(0, 0, 0, 0, 0, 0, 0, 0, 0, 0), DIFFERENCES, 0, "less", "exact"],
    expected: 25 / 1024,
    source:
      "Exact arithmetic: 25 of the 2^10 sign patterns of ranks 1–10 have T+ <= 8; signed-rank critical-value tables give 8 for n = 10 at two-sided 0.05 (from memory)",
    tolerance: 1e-15,
  },
  {
    id: "paired-watch-8",
    what: "Watching p-value, paired, eight pairs all higher second, two-sided",
    fn: "PAIREDWATCHPVALUE",
    args: [column(50, 50, 50, 50, 50, 50, 50, 50), column(51, 52, 53, 54, 55, 56, 57, 58)],
    expected: 9 / 256,
    source:
      "Exact arithmetic: the uniform mixture of likelihood ratios after 8 signs up is 2^8 · 8! · 0! / 9! = 256/9, its largest value so far",
    tolerance: 1e-13,
  },
  {
    id: "hodges-lehmann-5",
    what: "Hodges–Lehmann estimate of 1, 2, 3, 4, 5",
    fn: "HODGESLEHMANN",
    args: [column(1, 2, 3, 4, 5)],
    column: 1,
    expected: 3,
    source: "Exact arithmetic: the 15 Walsh averages are symmetric about 3, so their median is 3",
    tolerance: 1e-15,
  },
  {
    id: "power-null-10",
    what: "Power of the two-sided sign test, 10 values, at p_above = 0.5 (the attained alpha)",
    fn: "POWER",
    args: [10, 0.5, 0.05, "two-sided"],
    expected: 22 / 1024,
    source: "Exact arithmetic: rejects at 9 or more on either side (2 × 11/1024 <= 0.05 < 2 × 56/1024), so P = 22/1024",
    tolerance: 1e-15,
  },
  {
    id: "holm-3",
    what: "Holm adjustment of 0.01, 0.04, 0.03: the second p-value",
    fn: "ADJUST",
    args: [[[0.01, 0.04, 0.03]], "holm"],
    column: 2,
    expected: 0.06,
    source: "Exact arithmetic (Holm's step-down rule): sorted 0.01, 0.03, 0.04 become 3 × 0.01, max(0.03, 2 × 0.03), max(0.06, 0.04)",
    tolerance: 1e-15,
  },
  {
    id: "labeled-two-groups-3-4",
    what: "Rank-sum test of the groups labelled A (1, 2, 3) and b (4, 5, 6, 7) picked from one column, a third label left out, one-sided",
    fn: "LABELEDTWOGROUPS",
    args: [column(1, 100, 2, 3, 4, 5, 6, 7), [["A"], ["C"], ["a"], ["A"], ["B"], ["b"], ["B"], ["B"]], "A", "b", 0, "greater"],
    expected: 1 / 35,
    source: "Exact arithmetic: every value labelled b exceeds every value labelled A, 1 of the C(7, 3) = 35 equally likely rank patterns",
    tolerance: 1e-15,
  },
  {
    id: "two-groups-tied-3-3",
    what: "Rank-sum test of 1, 2, 2 against 2, 3, 4 (three values tied at 2), exact given the ties, one-sided",
    fn: "TWOGROUPS",
    args: [column(1, 2, 2), column(2, 3, 4), 0, "greater"],
    expected: 3 / 20,
    source:
      "Exact arithmetic: mid-ranks 1, 3, 3, 3, 5, 6; the second group's rank sum 3 + 5 + 6 = 14 is the largest possible, reached by 3 of the C(6, 3) = 20 equally likely choices (any one of the three 3s with 5 and 6)",
    tolerance: 1e-15,
  },
  {
    id: "two-groups-u-3-3",
    what: "Rank-sum statistic U of 1, 2, 2 against 2, 3, 4",
    fn: "TWOGROUPSSTATISTIC",
    args: [column(1, 2, 2), column(2, 3, 4)],
    column: 1,
    expected: 8,
    source:
      "Exact arithmetic: pairs in which the second group's value is larger, a tie counting 1/2: 2 beats 1 and ties both 2s (2), 3 and 4 beat all three (3 + 3)",
    tolerance: 0,
  },
];

function errorCode(value: unknown): string | null {
  if (typeof value === "object" && value !== null && typeof (value as { code?: unknown }).code === "string")
    return (value as { code: string }).code;
  return null;
}

/** The single value a case looks at: the answer itself, or one column of a one-row answer (as INDEX(…, 1, k)). */
function pick(answer: unknown, position: number | undefined): unknown {
  if (position === undefined || !Array.isArray(answer)) return answer;
  return (answer as unknown[][])[0]?.[position - 1];
}

/**
 * Runs one case through `call` (the catalogue's `callFunction` on an installation).
 *
 * @example
 * runReferenceCase(REFERENCE_CASES[0], callFunction); // { actual: 0.125, difference: 0, passed: true, ... }
 */
export function runReferenceCase(reference: ReferenceCase, call: CatalogueCall): CaseOutcome {
  let answer: unknown;
  try {
    answer = pick(call(reference.fn, [...reference.args]), reference.column);
  } catch (thrown) {
    return { reference, actual: thrown instanceof Error ? thrown.message : String(thrown), difference: null, passed: false };
  }
  if (typeof answer !== "number" || !Number.isFinite(answer)) {
    return { reference, actual: errorCode(answer) ?? String(answer), difference: null, passed: false };
  }
  const difference = answer - reference.expected;
  return { reference, actual: answer, difference, passed: Math.abs(difference) <= reference.tolerance };
}

/**
 * Runs every reference case.
 *
 * @example
 * runInstallationCheck(callFunction).every((o) => o.passed); // true on a sound installation
 */
export function runInstallationCheck(call: CatalogueCall): CaseOutcome[] {
  return REFERENCE_CASES.map((reference) => runReferenceCase(reference, call));
}

function formulaArgument(arg: unknown): string {
  if (Array.isArray(arg)) return `{${(arg as unknown[][]).map((row) => row.map(formulaArgument).join(",")).join(";")}}`;
  if (typeof arg === "string") return `"${arg.replace(/"/g, '""')}"`;
  return String(arg).replace("e", "E");
}

/**
 * The case as the formula a sheet would hold, ranges written as array constants, so a record can show the
 * exact call.
 *
 * @example
 * caseFormula(REFERENCE_CASES[0]); // '=EVENSPLIT.PVALUE({51;52;53},50,"greater")'
 */
export function caseFormula(reference: ReferenceCase): string {
  const inner = `EVENSPLIT.${reference.fn}(${reference.args.map(formulaArgument).join(",")})`;
  return reference.column === undefined ? `=${inner}` : `=INDEX(${inner},1,${reference.column})`;
}
