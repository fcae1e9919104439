/**
 * The installation check's formulas (caseFormula, src/report/installationCheck.ts) entered in the demo sheet
 * and calculated by its evaluator with the catalogue's functions: each must give the value its case expects,
 * within the case's tolerance, as the same call through callFunction does. This is what lets the demo sheet
 * stand in for Excel when it shows the check.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { caseFormula, REFERENCE_CASES } from "../../src/report/installationCheck";
import { catalogueFunctions } from "./catalogue";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

describe("the installation check's formulas in the demo sheet", () => {
  it("each calculates to its expected value within its tolerance", () => {
    const workbook = new Workbook(["Check"]);
    workbook.setFunctions(functions);
    workbook.writeEntries(
      "Check",
      0,
      0,
      REFERENCE_CASES.map((c) => [caseFormula(c)]),
    );
    REFERENCE_CASES.forEach((c, row) => {
      const value = workbook.value("Check", row, 0);
      expect(typeof value, `${c.id}: ${JSON.stringify(value)}`).toBe("number");
      expect(Math.abs((value as number) - c.expected), c.id).toBeLessThanOrEqual(c.tolerance);
    });
  });
});
