/**
 * The result block: the one definition of what Evensplit writes beside the
 * data, shared by the REPORT cell function (which evaluates it) and the side
 * pane (which writes it as live EVENSPLIT formulas). Because both read these
 * rows, their labels, values and number formats cannot drift apart.
 *
 * A row's value is a small expression (`BlockValue`) with two renderings:
 * `blockFormula` turns it into the locale-independent formula text that the
 * pane puts into `Range.formulas`, and `blockValue` evaluates it on cell
 * matrices through the catalogue's own functions, as REPORT does.
 *
 * The block checks itself where the host can mislead it: a row compares the
 * sheet's own COUNT of the data with the numbers Evensplit read (some Excel
 * builds pass blank cells to add-ins as 0), and the signed-rank method row
 * states the method that ran, which under "auto" depends on the data's size.
 *
 * The last row is an audit line, so that a block pasted into a report can be
 * traced: the Evensplit version, the method and its options, the exact ranges
 * the formulas read and when the block was written (a fixed text set at
 * writing, not a volatile NOW(), which would change at every recalculation);
 * REPORT shows the same row with the addresses Excel gave it (or, without them,
 * the ranges' sizes) and the time it was evaluated instead.
 *
 * Cost: O(rows) to build; evaluation costs the catalogue calls it makes.
 */
import { cellError } from "../functions/runtime";
import { EXACT_AUTO_SIZE, EXACT_AUTO_TIED_SIZE } from "../stats/rankSum";
import { EXACT_AUTO_LIMIT } from "../stats/signedRank";
import type { AdjustMethod, Alternative, SignTestMethod, SignedRankMethod, TieRule, ZeroRule } from "../stats/types";
import { EVENSPLIT_VERSION } from "./version";

/** One sample or pairs: "sign", "signed-rank", "quantile"; independent groups: "two-groups" (two ranges), "groups" (values and labels). */
export type BlockTest = "sign" | "signed-rank" | "quantile" | "two-groups" | "groups";

/** How two groups are compared: the Wilcoxon–Mann–Whitney rank-sum test or Mood's median test (TWOGROUPS). */
export type TwoGroupMethod = "rank-sum" | "median";

/** How several groups are compared: Mood's median test or Kruskal–Wallis (GROUPS). */
export type ManyGroupMethod = "median" | "rank";

/** What the block is about; everything the wording and the formulas need. */
export interface BlockRequest {
  readonly test: BlockTest;
  /**
   * True: `data` is the first range, `second` the second, and `center` the shift of second − first.
   * Groups are never paired: for "two-groups" `data` and `second` are the two groups and `center` the shift
   * second − first under test; for "groups" `data` holds the values and `second` their group labels.
   */
  readonly paired: boolean;
  /**
   * Hypothesised median, shift (paired, two groups) or, for the quantile test, the hypothesised value of the
   * quantile. Several groups: the target median each group is tested against in the by-group table, when
   * `withTarget` is true.
   */
  readonly center: number;
  /** Several groups only: the by-group table tests each group against `center`; false or absent: no target, no tests. */
  readonly withTarget?: boolean;
  /** Quantile test only: which quantile, strictly between 0 and 1. */
  readonly quantile?: number;
  readonly alternative: Alternative;
  readonly alpha: number;
  readonly confidence: number;
  readonly ties?: TieRule;
  readonly method?: SignTestMethod | SignedRankMethod | TwoGroupMethod | ManyGroupMethod;
  readonly zeros?: ZeroRule;
  /** Several groups: how the by-group table adjusts its p-values across the groups (ADJUST's methods). */
  readonly adjust?: AdjustMethod;
  /** Names used in the wording (column headers); plain text, never markup. */
  readonly dataName?: string;
  readonly secondName?: string;
  /** True when the block's references take in rows added later (a table column or an open-ended range). */
  readonly followsNewRows?: boolean;
  /**
   * True when the result will be looked at again as rows arrive. A sign-test block then uses the watching
   * versions (WATCHPVALUE and WATCHBOUNDS; PAIREDWATCHPVALUE and PAIREDWATCHBOUNDS for pairs); other blocks
   * are unchanged.
   */
  readonly watching?: boolean;
  /**
   * Set when the data are a database query's answer pasted into one row of cells (n, below, tied, above,
   * lower bound, upper bound; databaseQuery.ts): the block is then a sign test from those counts
   * (COUNTPVALUE) with the bounds the query fetched at ORDERRANKS' ranks. One sample only.
   */
  readonly database?: DatabaseSource;
  /**
   * Two groups named in a group column: `data` holds the values, `second` the group labels beside them, and
   * these are the labels of the first and the second group (LABELEDTWOGROUPS, LABELEDSHIFT); the count and
   * median rows find each group's row of BYGROUP's table by its label. Absent: the two groups are two ranges.
   */
  readonly groupLabels?: GroupLabels;
}

/** The labels of two groups read from one group column. */
export interface GroupLabels {
  readonly first: string | number;
  readonly second: string | number;
}

/** Where a block's pasted numbers came from, for its wording and its audit line. */
export interface DatabaseSource {
  /** Table and column as the person named them. */
  readonly table: string;
  readonly column: string;
  /** The group column and the label of the group whose row the block reads; absent for one column. */
  readonly group?: { readonly column: string; readonly label: string };
  /** SHA-256 (hex) of the text of the query whose answer the cells hold. */
  readonly queryHash: string;
}

/** Which cell of the pasted row holds what, from 1 (a grouped row has its label first). */
export const PASTED_COLUMNS = { n: 1, below: 2, tied: 3, above: 4, lower: 5, upper: 6 } as const;

/**
 * An argument of a catalogue call: one of the block's ranges (or, with `cell`, one cell of its first
 * row, as `INDEX(range,1,cell)`), or a literal.
 */
export type Operand =
  | { readonly ref: "data"; readonly cell?: number }
  | { readonly ref: "second" }
  | { readonly number: number }
  | { readonly text: string }
  /** An optional argument left out: nothing between its commas. */
  | { readonly omitted: true };

export interface CallValue {
  readonly kind: "call";
  /** Catalogue id without the namespace, e.g. "PVALUE". */
  readonly fn: string;
  readonly args: readonly Operand[];
  /** 1-based position in a one-row result; absent for scalar results. */
  readonly column?: number;
  /** With `column`: the 1-based row of a table result (BYGROUP); absent for the first row. */
  readonly row?: number;
  /**
   * With `column`, instead of `row`: the row of a table result whose first cell holds this label (text
   * compared without regard to case, as MATCH does), so a group is found by its name, not its place.
   */
  readonly rowLabel?: string | number;
}

export type BlockValue =
  | { readonly kind: "text"; readonly text: string }
  | CallValue
  /** Number of numeric cells in a range. */
  | { readonly kind: "numbers"; readonly of: "data" | "second" }
  /** The sheet's own MEDIAN of a range's numbers (text, logical and blank cells ignored). */
  | { readonly kind: "median"; readonly of: "data" | "second" }
  /**
   * Filled cells of the data range that are not numbers (text, logical).
   * Blank cells are not counted, so an open-ended reference such as
   * B2:B1048576 reports what it skipped, not the million empty rows below the data.
   */
  | { readonly kind: "skipped"; readonly of: "data" | "second" }
  /** The sum of several catalogue values (e.g. ties + used = pairs compared). */
  | { readonly kind: "sum"; readonly terms: readonly CallValue[] }
  | BlankCheckValue
  | { readonly kind: "decision"; readonly pValue: CallValue; readonly alpha: number; readonly reject: string; readonly keep: string }
  /** One text when a catalogue value is at most a limit, another above it (e.g. which method a size led to). */
  | { readonly kind: "atMost"; readonly value: CallValue; readonly limit: number; readonly then: string; readonly otherwise: string }
  /** One text when a catalogue value is a word (compared as the sheet compares text, ignoring case), another otherwise. */
  | { readonly kind: "whenWord"; readonly value: CallValue; readonly word: string; readonly then: string; readonly otherwise: string }
  /**
   * Cells of the data's first row, added (a pasted count, or below + above). With `blankShows`, a single
   * blank cell shows as empty rather than 0 (a bound the query did not fetch).
   */
  | { readonly kind: "pasted"; readonly cells: readonly number[]; readonly blankShows?: boolean }
  /** Whether the pasted n equals below + tied + above: a row pasted out of line shows here. */
  | {
      readonly kind: "pastedAddsUp";
      readonly total: number;
      readonly parts: readonly number[];
      readonly agree: string;
      readonly differ: string;
    }
  | AuditValue;

/**
 * The audit line: version and method are known when the rows are made; the ranges and the time are filled in
 * by the rendering (`blockFormula`: the references and the time of writing; `blockValue`: the ranges as REPORT
 * received them and the time of evaluation).
 */
export interface AuditValue {
  readonly kind: "audit";
  readonly version: string;
  /** The method with its options, in words. */
  readonly method: string;
}

/**
 * The blank-cell check: the sheet's own COUNT of the ranges against the
 * numbers Evensplit read from them (`read`, summed). Some Excel builds pass
 * the blank cells of a range argument to an add-in's function as 0
 * (office-js issues 5262, 4702 and 1951), which no function can tell from a
 * measured 0; the sheet's own COUNT still skips them, so the two differ
 * exactly when that happened to these ranges.
 */
export interface BlankCheckValue {
  readonly kind: "blankCheck";
  readonly ranges: readonly ("data" | "second")[];
  readonly read: readonly CallValue[];
  readonly agree: string;
  readonly differ: string;
}

export type BlockFormat = "text" | "integer" | "number" | "pvalue" | "percent";

export interface BlockRow {
  /** Stable identifier, for tests and for the pane's preview. */
  readonly key: string;
  readonly label: string;
  readonly value: BlockValue;
  readonly format: BlockFormat;
  readonly style: "title" | "plain" | "caution";
  /**
   * A table the value spills (a catalogue call answering with a header row and a row per group): its formula
   * goes into the label column of its own row and spills right and down, each column under its own format.
   * The label is not written; the row above names the table.
   */
  readonly spill?: SpillShape;
}

/** The columns of a spilled table and the number format of each. */
export interface SpillShape {
  readonly columns: number;
  readonly formats: readonly BlockFormat[];
}

/**
 * P-values below this show as "< 1E-307": the sheet holds no positive number
 * below about 2.2E-308 (Microsoft, "Excel specifications and limits":
 * smallest allowed positive number 2.2251E-308), so such a p-value, or one
 * too small for a double at all (the core's 0), would otherwise show as 0.
 */
export const SMALLEST_SHOWN_PVALUE = 1e-307;

/** What a cell shows for a p-value too small to hold. */
export const TINY_PVALUE_WORDS = "< 1E-307";

/**
 * Excel number formats for each kind of value (at most two conditions and a
 * third section for the rest; Microsoft, "Review guidelines for customizing a
 * number format").
 * - P-values: "< 1E-307" below what a cell can hold, scientific notation below
 *   0.0001 (a tiny p-value never shows as 0.0000), otherwise as they are (so 1
 *   shows as 1).
 * - Coverage: two decimals of a percent, five from 99.99%, and a bound rather
 *   than a rounded figure beyond, so a coverage below 1 never shows as 100%.
 */
export const NUMBER_FORMATS: Readonly<Record<BlockFormat, string>> = {
  text: "General",
  integer: "0",
  number: "General",
  pvalue: `[<${formulaNumber(SMALLEST_SHOWN_PVALUE)}]"${TINY_PVALUE_WORDS}";[<0.0001]0.00E+00;General`,
  percent: '[<0.9999]0.00%;[<0.99999995]0.00000%;"> 99.99999%"',
};

/**
 * A value as REPORT puts it in its cell, where no number format of ours
 * applies: a p-value too small to hold becomes the words a formatted cell shows.
 *
 * @example
 * reportCell("pvalue", 0);    // "< 1E-307"
 * reportCell("pvalue", 0.03); // 0.03
 */
export function reportCell(format: BlockFormat, value: unknown): unknown {
  return format === "pvalue" && typeof value === "number" && value < SMALLEST_SHOWN_PVALUE ? TINY_PVALUE_WORDS : value;
}

const RELATION: Readonly<Record<Alternative, string>> = { greater: ">", less: "<", "two-sided": "≠" };
const CLAIM: Readonly<Record<Alternative, string>> = { greater: "above", less: "below", "two-sided": "different from" };

const TIE_WORDS: Readonly<Record<TieRule, string>> = {
  drop: "ties left out",
  split: "ties shared evenly between below and above (an odd one left out)",
  conservative: "ties counted against the alternative",
};

const SIGN_METHOD_WORDS: Readonly<Record<SignTestMethod, string>> = {
  exact: "exact binomial",
  midp: "mid-p binomial",
  normal: "normal approximation with continuity correction",
};

const SIGNED_RANK_EXACT_WORDS = "exact (conditional on ties)";
const SIGNED_RANK_NORMAL_WORDS = "normal approximation with continuity and tie corrections";

/** Formats a number the way it appears in the block's wording: as typed, no trailing zeros. */
function numberWords(x: number): string {
  return String(x);
}

/** A confidence in the wording: a percent to four decimals, never rounded up to 100% (then the fraction as typed). */
function percentWords(fraction: number): string {
  const percent = Math.round(fraction * 1e6) / 1e4;
  return percent >= 100 ? numberWords(fraction) : `${numberWords(percent)}%`;
}

function data(): Operand {
  return { ref: "data" };
}
function second(): Operand {
  return { ref: "second" };
}
function num(value: number): Operand {
  return { number: value };
}
function word(text: string): Operand {
  return { text };
}
function call(fn: string, args: Operand[], column?: number): CallValue {
  return column === undefined ? { kind: "call", fn, args } : { kind: "call", fn, args, column };
}
function labelOperand(label: string | number): Operand {
  return typeof label === "number" ? num(label) : word(label);
}
function text(value: string): BlockValue {
  return { kind: "text", text: value };
}

/**
 * The side of the bounds that matches the alternative: a one-sided test gets the one-sided bound.
 *
 * @example
 * boundSideFor("greater"); // "lower": a test for "above" gets a lower bound
 */
export function boundSideFor(alternative: Alternative): "two-sided" | "lower" | "upper" {
  return alternative === "greater" ? "lower" : alternative === "less" ? "upper" : "two-sided";
}

/** The quantity the hypotheses are about, in words. */
function subject(request: BlockRequest): string {
  const first = request.dataName ?? "the data";
  const location = request.test === "quantile" ? `the ${numberWords(request.quantile ?? 0.5)} quantile` : "the median";
  if (!request.paired) return `${location} of ${first}`;
  const firstName = request.dataName ?? "first";
  const secondName = request.secondName ?? "second";
  return `${location} of ${secondName} − ${firstName}`;
}

function checkRequest(request: BlockRequest): void {
  if (!Number.isFinite(request.center)) throw new RangeError("center must be a finite number");
  if (!(request.alpha > 0 && request.alpha < 1)) throw new RangeError("alpha must lie strictly between 0 and 1");
  if (!(request.confidence > 0 && request.confidence < 1)) throw new RangeError("confidence must lie strictly between 0 and 1");
  if (request.database !== undefined && (request.test !== "sign" || request.paired))
    throw new RangeError("a block from a database query is a one-sample sign test");
  if (request.test === "quantile") {
    if (request.paired) throw new RangeError("the quantile test takes one range");
    const q = request.quantile;
    if (q === undefined || !(q > 0 && q < 1)) throw new RangeError("quantile must lie strictly between 0 and 1");
  }
}

/** Rows describing the data: how many cells, how many numbers, what was set aside. */
function countRows(request: BlockRequest, centerWords: string): BlockRow[] {
  const c = num(request.center);
  // The sign test keeps some ties under "split" and "conservative": the used row then states the n its p-value used.
  const ties = request.test === "sign" ? (request.ties ?? "drop") : "drop";
  const tieArgs = ties === "drop" ? [] : [word(ties)];
  const usedLabel = ties === "drop" ? "Used (n, ties left out)" : `Used by the test (n, ${TIE_WORDS[ties]})`;
  if (request.paired) {
    const counts = (column: number): CallValue => call("PAIREDCOUNTS", [data(), second(), c], column);
    return [
      row("pairs", "Complete pairs (n total)", { kind: "sum", terms: [counts(2), counts(4)] }, "integer"),
      row("skipped", "Pairs skipped (one side blank or not a number)", counts(5), "integer"),
      blankCheckRow(["data", "second"]),
      row("below", `Differences below ${centerWords}`, counts(1), "integer"),
      row("tied", `Differences equal to ${centerWords} (ties)`, counts(2), "integer"),
      row("above", `Differences above ${centerWords}`, counts(3), "integer"),
      row("used", usedLabel, call("PAIREDCOUNTS", [data(), second(), c, ...tieArgs], 4), "integer"),
    ];
  }
  const counts = (column: number): CallValue => call("COUNTS", [data(), c], column);
  return [
    row("numbers", "Numbers in range (n total)", { kind: "numbers", of: "data" }, "integer"),
    row("skipped", "Cells skipped (text or logical; blanks not counted)", { kind: "skipped", of: "data" }, "integer"),
    blankCheckRow(["data"]),
    row("below", `Values below ${centerWords}`, counts(1), "integer"),
    row("tied", `Values equal to ${centerWords} (ties)`, counts(2), "integer"),
    row("above", `Values above ${centerWords}`, counts(3), "integer"),
    row("used", usedLabel, call("COUNTS", [data(), c, ...tieArgs], 4), "integer"),
  ];
}

/** What the check row says when the counts agree, and when they do not. */
export const BLANK_CHECK_WORDS = {
  agree: "Agrees: Evensplit read as many numbers as the sheet's COUNT finds",
  differ: "Differs from the sheet's COUNT: this Excel passed blank cells as zeros; use a table column and leave no cell in it empty",
} as const;

/**
 * The row comparing the sheet's COUNT of the ranges with the numbers Evensplit
 * read from them: tied + used (= below + tied + above) of COUNTS on each
 * range; the hypothesised value does not change that sum, so 0 is passed.
 */
function blankCheckRow(ranges: readonly ("data" | "second")[]): BlockRow {
  const read = ranges.flatMap((range) => [2, 4].map((column) => call("COUNTS", [{ ref: range }, num(0)], column)));
  return row(
    "blanks",
    "Blank cells (the sheet's COUNT against the numbers read)",
    { kind: "blankCheck", ranges, read, ...BLANK_CHECK_WORDS },
    "text",
  );
}

function row(key: string, label: string, value: BlockValue, format: BlockFormat, style: BlockRow["style"] = "plain"): BlockRow {
  return { key, label, value, format, style };
}

/** Only the sign test has watching versions (WATCHPVALUE, WATCHBOUNDS; for pairs PAIREDWATCHPVALUE, PAIREDWATCHBOUNDS). */
function canWatch(request: BlockRequest): boolean {
  return request.test === "sign";
}

/** The block uses the watching versions in place of the fixed-sample test. */
function usesWatching(request: BlockRequest): boolean {
  return canWatch(request) && request.watching === true;
}

/** The block follows new rows but keeps the fixed-sample test: it shows the watching p-value beside it, and a caution. */
function showsWatchingBeside(request: BlockRequest): boolean {
  return canWatch(request) && request.followsNewRows === true && request.watching !== true;
}

/** The watching p-value of a sign block: valid however often it is looked at as rows arrive. */
function watchingPValue(request: BlockRequest): CallValue {
  const options = [num(request.center), word(request.alternative), word(request.ties ?? "drop")];
  return request.paired ? call("PAIREDWATCHPVALUE", [data(), second(), ...options]) : call("WATCHPVALUE", [data(), ...options]);
}

/** What the watching versions promise, and the order they read the rows (or the pairs) in. */
function watchingMethodWords(request: BlockRequest): string {
  const order = request.paired ? "pairs read in sheet order" : "rows read in sheet order";
  return `these hold however often the result is looked at as rows arrive (${order})`;
}

/**
 * The watching version of a sign block: the p-value and bounds that may be looked at after every new row
 * (Howard, Ramdas, McAuliffe and Sekhon 2021, via WATCHPVALUE and WATCHBOUNDS, or their paired versions on
 * second − first). The bounds are two-sided whatever the alternative: WATCHBOUNDS gives both ends; for pairs
 * they bound the median of second − first, as PAIREDBOUNDS does in the fixed-sample block.
 */
function watchingSignRows(
  request: BlockRequest,
  statistic: BlockRow,
): { statistic: BlockRow; pValue: CallValue; method: BlockValue; bounds: BlockRow[] } {
  const ties = request.ties ?? "drop";
  const level = num(request.confidence);
  const bound = (column: number): CallValue =>
    request.paired ? call("PAIREDWATCHBOUNDS", [data(), second(), level], column) : call("WATCHBOUNDS", [data(), level], column);
  const what = request.paired ? "median difference" : "median";
  const label = (end: "lower" | "upper"): string =>
    `${percentWords(request.confidence)} bounds for the ${what}, at every ${request.paired ? "pair" : "row"} count at once: ${end}`;
  return {
    statistic,
    pValue: watchingPValue(request),
    method: text(`Sign test, watching p-value and bounds: ${watchingMethodWords(request)}; ${TIE_WORDS[ties]}`),
    bounds: [
      row("lower", label("lower"), bound(1), "number"),
      row("upper", label("upper"), bound(2), "number"),
      row("rowsRead", request.paired ? "Pairs read by these bounds" : "Rows read by these bounds", bound(3), "integer"),
    ],
  };
}

function signRows(request: BlockRequest): { statistic: BlockRow; pValue: CallValue; method: BlockValue; bounds: BlockRow[] } {
  const ties = request.ties ?? "drop";
  const method = (request.method as SignTestMethod | undefined) ?? "exact";
  const alt = word(request.alternative);
  const c = num(request.center);
  const statisticWords =
    request.alternative === "greater" ? "count above" : request.alternative === "less" ? "count below" : "larger of the two counts";
  const statistic = request.paired
    ? call("PAIREDSTATISTIC", [data(), second(), c, alt, word(ties)])
    : call("STATISTIC", [data(), c, alt, word(ties)]);
  const pValue = request.paired
    ? call("PAIRED", [data(), second(), c, alt, word(ties), word(method)])
    : call("PVALUE", [data(), c, alt, word(ties), word(method)]);
  const side = boundSideFor(request.alternative);
  const boundArgs = [num(request.confidence), word(side), word("exact")];
  const bound = (column: number): CallValue =>
    request.paired ? call("PAIREDBOUNDS", [data(), second(), ...boundArgs], column) : call("BOUNDS", [data(), ...boundArgs], column);
  const what = request.paired ? "median difference" : "median";
  const statisticRow = row("statistic", `Sign statistic (${statisticWords})`, statistic, "integer");
  if (usesWatching(request)) return watchingSignRows(request, statisticRow);
  return {
    statistic: statisticRow,
    pValue,
    method: text(
      `Sign test, ${SIGN_METHOD_WORDS[method]}${request.alternative === "two-sided" ? " (twice the smaller tail, at most 1)" : ""}; ${TIE_WORDS[ties]}`,
    ),
    bounds: boundRows(request, what, side, bound),
  };
}

/**
 * The method row of a signed-rank block: the method that ran. Under "auto" that depends on how many
 * non-zero differences there are (used, below + above), so the row is live and states it.
 */
function signedRankMethod(request: BlockRequest, method: SignedRankMethod, zeros: ZeroRule): BlockValue {
  const zeroWords = `zero differences ${zeros === "pratt" ? "ranked, then left out (Pratt)" : "left out"}`;
  const words = (what: string): string => `Wilcoxon signed-rank test, ${what}; ${zeroWords}`;
  if (method === "exact") return text(words(SIGNED_RANK_EXACT_WORDS));
  if (method === "normal") return text(words(SIGNED_RANK_NORMAL_WORDS));
  const c = num(request.center);
  const nonZero = request.paired ? call("PAIREDCOUNTS", [data(), second(), c], 4) : call("COUNTS", [data(), c], 4);
  const limit = EXACT_AUTO_LIMIT.toLocaleString("en-US");
  return {
    kind: "atMost",
    value: nonZero,
    limit: EXACT_AUTO_LIMIT,
    then: words(`${SIGNED_RANK_EXACT_WORDS}, as there are at most ${limit} non-zero differences`),
    otherwise: words(`${SIGNED_RANK_NORMAL_WORDS}, as there are more than ${limit} non-zero differences`),
  };
}

function signedRankRows(request: BlockRequest): { statistic: BlockRow; pValue: CallValue; method: BlockValue; bounds: BlockRow[] } {
  const method = (request.method as SignedRankMethod | undefined) ?? "auto";
  const zeros = request.zeros ?? "drop";
  const alt = word(request.alternative);
  const c = num(request.center);
  const statistic = request.paired
    ? call("PAIREDSIGNRANKSTATISTIC", [data(), second(), c, word(zeros)])
    : call("SIGNRANKSTATISTIC", [data(), c, word(zeros)]);
  const pValue = request.paired
    ? call("PAIREDSIGNRANK", [data(), second(), c, alt, word(method), word(zeros)])
    : call("SIGNRANK", [data(), c, alt, word(method), word(zeros)]);
  // A one-sided question gets the one-sided bound, as in the sign-test block.
  const side = boundSideFor(request.alternative);
  const hlArgs = [num(request.confidence), word(side)];
  const hl = (column: number): CallValue =>
    request.paired
      ? call("PAIREDHODGESLEHMANN", [data(), second(), ...hlArgs], column)
      : call("HODGESLEHMANN", [data(), ...hlArgs], column);
  return {
    statistic: row("statistic", "Signed-rank statistic V (sum of ranks of positive differences)", statistic, "number"),
    pValue,
    method: signedRankMethod(request, method, zeros),
    bounds: [
      row("estimate", "Hodges–Lehmann estimate", hl(1), "number"),
      ...boundRows(request, request.paired ? "centre of the differences" : "centre", side, (column) => hl(column + 1)),
    ],
  };
}

function quantileRows(request: BlockRequest): { statistic: BlockRow; pValue: CallValue; method: BlockValue; bounds: BlockRow[] } {
  const q = request.quantile as number;
  const c = num(request.center);
  const side = boundSideFor(request.alternative);
  const bound = (column: number): CallValue => call("QUANTILEBOUNDS", [data(), num(q), num(request.confidence), word(side)], column);
  return {
    statistic: row(
      "statistic",
      `Quantile statistic (count below ${numberWords(request.center)})`,
      call("COUNTS", [data(), c], 1),
      "integer",
    ),
    pValue: call("QUANTILEPVALUE", [data(), c, num(q), word(request.alternative)]),
    method: text(
      `Quantile test, exact binomial with p = ${numberWords(q)}${request.alternative === "two-sided" ? " (twice the smaller tail, at most 1)" : ""}; ties left out`,
    ),
    bounds: boundRows(request, `${numberWords(q)} quantile`, side, bound),
  };
}

function boundRows(
  request: BlockRequest,
  what: string,
  side: "two-sided" | "lower" | "upper",
  bound: (column: number) => CallValue,
): BlockRow[] {
  const level = percentWords(request.confidence);
  const label = (end: "lower" | "upper"): string =>
    side === "two-sided"
      ? `${level} bounds for the ${what}: ${end}`
      : side === end
        ? `${level} ${end} bound for the ${what} (one-sided)`
        : `${end[0].toUpperCase()}${end.slice(1)} bound (none: one-sided)`;
  return [
    row("lower", label("lower"), bound(1), "number"),
    row("upper", label("upper"), bound(2), "number"),
    row("coverage", "Exact coverage of these bounds", bound(3), "percent"),
  ];
}

/**
 * The caution for a block that follows new rows but gives a fixed-sample p-value: looking after every row and
 * stopping at the first p below alpha raises false alarms. Where a watching version exists it is named.
 */
function lookingAgainRow(request: BlockRequest): BlockRow {
  const remedy = canWatch(request)
    ? "the watching p-value may be checked at every new row."
    : "for a result to check at every new row, use the sign test's watching p-value (WATCHPVALUE, or PAIREDWATCHPVALUE for pairs).";
  return row(
    "lookingAgain",
    "Looking again as rows arrive",
    text(
      `The p-value above is for one look at the rows there are. Checking it as rows arrive and stopping the first time it drops below alpha raises false alarms well beyond alpha; ${remedy}`,
    ),
    "text",
    "caution",
  );
}

function cautionRows(request: BlockRequest): BlockRow[] {
  const assumption =
    request.test === "signed-rank"
      ? "Assumes independent observations and differences symmetric about their centre."
      : "Assumes independent observations; nothing is assumed about the shape of the distribution.";
  const looking = request.followsNewRows === true && !usesWatching(request) ? [lookingAgainRow(request)] : [];
  return [
    row("assumptions", "Assumptions", text(assumption), "text", "caution"),
    ...looking,
    row(
      "reading",
      "Reading the result",
      text(
        `A p-value above alpha does not show that ${subject(request)} equals ${numberWords(request.center)}; it only means these data do not rule it out.`,
      ),
      "text",
      "caution",
    ),
    row(
      "review",
      "Before acting on it",
      text(
        "For clinical, safety or regulatory decisions, have the analysis reviewed by a qualified person and follow the rules that apply to you.",
      ),
      "text",
      "caution",
    ),
  ];
}

// ---------------------------------------------------------------------------
// Independent groups: two groups from two ranges, several groups from values and labels

const TWO_GROUP_TITLES: Readonly<Record<TwoGroupMethod, string>> = {
  "rank-sum": "Two groups, Wilcoxon–Mann–Whitney rank-sum test",
  median: "Two groups, Mood's median test",
};

const MANY_GROUP_TITLES: Readonly<Record<ManyGroupMethod, string>> = {
  median: "Several groups, Mood's median test",
  rank: "Several groups, Kruskal–Wallis test",
};

/** The columns of BYGROUP's table (src/functions/functions.ts) and the format of each. */
export const BY_GROUP_SPILL: SpillShape = {
  columns: 8,
  formats: ["text", "integer", "number", "number", "number", "percent", "pvalue", "pvalue"],
};

const REVIEW_WORDS =
  "For clinical, safety or regulatory decisions, have the analysis reviewed by a qualified person and follow the rules that apply to you.";

function reviewRow(): BlockRow {
  return row("review", "Before acting on it", text(REVIEW_WORDS), "text", "caution");
}

function groupNames(request: BlockRequest): { first: string; second: string } {
  return { first: request.dataName ?? "the first group", second: request.secondName ?? "the second group" };
}

/** "Line B" against "Line A" shifted by the hypothesised amount, in words. */
function shiftedWords(request: BlockRequest): string {
  const { first } = groupNames(request);
  if (request.center === 0) return first;
  return `${first} ${request.center > 0 ? "+" : "−"} ${numberWords(Math.abs(request.center))}`;
}

/** The hypotheses of a two-group block: about whole distributions (rank-sum) or about the two medians (median test). */
function twoGroupHypotheses(request: BlockRequest, method: TwoGroupMethod): { question: string; h0: string; h1: string; keep: string } {
  const { first, second } = groupNames(request);
  const against = shiftedWords(request);
  const shiftWords = numberWords(request.center);
  if (method === "median") {
    const difference = `median of ${second} − median of ${first}`;
    return {
      question: `Is the ${difference} ${CLAIM[request.alternative]} ${shiftWords}?`,
      h0: `${difference} = ${shiftWords}`,
      h1: `${difference} ${RELATION[request.alternative]} ${shiftWords}`,
      keep: `the ${difference} is ${CLAIM[request.alternative]} ${shiftWords}`,
    };
  }
  const direction: Readonly<Record<Alternative, string>> = { greater: "above", less: "below", "two-sided": "above or below" };
  const tends = `${second} tends to lie ${direction[request.alternative]} ${against}`;
  return {
    question: `Does ${second} tend to lie ${direction[request.alternative]} ${against}?`,
    h0: `${second} and ${against} have the same distribution`,
    h1: tends,
    keep: tends,
  };
}

const MEDIAN_TEST_WORDS =
  "Mood's median test: each group's values above / not above the pooled median (values equal to it count as not above), Fisher's exact test on that 2×2 table";

/**
 * The rank-sum method row: the method that ran, as the statistic's second cell names it (TWOGROUPSSTATISTIC
 * decides it by rankSum.ts's rule: the size, and whether values are tied).
 */
function rankSumMethod(methodCell: CallValue): BlockValue {
  const test = "Wilcoxon–Mann–Whitney rank-sum test";
  const sizes = `at most ${EXACT_AUTO_SIZE} numbers together without ties, ${EXACT_AUTO_TIED_SIZE} with ties`;
  return {
    kind: "whenWord",
    value: methodCell,
    word: "exact",
    then: `${test}, exact (conditional on tied mid-ranks), as the groups are small enough for it (${sizes})`,
    otherwise: `${test}, the normal approximation with tie and continuity corrections, as the groups are too large for the exact distribution (it takes ${sizes})`,
  };
}

/** The decision row: reject or keep H0 at the block's alpha, saying in words what the evidence is for. */
function decisionRow(request: BlockRequest, pValue: CallValue, claim: string): BlockRow {
  return row(
    "decision",
    `Decision at alpha = ${numberWords(request.alpha)}`,
    {
      kind: "decision",
      pValue,
      alpha: request.alpha,
      reject: `Reject H0: evidence that ${claim}`,
      keep: `Do not reject H0: these data do not show that ${claim}`,
    },
    "text",
  );
}

function twoGroupRows(request: BlockRequest): BlockRow[] {
  const method = (request.method as TwoGroupMethod | undefined) ?? "rank-sum";
  const { first, second: secondName } = groupNames(request);
  const words = twoGroupHypotheses(request, method);
  const labels = request.groupLabels;
  const picked = labels === undefined ? [] : [labelOperand(labels.first), labelOperand(labels.second)];
  const pValue = labels
    ? call("LABELEDTWOGROUPS", [data(), second(), ...picked, num(request.center), word(request.alternative), word(method)])
    : call("TWOGROUPS", [data(), second(), num(request.center), word(request.alternative), word(method)]);
  const statistic = (column: number): CallValue =>
    labels
      ? call("LABELEDTWOGROUPSSTATISTIC", [data(), second(), ...picked, num(request.center)], column)
      : call("TWOGROUPSSTATISTIC", [data(), second(), num(request.center)], column);
  const rankSum = method === "rank-sum";
  const uRow = row(
    "statistic",
    `Rank-sum statistic U (pairs in which ${secondName} exceeds ${shiftedWords(request)}; a tie counts ½)`,
    statistic(1),
    "number",
  );
  const shift = (column: number): CallValue =>
    labels
      ? call("LABELEDSHIFT", [data(), second(), ...picked, num(request.confidence)], column)
      : call("SHIFT", [data(), second(), num(request.confidence)], column);
  const level = percentWords(request.confidence);
  const sameShape =
    method === "rank-sum"
      ? "The rank-sum test compares the two whole distributions; it speaks of a shift of the medians only when the two groups have the same shape, one a shifted copy of the other. The shift and its bounds read the same way."
      : "The median test compares the two medians without assuming a shape; the shift and its bounds below read as a shift of medians only when the two groups have the same shape.";
  const looking = request.followsNewRows === true ? [lookingAgainRow(request)] : [];
  return [
    row("title", "Evensplit result", text(TWO_GROUP_TITLES[method]), "text", "title"),
    row("question", "Question", text(words.question), "text"),
    row("h0", "H0", text(words.h0), "text"),
    row("h1", "H1", text(words.h1), "text"),
    ...(labels ? labeledSummaryRows(request, labels) : twoRangeSummaryRows(request)),
    ...(rankSum ? [uRow] : []),
    row("pvalue", "p-value", pValue, "pvalue"),
    row("method", "Method", rankSum ? rankSumMethod(statistic(2)) : text(MEDIAN_TEST_WORDS), "text"),
    decisionRow(request, pValue, words.keep),
    row("estimate", `Shift estimate, ${secondName} − ${first} (Hodges–Lehmann: median of all differences)`, shift(1), "number"),
    row("lower", `${level} bounds for the shift: lower`, shift(2), "number"),
    row("upper", `${level} bounds for the shift: upper`, shift(3), "number"),
    row("coverage", "Exact coverage of these bounds (for groups of the same shape)", shift(4), "percent"),
    row(
      "assumptions",
      "Assumptions",
      text(`Assumes independent observations, within each group and between the groups. ${sameShape}`),
      "text",
      "caution",
    ),
    ...looking,
    row(
      "reading",
      "Reading the result",
      text(`A p-value above alpha does not show that ${words.h0}; it only means these data do not rule it out.`),
      "text",
      "caution",
    ),
    reviewRow(),
    row("audit", "Audit", { kind: "audit", version: EVENSPLIT_VERSION, method: auditMethod(request) }, "text"),
  ];
}

/** Counts, skipped cells, the blank check and medians of two groups given as two ranges. */
function twoRangeSummaryRows(request: BlockRequest): BlockRow[] {
  const { first, second: secondName } = groupNames(request);
  return [
    row("firstNumbers", `Numbers in ${first} (n)`, { kind: "numbers", of: "data" }, "integer"),
    row("secondNumbers", `Numbers in ${secondName} (n)`, { kind: "numbers", of: "second" }, "integer"),
    row("firstSkipped", `Cells skipped in ${first} (text or logical; blanks not counted)`, { kind: "skipped", of: "data" }, "integer"),
    row(
      "secondSkipped",
      `Cells skipped in ${secondName} (text or logical; blanks not counted)`,
      { kind: "skipped", of: "second" },
      "integer",
    ),
    blankCheckRow(["data", "second"]),
    row("firstMedian", `Median of ${first}`, { kind: "median", of: "data" }, "number"),
    row("secondMedian", `Median of ${secondName}`, { kind: "median", of: "second" }, "number"),
  ];
}

/**
 * The same rows for two groups named in a group column: each group's count and median from the row of
 * BYGROUP's table of the values and labels that carries its label (column 2 the count, 3 the median; found
 * with MATCH, so edits that change which label appears first cannot swap them), the cells skipped in the
 * values column, and the blank check of the values column.
 */
function labeledSummaryRows(request: BlockRequest, labels: GroupLabels): BlockRow[] {
  const { first, second: secondName } = groupNames(request);
  const table = (label: string | number, column: number): CallValue => ({
    ...call("BYGROUP", [data(), second()], column),
    rowLabel: label,
  });
  return [
    row("firstNumbers", `Numbers in ${first} (n)`, table(labels.first, 2), "integer"),
    row("secondNumbers", `Numbers in ${secondName} (n)`, table(labels.second, 2), "integer"),
    row("firstSkipped", "Cells skipped in the values (text or logical; blanks not counted)", { kind: "skipped", of: "data" }, "integer"),
    blankCheckRow(["data"]),
    row("firstMedian", `Median of ${first}`, table(labels.first, 3), "number"),
    row("secondMedian", `Median of ${secondName}`, table(labels.second, 3), "number"),
  ];
}

/** The words of the by-group table's heading row: what each row gives. */
function byGroupWords(request: BlockRequest): string {
  const level = percentWords(request.confidence);
  const side = boundSideFor(request.alternative);
  const bounds = side === "two-sided" ? `${level} bounds for its median` : `a ${level} ${side} bound for its median (one-sided)`;
  const tests = request.withTarget
    ? `, the sign-test p-value against ${numberWords(request.center)} (${CLAIM[request.alternative]}) and that p-value adjusted across the groups (${request.adjust ?? "holm"})`
    : "; no target median was given, so no p-values";
  return `One row per group, in order of first appearance: its count, its median, ${bounds} with their exact coverage${tests}.`;
}

function manyGroupRows(request: BlockRequest): BlockRow[] {
  const method = (request.method as ManyGroupMethod | undefined) ?? "median";
  const values = request.dataName ?? "the values";
  const labels = request.secondName ?? "the group column";
  const pValue = call("GROUPS", [data(), second(), word(method)]);
  const alternative = request.withTarget ? request.alternative : "two-sided";
  const table = call("BYGROUP", [
    data(),
    second(),
    ...(request.withTarget ? [num(request.center)] : [{ omitted: true } as const]),
    word(alternative),
    num(request.confidence),
    word(request.adjust ?? "holm"),
  ]);
  const h0 =
    method === "median"
      ? `every group of ${labels} has the same median of ${values}`
      : `every group of ${labels} gives ${values} from one distribution`;
  const h1 =
    method === "median"
      ? `at least one group's median of ${values} differs from another's`
      : `at least one group's ${values} tend to lie above or below another's`;
  const methodWords =
    method === "median"
      ? "Mood's median test: each group's values above / not above the pooled median (values equal to it count as not above); chi-square p-value, or a seeded simulation when some expected count is below 5 (Fisher's exact test for two groups)"
      : "Kruskal–Wallis test on the ranks of all values, tie-corrected, chi-square approximation";
  const shape =
    method === "median"
      ? "The median test compares medians without assuming a shape."
      : "The rank test compares whole distributions; it speaks of medians only when the groups have the same shape.";
  const multiple = request.withTarget
    ? " Each group's own p-value is for that group alone; when several groups are looked at together, read the adjusted p-values."
    : "";
  const looking = request.followsNewRows === true ? [lookingAgainRow(request)] : [];
  return [
    row("title", "Evensplit result", text(MANY_GROUP_TITLES[method]), "text", "title"),
    row("question", "Question", text(`Do the typical values of ${values} differ between the groups of ${labels}?`), "text"),
    row("h0", "H0", text(h0), "text"),
    row("h1", "H1", text(h1), "text"),
    row("numbers", "Numbers in range (n total)", { kind: "numbers", of: "data" }, "integer"),
    row("skipped", "Cells skipped (text or logical; blanks not counted)", { kind: "skipped", of: "data" }, "integer"),
    blankCheckRow(["data"]),
    row("pvalue", "p-value", pValue, "pvalue"),
    row("method", "Method", text(methodWords), "text"),
    decisionRow(request, pValue, h1),
    row(
      "assumptions",
      "Assumptions",
      text(
        `Assumes independent observations, within each group and between the groups; rows with a blank group label are skipped and counted in the table. ${shape}${multiple}`,
      ),
      "text",
      "caution",
    ),
    ...looking,
    row(
      "reading",
      "Reading the result",
      text(`A p-value above alpha does not show that ${h0}; it only means these data do not rule it out.`),
      "text",
      "caution",
    ),
    reviewRow(),
    row("audit", "Audit", { kind: "audit", version: EVENSPLIT_VERSION, method: auditMethod(request) }, "text"),
    row("byGroupTitle", "By group", text(byGroupWords(request)), "text"),
    { key: "byGroup", label: "By group (table)", value: table, format: "text", style: "plain", spill: BY_GROUP_SPILL },
  ];
}

/**
 * The rows of the result block for a request, top to bottom.
 *
 * @example
 * resultBlockRows({ test: "sign", paired: false, center: 50, alternative: "greater", alpha: 0.05, confidence: 0.95, dataName: "Thickness" })
 *   .map((r) => r.label); // ["Evensplit result", "Question", "H0", "H1", "Numbers in range (n total)", ...]
 */
export function resultBlockRows(request: BlockRequest): BlockRow[] {
  checkRequest(request);
  if (request.database !== undefined) return databaseRows(request, request.database);
  if (request.test === "two-groups") return twoGroupRows(request);
  if (request.test === "groups") return manyGroupRows(request);
  const centerWords = numberWords(request.center);
  const about = subject(request);
  const parts =
    request.test === "sign" ? signRows(request) : request.test === "signed-rank" ? signedRankRows(request) : quantileRows(request);
  const title = request.test === "sign" ? "Sign test" : request.test === "signed-rank" ? "Wilcoxon signed-rank test" : "Quantile test";
  return [
    row("title", "Evensplit result", text(`${title}${request.paired ? ", paired" : ", one sample"}`), "text", "title"),
    row("question", "Question", text(`Is ${about} ${CLAIM[request.alternative]} ${centerWords}?`), "text"),
    row("h0", "H0", text(`${about} = ${centerWords}`), "text"),
    row("h1", "H1", text(`${about} ${RELATION[request.alternative]} ${centerWords}`), "text"),
    ...countRows(request, centerWords),
    parts.statistic,
    // A watched block keeps the label "p-value" (the pane reads a block back by it); its method row says which p-value.
    row("pvalue", "p-value", parts.pValue, "pvalue"),
    ...(showsWatchingBeside(request) ? [row("watchPvalue", "Watching p-value", watchingPValue(request), "pvalue")] : []),
    row("method", "Method", parts.method, "text"),
    decisionRow(request, parts.pValue, `${about} is ${CLAIM[request.alternative]} ${centerWords}`),
    ...parts.bounds,
    ...cautionRows(request),
    row("audit", "Audit", { kind: "audit", version: EVENSPLIT_VERSION, method: auditMethod(request) }, "text"),
  ];
}

/** The words of the check that the pasted n equals below + tied + above. */
export const PASTED_CHECK_WORDS = {
  agree: "Agrees: n equals below + tied + above",
  differ: "Differs: n is not below + tied + above; paste the query's row again, its columns in order",
} as const;

/** One pasted cell, or the sum of several. */
function pastedCells(...cells: number[]): BlockValue {
  return { kind: "pasted", cells };
}

function pastedCell(cell: number): Operand {
  return { ref: "data", cell };
}

/** The cell of the pasted row, shifted past the group label when there is one. */
function pastedColumn(source: DatabaseSource, what: keyof typeof PASTED_COLUMNS): number {
  return PASTED_COLUMNS[what] + (source.group === undefined ? 0 : 1);
}

/**
 * The block for a database query's answer pasted into one row: the counts as pasted, the sign test from
 * them (COUNTPVALUE), ORDERRANKS' two-sided ranks and exact coverage for the pasted n, and the two order
 * statistics the query fetched at those ranks.
 */
function databaseRows(request: BlockRequest, source: DatabaseSource): BlockRow[] {
  const at = (what: keyof typeof PASTED_COLUMNS): number => pastedColumn(source, what);
  const centerWords = numberWords(request.center);
  const about = subject(request);
  const method = (request.method as SignTestMethod | undefined) ?? "exact";
  const pValue = call("COUNTPVALUE", [pastedCell(at("above")), pastedCell(at("below")), word(request.alternative), word(method)]);
  // Two-sided whatever the alternative: the ranks go into the query before the question's direction is asked.
  const ranks = (column: number): CallValue =>
    call("ORDERRANKS", [pastedCell(at("n")), num(request.confidence), num(0.5), word("two-sided")], column);
  const level = percentWords(request.confidence);
  const boundLabel = (end: "lower" | "upper"): string => `${level} bounds for the median (two-sided): ${end}`;
  const where = source.group === undefined ? "" : `, group ${source.group.label}`;
  return [
    row("title", "Evensplit result", text(`Sign test, one sample, from a database query${where}`), "text", "title"),
    row("question", "Question", text(`Is ${about} ${CLAIM[request.alternative]} ${centerWords}?`), "text"),
    row("h0", "H0", text(`${about} = ${centerWords}`), "text"),
    row("h1", "H1", text(`${about} ${RELATION[request.alternative]} ${centerWords}`), "text"),
    row("numbers", "Values the query counted (n, NULLs left out)", pastedCells(at("n")), "integer"),
    row("below", `Values below ${centerWords}`, pastedCells(at("below")), "integer"),
    row("tied", `Values equal to ${centerWords} (ties)`, pastedCells(at("tied")), "integer"),
    row("above", `Values above ${centerWords}`, pastedCells(at("above")), "integer"),
    row(
      "addsUp",
      "Pasted counts (n against below + tied + above)",
      { kind: "pastedAddsUp", total: at("n"), parts: [at("below"), at("tied"), at("above")], ...PASTED_CHECK_WORDS },
      "text",
    ),
    row("used", "Used (n, ties left out)", pastedCells(at("below"), at("above")), "integer"),
    row("pvalue", "p-value", pValue, "pvalue"),
    row(
      "method",
      "Method",
      text(
        `Sign test from counts, ${SIGN_METHOD_WORDS[method]}${request.alternative === "two-sided" ? " (twice the smaller tail, at most 1)" : ""}; ties left out`,
      ),
      "text",
    ),
    decisionRow(request, pValue, `${about} is ${CLAIM[request.alternative]} ${centerWords}`),
    row("lowerRank", "Rank of the lower bound among the sorted values", ranks(1), "integer"),
    row("upperRank", "Rank of the upper bound among the sorted values", ranks(2), "integer"),
    row("lower", boundLabel("lower"), { kind: "pasted", cells: [at("lower")], blankShows: true }, "number"),
    row("upper", boundLabel("upper"), { kind: "pasted", cells: [at("upper")], blankShows: true }, "number"),
    row("coverage", "Exact coverage of these bounds", ranks(3), "percent"),
    row(
      "fromQuery",
      "Where the numbers come from",
      text(
        "A database query's answer, pasted: the bounds are the values at the ranks above only if the query ran with them. After the table changes, run both queries again and paste the new row.",
      ),
      "text",
      "caution",
    ),
    ...cautionRows(request),
    row("audit", "Audit", { kind: "audit", version: EVENSPLIT_VERSION, method: auditMethod(request) }, "text"),
  ];
}

/** The method and every option that changes the numbers, for the audit line. */
function auditMethod(request: BlockRequest): string {
  const common = `${request.alternative}, alpha ${numberWords(request.alpha)}, confidence ${numberWords(request.confidence)}; hypothesised ${numberWords(request.center)}`;
  if (request.test === "two-groups") {
    const method = (request.method as TwoGroupMethod | undefined) ?? "rank-sum";
    return `two groups, ${method === "median" ? "Mood's median test" : "rank-sum test"} (shift ${numberWords(request.center)}; ${request.alternative}, alpha ${numberWords(request.alpha)}, confidence ${numberWords(request.confidence)})`;
  }
  if (request.test === "groups") {
    const method = (request.method as ManyGroupMethod | undefined) ?? "median";
    const target = request.withTarget ? `target median ${numberWords(request.center)}, ${request.alternative}` : "no target median";
    return `several groups, ${method === "median" ? "Mood's median test" : "Kruskal–Wallis test"} (${target}; adjustment ${request.adjust ?? "holm"}; alpha ${numberWords(request.alpha)}, confidence ${numberWords(request.confidence)})`;
  }
  const kind = request.paired ? "paired" : "one sample";
  if (request.database !== undefined) {
    const { table, column, group, queryHash } = request.database;
    const rows = group === undefined ? "" : `, group column ${group.column} = ${group.label}`;
    const how = SIGN_METHOD_WORDS[(request.method as SignTestMethod | undefined) ?? "exact"];
    return `sign test from a database query's counts (${how}; ties left out; ${common}); table ${table}, column ${column}${rows}; query SHA-256 ${queryHash}`;
  }
  if (request.test === "sign") {
    const method = (request.method as SignTestMethod | undefined) ?? "exact";
    const how = usesWatching(request) ? "watching p-value and bounds" : SIGN_METHOD_WORDS[method];
    return `sign test, ${kind} (${how}; ${TIE_WORDS[request.ties ?? "drop"]}; ${common})`;
  }
  if (request.test === "signed-rank") {
    const method = (request.method as SignedRankMethod | undefined) ?? "auto";
    const zeros = request.zeros ?? "drop";
    return `Wilcoxon signed-rank test, ${kind} (method ${method}; zeros ${zeros}; ${common})`;
  }
  return `quantile test (quantile ${numberWords(request.quantile ?? 0.5)}; exact binomial; ${common})`;
}

/**
 * A moment as the audit line states it: UTC to the second, so a block written anywhere reads the same.
 *
 * @example
 * auditTime(new Date(Date.UTC(2026, 11, 2, 6, 30, 5))); // "2026-12-02 06:30:05 UTC"
 */
export function auditTime(moment: Date): string {
  return `${moment.toISOString().slice(0, 19).replace("T", " ")} UTC`;
}

/** The audit line's words for a version, a method, the ranges read and a time ("written" or "evaluated"). */
function auditWords(value: AuditValue, ranges: string, when: string): string {
  return `Evensplit ${value.version}; ${value.method}; reads ${ranges}; ${when}`;
}

/** A number as a formula literal: shortest round-trip digits, Excel's exponent letter. */
function formulaNumber(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError("a formula literal must be a finite number");
  return String(x).replace("e", "E");
}

function formulaString(s: string): string {
  return `"${s.replace(/"/g, '""')}"`;
}

function formulaOperand(operand: Operand, refs: { data: string; second?: string }): string {
  if ("ref" in operand) {
    if (operand.ref === "data") return operand.cell === undefined ? refs.data : `INDEX(${refs.data},1,${operand.cell})`;
    if (refs.second === undefined) throw new RangeError("this block needs a second range");
    return refs.second;
  }
  if ("omitted" in operand) return "";
  return "number" in operand ? formulaNumber(operand.number) : formulaString(operand.text);
}

/** The references the formulas use, and for the audit line the moment of writing (now when not given). */
export interface FormulaRefs {
  readonly data: string;
  readonly second?: string;
  readonly writtenAt?: Date;
}

function formulaCall(value: CallValue, refs: { data: string; second?: string }): string {
  const inner = `EVENSPLIT.${value.fn}(${value.args.map((a) => formulaOperand(a, refs)).join(",")})`;
  if (value.column === undefined) return inner;
  if (value.rowLabel === undefined) return `INDEX(${inner},${value.row ?? 1},${value.column})`;
  const label = typeof value.rowLabel === "number" ? formulaNumber(value.rowLabel) : formulaString(value.rowLabel);
  return `INDEX(${inner},MATCH(${label},INDEX(${inner},0,1),0),${value.column})`;
}

/** Characters that would make the spreadsheet read a typed text as a formula or a number. */
const FORMULA_LEAD = /^[=+\-@']/;

/**
 * The text to put into `Range.formulas` for a value: a formula for computed
 * values, the bare text for text rows (guarded so it is never read as a formula).
 *
 * @example
 * blockFormula({ kind: "call", fn: "COUNTS", args: [{ ref: "data" }, { number: 50 }], column: 3 }, { data: "Panels[Thickness]" });
 * // "=INDEX(EVENSPLIT.COUNTS(Panels[Thickness],50),1,3)"
 */
export function blockFormula(value: BlockValue, refs: FormulaRefs): string {
  switch (value.kind) {
    case "text":
      return FORMULA_LEAD.test(value.text) ? `'${value.text}` : value.text;
    case "call":
      return `=${formulaCall(value, refs)}`;
    case "numbers":
      return `=COUNT(${formulaOperand({ ref: value.of }, refs)})`;
    case "median":
      return `=MEDIAN(${formulaOperand({ ref: value.of }, refs)})`;
    case "skipped": {
      const range = formulaOperand({ ref: value.of }, refs);
      return `=COUNTA(${range})-COUNT(${range})`;
    }
    case "sum":
      return `=${value.terms.map((term) => formulaCall(term, refs)).join("+")}`;
    case "decision":
      return `=IF(${formulaCall(value.pValue, refs)}<=${formulaNumber(value.alpha)},${formulaString(value.reject)},${formulaString(value.keep)})`;
    case "atMost":
      return `=IF(${formulaCall(value.value, refs)}<=${formulaNumber(value.limit)},${formulaString(value.then)},${formulaString(value.otherwise)})`;
    case "whenWord":
      return `=IF(${formulaCall(value.value, refs)}=${formulaString(value.word)},${formulaString(value.then)},${formulaString(value.otherwise)})`;
    case "blankCheck": {
      const sheetCount = `COUNT(${value.ranges.map((range) => formulaOperand({ ref: range }, refs)).join(",")})`;
      const read = value.read.map((term) => formulaCall(term, refs)).join("+");
      return `=IF(${sheetCount}=${read},${formulaString(value.agree)},${formulaString(value.differ)})`;
    }
    case "pasted": {
      const cells = value.cells.map((cell) => formulaOperand(pastedCell(cell), refs));
      return value.blankShows === true && cells.length === 1 ? `=IF(${cells[0]}="","",${cells[0]})` : `=${cells.join("+")}`;
    }
    case "pastedAddsUp": {
      const cell = (k: number): string => formulaOperand(pastedCell(k), refs);
      return `=IF(${cell(value.total)}=${value.parts.map(cell).join("+")},${formulaString(value.agree)},${formulaString(value.differ)})`;
    }
    case "audit": {
      // Plain text, fixed at writing: the time must not move with recalculation.
      const ranges = refs.second === undefined ? refs.data : `${refs.data} and ${refs.second}`;
      return blockFormula({ kind: "text", text: auditWords(value, ranges, `written ${auditTime(refs.writtenAt ?? new Date())}`) }, refs);
    }
  }
}

/** Inputs for evaluating a block directly, as REPORT does. */
export interface BlockInputs {
  readonly data: readonly (readonly unknown[])[];
  readonly second?: readonly (readonly unknown[])[];
  /**
   * True when the cells arrived as a custom function's range argument (REPORT), where some Excel
   * builds pass a blank cell as 0; absent or false when they were read from the sheet itself
   * (the pane reads `Range.values`, where a blank is always empty).
   */
  readonly passedAsArgument?: boolean;
  /** The moment the audit line states as the evaluation time; now when not given. */
  readonly evaluatedAt?: Date;
  /**
   * The ranges' addresses as the host gave them (REPORT: `invocation.parameterAddresses`, such as
   * "Panels!B2:B25"), for the audit line; without them (an older host, a call without a sheet) it gives
   * the ranges' sizes. For a paired block both are needed.
   */
  readonly addresses?: { readonly data: string; readonly second?: string };
}

/** Runs a catalogue function by id on cell matrices, numbers and words; returns a scalar or a one-row matrix. */
export type CatalogueCall = (fn: string, args: unknown[]) => unknown;

/** What COUNT counts. */
function isNumberCell(cell: unknown): boolean {
  return typeof cell === "number" && Number.isFinite(cell);
}

/** What COUNTA counts: anything but an empty cell. */
function isFilledCell(cell: unknown): boolean {
  return cell !== null && cell !== undefined && cell !== "";
}

function countCells(matrix: readonly (readonly unknown[])[], counts: (cell: unknown) => boolean): number {
  let count = 0;
  for (const r of matrix) for (const cell of r) if (counts(cell)) count++;
  return count;
}

/**
 * What the sheet's MEDIAN gives for a range: the middle of its numbers (the mean of the two middle ones for an
 * even count), text, logical values and blanks in the range ignored, #NUM! when it holds no number (Microsoft,
 * "MEDIAN function"), here as a cell error object of the catalogue's shape.
 */
function sheetMedian(cells: readonly (readonly unknown[])[]): unknown {
  const numbers: number[] = [];
  for (const r of cells) for (const cell of r) if (isNumberCell(cell)) numbers.push(cell as number);
  if (numbers.length === 0) return { code: "#NUM!", message: "MEDIAN found no number in the range." };
  numbers.sort((a, b) => a - b);
  const middle = numbers.length >> 1;
  return numbers.length % 2 === 1 ? numbers[middle] : (numbers[middle - 1] + numbers[middle]) / 2;
}

function rangeOf(range: "data" | "second", inputs: BlockInputs): readonly (readonly unknown[])[] {
  if (range === "data") return inputs.data;
  if (inputs.second === undefined) throw new RangeError("this block needs a second range");
  return inputs.second;
}

/**
 * What REPORT can say when the counts agree but cells arrived as 0: inside one cell a blank passed as 0
 * looks like a measured 0, so only the sheet's own COUNT beside it can settle the question.
 */
export function blankCheckUncheckedWords(zeros: number, read: number): string {
  return `Cannot be checked inside REPORT: ${zeros} cell${zeros === 1 ? "" : "s"} arrived as 0. If the sheet's COUNT of the range is less than ${read}, this Excel passed blank cells as zeros; use a table column and leave no cell in it empty`;
}

function blankCheck(value: BlankCheckValue, inputs: BlockInputs, run: CatalogueCall): unknown {
  let read = 0;
  for (const term of value.read) {
    const part = evaluateCall(term, inputs, run);
    if (typeof part !== "number") return part;
    read += part;
  }
  let sheetCount = 0;
  let zeros = 0;
  for (const range of value.ranges) {
    const cells = rangeOf(range, inputs);
    sheetCount += countCells(cells, isNumberCell);
    zeros += countCells(cells, (cell) => cell === 0);
  }
  if (sheetCount !== read) return value.differ;
  return inputs.passedAsArgument === true && zeros > 0 ? blankCheckUncheckedWords(zeros, read) : value.agree;
}

/** A range's outline, for the audit line when the host gave REPORT the values without their address. */
function rangeWords(cells: readonly (readonly unknown[])[]): string {
  const rows = cells.length;
  const columns = rows === 0 ? 0 : cells[0].length;
  return `${rows} row${rows === 1 ? "" : "s"} × ${columns} column${columns === 1 ? "" : "s"}`;
}

/** The ranges read: their addresses when the host gave every one of them, otherwise their sizes. */
function rangesRead(inputs: BlockInputs): string {
  const addresses = inputs.addresses;
  if (addresses !== undefined && (inputs.second === undefined) === (addresses.second === undefined))
    return addresses.second === undefined ? addresses.data : `${addresses.data} and ${addresses.second}`;
  return inputs.second === undefined
    ? `the range given (${rangeWords(inputs.data)})`
    : `the ranges given (${rangeWords(inputs.data)} and ${rangeWords(inputs.second)})`;
}

function auditValue(value: AuditValue, inputs: BlockInputs): string {
  return auditWords(value, rangesRead(inputs), `evaluated ${auditTime(inputs.evaluatedAt ?? new Date())}`);
}

/** One cell of the data's first row (from 1), as the sheet holds it. */
function pastedValue(inputs: BlockInputs, cell: number): unknown {
  return inputs.data[0]?.[cell - 1] ?? null;
}

function isBlank(cell: unknown): boolean {
  return cell === null || cell === undefined || cell === "";
}

/** Pasted cells added as the sheet's + adds them: a blank counts 0, text is #VALUE!. */
function pastedSum(inputs: BlockInputs, cells: readonly number[]): unknown {
  let total = 0;
  for (const cell of cells) {
    const x = pastedValue(inputs, cell);
    if (isBlank(x)) continue;
    if (typeof x !== "number") return cellError("#VALUE!", "A pasted cell that should hold a count holds text.");
    total += x;
  }
  return total;
}

function pasted(value: { readonly cells: readonly number[]; readonly blankShows?: boolean }, inputs: BlockInputs): unknown {
  if (value.cells.length !== 1) return pastedSum(inputs, value.cells);
  const x = pastedValue(inputs, value.cells[0]);
  return isBlank(x) ? (value.blankShows === true ? "" : 0) : x;
}

function evaluateCall(value: CallValue, inputs: BlockInputs, run: CatalogueCall): unknown {
  const args = value.args.map((operand) =>
    "ref" in operand
      ? operand.ref === "data" && operand.cell !== undefined
        ? pastedValue(inputs, operand.cell)
        : rangeOf(operand.ref, inputs)
      : "omitted" in operand
        ? null
        : "number" in operand
          ? operand.number
          : operand.text,
  );
  const result = run(value.fn, args);
  if (value.column === undefined || !Array.isArray(result)) return result;
  const table = result as unknown[][];
  if (value.rowLabel === undefined) return table[(value.row ?? 1) - 1][value.column - 1];
  const at = table.findIndex((r) => sameLabel(r[0], value.rowLabel!));
  return at < 0 ? { code: "#N/A", message: `No row of the table is labelled ${String(value.rowLabel)}.` } : table[at][value.column - 1];
}

/** MATCH's exact comparison: text without regard to case, anything else as it is. */
function sameLabel(cell: unknown, label: string | number): boolean {
  return typeof label === "string" ? typeof cell === "string" && cell.toLowerCase() === label.toLowerCase() : cell === label;
}

/**
 * Evaluates a value on cell matrices, as the formulas from `blockFormula`
 * would in the sheet. A catalogue call that answers with an error object
 * (anything not a number) passes it through unchanged, including in a decision.
 */
export function blockValue(value: BlockValue, inputs: BlockInputs, run: CatalogueCall): unknown {
  switch (value.kind) {
    case "text":
      return value.text;
    case "call":
      return evaluateCall(value, inputs, run);
    case "numbers":
      return countCells(rangeOf(value.of, inputs), isNumberCell);
    case "median":
      return sheetMedian(rangeOf(value.of, inputs));
    case "skipped":
      return countCells(rangeOf(value.of, inputs), isFilledCell) - countCells(rangeOf(value.of, inputs), isNumberCell);
    case "sum": {
      let total = 0;
      for (const term of value.terms) {
        const part = evaluateCall(term, inputs, run);
        if (typeof part !== "number") return part;
        total += part;
      }
      return total;
    }
    case "decision": {
      const p = evaluateCall(value.pValue, inputs, run);
      if (typeof p !== "number") return p;
      return p <= value.alpha ? value.reject : value.keep;
    }
    case "atMost": {
      const x = evaluateCall(value.value, inputs, run);
      if (typeof x !== "number") return x;
      return x <= value.limit ? value.then : value.otherwise;
    }
    case "whenWord": {
      const x = evaluateCall(value.value, inputs, run);
      if (typeof x !== "string") return x;
      return x.toLowerCase() === value.word.toLowerCase() ? value.then : value.otherwise;
    }
    case "blankCheck":
      return blankCheck(value, inputs, run);
    case "pasted":
      return pasted(value, inputs);
    case "pastedAddsUp": {
      const total = pastedSum(inputs, [value.total]);
      const parts = pastedSum(inputs, value.parts);
      if (typeof total !== "number") return total;
      if (typeof parts !== "number") return parts;
      return total === parts ? value.agree : value.differ;
    }
    case "audit":
      return auditValue(value, inputs);
  }
}
