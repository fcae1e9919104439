/**
 * Places where the demo sheet follows Excel rather than doing something
 * easier that could hide a defect in the pane. Each check names its source.
 */
import { describe, expect, it } from "vitest";
import { FakeApiError, fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { demoRows, DEMO_SHEET } from "../../src/demo/inventedData";
import { shapesFrom, withShapes } from "../../src/demo/standIn";
import { tableHeaders, Workbook } from "../../src/demo/workbook";
import { LAST_COLUMN } from "../../src/taskpane/a1";
import type { HostContext } from "../../src/taskpane/host";
import { BLANK_CHECK_WORDS, blockFormula, resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";
import { catalogueFunctions } from "./catalogue";

const S = "Paint line";

describe("references to a sheet that is not there", () => {
  it("are #REF!, and the rest of the sheet still calculates (Excel shows #REF! for a missing sheet)", () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["='No such sheet'!A1"], [2], ["=A2*2"], ["=ROWS('No such sheet'!A1:A5)"]]);
    expect((w.value(S, 0, 0) as { code: string }).code).toBe("#REF!");
    expect((w.value(S, 3, 0) as { code: string }).code).toBe("#REF!");
    expect(w.value(S, 2, 0)).toBe(4);
  });
});

describe('a new table\'s header row (Microsoft, "Overview of Excel tables"; numbering of repeats from memory)', () => {
  it("turns numbers into text, names blanks ColumnN and makes repeated names unique", () => {
    expect(tableHeaders(["Thickness", "thickness", 2024, null, true])).toEqual(["Thickness", "thickness2", "2024", "Column4", "TRUE"]);
  });

  it("writes those names into the sheet, so a structured reference must use them", () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [
      ["Thickness", "Thickness", 2024, ""],
      [1, 2, 3, 4],
      [5, 6, 7, 8],
    ]);
    w.addTable(S, { top: 0, left: 0, bottom: 2, right: 3 });
    expect(w.tableColumns(w.tables[0])).toEqual(["Thickness", "Thickness2", "2024", "Column4"]);
    expect(w.entry(S, 0, 2)).toBe("2024");
    w.writeEntries(S, 4, 0, [["=COUNT(Table1[Thickness2])", "=COUNT(Table1[2024])"]]);
    expect([w.value(S, 4, 0), w.value(S, 4, 1)]).toEqual([2, 2]);
  });
});

describe("the Excel stand-in refuses what Excel refuses", () => {
  const sheetWithData = (): Workbook => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["Thickness"], [50]]);
    return w;
  };

  it("rejects an Excel.run batch that returns no promise (office-js: RunMustReturnPromise)", async () => {
    const run = fakeRun(sheetWithData());
    const noPromise = ((context: HostContext) => {
      context.workbook.worksheets.getItem(S).getRange("B1").values = [[1]];
    }) as unknown as (context: HostContext) => Promise<void>;
    await expect(run(noPromise)).rejects.toMatchObject({ code: "RunMustReturnPromise" });
  });

  it("fails the sync with InvalidArgument when a formula breaks Excel's rules, and keeps the earlier cells of the batch", async () => {
    const w = sheetWithData();
    const run = fakeRun(w);
    const failure = run(async (context) => {
      const sheet = context.workbook.worksheets.getItem(S);
      sheet.getRange("C1").values = [["written first"]];
      sheet.getRange("C2").formulas = [["=COUNT(Table1[Temp. °C])"]];
      sheet.getRange("C3").formulas = [["=1"]];
      await context.sync();
    });
    await expect(failure).rejects.toBeInstanceOf(FakeApiError);
    await expect(failure).rejects.toMatchObject({ code: "InvalidArgument", debugInfo: { code: "InvalidArgument" } });
    expect([w.entry(S, 0, 2), w.entry(S, 1, 2), w.entry(S, 2, 2)]).toEqual(["written first", "", ""]);
  });

  it("fails the sync for a text constant over 255 characters, a formula over 8,192 or a text over 32,767", async () => {
    for (const entry of [`="${"a".repeat(256)}"`, `=${"1+".repeat(4096)}1`, "x".repeat(32_768)]) {
      const w = sheetWithData();
      const write = fakeRun(w)(async (context) => {
        context.workbook.worksheets.getItem(S).getRange("D1").formulas = [[entry]];
        // One sync in each separate run over a fresh workbook, not a loop of syncs in one batch.
        // eslint-disable-next-line office-addins/no-context-sync-in-loop
        await context.sync();
      });
      await expect(write).rejects.toMatchObject({ code: "InvalidArgument" });
      expect(w.entry(S, 0, 3)).toBe("");
    }
  });

  it("refuses a range reaching past the last column or row of the sheet", async () => {
    const run = fakeRun(sheetWithData());
    const pastColumn = run(async (context) => {
      context.workbook.worksheets.getItem(S).getRange("XFD1").getColumn(1).values = [[1]];
      await context.sync();
    });
    await expect(pastColumn).rejects.toMatchObject({ code: "InvalidArgument" });
    const pastRow = run(async (context) => {
      context.workbook.worksheets.getItem(S).getRange("A1048576").getRow(1).values = [[1]];
      await context.sync();
    });
    await expect(pastRow).rejects.toMatchObject({ code: "InvalidArgument" });
    const pastAddress = run(async (context) => {
      context.workbook.worksheets.getItem(S).getRange("XFE1").values = [[1]];
      await context.sync();
    });
    await expect(pastAddress).rejects.toMatchObject({ code: "InvalidArgument" });
  });
});

describe('the used range (Microsoft, "Excel.Worksheet class", getUsedRangeOrNullObject(valuesOnly))', () => {
  it("counts cells that only carry a format unless asked for values only", async () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["Thickness"], [50]]);
    w.setFormat(S, { top: 9, left: 4, bottom: 9, right: 4 }, { bold: true });
    const addresses = await fakeRun(w)(async (context) => {
      const sheet = context.workbook.worksheets.getItem(S);
      const all = sheet.getUsedRangeOrNullObject();
      const values = sheet.getUsedRangeOrNullObject(true);
      all.load("address");
      values.load("address");
      await context.sync();
      return [all.address, values.address];
    });
    expect(addresses).toEqual(["'Paint line'!A1:E10", "'Paint line'!A1:A2"]);
  });
});

describe("proxies belong to their own Excel.run (office-js CommonUtility.validateContext)", () => {
  it("refuses a range from an earlier batch as a chart's source", async () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["Thickness"], [50], [51]]);
    const run = fakeRun(w);
    const kept = await run(async (context) => context.workbook.worksheets.getItem(S).getRange("A1:A3"));
    const reuse = run(async (context) => {
      context.workbook.worksheets.getItem(S).charts.add("XYScatter", kept);
      await context.sync();
    });
    await expect(reuse).rejects.toMatchObject({ code: "InvalidRequestContext" });
    expect(w.charts).toEqual([]);
  });
});

describe('null and empty text in what the API writes (Microsoft, "Blank and null values in Excel add-ins")', () => {
  it('leaves a cell given null as it is and clears a cell given ""', async () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["keep", "clear", "old"]]);
    w.setFormat(S, { top: 0, left: 0, bottom: 0, right: 2 }, { numberFormat: "0.00" });
    await fakeRun(w)(async (context) => {
      const range = context.workbook.worksheets.getItem(S).getRange("A1:C1");
      range.formulas = [[null, "", "=1+1"]] as unknown as string[][];
      range.numberFormat = [[null, "", "0%"]] as unknown as string[][];
      await context.sync();
    });
    expect([w.entry(S, 0, 0), w.entry(S, 0, 1), w.entry(S, 0, 2)]).toEqual(["keep", "", "=1+1"]);
    expect([0, 1, 2].map((c) => w.format(S, 0, c).numberFormat)).toEqual(["0.00", "General", "0%"]);
  });

  it("refuses null for a whole property", async () => {
    const write = fakeRun(new Workbook([S]))(async (context) => {
      context.workbook.worksheets.getItem(S).getRange("A1").values = null as unknown as string[][];
      await context.sync();
    });
    await expect(write).rejects.toMatchObject({ code: "InvalidArgument" });
  });
});

describe('spilling (Microsoft, "How to correct a #SPILL! error")', () => {
  const pair: CustomFunction = { fn: () => [[1, 2]], shapes: [], result: "matrix" };

  it("is #SPILL! for an array formula inside a table or one whose spill would reach into a table", () => {
    const w = new Workbook([S]);
    w.setFunctions(new Map([["PAIR", pair]]));
    // A table over B1:C3 whose data cells are blank, so only the table is in the way.
    w.writeEntries(S, 0, 1, [["A", "B"]]);
    w.addTable(S, { top: 0, left: 1, bottom: 2, right: 2 });
    w.writeEntries(S, 1, 0, [["=EVENSPLIT.PAIR()"]]);
    expect((w.value(S, 1, 0) as { code: string }).code).toBe("#SPILL!");
    w.writeEntries(S, 2, 1, [["=EVENSPLIT.PAIR()"]]);
    expect((w.value(S, 2, 1) as { code: string }).code).toBe("#SPILL!");
    w.writeEntries(S, 5, 0, [["=EVENSPLIT.PAIR()"]]);
    expect([w.value(S, 5, 0), w.value(S, 5, 1)]).toEqual([1, 2]);
  });

  it("is #SPILL! when the spill would run past the last column", () => {
    const w = new Workbook([S]);
    w.setFunctions(new Map([["PAIR", pair]]));
    w.writeEntries(S, 0, LAST_COLUMN, [["=EVENSPLIT.PAIR()"]]);
    expect((w.value(S, 0, LAST_COLUMN) as { code: string }).code).toBe("#SPILL!");
  });
});

describe('defined names (Microsoft, "Define and use names in formulas")', () => {
  it("refuses names that read as a cell in either reference style", async () => {
    for (const name of ["R1C1", "R2", "C3", "RC", "AB12", "has space"]) {
      const w = new Workbook([S]);
      const add = fakeRun(w)(async (context) => {
        context.workbook.names.add(name, context.workbook.worksheets.getItem(S).getRange("A1"));
        // One sync in each separate run over a fresh workbook, not a loop of syncs in one batch.
        // eslint-disable-next-line office-addins/no-context-sync-in-loop
        await context.sync();
      });
      await expect(add, name).rejects.toMatchObject({ code: "InvalidArgument" });
    }
    const w = new Workbook([S]);
    await fakeRun(w)(async (context) => {
      context.workbook.names.add("Evensplit_block_1", context.workbook.worksheets.getItem(S).getRange("A1"));
      await context.sync();
    });
  });
});

describe('payload of one sync (Microsoft, "Resource limits and performance optimization for Office Add-ins": 5 MB on the web)', () => {
  it("refuses to load the values of a whole column in one sync, and loads a used range", async () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["Thickness"], [50]]);
    const run = fakeRun(w);
    const whole = run(async (context) => {
      const column = context.workbook.worksheets.getItem(S).getRange("A:C");
      column.load("values");
      await context.sync();
      // The rule reads "values/length" as a property path to load; loading "values" is what Office.js needs.
      // eslint-disable-next-line office-addins/load-object-before-read
      return column.values.length;
    });
    await expect(whole).rejects.toMatchObject({ code: "ResponsePayloadSizeLimitExceeded" });
    const used = await run(async (context) => {
      const range = context.workbook.worksheets.getItem(S).getRange("A1:A2");
      range.load("values");
      await context.sync();
      return range.values;
    });
    expect(used).toEqual([["Thickness"], [50]]);
  });

  it("refuses a write of more than 5 MB before any of it happens", async () => {
    const w = new Workbook([S]);
    const big = Array.from({ length: 200 }, () => Array.from({ length: 20 }, () => "x".repeat(1400)));
    const write = fakeRun(w)(async (context) => {
      context.workbook.worksheets.getItem(S).getRange("A1:T200").values = big;
      await context.sync();
    });
    await expect(write).rejects.toMatchObject({ code: "RequestPayloadSizeLimitExceeded" });
    expect(w.usedRect(S)).toBeNull();
  });
});

describe('functions Excel knows only through their metadata (Microsoft, "Manually create JSON metadata for custom functions")', () => {
  it("leaves out a registered function the metadata does not declare, and reads each answer's declared shape", () => {
    const registered = new Map([
      ["PVALUE", () => 0.5],
      ["HIDDEN", () => 1],
    ]);
    const joined = withShapes(registered, shapesFrom({ functions: [{ id: "PVALUE", parameters: [{ dimensionality: "matrix" }, {}] }] }));
    expect([...joined.keys()]).toEqual(["PVALUE"]);
    expect(joined.get("PVALUE")).toMatchObject({ shapes: ["matrix", "scalar"], result: "scalar" });
    const w = new Workbook([S]);
    w.setFunctions(joined);
    w.writeEntries(S, 0, 0, [["=EVENSPLIT.HIDDEN()"]]);
    expect((w.value(S, 0, 0) as { code: string }).code).toBe("#NAME?");
  });
});

describe("blank cells handed to a function as 0, as some Excel builds do (office-js issues 5262, 1951)", () => {
  it('passes "" by default and 0 once switched, and the block\'s blank check then warns', async () => {
    const seen: unknown[] = [];
    const echo: CustomFunction = { fn: (cells: unknown) => (seen.push(cells), 1), shapes: ["matrix"], result: "scalar" };
    const w = new Workbook([S]);
    w.setFunctions(new Map([["ECHO", echo]]));
    w.writeEntries(S, 0, 0, [[1], [""], [3], ["=EVENSPLIT.ECHO(A1:A3)"]]);
    expect(seen.at(-1)).toEqual([[1], [""], [3]]);
    w.setBlanksAsZeros(true);
    expect(seen.at(-1)).toEqual([[1], [0], [3]]);

    const block = (zeros: boolean): unknown => {
      const sheet = new Workbook([DEMO_SHEET]);
      sheet.writeEntries(DEMO_SHEET, 0, 0, demoRows());
      sheet.setFunctions(functions);
      sheet.setBlanksAsZeros(zeros);
      const request: BlockRequest = {
        test: "sign",
        paired: false,
        center: 50,
        alternative: "two-sided",
        alpha: 0.05,
        confidence: 0.95,
        dataName: "Thickness (µm)",
      };
      const rows = resultBlockRows(request);
      sheet.writeEntries(
        DEMO_SHEET,
        0,
        5,
        rows.map((row) => [blockFormula(row.value, { data: "$B$2:$B$26" })]),
      );
      return sheet.value(
        DEMO_SHEET,
        rows.findIndex((r) => r.key === "blanks"),
        5,
      );
    };
    const functions = await catalogueFunctions();
    expect([block(false), block(true)]).toEqual([BLANK_CHECK_WORDS.agree, BLANK_CHECK_WORDS.differ]);
  });
});

describe('new worksheets (Microsoft, "Excel.WorksheetCollection class"; names as Microsoft Support, "Rename a worksheet", from memory)', () => {
  const refusedCode = async (w: Workbook, name: string): Promise<string> => {
    try {
      await fakeRun(w)(async (context: HostContext) => {
        context.workbook.worksheets.add(name);
        await context.sync();
      });
      return "accepted";
    } catch (thrown) {
      return thrown instanceof FakeApiError ? thrown.code : String(thrown);
    }
  };

  it("refuses a blank name, one over 31 characters, / \\ ? * : [ ], an apostrophe at either end, History, and a name in use in any case", async () => {
    const w = new Workbook([S]);
    for (const name of ["", "   ", "x".repeat(32), "a/b", "a\\b", "a?b", "a*b", "a:b", "a[b", "a]b", "'quoted", "quoted'", "history"]) {
      expect(await refusedCode(w, name), JSON.stringify(name)).toBe("InvalidArgument");
    }
    expect(await refusedCode(w, "PAINT LINE")).toBe("ItemAlreadyExists");
    expect(w.sheetNames).toEqual([S]);
    expect(await refusedCode(w, "x".repeat(31))).toBe("accepted");
    expect(await refusedCode(w, "Lot's check (2)")).toBe("accepted");
    expect(w.sheetNames).toEqual([S, "x".repeat(31), "Lot's check (2)"]);
  });

  it("lists the sheets, writes to a new one in the same batch, shows it on activate, and deletes it again", async () => {
    const w = new Workbook([S]);
    const names = await fakeRun(w)(async (context: HostContext) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      await context.sync();
      const before = sheets.items.map((s) => s.name);
      const made = sheets.add("Check");
      made.getRange("A1:B1").formulas = [["=1+1", "=Check!A1*2"]];
      made.activate();
      await context.sync();
      return before;
    });
    expect(names).toEqual([S]);
    expect(w.value("Check", 0, 1)).toBe(4);
    expect(w.selection.sheet).toBe("Check");
    w.writeEntries(S, 0, 0, [["=Check!A1"]]);
    const found = await fakeRun(w)(async (context: HostContext) => {
      const missing = context.workbook.worksheets.getItemOrNullObject("Nothing");
      const there = context.workbook.worksheets.getItemOrNullObject("check");
      missing.load("name");
      there.load("name");
      await context.sync();
      if (!there.isNullObject) there.delete();
      await context.sync();
      return { missing: missing.isNullObject, there: there.isNullObject };
    });
    expect(found).toEqual({ missing: true, there: false });
    expect(w.sheetNames).toEqual([S]);
    expect(w.selection.sheet).toBe(S);
    expect((w.value(S, 0, 0) as { code: string }).code).toBe("#REF!");
  });

  it("keeps the last sheet of a workbook", async () => {
    const w = new Workbook([S]);
    await expect(
      fakeRun(w)(async (context: HostContext) => {
        context.workbook.worksheets.getItem(S).delete();
        await context.sync();
      }),
    ).rejects.toMatchObject({ code: "InvalidOperation" });
  });
});

describe('parameter addresses (Microsoft, "Custom functions parameter options": invocation parameter, detect the address of a parameter)', () => {
  it("passes a function that asks for them an invocation last, after every declared argument, with one address per argument", () => {
    const seen: unknown[][] = [];
    const echo: CustomFunction = {
      fn: (...args: unknown[]) => (seen.push(args), 1),
      shapes: ["matrix", "scalar", "scalar"],
      result: "scalar",
      parameterAddresses: true,
    };
    const plain: CustomFunction = { fn: (...args: unknown[]) => (seen.push(args), 2), shapes: ["matrix", "scalar"], result: "scalar" };
    const w = new Workbook([S]);
    w.setFunctions(
      new Map([
        ["ECHO", echo],
        ["PLAIN", plain],
      ]),
    );
    w.writeEntries(S, 0, 0, [[1], [2], [3], ["=EVENSPLIT.ECHO(A1:A3, 5)"], ["=EVENSPLIT.ECHO(A2,,C1)"], ["=EVENSPLIT.PLAIN(A1:A3)"]]);
    expect(seen[0]).toEqual([[[1], [2], [3]], 5, null, { parameterAddresses: ["'Paint line'!A1:A3", "", ""] }]);
    expect(seen[1]).toEqual([[[2]], null, 0, { parameterAddresses: ["'Paint line'!A2", "", "'Paint line'!C1"] }]);
    // A function whose metadata does not ask gets only its arguments, as before.
    expect(seen[2]).toEqual([[[1], [2], [3]]]);
  });

  it("lets REPORT's audit row name the range it read, as the addresses Excel gives", async () => {
    const functions = await catalogueFunctions();
    expect(functions.get("REPORT")?.parameterAddresses).toBe(true);
    const sheet = new Workbook([DEMO_SHEET]);
    sheet.writeEntries(DEMO_SHEET, 0, 0, demoRows());
    sheet.setFunctions(functions);
    sheet.writeEntries(DEMO_SHEET, 0, 5, [["=EVENSPLIT.REPORT($B$2:$B$26, 50)"]]);
    let audit: unknown;
    for (let row = 0; row < 60 && audit === undefined; row++)
      if (sheet.value(DEMO_SHEET, row, 5) === "Audit") audit = sheet.value(DEMO_SHEET, row, 6);
    expect(audit).toMatch(/; reads 'Paint line'!B2:B26; evaluated /);
  });
});
