/**
 * The chart's plan, worked out without a workbook: the value axis (ends by
 * hand from the rule in chartPlan.ts), the place (covers neither data nor
 * block; cells of a replaced block count as empty), the helper cells (each
 * bound a formula pointing at the block's own cell; only the bounds a
 * one-sided question has) and the series.
 */
import { describe, expect, it } from "vitest";
import type { BlockRequest } from "../../src/report/resultBlock";
import { rectsOverlap, type CellRect } from "../../src/taskpane/a1";
import {
  axisRange,
  CHART_COLUMNS,
  CHART_ROWS,
  chartColumn,
  chartProblem,
  chartQuestionProblem,
  HELPER_COLUMNS,
  planChart,
  withoutRegions,
  type ChartColumn,
  type ChartInput,
} from "../../src/taskpane/chartPlan";
import type { CellsRead } from "../../src/taskpane/host";
import type { PreviewRow } from "../../src/taskpane/preview";

const SHEET = "Paint line";

/** A strip of the sheet as read: `filled` lists [row, column] cells holding something. */
function strip(rect: CellRect, filled: readonly [number, number][]): CellsRead {
  const values = Array.from({ length: rect.bottom - rect.top + 1 }, (_, r) =>
    Array.from({ length: rect.right - rect.left + 1 }, (_, c) =>
      filled.some(([fr, fc]) => fr === rect.top + r && fc === rect.left + c) ? "x" : "",
    ),
  );
  return { sheet: SHEET, rect, values, formulas: values };
}

describe("the value axis", () => {
  it("runs over the values with a quarter of their spread each side, rounded outwards, never from 0", () => {
    // By hand: 47.2 to 53.9, spread 6.7, margin 1.675 → 45.525 to 55.575; step for 6.7 / 10 is 1 → 45 to 56.
    expect(axisRange([47.2, 50, 53.9])).toEqual({ minimum: 45, maximum: 56 });
    // Far from zero, the axis stays near the data: 1000.2 to 1000.8 → 1000.05 to 1000.95, step 0.1 → 1000 to 1001.
    expect(axisRange([1000.2, 1000.8])).toEqual({ minimum: 1000, maximum: 1001 });
    // Negative differences: -3 to 1, margin 1, step 0.5 → -4 to 2.
    expect(axisRange([-3, 1, 0])).toEqual({ minimum: -4, maximum: 2 });
  });

  it("gives one value room around it, and skips what is not a finite number", () => {
    expect(axisRange([5])).toEqual({ minimum: 4.5, maximum: 5.5 });
    expect(axisRange([0])).toEqual({ minimum: -1, maximum: 1 });
    expect(axisRange([NaN, Infinity, 5])).toEqual({ minimum: 4.5, maximum: 5.5 });
    expect(axisRange([])).toEqual({ minimum: 0, maximum: 1 });
  });
});

describe("the place of the helper cells and the chart", () => {
  it("starts right of the block after an empty column when that is free", () => {
    const read = strip({ top: 0, left: 6, bottom: CHART_ROWS - 1, right: 20 }, []);
    expect(chartColumn(read, 7, [])).toBe(7);
  });

  it("moves past data in any row the chart would cover, keeping an empty column before it", () => {
    // Something in N12 (row 11, column 13): the helper cells and the chart (11 columns) must start at P (15).
    const read = strip({ top: 0, left: 6, bottom: CHART_ROWS - 1, right: 30 }, [[11, 13]]);
    const left = chartColumn(read, 7, []);
    expect(left).toBe(15);
    const chart = { top: 0, left: left + HELPER_COLUMNS + 1, bottom: CHART_ROWS - 1, right: left + HELPER_COLUMNS + CHART_COLUMNS };
    expect(rectsOverlap(chart, { top: 11, left: 13, bottom: 11, right: 13 })).toBe(false);
  });

  it("counts the cells of a block being replaced (and its helper cells) as empty, so a rewrite stays in place", () => {
    const earlierHelper = { sheet: SHEET, rect: { top: 0, left: 7, bottom: 3, right: 9 } };
    const read = strip({ top: 0, left: 6, bottom: CHART_ROWS - 1, right: 30 }, [
      [0, 7],
      [3, 9],
    ]);
    expect(chartColumn(read, 7, [])).toBe(11);
    expect(chartColumn(read, 7, [earlierHelper])).toBe(7);
    // Regions on another sheet change nothing.
    expect(chartColumn(read, 7, [{ ...earlierHelper, sheet: "Elsewhere" }])).toBe(11);
    expect(withoutRegions(read, [earlierHelper]).values[0][1]).toBe("");
  });
});

const THICKNESS: ChartColumn = {
  sheet: SHEET,
  rect: { top: 1, left: 1, bottom: 5, right: 1 },
  values: [[49.5], [51.2], ["n/a"], [50.8], [52.1]],
  name: "Thickness (µm)",
};

/** Preview rows with the bounds where the sign-test block has them (rows 12 and 13 here), values by hand. */
function rows(lower: unknown, upper: unknown): PreviewRow[] {
  const row = (key: string, value: unknown): PreviewRow => ({
    key,
    label: key,
    style: "plain",
    shown: "",
    value,
    formula: "",
    numberFormat: "General",
  });
  return [...Array.from({ length: 12 }, (_, i) => row(`r${i}`, "")), row("lower", lower), row("upper", upper), row("coverage", 0.9)];
}

function input(request: Partial<BlockRequest>, overrides: Partial<ChartInput> = {}): ChartInput {
  return {
    request: { test: "sign", paired: false, center: 50, alternative: "two-sided", alpha: 0.05, confidence: 0.95, ...request },
    columns: [THICKNESS],
    tableReference: "Table1[[Thickness (µm)]]",
    block: { sheet: SHEET, rect: { top: 0, left: 4, bottom: 14, right: 5 } },
    rows: rows(49.5, 52.1),
    left: 7,
    chartName: "Evensplit chart 1",
    helperName: "Evensplit_chartcells_1",
    ...overrides,
  };
}

describe("the chart's plan", () => {
  it("plots the column itself and draws H0 and both bounds of a two-sided question from helper cells that point at the block", () => {
    const chart = planChart(input({}));
    expect(chart.points).toEqual({ sheet: SHEET, rect: THICKNESS.rect, name: "Thickness (µm)" });
    expect(chart.helper).toEqual({
      rect: { top: 0, left: 7, bottom: 3, right: 9 },
      formulas: [
        ["Chart lines run over rows", "0", "=ROWS(Table1[[Thickness (µm)]])+1"],
        ["Chart line: H0: median = 50", "50", "50"],
        // The block's value column is F; the lower bound is its row 13, the upper its row 14.
        ["Chart line: 95% lower bound", "=$F$13", "=$F$13"],
        ["Chart line: 95% upper bound", "=$F$14", "=$F$14"],
      ],
      name: "Evensplit_chartcells_1",
    });
    expect(chart.lineEnds).toEqual({ top: 0, left: 8, bottom: 0, right: 9 });
    expect(chart.lines.map((l) => [l.name, l.values.top, l.style])).toEqual([
      ["H0: median = 50", 1, "Continuous"],
      ["95% lower bound", 2, "Dash"],
      ["95% upper bound", 3, "Dash"],
    ]);
    // Right of the helper cells (H:J) after an empty column K: L1:R15.
    expect(chart.area).toEqual({ top: 0, left: 11, bottom: 14, right: 17 });
    // Values 49.5 to 52.1 with 50 and the bounds inside: margin 0.65, step 0.5 → 48.85 to 52.75 → 48.5 to 53.
    expect(chart.valueAxis).toEqual({ minimum: 48.5, maximum: 53, title: "Thickness (µm)" });
    expect(chart.title).toBe("Thickness (µm) row by row, against H0 and the 95% bounds");
  });

  it("counts fixed cells when the data are no table, and draws only the bound a one-sided question has", () => {
    const greater = planChart(input({ alternative: "greater" }, { tableReference: null, rows: rows(49.8, "") }));
    expect(greater.helper.formulas[0][2]).toBe("=ROWS($B$2:$B$6)+1");
    expect(greater.lines.map((l) => l.name)).toEqual(["H0: median = 50", "95% lower bound"]);
    expect(greater.title).toBe("Thickness (µm) row by row, against H0 and the 95% lower bound");
    const less = planChart(input({ alternative: "less" }, { rows: rows("", 51.9) }));
    expect(less.lines.map((l) => l.name)).toEqual(["H0: median = 50", "95% upper bound"]);
    // The upper bound's helper row points at the block's upper row, whatever row of the helper it lands in.
    expect(less.helper.formulas[2]).toEqual(["Chart line: 95% upper bound", "=$F$14", "=$F$14"]);
  });

  it("takes the hypothesised value into the axis even far from the data, and names a quantile", () => {
    const chart = planChart(input({ test: "quantile", quantile: 0.9, center: 60 }, { rows: rows("", "") }));
    expect(chart.lines[0].name).toBe("H0: 0.9 quantile = 60");
    expect(chart.valueAxis.maximum).toBeGreaterThan(60);
    expect(chart.valueAxis.minimum).toBeLessThan(49.5);
  });

  it("plots pairs as second − first, a helper formula per pair that gives #N/A where a side has no number", () => {
    const after: ChartColumn = { sheet: SHEET, rect: { top: 1, left: 2, bottom: 3, right: 2 }, values: [[48], [50], [""]], name: "After" };
    const before: ChartColumn = {
      sheet: SHEET,
      rect: { top: 1, left: 1, bottom: 3, right: 1 },
      values: [[50], [49], [51]],
      name: "Before",
    };
    const chart = planChart(input({ paired: true, center: 0, alternative: "less" }, { columns: [before, after], rows: rows("", 0.5) }));
    expect(chart.points).toEqual({ sheet: SHEET, rect: { top: 3, left: 8, bottom: 5, right: 8 }, name: "After − Before" });
    expect(chart.helper.formulas.slice(3)).toEqual([
      ["Chart points: After − Before", "=IF(COUNT($B$2,$C$2)=2,$C$2-$B$2,NA())", ""],
      ["", "=IF(COUNT($B$3,$C$3)=2,$C$3-$B$3,NA())", ""],
      ["", "=IF(COUNT($B$4,$C$4)=2,$C$4-$B$4,NA())", ""],
    ]);
    // Three pairs: the lines run from 0 to 4.
    expect(chart.helper.formulas[0]).toEqual(["Chart lines run over rows", "0", "4"]);
    expect(chart.rowAxisTitle).toBe("Pair, in row order");
    // Differences -2 and 1, H0 at 0, upper bound 0.5: -2 to 1 with margin 0.75, step 0.5 → -3 to 2.
    expect(chart.valueAxis).toMatchObject({ minimum: -3, maximum: 2 });
  });

  it("names data on another sheet in the helper formulas", () => {
    const elsewhere = { ...THICKNESS, sheet: "Readings" };
    const chart = planChart(input({}, { columns: [elsewhere], tableReference: null }));
    expect(chart.helper.formulas[0][2]).toBe("=ROWS(Readings!$B$2:$B$6)+1");
    expect(chart.points.sheet).toBe("Readings");
    expect(chart.sheet).toBe(SHEET);
  });

  it("is drawn for one set of values or pairs, not for groups", () => {
    expect(chartQuestionProblem(input({}).request)).toBeNull();
    expect(chartQuestionProblem({ ...input({}).request, test: "two-groups" })).toMatch(/not for groups/);
    expect(chartQuestionProblem({ ...input({}).request, test: "groups" })).toMatch(/not for groups/);
  });

  it("refuses a range of more than one column", () => {
    expect(chartProblem([THICKNESS])).toBeNull();
    expect(chartProblem([{ ...THICKNESS, rect: { top: 1, left: 1, bottom: 5, right: 2 } }])).toBe(
      "The chart plots one column of values; B2:C6 has 2.",
    );
  });
});
