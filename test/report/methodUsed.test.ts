/**
 * Say which method ran. The signed-rank block's method row states the method
 * the p-value actually used (under "auto": exact up to EXACT_AUTO_LIMIT
 * non-zero differences, the normal approximation beyond), and a one-sided
 * question gets the one-sided Hodges–Lehmann bound, as the sign test's block does.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { blockFormula, blockValue, resultBlockRows, type BlockRequest, type CallValue } from "../../src/report/resultBlock";
import { EXACT_AUTO_LIMIT, signedRankTest } from "../../src/stats/signedRank";
import { catalogueFunctions } from "../demo/catalogue";

const AUTO: BlockRequest = {
  test: "signed-rank",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  method: "auto",
};

/** n invented thicknesses around 50, none equal to it: n non-zero differences. */
function column(n: number): number[][] {
  return Array.from({ length: n }, (_, i) => [50 + (i % 2 === 0 ? 1 : -1) * (0.5 + i / 64)]);
}

function methodOf(request: BlockRequest, data: number[][]): unknown {
  const method = resultBlockRows(request).find((r) => r.key === "method")!;
  return blockValue(method.value, { data }, callFunction);
}

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

describe("the method row states the method that ran", () => {
  it("exact at the auto limit, normal one past it", () => {
    expect(methodOf(AUTO, column(EXACT_AUTO_LIMIT))).toMatch(
      /^Wilcoxon signed-rank test, exact \(conditional on ties\), as there are at most 1,000 non-zero/,
    );
    expect(methodOf(AUTO, column(EXACT_AUTO_LIMIT + 1))).toMatch(
      /^Wilcoxon signed-rank test, normal approximation .*, as there are more than 1,000 non-zero/,
    );
    expect(methodOf(AUTO, column(1492))).toMatch(/normal approximation/);
  });

  it("agrees with the method the core reports, in the sheet as in REPORT's direct evaluation", () => {
    for (const n of [12, EXACT_AUTO_LIMIT + 1]) {
      const workbook = new Workbook(["Paint line"]);
      workbook.writeEntries("Paint line", 0, 0, [["Thickness"], ...column(n)]);
      workbook.setFunctions(functions);
      const method = resultBlockRows(AUTO).find((r) => r.key === "method")!;
      workbook.writeEntries("Paint line", 0, 3, [[blockFormula(method.value, { data: `$A$2:$A$${n + 1}` })]]);
      expect(workbook.value("Paint line", 0, 3)).toBe(methodOf(AUTO, column(n)));
      const core = signedRankTest(
        column(n).map(([x]) => x - 50),
        { method: "auto" },
      );
      expect(core.available && core.method).toBe(n <= EXACT_AUTO_LIMIT ? "exact" : "normal");
      expect(methodOf(AUTO, column(n))).toMatch(n <= EXACT_AUTO_LIMIT ? /, exact / : /, normal /);
    }
  });

  it("states exact or normal plainly when that was asked", () => {
    expect(methodOf({ ...AUTO, method: "exact" }, column(5))).toMatch(
      /^Wilcoxon signed-rank test, exact \(conditional on ties\); zero differences left out$/,
    );
    expect(methodOf({ ...AUTO, method: "normal", zeros: "pratt" }, column(5))).toMatch(/normal approximation.*Pratt/);
  });
});

describe("signed-rank bounds follow the question's side", () => {
  const sideOf = (request: BlockRequest): unknown => {
    const lower = resultBlockRows(request).find((r) => r.key === "lower")!.value as CallValue;
    return lower.args.find((a) => "text" in a);
  };

  it("asks Hodges–Lehmann for the one-sided bound under a one-sided alternative", () => {
    expect(sideOf(AUTO)).toEqual({ text: "lower" });
    expect(sideOf({ ...AUTO, alternative: "less" })).toEqual({ text: "upper" });
    expect(sideOf({ ...AUTO, alternative: "two-sided" })).toEqual({ text: "two-sided" });
    const labels = resultBlockRows(AUTO)
      .filter((r) => r.key === "lower" || r.key === "upper")
      .map((r) => r.label);
    expect(labels).toEqual(["95% lower bound for the centre (one-sided)", "Upper bound (none: one-sided)"]);
  });

  it("gives the lower bound alone, at the full confidence", () => {
    const rows = resultBlockRows(AUTO);
    const at = (key: string) => blockValue(rows.find((r) => r.key === key)!.value, { data: column(10) }, callFunction);
    expect(typeof at("lower")).toBe("number");
    expect(at("upper")).toBe("");
    expect(at("coverage") as number).toBeGreaterThanOrEqual(0.95);
  });
});
