/**
 * The Result step's part of the pane state: where the block goes, the chart
 * and plot choices, the listing of filled cells awaiting consent. Pure
 * updates, and what the step shows: the preview rows computed now by the
 * catalogue's own functions, the plots' inputs, the place and its problems.
 *
 * Method: the rows come from preview.ts (src/report/resultBlock.ts's one
 * definition); the null distribution's bars from plot.ts.
 *
 * Cost: the preview costs the catalogue calls on the data (one pass each);
 * the updates O(1).
 */
import { boundSideFor, resultBlockRows, type BlockRequest, type CatalogueCall } from "../report/resultBlock";
import { numbersFromCells, pairsFromCells } from "../stats/cells";
import { pairedDifferences } from "../stats/differences";
import { formatAddress, type CellRect } from "./a1";
import { choices, dataKind, dataReady, referenceSentence } from "./dataState";
import type { Confirmation, PaneState } from "./paneState";
import { nullBars, type NullBar } from "./plot";
import { numberLineLayout, type NumberLineInput } from "./plotView";
import { blockPreview, blockSize, type PreviewRow } from "./preview";
import { currentRequest } from "./questionState";
import { chartProblem, chartQuestionProblem } from "./chartPlan";
import {
  blockInputs,
  blockRefs,
  bodyOf,
  chartColumnsOf,
  chartTableReference,
  placeFromText,
  referenceOptions,
  tablesToCreate,
  type DataChoice,
} from "./workflow";
import { onSheet, wordingRequest } from "./writePlan";

export const PAST_EDGE =
  "The block does not fit on the sheet there (1,048,576 rows, columns A to XFD): pick a top-left cell further up or to the left.";
export const NO_ADDRESS = "Type a cell address such as E1 for the block’s top-left corner.";

/**
 * The place typed or picked by the person: the pane stops suggesting one, and a listing made for another place no longer holds.
 *
 * @example
 * setTarget(state, "H1"); // { ...state, target: "H1", targetEdited: true, confirm: null }
 */
export function setTarget(state: PaneState, target: string): PaneState {
  return { ...state, target, targetEdited: true, confirm: null };
}

/**
 * The place the pane suggests, unless the person chose one.
 *
 * @example
 * suggestTarget(state, "E1").target; // "E1"
 */
export function suggestTarget(state: PaneState, target: string): PaneState {
  return state.targetEdited ? state : { ...state, target };
}

/**
 * The top-left cell of a selection's address, as the block's place.
 *
 * @example
 * targetFromSelection(state, "'Paint line'!H3:J9").target; // "'Paint line'!H3"
 */
export function targetFromSelection(state: PaneState, address: string): PaneState {
  return setTarget(state, address.split(":")[0]);
}

/**
 * Whether to add the chart.
 *
 * @example
 * setChart(state, true).chart; // true
 */
export function setChart(state: PaneState, chart: boolean): PaneState {
  return { ...state, chart };
}

/**
 * Whether to show the count's null distribution.
 *
 * @example
 * setShowNull(state, true).showNull; // true
 */
export function setShowNull(state: PaneState, showNull: boolean): PaneState {
  return { ...state, showNull };
}

/**
 * The filled cells to ask about, or null once the person answered.
 *
 * @example
 * setConfirm(state, null).confirm; // null
 */
export function setConfirm(state: PaneState, confirm: Confirmation | null): PaneState {
  return { ...state, confirm };
}

/**
 * The state with a chart only where one can be made: one set of values or pairs, each range one column, never a database's answer.
 *
 * @example
 * settleResult({ ...state, chart: true }).chart; // false when the values fill two columns
 */
export function settleResult(state: PaneState): PaneState {
  // A database's values are not in the sheet: a chart of the pasted counts would mean nothing.
  if (state.chart && state.database !== null) return { ...state, chart: false };
  const c = choices(state);
  if (!state.chart || c.length === 0) return state;
  const kind = dataKind(state);
  if ((kind === "one" || kind === "pairs") && chartProblem(chartColumnsOf(c)) === null) return state;
  return { ...state, chart: false };
}

/**
 * The preview rows of the block the state asks for, evaluated now.
 *
 * @example
 * statePreview(state, request, callFunction).find((r) => r.key === "pvalue")?.shown; // "0.0133"
 */
export function statePreview(state: PaneState, request: BlockRequest, calculate: CatalogueCall): PreviewRow[] {
  const c = choices(state);
  return blockPreview(wordingRequest(request), blockInputs(c), blockRefs(c, state.reference, [], c[0].range.sheet), calculate);
}

/**
 * The block's size: from its rows alone, or, when it spills a table by group, from the preview, since the
 * table takes a row per group.
 *
 * @example
 * targetSize(state, request, callFunction); // { rows: 24, columns: 2 }
 */
export function targetSize(state: PaneState, request: BlockRequest, calculate: CatalogueCall): { rows: number; columns: number } {
  const rows = resultBlockRows(request);
  if (!rows.some((row) => row.spill) || choices(state).length === 0) return { rows: rows.length, columns: 2 };
  return blockSize(statePreview(state, request, calculate));
}

/**
 * What the chart will show, in a sentence for the hint under its checkbox.
 *
 * @example
 * chartWords(false, "two-sided", "table"); // "A scatter chart of the values row by row, with H0's value and the bounds as lines; ..."
 */
export function chartWords(paired: boolean, side: "two-sided" | "lower" | "upper", rows: "table" | "open" | "exact"): string {
  const bounds = side === "two-sided" ? "the lower and upper bounds" : `the ${side} bound`;
  const what = paired ? "the differences (second − first), pair by pair," : "the values row by row,";
  // Only a table's column grows the chart's series: an open-ended range would plot a million empty rows.
  const follows = paired
    ? " The differences are worked out in helper cells for the pairs there are now; write again after adding rows."
    : rows === "table"
      ? " New rows of the table show up as new points."
      : rows === "open"
        ? " The block reads new rows, but the chart plots the rows there are now; write again after adding rows."
        : "";
  return `A scatter chart of ${what} with H0’s value and ${bounds} as lines that move with the block. It goes right of the block, beside a few labelled helper cells, where it covers no data. Its value axis is set around the values when written; a value far outside it needs the block written again.${follows}`;
}

/**
 * The block's place for a request, read from the target text, or null when it is not an address.
 *
 * @example
 * targetPlace(state, request); // { sheet: "Paint line", rect: { top: 0, left: 4, bottom: 20, right: 5 } }
 */
export function targetPlace(state: PaneState, request: BlockRequest, calculate: CatalogueCall): { sheet: string; rect: CellRect } | null {
  const c = choices(state);
  if (c.length === 0) return null;
  const size = targetSize(state, request, calculate);
  return placeFromText(state.target, c[0].range.sheet, size.rows, size.columns);
}

/**
 * Numbers for the plot: the values, or the paired differences second − first.
 *
 * @example
 * plotValues([{ range, useHeader: true }]).length; // 22
 */
export function plotValues(c: readonly DataChoice[]): Float64Array {
  const bodies = c.map(bodyOf);
  if (bodies.length === 1) return numbersFromCells(bodies[0].values).values;
  const pairs = pairsFromCells(bodies[0].values, bodies[1].values);
  return pairedDifferences(pairs.first, pairs.second, 0);
}

function numberOrNull(value: unknown): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

/** Where the block goes, in words, and what is wrong with the place typed. */
function placeOf(
  state: PaneState,
  request: BlockRequest,
  height: number,
  calculate: CatalogueCall,
): { targetHint: string; targetProblem: string | null } {
  const target = targetPlace(state, request, calculate);
  const fits = target !== null && onSheet(target.rect);
  const targetHint = fits
    ? `The block takes 2 columns × ${height} rows: ${formatAddress(target.rect, target.sheet)}.${state.targetEdited ? "" : " Suggested: the first empty area to the right of the data."}`
    : `The block takes 2 columns × ${height} rows; type the cell for its top-left corner, such as E1.`;
  const targetProblem =
    state.target.trim() === "" ? null : !target ? "That is not a cell address; type one such as E1." : fits ? null : PAST_EDGE;
  return { targetHint, targetProblem };
}

/** The Result step's recap for a database query's pasted answer. */
function databaseRecap(cells: string): string {
  return `The block will read the query's answer in ${cells}: its formulas recalculate when a new answer is pasted there.`;
}

/** What the Result step shows. */
export interface ResultView {
  readonly rows: readonly PreviewRow[];
  readonly plot: NumberLineInput | null;
  readonly caption: string;
  /** The count's null distribution is offered (sign and quantile tests). */
  readonly countTest: boolean;
  /** The bars to draw, empty when not asked for or too many. */
  readonly bars: readonly NullBar[];
  readonly barsWhat: string;
  readonly barsCaption: string;
  readonly tooManyBars: boolean;
  readonly target: string;
  readonly targetHint: string;
  readonly targetProblem: string | null;
  readonly recap: string;
  readonly chartAvailable: boolean;
  /** Writing will make a table of the data first: the Write button says so. */
  readonly makesTable: boolean;
  readonly chartHint: string;
  readonly chart: boolean;
  readonly busy: boolean;
  readonly confirm: Confirmation | null;
}

const EMPTY: Omit<ResultView, "busy" | "confirm" | "target" | "chart"> = {
  rows: [],
  plot: null,
  caption: "",
  countTest: false,
  bars: [],
  barsWhat: "",
  barsCaption: "",
  tooManyBars: false,
  targetHint: "",
  targetProblem: null,
  recap: "",
  chartAvailable: false,
  chartHint: "",
  makesTable: false,
};

/**
 * Everything the Result step shows, from the state. The preview runs the
 * tests on the data, so only while the Result step is shown.
 *
 * @example
 * resultView(stateAtResult, callFunction).rows.find((r) => r.key === "pvalue")?.shown; // "0.0133"
 */
export function resultView(state: PaneState, calculate: CatalogueCall): ResultView {
  const fixed = { busy: state.busy, confirm: state.confirm, target: state.target, chart: state.chart };
  const built = currentRequest(state);
  if (state.step !== 3 || !built.ok || !dataReady(state)) return { ...EMPTY, ...fixed };
  const c = choices(state);
  const request = built.request;
  const rows = statePreview(state, request, calculate);
  if (state.groups !== "none") return groupResultView(state, rows, fixed);
  const value = (key: string): unknown => rows.find((r) => r.key === key)?.value;
  // A database's values stay in the database: the pane holds only the pasted counts, so there is nothing to plot.
  if (state.database !== null)
    return {
      ...EMPTY,
      ...fixed,
      rows,
      ...placeOf(state, request, rows.length, calculate),
      recap: databaseRecap(blockRefs(c, state.reference, [], c[0].range.sheet).data),
    };
  const values = plotValues(c);
  const what = state.paired ? "differences" : "values";
  const plot = { values, center: request.center, lower: numberOrNull(value("lower")), upper: numberOrNull(value("upper")), what };
  const level = `${Number((request.confidence * 100).toPrecision(12))}%`;
  const bounded = plot.lower !== null || plot.upper !== null;
  const band = bounded
    ? `Shaded: the ${level} bounds${request.test === "signed-rank" ? " (Hodges–Lehmann)" : ""}.`
    : `There are no bounds to shade: these data cannot reach ${level} confidence.`;
  const count = values.length.toLocaleString("en-US");
  const drawn =
    numberLineLayout(plot).kind === "bins"
      ? `Bars: the ${count} ${what}, counted in bins too full to stack as dots`
      : `Dots: the ${count} ${what}`;
  const caption = `${drawn}. Dashed line: the hypothesised value ${request.center}. ${band}`;
  const countTest = request.test !== "signed-rank";
  const used = numberOrNull(value("used"));
  const observed = request.test === "quantile" ? numberOrNull(value("below")) : numberOrNull(value("statistic"));
  const bars = countTest && state.showNull && used !== null && observed !== null ? nullBars(used, request.quantile ?? 0.5, observed) : [];
  const chartBlocked = chartQuestionProblem(request) ?? chartProblem(chartColumnsOf(c));
  return {
    ...fixed,
    rows,
    plot,
    caption,
    countTest,
    bars,
    barsWhat: request.test === "quantile" ? "count below" : "sign statistic",
    barsCaption:
      bars.length > 0
        ? `Bars: how likely each ${request.test === "quantile" ? "count below the hypothesised value" : "count above the hypothesised value"} is if H0 holds, for the ${used} values used; the observed count is marked.`
        : "",
    tooManyBars: state.showNull && countTest && bars.length === 0,
    ...placeOf(state, request, rows.length, calculate),
    recap: referenceSentence(state),
    chartAvailable: chartBlocked === null,
    makesTable: state.reference === "table" && !referenceOptions(c).allTableColumns && tablesToCreate(c).length > 0,
    chartHint:
      chartBlocked !== null
        ? `Not available: ${chartBlocked[0].toLowerCase()}${chartBlocked.slice(1)}`
        : chartWords(
            state.paired,
            boundSideFor(request.alternative),
            chartTableReference(c, state.reference, []) !== null || state.reference === "table" ? "table" : state.reference,
          ),
  };
}

/**
 * The Result step for groups: the preview (the table by group included) and the place; no number line, since
 * the groups' values are not one set to draw against one hypothesised value, and no chart: independent groups
 * have no row-by-row difference to plot.
 */
function groupResultView(
  state: PaneState,
  rows: PreviewRow[],
  fixed: Pick<ResultView, "busy" | "confirm" | "target" | "chart">,
): ResultView {
  const c = choices(state);
  const size = blockSize(rows);
  const target = placeFromText(state.target, c[0].range.sheet, size.rows, size.columns);
  const fits = target !== null && onSheet(target.rect);
  const table = rows.some((row) => row.table !== undefined) ? ", the table by group taking a row per group" : "";
  const shape = `The block takes ${size.columns} columns × ${size.rows} rows${table}`;
  const targetHint = fits
    ? `${shape}: ${formatAddress(target.rect, target.sheet)}.${state.targetEdited ? "" : " Suggested: the first empty area to the right of the data."}`
    : `${shape}; type the cell for its top-left corner, such as H1.`;
  const targetProblem =
    state.target.trim() === "" ? null : !target ? "That is not a cell address; type one such as H1." : fits ? null : PAST_EDGE;
  return {
    ...EMPTY,
    ...fixed,
    rows,
    targetHint,
    targetProblem,
    recap: referenceSentence(state),
    chartAvailable: false,
    makesTable: state.reference === "table" && !referenceOptions(c).allTableColumns && tablesToCreate(c).length > 0,
    chartHint: "Not available: the chart is drawn for one set of values or pairs, not for groups.",
  };
}
