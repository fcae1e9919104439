/**
 * The demo's drawing of a recorded scatter chart: where each series' points
 * and lines fall in a small picture, the axes' ends and their ticks. Excel
 * draws the chart itself; the demo draws what the workbook records, read
 * from the same cells, so that it follows them as they change.
 *
 * Method: as a scatter chart reads its cells (common practice of Excel's
 * scatter charts): numbers are drawn, text as 0, blanks and error values
 * (such as #N/A) not at all; a series without x values is drawn against its
 * positions 1, 2, 3, ...; an axis end that is not set is chosen to take in
 * every point, rounded outwards to a step of 1, 2 or 5 times a power of ten,
 * and the horizontal axis starts at 0 when the values are all positive.
 * Points that land on the same spot of the picture (to one unit of it, less
 * than half a marker) are drawn once, so 100,000 rows stay a picture of a
 * bounded number of marks.
 *
 * Cost: O(cells read) per drawing.
 */
import type { Scalar } from "./formula/values";
import type { ChartModel, SeriesLink } from "./workbook";

/** The picture's size in its own units, and the margins that hold the axis labels. */
export const DRAWING = { width: 360, height: 240, left: 46, right: 10, top: 10, bottom: 40 } as const;

export interface DrawnSeries {
  readonly name: string;
  /** Points as markers, or a line through them. */
  readonly kind: "points" | "line";
  readonly colour: string | null;
  readonly dashed: boolean;
  /** Positions in the picture's units, after clipping to the plot area for points. */
  readonly positions: readonly (readonly [number, number])[];
  /** How many values the series has to draw: numbers, and text read as 0. */
  readonly count: number;
  /** Points left out because they fall outside the axes (a line is clipped instead). */
  readonly outside: number;
}

export interface ScatterDrawing {
  readonly series: readonly DrawnSeries[];
  readonly x: { readonly minimum: number; readonly maximum: number; readonly ticks: readonly number[]; readonly title: string };
  readonly y: { readonly minimum: number; readonly maximum: number; readonly ticks: readonly number[]; readonly title: string };
}

/** A number as a scatter chart reads a cell: text as 0, blanks and errors as nothing. */
function plotted(cell: Scalar): number | null {
  if (typeof cell === "number") return Number.isFinite(cell) ? cell : null;
  if (typeof cell === "string") return 0;
  if (typeof cell === "boolean") return cell ? 1 : 0;
  return null;
}

function roundStep(spread: number): number {
  const rough = spread / 5;
  const power = 10 ** Math.floor(Math.log10(rough));
  const scaled = rough / power;
  return (scaled <= 1 ? 1 : scaled <= 2 ? 2 : scaled <= 5 ? 5 : 10) * power;
}

/**
 * An axis's ends: those set, else the data's, rounded outwards to a round step; and its ticks.
 *
 * @example
 * axisScale([3, 18], null, null, true); // { minimum: 0, maximum: 20, ticks: [0, 5, 10, 15, 20] }
 */
export function axisScale(
  values: readonly number[],
  minimum: number | null,
  maximum: number | null,
  fromZero: boolean,
): { minimum: number; maximum: number; ticks: number[] } {
  let low = Infinity;
  let high = -Infinity;
  for (const v of values) {
    if (v < low) low = v;
    if (v > high) high = v;
  }
  if (low === Infinity) [low, high] = [0, 1];
  if (fromZero && low > 0) low = 0;
  if (minimum !== null) low = minimum;
  if (maximum !== null) high = maximum;
  if (!(high > low)) high = low + 1;
  const step = roundStep(high - low);
  const tidy = (x: number): number => Number(x.toPrecision(12));
  const start = minimum ?? tidy(Math.floor(low / step) * step);
  const end = maximum ?? tidy(Math.ceil(high / step) * step);
  const ticks: number[] = [];
  for (let t = Math.ceil(start / step) * step; t <= end + step / 1e9; t += step) ticks.push(tidy(t));
  return { minimum: start, maximum: end, ticks };
}

/**
 * Lays out a recorded scatter chart from the cells it reads.
 *
 * @example
 * scatterDrawing(chart, (link) => workbook.values(link.sheet, workbook.linkedRect(link)));
 * // { series: [{ name: "Thickness (µm)", kind: "points", positions: [[...], ...] }, ...], x: {...}, y: {...} }
 */
export function scatterDrawing(chart: ChartModel, read: (link: SeriesLink) => Scalar[][]): ScatterDrawing {
  const raw = chart.series.map((s) => {
    const ys = s.values ? read(s.values).flat() : [];
    const xs = s.xValues ? read(s.xValues).flat() : null;
    const pairs: [number, number][] = [];
    ys.forEach((cell, i) => {
      const y = plotted(cell);
      const x = xs ? plotted(xs[i] ?? null) : i + 1;
      if (y !== null && x !== null) pairs.push([x, y]);
    });
    return { series: s, pairs };
  });
  const allX = raw.flatMap((r) => r.pairs.map((p) => p[0]));
  const allY = raw.flatMap((r) => r.pairs.map((p) => p[1]));
  const x = axisScale(allX, chart.axes.category.minimum, chart.axes.category.maximum, true);
  const y = axisScale(allY, chart.axes.value.minimum, chart.axes.value.maximum, false);
  const { width, height, left, right, top, bottom } = DRAWING;
  const across = (v: number): number => left + ((v - x.minimum) / (x.maximum - x.minimum)) * (width - left - right);
  const up = (v: number): number => height - bottom - ((v - y.minimum) / (y.maximum - y.minimum)) * (height - top - bottom);
  const inside = ([px, py]: readonly [number, number]): boolean =>
    px >= left - 0.01 && px <= width - right + 0.01 && py >= top - 0.01 && py <= height - bottom + 0.01;
  const series = raw.map(({ series: s, pairs }): DrawnSeries => {
    const line = s.chartType.includes("Lines") || s.chartType.includes("Smooth");
    // Lines keep a tenth of a unit; points snap to whole units, where a marker 5 units wide hides the difference.
    const digits = line ? 1 : 0;
    const placed = pairs.map(([px, py]) => [Number(across(px).toFixed(digits)), Number(up(py).toFixed(digits))] as const);
    const seen = new Set<string>();
    let outside = 0;
    const positions = line
      ? placed
      : placed.filter((p) => {
          if (!inside(p)) {
            outside++;
            return false;
          }
          const key = `${p[0]},${p[1]}`;
          if (seen.has(key)) return false;
          seen.add(key);
          return true;
        });
    return {
      name: s.name,
      kind: line ? "line" : "points",
      colour: line ? s.lineColour : s.markerColour,
      dashed: s.lineStyle.startsWith("Dash") || s.lineStyle.includes("Dot"),
      positions,
      count: pairs.length,
      outside,
    };
  });
  return {
    series,
    x: { ...x, title: chart.axes.category.title },
    y: { ...y, title: chart.axes.value.title },
  };
}
