/**
 * The one door between the pane and the workbook. Every read and write the
 * pane makes goes through `createHost`, which takes the spreadsheet's `run`
 * function (Excel.run in Office, the demo sheet's stand-in on the demo page,
 * office-addin-mock in tests) and offers a handful of coarse operations.
 *
 * The interfaces below are the part of the Excel JavaScript API the pane
 * uses, written as structural types: Excel's own classes satisfy them, and
 * the demo sheet implements exactly these and nothing more.
 * Reference: Microsoft, "Excel JavaScript API" (ExcelApi 1.1–1.9 requirement
 * sets): Excel.run, RequestContext.sync, Range.load/values/formulas/numberFormat,
 * Range.clear, Range.getCellProperties/setCellProperties (1.9),
 * Worksheet.getUsedRangeOrNullObject, TableCollection.add/getItemOrNullObject,
 * Table.name/convertToRange, ChartCollection.add/getItemOrNullObject,
 * Chart.name/delete/setPosition/title/legend/axes (minimum, maximum, title),
 * ChartSeriesCollection.add and ChartSeries.setValues/setXAxisValues, chartType
 * and markers (1.7), NamedItemCollection.add/getItemOrNullObject and
 * NamedItem.getRangeOrNullObject/delete (1.4), WorksheetCollection.add/items
 * and Worksheet.activate/delete (1.1), WorksheetCollection.getItemOrNullObject
 * (1.4), RangeFormat.columnWidth (1.2).
 *
 * A write is one batch that cannot half-happen: it reads what it will
 * change, queues every change and syncs once. When the workbook refuses a
 * command of the batch, the commands before it have been carried out and
 * the rest have not (Microsoft, "OfficeExtension.Error class": the trace
 * holds what was "executed before the error occurred"), so the host puts
 * back what it read, removes by name what it made, and reads the workbook
 * again to say what, if anything, could not be put back.
 *
 * Cost: each operation is one `run` with one or two `sync` round trips; a
 * write is one `run` of three, and a refused write two more.
 */
import { formatAddress, parseAddress, rectSize, type CellRect } from "./a1";
import { CHART_COLOURS, type PlannedChart } from "./chartPlan";
import { BLOCK_NAME_PREFIX, companionNames, type BlockMark, type PlannedWrite } from "./writePlan";

export interface HostFont {
  bold: boolean;
  italic: boolean;
  color: string;
}

/** The font part of a cell's properties (Range.getCellProperties / setCellProperties, ExcelApi 1.9). */
export interface CellFont {
  readonly format?: { readonly font?: { readonly bold?: boolean; readonly italic?: boolean; readonly color?: string } };
}

/** What Range.clear can clear (Microsoft, "Excel.ClearApplyTo"). */
export type ClearWhat = "All" | "Formats" | "Contents";

export interface HostRange {
  readonly address: string;
  values: unknown[][];
  formulas: unknown[][];
  numberFormat: unknown[][];
  readonly isNullObject: boolean;
  readonly format: { readonly font: HostFont; columnWidth: number; autofitColumns(): void };
  load(propertyNames: string): unknown;
  getRow(row: number): HostRange;
  getColumn(column: number): HostRange;
  select(): void;
  clear(applyTo?: ClearWhat): void;
  getCellProperties(load: { format: { font: { bold: true; italic: true; color: true } } }): { readonly value: CellFont[][] };
  setCellProperties(properties: CellFont[][]): void;
}

export interface HostTableColumn {
  readonly name: string;
}

export interface HostTable {
  name: string;
  readonly isNullObject: boolean;
  readonly columns: { readonly items: HostTableColumn[]; load(propertyNames: string): unknown };
  getRange(): HostRange;
  load(propertyNames: string): unknown;
  convertToRange(): HostRange;
}

/**
 * Enumerated properties are typed as text, as Excel reads them back in wider sets than the pane writes; the
 * pane writes only members of Excel.ChartType ("XYScatter", "XYScatterLinesNoMarkers"), Excel.ChartMarkerStyle
 * ("Circle"), Excel.ChartLineStyle ("Continuous", "Dash") and Excel.ChartLegendPosition ("Bottom"), and the
 * demo's stand-in refuses anything else (Microsoft, the enum pages of the Excel JavaScript API).
 */
export interface HostChartSeries {
  name: string;
  chartType: string;
  markerStyle: string;
  markerSize: number;
  markerBackgroundColor: string;
  markerForegroundColor: string;
  readonly format: { readonly line: { color: string; lineStyle: string; weight: number } };
  setValues(sourceData: HostRange): void;
  setXAxisValues(sourceData: HostRange): void;
}

export interface HostChartAxis {
  /** A number, or "" for Excel's automatic choice (Microsoft, "Excel.ChartAxis class"). */
  minimum: number | "";
  maximum: number | "";
  readonly title: { text: string };
}

export interface HostChart {
  name: string;
  readonly isNullObject: boolean;
  readonly title: { text: string };
  readonly series: { add(name?: string): HostChartSeries; getItemAt(index: number): HostChartSeries };
  /** In a scatter chart the category axis is the horizontal one, the value axis the vertical one. */
  readonly axes: { readonly categoryAxis: HostChartAxis; readonly valueAxis: HostChartAxis };
  readonly legend: { position: string };
  setPosition(startCell: string, endCell?: string): void;
  load(propertyNames: string): unknown;
  delete(): void;
}

export interface HostNamedItem {
  readonly name: string;
  readonly isNullObject: boolean;
  load(propertyNames: string): unknown;
  getRangeOrNullObject(): HostRange;
  delete(): void;
}

export interface HostWorksheet {
  readonly name: string;
  readonly tables: {
    readonly items: HostTable[];
    add(address: string, hasHeaders: boolean): HostTable;
    getItemOrNullObject(name: string): HostTable;
    load(propertyNames: string): unknown;
  };
  readonly charts: {
    readonly items: HostChart[];
    add(type: string, sourceData: HostRange, seriesBy?: "Auto" | "Columns" | "Rows"): HostChart;
    getItemOrNullObject(name: string): HostChart;
    load(propertyNames: string): unknown;
  };
  readonly isNullObject: boolean;
  getRange(address?: string): HostRange;
  getUsedRangeOrNullObject(valuesOnly?: boolean): HostRange;
  load(propertyNames: string): unknown;
  activate(): void;
  delete(): void;
}

export interface HostContext {
  readonly workbook: {
    getSelectedRange(): HostRange;
    readonly worksheets: {
      readonly items: HostWorksheet[];
      load(propertyNames: string): unknown;
      add(name: string): HostWorksheet;
      getItem(name: string): HostWorksheet;
      getItemOrNullObject(name: string): HostWorksheet;
      getActiveWorksheet(): HostWorksheet;
    };
    readonly names: {
      readonly items: HostNamedItem[];
      add(name: string, reference: HostRange | string, comment?: string): HostNamedItem;
      getItemOrNullObject(name: string): HostNamedItem;
      load(propertyNames: string): unknown;
    };
    /** Every table of the workbook: a new table's name must differ from all of them. */
    readonly tables: { readonly items: HostTable[]; load(propertyNames: string): unknown };
  };
  sync(): Promise<unknown>;
}

/** Excel.run, or anything shaped like it. */
export type RunBatch = <T>(batch: (context: HostContext) => Promise<T>) => Promise<T>;

/** A rectangle on a named sheet. */
export interface SheetRect {
  readonly sheet: string;
  readonly rect: CellRect;
}

/** Cells read from the workbook: values as calculated, formulas as typed. */
export interface CellsRead extends SheetRect {
  readonly values: unknown[][];
  readonly formulas: unknown[][];
}

/** A table on a sheet: its whole range (header row included) and its column names in order. */
export interface TableInfo extends SheetRect {
  readonly name: string;
  readonly columns: readonly string[];
}

/** Everything needed to write the result block in one batch. */
export interface BlockWrite extends SheetRect {
  /** One row per block row: the label, then the value's formula (or text). */
  readonly formulas: string[][];
  readonly numberFormats: string[][];
  /** 0-based rows of the block to show bold across (the title). */
  readonly titleRows: readonly number[];
  /** 0-based rows shown in a muted italic style (the caution lines). */
  readonly cautionRows: readonly number[];
}

/** A new sheet's cells from A1, written in one batch (the installation check's sheet). */
export interface SheetContent {
  /** Row by row: formulas, texts and numbers, all rows as long. */
  readonly formulas: readonly (readonly (string | number)[])[];
  readonly numberFormats: readonly (readonly string[])[];
  /** 0-based rows shown bold. */
  readonly boldRows: readonly number[];
  /** 0-based rows shown italic (the cautions). */
  readonly italicRows: readonly number[];
  /** Widths in points of the first columns (RangeFormat.columnWidth). */
  readonly columnWidths: readonly number[];
}

/** How adding a sheet ended: written under this name, or refused (and the half-made sheet removed, unless `left` says otherwise). */
export type SheetReport =
  | { readonly kind: "written"; readonly sheet: string }
  | { readonly kind: "refused"; readonly reason: string; readonly left: string | null };

export interface Host {
  /** The selected range's address, with its sheet. */
  selection(): Promise<string>;
  /** Reads an address (with or without sheet; without: the active sheet). Null when the address cannot be read. */
  read(address: string): Promise<CellsRead | null>;
  /** The smallest rectangle holding every non-empty cell of a sheet, or null for an empty sheet. */
  usedRect(sheet: string): Promise<CellRect | null>;
  /** The tables of a sheet. */
  tables(sheet: string): Promise<TableInfo[]>;
  /** The blocks the pane wrote earlier, found by their defined names. */
  blocks(): Promise<BlockMark[]>;
  /** Names a new table, chart or block name must avoid: every defined name and table, and the charts of these sheets. */
  takenNames(sheets: readonly string[]): Promise<string[]>;
  /**
   * Carries out a checked write in one batch. First reads the cells of
   * `region` (the block's place and the earlier blocks it replaces) and asks
   * `proceed` whether they are still what the person agreed to; then queues
   * every change (earlier blocks cleared, tables made and named, formulas,
   * number formats, fonts, the chart, the block's name) and syncs once. When
   * the workbook refuses, what the batch changed is put back from what was
   * read, and the report lists whatever could not be put back.
   */
  applyWrite(plan: PlannedWrite, region: readonly SheetRect[], proceed: (current: readonly CellsRead[]) => boolean): Promise<WriteReport>;
  /**
   * Adds a sheet, named by `chooseName` from the names the workbook has, and writes `content` into it in
   * the same batch, then shows it. When the workbook refuses, the sheet it had added is deleted again.
   */
  addSheet(chooseName: (taken: readonly string[]) => string, content: SheetContent): Promise<SheetReport>;
}

/** How a write ended: the cells changed since the person agreed (nothing written), written whole, or refused and undone. */
export type WriteReport =
  | { readonly kind: "changed"; readonly current: readonly CellsRead[] }
  | { readonly kind: "written" }
  /**
   * `left` lists what the sheet still holds of this write; empty when it is exactly as before.
   * `unmade` lists the tables the write had made and that were turned back into plain cells.
   */
  | { readonly kind: "undone"; readonly reason: string; readonly left: readonly string[]; readonly unmade: readonly TableInfo[] };

function parseSheetAddress(address: string, fallbackSheet: string): SheetRect {
  const parsed = parseAddress(address);
  if (!parsed) throw new TypeError(`the workbook returned an address the pane cannot read: ${address}`);
  return { sheet: parsed.sheet ?? fallbackSheet, rect: { top: parsed.top, left: parsed.left, bottom: parsed.bottom, right: parsed.right } };
}

/** Queues what a TableInfo needs (name, column names, address); read it with `tableInfo` after the next sync. */
function queueTableLoad(table: HostTable): { table: HostTable; range: HostRange } {
  table.load("name");
  table.columns.load("items/name");
  const range = table.getRange();
  range.load("address");
  return { table, range };
}

function tableInfo({ table, range }: { table: HostTable; range: HostRange }, sheet: string): TableInfo {
  return { name: table.name, sheet, rect: parseSheetAddress(range.address, sheet).rect, columns: table.columns.items.map((c) => c.name) };
}

/** Font properties read before a write so they can be put back. */
const FONT_PROPERTIES = { format: { font: { bold: true, italic: true, color: true } } } as const;

/** What the cells of a region held before a write: contents, number formats and fonts. */
interface Snapshot extends CellsRead {
  readonly numberFormat: unknown[][];
  readonly fonts: CellFont[][];
}

type Attempt =
  | { readonly kind: "changed"; readonly current: readonly CellsRead[] }
  | { readonly kind: "written" }
  | { readonly kind: "failed"; readonly snapshot: readonly Snapshot[]; readonly reason: string };

function rangeOf(context: HostContext, part: SheetRect): HostRange {
  return context.workbook.worksheets.getItem(part.sheet).getRange(formatAddress(part.rect));
}

async function readSnapshot(context: HostContext, region: readonly SheetRect[]): Promise<Snapshot[]> {
  const reads = region.map((part) => {
    const range = rangeOf(context, part);
    range.load("values, formulas, numberFormat");
    return { part, range, fonts: range.getCellProperties(FONT_PROPERTIES) };
  });
  await context.sync();
  return reads.map(({ part, range, fonts }) => ({
    sheet: part.sheet,
    rect: part.rect,
    values: range.values,
    formulas: range.formulas,
    numberFormat: range.numberFormat,
    fonts: fonts.value,
  }));
}

function refusal(thrown: unknown): string {
  return thrown instanceof Error && thrown.message ? thrown.message : "the workbook gave no reason";
}

/** Queues every change of a write, in order: earlier blocks cleared, tables, cells, formats, chart, the block's name. */
function queueWrite(context: HostContext, plan: PlannedWrite): { tables: HostTable[]; block: HostRange } {
  const book = context.workbook;
  for (const earlier of plan.replaces) {
    rangeOf(context, earlier).clear("All");
    book.names.getItemOrNullObject(earlier.name).delete();
    if (earlier.helper) {
      rangeOf(context, earlier.helper).clear("All");
      book.names.getItemOrNullObject(earlier.helper.name).delete();
    }
    if (earlier.chart) book.worksheets.getItem(earlier.sheet).charts.getItemOrNullObject(earlier.chart).delete();
  }
  const tables = plan.tables.map((t) => {
    const made = book.worksheets.getItem(t.sheet).tables.add(formatAddress(t.rect, t.sheet), true);
    made.name = t.name;
    made.columns.load("items/name");
    return made;
  });
  const { block } = plan;
  const { rows, columns } = rectSize(block.rect);
  if (block.formulas.length !== rows || block.formulas.some((r) => r.length !== columns)) {
    throw new RangeError("the block's formulas do not match its target rectangle");
  }
  const range = rangeOf(context, block);
  range.formulas = block.formulas;
  range.numberFormat = block.numberFormats;
  range.getColumn(0).format.font.bold = true;
  for (const r of block.titleRows) range.getRow(r).format.font.bold = true;
  // Cautions are set apart by italics alone: a fixed grey that reads on white reads at about 2:1 on the dark
  // theme's cells, while the automatic font colour follows the theme (test/taskpane/paneDefects.test.ts).
  for (const r of block.cautionRows) range.getRow(r).format.font.italic = true;
  if (plan.chart) queueChart(context, plan.chart);
  book.names.add(plan.blockName, range, "Evensplit result block");
  return { tables, block: range };
}

/**
 * Queues the chart: its helper cells and their name, then a scatter chart made from the plotted values (one
 * series, drawn against the rows), a two-point line series per reference line, the axes, title, legend and place.
 */
function queueChart(context: HostContext, chart: PlannedChart): void {
  const book = context.workbook;
  const sheet = book.worksheets.getItem(chart.sheet);
  const helper = sheet.getRange(formatAddress(chart.helper.rect));
  helper.formulas = chart.helper.formulas;
  helper.getColumn(0).format.font.italic = true;
  const source = book.worksheets.getItem(chart.points.sheet).getRange(formatAddress(chart.points.rect));
  const made = sheet.charts.add("XYScatter", source, "Columns");
  made.name = chart.name;
  made.title.text = chart.title;
  const points = made.series.getItemAt(0);
  points.name = chart.points.name;
  points.markerStyle = "Circle";
  points.markerSize = 5;
  points.markerBackgroundColor = CHART_COLOURS.points;
  points.markerForegroundColor = CHART_COLOURS.points;
  const ends = sheet.getRange(formatAddress(chart.lineEnds));
  for (const line of chart.lines) {
    const series = made.series.add(line.name);
    series.chartType = "XYScatterLinesNoMarkers";
    series.setXAxisValues(ends);
    series.setValues(sheet.getRange(formatAddress(line.values)));
    series.format.line.color = line.colour;
    series.format.line.lineStyle = line.style;
    series.format.line.weight = 1.5;
  }
  made.axes.valueAxis.minimum = chart.valueAxis.minimum;
  made.axes.valueAxis.maximum = chart.valueAxis.maximum;
  made.axes.valueAxis.title.text = chart.valueAxis.title;
  made.axes.categoryAxis.minimum = 0;
  made.axes.categoryAxis.title.text = chart.rowAxisTitle;
  made.legend.position = "Bottom";
  made.setPosition(
    formatAddress({ ...chart.area, bottom: chart.area.top, right: chart.area.left }),
    formatAddress({ ...chart.area, top: chart.area.bottom, left: chart.area.right }),
  );
  book.names.add(chart.helper.name, helper, "Evensplit chart helper cells");
}

/** A table whose columns Excel named otherwise than the plan expected would leave the block's references pointing at nothing. */
function columnMismatch(plan: PlannedWrite, made: readonly HostTable[]): string | null {
  for (let i = 0; i < plan.tables.length; i++) {
    const got = made[i].columns.items.map((c) => c.name);
    const wanted = plan.tables[i].columns;
    if (got.length !== wanted.length || got.some((name, k) => name !== wanted[k])) {
      return `the new table's columns came out named ${got.map((n) => `“${n}”`).join(", ")}, not as the header row reads`;
    }
  }
  return null;
}

/** Puts back what a failed write changed, then reads the workbook again and lists whatever still differs. */
async function undoWrite(
  run: RunBatch,
  plan: PlannedWrite,
  snapshot: readonly Snapshot[],
): Promise<{ left: string[]; unmade: TableInfo[] }> {
  // Which of the planned tables the failed write had made, as found before undoing.
  let made: boolean[] = [];
  try {
    await run(async (context) => {
      const book = context.workbook;
      const found = madeObjects(context, plan);
      await context.sync();
      made = found.tables.map((table) => !table.isNullObject);
      for (const table of found.tables) if (!table.isNullObject) table.convertToRange();
      if (found.chart && !found.chart.isNullObject) found.chart.delete();
      if (found.helper && !found.helper.isNullObject) found.helper.delete();
      if (!found.mark.isNullObject) found.mark.delete();
      plan.replaces.forEach((earlier, i) => {
        if (found.earlier[i].isNullObject) book.names.add(earlier.name, rangeOf(context, earlier), "Evensplit result block");
        const helper = found.earlierHelpers[i];
        if (earlier.helper && helper?.isNullObject)
          book.names.add(earlier.helper.name, rangeOf(context, earlier.helper), "Evensplit chart helper cells");
      });
      for (const part of snapshot) {
        const range = rangeOf(context, part);
        range.formulas = part.formulas;
        range.numberFormat = part.numberFormat;
        range.setCellProperties(part.fonts);
      }
      await context.sync();
    });
  } catch {
    // Whatever could not be put back shows up in the reading below.
  }
  try {
    return await run(async (context) => {
      const found = madeObjects(context, plan);
      const now = await readSnapshot(context, snapshot);
      const unmade = plan.tables.filter((_, i) => made[i] && found.tables[i].isNullObject);
      return { left: [...cellsLeft(snapshot, now), ...objectsLeft(plan, found)], unmade };
    });
  } catch (thrown) {
    return {
      left: [
        `the sheet could not be read back (${refusal(thrown)}): look at ${snapshot.map((p) => formatAddress(p.rect, p.sheet)).join(" and ")}`,
      ],
      unmade: [],
    };
  }
}

/** The objects a write makes, looked up by the names it gave them (null objects where they do not exist). */
function madeObjects(
  context: HostContext,
  plan: PlannedWrite,
): {
  tables: HostTable[];
  chart: HostChart | null;
  helper: HostNamedItem | null;
  mark: HostNamedItem;
  earlier: HostNamedItem[];
  earlierHelpers: (HostNamedItem | null)[];
  earlierCharts: (HostChart | null)[];
} {
  const book = context.workbook;
  const tables = plan.tables.map((t) => book.worksheets.getItem(t.sheet).tables.getItemOrNullObject(t.name));
  for (const table of tables) table.load("name");
  const chart = plan.chart ? book.worksheets.getItem(plan.chart.sheet).charts.getItemOrNullObject(plan.chart.name) : null;
  chart?.load("name");
  const helper = plan.chart ? book.names.getItemOrNullObject(plan.chart.helper.name) : null;
  helper?.load("name");
  const mark = book.names.getItemOrNullObject(plan.blockName);
  mark.load("name");
  const earlier = plan.replaces.map((b) => book.names.getItemOrNullObject(b.name));
  for (const name of earlier) name.load("name");
  const earlierHelpers = plan.replaces.map((b) => (b.helper ? book.names.getItemOrNullObject(b.helper.name) : null));
  for (const name of earlierHelpers) name?.load("name");
  const earlierCharts = plan.replaces.map((b) => (b.chart ? book.worksheets.getItem(b.sheet).charts.getItemOrNullObject(b.chart) : null));
  for (const made of earlierCharts) made?.load("name");
  return { tables, chart, helper, mark, earlier, earlierHelpers, earlierCharts };
}

function sameCell(a: unknown, b: unknown): boolean {
  return JSON.stringify(a ?? "") === JSON.stringify(b ?? "");
}

/** The parts of a region whose cells differ from before, in words. */
function cellsLeft(before: readonly Snapshot[], now: readonly Snapshot[]): string[] {
  return before.flatMap((part, p) => {
    const differ: string[] = [];
    part.formulas.forEach((row, r) =>
      row.forEach((formula, c) => {
        const after = now[p];
        const changed =
          !sameCell(formula, after.formulas[r]?.[c]) ||
          !sameCell(part.numberFormat[r]?.[c], after.numberFormat[r]?.[c]) ||
          !sameCell(part.fonts[r]?.[c], after.fonts[r]?.[c]);
        if (changed)
          differ.push(
            formatAddress({ top: part.rect.top + r, left: part.rect.left + c, bottom: part.rect.top + r, right: part.rect.left + c }),
          );
      }),
    );
    if (differ.length === 0) return [];
    const shown = differ.length > 6 ? `${differ.slice(0, 6).join(", ")} and ${differ.length - 6} more` : differ.join(", ");
    return [`${differ.length} cells of ${formatAddress(part.rect, part.sheet)} differ from before (${shown})`];
  });
}

function objectsLeft(plan: PlannedWrite, found: ReturnType<typeof madeObjects>): string[] {
  const left: string[] = [];
  plan.tables.forEach((t, i) => {
    if (!found.tables[i].isNullObject) left.push(`table ${t.name} over ${formatAddress(t.rect, t.sheet)}`);
  });
  if (plan.chart && found.chart && !found.chart.isNullObject) left.push(`the chart ${plan.chart.name}`);
  if (plan.chart && found.helper && !found.helper.isNullObject) left.push(`the defined name ${plan.chart.helper.name}`);
  if (!found.mark.isNullObject) left.push(`the defined name ${plan.blockName}`);
  plan.replaces.forEach((earlier, i) => {
    if (found.earlier[i].isNullObject)
      left.push(`no defined name ${earlier.name} any more for the earlier block at ${formatAddress(earlier.rect, earlier.sheet)}`);
    if (earlier.helper && found.earlierHelpers[i]?.isNullObject)
      left.push(`no defined name ${earlier.helper.name} any more for the earlier chart's helper cells`);
    // A deleted chart cannot be put back from what was read; writing that block again redraws it.
    if (earlier.chart && found.earlierCharts[i]?.isNullObject) left.push(`no chart ${earlier.chart} any more beside the earlier block`);
  });
  return left;
}

/** Queues the cells, formats and column widths of a new sheet's content. */
function queueSheetContent(sheet: HostWorksheet, content: SheetContent): void {
  const rows = content.formulas.length;
  const columns = content.formulas[0]?.length ?? 0;
  if (rows === 0 || columns === 0) return;
  const range = sheet.getRange(formatAddress({ top: 0, left: 0, bottom: rows - 1, right: columns - 1 }));
  // Formats first: a text format ("@") set before the entry keeps a version such as 16.0 as text.
  range.numberFormat = content.numberFormats.map((row) => [...row]);
  range.formulas = content.formulas.map((row) => [...row]);
  for (const r of content.boldRows) range.getRow(r).format.font.bold = true;
  for (const r of content.italicRows) range.getRow(r).format.font.italic = true;
  content.columnWidths.forEach((points, c) => {
    range.getColumn(c).format.columnWidth = points;
  });
}

/** Deletes a sheet a refused batch had added; what could not be removed, in words, or null. */
async function removeSheet(run: RunBatch, name: string): Promise<string | null> {
  try {
    await run(async (context) => {
      const sheet = context.workbook.worksheets.getItemOrNullObject(name);
      sheet.load("name");
      await context.sync();
      if (!sheet.isNullObject) sheet.delete();
      await context.sync();
    });
    return null;
  } catch (thrown) {
    return `The sheet ${name} it had begun could not be removed (${refusal(thrown)}); delete it by hand.`;
  }
}

/**
 * Wraps a `run` function into the pane's workbook operations.
 *
 * @example
 * const host = createHost((batch) => Excel.run(batch));
 * const cells = await host.read(await host.selection());
 */
export function createHost(run: RunBatch): Host {
  return {
    selection: () =>
      run(async (context) => {
        const range = context.workbook.getSelectedRange();
        range.load("address");
        await context.sync();
        return range.address;
      }),

    read: (address) => {
      const parsed = parseAddress(address);
      if (!parsed) return Promise.resolve(null);
      return run(async (context) => {
        const sheet =
          parsed.sheet === undefined ? context.workbook.worksheets.getActiveWorksheet() : context.workbook.worksheets.getItem(parsed.sheet);
        sheet.load("name");
        const range = sheet.getRange(formatAddress(parsed));
        range.load("address, values, formulas");
        await context.sync();
        const where = parseSheetAddress(range.address, sheet.name);
        return { ...where, values: range.values, formulas: range.formulas };
      });
    },

    usedRect: (sheetName) =>
      run(async (context) => {
        const used = context.workbook.worksheets.getItem(sheetName).getUsedRangeOrNullObject(true);
        used.load("address");
        await context.sync();
        return used.isNullObject ? null : parseSheetAddress(used.address, sheetName).rect;
      }),

    tables: (sheetName) =>
      run(async (context) => {
        const sheet = context.workbook.worksheets.getItem(sheetName);
        sheet.tables.load("items/name");
        await context.sync();
        // One more sync for all the tables together, not one per table.
        const queued = sheet.tables.items.map(queueTableLoad);
        await context.sync();
        return queued.map((loaded) => tableInfo(loaded, sheetName));
      }),

    blocks: () =>
      run(async (context) => {
        const names = context.workbook.names;
        names.load("items/name");
        await context.sync();
        const byName = new Map(names.items.map((n) => [n.name.toLowerCase(), n]));
        const ours = names.items.filter((n) => n.name.toLowerCase().startsWith(BLOCK_NAME_PREFIX.toLowerCase()));
        const found = ours.map((n) => {
          const range = n.getRangeOrNullObject();
          range.load("address");
          const helperName = byName.get(companionNames(n.name).helper.toLowerCase());
          const helper = helperName?.getRangeOrNullObject() ?? null;
          helper?.load("address");
          return { name: n.name, range, helperName: helperName?.name, helper };
        });
        await context.sync();
        const marks = found.flatMap(({ name, range, helperName, helper }): BlockMark[] => {
          if (range.isNullObject) return [];
          const where = parseSheetAddress(range.address, "");
          const cells =
            helper && !helper.isNullObject && helperName ? { helper: { name: helperName, ...parseSheetAddress(helper.address, "") } } : {};
          return [{ name, ...where, ...cells }];
        });
        // One more sync for the charts of all the blocks, each looked up on its block's sheet by the name it was given.
        const charts = marks.map((mark) => {
          const chart = context.workbook.worksheets.getItem(mark.sheet).charts.getItemOrNullObject(companionNames(mark.name).chart);
          chart.load("name");
          return chart;
        });
        await context.sync();
        return marks.map((mark, i) => (charts[i].isNullObject ? mark : { ...mark, chart: charts[i].name }));
      }),

    takenNames: (sheetNames) =>
      run(async (context) => {
        const { names, tables } = context.workbook;
        names.load("items/name");
        tables.load("items/name");
        const sheets = sheetNames.map((name) => context.workbook.worksheets.getItem(name));
        for (const sheet of sheets) sheet.charts.load("items/name");
        await context.sync();
        return [
          ...names.items.map((n) => n.name),
          ...tables.items.map((t) => t.name),
          ...sheets.flatMap((sheet) => sheet.charts.items.map((c) => c.name)),
        ];
      }),

    addSheet: async (chooseName, content) => {
      const attempt = await run(async (context) => {
        const sheets = context.workbook.worksheets;
        sheets.load("items/name");
        await context.sync();
        const name = chooseName(sheets.items.map((s) => s.name));
        const sheet = sheets.add(name);
        queueSheetContent(sheet, content);
        sheet.activate();
        try {
          await context.sync();
          return { name, reason: null };
        } catch (thrown) {
          return { name, reason: refusal(thrown) };
        }
      });
      if (attempt.reason === null) return { kind: "written", sheet: attempt.name };
      return { kind: "refused", reason: attempt.reason, left: await removeSheet(run, attempt.name) };
    },

    applyWrite: async (plan, region, proceed) => {
      const attempt = await run(async (context): Promise<Attempt> => {
        const snapshot = await readSnapshot(context, region);
        const current = snapshot.map(({ sheet, rect, values, formulas }) => ({ sheet, rect, values, formulas }));
        if (!proceed(current)) return { kind: "changed", current };
        const queued = queueWrite(context, plan);
        try {
          await context.sync();
        } catch (thrown) {
          return { kind: "failed", snapshot, reason: refusal(thrown) };
        }
        const renamed = columnMismatch(plan, queued.tables);
        if (renamed) return { kind: "failed", snapshot, reason: renamed };
        try {
          queued.block.getColumn(0).format.autofitColumns();
          queued.block.select();
          await context.sync();
        } catch {
          // The block is whole by now; a column width or the selection is no part of what was written.
        }
        return { kind: "written" };
      });
      if (attempt.kind !== "failed") return attempt;
      return { kind: "undone", reason: attempt.reason, ...(await undoWrite(run, plan, attempt.snapshot)) };
    },
  };
}
