/**
 * The demo's drawing of a recorded scatter chart reads cells as a scatter
 * chart does (common practice of Excel's scatter charts: numbers drawn, text
 * as 0, blanks and #N/A left out, no x values meaning 1, 2, 3, ...), and keeps
 * 100,000 rows to a picture of a bounded number of marks. Positions are
 * checked by hand against the layout constants.
 */
import { describe, expect, it } from "vitest";
import { errorValue, type Scalar } from "../../src/demo/formula/values";
import { axisScale, DRAWING, scatterDrawing } from "../../src/demo/scatterDrawing";
import type { ChartModel, SeriesLink, SeriesModel } from "../../src/demo/workbook";

const link = (left: number, rows: number): SeriesLink => ({ sheet: "S", rect: { top: 0, left, bottom: rows - 1, right: left } });

function series(name: string, values: SeriesLink, extra: Partial<SeriesModel> = {}): SeriesModel {
  return {
    name,
    chartType: "XYScatter",
    values,
    xValues: null,
    markerStyle: "Circle",
    markerSize: 5,
    markerColour: "#3D5A80",
    lineColour: null,
    lineStyle: "Automatic",
    lineWeight: 1.5,
    ...extra,
  };
}

function chart(
  all: SeriesModel[],
  value: { minimum: number | null; maximum: number | null } = { minimum: null, maximum: null },
): ChartModel {
  return {
    type: "XYScatter",
    sheet: "S",
    series: all,
    axes: { category: { minimum: 0, maximum: null, title: "Row" }, value: { ...value, title: "Thickness" } },
    legend: "Bottom",
    title: "",
    from: "L1",
    to: "R15",
  };
}

describe("the axes of the drawing", () => {
  it("takes set ends as they are and rounds the others outwards to 1, 2 or 5 times a power of ten", () => {
    expect(axisScale([3, 18], null, null, true)).toEqual({ minimum: 0, maximum: 20, ticks: [0, 5, 10, 15, 20] });
    expect(axisScale([47.2, 53.9], 46, 55, false)).toEqual({ minimum: 46, maximum: 55, ticks: [46, 48, 50, 52, 54] });
    expect(axisScale([], null, null, false)).toEqual({ minimum: 0, maximum: 1, ticks: [0, 0.2, 0.4, 0.6, 0.8, 1] });
  });
});

describe("the drawing of a scatter chart", () => {
  it("draws values against 1, 2, 3, ..., text as 0, and leaves out blanks and #N/A", () => {
    const cells: Record<number, Scalar[][]> = { 0: [[50], [null], ["n/a"], [errorValue("#N/A", "")], [52]] };
    const drawing = scatterDrawing(chart([series("Thickness", link(0, 5))], { minimum: 0, maximum: 100 }), (l) => cells[l.rect.left]);
    const [points] = drawing.series;
    expect(points).toMatchObject({ count: 3, outside: 0 });
    // x axis from 0 to 5 (positions 1..5 rounded to a step of 1); plot spans DRAWING.left to width - right.
    const across = (x: number): number => DRAWING.left + (x / 5) * (DRAWING.width - DRAWING.left - DRAWING.right);
    const up = (y: number): number => DRAWING.height - DRAWING.bottom - (y / 100) * (DRAWING.height - DRAWING.top - DRAWING.bottom);
    expect(points.positions).toEqual([
      [Math.round(across(1)), Math.round(up(50))],
      [Math.round(across(3)), Math.round(up(0))],
      [Math.round(across(5)), Math.round(up(52))],
    ]);
  });

  it("leaves out points outside set axis ends and counts them", () => {
    const cells: Scalar[][] = [[50], ["re-measured"], [120]];
    const drawing = scatterDrawing(chart([series("Thickness", link(0, 3))], { minimum: 40, maximum: 60 }), () => cells);
    expect(drawing.series[0]).toMatchObject({ count: 3, outside: 2 });
    expect(drawing.series[0].positions).toHaveLength(1);
  });

  it("draws a line series through its x and y values, dashed when its style is", () => {
    const cells: Record<number, Scalar[][]> = { 0: [[50], [52]], 1: [[0, 3]], 2: [[51, 51]] };
    const line = series("95% lower bound", link(2, 1), {
      chartType: "XYScatterLinesNoMarkers",
      xValues: { sheet: "S", rect: { top: 0, left: 1, bottom: 0, right: 1 } },
      lineColour: "#2D7A4F",
      lineStyle: "Dash",
    });
    const drawing = scatterDrawing(chart([series("Thickness", link(0, 2)), line]), (l) => cells[l.rect.left]);
    expect(drawing.series[1]).toMatchObject({ kind: "line", colour: "#2D7A4F", dashed: true, count: 2 });
    expect(drawing.series[1].positions[0][0]).toBe(DRAWING.left);
  });

  it("draws points that fall on the same whole unit of the picture once, so 100,000 rows stay a few thousand marks", () => {
    const many: Scalar[][] = Array.from({ length: 100_000 }, (_, i) => [50 + (i % 7)]);
    const drawing = scatterDrawing(chart([series("Thickness", link(0, many.length))]), () => many);
    expect(drawing.series[0].count).toBe(100_000);
    // Seven heights, one mark per whole unit across the plot at most.
    expect(drawing.series[0].positions.length).toBeLessThanOrEqual(7 * (DRAWING.width - DRAWING.left - DRAWING.right + 1));
  });
});
