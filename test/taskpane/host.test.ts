/**
 * The host module against office-addin-mock (Microsoft's mock of the Office
 * JavaScript API objects: a property reads as an error string until it was
 * loaded and synced). Each check says which Excel JavaScript API behaviour it
 * stands for (Microsoft, "Excel JavaScript API reference"; common practice).
 */
import { OfficeMockObject } from "office-addin-mock";
import { describe, expect, it } from "vitest";
import { createHost, type HostContext, type RunBatch } from "../../src/taskpane/host";
import type { PlannedWrite } from "../../src/taskpane/writePlan";
import { itemsCollection, workbookMock } from "./officeMock";

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

  it("lists every table of a sheet in two syncs, however many tables there are", async () => {
    const sheet = {
      name: "Paint line",
      tables: itemsCollection([
        plainTable("Table1", "'Paint line'!A1:A5", ["Panel"]),
        plainTable("Table2", "'Paint line'!C1:D5", ["Before", "After"]),
        plainTable("Table3", "'Paint line'!F1:F9", ["Lot"]),
      ]),
    };
    let syncs = 0;
    const counting: RunBatch = (batch) =>
      mockRun(workbookMock(sheet))((context) => {
        const sync = context.sync.bind(context);
        return batch(Object.assign(Object.create(context) as typeof context, { sync: () => (syncs++, sync()) }));
      });
    const tables = await createHost(counting).tables("Paint line");
    expect(tables.map((t) => t.name)).toEqual(["Table1", "Table2", "Table3"]);
    expect(tables[1].columns).toEqual(["Before", "After"]);
    expect(syncs).toBe(2);
  });

  it("lists a sheet's tables with their ranges and column names", async () => {
    const sheet = {
      name: "Paint line",
      tables: itemsCollection([plainTable("Table1", "'Paint line'!A1:C25", ["Panel", "Thickness (µm)", "After"])]),
    };
    const tables = await createHost(mockRun(workbookMock(sheet))).tables("Paint line");
    expect(tables).toEqual([
      {
        name: "Table1",
        sheet: "Paint line",
        rect: { top: 0, left: 0, bottom: 24, right: 2 },
        columns: ["Panel", "Thickness (µm)", "After"],
      },
    ]);
  });

  it("finds the pane's earlier blocks by their defined names, with their charts and helper cells, skipping other names and names of no range", async () => {
    // Items of a loaded collection are plain objects here (see itemsCollection), so their ranges are too.
    const named = (name: string, address: string, isNullObject = false): Record<string, unknown> => {
      const range = { address, isNullObject, load: () => undefined };
      return { name, load: () => undefined, getRangeOrNullObject: () => range };
    };
    const names = [
      named("Evensplit_block_1", "'Paint line'!$E$1:$F$20"),
      named("Evensplit_chartcells_1", "'Paint line'!$H$1:$J$4"),
      named("Prices", "'Paint line'!$A$1"),
      named("Evensplit_block_2", "", true),
      named("Evensplit_block_3", "'Paint line'!$E$30:$F$50"),
    ];
    // Only block 1 has a chart: the sheet finds "Evensplit chart 1" and no other.
    const charts = {
      getItemOrNullObject: (name: string) => ({ name, isNullObject: name !== "Evensplit chart 1", load: () => undefined }),
    };
    const host = createHost(mockRun(workbookMock({ name: "Paint line", charts }, undefined, names)));
    expect(await host.blocks()).toEqual([
      {
        name: "Evensplit_block_1",
        sheet: "Paint line",
        rect: { top: 0, left: 4, bottom: 19, right: 5 },
        chart: "Evensplit chart 1",
        helper: { name: "Evensplit_chartcells_1", sheet: "Paint line", rect: { top: 0, left: 7, bottom: 3, right: 9 } },
      },
      { name: "Evensplit_block_3", sheet: "Paint line", rect: { top: 29, left: 4, bottom: 49, right: 5 } },
    ]);
  });

  it("lists the names a new table, chart or block must avoid: defined names, every table, charts of the sheets", async () => {
    // Table names are unique in the whole workbook, so a table on another sheet counts too.
    const sheet = { name: "Paint line", charts: itemsCollection([{ name: "Chart 1" }]) };
    const host = createHost(mockRun(workbookMock(sheet, undefined, [{ name: "Target" }], [{ name: "Panels" }, { name: "Elsewhere" }])));
    expect(await host.takenNames(["Paint line"])).toEqual(["Target", "Panels", "Elsewhere", "Chart 1"]);
  });
});

/**
 * A recording double of the request context: every property set and method
 * call is logged in order, `sync` is logged, and loaded properties answer
 * from `answers`. It stands for Excel's batching model (Microsoft, "Excel
 * JavaScript object model in Office Add-ins": calls are queued and carried
 * out at sync), so the order of the log is the order Excel would see.
 */
function recordingRun(log: string[], answers: (path: string) => unknown): RunBatch {
  const describe = (a: unknown): string => (typeof a === "function" ? "<object>" : JSON.stringify(a));
  const make = (path: string): unknown =>
    new Proxy(function () {}, {
      get(_target, key) {
        if (typeof key === "symbol" || key === "then") return undefined;
        const at = `${path}.${key}`;
        if (at === "context.sync") {
          return async () => {
            log.push("sync");
          };
        }
        const answer = answers(at);
        return answer === undefined ? make(at) : answer;
      },
      set(_target, key, value) {
        log.push(`${path.replace(/^context\.workbook\./, "")}.${String(key)} = ${describe(value)}`);
        return true;
      },
      apply(_target, _this, args: unknown[]) {
        const at = `${path}(${args.map(describe).join(",")})`;
        log.push(at.replace(/^context\.workbook\./, ""));
        return make(at);
      },
    });
  return (batch) => batch(make("context") as HostContext);
}

const PLAN: PlannedWrite = {
  tables: [{ name: "Table1", sheet: "Paint line", rect: { top: 0, left: 1, bottom: 24, right: 1 }, columns: ["Thickness (µm)"] }],
  refs: { data: "Table1[[Thickness (µm)]]" },
  rows: [],
  block: {
    sheet: "Paint line",
    rect: { top: 0, left: 4, bottom: 1, right: 5 },
    formulas: [
      ["Evensplit result", "Sign test, one sample"],
      ["p-value", '=EVENSPLIT.PVALUE(Table1[[Thickness (µm)]],50,"greater")'],
    ],
    numberFormats: [
      ["General", "General"],
      ["General", "[<0.0001]0.00E+00;0.0000"],
    ],
    titleRows: [0],
    cautionRows: [1],
  },
  chart: {
    sheet: "Paint line",
    name: "Evensplit chart 1",
    title: "Thickness (µm) row by row, against H0 and the 95% bounds",
    area: { top: 0, left: 11, bottom: 14, right: 17 },
    points: { sheet: "Paint line", rect: { top: 1, left: 1, bottom: 24, right: 1 }, name: "Thickness (µm)" },
    lineEnds: { top: 0, left: 8, bottom: 0, right: 9 },
    lines: [
      { name: "H0: median = 50", values: { top: 1, left: 8, bottom: 1, right: 9 }, style: "Continuous", colour: "#B5452E" },
      { name: "95% lower bound", values: { top: 2, left: 8, bottom: 2, right: 9 }, style: "Dash", colour: "#2D7A4F" },
    ],
    valueAxis: { minimum: 46, maximum: 55, title: "Thickness (µm)" },
    rowAxisTitle: "Row of the data, in sheet order",
    helper: {
      rect: { top: 0, left: 7, bottom: 2, right: 9 },
      formulas: [
        ["Chart lines run over rows", "0", "=ROWS(Table1[[Thickness (µm)]])+1"],
        ["Chart line: H0: median = 50", "50", "50"],
        ["Chart line: 95% lower bound", "=$F$2", "=$F$2"],
      ],
      name: "Evensplit_chartcells_1",
    },
  },
  blockName: "Evensplit_block_1",
  replaces: [
    {
      name: "Evensplit_block_0",
      sheet: "Paint line",
      rect: { top: 0, left: 4, bottom: 2, right: 5 },
      chart: "Evensplit chart 0",
      helper: { name: "Evensplit_chartcells_0", sheet: "Paint line", rect: { top: 0, left: 7, bottom: 3, right: 9 } },
    },
  ],
};

const REGION = [
  { sheet: "Paint line", rect: { top: 0, left: 4, bottom: 1, right: 5 } },
  { sheet: "Paint line", rect: { top: 0, left: 4, bottom: 2, right: 5 } },
];

function regionAnswers(path: string): unknown {
  const rows = /getRange\("E1:F(\d)"\)/.exec(path);
  const height = rows ? Number(rows[1]) : 0;
  if (/getRange\("E1:F\d"\)\.(values|formulas)$/.test(path)) return Array.from({ length: height }, () => ["", ""]);
  if (/getRange\("E1:F\d"\)\.numberFormat$/.test(path)) return Array.from({ length: height }, () => ["General", "General"]);
  if (/getCellProperties\(.*\)\.value$/.test(path))
    return Array.from({ length: height }, () => [{ format: { font: { bold: false } } }, { format: { font: { bold: false } } }]);
  if (path.endsWith(".columns.items")) return [{ name: "Thickness (µm)" }];
  return undefined;
}

describe("one write, one batch", () => {
  it("reads the region, then queues every change in order (earlier block, its chart and helper cells cleared, table, cells, formats, chart, names) and syncs once", async () => {
    const log: string[] = [];
    const report = await createHost(recordingRun(log, regionAnswers)).applyWrite(PLAN, REGION, () => true);
    expect(report).toEqual({ kind: "written" });
    const syncs = log.flatMap((entry, i) => (entry === "sync" ? [i] : []));
    // One sync for the reading, one for the whole write, one for the column width and selection.
    expect(syncs).toHaveLength(3);
    const write = log.slice(syncs[0] + 1, syncs[1]);
    const order = [
      /getRange\("E1:F3"\)\.clear\("All"\)$/,
      /names\.getItemOrNullObject\("Evensplit_block_0"\)\.delete\(\)$/,
      /getRange\("H1:J4"\)\.clear\("All"\)$/,
      /names\.getItemOrNullObject\("Evensplit_chartcells_0"\)\.delete\(\)$/,
      /charts\.getItemOrNullObject\("Evensplit chart 0"\)\.delete\(\)$/,
      /tables\.add\("'Paint line'!B1:B25",true\)$/,
      /tables\.add\(.*\)\.name = "Table1"$/,
      /getRange\("E1:F2"\)\.formulas = \[\["Evensplit result"/,
      /getRange\("E1:F2"\)\.numberFormat = /,
      /getColumn\(0\)\.format\.font\.bold = true$/,
      /getRow\(1\)\.format\.font\.italic = true$/,
      /getRange\("H1:J3"\)\.formulas = \[\["Chart lines run over rows","0","=ROWS\(Table1\[\[Thickness \(µm\)\]\]\)\+1"\]/,
      /getRange\("B2:B25"\)$/,
      /charts\.add\("XYScatter",<object>,"Columns"\)$/,
      /\.name = "Evensplit chart 1"$/,
      /series\.getItemAt\(0\)\.name = "Thickness \(µm\)"$/,
      /series\.getItemAt\(0\)\.markerStyle = "Circle"$/,
      /series\.add\("H0: median = 50"\)$/,
      /\.chartType = "XYScatterLinesNoMarkers"$/,
      /\.setXAxisValues\(<object>\)$/,
      /\.setValues\(<object>\)$/,
      /series\.add\("95% lower bound"\)$/,
      /\.format\.line\.lineStyle = "Dash"$/,
      /axes\.valueAxis\.minimum = 46$/,
      /axes\.valueAxis\.maximum = 55$/,
      /axes\.categoryAxis\.minimum = 0$/,
      /legend\.position = "Bottom"$/,
      /setPosition\("L1","R15"\)$/,
      /names\.add\("Evensplit_chartcells_1",<object>,"Evensplit chart helper cells"\)$/,
      /names\.add\("Evensplit_block_1",<object>,"Evensplit result block"\)$/,
    ];
    let from = 0;
    for (const step of order) {
      const at = write.findIndex((entry, i) => i >= from && step.test(entry));
      expect(at, `${step} after entry ${from} of\n${write.join("\n")}`).toBeGreaterThanOrEqual(0);
      from = at + 1;
    }
    expect(log.slice(syncs[1] + 1, syncs[2]).join(" ")).toMatch(/autofitColumns\(\).*select\(\)/);
  });

  it("changes nothing when the cells are no longer what the person agreed to", async () => {
    const log: string[] = [];
    const report = await createHost(recordingRun(log, regionAnswers)).applyWrite(PLAN, REGION, () => false);
    expect(report.kind).toBe("changed");
    expect(log.filter((entry) => entry === "sync")).toHaveLength(1);
    expect(log.some((entry) => / = |clear|add\(|delete/.test(entry))).toBe(false);
  });

  it("refuses formulas whose size does not match the target (a programmer error, before any sync of a change)", async () => {
    const log: string[] = [];
    const wrong = { ...PLAN, block: { ...PLAN.block, formulas: [["a", "b"]] } };
    await expect(createHost(recordingRun(log, regionAnswers)).applyWrite(wrong, REGION, () => true)).rejects.toThrow(RangeError);
    expect(log.filter((entry) => entry === "sync")).toHaveLength(1);
  });
});
