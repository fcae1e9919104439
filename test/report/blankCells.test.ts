/**
 * Blank cells that arrive as zeros. Some Excel builds pass the blank cells of
 * a range argument to an add-in's function as 0 (office-js issues 5262, 4702
 * and 1951: "Excel sends 0 for empty cells"), while the sheet's own COUNT
 * still skips blanks (Microsoft, "COUNT function": "counts the number of
 * cells that contain numbers"). The block's check row compares the two; here
 * the demo sheet plays such a build by handing the catalogue 0 for every
 * blank cell of a range, and plays an honest one by handing it "".
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { BLANK_CHECK_WORDS, blockFormula, blockValue, resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";
import { catalogueFunctions } from "../demo/catalogue";

const SHEET = "Paint line";

/** Invented coating thicknesses (µm) with two blank cells (rows 4 and 7) and no measured zero. */
const THICKNESS: (number | null)[] = [51.2, 48.7, 53.1, null, 50.4, 52.9, null, 49.8, 54.6, 51.7];
/** A second invented measurement of the same panels, with its own blank (row 9). */
const AFTER: (number | null)[] = [50.1, 48.2, 52.0, 50.3, 49.9, 52.1, 51.0, 49.0, null, 50.5];

const ONE_SAMPLE: BlockRequest = {
  test: "sign",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  dataName: "Thickness",
};
const PAIRED: BlockRequest = { ...ONE_SAMPLE, paired: true, center: 0, alternative: "two-sided", secondName: "After" };

let honest: Map<string, CustomFunction>;
let zeroForBlank: Map<string, CustomFunction>;

/** What a build that passes blanks as 0 hands the function: every empty cell of a range becomes 0. */
function blanksAsZeros(arg: unknown): unknown {
  return Array.isArray(arg) ? arg.map((row: unknown[]) => row.map((cell) => (cell === "" || cell === null ? 0 : cell))) : arg;
}

beforeAll(async () => {
  honest = await catalogueFunctions();
  zeroForBlank = new Map(
    [...honest].map(([id, custom]) => [id, { ...custom, fn: (...args: unknown[]) => custom.fn(...args.map(blanksAsZeros)) }] as const),
  );
});

function sheet(functions: Map<string, CustomFunction>): Workbook {
  const workbook = new Workbook([SHEET]);
  workbook.writeEntries(SHEET, 0, 0, [["Thickness", "After"], ...THICKNESS.map((x, i) => [x ?? "", AFTER[i] ?? ""])]);
  workbook.setFunctions(functions);
  return workbook;
}

/** The value the sheet calculates for the block's check row, written as the pane writes it. */
function checkRowInSheet(workbook: Workbook, request: BlockRequest, refs: { data: string; second?: string }): unknown {
  const check = resultBlockRows(request).find((r) => r.key === "blanks")!;
  workbook.writeEntries(SHEET, 0, 4, [[blockFormula(check.value, refs)]]);
  return workbook.value(SHEET, 0, 4);
}

describe("the block's blank-cell check in the sheet", () => {
  it("warns when this Excel passes blank cells as zeros (one sample, fixed cells and a table column)", () => {
    expect(checkRowInSheet(sheet(zeroForBlank), ONE_SAMPLE, { data: "$A$2:$A$11" })).toBe(BLANK_CHECK_WORDS.differ);
    const inTable = sheet(zeroForBlank);
    inTable.addTable(SHEET, { top: 0, left: 0, bottom: 10, right: 1 });
    expect(checkRowInSheet(inTable, ONE_SAMPLE, { data: "Table1[Thickness]" })).toBe(BLANK_CHECK_WORDS.differ);
  });

  it("warns for pairs when either range has a blank passed as zero", () => {
    expect(checkRowInSheet(sheet(zeroForBlank), PAIRED, { data: "$A$2:$A$11", second: "$B$2:$B$11" })).toBe(BLANK_CHECK_WORDS.differ);
  });

  it("agrees when blanks arrive as blanks, also for a reference running on to the end of the sheet", () => {
    expect(checkRowInSheet(sheet(honest), ONE_SAMPLE, { data: "$A$2:$A$11" })).toBe(BLANK_CHECK_WORDS.agree);
    expect(checkRowInSheet(sheet(honest), ONE_SAMPLE, { data: "$A$2:$A$1048576" })).toBe(BLANK_CHECK_WORDS.agree);
    expect(checkRowInSheet(sheet(honest), PAIRED, { data: "$A$2:$A$11", second: "$B$2:$B$11" })).toBe(BLANK_CHECK_WORDS.agree);
  });

  it("agrees when the range holds measured zeros and no blank", () => {
    const workbook = new Workbook([SHEET]);
    workbook.writeEntries(SHEET, 0, 0, [["Offset"], [0], [1.5], [-0.5], [0]]);
    workbook.setFunctions(zeroForBlank);
    expect(checkRowInSheet(workbook, { ...ONE_SAMPLE, center: 0 }, { data: "$A$2:$A$5" })).toBe(BLANK_CHECK_WORDS.agree);
  });
});

describe("the same check in REPORT (direct evaluation)", () => {
  const honestCells = THICKNESS.map((x) => [x ?? ""]);
  const zeroCells = THICKNESS.map((x) => [x ?? 0]);
  const checkOf = (report: unknown[][]): unknown => report.find((r) => String(r[0]).startsWith("Blank cells"))![1];

  it("says nothing is wrong when the cells arrive with their blanks", () => {
    expect(checkOf(callFunction("REPORT", [honestCells, 50, "greater"]) as unknown[][])).toBe(BLANK_CHECK_WORDS.agree);
  });

  it("warns when cells arrive as 0, since inside one cell a blank passed as 0 looks like a measured 0", () => {
    const words = checkOf(callFunction("REPORT", [zeroCells, 50, "greater"]) as unknown[][]);
    // Two cells arrived as 0; 10 numbers were read (hand count of zeroCells).
    expect(words).toMatch(
      /^Cannot be checked inside REPORT: 2 cells arrived as 0\. If the sheet's COUNT of the range is less than 10, this Excel passed blank cells as zeros; use a table column/,
    );
  });

  it("in the pane's preview, which reads the sheet itself (a blank is empty there), measured zeros raise no question", () => {
    const check = resultBlockRows(ONE_SAMPLE).find((r) => r.key === "blanks")!;
    expect(blockValue(check.value, { data: honestCells }, callFunction)).toBe(BLANK_CHECK_WORDS.agree);
    expect(blockValue(check.value, { data: [[0], [1.5], [-0.5]] }, callFunction)).toBe(BLANK_CHECK_WORDS.agree);
  });
});
