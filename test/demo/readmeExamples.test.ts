/**
 * Every `=EVENSPLIT.…` example formula of README.md, typed into the demo
 * workbook's "README examples" sheet, answers with a number or a row holding
 * numbers, never with #NAME?, #REF!, #VALUE! or #SPILL!: the demo holds the
 * tables (Panels, Nozzle, Lines, Heads), the p-values in F2:F6 and the names
 * (n, below, above) the README's examples name. The source of truth is the
 * README text itself, read at test time.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { beforeAll, describe, expect, it } from "vitest";
import { demoWorkbook } from "../../src/demo/demoWorkbook";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { isError, type Scalar } from "../../src/demo/formula/values";
import { README_SHEET } from "../../src/demo/readmeData";
import { catalogueFunctions } from "./catalogue";

const README = readFileSync(fileURLToPath(new URL("../../README.md", import.meta.url)), "utf8");

/** The example formulas: code spans starting "=EVENSPLIT." followed by a function call. */
function readmeFormulas(text: string): string[] {
  const found = [...text.matchAll(/`(=EVENSPLIT\.[A-Z]+\(.*?\))`/g)].map((m) => m[1]);
  return [...new Set(found)];
}

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

/** Where each formula is typed: an empty corner of the README sheet, far from its data. */
const AT = { row: 60, column: 14 };

function answer(formula: string): Scalar[][] {
  const workbook = demoWorkbook(functions);
  workbook.writeEntries(README_SHEET, AT.row, AT.column, [[formula]], true);
  return workbook.values(README_SHEET, { top: AT.row, left: AT.column, bottom: AT.row + 30, right: AT.column + 8 });
}

describe("the README's example formulas in the demo workbook", () => {
  const formulas = readmeFormulas(README);

  it("finds the examples of every function table and of the text around them", () => {
    // 31 distinct examples in the README as written; at least the function tables' 29 rows.
    expect(formulas.length).toBeGreaterThanOrEqual(29);
    expect(formulas).toContain('=EVENSPLIT.ADJUST(F2:F6, "holm")');
    expect(formulas).toContain('=EVENSPLIT.COUNTPVALUE(above, below, "greater")');
    expect(formulas).toContain('=EVENSPLIT.REPORT(Nozzle[Before], 0, "less", 0.05, 0.95, Nozzle[After])');
  });

  it.each(readmeFormulas(README))("%s answers with a number or a row of numbers", (formula) => {
    const cells = answer(formula);
    const first = cells[0][0];
    expect(isError(first) ? first.code : first, `${formula} shows ${isError(first) ? first.message : String(first)}`).not.toSatisfy(
      (v: unknown) => typeof v === "string" && v.startsWith("#"),
    );
    const shown = cells.flat();
    const refusals = shown.filter((v) => isError(v) && ["#NAME?", "#REF!", "#VALUE!", "#SPILL!"].includes(v.code));
    expect(refusals).toEqual([]);
    expect(shown.some((v) => typeof v === "number")).toBe(true);
  });
});
