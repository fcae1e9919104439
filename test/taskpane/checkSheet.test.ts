/**
 * The installation check's sheet (src/taskpane/checkSheet.ts) written through the host into the demo
 * workbook, whose evaluator calculates each case's formula with the catalogue's functions: every case shows
 * pass, a function off by one part in a million makes exactly its own cases show fail, and the header states
 * the versions, the platform and the time as fixed text. Sheet names follow Excel's rules (src/demo/limits.ts).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { sheetNameRefusal } from "../../src/demo/limits";
import { REFERENCE_CASES } from "../../src/report/installationCheck";
import { auditTime } from "../../src/report/resultBlock";
import { EVENSPLIT_VERSION } from "../../src/report/version";
import {
  CHECK_CAUTIONS,
  CHECK_SHEET_NAME,
  checkSheetContent,
  environmentFrom,
  NOT_REPORTED,
  uniqueSheetName,
  writeCheckSheet,
  type CheckFacts,
} from "../../src/taskpane/checkSheet";
import { createHost } from "../../src/taskpane/host";
import { catalogueFunctions } from "../demo/catalogue";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

const FACTS: CheckFacts = {
  evensplitVersion: EVENSPLIT_VERSION,
  excelVersion: "16.0.17928.20114",
  platform: "PC (Excel on Windows)",
  exactStep: "webassembly",
  checkedAt: new Date(Date.UTC(2026, 11, 2, 8, 15, 30)),
};
const LAYOUT = checkSheetContent(REFERENCE_CASES, FACTS).layout;

/** One function of the catalogue answering every number off by one part in a million, as a broken build would. */
function perturbed(id: string): Map<string, CustomFunction> {
  const nudge = (value: unknown): unknown =>
    typeof value === "number" ? value * (1 + 1e-6) : Array.isArray(value) ? value.map(nudge) : value;
  const original = functions.get(id) as CustomFunction;
  return new Map(functions).set(id, { ...original, fn: (...args) => nudge(original.fn(...args)) });
}

function workbookWith(fns: Map<string, CustomFunction>, sheets = ["Paint line"]): Workbook {
  const workbook = new Workbook(sheets);
  workbook.setFunctions(fns);
  return workbook;
}

function resultsOf(workbook: Workbook, sheet: string): unknown[] {
  return REFERENCE_CASES.map((_, i) => workbook.value(sheet, LAYOUT.firstCaseRow + i, LAYOUT.resultColumn));
}

describe("the check sheet's name", () => {
  it("is ours, with (2), (3), … when taken, compared without regard to case, never past 31 characters", () => {
    expect(uniqueSheetName(CHECK_SHEET_NAME, ["Sheet1"])).toBe("Evensplit check");
    expect(uniqueSheetName(CHECK_SHEET_NAME, ["EVENSPLIT CHECK", "Evensplit check (2)"])).toBe("Evensplit check (3)");
    const long = "x".repeat(31);
    expect(uniqueSheetName(long, [long])).toBe(`${"x".repeat(27)} (2)`);
    for (const name of [uniqueSheetName(long, [long]), uniqueSheetName(CHECK_SHEET_NAME, ["Evensplit check"])]) {
      expect(sheetNameRefusal(name, [long, "Evensplit check"])).toBeNull();
    }
  });
});

describe('Excel\'s version and platform (Microsoft, "Office.ContextInformation interface")', () => {
  it("are taken as reported, the platform with words, and are null when missing or empty", () => {
    expect(environmentFrom({ version: "16.0.17928.20114", platform: "OfficeOnline" })).toEqual({
      excelVersion: "16.0.17928.20114",
      platform: "OfficeOnline (Excel on the web)",
    });
    expect(environmentFrom({ version: 16, platform: "SomethingNew" })).toEqual({ excelVersion: null, platform: "SomethingNew" });
    expect(environmentFrom(undefined)).toEqual({ excelVersion: null, platform: null });
    expect(environmentFrom({ version: " ", platform: null })).toEqual({ excelVersion: null, platform: null });
  });

  it('show as "not reported" on the sheet when missing', () => {
    const { formulas } = checkSheetContent(REFERENCE_CASES, { ...FACTS, ...environmentFrom(undefined) });
    expect(formulas.slice(1, 6).map((row) => row.slice(0, 2))).toEqual([
      ["Evensplit version", EVENSPLIT_VERSION],
      ["Excel version", NOT_REPORTED],
      ["Platform", NOT_REPORTED],
      ["Exact signed-rank step", "WebAssembly"],
      ["Checked at", "2026-12-02 08:15:30 UTC"],
    ]);
  });

  it("says when the exact signed-rank step falls back to JavaScript, and what that means", () => {
    const { formulas } = checkSheetContent(REFERENCE_CASES, { ...FACTS, exactStep: "javascript" });
    expect(formulas[4][1]).toMatch(/^JavaScript: WebAssembly is not available in this Excel, .*same results/);
  });
});

describe("the check sheet's content", () => {
  const content = checkSheetContent(REFERENCE_CASES, FACTS);

  it("is rectangular, with a number format per cell, and writes facts as text", () => {
    const width = content.formulas[0].length;
    for (const [r, row] of content.formulas.entries()) {
      expect(row.length, `row ${r}`).toBe(width);
      expect(content.numberFormats[r].length, `row ${r}`).toBe(width);
    }
    for (let r = 1; r <= 5; r++) expect(content.numberFormats[r][1]).toBe("@");
  });

  it("states the time as fixed text and holds no volatile function, so the record keeps it", () => {
    expect(content.formulas[5][1]).toBe(auditTime(FACTS.checkedAt));
    const text = content.formulas.flat().join("\n").toUpperCase();
    for (const volatile of ["NOW(", "TODAY(", "RAND(", "OFFSET(", "INDIRECT("]) expect(text).not.toContain(volatile);
  });

  it("gives each case its formula, its expected value as a number, a difference formula, its tolerance, a pass/fail formula and its source", () => {
    REFERENCE_CASES.forEach((c, i) => {
      const row = content.formulas[LAYOUT.firstCaseRow + i];
      const n = LAYOUT.firstCaseRow + i + 1;
      expect(row).toEqual([
        c.id,
        c.what,
        expect.stringMatching(/^=(INDEX\()?EVENSPLIT\./),
        c.expected,
        `=C${n}-D${n}`,
        c.tolerance,
        `=IFERROR(IF(ABS(E${n})<=F${n},"pass","fail"),"fail")`,
        c.source,
      ]);
    });
  });

  it("never has a text the sheet would take for a formula or a number", () => {
    for (const cell of content.formulas.flat()) {
      if (typeof cell !== "string" || cell.startsWith("=") || cell === "") continue;
      expect(/^[+\-@]/.test(cell), cell).toBe(false);
      expect(Number.isFinite(Number(cell.trim())), cell).toBe(false);
    }
  });

  it("ends with the caution that it does not replace the lab's own qualification, in italics", () => {
    expect(CHECK_CAUTIONS[0]).toMatch(/does not replace.*qualification.*quality system and local rules/);
    const last = content.formulas.slice(-CHECK_CAUTIONS.length).map((row) => row[0]);
    expect(last).toEqual(CHECK_CAUTIONS);
    expect(content.italicRows.map((r) => content.formulas[r][0])).toEqual(CHECK_CAUTIONS);
  });
});

describe("the check sheet in the demo workbook", () => {
  it("is added in one batch under its own name, shown, and every case passes there", async () => {
    const workbook = workbookWith(functions);
    const host = createHost(fakeRun(workbook));
    const { report, message } = await writeCheckSheet(host, REFERENCE_CASES, FACTS);
    expect(report).toEqual({ kind: "written", sheet: CHECK_SHEET_NAME });
    expect(message).toContain("“Evensplit check”");
    expect(workbook.sheetNames).toEqual(["Paint line", CHECK_SHEET_NAME]);
    expect(workbook.selection.sheet).toBe(CHECK_SHEET_NAME);
    expect(resultsOf(workbook, CHECK_SHEET_NAME)).toEqual(REFERENCE_CASES.map(() => "pass"));
    expect(workbook.value(CHECK_SHEET_NAME, LAYOUT.passedRow, LAYOUT.resultColumn)).toBe(REFERENCE_CASES.length);
    expect(workbook.value(CHECK_SHEET_NAME, LAYOUT.checkedRow, LAYOUT.resultColumn)).toBe(REFERENCE_CASES.length);
    expect(workbook.value(CHECK_SHEET_NAME, LAYOUT.outcomeRow, 1)).toBe("Every case passes");
    expect(workbook.value(CHECK_SHEET_NAME, 2, 1)).toBe("16.0.17928.20114");
    expect(workbook.format(CHECK_SHEET_NAME, LAYOUT.headerRow, 0).bold).toBe(true);
    expect(workbook.columnWidth(CHECK_SHEET_NAME, 1)).toBe(440);
  });

  it("is added again beside the first as Evensplit check (2)", async () => {
    const workbook = workbookWith(functions);
    const host = createHost(fakeRun(workbook));
    await writeCheckSheet(host, REFERENCE_CASES, FACTS);
    const { report } = await writeCheckSheet(host, REFERENCE_CASES, FACTS);
    expect(report).toEqual({ kind: "written", sheet: "Evensplit check (2)" });
    expect(workbook.sheetNames).toEqual(["Paint line", "Evensplit check", "Evensplit check (2)"]);
  });

  for (const id of ["PVALUE", "BOUNDS", "COUNTPVALUE"]) {
    it(`shows fail on exactly the cases of ${id} when that function is off by one part in a million`, async () => {
      const workbook = workbookWith(perturbed(id));
      await writeCheckSheet(createHost(fakeRun(workbook)), REFERENCE_CASES, FACTS);
      const results = resultsOf(workbook, CHECK_SHEET_NAME);
      expect(results).toEqual(REFERENCE_CASES.map((c) => (c.fn === id ? "fail" : "pass")));
      const failing = REFERENCE_CASES.filter((c) => c.fn === id).length;
      expect(failing).toBeGreaterThan(0);
      expect(workbook.value(CHECK_SHEET_NAME, LAYOUT.passedRow, LAYOUT.resultColumn)).toBe(REFERENCE_CASES.length - failing);
      expect(workbook.value(CHECK_SHEET_NAME, LAYOUT.outcomeRow, 1)).toMatch(/^Not every case passes/);
    });
  }

  it("shows fail, not an error, for a case whose function answers with an error", async () => {
    const refusing = new Map(functions);
    refusing.set("ORDERRANKS", { ...(functions.get("ORDERRANKS") as CustomFunction), fn: () => ({ code: "#N/A" }) });
    const workbook = workbookWith(refusing);
    await writeCheckSheet(createHost(fakeRun(workbook)), REFERENCE_CASES, FACTS);
    expect(resultsOf(workbook, CHECK_SHEET_NAME)).toEqual(REFERENCE_CASES.map((c) => (c.fn === "ORDERRANKS" ? "fail" : "pass")));
  });

  it("removes the sheet it began when the workbook refuses the batch, and says why", async () => {
    const workbook = workbookWith(functions);
    const host = createHost(fakeRun(workbook));
    const content = checkSheetContent(REFERENCE_CASES, FACTS);
    const broken = { ...content, formulas: content.formulas.map((row, r) => (r === 1 ? ["=1+", ...row.slice(1)] : row)) };
    const report = await host.addSheet(() => CHECK_SHEET_NAME, broken);
    expect(report).toMatchObject({ kind: "refused", left: null });
    expect(workbook.sheetNames).toEqual(["Paint line"]);
  });
});
