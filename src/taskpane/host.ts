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
 * Worksheet.getUsedRangeOrNullObject, TableCollection.add, ChartCollection.add.
 *
 * Cost: each operation is one `run` with one or two `sync` round trips.
 */
import { formatAddress, parseAddress, rectSize, type CellRect } from "./a1";

export interface HostFont {
  bold: boolean;
  italic: boolean;
  color: string;
}

export interface HostRange {
  readonly address: string;
  values: unknown[][];
  formulas: unknown[][];
  numberFormat: unknown[][];
  readonly isNullObject: boolean;
  readonly format: { readonly font: HostFont; autofitColumns(): void };
  load(propertyNames: string): unknown;
  getRow(row: number): HostRange;
  getColumn(column: number): HostRange;
  select(): void;
}

export interface HostTableColumn {
  readonly name: string;
}

export interface HostTable {
  readonly name: string;
  readonly columns: { readonly items: HostTableColumn[]; load(propertyNames: string): unknown };
  getRange(): HostRange;
  load(propertyNames: string): unknown;
}

export interface HostChart {
  readonly title: { text: string };
  setPosition(startCell: string, endCell?: string): void;
}

export interface HostWorksheet {
  readonly name: string;
  readonly tables: { readonly items: HostTable[]; add(address: string, hasHeaders: boolean): HostTable; load(propertyNames: string): unknown };
  readonly charts: { add(type: "ColumnClustered", sourceData: HostRange, seriesBy?: "Auto" | "Columns" | "Rows"): HostChart };
  getRange(address?: string): HostRange;
  getUsedRangeOrNullObject(valuesOnly?: boolean): HostRange;
  load(propertyNames: string): unknown;
}

export interface HostContext {
  readonly workbook: {
    getSelectedRange(): HostRange;
    readonly worksheets: { getItem(name: string): HostWorksheet; getActiveWorksheet(): HostWorksheet };
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

/** A native chart of the data, linked to its range. */
export interface ChartWrite {
  readonly sheet: string;
  /** A1 address (no sheet) of the source range, header row included so the series are named. */
  readonly source: string;
  readonly title: string;
  /** Top-left and bottom-right cells the chart covers. */
  readonly from: string;
  readonly to: string;
}

/** Colour of the caution lines: #595959 on white is 7.0:1 (WCAG 2.1 contrast ratio, AAA for normal text). */
export const CAUTION_COLOR = "#595959";

export interface Host {
  /** The selected range's address, with its sheet. */
  selection(): Promise<string>;
  /** Reads an address (with or without sheet; without: the active sheet). Null when the address cannot be read. */
  read(address: string): Promise<CellsRead | null>;
  /** The smallest rectangle holding every non-empty cell of a sheet, or null for an empty sheet. */
  usedRect(sheet: string): Promise<CellRect | null>;
  /** The tables of a sheet. */
  tables(sheet: string): Promise<TableInfo[]>;
  /** Turns a range with a header row into a table. */
  createTable(target: SheetRect): Promise<TableInfo>;
  /** Writes the block: formulas in one assignment, then formats. */
  writeBlock(block: BlockWrite): Promise<void>;
  addChart(chart: ChartWrite): Promise<void>;
}

function parseSheetAddress(address: string, fallbackSheet: string): SheetRect {
  const parsed = parseAddress(address);
  if (!parsed) throw new TypeError(`the workbook returned an address the pane cannot read: ${address}`);
  return { sheet: parsed.sheet ?? fallbackSheet, rect: { top: parsed.top, left: parsed.left, bottom: parsed.bottom, right: parsed.right } };
}

async function loadTable(context: HostContext, table: HostTable, sheet: string): Promise<TableInfo> {
  table.load("name");
  table.columns.load("items/name");
  const range = table.getRange();
  range.load("address");
  await context.sync();
  return { name: table.name, sheet, rect: parseSheetAddress(range.address, sheet).rect, columns: table.columns.items.map((c) => c.name) };
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
        const found: TableInfo[] = [];
        for (const table of sheet.tables.items) found.push(await loadTable(context, table, sheetName));
        return found;
      }),

    createTable: (target) =>
      run(async (context) => {
        const table = context.workbook.worksheets.getItem(target.sheet).tables.add(formatAddress(target.rect, target.sheet), true);
        return loadTable(context, table, target.sheet);
      }),

    writeBlock: (block) =>
      run(async (context) => {
        const { rows, columns } = rectSize(block.rect);
        if (block.formulas.length !== rows || block.formulas.some((r) => r.length !== columns)) {
          throw new RangeError("the block's formulas do not match its target rectangle");
        }
        const range = context.workbook.worksheets.getItem(block.sheet).getRange(formatAddress(block.rect));
        range.formulas = block.formulas;
        await context.sync();
        range.numberFormat = block.numberFormats;
        range.getColumn(0).format.font.bold = true;
        for (const r of block.titleRows) range.getRow(r).format.font.bold = true;
        for (const r of block.cautionRows) {
          const line = range.getRow(r).format.font;
          line.italic = true;
          line.color = CAUTION_COLOR;
        }
        range.getColumn(0).format.autofitColumns();
        range.select();
        await context.sync();
      }),

    addChart: (chart) =>
      run(async (context) => {
        const sheet = context.workbook.worksheets.getItem(chart.sheet);
        const created = sheet.charts.add("ColumnClustered", sheet.getRange(chart.source), "Columns");
        created.title.text = chart.title;
        created.setPosition(chart.from, chart.to);
        await context.sync();
      }),
  };
}
