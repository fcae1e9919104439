/**
 * The host module against office-addin-mock (Microsoft's mock of the Office
 * JavaScript API objects: a property reads as an error string until it was
 * loaded and synced). Each check says which Excel JavaScript API behaviour it
 * stands for (Microsoft, "Excel JavaScript API reference"; common practice).
 */
import { OfficeMockObject } from "office-addin-mock";
import { describe, expect, it } from "vitest";
import { CAUTION_COLOR, createHost, type RunBatch } from "../../src/taskpane/host";
import { workbookMock } from "./officeMock";

/** office-addin-mock only loads properties it knows; collections' items are given as plain, already loaded objects. */
function itemsCollection(items: unknown[], extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    items,
    ...extra,
    load(this: OfficeMockObject) {
      // "items/name" navigates into an array, which the mock cannot; load the array itself instead.
      OfficeMockObject.prototype.load.call(this, "items");
      return this;
    },
  };
}

function plainTable(name: string, address: string, columns: string[]): Record<string, unknown> {
  return {
    name,
    load: () => undefined,
    columns: { items: columns.map((c) => ({ name: c })), load: () => undefined },
    getRange: () => ({ address, load: () => undefined }),
  };
}

/** A range from a *OrNullObject method: after a sync, isNullObject is known whatever was loaded (as in Office.js). */
function nullable(address: string, isNullObject: boolean): Record<string, unknown> {
  return {
    address,
    isNullObject,
    load(this: OfficeMockObject, names: string) {
      OfficeMockObject.prototype.load.call(this, `${names}, isNullObject`);
      return this;
    },
  };
}

function mockRun(mock: OfficeMockObject): RunBatch {
  return (batch) => (mock as unknown as { run: RunBatch }).run(batch);
}


describe("host over office-addin-mock", () => {
  it("reads the selection's address after load and sync", async () => {
    const host = createHost(mockRun(workbookMock({ name: "Paint line" })));
    expect(await host.selection()).toBe("'Paint line'!B1:B25");
  });

  it("reads values and formulas of an address and reports the sheet from the returned address", async () => {
    const sheet = {
      name: "Paint line",
      range: { address: "'Paint line'!B1:B3", values: [["Thickness (µm)"], [51.8], [""]], formulas: [["Thickness (µm)"], [51.8], [""]] },
      getRange(this: { range: unknown }) {
        return this.range;
      },
    };
    const host = createHost(mockRun(workbookMock(sheet)));
    const read = await host.read("B1:B3");
    expect(read).toEqual({
      sheet: "Paint line",
      rect: { top: 0, left: 1, bottom: 2, right: 1 },
      values: [["Thickness (µm)"], [51.8], [""]],
      formulas: [["Thickness (µm)"], [51.8], [""]],
    });
  });

  it("gives null for text that is not an address, without touching the workbook", async () => {
    let ran = false;
    const host = createHost(async () => {
      ran = true;
      throw new Error("should not run");
    });
    expect(await host.read("not a range")).toBeNull();
    expect(ran).toBe(false);
  });

  it("reports an empty sheet's used range as null (getUsedRangeOrNullObject gives a null object)", async () => {
    const empty = {
      name: "Paint line",
      used: nullable("", true),
      getUsedRangeOrNullObject(this: { used: unknown }) {
        return this.used;
      },
    };
    expect(await createHost(mockRun(workbookMock(empty))).usedRect("Paint line")).toBeNull();
    const filled = {
      name: "Paint line",
      used: nullable("'Paint line'!A1:C25", false),
      getUsedRangeOrNullObject(this: { used: unknown }) {
        return this.used;
      },
    };
    expect(await createHost(mockRun(workbookMock(filled))).usedRect("Paint line")).toEqual({ top: 0, left: 0, bottom: 24, right: 2 });
  });

  it("lists a sheet's tables with their ranges and column names", async () => {
    const sheet = { name: "Paint line", tables: itemsCollection([plainTable("Table1", "'Paint line'!A1:C25", ["Panel", "Thickness (µm)", "After"])]) };
    const tables = await createHost(mockRun(workbookMock(sheet))).tables("Paint line");
    expect(tables).toEqual([{ name: "Table1", sheet: "Paint line", rect: { top: 0, left: 0, bottom: 24, right: 2 }, columns: ["Panel", "Thickness (µm)", "After"] }]);
  });

  it("turns a range into a table with a header row (TableCollection.add(address, true))", async () => {
    const calls: unknown[][] = [];
    const sheet = {
      name: "Paint line",
      tables: itemsCollection([], {
        add: (address: string, hasHeaders: boolean) => {
          calls.push([address, hasHeaders]);
          return plainTable("Table1", "'Paint line'!B1:B25", ["Thickness (µm)"]);
        },
      }),
    };
    const made = await createHost(mockRun(workbookMock(sheet))).createTable({ sheet: "Paint line", rect: { top: 0, left: 1, bottom: 24, right: 1 } });
    expect(calls).toEqual([["'Paint line'!B1:B25", true]]);
    expect(made.name).toBe("Table1");
    expect(made.columns).toEqual(["Thickness (µm)"]);
  });

  it("writes the block's formulas in one assignment before any format, then formats rows and columns", async () => {
    const log: string[] = [];
    const font = () => ({ bold: false, italic: false, color: "" });
    const target = {
      address: "'Paint line'!E1:F3",
      formulas: [],
      numberFormat: [],
      format: { font: font() },
      rows: { r0: { format: { font: font() } }, r2: { format: { font: font() } } },
      column0: { format: { font: font(), autofitColumns: () => log.push("autofit") } },
      getRow(this: { rows: Record<string, unknown> }, i: number) {
        return this.rows[`r${i}`];
      },
      getColumn(this: { column0: unknown }) {
        return this.column0;
      },
      select: () => log.push("select"),
    };
    const sheet = {
      name: "Paint line",
      target,
      getRange(this: { target: unknown }, address: string) {
        log.push(`getRange ${address}`);
        return this.target;
      },
    };
    const mock = workbookMock(sheet);
    const context = (mock as unknown as { context: { sync: () => Promise<void> } }).context;
    const realSync = context.sync.bind(context);
    const range = (mock as unknown as { context: { workbook: { worksheets: { sheet: { target: { formulas: unknown; numberFormat: unknown } } } } } }).context.workbook.worksheets.sheet.target;
    context.sync = async () => {
      log.push(`sync formulas=${JSON.stringify(range.formulas)} formats=${JSON.stringify(range.numberFormat)}`);
      await realSync();
    };
    await createHost(mockRun(mock)).writeBlock({
      sheet: "Paint line",
      rect: { top: 0, left: 4, bottom: 2, right: 5 },
      formulas: [["Evensplit result", "Sign test, one sample"], ["p-value", "=EVENSPLIT.PVALUE($B$2:$B$25,50)"], ["Assumptions", "Independent observations."]],
      numberFormats: [["General", "General"], ["General", "[<0.0001]0.00E+00;0.0000"], ["General", "General"]],
      titleRows: [0],
      cautionRows: [2],
    });
    // The first sync carries the formulas alone; the formats follow in the second.
    expect(log[0]).toBe("getRange E1:F3");
    expect(log[1]).toMatch(/^sync formulas=\[\["Evensplit result".*formats="Error, property was not loaded"$/);
    expect(log[log.length - 1]).toMatch(/^sync formulas=.*formats=\[\["General","General"\]/);
    const sheetMock = (mock as unknown as { context: { workbook: { worksheets: { sheet: { target: typeof target } } } } }).context.workbook.worksheets.sheet;
    expect(sheetMock.target.column0.format.font.bold).toBe(true);
    expect((sheetMock.target.rows.r0 as { format: { font: { bold: boolean } } }).format.font.bold).toBe(true);
    const caution = (sheetMock.target.rows.r2 as { format: { font: { italic: boolean; color: string } } }).format.font;
    expect(caution.italic).toBe(true);
    expect(caution.color).toBe(CAUTION_COLOR);
    expect(log).toContain("autofit");
    expect(log).toContain("select");
  });

  it("refuses formulas whose size does not match the target (a programmer error, before touching the sheet)", async () => {
    const host = createHost(mockRun(workbookMock({ name: "Paint line", getRange: () => ({}) })));
    await expect(
      host.writeBlock({ sheet: "Paint line", rect: { top: 0, left: 4, bottom: 1, right: 5 }, formulas: [["a", "b"]], numberFormats: [["General", "General"]], titleRows: [], cautionRows: [] }),
    ).rejects.toThrow(RangeError);
  });

  it("adds a clustered column chart linked to the source range, titled and placed", async () => {
    const added: unknown[] = [];
    const position: string[] = [];
    const chart = { title: { text: "" }, setPosition: (a: string, b: string) => position.push(a, b) };
    const sheet = {
      name: "Paint line",
      source: { address: "'Paint line'!B1:B25" },
      getRange(this: { source: unknown }, address: string) {
        added.push(`range ${address}`);
        return this.source;
      },
      charts: {
        chart,
        add(this: { chart: unknown }, type: string, _source: unknown, seriesBy: string) {
          added.push(`${type} by ${seriesBy}`);
          return this.chart;
        },
      },
    };
    const mock = workbookMock(sheet);
    await createHost(mockRun(mock)).addChart({ sheet: "Paint line", source: "B1:B25", title: "Thickness (µm)", from: "H1", to: "N15" });
    expect(added).toEqual(["range B1:B25", "ColumnClustered by Columns"]);
    const made = (mock as unknown as { context: { workbook: { worksheets: { sheet: { charts: { chart: typeof chart } } } } } }).context.workbook.worksheets.sheet.charts.chart;
    expect(made.title.text).toBe("Thickness (µm)");
    expect(position).toEqual(["H1", "N15"]);
  });
});
