/**
 * The demo page's workbook: sheets of cells (constants or formulas), tables,
 * recorded charts, the selection, and a full recalculation after every
 * change. It stands in for the spreadsheet where Excel is not installed.
 *
 * Method: formulas are parsed once when entered and evaluated on every
 * change, each cell at most once per pass (memoised, with a guard against
 * circular references). A formula whose answer has several cells spills it
 * right and down into empty cells, as dynamic arrays do, or shows #SPILL! when
 * something is in the way; because a spill can change what other formulas
 * read, passes repeat until the spilled areas stop changing (at most four).
 * Whole-column references are read down to the last used row only: the
 * custom functions then see fewer trailing blank cells than Excel would pass,
 * which changes nothing but blank counts.
 * Typing into the row just below a table makes the table one row longer, as
 * the spreadsheet's automatic table expansion does. A write holding anything
 * Excel would refuse (limits.ts: lengths, formula syntax, the sheet's edge)
 * is refused whole, before any cell changes.
 *
 * Cost: a recalculation is O(formula cells × cells each reads).
 */
import { LAST_ROW, rectContains, rectsOverlap, rectSize, type CellRect } from "../taskpane/a1";
import { evaluate, type CustomFunction, type EvaluationContext } from "./formula/evaluate";
import { parseFormula, type Expression } from "./formula/parse";
import { FormulaSyntaxError } from "./formula/tokenize";
import { areaRefusal, lengthRefusal, RefusedEntry, sheetNameRefusal } from "./limits";
import { errorValue, isError, isMatrix, isReference, type ReferenceValue, type Scalar, type Value } from "./formula/values";

export interface CellFormat {
  numberFormat: string;
  bold: boolean;
  italic: boolean;
  color: string | null;
}

interface Cell {
  /** Constant value, or null for a formula cell. */
  constant: number | string | boolean | null;
  /** Formula text with its "=", when the cell holds a formula. */
  formula: string | null;
  parsed: Expression | null;
  format: CellFormat;
}

export interface TableModel {
  readonly name: string;
  readonly sheet: string;
  /** Header row included. */
  rect: CellRect;
}

/** Cells a chart series reads. Set `table` when they are a table's column: the series then follows the table's rows as it grows. */
export interface SeriesLink {
  readonly sheet: string;
  readonly rect: CellRect;
  readonly table?: { readonly name: string; readonly left: number; readonly right: number; readonly header: boolean };
}

/** A chart series as recorded: what it reads and how it is drawn. */
export interface SeriesModel {
  name: string;
  chartType: string;
  values: SeriesLink | null;
  /** Null: the values are drawn against 1, 2, 3, ... */
  xValues: SeriesLink | null;
  markerStyle: string;
  markerSize: number;
  markerColour: string | null;
  lineColour: string | null;
  lineStyle: string;
  lineWeight: number;
}

/** An axis's ends (null: Excel chooses) and title. */
export interface AxisModel {
  minimum: number | null;
  maximum: number | null;
  title: string;
}

export interface ChartModel {
  readonly type: string;
  readonly sheet: string;
  readonly series: SeriesModel[];
  readonly axes: { readonly category: AxisModel; readonly value: AxisModel };
  legend: string;
  title: string;
  from: string;
  to: string;
}

/** A defined name and the cells it refers to (Microsoft, "Define and use names in formulas"). */
export interface DefinedName {
  readonly name: string;
  readonly sheet: string;
  readonly rect: CellRect;
}

export interface Selection {
  readonly sheet: string;
  readonly rect: CellRect;
}

interface SheetModel {
  readonly name: string;
  readonly cells: Map<string, Cell>;
  readonly columnWidths: Map<number, number>;
}

const DEFAULT_FORMAT: CellFormat = { numberFormat: "General", bold: false, italic: false, color: null };
const FORMAT_PROPERTIES = Object.keys(DEFAULT_FORMAT) as (keyof CellFormat)[];
const MAX_PASSES = 4;
/** Formulas depending on a change beyond which a recalculation simply takes every formula. */
const MAX_TRACKED_DEPENDENTS = 500;

function key(row: number, column: number): string {
  return `${row},${column}`;
}

function fromKey(k: string): { row: number; column: number } {
  const comma = k.indexOf(",");
  return { row: Number(k.slice(0, comma)), column: Number(k.slice(comma + 1)) };
}

/** Ranges read in one calculation pass, and how many circular references it met so far. */
interface PassReads {
  readonly ranges: Map<string, Scalar[][]>;
  circular: number;
}

/** Cells of a sheet that changed, or whose answers may have: what a recalculation starts from. */
interface Region {
  readonly sheet: string;
  readonly rect: CellRect;
}

function single(row: number, column: number): CellRect {
  return { top: row, left: column, bottom: row, right: column };
}

/** A typed or API-written entry: formula, text (leading apostrophe forces text), number, logical or blank. */
function readInput(input: unknown): { constant: number | string | boolean | null; formula: string | null } {
  if (input === null || input === undefined || input === "") return { constant: null, formula: null };
  if (typeof input === "number" || typeof input === "boolean") return { constant: input, formula: null };
  const text = String(input);
  if (text.startsWith("=") && text.length > 1) return { constant: null, formula: text };
  if (text.startsWith("'")) return { constant: text.slice(1), formula: null };
  const trimmed = text.trim();
  if (trimmed !== "" && Number.isFinite(Number(trimmed))) return { constant: Number(trimmed), formula: null };
  if (/^(true|false)$/i.test(trimmed)) return { constant: trimmed.toUpperCase() === "TRUE", formula: null };
  return { constant: text, formula: null };
}

/** An entry as the cell will hold it, or a RefusedEntry when Excel would not take it. */
function checkedEntry(input: unknown): { constant: number | string | boolean | null; formula: string | null; parsed: Expression | null } {
  const { constant, formula } = readInput(input);
  const text = formula ?? (typeof constant === "string" ? constant : "");
  const tooLong = lengthRefusal(text, formula !== null);
  if (tooLong) throw new RefusedEntry(tooLong);
  if (formula === null) return { constant, formula, parsed: null };
  try {
    return { constant, formula, parsed: parseFormula(formula.slice(1)) };
  } catch (thrown) {
    if (thrown instanceof FormulaSyntaxError)
      throw new RefusedEntry(
        `Excel would not take the formula ${formula.length > 60 ? `${formula.slice(0, 60)}…` : formula}: ${thrown.message}`,
      );
    throw thrown;
  }
}

/**
 * Column names as Excel gives a new table's header row: its shown values as
 * text, a blank as ColumnN (N the place in the table), and a repeated name
 * (compared without regard to case) made unique by a number: Thickness,
 * Thickness2. Microsoft, "Overview of Excel tables" (default ColumnN names
 * and unique headers); the numbering of repeats from memory.
 *
 * @example
 * tableHeaders(["Thickness", "thickness", 2024, null]); // ["Thickness", "thickness2", "2024", "Column4"]
 */
export function tableHeaders(shown: readonly Scalar[]): string[] {
  const taken = new Set<string>();
  return shown.map((value, i) => {
    const text =
      value === null ? "" : isError(value) ? value.code : typeof value === "boolean" ? (value ? "TRUE" : "FALSE") : String(value);
    const base = text === "" ? `Column${i + 1}` : text;
    let header = base;
    for (let n = 2; taken.has(header.toLowerCase()); n++) header = `${base}${n}`;
    taken.add(header.toLowerCase());
    return header;
  });
}

/** The table name the spreadsheet would pick next: Table1, Table2, ... */
function nextTableName(tables: readonly TableModel[]): string {
  let n = 1;
  while (tables.some((t) => t.name.toLowerCase() === `table${n}`)) n++;
  return `Table${n}`;
}

/**
 * A workbook of named sheets; see the module comment for how it calculates.
 *
 * @example
 * const workbook = new Workbook(["Paint line"]);
 * workbook.writeEntries("Paint line", 0, 0, [[49], [51], ["=COUNT(A1:A2)"]]);
 * workbook.value("Paint line", 2, 0); // 2
 */
/** The last row of `entries` holding an entry in columns from..to (relative to the write), or -1. */
function lastFilledRow(entries: readonly (readonly unknown[])[], from: number, to: number): number {
  let last = -1;
  entries.forEach((row, r) => {
    for (let c = Math.max(0, from); c <= Math.min(to, row.length - 1); c++) {
      const e = row[c];
      if (e !== "" && e !== null && e !== undefined) last = r;
    }
  });
  return last;
}

export class Workbook {
  private readonly sheets: SheetModel[];
  readonly tables: TableModel[] = [];
  readonly charts: ChartModel[] = [];
  /** Defined names by lower-cased name (names ignore case, as Excel's do). */
  readonly names = new Map<string, DefinedName>();
  private selected: Selection;
  private readonly computed = new Map<string, Map<string, Value>>();
  private spills = new Map<string, Map<string, CellRect>>();
  private readonly listeners: (() => void)[] = [];
  private functions = new Map<string, CustomFunction>();
  /** Number of recalculations so far; tests watch it to see that a batch recalculated once. */
  recalculations = 0;
  private held = 0;
  private blanksAsZeros = false;
  private pending = { recalculate: false, notify: false };
  /** Sheets by lower-cased name: every cell read looks its sheet up. */
  private readonly byName = new Map<string, SheetModel>();
  /** Keys of the formula cells of each sheet, so a recalculation never walks the constants. */
  private readonly formulaKeys = new Map<string, Set<string>>();
  /** Per formula cell ("sheet!row,column"), the ranges it read when last calculated. */
  private readonly reads = new Map<string, Region[]>();
  /** Cells written since the last recalculation; a full recalculation when `full`. */
  private changed: Region[] = [];
  private full = true;
  /** Used rectangles by sheet (values only, and with formats), until the next change. */
  private readonly usedCache = new Map<string, CellRect | null>();

  constructor(sheetNames: readonly string[]) {
    if (sheetNames.length === 0) throw new RangeError("a workbook needs a sheet");
    this.sheets = sheetNames.map((name) => ({ name, cells: new Map(), columnWidths: new Map() }));
    for (const sheet of this.sheets) {
      this.byName.set(sheet.name.toLowerCase(), sheet);
      this.formulaKeys.set(sheet.name, new Set());
    }
    this.selected = { sheet: sheetNames[0], rect: { top: 0, left: 0, bottom: 0, right: 0 } };
  }

  get sheetNames(): string[] {
    return this.sheets.map((s) => s.name);
  }

  get selection(): Selection {
    return this.selected;
  }

  /** Registers the add-in's functions (captured from the bundle) and recalculates. */
  setFunctions(functions: ReadonlyMap<string, CustomFunction>): void {
    this.functions = new Map(functions);
    this.recalculate();
  }

  /**
   * Hands custom functions the blank cells of a range as 0 (as some Excel
   * builds do: OfficeDev/office-js issues 5262 and 1951) or as "" (Excel on
   * the web), and recalculates.
   */
  setBlanksAsZeros(on: boolean): void {
    this.blanksAsZeros = on;
    this.recalculate();
  }

  onChange(listener: () => void): void {
    this.listeners.push(listener);
  }

  hasSheet(name: string): boolean {
    return this.byName.has(name.toLowerCase());
  }

  private sheet(name: string): SheetModel {
    const found = this.byName.get(name.toLowerCase());
    if (!found) throw new RangeError(`There is no sheet named ${name}.`);
    return found;
  }

  sheetName(name: string): string {
    return this.sheet(name).name;
  }

  /**
   * Adds an empty sheet after the others; a name Excel would refuse (limits.ts, sheetNameRefusal) is a
   * RefusedEntry and changes nothing.
   */
  addSheet(name: string): void {
    const refused = sheetNameRefusal(name, this.sheetNames);
    if (refused) throw new RefusedEntry(refused);
    const sheet: SheetModel = { name, cells: new Map(), columnWidths: new Map() };
    this.sheets.push(sheet);
    this.byName.set(name.toLowerCase(), sheet);
    this.formulaKeys.set(name, new Set());
    this.notify();
  }

  /**
   * Removes a sheet with its tables, charts and the defined names on it; formulas that read it show #REF!
   * (Microsoft, "Excel.Worksheet class", delete). A workbook keeps at least one sheet, so the last one is refused.
   */
  deleteSheet(name: string): void {
    const sheet = this.sheet(name);
    if (this.sheets.length === 1) throw new RefusedEntry("A workbook must keep at least one sheet.");
    this.sheets.splice(this.sheets.indexOf(sheet), 1);
    this.byName.delete(sheet.name.toLowerCase());
    this.formulaKeys.delete(sheet.name);
    this.computed.delete(sheet.name);
    this.spills.delete(sheet.name);
    this.usedCache.clear();
    for (const list of [this.tables, this.charts]) {
      for (let i = list.length - 1; i >= 0; i--) if (list[i].sheet === sheet.name) list.splice(i, 1);
    }
    for (const [k, defined] of this.names) if (defined.sheet === sheet.name) this.names.delete(k);
    if (this.selected.sheet === sheet.name) this.selected = { sheet: this.sheets[0].name, rect: { top: 0, left: 0, bottom: 0, right: 0 } };
    this.recalculate();
    this.notify();
  }

  select(selection: Selection): void {
    this.selected = { sheet: this.sheet(selection.sheet).name, rect: selection.rect };
    this.notify();
  }

  /**
   * Writes entries into a rectangle (one batch: one recalculation). Values
   * follow the typing rules: "=..." is a formula, "'..." is text, numbers and
   * TRUE/FALSE are read as such, "" clears the cell but keeps its format, and
   * null leaves the cell as it is (Microsoft, "Blank and null values in Excel
   * add-ins": null in a 2-D array leaves that cell unchanged).
   */
  writeEntries(sheetName: string, top: number, left: number, entries: readonly (readonly unknown[])[], typed = false): void {
    const sheet = this.sheet(sheetName);
    const width = Math.max(0, ...entries.map((row) => row.length));
    const outside =
      entries.length === 0 || width === 0 ? null : areaRefusal({ top, left, bottom: top + entries.length - 1, right: left + width - 1 });
    if (outside) throw new RefusedEntry(outside);
    // Every entry is checked before any is written: a refused write changes nothing.
    const checked = entries.map((row) => row.map((entry) => (entry === null ? null : checkedEntry(entry))));
    const formulas = this.formulaKeys.get(sheet.name) as Set<string>;
    checked.forEach((row, r) =>
      row.forEach((entry, c) => {
        if (entry === null) return;
        const { constant, formula, parsed } = entry;
        const k = key(top + r, left + c);
        const existing = sheet.cells.get(k);
        if (constant === null && formula === null && existing === undefined) return;
        const format = existing?.format ?? { ...DEFAULT_FORMAT };
        sheet.cells.set(k, { constant, formula, parsed, format });
        if (parsed === null) formulas.delete(k);
        else formulas.add(k);
      }),
    );
    this.usedCache.clear();
    const rect = { top, left, bottom: top + entries.length - 1, right: left + width - 1 };
    const grew = typed && this.growTables(sheet.name, top, left, entries);
    // A table's header names its columns: a write there, or a table growing, changes what structured references mean.
    const header = this.tables.some((t) => t.sheet === sheet.name && rectsOverlap({ ...t.rect, bottom: t.rect.top }, rect));
    if (grew || header) this.full = true;
    if (entries.length > 0 && width > 0) this.changed.push({ sheet: sheet.name, rect });
    this.calculate();
  }

  /**
   * Typing or pasting right below a table lengthens it down to the last row
   * that holds an entry (Microsoft, "Overview of Excel tables": a table
   * expands to include rows typed or pasted directly below it).
   */
  private growTables(sheetName: string, top: number, left: number, entries: readonly (readonly unknown[])[]): boolean {
    let grew = false;
    for (const table of this.tables) {
      if (table.sheet !== sheetName || top !== table.rect.bottom + 1) continue;
      // Only entries under the table's own columns count: a row typed across A:C grows a table on column B.
      const last = lastFilledRow(entries, table.rect.left - left, table.rect.right - left);
      if (last < 0) continue;
      table.rect = { ...table.rect, bottom: top + last };
      grew = true;
    }
    return grew;
  }

  setFormat(sheetName: string, rect: CellRect, patch: Partial<CellFormat>): void {
    const sheet = this.sheet(sheetName);
    for (let r = rect.top; r <= rect.bottom; r++) {
      for (let c = rect.left; c <= rect.right; c++) {
        const k = key(r, c);
        const cell = sheet.cells.get(k) ?? { constant: null, formula: null, parsed: null, format: { ...DEFAULT_FORMAT } };
        cell.format = { ...cell.format, ...patch };
        sheet.cells.set(k, cell);
      }
    }
    this.usedCache.clear();
    this.notify();
  }

  /** Widens columns to fit what they show (about 7 px per character, as a plain default font). */
  autofitColumns(sheetName: string, rect: CellRect, shown: (row: number, column: number) => string): void {
    const sheet = this.sheet(sheetName);
    const used = this.usedRect(sheetName);
    for (let c = rect.left; c <= rect.right; c++) {
      let longest = 0;
      if (used) for (let r = used.top; r <= used.bottom; r++) longest = Math.max(longest, shown(r, c).length);
      sheet.columnWidths.set(c, Math.min(300, Math.max(64, longest * 7 + 12)));
    }
    this.notify();
  }

  setColumnWidth(sheetName: string, column: number, pixels: number): void {
    this.sheet(sheetName).columnWidths.set(column, pixels);
    this.notify();
  }

  columnWidth(sheetName: string, column: number): number | undefined {
    return this.sheet(sheetName).columnWidths.get(column);
  }

  format(sheetName: string, row: number, column: number): CellFormat {
    return this.sheet(sheetName).cells.get(key(row, column))?.format ?? DEFAULT_FORMAT;
  }

  /** What a cell holds as typed: the formula, the constant, or "" for blank. */
  entry(sheetName: string, row: number, column: number): number | string | boolean {
    const cell = this.sheet(sheetName).cells.get(key(row, column));
    if (!cell) return "";
    return cell.formula ?? cell.constant ?? "";
  }

  /** The calculated value of a cell, spilled values included; null when blank. */
  value(sheetName: string, row: number, column: number): Scalar {
    const sheet = this.sheet(sheetName);
    const k = key(row, column);
    const cell = sheet.cells.get(k);
    // A cell that only carries a format is empty: a spill passes over it and shows there, as in Excel.
    if (cell && cell.formula === null && cell.constant !== null) return cell.constant;
    const own = cell ? this.computed.get(sheet.name)?.get(k) : undefined;
    if (own !== undefined) return this.cellValue(own, sheet.name, row, column);
    return this.spilledValue(sheet.name, row, column);
  }

  private spilledValue(sheetName: string, row: number, column: number): Scalar {
    for (const [anchor, rect] of this.spills.get(sheetName) ?? []) {
      if (!rectContains(rect, { top: row, left: column, bottom: row, right: column })) continue;
      const value = this.computed.get(sheetName)?.get(anchor);
      if (value !== undefined && isMatrix(value)) return value.rows[row - rect.top]?.[column - rect.left] ?? null;
    }
    return null;
  }

  /** What a formula cell shows: the top-left of a matrix, #SPILL! when its spill is blocked. */
  private cellValue(value: Value, sheetName: string, row: number, column: number): Scalar {
    if (isMatrix(value)) {
      const spill = this.spills.get(sheetName)?.get(key(row, column));
      const single = value.rows.length === 1 && value.rows[0].length === 1;
      if (!single && spill === undefined) return errorValue("#SPILL!", "The result needs more cells, and something is in the way.");
      return value.rows[0][0];
    }
    if (isReference(value)) return null;
    return value;
  }

  /**
   * The smallest rectangle around every non-blank cell, or null; with
   * `withFormats`, cells that only carry a format count too, as Excel's used
   * range does unless asked for values only (Microsoft, "Excel.Worksheet
   * class", getUsedRange(valuesOnly)).
   */
  usedRect(sheetName: string, withFormats = false): CellRect | null {
    const name = this.sheet(sheetName).name;
    const cacheKey = `${withFormats ? "f" : "v"}${name}`;
    const cached = this.usedCache.get(cacheKey);
    if (cached !== undefined) return cached;
    const found = this.findUsedRect(name, withFormats);
    this.usedCache.set(cacheKey, found);
    return found;
  }

  private findUsedRect(name: string, withFormats: boolean): CellRect | null {
    let top = Infinity;
    let left = Infinity;
    let bottom = -Infinity;
    let right = -Infinity;
    const grow = (row: number, column: number): void => {
      top = Math.min(top, row);
      left = Math.min(left, column);
      bottom = Math.max(bottom, row);
      right = Math.max(right, column);
    };
    for (const [k, cell] of this.sheet(name).cells) {
      const formatted = withFormats && FORMAT_PROPERTIES.some((p) => cell.format[p] !== DEFAULT_FORMAT[p]);
      if (cell.constant === null && cell.formula === null && !formatted) continue;
      const { row, column } = fromKey(k);
      grow(row, column);
    }
    for (const rectOfSpill of this.spills.get(name)?.values() ?? []) {
      grow(rectOfSpill.top, rectOfSpill.left);
      grow(rectOfSpill.bottom, rectOfSpill.right);
    }
    return top === Infinity ? null : { top, left, bottom, right };
  }

  /** Values of a rectangle, row by row (null for blank). */
  values(sheetName: string, rect: CellRect): Scalar[][] {
    const rows: Scalar[][] = [];
    for (let r = rect.top; r <= rect.bottom; r++) {
      const row: Scalar[] = [];
      for (let c = rect.left; c <= rect.right; c++) row.push(this.value(sheetName, r, c));
      rows.push(row);
    }
    return rows;
  }

  /** Makes a table of `rect` (header row first), named `tableName` or the next free TableN. */
  addTable(sheetName: string, rect: CellRect, tableName = nextTableName(this.tables)): TableModel {
    const name = this.sheet(sheetName).name;
    if (rect.top === rect.bottom) throw new RangeError("A table needs a header row and at least one row of data.");
    if (this.tables.some((t) => t.sheet === name && rectsOverlap(t.rect, rect))) throw new RangeError("Tables cannot overlap.");
    const table: TableModel = { name: tableName, sheet: name, rect };
    const headers = tableHeaders(this.values(name, { ...rect, bottom: rect.top })[0]);
    // The header row becomes text, as Excel makes it: a leading apostrophe keeps "2024" or "=1+1" a text.
    this.batch(() => this.writeEntries(name, rect.top, rect.left, [headers.map((h) => `'${h}`)]));
    this.tables.push(table);
    this.recalculate();
    return table;
  }

  tableColumns(table: TableModel): string[] {
    const names: string[] = [];
    for (let c = table.rect.left; c <= table.rect.right; c++) names.push(String(this.value(table.sheet, table.rect.top, c) ?? ""));
    return names;
  }

  addChart(chart: ChartModel): ChartModel {
    this.charts.push(chart);
    this.notify();
    return chart;
  }

  /**
   * What a series reading these cells records: linked to a table when they are one of its columns' data rows
   * (header row included or not), so that it follows the table as it grows, as Excel's charts of tables do.
   */
  seriesLink(sheet: string, rect: CellRect): SeriesLink {
    const table = this.tables.find(
      (t) =>
        t.sheet === sheet &&
        rectContains(t.rect, rect) &&
        (rect.top === t.rect.top || rect.top === t.rect.top + 1) &&
        rect.bottom === t.rect.bottom &&
        rect.bottom > t.rect.top,
    );
    return table
      ? { sheet, rect, table: { name: table.name, left: rect.left, right: rect.right, header: rect.top === table.rect.top } }
      : { sheet, rect };
  }

  /** The cells a series reads now: a table-linked series covers the table's present rows. */
  linkedRect(link: SeriesLink): CellRect {
    const { table: linked } = link;
    const table = linked ? this.tables.find((t) => t.name === linked.name) : undefined;
    if (!linked || !table) return link.rect;
    return { top: linked.header ? table.rect.top : table.rect.top + 1, bottom: table.rect.bottom, left: linked.left, right: linked.right };
  }

  /**
   * Runs several changes as one batch: the workbook recalculates and tells
   * its listeners once, at the end, as the spreadsheet does for one sync.
   */
  batch<T>(changes: () => T): T {
    this.held++;
    try {
      return changes();
    } finally {
      this.held--;
      if (this.held === 0) {
        const { recalculate, notify } = this.pending;
        this.pending = { recalculate: false, notify: false };
        if (recalculate) this.calculate();
        else if (notify) this.notify();
      }
    }
  }

  private notify(): void {
    if (this.held > 0) {
      this.pending.notify = true;
      return;
    }
    for (const listener of this.listeners) listener();
  }

  /** The evaluator's view of the workbook for one formula cell; every range it reads is added to `read`. */
  private context(
    sheetName: string,
    evaluateCell: (sheet: string, row: number, column: number) => Scalar,
    read: Region[],
    seen: PassReads,
  ): EvaluationContext {
    return {
      sheet: sheetName,
      blanksAsZeros: this.blanksAsZeros,
      hasSheet: (name: string) => this.hasSheet(name),
      read: (reference: ReferenceValue) => {
        // The whole range counts as read, down to row 1,048,576 for A:A, so a value typed below the used rows reaches it.
        const sheet = this.sheetName(reference.sheet);
        read.push({ sheet, rect: reference.rect });
        // Within one pass a range reads the same every time: the block's formulas all read the data once between them.
        const seenKey = `${sheet}!${reference.rect.top},${reference.rect.left},${reference.rect.bottom},${reference.rect.right}`;
        const before = seen.ranges.get(seenKey);
        if (before) return before;
        const circular = seen.circular;
        const used = this.usedRect(reference.sheet);
        const bottom =
          reference.rect.bottom === LAST_ROW || rectSize(reference.rect).rows > 10_000
            ? Math.max(reference.rect.top, Math.min(reference.rect.bottom, used?.bottom ?? reference.rect.top))
            : reference.rect.bottom;
        const rows: Scalar[][] = [];
        for (let r = reference.rect.top; r <= bottom; r++) {
          const row: Scalar[] = [];
          for (let c = reference.rect.left; c <= reference.rect.right; c++) row.push(evaluateCell(sheet, r, c));
          rows.push(row);
        }
        // A range that met a formula still being calculated (a circular reference) is read afresh next time.
        if (seen.circular === circular) seen.ranges.set(seenKey, rows);
        return rows;
      },
      tableColumn: (tableName: string, column: string) => {
        const table = this.tables.find((t) => t.name.toLowerCase() === tableName.toLowerCase());
        if (!table) return errorValue("#REF!", `There is no table named ${tableName}.`);
        const index = this.tableColumns(table).findIndex((c) => c.toLowerCase() === column.toLowerCase());
        if (index < 0) return errorValue("#REF!", `Table ${table.name} has no column ${column}.`);
        const c = table.rect.left + index;
        return { kind: "reference", sheet: table.sheet, rect: { top: table.rect.top + 1, bottom: table.rect.bottom, left: c, right: c } };
      },
      customFunction: (id: string) => this.functions.get(id.toUpperCase()),
      definedName: (name: string) => {
        const found = this.names.get(name.toLowerCase());
        return found ? { kind: "reference", sheet: found.sheet, rect: found.rect } : undefined;
      },
    };
  }

  private formulaCells(): { sheet: string; k: string; cell: Cell }[] {
    const found: { sheet: string; k: string; cell: Cell }[] = [];
    for (const sheet of this.sheets) {
      for (const k of this.formulaKeys.get(sheet.name) ?? []) {
        const cell = sheet.cells.get(k);
        if (cell?.parsed) found.push({ sheet: sheet.name, k, cell });
      }
    }
    return found;
  }

  /**
   * Formula cells whose answers may differ after `changed`: those inside it,
   * those that read any of it, and, over and over, those that read a cell (or
   * the spilled area) of a formula already found — the cells that depend on
   * the change, directly or through other formulas; null when they pass
   * MAX_TRACKED_DEPENDENTS (the search is quadratic in them).
   */
  private dependents(changed: readonly Region[]): Set<string> | null {
    const regions = [...changed];
    const dirty = new Set<string>();
    const formulas = this.formulaCells();
    const touches = (sheet: string, rect: CellRect): boolean => regions.some((g) => g.sheet === sheet && rectsOverlap(g.rect, rect));
    // An anchor written over (a formula replaced, say) takes its spilled values with it.
    for (const [sheet, areas] of this.spills) {
      for (const [k, rect] of areas) {
        const { row, column } = fromKey(k);
        if (changed.some((g) => g.sheet === sheet && rectContains(g.rect, single(row, column)))) regions.push({ sheet, rect });
      }
    }
    for (let grown = true; grown;) {
      grown = false;
      for (const { sheet, k } of formulas) {
        const id = `${sheet}!${k}`;
        if (dirty.has(id)) continue;
        const { row, column } = fromKey(k);
        if (!touches(sheet, single(row, column)) && !(this.reads.get(id) ?? []).some((r) => touches(r.sheet, r.rect))) continue;
        dirty.add(id);
        grown = true;
        // Past a few hundred, comparing regions costs more than calculating everything: the caller does that.
        if (dirty.size > MAX_TRACKED_DEPENDENTS) return null;
        regions.push({ sheet, rect: single(row, column) });
        const spill = this.spills.get(sheet)?.get(k);
        if (spill) regions.push({ sheet, rect: spill });
      }
    }
    return dirty;
  }

  /**
   * Calculates every formula cell not yet calculated (memoised, each at most
   * once), recording what each reads.
   */
  private calculatePass(): void {
    const inProgress = new Set<string>();
    const seen: PassReads = { ranges: new Map(), circular: 0 };
    const results = (sheet: string): Map<string, Value> => {
      let map = this.computed.get(sheet);
      if (!map) this.computed.set(sheet, (map = new Map()));
      return map;
    };
    const calculate = (sheet: string, k: string, cell: Cell): Value => {
      const done = results(sheet).get(k);
      if (done !== undefined) return done;
      const id = `${sheet}!${k}`;
      if (inProgress.has(id)) {
        seen.circular++;
        return errorValue("#REF!", "This formula depends on itself (a circular reference).");
      }
      inProgress.add(id);
      const read: Region[] = [];
      const context = this.context(sheet, readCell, read, seen);
      let value = evaluate(cell.parsed as Expression, context);
      if (isReference(value)) {
        const cells = context.read(value);
        value =
          cells.length === 1 && cells[0].length === 1
            ? (cells[0][0] ?? 0)
            : { kind: "matrix", rows: cells.map((r) => r.map((x) => x ?? 0)) };
      }
      inProgress.delete(id);
      this.reads.set(id, read);
      results(sheet).set(k, value);
      return value;
    };
    const readCell = (sheetName: string, row: number, column: number): Scalar => {
      const sheet = this.sheet(sheetName);
      const k = key(row, column);
      const cell = sheet.cells.get(k);
      if (cell && cell.parsed !== null) return this.cellValue(calculate(sheet.name, k, cell), sheet.name, row, column);
      if (cell && cell.constant !== null) return cell.constant;
      for (const [anchor, rect] of this.spills.get(sheet.name) ?? []) {
        if (!rectContains(rect, single(row, column))) continue;
        const anchorCell = sheet.cells.get(anchor);
        // The anchor may have been written over since the spill was found: then it spills nothing.
        if (!anchorCell || anchorCell.parsed === null) continue;
        const value = calculate(sheet.name, anchor, anchorCell);
        if (isMatrix(value)) return value.rows[row - rect.top]?.[column - rect.left] ?? null;
      }
      return null;
    };
    for (const { sheet, k, cell } of this.formulaCells()) calculate(sheet, k, cell);
  }

  /** Where each matrix answer may spill this time, given what the cells hold. */
  private spillAreas(): Map<string, Map<string, CellRect>> {
    const areas = new Map<string, Map<string, CellRect>>();
    for (const { sheet, k } of this.formulaCells()) {
      const value = this.computed.get(sheet)?.get(k);
      if (value === undefined || !isMatrix(value)) continue;
      const { row, column } = fromKey(k);
      const rect = { top: row, left: column, bottom: row + value.rows.length - 1, right: column + (value.rows[0]?.length ?? 1) - 1 };
      if (rect.top === rect.bottom && rect.left === rect.right) continue;
      const cells = this.sheet(sheet).cells;
      let blocked = false;
      for (let r = rect.top; r <= rect.bottom && !blocked; r++) {
        for (let c = rect.left; c <= rect.right && !blocked; c++) {
          if (r === row && c === column) continue;
          const other = cells.get(key(r, c));
          if (other && (other.constant !== null || other.formula !== null)) blocked = true;
        }
      }
      const taken = [...(areas.get(sheet)?.values() ?? [])].some((a) => rectsOverlap(a, rect));
      // Excel answers #SPILL! also when the spill would reach into a table or past the sheet's edge
      // (Microsoft, "How to correct a #SPILL! error": spill range in table; extends beyond the worksheet's edge).
      const inTable = this.tables.some((t) => t.sheet === sheet && rectsOverlap(t.rect, rect));
      if (blocked || taken || inTable || areaRefusal(rect) !== null) continue;
      if (!areas.has(sheet)) areas.set(sheet, new Map());
      areas.get(sheet)?.set(k, rect);
    }
    return areas;
  }

  /** Recalculates every formula, lets matrices spill, then tells the listeners. */
  recalculate(): void {
    this.full = true;
    this.calculate();
  }

  /**
   * Brings the answers up to date: after cell writes only the formulas that
   * depend on the written cells (see dependents); after anything else (new
   * functions, tables, blank handling) every formula. Spilled areas are then
   * found again; if they moved, the passes repeat over every formula until they
   * stop moving (at most four), since a spill changes what other cells read.
   */
  private calculate(): void {
    if (this.held > 0) {
      this.pending.recalculate = true;
      return;
    }
    const full = this.full;
    const changed = this.changed;
    this.full = false;
    this.changed = [];
    if (full) {
      this.computed.clear();
      this.reads.clear();
    } else {
      const dirty = this.dependents(changed);
      if (dirty === null) {
        this.computed.clear();
        this.reads.clear();
      }
      for (const id of dirty ?? []) {
        const bang = id.lastIndexOf("!");
        this.computed.get(id.slice(0, bang))?.delete(id.slice(bang + 1));
        this.reads.delete(id);
      }
      // A formula overwritten by a constant leaves no answer behind.
      for (const [sheet, answers] of this.computed) {
        const formulas = this.formulaKeys.get(sheet);
        for (const k of answers.keys()) {
          if (!formulas?.has(k)) {
            answers.delete(k);
            this.reads.delete(`${sheet}!${k}`);
          }
        }
      }
    }
    for (let pass = 0; pass < MAX_PASSES; pass++) {
      this.calculatePass();
      const areas = this.spillAreas();
      const same =
        JSON.stringify([...areas].map(([s, m]) => [s, [...m]])) === JSON.stringify([...this.spills].map(([s, m]) => [s, [...m]]));
      this.spills = areas;
      this.usedCache.clear();
      if (same) break;
      this.computed.clear();
      this.reads.clear();
    }
    this.recalculations++;
    this.notify();
  }
}
