/**
 * Planning a write before anything changes: Excel's limits, checked at their
 * edges (Microsoft, "Excel specifications and limits": 1,048,576 rows by
 * 16,384 columns, 32,767 characters in a cell, 8,192 characters of formula
 * contents; 255 characters for a text value inside a formula, from Excel's
 * own refusal message, from memory), long header names shortened in the
 * wording but never in references, and names that avoid those in use.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import type { BlockRequest } from "../../src/report/resultBlock";
import { LAST_COLUMN, LAST_ROW } from "../../src/taskpane/a1";
import { createHost } from "../../src/taskpane/host";
import { analyzeRange, placeFromText, planWrite, type DataChoice, type WritePlan } from "../../src/taskpane/workflow";
import {
  cellContentProblem,
  companionNames,
  formulaTexts,
  freeBlockName,
  freeName,
  onSheet,
  tableHeaderProblem,
  wordingName,
} from "../../src/taskpane/writePlan";
import { catalogueFunctions } from "../demo/catalogue";

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
};

/** The demo data with the thickness column's header replaced. */
async function choiceWithHeader(header: string): Promise<DataChoice> {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  workbook.writeEntries(DEMO_SHEET, 0, 1, [[header]]);
  workbook.setFunctions(functions);
  const analysis = await analyzeRange(createHost(fakeRun(workbook)), "B1:B25");
  if (!analysis.ok) throw new Error(analysis.message);
  return { range: analysis.range, useHeader: true };
}

function writePlan(choice: DataChoice, overrides: Partial<WritePlan> = {}): WritePlan {
  const request = { ...SIGN, dataName: choice.range.header ?? undefined };
  return {
    choices: [choice],
    reference: "exact",
    request,
    target: { sheet: DEMO_SHEET, rect: { top: 0, left: 4, bottom: 19, right: 5 } },
    chart: false,
    consent: null,
    calculate: callFunction,
    ...overrides,
  };
}

describe("Excel's limits, at their edges", () => {
  it("reads the text values inside a formula, with doubled quotes as one (Excel's formula syntax)", () => {
    expect(formulaTexts('=IF(A1<=0.05,"Reject ""H0""","Keep")')).toEqual(['Reject "H0"', "Keep"]);
    expect(formulaTexts("=COUNT($B$2:$B$25)")).toEqual([]);
    expect(formulaTexts('=""')).toEqual([""]);
  });

  it("takes a formula of 8,192 characters and refuses 8,193", () => {
    const longest = `=${"1+".repeat(4094)}111`;
    expect(longest.length).toBe(8192);
    expect(cellContentProblem(longest)).toBeNull();
    expect(cellContentProblem(`${longest}1`)).toMatch(/8193 characters; Excel takes at most 8,192/);
  });

  it("takes a text value of 255 characters inside a formula and refuses 256", () => {
    expect(cellContentProblem(`=IF(TRUE,"${"a".repeat(255)}")`)).toBeNull();
    expect(cellContentProblem(`=IF(TRUE,"${"a".repeat(256)}")`)).toMatch(/text of 256 characters/);
    // A doubled quote is one character of the text.
    expect(cellContentProblem(`=IF(TRUE,"${'""'.repeat(255)}")`)).toBeNull();
  });

  it("takes cell text of 32,767 characters and refuses 32,768; a leading apostrophe is not part of the text", () => {
    expect(cellContentProblem("x".repeat(32_767))).toBeNull();
    expect(cellContentProblem(`'${"x".repeat(32_767)}`)).toBeNull();
    expect(cellContentProblem("x".repeat(32_768))).toMatch(/32768 characters/);
  });

  it("knows the sheet's last row and column", () => {
    expect(LAST_ROW + 1).toBe(1_048_576);
    expect(LAST_COLUMN + 1).toBe(16_384);
    expect(onSheet({ top: LAST_ROW - 19, left: LAST_COLUMN - 1, bottom: LAST_ROW, right: LAST_COLUMN })).toBe(true);
    expect(onSheet({ top: LAST_ROW - 18, left: 0, bottom: LAST_ROW + 1, right: 1 })).toBe(false);
    expect(onSheet({ top: 0, left: LAST_COLUMN, bottom: 19, right: LAST_COLUMN + 1 })).toBe(false);
  });
});

describe("names", () => {
  it("picks the first free name without regard to case, as the workbook compares names", () => {
    expect(freeName("Table", [])).toBe("Table1");
    expect(freeName("Table", ["Table1", "TABLE2", "Table4"])).toBe("Table3");
  });

  it("refuses headers a table would rename: duplicates, blanks, spaces at the ends, line breaks", () => {
    expect(tableHeaderProblem(["Before", "After"])).toBeNull();
    expect(tableHeaderProblem(["Before", "before"])).toMatch(/both named/);
    expect(tableHeaderProblem(["Before ", "After"])).toMatch(/spaces at its ends/);
    expect(tableHeaderProblem(["", "After"])).toMatch(/spaces at its ends or a line break/);
    expect(tableHeaderProblem(["Line\nbreak"])).toMatch(/line break/);
  });

  it("shortens long names for the wording only", () => {
    expect(wordingName("Thickness (µm)")).toBe("Thickness (µm)");
    const long = wordingName("µ".repeat(300));
    expect([...long]).toHaveLength(60);
    expect(long.endsWith("…")).toBe(true);
  });
});

describe("planning a whole write", () => {
  it("refuses a block past the last column (top-left XFD1) before anything is read or written", async () => {
    const choice = await choiceWithHeader("Thickness (µm)");
    const target = placeFromText("XFD1", DEMO_SHEET, 20);
    if (!target) throw new Error("XFD1 is an address");
    expect(target.rect.right).toBe(LAST_COLUMN + 1);
    expect(planWrite(writePlan(choice, { target }), [], [])).toEqual({
      ok: false,
      message: expect.stringMatching(/does not fit on the sheet/),
    });
    const low = placeFromText("E1048570", DEMO_SHEET, 20);
    if (!low) throw new Error("E1048570 is an address");
    expect(planWrite(writePlan(choice, { target: low }), [], [])).toMatchObject({ ok: false });
  });

  it("refuses a chart that would run past the edge, and plans it when it fits", async () => {
    const choice = await choiceWithHeader("Thickness (µm)");
    const nearEdge = placeFromText("XFA1", DEMO_SHEET, 20);
    if (!nearEdge) throw new Error("XFA1 is an address");
    expect(planWrite(writePlan(choice, { target: nearEdge }), [], [])).toMatchObject({ ok: true });
    expect(planWrite(writePlan(choice, { target: nearEdge, chart: true }), [], [])).toEqual({
      ok: false,
      message: expect.stringMatching(/chart beside the block would run past the edge/),
    });
    // A chart already named "Evensplit chart 1" takes number 1 away from the block, its chart and its helper cells together.
    const planned = planWrite(writePlan(choice, { chart: true }), ["Evensplit chart 1"], []);
    if (!planned.ok) throw new Error(planned.message);
    expect(planned.write.blockName).toBe("Evensplit_block_2");
    // Without a place found on the sheet, the helper cells start two columns right of the block (E1): H, the chart at L.
    expect(planned.write.chart).toMatchObject({
      name: "Evensplit chart 2",
      area: { top: 0, left: 11, bottom: 14, right: 17 },
      helper: { name: "Evensplit_chartcells_2", rect: { top: 0, left: 7 } },
    });
    const further = planWrite(writePlan(choice, { chart: true }), [], [], 20);
    if (!further.ok) throw new Error(further.message);
    expect(further.write.chart).toMatchObject({ area: { left: 24 }, helper: { rect: { left: 20 } } });
  });

  it("ties a block's chart and helper cells to it by one number", () => {
    expect(companionNames("Evensplit_block_3")).toEqual({ chart: "Evensplit chart 3", helper: "Evensplit_chartcells_3" });
    expect(freeBlockName([])).toBe("Evensplit_block_1");
    expect(freeBlockName(["evensplit_block_1", "Evensplit_chartcells_2"])).toBe("Evensplit_block_3");
  });

  it("shortens a 300-character header in the wording, keeps it whole in the table reference, and every cell fits Excel's limits", async () => {
    const header = `Coating thickness ${"measured again ".repeat(20)}(µm)`.slice(0, 300);
    expect(header).toHaveLength(300);
    const choice = await choiceWithHeader(header);
    const planned = planWrite(writePlan(choice, { reference: "table" }), ["Table1"], []);
    if (!planned.ok) throw new Error(planned.message);
    const { write } = planned;
    expect(write.tables).toEqual([
      { name: "Table2", sheet: DEMO_SHEET, rect: { top: 0, left: 1, bottom: 24, right: 1 }, columns: [header] },
    ]);
    expect(write.refs.data).toContain(header);
    const cells = write.block.formulas.flat();
    expect(cells.every((cell) => cellContentProblem(cell) === null)).toBe(true);
    const decision = cells.find((cell) => cell.startsWith("=IF("));
    expect(decision).toContain(header);
    expect(formulaTexts(decision ?? "").every((text) => text.length <= 255)).toBe(true);
    const question = write.rows.find((r) => r.key === "question");
    expect(question?.formula).toContain(wordingName(header));
    expect(question?.formula).not.toContain(header);
    // The unshortened wording would have broken the 255-character limit inside the decision's formula.
    const unshortened = `Reject H0: evidence that the median of ${header} is above 50`;
    expect(unshortened.length).toBeGreaterThan(255);
  });

  it("names the block after those in use and replaces the earlier block it overlaps", async () => {
    const choice = await choiceWithHeader("Thickness (µm)");
    const earlier = [
      { name: "Evensplit_block_1", sheet: DEMO_SHEET, rect: { top: 0, left: 4, bottom: 22, right: 5 } },
      { name: "Evensplit_block_2", sheet: DEMO_SHEET, rect: { top: 0, left: 9, bottom: 22, right: 10 } },
    ];
    const planned = planWrite(writePlan(choice), ["Evensplit_block_1", "Evensplit_block_2"], earlier);
    if (!planned.ok) throw new Error(planned.message);
    expect(planned.write.blockName).toBe("Evensplit_block_3");
    expect(planned.write.replaces).toEqual([earlier[0]]);
  });
});
