/**
 * The pane's workbook steps against the demo sheet's Excel stand-in (the
 * fake host): reading and describing ranges, reference choices, the default
 * place, the overwrite check, table conversion, open-ended references, the
 * chart, and what ends up in the cells. Expected counts are by hand from the
 * invented data; expected formulas from the block's one definition
 * (resultBlock.ts).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { NUMBER_FORMATS, type BlockRequest } from "../../src/report/resultBlock";
import { createHost, type Host, type RunBatch } from "../../src/taskpane/host";
import {
  analyzeRange,
  bodyOf,
  dataProblem,
  defaultPlace,
  placeFromText,
  referenceOptions,
  writeResult,
  type AnalyzedRange,
  type DataChoice,
  type WritePlan,
} from "../../src/taskpane/workflow";
import { catalogueFunctions } from "../demo/catalogue";
import { itemsCollection, workbookMock } from "./officeMock";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

const SIGN: BlockRequest = {
  test: "sign",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  ties: "drop",
  method: "exact",
  dataName: "Thickness (µm)",
};

function demo(): { workbook: Workbook; host: Host } {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  workbook.setFunctions(functions);
  return { workbook, host: createHost(fakeRun(workbook)) };
}

async function analyzed(host: Host, address: string): Promise<AnalyzedRange> {
  const result = await analyzeRange(host, address);
  if (!result.ok) throw new Error(result.message);
  return result.range;
}

function plan(choices: DataChoice[], overrides: Partial<WritePlan> = {}): WritePlan {
  return {
    choices,
    reference: "exact",
    request: SIGN,
    target: { sheet: DEMO_SHEET, rect: { top: 0, left: 4, bottom: 21, right: 5 } },
    chart: false,
    consent: null,
    calculate: callFunction,
    ...overrides,
  };
}

describe("reading the data", () => {
  it("describes the thickness column: header, counts, no table", async () => {
    const { host } = demo();
    const range = await analyzed(host, "B1:B25");
    expect(range.header).toBe("Thickness (µm)");
    expect(range.place.kind).toBe("none");
    const body = bodyOf({ range, useHeader: true });
    expect(body.rect).toEqual({ top: 1, left: 1, bottom: 24, right: 1 });
    // By hand: 24 cells, 22 numbers, P-108 blank, P-113 a note.
    expect(body.tally).toEqual({ cells: 24, numbers: 22, skipped: { blank: 1, text: 1, boolean: 0, other: 0 } });
    expect(bodyOf({ range, useHeader: false }).tally.skipped.text).toBe(2);
  });

  it("cuts a whole column to the used rows and refuses text that is no address", async () => {
    const { host } = demo();
    expect((await analyzed(host, "B:B")).rect).toEqual({ top: 0, left: 1, bottom: 24, right: 1 });
    expect(await analyzeRange(host, "thickness")).toMatchObject({ ok: false, message: expect.stringContaining("not a range address") });
    expect(await analyzeRange(host, "'No such sheet'!A1")).toMatchObject({ ok: false });
  });

  it("recognises a table column and names it after the table's header", async () => {
    const { workbook, host } = demo();
    workbook.addTable(DEMO_SHEET, { top: 0, left: 0, bottom: 24, right: 2 });
    const range = await analyzed(host, "C2:C25");
    expect(range.place).toMatchObject({ kind: "column", match: { column: "After nozzle change (µm)", headerIncluded: false } });
    expect(referenceOptions([{ range, useHeader: true }]).allTableColumns).toBe(true);
  });

  it("checks that pairs line up", async () => {
    const { host } = demo();
    const first = await analyzed(host, "B1:B25");
    const short = await analyzed(host, "C1:C20");
    expect(
      dataProblem([
        { range: first, useHeader: true },
        { range: short, useHeader: true },
      ]),
    ).toMatch(/same shape/);
    const second = await analyzed(host, "C1:C25");
    expect(
      dataProblem([
        { range: first, useHeader: true },
        { range: second, useHeader: true },
      ]),
    ).toBeNull();
  });

  it("offers a table only with a header row, and open-ended pairs only when they start together", async () => {
    const { host } = demo();
    const noHeader = await analyzed(host, "B2:B25");
    expect(referenceOptions([{ range: noHeader, useHeader: false }]).table).toMatchObject({
      available: false,
      reason: expect.stringContaining("name"),
    });
    const first = await analyzed(host, "B1:B25");
    const second = await analyzed(host, "C2:C25");
    expect(
      referenceOptions([
        { range: first, useHeader: true },
        { range: second, useHeader: false },
      ]).open.available,
    ).toBe(true);
    const later = await analyzed(host, "C3:C26");
    expect(
      referenceOptions([
        { range: first, useHeader: true },
        { range: later, useHeader: false },
      ]).open.available,
    ).toBe(false);
  });
});

describe("the place for the block", () => {
  it("is the first empty area right of the data with a gap column, and moves past anything in the way", async () => {
    const { workbook, host } = demo();
    const range = await analyzed(host, "B1:B25");
    // Column C holds data, so D stays as the gap and the block starts in E.
    expect(await defaultPlace(host, [{ range, useHeader: true }], 20)).toEqual({
      sheet: DEMO_SHEET,
      rect: { top: 0, left: 4, bottom: 19, right: 5 },
    });
    workbook.writeEntries(DEMO_SHEET, 9, 5, [["note"]]);
    expect((await defaultPlace(host, [{ range, useHeader: true }], 20)).rect.left).toBe(7);
    expect(placeFromText("'Paint line'!J3", "Other", 20)).toEqual({ sheet: DEMO_SHEET, rect: { top: 2, left: 9, bottom: 21, right: 10 } });
    expect(placeFromText("somewhere", DEMO_SHEET, 20)).toBeNull();
  });
});

describe("writing the block", () => {
  it("writes formulas that the sheet calculates, labels bold, cautions in italics", async () => {
    const { workbook, host } = demo();
    const range = await analyzed(host, "B1:B25");
    const outcome = await writeResult(host, plan([{ range, useHeader: true }]));
    expect(outcome.kind).toBe("written");
    if (outcome.kind !== "written") return;
    expect(outcome.address).toBe("'Paint line'!E1:F22");
    expect(workbook.entry(DEMO_SHEET, 0, 4)).toBe("Evensplit result");
    const p = outcome.rows.findIndex((r) => r.key === "pvalue");
    expect(workbook.entry(DEMO_SHEET, p, 5)).toBe('=EVENSPLIT.PVALUE($B$2:$B$25,50,"greater","drop","exact")');
    // The sheet's answer is the preview's: P(X >= 16), X ~ Bin(21, 1/2) = 27896 / 2^21 (exact arithmetic).
    expect(workbook.value(DEMO_SHEET, p, 5)).toBeCloseTo(27896 / 2097152, 14);
    expect(outcome.rows[p].value).toBe(workbook.value(DEMO_SHEET, p, 5));
    // The block's own p-value format (resultBlock.ts), carried to the cell.
    expect(workbook.format(DEMO_SHEET, p, 5).numberFormat).toBe(NUMBER_FORMATS.pvalue);
    expect(workbook.format(DEMO_SHEET, p, 4).bold).toBe(true);
    const caution = outcome.rows.findIndex((r) => r.style === "caution");
    // Italic, in the automatic colour that follows the theme (a fixed grey failed the dark theme: paneDefects.test.ts).
    expect(workbook.format(DEMO_SHEET, caution, 5)).toMatchObject({ italic: true, color: null });
  });

  it("asks before replacing filled cells and writes nothing until confirmed", async () => {
    const { workbook, host } = demo();
    workbook.writeEntries(DEMO_SHEET, 4, 5, [["keep me"]]);
    const range = await analyzed(host, "B1:B25");
    const before = workbook.recalculations;
    const asked = await writeResult(host, plan([{ range, useHeader: true }]));
    expect(asked).toMatchObject({ kind: "confirm", consent: { filled: [{ address: "F5", content: "keep me" }] }, changed: false });
    expect(workbook.recalculations).toBe(before);
    expect(workbook.entry(DEMO_SHEET, 0, 4)).toBe("");
    if (asked.kind !== "confirm") return;
    const written = await writeResult(host, plan([{ range, useHeader: true }], { consent: asked.consent }));
    expect(written.kind).toBe("written");
    expect(workbook.entry(DEMO_SHEET, 4, 5)).not.toBe("keep me");
  });

  it("refuses a place that covers the data", async () => {
    const { host } = demo();
    const range = await analyzed(host, "B1:B25");
    const outcome = await writeResult(
      host,
      plan([{ range, useHeader: true }], { target: { sheet: DEMO_SHEET, rect: { top: 5, left: 0, bottom: 24, right: 1 } } }),
    );
    expect(outcome).toMatchObject({ kind: "refused" });
  });

  it("turns the range into a table when agreed, so a row typed below counts", async () => {
    const { workbook, host } = demo();
    const range = await analyzed(host, "B1:B25");
    const outcome = await writeResult(host, plan([{ range, useHeader: true }], { reference: "table", chart: true }));
    if (outcome.kind !== "written") throw new Error(outcome.kind);
    expect(outcome.created.map((t) => t.name)).toEqual(["Table1"]);
    expect(outcome.refs.data).toBe("Table1[[Thickness (µm)]]");
    // The helper cells take H1:J3 (after an empty column G), the chart floats over L1:R15.
    expect(outcome.chartAt).toBe("L1");
    expect(workbook.charts).toHaveLength(1);
    const n = outcome.rows.findIndex((r) => r.key === "numbers");
    expect(workbook.value(DEMO_SHEET, n, 5)).toBe(22);
    expect(workbook.value(DEMO_SHEET, 0, 9)).toBe(25);
    workbook.writeEntries(DEMO_SHEET, 25, 1, [[53]], true);
    expect(workbook.value(DEMO_SHEET, n, 5)).toBe(23);
    // The points follow the table's new row, and the lines now run to row 26.
    const [points] = workbook.charts[0].series;
    expect(points.values && workbook.linkedRect(points.values)).toEqual({ top: 1, left: 1, bottom: 25, right: 1 });
    expect(workbook.value(DEMO_SHEET, 0, 9)).toBe(26);
  });

  it("reads to the end of the sheet with an open-ended reference", async () => {
    const { workbook, host } = demo();
    const range = await analyzed(host, "B1:B25");
    const outcome = await writeResult(host, plan([{ range, useHeader: true }], { reference: "open" }));
    if (outcome.kind !== "written") throw new Error(outcome.kind);
    expect(outcome.refs.data).toBe("$B$2:$B$1048576");
    const n = outcome.rows.findIndex((r) => r.key === "numbers");
    workbook.writeEntries(DEMO_SHEET, 29, 1, [[48]]);
    expect(workbook.value(DEMO_SHEET, n, 5)).toBe(23);
  });

  it("writes a paired block referring to both columns, with a chart of the differences", async () => {
    const { workbook, host } = demo();
    const first = await analyzed(host, "B1:B25");
    const second = await analyzed(host, "C1:C25");
    const choices = [
      { range: first, useHeader: true },
      { range: second, useHeader: true },
    ];
    const request: BlockRequest = { test: "sign", paired: true, center: 0, alternative: "two-sided", alpha: 0.05, confidence: 0.95 };
    const outcome = await writeResult(host, plan(choices, { request, chart: true }));
    if (outcome.kind !== "written") throw new Error(outcome.kind);
    expect(outcome.refs).toEqual({ data: "$B$2:$B$25", second: "$C$2:$C$25" });
    const skipped = outcome.rows.findIndex((r) => r.key === "skipped");
    expect(workbook.value(DEMO_SHEET, skipped, 5)).toBe(2);
    const p = outcome.rows.findIndex((r) => r.key === "pvalue");
    // By hand: 18 negative differences, 3 positive, 1 zero: two-sided 2 * P(X <= 3), X ~ Bin(21, 1/2) = 2 * 1562 / 2^21.
    expect(workbook.value(DEMO_SHEET, p, 5)).toBeCloseTo((2 * 1562) / 2097152, 14);
    // Helper rows: line ends, H0, lower and upper bound (two-sided), then one difference per pair in column I.
    const [points, ...lines] = workbook.charts[0].series;
    expect(points.values).toEqual({ sheet: DEMO_SHEET, rect: { top: 4, left: 8, bottom: 27, right: 8 } });
    expect(lines.map((l) => l.name)).toEqual(["H0: median = 0", "95% lower bound", "95% upper bound"]);
    for (let r = 0; r < 24; r++) {
      const [b, c] = [workbook.value(DEMO_SHEET, r + 1, 1), workbook.value(DEMO_SHEET, r + 1, 2)];
      const difference = workbook.value(DEMO_SHEET, r + 4, 8);
      if (typeof b === "number" && typeof c === "number") expect(difference).toBeCloseTo(c - b, 12);
      else expect(difference).toMatchObject({ code: "#N/A" });
    }
  });
});

describe("writing the block through office-addin-mock", () => {
  function mockHost(target: { values: unknown[][]; formulas: unknown[][] }): { host: Host; written: () => unknown } {
    const sheet = {
      name: DEMO_SHEET,
      target: { address: "'Paint line'!E1:F22", ...target, numberFormat: [], format: { font: {} } },
      tables: itemsCollection([]),
      charts: itemsCollection([]),
      getRange(this: { target: unknown }) {
        return this.target;
      },
    };
    const mock = workbookMock(sheet) as unknown as {
      run: RunBatch;
      context: { workbook: { worksheets: { sheet: { target: { formulas: unknown } } } } };
    };
    return { host: createHost((batch) => mock.run(batch)), written: () => mock.context.workbook.worksheets.sheet.target.formulas };
  }

  it("stops at the overwrite check when a target cell holds something, before any write", async () => {
    const { host: demoHost } = demo();
    const range = await analyzed(demoHost, "B1:B25");
    const blank = (): unknown[][] => Array.from({ length: 22 }, () => ["", ""]);
    const values = blank();
    values[3][1] = 0.5;
    const formulas = blank();
    formulas[3][1] = "=A1/2";
    const { host, written } = mockHost({ values, formulas });
    const outcome = await writeResult(host, plan([{ range, useHeader: true }]));
    expect(outcome).toMatchObject({ kind: "confirm", consent: { filled: [{ address: "F4", content: "=A1/2" }] } });
    expect(written()).toBe(formulas);
  });
});
