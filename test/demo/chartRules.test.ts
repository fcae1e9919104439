/**
 * The stand-in refuses what Excel refuses when the pane builds its chart, each
 * rule with the Microsoft page it follows (src/demo/chartRules.ts), and records
 * what Excel would record: a scatter chart of one column drawn against its rows,
 * series set to cells (linked to a table's column when they are one), axes,
 * legend and place. A refusal fails the sync with InvalidArgument, and what the
 * batch did before it stays done (Microsoft, "Error handling with the
 * application-specific JavaScript APIs").
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { Workbook } from "../../src/demo/workbook";
import type { HostChart, HostContext } from "../../src/taskpane/host";

const S = "Paint line";

function sheet(): Workbook {
  const w = new Workbook([S]);
  w.writeEntries(S, 0, 0, [["Thickness"], [50.2], [49.1], [51.4]]);
  w.writeEntries(S, 0, 2, [
    [0, 4],
    [50, 50],
  ]);
  return w;
}

/** Runs `then` on a new scatter chart of A1:A4 in one batch; resolves with the refusal's code, or "ok". */
async function withChart(w: Workbook, then: (chart: HostChart, context: HostContext) => void): Promise<string> {
  try {
    await fakeRun(w)(async (context) => {
      const ws = context.workbook.worksheets.getItem(S);
      then(ws.charts.add("XYScatter", ws.getRange("A1:A4"), "Columns"), context);
      await context.sync();
    });
    return "ok";
  } catch (thrown) {
    return (thrown as { code?: string }).code ?? String(thrown);
  }
}

describe("the chart the stand-in records", () => {
  it("makes one series of the column, named by its header and drawn against 1, 2, 3, ...", async () => {
    const w = sheet();
    expect(await withChart(w, () => undefined)).toBe("ok");
    const [chart] = w.charts;
    expect(chart.type).toBe("XYScatter");
    expect(chart.series).toHaveLength(1);
    expect(chart.series[0]).toMatchObject({
      name: "Thickness",
      values: { sheet: S, rect: { top: 1, left: 0, bottom: 3, right: 0 } },
      xValues: null,
    });
  });

  it("adds line series with x and y values, and records axes, legend and place", async () => {
    const w = sheet();
    const code = await withChart(w, (chart, context) => {
      const ws = context.workbook.worksheets.getItem(S);
      const line = chart.series.add("H0: median = 50");
      line.chartType = "XYScatterLinesNoMarkers";
      line.setXAxisValues(ws.getRange("C1:D1"));
      line.setValues(ws.getRange("C2:D2"));
      line.format.line.lineStyle = "Dash";
      chart.axes.valueAxis.minimum = 48;
      chart.axes.valueAxis.maximum = "";
      chart.axes.categoryAxis.title.text = "Row";
      chart.legend.position = "Bottom";
      chart.setPosition("F1", "L15");
    });
    expect(code).toBe("ok");
    const [chart] = w.charts;
    expect(chart.series[1]).toMatchObject({
      name: "H0: median = 50",
      chartType: "XYScatterLinesNoMarkers",
      xValues: { rect: { top: 0, left: 2, bottom: 0, right: 3 } },
      values: { rect: { top: 1, left: 2, bottom: 1, right: 3 } },
      lineStyle: "Dash",
    });
    expect(chart.axes.value).toEqual({ minimum: 48, maximum: null, title: "" });
    expect(chart.axes.category.title).toBe("Row");
    expect([chart.legend, chart.from, chart.to]).toEqual(["Bottom", "F1", "L15"]);
  });
});

describe("what Excel refuses, the stand-in refuses (InvalidArgument)", () => {
  const cases: [string, (chart: HostChart) => void][] = [
    // Microsoft, "Series.MarkerSize property (Excel)": 2 through 72 points.
    ["a marker of 1 point", (c) => (c.series.getItemAt(0).markerSize = 1)],
    ["a marker of 73 points", (c) => (c.series.getItemAt(0).markerSize = 73)],
    // Microsoft, "Excel.ChartMarkerStyle enum".
    ["a marker style outside the enum", (c) => (c.series.getItemAt(0).markerStyle = "Ring")],
    // Microsoft, "Excel.ChartLineStyle enum".
    ["a line style outside the enum", (c) => (c.series.getItemAt(0).format.line.lineStyle = "Dotted")],
    // Microsoft, "Excel.ChartSeries class": a name of at most 255 characters.
    ["a series name of 256 characters", (c) => (c.series.getItemAt(0).name = "x".repeat(256))],
    ["a new series named with 256 characters", (c) => c.series.add("x".repeat(256))],
    // Microsoft, "Excel.ChartAxis class": a number, or "" for automatic.
    ["an axis end that is a word", (c) => (c.axes.valueAxis.minimum = "low" as unknown as number)],
    // Microsoft, "Excel.ChartLineFormat class": an HTML colour code.
    ["a colour without its #", (c) => (c.series.getItemAt(0).markerBackgroundColor = "3D5A80")],
    // Microsoft, "Excel.ChartLegendPosition enum".
    ["a legend position outside the enum", (c) => (c.legend.position = "Below")],
    // Microsoft, "Excel.Chart class", setPosition: cells of the sheet.
    ["a place past the last column", (c) => c.setPosition("XFE1", "XFE2")],
  ];
  for (const [what, act] of cases) {
    it(`refuses ${what}, keeping what came before it in the batch`, async () => {
      const w = sheet();
      expect(await withChart(w, act)).toBe("InvalidArgument");
      // The chart was added before the refused command, as in Excel.
      expect(w.charts).toHaveLength(1);
    });
  }

  it('refuses a 256th series (Microsoft, "Excel specifications and limits": 255 data series in one chart)', async () => {
    const w = sheet();
    const code = await withChart(w, (chart) => {
      for (let i = 0; i < 255; i++) chart.series.add(`Line ${i}`);
    });
    expect(code).toBe("InvalidArgument");
    expect(w.charts[0].series).toHaveLength(255);
  });

  it("refuses a series position the chart does not have", async () => {
    expect(await withChart(sheet(), (chart) => (chart.series.getItemAt(1).name = "none"))).toBe("ItemNotFound");
  });

  it("records scatter charts only, from one column: anything else is beyond the demo and refused", async () => {
    const w = sheet();
    const refused = fakeRun(w)(async (context) => {
      const ws = context.workbook.worksheets.getItem(S);
      ws.charts.add("ColumnClustered", ws.getRange("A1:A4"));
      await context.sync();
    });
    await expect(refused).rejects.toMatchObject({ code: "InvalidArgument" });
    const wide = fakeRun(w)(async (context) => {
      const ws = context.workbook.worksheets.getItem(S);
      ws.charts.add("XYScatter", ws.getRange("C1:D2"));
      await context.sync();
    });
    await expect(wide).rejects.toMatchObject({ code: "InvalidArgument" });
    expect(w.charts).toEqual([]);
  });

  it("does not read chart properties back (the pane never reads them)", async () => {
    const w = sheet();
    const read = fakeRun(w)(async (context) => {
      const ws = context.workbook.worksheets.getItem(S);
      const chart = ws.charts.add("XYScatter", ws.getRange("A1:A4"));
      await context.sync();
      return chart.series.getItemAt(0).markerSize;
    });
    await expect(read).rejects.toMatchObject({ code: "PropertyNotLoaded" });
  });
});
