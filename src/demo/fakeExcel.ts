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
 * overlapping tables) surface at `sync`, with the API's error codes.
 *
 * Cost: O(cells touched) per sync.
 */
import { formatAddress, parseAddress, rectSize, type CellRect } from "../taskpane/a1";
import type { HostChart, HostContext, HostFont, HostRange, HostTable, HostTableColumn, HostWorksheet, RunBatch } from "../taskpane/host";
import { isError, type Scalar } from "./formula/values";
import { formatCell } from "../taskpane/numberFormat";
import type { TableModel, Workbook } from "./workbook";

/**
 * An error as the real API reports it: a code and a message.
 *
 * @example
 * new FakeApiError("ItemNotFound", "There is no worksheet named Summary.").code; // "ItemNotFound"
 */
export class FakeApiError extends Error {
  constructor(
    readonly code: "ItemNotFound" | "InvalidArgument" | "PropertyNotLoaded" | "InvalidOperation",
    message: string,
  ) {
    super(message);
    this.name = "RichApi.Error";
  }
}

class Queue {
  private readonly operations: (() => void)[] = [];
  constructor(readonly workbook: Workbook) {}
  add(operation: () => void): void {
    this.operations.push(operation);
  }
  flush(): void {
    const pending = this.operations.splice(0);
    this.workbook.batch(() => {
      for (const operation of pending) operation();
    });
  }
}

/** Values a proxy has loaded; readable only after the sync that carried the load out. */
class Loaded {
  private readonly values = new Map<string, unknown>();
  /** The property names of a load call ("address, values"). */
  static names(list: string): string[] {
    return list.split(",").map((n) => n.trim()).filter((n) => n !== "");
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
  if (matrix.length !== rows || matrix.some((r) => !Array.isArray(r) || r.length !== columns)) {
    throw new FakeApiError("InvalidArgument", `The array does not have the size of the range (${rows} × ${columns}).`);
  }
}

type Where = () => { sheet: string; rect: CellRect } | null;

class FakeFont implements HostFont {
  constructor(private readonly queue: Queue, private readonly where: Where) {}
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

class FakeRange implements HostRange {
  private readonly loaded = new Loaded();
  readonly format: { readonly font: HostFont; autofitColumns(): void };

  constructor(private readonly queue: Queue, private readonly where: Where) {
    const font = new FakeFont(queue, where);
    this.format = {
      font,
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
          const rows: unknown[][] = [];
          for (let r = rect.top; r <= rect.bottom; r++) {
            const row: unknown[] = [];
            for (let c = rect.left; c <= rect.right; c++) row.push(read(r, c));
            rows.push(row);
          }
          return rows;
        };
        switch (name) {
          case "address":
            this.loaded.set(name, formatAddress(rect, sheet));
            break;
          case "values":
            this.loaded.set(name, each((r, c) => apiValue(workbook.value(sheet, r, c))));
            break;
          case "formulas":
            this.loaded.set(name, each((r, c) => workbook.entry(sheet, r, c)));
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
    throw new FakeApiError("PropertyNotLoaded", "The demo sheet does not read number formats back.");
  }
  set numberFormat(matrix: unknown[][]) {
    this.queue.add(() => {
      const w = this.where();
      if (!w) return;
      checkShape(w.rect, matrix);
      matrix.forEach((row, r) =>
        row.forEach((format, c) => {
          const cell = { top: w.rect.top + r, left: w.rect.left + c, bottom: w.rect.top + r, right: w.rect.left + c };
          this.queue.workbook.setFormat(w.sheet, cell, { numberFormat: String(format) });
        }),
      );
    });
  }

  private write(matrix: unknown[][]): void {
    const copy = matrix.map((row) => [...row]);
    this.queue.add(() => {
      const w = this.where();
      if (!w) throw new FakeApiError("InvalidOperation", "This range does not exist.");
      checkShape(w.rect, copy);
      this.queue.workbook.writeEntries(w.sheet, w.rect.top, w.rect.left, copy);
    });
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
}

class FakeTable implements HostTable {
  private readonly loaded = new Loaded();
  private readonly columnsLoaded = new Loaded();
  readonly columns: { readonly items: HostTableColumn[]; load(propertyNames: string): unknown };

  constructor(private readonly queue: Queue, private readonly model: () => TableModel) {
    const columnsLoaded = this.columnsLoaded;
    this.columns = {
      get items(): HostTableColumn[] {
        return columnsLoaded.get("items", "TableColumnCollection");
      },
      load: () => {
        queue.add(() => columnsLoaded.set("items", queue.workbook.tableColumns(model()).map((name) => ({ name }))));
        return this.columns;
      },
    };
  }

  /** Marks the name as loaded already (items of a loaded collection come with what was asked for). */
  preload(name: string): void {
    this.loaded.set("name", name);
  }

  get name(): string {
    return this.loaded.get("name", "Table");
  }

  /** A table offers only its name here, whatever is asked for. */
  load(): FakeTable {
    this.queue.add(() => this.loaded.set("name", this.model().name));
    return this;
  }

  getRange(): FakeRange {
    return new FakeRange(this.queue, () => ({ sheet: this.model().sheet, rect: this.model().rect }));
  }
}

class FakeChart implements HostChart {
  readonly title: { text: string };
  constructor(private readonly queue: Queue, private readonly model: () => { title: string; from: string; to: string }) {
    this.title = {
      get text(): string {
        throw new FakeApiError("PropertyNotLoaded", "The demo sheet does not read chart titles back.");
      },
      set text(value: string) {
        queue.add(() => (model().title = value));
      },
    };
  }
  setPosition(startCell: string, endCell?: string): void {
    this.queue.add(() => {
      const chart = this.model();
      chart.from = startCell;
      chart.to = endCell ?? startCell;
    });
  }
}

class FakeWorksheet implements HostWorksheet {
  private readonly loaded = new Loaded();
  readonly tables: HostWorksheet["tables"];
  readonly charts: HostWorksheet["charts"];

  constructor(private readonly queue: Queue, private readonly sheetName: () => string) {
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
              const proxy = new FakeTable(queue, () => t);
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
        return new FakeTable(queue, () => {
          if (created === null) throw new FakeApiError("InvalidOperation", "The table does not exist yet.");
          return created;
        });
      },
    };
    this.charts = {
      add: (type: "ColumnClustered", sourceData: HostRange) => {
        let chart: { title: string; from: string; to: string } | null = null;
        // The source range's address is only known once the queue runs; read it from a load queued now.
        const source = sourceData as FakeRange;
        source.load("address");
        queue.add(() => {
          const parsed = parseAddress(source.address);
          if (!parsed) throw new FakeApiError("InvalidArgument", "The chart has no source range.");
          const { sheet = this.sheetName(), ...rect } = parsed;
          chart = workbook.addChart({ type, sheet: sheetOrThrow(workbook, sheet), source: rect, title: "", from: "", to: "" });
        });
        return new FakeChart(queue, () => {
          if (chart === null) throw new FakeApiError("InvalidOperation", "The chart does not exist yet.");
          return chart;
        });
      },
    };
  }

  get name(): string {
    return this.loaded.get("name", "Worksheet");
  }

  /** A worksheet offers only its name here, whatever is asked for. */
  load(): FakeWorksheet {
    this.queue.add(() => this.loaded.set("name", sheetOrThrow(this.queue.workbook, this.sheetName())));
    return this;
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

  getUsedRangeOrNullObject(): FakeRange {
    return new FakeRange(this.queue, () => {
      const sheet = sheetOrThrow(this.queue.workbook, this.sheetName());
      const rect = this.queue.workbook.usedRect(sheet);
      return rect === null ? null : { sheet, rect };
    });
  }
}

class FakeContext implements HostContext {
  readonly queue: Queue;
  readonly workbook: HostContext["workbook"];

  constructor(workbook: Workbook) {
    const queue = (this.queue = new Queue(workbook));
    this.workbook = {
      getSelectedRange: () => new FakeRange(queue, () => workbook.selection),
      worksheets: {
        getItem: (name: string) => new FakeWorksheet(queue, () => name),
        getActiveWorksheet: () => new FakeWorksheet(queue, () => workbook.selection.sheet),
      },
    };
  }

  async sync(): Promise<void> {
    // A real sync is a round trip; yielding once keeps the pane honest about awaiting it.
    await new Promise<void>((resolve) => setTimeout(resolve, 0));
    this.queue.flush();
  }
}

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
    const result = await batch(context);
    await context.sync();
    return result;
  };
}
