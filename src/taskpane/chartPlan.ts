/**
 * The chart the pane adds beside a result block, planned without touching
 * the workbook: a strip of the values in row order (for pairs, of second −
 * first), with the value H0 names and the bounds that exist drawn across it
 * as lines, so that one look shows where the data lie against the question.
 *
 * Layout. The values go up the vertical axis and the rows of the data along
 * the horizontal one, so the chart needs no helper cell per value: a scatter
 * series with values and no x values is drawn against 1, 2, 3, ... (common
 * practice of Excel's scatter charts). Each line is a two-point series whose
 * x values are 0 and the number of rows + 1 and whose y values are helper
 * cells beside the block: the hypothesised value as a number, each bound as
 * a formula pointing at the block's own bound cell, so the lines move when
 * the block recalculates. When the data are a table column the series and
 * the row count refer to the table, so a new row shows as a new point
 * (Excel extends a chart's series when the table it plots grows; common
 * practice). Pairs are plotted as their differences, which need a helper
 * cell per pair: those cover the rows there are when the block is written.
 *
 * Place. The helper cells and the chart sit to the right of the block, in
 * the first columns where both fit on empty cells with an empty column
 * before them (placement.ts), the cells of blocks being replaced counting as
 * empty; so the chart covers neither the data nor any block.
 *
 * Axis. The value axis runs over the data, the hypothesised value and the
 * bounds with a quarter of their spread as margin on each side, rounded
 * outwards to a round step: not from 0, which would flatten the strip. Excel
 * keeps axis ends as numbers, not formulas, so the margin leaves room for
 * new rows near the data; a value far outside falls off the chart until the
 * block is written again.
 *
 * Cost: O(values) for the axis; O(rows of the strip × columns) for the place.
 */
import { boundSideFor, type BlockRequest } from "../report/resultBlock";
import { formatAddress, rectsOverlap, type CellRect } from "./a1";
import type { CellsRead, SheetRect } from "./host";
import { firstFreeColumn } from "./placement";
import type { PreviewRow } from "./preview";
import { absoluteReference } from "./references";

/** Columns of the helper cells: a label, then the line's two ends. */
export const HELPER_COLUMNS = 3;
/** The cells the chart floats over: 7 columns by 15 rows of default size, about 450 × 300 points (common practice). */
export const CHART_COLUMNS = 7;
export const CHART_ROWS = 15;

/** Colours of our own choosing: the points a slate blue, H0's line a brick red, the bounds a green, each readable on white. */
export const CHART_COLOURS = { points: "#3D5A80", hypothesis: "#B5452E", bounds: "#2D7A4F" } as const;

/** A line drawn across the chart: a two-point series. */
export interface ChartLine {
  readonly name: string;
  /** The two helper cells holding the line's height at its two ends. */
  readonly values: CellRect;
  readonly style: "Continuous" | "Dash";
  readonly colour: string;
}

/** A native chart the write adds, with the helper cells its lines read. */
export interface PlannedChart {
  /** The block's sheet: the chart, its helper cells and the block sit together. */
  readonly sheet: string;
  readonly name: string;
  readonly title: string;
  /** The cells the chart floats over. */
  readonly area: CellRect;
  /** The plotted values: one column, possibly on the data's sheet. */
  readonly points: { readonly sheet: string; readonly rect: CellRect; readonly name: string };
  /** Two helper cells: the x values of every line's ends. */
  readonly lineEnds: CellRect;
  readonly lines: readonly ChartLine[];
  readonly valueAxis: { readonly minimum: number; readonly maximum: number; readonly title: string };
  readonly rowAxisTitle: string;
  readonly helper: {
    readonly rect: CellRect;
    readonly formulas: string[][];
    /** The defined name that marks the helper cells, so a later write can clear them. */
    readonly name: string;
  };
}

/** A column of the data: where its values are and what they are called. */
export interface ChartColumn {
  readonly sheet: string;
  readonly rect: CellRect;
  readonly values: readonly (readonly unknown[])[];
  readonly name?: string;
}

/**
 * Why the chart cannot be drawn for these columns, or null: it plots one column of values (or two of pairs).
 *
 * @example
 * chartProblem([{ sheet: "S", rect: { top: 1, left: 1, bottom: 24, right: 2 }, values: [] }]); // "The chart plots one column ..."
 */
export function chartProblem(columns: readonly ChartColumn[]): string | null {
  const wide = columns.find((c) => c.rect.right !== c.rect.left);
  return wide ? `The chart plots one column of values; ${formatAddress(wide.rect)} has ${wide.rect.right - wide.rect.left + 1}.` : null;
}

/**
 * Why the chart does not fit the question, or null: it is drawn for one sample or pairs, not for groups.
 *
 * @example
 * chartQuestionProblem({ ...request, test: "two-groups" }); // "The chart is drawn for one set of values or pairs, not for groups."
 */
export function chartQuestionProblem(request: BlockRequest): string | null {
  return request.test === "two-groups" || request.test === "groups"
    ? "The chart is drawn for one set of values or pairs, not for groups."
    : null;
}

/**
 * A round step near a tenth of a spread: 1, 2 or 5 times a power of ten.
 *
 * @example
 * roundStep(6); // 0.5
 */
function roundStep(spread: number): number {
  const rough = spread / 10;
  const power = 10 ** Math.floor(Math.log10(rough));
  const scaled = rough / power;
  return (scaled <= 1 ? 1 : scaled <= 2 ? 2 : scaled <= 5 ? 5 : 10) * power;
}

/**
 * The value axis's ends: the values' range with a quarter of it as margin each side, rounded outwards to a step of
 * about a tenth of the range. A single value gets a margin of a tenth of its size (1 for 0).
 *
 * @example
 * axisRange([47.2, 50, 53.9]); // { minimum: 45, maximum: 56 }
 * axisRange([5]);              // { minimum: 4.5, maximum: 5.5 }
 */
export function axisRange(values: readonly number[]): { minimum: number; maximum: number } {
  const finite = values.filter(Number.isFinite);
  if (finite.length === 0) return { minimum: 0, maximum: 1 };
  let low = Infinity;
  let high = -Infinity;
  for (const v of finite) {
    if (v < low) low = v;
    if (v > high) high = v;
  }
  const spread = high > low ? high - low : Math.abs(high) / 10 || 1;
  const margin = high > low ? spread / 4 : spread;
  const step = roundStep(spread);
  const tidy = (x: number): number => Number(x.toPrecision(12));
  return { minimum: tidy(Math.floor((low - margin) / step) * step), maximum: tidy(Math.ceil((high + margin) / step) * step) };
}

/**
 * The strip with the cells of `cleared` regions read as empty: blocks the write replaces, whose cells it clears first.
 *
 * @example
 * withoutRegions(strip, [{ sheet: "S", rect: earlierBlock }]).values; // the earlier block's cells now ""
 */
export function withoutRegions(strip: CellsRead, cleared: readonly SheetRect[]): CellsRead {
  const mine = cleared.filter((r) => r.sheet.toLowerCase() === strip.sheet.toLowerCase() && rectsOverlap(r.rect, strip.rect));
  if (mine.length === 0) return strip;
  const inside = (row: number, column: number): boolean =>
    mine.some(({ rect }) => row >= rect.top && row <= rect.bottom && column >= rect.left && column <= rect.right);
  const blank = (grid: readonly (readonly unknown[])[]): unknown[][] =>
    grid.map((cells, r) => cells.map((cell, c) => (inside(strip.rect.top + r, strip.rect.left + c) ? "" : cell)));
  return { ...strip, values: blank(strip.values), formulas: blank(strip.formulas) };
}

/** Columns the helper cells, an empty column and the chart take together. */
export const CHART_SPAN = HELPER_COLUMNS + 1 + CHART_COLUMNS;

/**
 * The first column, at or right of `start`, where the helper cells and the chart fit on empty cells of the
 * strip with an empty column before them; the cells of `cleared` regions count as empty.
 *
 * @example
 * // a strip read from column G (6) with nothing in it: the helper cells start at H (7)
 * chartColumn(strip, 7, []); // 7
 */
export function chartColumn(strip: CellsRead, start: number, cleared: readonly SheetRect[]): number {
  return firstFreeColumn(withoutRegions(strip, cleared), start, CHART_SPAN);
}

/** What planChart needs: the question, the data, the block as planned, where the helper cells start, and the names. */
export interface ChartInput {
  readonly request: BlockRequest;
  /** One column, or two for pairs (first, second). */
  readonly columns: readonly ChartColumn[];
  /** The structured reference of the one column when it is a table column (the chart then follows new rows). */
  readonly tableReference: string | null;
  readonly block: SheetRect;
  readonly rows: readonly PreviewRow[];
  /** The helper cells' first column; the chart starts two columns after them. */
  readonly left: number;
  readonly chartName: string;
  readonly helperName: string;
}

function numbersOf(values: readonly (readonly unknown[])[]): number[] {
  return values.flatMap((row) => row.filter((v): v is number => typeof v === "number" && Number.isFinite(v)));
}

function percent(fraction: number): string {
  return `${Number((fraction * 100).toPrecision(12))}%`;
}

/**
 * Plans the chart: the helper cells (line ends, hypothesised value, a formula per bound that exists, and for
 * pairs a difference per row), the series, the axis and the place. Pairs lacking a number on either side get
 * #N/A, which a scatter chart leaves out (common practice).
 *
 * @example
 * planChart({ request, columns: [thickness], tableReference: "Table1[Thickness]", block, rows, left: 7, chartName: "Evensplit chart 1", helperName: "Evensplit_chartcells_1" });
 * // { area: { top: 0, left: 11, bottom: 14, right: 17 }, lines: [{ name: "H0: median = 50", ... }, ...], ... }
 */
export function planChart(input: ChartInput): PlannedChart {
  const { request, columns, block, rows, left } = input;
  const sheet = block.sheet;
  const top = block.rect.top;
  const level = percent(request.confidence);
  const side = boundSideFor(request.alternative);
  const quantity = request.test === "quantile" ? `${request.quantile ?? 0.5} quantile` : "median";
  const paired = columns.length === 2;
  const first = columns[0];
  const pointsName = paired ? `${columns[1].name ?? "second"} − ${first.name ?? "first"}` : (first.name ?? "Values");

  const helper: string[][] = [];
  const lineEnds = { top, left: left + 1, bottom: top, right: left + 2 };
  const plotted: number[] = [request.center];
  const lines: ChartLine[] = [];

  // Row 0: the line ends, from 0 to one past the last row, so the lines span every point.
  const rowCount = paired ? null : (input.tableReference ?? absoluteReference(first.rect, first.sheet, sheet));
  const pairRows = first.rect.bottom - first.rect.top + 1;
  helper.push(["Chart lines run over rows", "0", rowCount === null ? String(pairRows + 1) : `=ROWS(${rowCount})+1`]);
  const lineRow = (name: string, cells: string, style: ChartLine["style"], colour: string): void => {
    const row = helper.length;
    helper.push([`Chart line: ${name}`, cells, cells]);
    lines.push({ name, values: { top: top + row, left: left + 1, bottom: top + row, right: left + 2 }, style, colour });
  };
  lineRow(`H0: ${quantity} = ${request.center}`, String(request.center), "Continuous", CHART_COLOURS.hypothesis);
  for (const end of ["lower", "upper"] as const) {
    if (side !== "two-sided" && side !== end) continue;
    const index = rows.findIndex((r) => r.key === end);
    if (index < 0) continue;
    const bound = rows[index].value;
    if (typeof bound === "number") plotted.push(bound);
    const blockCell = absoluteReference(
      { top: top + index, left: block.rect.left + 1, bottom: top + index, right: block.rect.left + 1 },
      sheet,
      sheet,
    );
    lineRow(`${level} ${end} bound`, `=${blockCell}`, "Dash", CHART_COLOURS.bounds);
  }

  let points: PlannedChart["points"];
  if (paired) {
    const [a, b] = columns;
    const start = helper.length;
    for (let r = 0; r < pairRows; r++) {
      const at = (c: ChartColumn): string =>
        absoluteReference({ top: c.rect.top + r, left: c.rect.left, bottom: c.rect.top + r, right: c.rect.left }, c.sheet, sheet);
      helper.push([r === 0 ? `Chart points: ${pointsName}` : "", `=IF(COUNT(${at(a)},${at(b)})=2,${at(b)}-${at(a)},NA())`, ""]);
      const x = a.values[r]?.[0];
      const y = b.values[r]?.[0];
      if (typeof x === "number" && typeof y === "number") plotted.push(y - x);
    }
    points = { sheet, rect: { top: top + start, left: left + 1, bottom: top + start + pairRows - 1, right: left + 1 }, name: pointsName };
  } else {
    plotted.push(...numbersOf(first.values));
    points = { sheet: first.sheet, rect: first.rect, name: pointsName };
  }

  const bounds = side === "two-sided" ? `the ${level} bounds` : `the ${level} ${side} bound`;
  return {
    sheet,
    name: input.chartName,
    title: `${pointsName} row by row, against H0 and ${bounds}`,
    area: { top, left: left + HELPER_COLUMNS + 1, bottom: top + CHART_ROWS - 1, right: left + HELPER_COLUMNS + CHART_COLUMNS },
    points,
    lineEnds,
    lines,
    valueAxis: { ...axisRange(plotted), title: pointsName },
    rowAxisTitle: paired ? "Pair, in row order" : "Row of the data, in sheet order",
    helper: {
      rect: { top, left, bottom: top + helper.length - 1, right: left + HELPER_COLUMNS - 1 },
      formulas: helper,
      name: input.helperName,
    },
  };
}
