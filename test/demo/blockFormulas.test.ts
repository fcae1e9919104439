/**
 * The result block two ways: its formulas (blockFormula) entered in the demo
 * sheet and calculated by the sheet's evaluator with the catalogue's
 * functions, against the block evaluated directly on the cells as REPORT does
 * (blockValue with callFunction, src/report/resultBlock.ts). The two must show
 * the same value on every row, for every test and reference form the pane
 * writes; this is what lets the demo sheet stand in for Excel.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { isError } from "../../src/demo/formula/values";
import { demoRows, DEMO_SHEET } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { isCellError } from "../../src/functions/runtime";
import { blockFormula, blockValue, resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";
import { catalogueFunctions } from "./catalogue";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

const BASE = { alpha: 0.05, confidence: 0.95, dataName: "Thickness (µm)" } as const;

const ONE_SAMPLE: BlockRequest[] = [
  { ...BASE, test: "sign", paired: false, center: 50, alternative: "two-sided" },
  { ...BASE, test: "sign", paired: false, center: 50, alternative: "greater", ties: "split", method: "midp" },
  { ...BASE, test: "sign", paired: false, center: 50, alternative: "less", ties: "conservative", method: "normal" },
  { ...BASE, test: "signed-rank", paired: false, center: 50, alternative: "greater", method: "auto", zeros: "pratt" },
  { ...BASE, test: "quantile", paired: false, center: 53, quantile: 0.9, alternative: "two-sided", confidence: 0.9 },
  { ...BASE, test: "sign", paired: false, center: 50, alternative: "greater", followsNewRows: true, watching: true },
  { ...BASE, test: "sign", paired: false, center: 50, alternative: "two-sided", ties: "split", followsNewRows: true, watching: false },
];

const PAIRED: BlockRequest[] = [
  { ...BASE, test: "sign", paired: true, center: 0, alternative: "two-sided", secondName: "After nozzle change (µm)" },
  { ...BASE, test: "signed-rank", paired: true, center: -1, alternative: "less", method: "exact" },
  { ...BASE, test: "sign", paired: true, center: 0, alternative: "greater", followsNewRows: true, watching: true },
  {
    ...BASE,
    test: "sign",
    paired: true,
    center: 0.5,
    alternative: "two-sided",
    ties: "conservative",
    followsNewRows: true,
    watching: false,
  },
];

/** A request in a test's name: the test, the alternative, and whether it is watched or follows new rows. */
function named(r: BlockRequest): string {
  const looking = r.watching === true ? ", watched" : r.followsNewRows === true ? ", follows new rows" : "";
  return `${r.test} ${r.alternative}${looking}`;
}

/** The body cells as Range.values gives them (blank as ""). */
function column(c: number): unknown[][] {
  return demoRows()
    .slice(1)
    .map((row) => [row[c] ?? ""]);
}

function sheetWithData(): Workbook {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  workbook.setFunctions(functions);
  return workbook;
}

/** Writes the block's formulas in column F from row 1 and returns what the sheet calculates for each row. */
function sheetValues(workbook: Workbook, request: BlockRequest, refs: { data: string; second?: string }): unknown[] {
  const rows = resultBlockRows(request);
  workbook.writeEntries(
    DEMO_SHEET,
    0,
    5,
    rows.map((row) => [blockFormula(row.value, refs)]),
  );
  return rows.map((_, i) => workbook.value(DEMO_SHEET, i, 5));
}

function expectSame(sheet: unknown, direct: unknown, label: string): void {
  if (label === "Audit") {
    // Differs by design after the method: the sheet's line names the references and the time of writing,
    // REPORT's the outline of the cells it got and the time of evaluation (test/report/auditRow.test.ts).
    expect(String(sheet).split("; reads ")[0], label).toBe(String(direct).split("; reads ")[0]);
    return;
  }
  if (isCellError(direct)) {
    expect(isError(sheet) ? sheet.code : sheet, label).toBe(direct.code);
  } else if (direct === "" || direct === null || direct === undefined) {
    expect(sheet === "" || sheet === null, label).toBe(true);
  } else {
    expect(sheet, label).toEqual(direct);
  }
}

describe("the block's formulas in the demo sheet agree with REPORT's direct evaluation", () => {
  it.each(ONE_SAMPLE.map((r) => [named(r), r] as const))("one sample, exact cells: %s", (_, request) => {
    const workbook = sheetWithData();
    const values = sheetValues(workbook, request, { data: "$B$2:$B$25" });
    resultBlockRows(request).forEach((row, i) =>
      expectSame(values[i], blockValue(row.value, { data: column(1) }, callFunction), row.label),
    );
  });

  it.each(ONE_SAMPLE.map((r) => [named(r), r] as const))("one sample, table column: %s", (_, request) => {
    const workbook = sheetWithData();
    workbook.addTable(DEMO_SHEET, { top: 0, left: 0, bottom: 24, right: 2 });
    const values = sheetValues(workbook, request, { data: "Table1[Thickness (µm)]" });
    resultBlockRows(request).forEach((row, i) =>
      expectSame(values[i], blockValue(row.value, { data: column(1) }, callFunction), row.label),
    );
  });

  it.each(PAIRED.map((r) => [named(r), r] as const))("pairs, exact cells and table columns: %s", (_, request) => {
    const direct = resultBlockRows(request).map((row) => blockValue(row.value, { data: column(1), second: column(2) }, callFunction));
    const exact = sheetValues(sheetWithData(), request, { data: "$B$2:$B$25", second: "$C$2:$C$25" });
    const inTable = sheetWithData();
    inTable.addTable(DEMO_SHEET, { top: 0, left: 0, bottom: 24, right: 2 });
    const structured = sheetValues(inTable, request, { data: "Table1[Thickness (µm)]", second: "Table1[After nozzle change (µm)]" });
    resultBlockRows(request).forEach((row, i) => {
      expectSame(exact[i], direct[i], row.label);
      expectSame(structured[i], direct[i], row.label);
    });
  });

  it.each([...ONE_SAMPLE, ...PAIRED].map((r) => [`${r.paired ? "pairs" : "one sample"} ${named(r)}`, r] as const))(
    "open-ended reference to the end of the sheet gives the same block as the exact cells: %s",
    (_, request) => {
      // The million blank rows below the data must change nothing: blanks are neither skipped cells nor pairs.
      const refs = { data: "$B$2:$B$25", second: "$C$2:$C$25" };
      const open = { data: "$B$2:$B$1048576", second: "$C$2:$C$1048576" };
      const exact = sheetValues(sheetWithData(), request, refs);
      const openEnded = sheetValues(sheetWithData(), request, open);
      resultBlockRows(request).forEach((row, i) => expectSame(openEnded[i], exact[i], row.label));
    },
  );

  it("gives the hand-counted numbers for the invented data", () => {
    // By hand from src/demo/inventedData.ts: 22 numbers, 1 cell skipped (the text note; blanks are not counted), 5 below 50, 1 tie, 16 above.
    const request = ONE_SAMPLE[0];
    const values = sheetValues(sheetWithData(), request, { data: "$B$2:$B$25" });
    const at = (key: string) => values[resultBlockRows(request).findIndex((r) => r.key === key)];
    expect([at("numbers"), at("skipped"), at("below"), at("tied"), at("above"), at("used")]).toEqual([22, 1, 5, 1, 16, 21]);
    // Two-sided exact sign test, 5 of 21 below: 2 * (C(21,0) + ... + C(21,5)) / 2^21 = 2 * 27896 / 2097152 (exact arithmetic).
    expect(at("pvalue") as number).toBeCloseTo((2 * 27896) / 2097152, 14);
  });
});
