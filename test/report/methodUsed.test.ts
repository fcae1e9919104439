/**
 * Say which method ran. The signed-rank block's method row states the method
 * the p-value actually used (under "auto": exact up to EXACT_AUTO_LIMIT
 * non-zero differences, the normal approximation beyond), and a one-sided
 * question gets the one-sided Hodges–Lehmann bound, as the sign test's block does.
 * The two-group block's rank-sum row does the same from TWOGROUPSSTATISTIC's
 * second cell, which names the method rankSum.ts chose from the size and the ties.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { blockFormula, blockValue, resultBlockRows, type BlockRequest, type CallValue } from "../../src/report/resultBlock";
import { EXACT_AUTO_SIZE, EXACT_AUTO_TIED_SIZE, rankSumTest } from "../../src/stats/rankSum";
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

describe("the two-group block's method row states the method the rank-sum p-value used", () => {
  const TWO: BlockRequest = { test: "two-groups", paired: false, center: 0, alternative: "two-sided", alpha: 0.05, confidence: 0.95 };
  /** An invented group of n readings from `start` in steps of 0.01; with `tied`, every reading twice. */
  const group = (n: number, start: number, tied: boolean): number[][] =>
    Array.from({ length: n }, (_, i) => [Number((start + (tied ? i >> 1 : i) * 0.01).toFixed(3))]);
  const rowValue = (request: BlockRequest, key: string, first: unknown[][], second: unknown[][]): unknown =>
    blockValue(resultBlockRows(request).find((r) => r.key === key)!.value, { data: first, second }, callFunction);

  it("says exact or normal as the core chose, on both sides of each size limit, with and without ties, and gives U", () => {
    const tiedLimit = EXACT_AUTO_TIED_SIZE;
    for (const [m, n, tied] of [
      [tiedLimit / 2, tiedLimit / 2, true],
      [tiedLimit / 2 + 1, tiedLimit / 2, false],
      [tiedLimit / 2 + 1, tiedLimit / 2, true],
      [EXACT_AUTO_SIZE / 2, EXACT_AUTO_SIZE / 2, false],
      [EXACT_AUTO_SIZE / 2 + 1, EXACT_AUTO_SIZE / 2, false],
    ] as const) {
      const first = group(m, 50, tied);
      const second = group(n, 50.005, tied);
      const core = rankSumTest(first.flat(), second.flat());
      expect(core.available && core.tiesPresent, `${m} + ${n}`).toBe(tied);
      if (!core.available) continue;
      const words = rowValue(TWO, "method", first, second);
      expect(words, `${m} + ${n}, ties ${tied}`).toMatch(
        core.method === "exact"
          ? /^Wilcoxon–Mann–Whitney rank-sum test, exact \(conditional on tied mid-ranks\), as the groups are small enough/
          : /^Wilcoxon–Mann–Whitney rank-sum test, the normal approximation with tie and continuity corrections, as the groups are too large/,
      );
      expect(rowValue(TWO, "statistic", first, second)).toBe(core.statistic);
    }
  });

  it("is a formula the demo sheet evaluates to the same words, for two ranges and for labelled groups", () => {
    for (const [m, n, tied] of [
      [EXACT_AUTO_TIED_SIZE / 2 + 1, EXACT_AUTO_TIED_SIZE / 2, true],
      [EXACT_AUTO_TIED_SIZE / 2 + 1, EXACT_AUTO_TIED_SIZE / 2, false],
    ] as const) {
      const first = group(m, 50, tied);
      const second = group(n, 50.005, tied);
      const rows = first.length + second.length;
      const workbook = new Workbook(["Lines"]);
      // Columns A and B: the two ranges; C and D: the same values with a label column.
      workbook.writeEntries("Lines", 0, 0, [["Old"], ...first]);
      workbook.writeEntries("Lines", 0, 1, [["New"], ...second]);
      const labelled = [...first.map(([v]) => [v, "old"]), ...second.map(([v]) => [v, "new"])];
      workbook.writeEntries("Lines", 0, 2, [["Thickness", "Line"], ...labelled]);
      workbook.setFunctions(functions);
      const ranges = { data: `$A$2:$A$${first.length + 1}`, second: `$B$2:$B$${second.length + 1}` };
      const byLabel: BlockRequest = { ...TWO, groupLabels: { first: "old", second: "new" } };
      const columns = { data: `$C$2:$C$${rows + 1}`, second: `$D$2:$D$${rows + 1}` };
      const formulaOf = (request: BlockRequest, refs: { data: string; second: string }): string =>
        blockFormula(resultBlockRows(request).find((r) => r.key === "method")!.value, refs);
      workbook.writeEntries("Lines", 0, 5, [[formulaOf(TWO, ranges)], [formulaOf(byLabel, columns)]]);
      const direct = rowValue(TWO, "method", first, second);
      expect(direct).toMatch(tied ? /normal approximation/ : /, exact /);
      expect(workbook.value("Lines", 0, 5)).toBe(direct);
      expect(workbook.value("Lines", 1, 5)).toBe(direct);
      expect(
        rowValue(
          byLabel,
          "method",
          labelled.map(([v]) => [v]),
          labelled.map(([, label]) => [label]),
        ),
      ).toBe(direct);
    }
  });

  it("states Mood's test plainly, without a rank-sum statistic", () => {
    const rows = resultBlockRows({ ...TWO, method: "median" });
    expect(rows.find((r) => r.key === "method")!.value).toMatchObject({ kind: "text", text: expect.stringMatching(/^Mood's median test/) });
    expect(rows.some((r) => r.key === "statistic")).toBe(false);
  });
});
