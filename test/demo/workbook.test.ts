/**
 * The demo workbook: entries, recalculation, spilling, tables and the Excel
 * stand-in's batching. Expected behaviour is Excel's as documented
 * (Microsoft, "Dynamic array formulas and spilled array behavior"; "Overview
 * of Excel tables": automatic expansion; "Excel JavaScript object model":
 * load/sync) — the details of #SPILL! placement from memory.
 */
import { describe, expect, it } from "vitest";
import { FakeApiError, fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { createHost } from "../../src/taskpane/host";

const S = "Paint line";

function sheetWith(rows: unknown[][]): Workbook {
  const workbook = new Workbook([S]);
  workbook.writeEntries(S, 0, 0, rows);
  return workbook;
}

const counts: CustomFunction = {
  // A stand-in with the catalogue's COUNTS shape: one row below, tied, above, used.
  fn: (data: unknown, center: unknown) => {
    const values = (data as unknown[][]).flat().filter((v): v is number => typeof v === "number");
    const c = center as number;
    const below = values.filter((v) => v < c).length;
    const above = values.filter((v) => v > c).length;
    return [[below, values.length - below - above, above, below + above]];
  },
  shapes: ["matrix", "scalar"],
  result: "matrix",
};

describe("entries and recalculation", () => {
  it("reads typed entries as the spreadsheet does", () => {
    const w = sheetWith([["50", "'50", "TRUE", "=1+1", "text", ""]]);
    expect([0, 1, 2, 3, 4, 5].map((c) => w.value(S, 0, c))).toEqual([50, "50", true, 2, "text", null]);
    expect(w.entry(S, 0, 3)).toBe("=1+1");
  });

  it("recalculates dependent formulas after every change", () => {
    const w = sheetWith([[1], [2], ["=A1+A2"], ["=A3*10"]]);
    expect(w.value(S, 3, 0)).toBe(30);
    w.writeEntries(S, 0, 0, [[5]]);
    expect(w.value(S, 3, 0)).toBe(70);
  });

  it("answers a circular reference with an error instead of looping", () => {
    const w = sheetWith([["=A2"], ["=A1"]]);
    expect((w.value(S, 0, 0) as { code: string }).code).toBe("#REF!");
  });

  it("spills a one-row answer to the right, and shows #SPILL! when a cell is in the way", () => {
    const w = sheetWith([[49], [51], [50], [52], ["=EVENSPLIT.COUNTS(A1:A4,50)"]]);
    w.setFunctions(new Map([["COUNTS", counts]]));
    expect([0, 1, 2, 3].map((c) => w.value(S, 4, c))).toEqual([1, 1, 2, 3]);
    expect(w.entry(S, 4, 2)).toBe(""); // spilled cells hold no entry of their own
    w.writeEntries(S, 4, 2, [["in the way"]]);
    expect((w.value(S, 4, 0) as { code: string }).code).toBe("#SPILL!");
    expect(w.value(S, 4, 1)).toBeNull();
  });

  it("lets other formulas read spilled cells", () => {
    const w = sheetWith([[49], [51], [52], ["=EVENSPLIT.COUNTS(A1:A3,50)"], ["=C4*2"]]);
    w.setFunctions(new Map([["COUNTS", counts]]));
    expect(w.value(S, 4, 0)).toBe(4);
  });
});

describe("tables", () => {
  it("names tables Table1, Table2, ... and refuses overlapping ones", () => {
    const w = sheetWith([
      ["x", "y"],
      [1, 2],
      [3, 4],
    ]);
    expect(w.addTable(S, { top: 0, left: 0, bottom: 2, right: 0 }).name).toBe("Table1");
    expect(w.addTable(S, { top: 0, left: 1, bottom: 2, right: 1 }).name).toBe("Table2");
    expect(() => w.addTable(S, { top: 0, left: 0, bottom: 1, right: 1 })).toThrow(/overlap/);
  });

  it("grows when a person types in the row just below, and structured references follow", () => {
    const w = sheetWith([["Value"], [1], [2], [], [], ["=COUNT(Table1[Value])", "=ROWS(Table1[Value])"]]);
    w.addTable(S, { top: 0, left: 0, bottom: 2, right: 0 });
    expect([w.value(S, 5, 0), w.value(S, 5, 1)]).toEqual([2, 2]);
    w.writeEntries(S, 3, 0, [[7]], true);
    expect(w.tables[0].rect.bottom).toBe(3);
    expect([w.value(S, 5, 0), w.value(S, 5, 1)]).toEqual([3, 3]);
    // A write from code (not typing) does not grow the table.
    w.writeEntries(S, 4, 0, [[8]]);
    expect(w.tables[0].rect.bottom).toBe(3);
  });

  it('grows by every row of a paste just below it, down to the last row with an entry (Microsoft, "Overview of Excel tables")', () => {
    const w = sheetWith([["Value"], [1], [2]]);
    w.addTable(S, { top: 0, left: 0, bottom: 2, right: 0 });
    w.writeEntries(S, 3, 0, [["4"], ["5"], ["6"], [""]], true);
    expect(w.tables[0].rect.bottom).toBe(5);
  });

  it("grows when a row typed across several columns has an entry under the table's column, and not otherwise", () => {
    // The demo's "Add a panel row" writes A:C; a table the pane made on column B must grow with it.
    const w = sheetWith([
      ["Panel", "Value", "Note"],
      ["P-1", 1, ""],
      ["P-2", 2, ""],
    ]);
    w.addTable(S, { top: 0, left: 1, bottom: 2, right: 1 });
    w.writeEntries(S, 3, 0, [["P-3", 3, "new"]], true);
    expect(w.tables[0].rect.bottom).toBe(3);
    w.writeEntries(S, 4, 0, [["P-4", "", "no value"]], true);
    expect(w.tables[0].rect.bottom).toBe(3);
  });

  it("keeps a chart series set to a table's column linked to the table as it grows", () => {
    const w = sheetWith([["Value"], [1], [2]]);
    w.addTable(S, { top: 0, left: 0, bottom: 2, right: 0 });
    const body = w.seriesLink(S, { top: 1, left: 0, bottom: 2, right: 0 });
    const withHeader = w.seriesLink(S, { top: 0, left: 0, bottom: 2, right: 0 });
    const part = w.seriesLink(S, { top: 1, left: 0, bottom: 1, right: 0 });
    w.writeEntries(S, 3, 0, [[3]], true);
    expect(w.linkedRect(body)).toEqual({ top: 1, left: 0, bottom: 3, right: 0 });
    expect(w.linkedRect(withHeader)).toEqual({ top: 0, left: 0, bottom: 3, right: 0 });
    // Cells that are only part of the column stay as they were.
    expect(w.linkedRect(part)).toEqual({ top: 1, left: 0, bottom: 1, right: 0 });
  });
});

describe("the Excel stand-in", () => {
  it("throws on a property read before load and sync, as Office.js does", async () => {
    const w = sheetWith([[1]]);
    await fakeRun(w)(async (context) => {
      const range = context.workbook.getSelectedRange();
      // Reading too early on purpose: the stand-in must refuse it as Office.js does.
      // eslint-disable-next-line office-addins/call-sync-before-read, office-addins/load-object-before-read
      expect(() => range.address).toThrow(FakeApiError);
      range.load("address");
      // eslint-disable-next-line office-addins/call-sync-before-read, office-addins/call-sync-after-load
      expect(() => range.address).toThrow(/not available/);
      await context.sync();
      expect(range.address).toBe("'Paint line'!A1");
    });
  });

  it("applies queued writes only at sync, and recalculates once per sync", async () => {
    const w = sheetWith([[1], [2]]);
    const before = w.recalculations;
    await fakeRun(w)(async (context) => {
      const range = context.workbook.worksheets.getItem(S).getRange("B1:B2");
      range.formulas = [["=A1*2"], ["=A2*2"]];
      range.numberFormat = [["0.00"], ["0.00"]];
      range.getRow(0).format.font.bold = true;
      expect(w.value(S, 0, 1)).toBeNull();
      await context.sync();
      expect(w.value(S, 0, 1)).toBe(2);
    });
    expect(w.recalculations - before).toBe(1);
    expect(w.format(S, 0, 1)).toEqual({ numberFormat: "0.00", bold: true, italic: false, color: null });
  });

  it("reports an unknown sheet at sync with ItemNotFound", async () => {
    const w = sheetWith([[1]]);
    await expect(
      fakeRun(w)(async (context) => {
        context.workbook.worksheets.getItem("Nope").load("name");
        await context.sync();
      }),
    ).rejects.toMatchObject({ code: "ItemNotFound" });
  });

  it("serves the host module: read, used range, tables", async () => {
    const w = sheetWith([["Thickness"], [51], [""], ["note"]]);
    const host = createHost(fakeRun(w));
    expect(await host.read("A1:A4")).toEqual({
      sheet: S,
      rect: { top: 0, left: 0, bottom: 3, right: 0 },
      values: [["Thickness"], [51], [""], ["note"]],
      formulas: [["Thickness"], [51], [""], ["note"]],
    });
    expect(await host.usedRect(S)).toEqual({ top: 0, left: 0, bottom: 3, right: 0 });
    expect(await host.tables(S)).toEqual([]);
    w.addTable(S, { top: 0, left: 0, bottom: 3, right: 0 });
    expect(await host.tables(S)).toEqual([
      { name: "Table1", sheet: S, rect: { top: 0, left: 0, bottom: 3, right: 0 }, columns: ["Thickness"] },
    ]);
    expect(await createHost(fakeRun(new Workbook([S]))).usedRect(S)).toBeNull();
  });
});

describe("recalculating only what depends on a change", () => {
  /** A custom function that counts its calls: the sum of its numbers. */
  function counted(): { calls: () => number; fn: CustomFunction } {
    let calls = 0;
    return {
      calls: () => calls,
      fn: {
        fn: (data: unknown) => {
          calls++;
          return (data as unknown[][]).flat().reduce((sum: number, v) => sum + (typeof v === "number" ? v : 0), 0);
        },
        shapes: ["matrix"],
        result: "scalar",
      },
    };
  }

  it("calls again only the functions whose ranges hold the changed cell, and gets the same answers as a full recalculation", () => {
    const sum = counted();
    const w = sheetWith([
      [1, 10, "=EVENSPLIT.SUM(A1:A3)", "=EVENSPLIT.SUM(B1:B3)"],
      [2, 20],
      [3, 30],
    ]);
    w.setFunctions(new Map([["SUM", sum.fn]]));
    const before = sum.calls();
    w.writeEntries(S, 1, 0, [[5]], true);
    // Exact arithmetic: 1 + 5 + 3 = 9; column B untouched (60), and its formula not called again.
    expect([w.value(S, 0, 2), w.value(S, 0, 3)]).toEqual([9, 60]);
    expect(sum.calls() - before).toBe(1);
    w.recalculate();
    expect([w.value(S, 0, 2), w.value(S, 0, 3)]).toEqual([9, 60]);
  });

  it("follows chains of formulas, spilled answers and whole columns", () => {
    const w = sheetWith([[2, "=A1*10", "=B1+1", "=COUNT(A:A)"]]);
    w.setFunctions(new Map([["COUNTS", counts]]));
    w.writeEntries(S, 3, 4, [["=EVENSPLIT.COUNTS(A1:A3, 2)", null, null, null, "=INDEX(E4:H4,1,3)+100"]]);
    expect([w.value(S, 0, 2), w.value(S, 0, 3), w.value(S, 3, 8)]).toEqual([21, 1, 100]);
    w.writeEntries(S, 0, 0, [[3]], true);
    expect(w.value(S, 0, 2)).toBe(31);
    // Above 2 now: the spilled row's third cell, read by I4, changes with it.
    expect(w.value(S, 3, 8)).toBe(101);
    w.writeEntries(S, 999, 0, [[7]], true);
    expect(w.value(S, 0, 3)).toBe(2);
  });

  it("gets many dependents right too, where it recalculates everything instead of tracing them", () => {
    const rows = Array.from({ length: 600 }, (_, r) => [r, `=A${r + 1}+1`]);
    const w = sheetWith(rows);
    w.writeEntries(
      S,
      0,
      0,
      rows.map((_, r) => [r * 2]),
      true,
    );
    // Exact arithmetic: B600 = A600 + 1 = 599 × 2 + 1.
    expect(w.value(S, 599, 1)).toBe(1199);
    w.writeEntries(S, 0, 0, [[-5]], true);
    expect([w.value(S, 0, 1), w.value(S, 599, 1)]).toEqual([-4, 1199]);
  });

  it("frees the cells a spilled answer covered when its formula is written over", () => {
    const w = sheetWith([[1], [2], [3]]);
    w.setFunctions(new Map([["COUNTS", counts]]));
    w.writeEntries(S, 5, 0, [["=EVENSPLIT.COUNTS(A1:A3, 2)", null, null, null, "=B6+C6"]]);
    expect(w.value(S, 5, 4)).toBe(2);
    w.writeEntries(S, 5, 0, [["done"]], true);
    expect([w.value(S, 5, 1), w.value(S, 5, 4)]).toEqual([null, 0]);
  });
});
