/**
 * The part of the Excel JavaScript API that the pane's host module uses,
 * implemented over the demo workbook, so that the very same pane code runs on
 * the demo page.
 *
 * Method: the batching model of the real API (Microsoft, "Excel JavaScript
 * object model in Office Add-ins": proxy objects, load, sync). Setting a
 * property or calling a method only queues it; `load` queues a read; `sync`
 * carries out the queue in order inside one workbook batch (one
 * recalculation) and only then makes loaded properties readable. Reading a
 * property that was not loaded and synced throws, as the real API does, so a
 * forgotten `load` in the pane fails here too. Errors (an unknown sheet,
 * overlapping tables, an entry or a range Excel would refuse) surface at
 * `sync`, with the API's error codes; Excel.run refuses a batch that does not
 * return a promise.
 *
 * Cost: O(cells touched) per sync.
 */
import { formatAddress, parseAddress, rectSize, type CellRect } from "../taskpane/a1";
import type {
  CellFont,
  ClearWhat,
  HostChart,
  HostChartAxis,
  HostChartSeries,
  HostContext,
  HostFont,
  HostNamedItem,
  HostRange,
  HostTable,
  HostTableColumn,
  HostWorksheet,
  RunBatch,
} from "../taskpane/host";
import { isError, type Scalar } from "./formula/values";
import { formatCell } from "../taskpane/numberFormat";
import type { AxisModel, ChartModel, DefinedName, SeriesLink, SeriesModel, TableModel, Workbook } from "./workbook";
import { areaRefusal, RefusedEntry, sheetNameRefusal } from "./limits";
import {
  axisEndRefusal,
  chartTypeRefusal,
  colourRefusal,
  legendPositionRefusal,
  lineStyleRefusal,
  lineWeightRefusal,
  markerSizeRefusal,
  markerStyleRefusal,
  MAX_SERIES,
  seriesNameRefusal,
} from "./chartRules";

/**
 * An error as the real API reports it: a code and a message.
 *
 * @example
 * new FakeApiError("ItemNotFound", "There is no worksheet named Summary.").code; // "ItemNotFound"
 */
export class FakeApiError extends Error {
  /** As OfficeExtension.Error carries it (node_modules/@microsoft/office-js, Utility.createRuntimeError). */
  readonly debugInfo: { readonly code: string; readonly message: string };
  constructor(
    readonly code:
      | "ItemNotFound"
      | "ItemAlreadyExists"
      | "InvalidArgument"
      | "PropertyNotLoaded"
      | "InvalidOperation"
      | "RunMustReturnPromise"
      | "InvalidRequestContext"
      | "RequestPayloadSizeLimitExceeded"
      | "ResponsePayloadSizeLimitExceeded",
    message: string,
  ) {
    super(message);
    this.name = "RichApi.Error";
    this.debugInfo = { code, message };
  }
}

/**
 * Bytes a request or a response of one sync may carry: Excel on the web
 * refuses more than 5 MB either way (Microsoft, "Resource limits and
 * performance optimization for Office Add-ins", Excel add-ins; the codes are
 * office-js's RequestPayloadSizeLimitExceeded and
 * ResponsePayloadSizeLimitExceeded).
 */
const PAYLOAD_LIMIT = 5 * 1024 * 1024;

/** Size in bytes of a value as the API would carry it (JSON, UTF-8). */
function payloadBytes(value: unknown): number {
  return new TextEncoder().encode(JSON.stringify(value) ?? "").length;
}

class Queue {
  private readonly operations: (() => void)[] = [];
  private requestBytes = 0;
  private responseBytes = 0;
  constructor(readonly workbook: Workbook) {}
  add(operation: () => void, bytes = 0): void {
    this.operations.push(operation);
    this.requestBytes += bytes;
  }
  /** Counts what a load sends back in this sync, and refuses the sync once that passes the limit. */
  answer(bytes: number): void {
    this.responseBytes += bytes;
    if (this.responseBytes > PAYLOAD_LIMIT) {
      throw new FakeApiError(
        "ResponsePayloadSizeLimitExceeded",
        "The response of this sync is larger than the 5 MB Excel on the web carries; load fewer cells at a time.",
      );
    }
  }
  flush(): void {
    const pending = this.operations.splice(0);
    const request = this.requestBytes;
    this.requestBytes = 0;
    this.responseBytes = 0;
    // A request over the limit is refused before it is sent: nothing of it happens.
    if (request > PAYLOAD_LIMIT) {
      throw new FakeApiError(
        "RequestPayloadSizeLimitExceeded",
        "The request of this sync is larger than the 5 MB Excel on the web accepts; write fewer cells at a time.",
      );
    }
    this.workbook.batch(() => {
      for (const operation of pending) {
        try {
          operation();
        } catch (thrown) {
          // What Excel will not hold (limits.ts) fails the sync with InvalidArgument (Microsoft, "Error handling
          // with the application-specific JavaScript APIs"); what ran before it stays done, as in Excel.
          if (thrown instanceof RefusedEntry) throw new FakeApiError("InvalidArgument", thrown.message);
          throw thrown;
        }
      }
    });
  }
}

/** Values a proxy has loaded; readable only after the sync that carried the load out. */
class Loaded {
  private readonly values = new Map<string, unknown>();
  /** The property names of a load call ("address, values"). */
  static names(list: string): string[] {
    return list
      .split(",")
      .map((n) => n.trim())
      .filter((n) => n !== "");
  }
  set(name: string, value: unknown): void {
    this.values.set(name, value);
  }
  get<T>(name: string, owner: string): T {
    if (!this.values.has(name)) {
      throw new FakeApiError("PropertyNotLoaded", `The property '${name}' of ${owner} is not available. Load it and call sync first.`);
    }
    return this.values.get(name) as T;
  }
}

function sheetOrThrow(workbook: Workbook, name: string): string {
  if (!workbook.hasSheet(name)) throw new FakeApiError("ItemNotFound", `There is no worksheet named ${name}.`);
  return workbook.sheetName(name);
}

/** Range.values shows an error as its code text, a blank as "". */
function apiValue(value: Scalar): unknown {
  if (value === null) return "";
  return isError(value) ? value.code : value;
}

function checkShape(rect: CellRect, matrix: unknown[][]): void {
  const { rows, columns } = rectSize(rect);
  if (!Array.isArray(matrix))
    throw new FakeApiError("InvalidArgument", "A range's values, formulas or formats are set with a two-dimensional array.");
  if (matrix.length !== rows || matrix.some((r) => !Array.isArray(r) || r.length !== columns)) {
    throw new FakeApiError("InvalidArgument", `The array does not have the size of the range (${rows} × ${columns}).`);
  }
}

type Where = () => { sheet: string; rect: CellRect } | null;

class FakeFont implements HostFont {
  constructor(
    private readonly queue: Queue,
    private readonly where: Where,
  ) {}
  private set(patch: Partial<{ bold: boolean; italic: boolean; color: string | null }>): void {
    this.queue.add(() => {
      const w = this.where();
      if (w) this.queue.workbook.setFormat(w.sheet, w.rect, patch);
    });
  }
  get bold(): boolean {
    throw new FakeApiError("PropertyNotLoaded", "The demo sheet does not read fonts back.");
  }
  set bold(value: boolean) {
    this.set({ bold: value });
  }
  get italic(): boolean {
    throw new FakeApiError("PropertyNotLoaded", "The demo sheet does not read fonts back.");
  }
  set italic(value: boolean) {
    this.set({ italic: value });
  }
  get color(): string {
    throw new FakeApiError("PropertyNotLoaded", "The demo sheet does not read fonts back.");
  }
  set color(value: string) {
    this.set({ color: value });
  }
}

/**
 * The range itself when it belongs to this request context; a proxy from
 * another Excel.run is refused, as office-js refuses it
 * (CommonUtility.validateContext: InvalidRequestContext).
 */
function ownRange(queue: Queue, range: HostRange): FakeRange {
  if (!(range instanceof FakeRange) || !range.belongsTo(queue)) {
    throw new FakeApiError("InvalidRequestContext", "Cannot use the object across different request contexts.");
  }
  return range;
}

class FakeRange implements HostRange {
  private readonly loaded = new Loaded();
  readonly format: { readonly font: HostFont; columnWidth: number; autofitColumns(): void };

  private readonly where: Where;

  /** True when this proxy was made by the request context that owns `queue`. */
  belongsTo(queue: Queue): boolean {
    return this.queue === queue;
  }

  constructor(
    private readonly queue: Queue,
    where: Where,
  ) {
    // A range reaching past row 1,048,576 or column XFD (getRow, getColumn, an offset) is refused when
    // used (Microsoft, "Excel specifications and limits": the sheet's size).
    this.where = () => {
      const w = where();
      const outside = w === null ? null : areaRefusal(w.rect);
      if (outside) throw new FakeApiError("InvalidArgument", outside);
      return w;
    };
    const font = new FakeFont(queue, this.where);
    const whereNow = this.where;
    this.format = {
      font,
      get columnWidth(): number {
        throw new FakeApiError("PropertyNotLoaded", "The demo sheet does not read column widths back.");
      },
      /** Microsoft, "Excel.RangeFormat class", columnWidth (ExcelApi 1.2): every column of the range, in points. */
      set columnWidth(points: number) {
        queue.add(() => {
          const w = whereNow();
          if (!w) return;
          if (!(points >= 0)) throw new FakeApiError("InvalidArgument", "A column width is a number of points, 0 or more.");
          // A point is 4/3 of a pixel at the usual 96 dots an inch (common practice).
          for (let c = w.rect.left; c <= w.rect.right; c++) queue.workbook.setColumnWidth(w.sheet, c, Math.round((points * 4) / 3));
        });
      },
      autofitColumns: () =>
        this.queue.add(() => {
          const w = this.where();
          if (!w) return;
          const workbook = this.queue.workbook;
          workbook.autofitColumns(w.sheet, w.rect, (r, c) =>
            formatCell(apiValue(workbook.value(w.sheet, r, c)) as string | number | boolean, workbook.format(w.sheet, r, c).numberFormat),
          );
        }),
    };
  }

  load(propertyNames: string): FakeRange {
    const names = Loaded.names(propertyNames);
    this.queue.add(() => {
      const w = this.where();
      this.loaded.set("isNullObject", w === null);
      const workbook = this.queue.workbook;
      for (const name of names) {
        if (w === null) {
          this.loaded.set(name, null);
          continue;
        }
        const { sheet, rect } = w;
        const each = (read: (row: number, column: number) => unknown): unknown[][] => {
          // Every cell costs at least two bytes ("1,"): refuse before building an answer that cannot be carried.
          const { rows: height, columns: width } = rectSize(rect);
          this.queue.answer(height * width * 2);
          const rows: unknown[][] = [];
          for (let r = rect.top; r <= rect.bottom; r++) {
            const row: unknown[] = [];
            for (let c = rect.left; c <= rect.right; c++) row.push(read(r, c));
            rows.push(row);
          }
          this.queue.answer(payloadBytes(rows) - height * width * 2);
          return rows;
        };
        switch (name) {
          case "address":
            this.loaded.set(name, formatAddress(rect, sheet));
            break;
          case "values":
            this.loaded.set(
              name,
              each((r, c) => apiValue(workbook.value(sheet, r, c))),
            );
            break;
          case "formulas":
            this.loaded.set(
              name,
              each((r, c) => workbook.entry(sheet, r, c)),
            );
            break;
          case "numberFormat":
            this.loaded.set(
              name,
              each((r, c) => workbook.format(sheet, r, c).numberFormat),
            );
            break;
          default:
            throw new FakeApiError("InvalidArgument", `The demo sheet does not offer Range.${name}.`);
        }
      }
    });
    return this;
  }

  get address(): string {
    return this.loaded.get("address", "Range");
  }
  get isNullObject(): boolean {
    return this.loaded.get("isNullObject", "Range");
  }
  get values(): unknown[][] {
    return this.loaded.get("values", "Range");
  }
  set values(matrix: unknown[][]) {
    this.write(matrix);
  }
  get formulas(): unknown[][] {
    return this.loaded.get("formulas", "Range");
  }
  set formulas(matrix: unknown[][]) {
    this.write(matrix);
  }
  get numberFormat(): unknown[][] {
    return this.loaded.get("numberFormat", "Range");
  }
  set numberFormat(matrix: unknown[][]) {
    this.queue.add(() => {
      const w = this.where();
      if (!w) return;
      checkShape(w.rect, matrix);
      // null leaves a cell's format as it is, "" resets it to General (Microsoft, "Blank and null values in Excel add-ins").
      matrix.forEach((row, r) =>
        row.forEach((format, c) => {
          if (format === null) return;
          const cell = { top: w.rect.top + r, left: w.rect.left + c, bottom: w.rect.top + r, right: w.rect.left + c };
          this.queue.workbook.setFormat(w.sheet, cell, { numberFormat: format === "" ? "General" : String(format) });
        }),
      );
    }, payloadBytes(matrix));
  }

  private write(matrix: unknown[][]): void {
    // A whole property set to null (or anything not an array) is not valid input (same page).
    const copy: unknown[][] = Array.isArray(matrix) ? matrix.map((row) => (Array.isArray(row) ? [...row] : row)) : matrix;
    this.queue.add(() => {
      const w = this.where();
      if (!w) throw new FakeApiError("InvalidOperation", "This range does not exist.");
      checkShape(w.rect, copy);
      this.queue.workbook.writeEntries(w.sheet, w.rect.top, w.rect.left, copy);
    }, payloadBytes(copy));
  }

  private part(pick: (rect: CellRect) => CellRect): FakeRange {
    return new FakeRange(this.queue, () => {
      const w = this.where();
      return w ? { sheet: w.sheet, rect: pick(w.rect) } : null;
    });
  }

  getRow(row: number): FakeRange {
    return this.part((rect) => ({ ...rect, top: rect.top + row, bottom: rect.top + row }));
  }

  getColumn(column: number): FakeRange {
    return this.part((rect) => ({ ...rect, left: rect.left + column, right: rect.left + column }));
  }

  select(): void {
    this.queue.add(() => {
      const w = this.where();
      if (w) this.queue.workbook.select(w);
    });
  }

  /** Microsoft, "Excel.Range class", clear(applyTo): "All" (the default) clears contents and formats. */
  clear(applyTo: ClearWhat = "All"): void {
    this.queue.add(() => {
      const w = this.where();
      if (!w) throw new FakeApiError("InvalidOperation", "This range does not exist.");
      const { rows, columns } = rectSize(w.rect);
      if (applyTo !== "Formats")
        this.queue.workbook.writeEntries(
          w.sheet,
          w.rect.top,
          w.rect.left,
          Array.from({ length: rows }, () => Array<string>(columns).fill("")),
        );
      if (applyTo !== "Contents")
        this.queue.workbook.setFormat(w.sheet, w.rect, { numberFormat: "General", bold: false, italic: false, color: null });
    });
  }

  /**
   * Per-cell font properties (Microsoft, "Excel.Range class", getCellProperties, ExcelApi 1.9); the
   * answer is readable after the sync, as a ClientResult's value is. An automatic font colour reads as
   * "#000000" here (an assumption about Excel's answer, not checked in Excel).
   */
  getCellProperties(): { readonly value: CellFont[][] } {
    const result = new Loaded();
    this.queue.add(() => {
      const w = this.where();
      if (!w) throw new FakeApiError("InvalidOperation", "This range does not exist.");
      const rows: CellFont[][] = [];
      for (let r = w.rect.top; r <= w.rect.bottom; r++) {
        const row: CellFont[] = [];
        for (let c = w.rect.left; c <= w.rect.right; c++) {
          const f = this.queue.workbook.format(w.sheet, r, c);
          row.push({ format: { font: { bold: f.bold, italic: f.italic, color: f.color ?? "#000000" } } });
        }
        rows.push(row);
      }
      result.set("value", rows);
    });
    return {
      get value(): CellFont[][] {
        return result.get("value", "ClientResult");
      },
    };
  }

  /** Sets per-cell font properties; the array must have the range's shape (Microsoft, "Excel.Range class", setCellProperties). */
  setCellProperties(properties: CellFont[][]): void {
    const copy = properties.map((row) => [...row]);
    this.queue.add(() => {
      const w = this.where();
      if (!w) throw new FakeApiError("InvalidOperation", "This range does not exist.");
      checkShape(w.rect, copy);
      copy.forEach((row, r) =>
        row.forEach((cell, c) => {
          const { bold, italic, color } = cell.format?.font ?? {};
          const patch = {
            ...(bold === undefined ? {} : { bold }),
            ...(italic === undefined ? {} : { italic }),
            ...(color === undefined ? {} : { color }),
          };
          const at = { top: w.rect.top + r, left: w.rect.left + c, bottom: w.rect.top + r, right: w.rect.left + c };
          this.queue.workbook.setFormat(w.sheet, at, patch);
        }),
      );
    });
  }
}

/** Defined names of a demo workbook (Microsoft, "Excel.NamedItemCollection class"): lower-cased name to the name and its cells. */
function namesOf(workbook: Workbook): Map<string, DefinedName> {
  return workbook.names;
}

/**
 * Refuses a name Excel would refuse for a table or a defined name (Microsoft, "Rename an Excel table"
 * and "Names in formulas"): it starts with a letter, underscore or backslash, holds letters, digits,
 * points and underscores, is at most 255 characters, does not read as a cell reference, and is not
 * already the name of a table or a defined name (they share one namespace, compared without case).
 */
function checkNewName(workbook: Workbook, name: string): void {
  // Microsoft, "Define and use names in formulas": a letter, underscore or backslash first, no spaces, at most
  // 255 characters, and never a cell reference in either style (Z100, R1C1, R2, C3, and R or C alone).
  const cellLike = /^[A-Za-z]{1,3}[0-9]+$/.test(name) || /^[Rr][0-9]*([Cc][0-9]*)?$/.test(name) || /^[Cc][0-9]*$/.test(name);
  const shaped = /^[\p{L}_\\][\p{L}\p{N}._]*$/u.test(name) && name.length <= 255 && !cellLike;
  if (!shaped) throw new FakeApiError("InvalidArgument", `${name} is not a valid name for a table or a defined name.`);
  const key = name.toLowerCase();
  if (workbook.tables.some((t) => t.name.toLowerCase() === key) || namesOf(workbook).has(key)) {
    throw new FakeApiError("InvalidArgument", `The name ${name} is already in use in this workbook.`);
  }
}

class FakeTable implements HostTable {
  private readonly loaded = new Loaded();
  private readonly columnsLoaded = new Loaded();
  readonly columns: { readonly items: HostTableColumn[]; load(propertyNames: string): unknown };

  /** `model` answers null when there is no such table (a *OrNullObject proxy). */
  constructor(
    private readonly queue: Queue,
    private readonly model: () => TableModel | null,
  ) {
    const columnsLoaded = this.columnsLoaded;
    const existing = (): TableModel => {
      const found = model();
      if (found === null) throw new FakeApiError("ItemNotFound", "The table does not exist.");
      return found;
    };
    this.columns = {
      get items(): HostTableColumn[] {
        return columnsLoaded.get("items", "TableColumnCollection");
      },
      load: () => {
        queue.add(() =>
          columnsLoaded.set(
            "items",
            queue.workbook.tableColumns(existing()).map((name) => ({ name })),
          ),
        );
        return this.columns;
      },
    };
  }

  private existing(): TableModel {
    const found = this.model();
    if (found === null) throw new FakeApiError("ItemNotFound", "The table does not exist.");
    return found;
  }

  /** Marks the name as loaded already (items of a loaded collection come with what was asked for). */
  preload(name: string): void {
    this.loaded.set("name", name);
  }

  get name(): string {
    return this.loaded.get("name", "Table");
  }

  /** Renames the table; the new name follows Excel's rules for table names (see checkNewName). */
  set name(value: string) {
    this.queue.add(() => {
      const table = this.existing();
      if (table.name.toLowerCase() !== value.toLowerCase()) checkNewName(this.queue.workbook, value);
      // The demo's model keeps the name read-only for everyone else; renaming is the API's job alone.
      (table as { name: string }).name = value;
    });
  }

  get isNullObject(): boolean {
    return this.loaded.get("isNullObject", "Table");
  }

  /** A table offers only its name (and whether it exists) here, whatever is asked for. */
  load(): FakeTable {
    this.queue.add(() => {
      const table = this.model();
      this.loaded.set("isNullObject", table === null);
      this.loaded.set("name", table?.name ?? null);
    });
    return this;
  }

  getRange(): FakeRange {
    return new FakeRange(this.queue, () => {
      const table = this.existing();
      return { sheet: table.sheet, rect: table.rect };
    });
  }

  /** Microsoft, "Excel.Table class", convertToRange(): the table goes, its cells and their contents stay. */
  convertToRange(): FakeRange {
    let was: { sheet: string; rect: CellRect } | null = null;
    this.queue.add(() => {
      const table = this.existing();
      was = { sheet: table.sheet, rect: table.rect };
      const tables = this.queue.workbook.tables;
      tables.splice(tables.indexOf(table), 1);
      this.queue.workbook.recalculate();
    });
    return new FakeRange(this.queue, () => was);
  }
}

/**
 * Chart names of each demo workbook's charts: "Chart 1", "Chart 2", ... until renamed through Chart.name
 * (Microsoft, "Excel.Chart class": name, "the name of a chart object"; the default wording is common practice).
 */
const chartNames = new WeakMap<ChartModel, string>();

function chartName(workbook: Workbook, chart: ChartModel): string {
  let name = chartNames.get(chart);
  if (name === undefined) {
    let n = workbook.charts.indexOf(chart) + 1;
    while (workbook.charts.some((c) => c !== chart && chartNames.get(c) === `Chart ${n}`)) n++;
    chartNames.set(chart, (name = `Chart ${n}`));
  }
  return name;
}

/** Queues a property set that Excel checks when the batch runs: a refusal fails the sync with InvalidArgument. */
function checkedSet(queue: Queue, refusal: string | null, apply: () => void): void {
  queue.add(() => {
    if (refusal) throw new FakeApiError("InvalidArgument", refusal);
    apply();
  });
}

/** A property the demo writes but does not read back. */
function unread(what: string): never {
  throw new FakeApiError("PropertyNotLoaded", `The demo sheet does not read ${what} back.`);
}

/**
 * The cells a series is set to: a range of this request context, one column or one row (the demo records no
 * other shape), linked to a table when they are one of its columns.
 */
function seriesCells(queue: Queue, sourceData: HostRange, set: (link: SeriesLink) => void): void {
  const range = ownRange(queue, sourceData);
  range.load("address");
  queue.add(() => {
    const parsed = parseAddress(range.address);
    if (!parsed || parsed.sheet === undefined) throw new FakeApiError("InvalidArgument", "A series reads a range on a sheet.");
    const { sheet, ...rect } = parsed;
    if (rect.left !== rect.right && rect.top !== rect.bottom)
      throw new FakeApiError("InvalidArgument", "The demo sheet records series of one column or one row only.");
    set(queue.workbook.seriesLink(queue.workbook.sheetName(sheet), rect));
  });
}

/** A series as a new one starts: drawn as Excel's defaults would draw it (automatic markers and colours). */
function newSeries(name: string, values: SeriesLink | null, chartType: string): SeriesModel {
  return {
    name,
    chartType,
    values,
    xValues: null,
    markerStyle: "Automatic",
    markerSize: 5,
    markerColour: null,
    lineColour: null,
    lineStyle: "Automatic",
    lineWeight: 1.5,
  };
}

/** Microsoft, "Excel.ChartSeries class" (ExcelApi 1.1 and 1.7): the members the pane sets. */
class FakeChartSeries implements HostChartSeries {
  readonly format: HostChartSeries["format"];
  constructor(
    private readonly queue: Queue,
    private readonly model: () => SeriesModel,
  ) {
    const set = (refusal: string | null, apply: (series: SeriesModel) => void): void => checkedSet(queue, refusal, () => apply(model()));
    this.format = {
      line: {
        get color(): string {
          return unread("line colours");
        },
        set color(value: string) {
          set(colourRefusal(value), (s) => (s.lineColour = value));
        },
        get lineStyle(): string {
          return unread("line styles");
        },
        set lineStyle(value: string) {
          set(lineStyleRefusal(value), (s) => (s.lineStyle = value));
        },
        get weight(): number {
          return unread("line weights");
        },
        set weight(value: number) {
          set(lineWeightRefusal(value), (s) => (s.lineWeight = value));
        },
      },
    };
  }
  private set(refusal: string | null, apply: (series: SeriesModel) => void): void {
    checkedSet(this.queue, refusal, () => apply(this.model()));
  }
  get name(): string {
    return unread("series names");
  }
  set name(value: string) {
    this.set(seriesNameRefusal(value), (s) => (s.name = value));
  }
  get chartType(): string {
    return unread("series types");
  }
  set chartType(value: string) {
    this.set(chartTypeRefusal(value), (s) => (s.chartType = value));
  }
  get markerStyle(): string {
    return unread("marker styles");
  }
  set markerStyle(value: string) {
    this.set(markerStyleRefusal(value), (s) => (s.markerStyle = value));
  }
  get markerSize(): number {
    return unread("marker sizes");
  }
  set markerSize(value: number) {
    this.set(markerSizeRefusal(value), (s) => (s.markerSize = value));
  }
  get markerBackgroundColor(): string {
    return unread("marker colours");
  }
  set markerBackgroundColor(value: string) {
    this.set(colourRefusal(value), (s) => (s.markerColour = value));
  }
  get markerForegroundColor(): string {
    return unread("marker colours");
  }
  /** The demo draws a marker in one colour: its fill. The outline is checked as Excel checks it, and not drawn. */
  set markerForegroundColor(value: string) {
    this.set(colourRefusal(value), () => undefined);
  }
  /** Microsoft, "Excel.ChartSeries class", setValues (ExcelApi 1.7): for a scatter chart, the y values. */
  setValues(sourceData: HostRange): void {
    seriesCells(this.queue, sourceData, (link) => (this.model().values = link));
  }
  /** Microsoft, "Excel.ChartSeries class", setXAxisValues (ExcelApi 1.7). */
  setXAxisValues(sourceData: HostRange): void {
    seriesCells(this.queue, sourceData, (link) => (this.model().xValues = link));
  }
}

/** Microsoft, "Excel.ChartAxis class": minimum, maximum (a number or "" for automatic) and the title's text. */
class FakeChartAxis implements HostChartAxis {
  readonly title: { text: string };
  constructor(
    private readonly queue: Queue,
    private readonly model: () => AxisModel,
  ) {
    this.title = {
      get text(): string {
        return unread("axis titles");
      },
      set text(value: string) {
        queue.add(() => (model().title = value));
      },
    };
  }
  get minimum(): number | "" {
    return unread("axis ends");
  }
  set minimum(value: number | "") {
    checkedSet(this.queue, axisEndRefusal(value), () => (this.model().minimum = value === "" ? null : value));
  }
  get maximum(): number | "" {
    return unread("axis ends");
  }
  set maximum(value: number | "") {
    checkedSet(this.queue, axisEndRefusal(value), () => (this.model().maximum = value === "" ? null : value));
  }
}

class FakeChart implements HostChart {
  private readonly loaded = new Loaded();
  readonly title: { text: string };
  readonly series: HostChart["series"];
  readonly axes: HostChart["axes"];
  readonly legend: { position: string };
  /** `model` answers null when there is no such chart (a *OrNullObject proxy). */
  constructor(
    private readonly queue: Queue,
    private readonly model: () => ChartModel | null,
  ) {
    const existing = (): ChartModel => this.existing();
    this.title = {
      get text(): string {
        return unread("chart titles");
      },
      set text(value: string) {
        queue.add(() => (existing().title = value));
      },
    };
    this.series = {
      // Microsoft, "Excel.ChartSeriesCollection class", add (ExcelApi 1.7): a new series shows once its values are set.
      add: (name?: string) => {
        let made: SeriesModel | null = null;
        checkedSet(queue, name === undefined ? null : seriesNameRefusal(name), () => {
          const chart = existing();
          if (chart.series.length >= MAX_SERIES) throw new FakeApiError("InvalidArgument", "A chart holds at most 255 series.");
          made = newSeries(name ?? `Series${chart.series.length + 1}`, null, chart.type);
          chart.series.push(made);
        });
        return new FakeChartSeries(queue, () => {
          if (made === null) throw new FakeApiError("ItemNotFound", "The series was not made.");
          return made;
        });
      },
      // getItemAt (ExcelApi 1.1): the series at a zero-based position.
      getItemAt: (index: number) =>
        new FakeChartSeries(queue, () => {
          const found = existing().series[index];
          if (!found) throw new FakeApiError("ItemNotFound", `The chart has no series at position ${index}.`);
          return found;
        }),
    };
    this.axes = {
      categoryAxis: new FakeChartAxis(queue, () => existing().axes.category),
      valueAxis: new FakeChartAxis(queue, () => existing().axes.value),
    };
    this.legend = {
      get position(): string {
        return unread("legend positions");
      },
      set position(value: string) {
        checkedSet(queue, legendPositionRefusal(value), () => (existing().legend = value));
      },
    };
  }
  private existing(): ChartModel {
    const found = this.model();
    if (found === null) throw new FakeApiError("ItemNotFound", "The chart does not exist.");
    return found;
  }
  preload(name: string): void {
    this.loaded.set("name", name);
  }
  get name(): string {
    return this.loaded.get("name", "Chart");
  }
  set name(value: string) {
    this.queue.add(() => chartNames.set(this.existing(), value));
  }
  get isNullObject(): boolean {
    return this.loaded.get("isNullObject", "Chart");
  }
  /** A chart offers only its name (and whether it exists) here, whatever is asked for. */
  load(): FakeChart {
    this.queue.add(() => {
      const chart = this.model();
      this.loaded.set("isNullObject", chart === null);
      this.loaded.set("name", chart === null ? null : chartName(this.queue.workbook, chart));
    });
    return this;
  }
  /** Microsoft, "Excel.Chart class", setPosition: the cells where the chart starts and ends; each must be an address. */
  setPosition(startCell: string, endCell?: string): void {
    this.queue.add(() => {
      const chart = this.existing();
      for (const cell of [startCell, endCell ?? startCell]) {
        const parsed = parseAddress(cell);
        if (!parsed || areaRefusal(parsed)) throw new FakeApiError("InvalidArgument", `${cell} is not a cell of the sheet.`);
      }
      chart.from = startCell;
      chart.to = endCell ?? startCell;
    });
  }
  /** Microsoft, "Excel.Chart class", delete(): the chart object goes; its source cells stay. */
  delete(): void {
    this.queue.add(() => {
      const chart = this.existing();
      const charts = this.queue.workbook.charts;
      charts.splice(charts.indexOf(chart), 1);
      this.queue.workbook.recalculate();
    });
  }
}

class FakeNamedItem implements HostNamedItem {
  private readonly loaded = new Loaded();
  constructor(
    private readonly queue: Queue,
    private readonly key: string,
  ) {}
  preload(name: string): void {
    this.loaded.set("name", name);
  }
  get name(): string {
    return this.loaded.get("name", "NamedItem");
  }
  get isNullObject(): boolean {
    return this.loaded.get("isNullObject", "NamedItem");
  }
  load(): FakeNamedItem {
    this.queue.add(() => {
      const found = namesOf(this.queue.workbook).get(this.key);
      this.loaded.set("isNullObject", found === undefined);
      this.loaded.set("name", found?.name ?? null);
    });
    return this;
  }
  /** The cells the name refers to (Microsoft, "Excel.NamedItem class", getRangeOrNullObject, ExcelApi 1.4). */
  getRangeOrNullObject(): FakeRange {
    return new FakeRange(this.queue, () => {
      const found = namesOf(this.queue.workbook).get(this.key);
      return found ? { sheet: found.sheet, rect: found.rect } : null;
    });
  }
  /** Microsoft, "Excel.NamedItem class", delete(): the name goes; the cells it named stay. */
  delete(): void {
    this.queue.add(() => {
      if (!namesOf(this.queue.workbook).delete(this.key)) throw new FakeApiError("ItemNotFound", "There is no such name.");
    });
  }
}

class FakeWorksheet implements HostWorksheet {
  private readonly loaded = new Loaded();
  readonly tables: HostWorksheet["tables"];
  readonly charts: HostWorksheet["charts"];

  /** `orNull`: a *OrNullObject proxy, whose load reports a missing sheet instead of failing. */
  constructor(
    private readonly queue: Queue,
    private readonly sheetName: () => string,
    private readonly orNull = false,
  ) {
    const tablesLoaded = new Loaded();
    const workbook = queue.workbook;
    this.tables = {
      get items(): HostTable[] {
        return tablesLoaded.get("items", "TableCollection");
      },
      load: () => {
        queue.add(() => {
          const sheet = sheetOrThrow(workbook, this.sheetName());
          const items = workbook.tables
            .filter((t) => t.sheet === sheet)
            .map((t) => {
              const proxy = new FakeTable(queue, () => (workbook.tables.includes(t) ? t : null));
              proxy.preload(t.name);
              return proxy;
            });
          tablesLoaded.set("items", items);
        });
        return this.tables;
      },
      add: (address: string, hasHeaders: boolean) => {
        let created: TableModel | null = null;
        queue.add(() => {
          if (!hasHeaders) throw new FakeApiError("InvalidArgument", "The demo sheet only makes tables whose first row is the header.");
          const parsed = parseAddress(address);
          if (!parsed) throw new FakeApiError("InvalidArgument", `${address} is not an address.`);
          const { sheet = this.sheetName(), ...rect } = parsed;
          try {
            created = workbook.addTable(sheetOrThrow(workbook, sheet), rect);
          } catch (thrown) {
            throw new FakeApiError("InvalidOperation", thrown instanceof Error ? thrown.message : "The table could not be made.");
          }
        });
        return new FakeTable(queue, () => created);
      },
      getItemOrNullObject: (name: string) =>
        new FakeTable(queue, () => {
          const sheet = sheetOrThrow(workbook, this.sheetName());
          return workbook.tables.find((t) => t.sheet === sheet && t.name.toLowerCase() === name.toLowerCase()) ?? null;
        }),
    };
    const chartsLoaded = new Loaded();
    this.charts = {
      get items(): HostChart[] {
        return chartsLoaded.get("items", "ChartCollection");
      },
      load: () => {
        queue.add(() => {
          const sheet = sheetOrThrow(workbook, this.sheetName());
          const items = workbook.charts
            .filter((c) => c.sheet === sheet)
            .map((c) => {
              const proxy = new FakeChart(queue, () => (workbook.charts.includes(c) ? c : null));
              proxy.preload(chartName(workbook, c));
              return proxy;
            });
          chartsLoaded.set("items", items);
        });
        return this.charts;
      },
      /**
       * Microsoft, "Excel.ChartCollection class", add(type, sourceData, seriesBy): a chart of the source range. The
       * demo records a scatter chart of one column: one series whose values are the column (its first cell is the
       * series' name when it is text above numbers, as Excel reads a header; common practice), drawn against
       * 1, 2, 3, ... as it has no x values.
       */
      add: (type: string, sourceData: HostRange) => {
        let chart: ChartModel | null = null;
        // The source range's address is only known once the queue runs; read it from a load queued now.
        const source = ownRange(queue, sourceData);
        source.load("address");
        queue.add(() => {
          const refusal = chartTypeRefusal(type);
          if (refusal) throw new FakeApiError("InvalidArgument", refusal);
          const parsed = parseAddress(source.address);
          if (!parsed) throw new FakeApiError("InvalidArgument", "The chart has no source range.");
          const { sheet: sourceSheet = this.sheetName(), ...rect } = parsed;
          if (rect.left !== rect.right)
            throw new FakeApiError("InvalidArgument", "The demo sheet makes a scatter chart from one column only.");
          const from = sheetOrThrow(workbook, sourceSheet);
          const named = rect.bottom > rect.top && typeof workbook.value(from, rect.top, rect.left) === "string";
          const values = named ? { ...rect, top: rect.top + 1 } : rect;
          const name = named ? String(workbook.value(from, rect.top, rect.left)) : "Series1";
          const axis = (): AxisModel => ({ minimum: null, maximum: null, title: "" });
          chart = workbook.addChart({
            type,
            sheet: sheetOrThrow(workbook, this.sheetName()),
            series: [newSeries(name, workbook.seriesLink(from, values), type)],
            axes: { category: axis(), value: axis() },
            legend: "Right",
            title: "",
            from: "",
            to: "",
          });
          chartName(workbook, chart);
        });
        return new FakeChart(queue, () => chart);
      },
      getItemOrNullObject: (name: string) =>
        new FakeChart(queue, () => {
          const sheet = sheetOrThrow(workbook, this.sheetName());
          return workbook.charts.find((c) => c.sheet === sheet && chartName(workbook, c) === name) ?? null;
        }),
    };
  }

  /** Marks the name as loaded already (items of a loaded collection come with what was asked for). */
  preload(name: string): void {
    this.loaded.set("name", name);
    this.loaded.set("isNullObject", false);
  }

  get name(): string {
    return this.loaded.get("name", "Worksheet");
  }

  get isNullObject(): boolean {
    return this.loaded.get("isNullObject", "Worksheet");
  }

  /** A worksheet offers only its name (and whether it exists) here, whatever is asked for. */
  load(): FakeWorksheet {
    this.queue.add(() => {
      const workbook = this.queue.workbook;
      const there = workbook.hasSheet(this.sheetName());
      if (!there && !this.orNull) sheetOrThrow(workbook, this.sheetName());
      this.loaded.set("isNullObject", !there);
      this.loaded.set("name", there ? workbook.sheetName(this.sheetName()) : null);
    });
    return this;
  }

  /** Microsoft, "Excel.Worksheet class", activate(): the sheet is shown, here with A1 selected. */
  activate(): void {
    this.queue.add(() => {
      const sheet = sheetOrThrow(this.queue.workbook, this.sheetName());
      this.queue.workbook.select({ sheet, rect: { top: 0, left: 0, bottom: 0, right: 0 } });
    });
  }

  /** Microsoft, "Excel.Worksheet class", delete(): the sheet goes with its contents; the last sheet of a workbook stays. */
  delete(): void {
    this.queue.add(() => {
      const workbook = this.queue.workbook;
      try {
        workbook.deleteSheet(sheetOrThrow(workbook, this.sheetName()));
      } catch (thrown) {
        if (thrown instanceof RefusedEntry) throw new FakeApiError("InvalidOperation", thrown.message);
        throw thrown;
      }
    });
  }

  getRange(address?: string): FakeRange {
    return new FakeRange(this.queue, () => {
      const sheet = sheetOrThrow(this.queue.workbook, this.sheetName());
      if (address === undefined) return { sheet, rect: { top: 0, left: 0, bottom: 1_048_575, right: 16_383 } };
      const parsed = parseAddress(address);
      if (!parsed || parsed.sheet !== undefined) throw new FakeApiError("InvalidArgument", `${address} is not an address on this sheet.`);
      const { top, left, bottom, right } = parsed;
      return { sheet, rect: { top, left, bottom, right } };
    });
  }

  /** Formatted cells count as used unless `valuesOnly` (Microsoft, "Excel.Worksheet class", getUsedRangeOrNullObject). */
  getUsedRangeOrNullObject(valuesOnly = false): FakeRange {
    return new FakeRange(this.queue, () => {
      const sheet = sheetOrThrow(this.queue.workbook, this.sheetName());
      const rect = this.queue.workbook.usedRect(sheet, !valuesOnly);
      return rect === null ? null : { sheet, rect };
    });
  }
}

/** Every table of the workbook, whatever its sheet (Microsoft, "Excel.Workbook class": tables, ExcelApi 1.1). */
function fakeWorkbookTables(queue: Queue): HostContext["workbook"]["tables"] {
  const loaded = new Loaded();
  const tables: HostContext["workbook"]["tables"] = {
    get items(): HostTable[] {
      return loaded.get("items", "TableCollection");
    },
    load: () => {
      queue.add(() =>
        loaded.set(
          "items",
          queue.workbook.tables.map((t) => {
            const proxy = new FakeTable(queue, () => (queue.workbook.tables.includes(t) ? t : null));
            proxy.preload(t.name);
            return proxy;
          }),
        ),
      );
      return tables;
    },
  };
  return tables;
}

/** The workbook's defined names (Microsoft, "Excel.NamedItemCollection class", ExcelApi 1.4 for add and getItemOrNullObject). */
function fakeNames(queue: Queue): HostContext["workbook"]["names"] {
  const loaded = new Loaded();
  const names: HostContext["workbook"]["names"] = {
    get items(): HostNamedItem[] {
      return loaded.get("items", "NamedItemCollection");
    },
    load: () => {
      queue.add(() =>
        loaded.set(
          "items",
          [...namesOf(queue.workbook)].map(([key, { name }]) => {
            const item = new FakeNamedItem(queue, key);
            item.preload(name);
            return item;
          }),
        ),
      );
      return names;
    },
    add: (name: string, reference: HostRange | string) => {
      if (typeof reference === "string")
        throw new FakeApiError("InvalidArgument", "The demo sheet names ranges given as Range objects only.");
      const range = ownRange(queue, reference);
      range.load("address");
      queue.add(() => {
        checkNewName(queue.workbook, name);
        const parsed = parseAddress(range.address);
        if (!parsed || parsed.sheet === undefined) throw new FakeApiError("InvalidArgument", "A name needs a range on a sheet.");
        const { sheet, ...rect } = parsed;
        namesOf(queue.workbook).set(name.toLowerCase(), { name, sheet: queue.workbook.sheetName(sheet), rect });
      });
      return new FakeNamedItem(queue, name.toLowerCase());
    },
    getItemOrNullObject: (name: string) => new FakeNamedItem(queue, name.toLowerCase()),
  };
  return names;
}

/**
 * The workbook's sheets (Microsoft, "Excel.WorksheetCollection class": add, getItem, getActiveWorksheet and
 * items, ExcelApi 1.1; getItemOrNullObject, 1.4). A new sheet's name follows Excel's rules (limits.ts,
 * sheetNameRefusal): a name in use fails with ItemAlreadyExists and the message Excel gives ("A resource with
 * the same name or identifier already exists.", OfficeDev/office-scripts-docs issue 560), any other refused
 * name with InvalidArgument. The demo asks for the name: Excel's default SheetN is not offered.
 */
function fakeWorksheets(queue: Queue): HostContext["workbook"]["worksheets"] {
  const workbook = queue.workbook;
  const loaded = new Loaded();
  const worksheets: HostContext["workbook"]["worksheets"] = {
    get items(): HostWorksheet[] {
      return loaded.get("items", "WorksheetCollection");
    },
    load: () => {
      queue.add(() =>
        loaded.set(
          "items",
          workbook.sheetNames.map((name) => {
            const sheet = new FakeWorksheet(queue, () => name);
            sheet.preload(name);
            return sheet;
          }),
        ),
      );
      return worksheets;
    },
    add: (name: string) => {
      queue.add(() => {
        if (typeof name !== "string") throw new FakeApiError("InvalidArgument", "The demo sheet adds a sheet only with its name given.");
        const refused = sheetNameRefusal(name, workbook.sheetNames);
        if (refused && workbook.hasSheet(name))
          throw new FakeApiError("ItemAlreadyExists", "A resource with the same name or identifier already exists.");
        if (refused) throw new FakeApiError("InvalidArgument", refused);
        workbook.addSheet(name);
      });
      return new FakeWorksheet(queue, () => name);
    },
    getItem: (name: string) => new FakeWorksheet(queue, () => name),
    getItemOrNullObject: (name: string) => new FakeWorksheet(queue, () => name, true),
    getActiveWorksheet: () => new FakeWorksheet(queue, () => workbook.selection.sheet),
  };
  return worksheets;
}

class FakeContext implements HostContext {
  readonly queue: Queue;
  readonly workbook: HostContext["workbook"];

  constructor(workbook: Workbook) {
    const queue = (this.queue = new Queue(workbook));
    this.workbook = {
      getSelectedRange: () => new FakeRange(queue, () => workbook.selection),
      worksheets: fakeWorksheets(queue),
      names: fakeNames(queue),
      tables: fakeWorkbookTables(queue),
    };
  }

  async sync(): Promise<void> {
    // A real sync is a round trip; yielding once keeps the pane honest about awaiting it.
    await new Promise<void>((resolve) => setTimeout(resolve, 0));
    this.queue.flush();
  }
}

/**
 * The demo page's stand-in for Office.context.diagnostics (Microsoft, "Office.ContextInformation interface":
 * host, platform, version). It says plainly that no Excel is present, so an installation check written on
 * the demo page can never pass for a record of an Excel installation.
 */
export const DEMO_DIAGNOSTICS = {
  host: "Excel",
  platform: "Evensplit demo page (no Excel)",
  version: "none: the demo page's stand-in calculates",
} as const;

/**
 * Excel.run for the demo workbook: runs a batch against a fresh request
 * context and syncs what is left queued at the end, as Excel.run does.
 *
 * @example
 * const host = createHost(fakeRun(workbook));
 */
export function fakeRun(workbook: Workbook): RunBatch {
  return async <T>(batch: (context: HostContext) => Promise<T>): Promise<T> => {
    const context = new FakeContext(workbook);
    const pending: unknown = batch(context);
    // Excel.run rejects a batch that does not return a promise (Microsoft, "Excel.run": the batch function
    // "returns a promise"; the code and message are office-js's own, excel-web-16.00.debug.js).
    if (typeof (pending as { then?: unknown } | null)?.then !== "function") {
      throw new FakeApiError(
        "RunMustReturnPromise",
        'The batch function passed to the ".run" method didn\'t return a promise. The function must return a promise, so that any automatically-tracked objects can be released at the completion of the batch operation.',
      );
    }
    const result = await (pending as Promise<T>);
    await context.sync();
    return result;
  };
}
