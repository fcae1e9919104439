/**
 * Draws the Result step's plots as inline SVG: the data as dots on a number
 * line with the hypothesised value (dashed) and the bounds (shaded band), and
 * optionally the null distribution of the count as bars with the observed
 * count in the accent colour. Colours come from the stylesheet (classes
 * only), so the plots follow the light and dark themes; every label is a text
 * node. Each plot is an image to assistive technology, with a text summary.
 *
 * Method: geometry from plot.ts; drawing is direct SVG element construction.
 *
 * Cost: O(n) elements.
 */
import { svg } from "./dom";
import { dotLayout, labelPlace, lineScale, type DotLayout, type LineScale, type NullBar } from "./plot";

const WIDTH = 300;
const MARGIN = 14;
const DOT = 7;
/** Width of one character of a mark label, in drawing units: generous for the 10px sans-serif the stylesheet sets. */
const LABEL_CHAR = 6.2;

function label(x: number, y: number, text: string, anchor: "start" | "middle" | "end", cls: string): SVGElement {
  return svg("text", { class: cls, attrs: { x: x.toFixed(1), y: y.toFixed(1), "text-anchor": anchor } }, text);
}

function short(x: number): string {
  return String(Number(x.toPrecision(6)));
}

export interface NumberLineInput {
  readonly values: ArrayLike<number>;
  readonly center: number;
  /** null: no bound on that side (one-sided bounds) or none available. */
  readonly lower: number | null;
  readonly upper: number | null;
  /** What the dots are, for the text summary ("values", "differences"). */
  readonly what: string;
}

function numberLineScale(input: NumberLineInput): LineScale {
  const marks = [input.center, ...(input.lower === null ? [] : [input.lower]), ...(input.upper === null ? [] : [input.upper])];
  return lineScale(input.values, marks, MARGIN, WIDTH - MARGIN);
}

/**
 * How the number-line plot draws the values: dots, or bins when there are too many to stack.
 *
 * @example
 * numberLineLayout({ values: [48, 51, 53], center: 50, lower: 48, upper: 53, what: "values" }).kind; // "dots"
 */
export function numberLineLayout(input: NumberLineInput): DotLayout {
  return dotLayout(input.values, numberLineScale(input), DOT);
}

/**
 * The number-line plot.
 *
 * @example
 * numberLinePlot({ values: [48, 51, 53], center: 50, lower: 48, upper: 53, what: "values" }); // <svg role="img" ...>
 */
export function numberLinePlot(input: NumberLineInput): SVGElement {
  const scale = numberLineScale(input);
  // Many values are counted in bins (plot.ts), so the plot's height stays bounded.
  const layout = dotLayout(input.values, scale, DOT);
  const levels = layout.levels;
  const top = 18;
  const axis = top + levels * DOT + 6;
  const height = axis + 22;
  const bounds =
    input.lower === null && input.upper === null
      ? "no bounds"
      : `bounds ${input.lower === null ? "none" : short(input.lower)} to ${input.upper === null ? "none" : short(input.upper)}`;
  const binned = layout.kind === "bins" ? `, counted in bins one dot wide (the fullest holds ${layout.largest})` : "";
  const summary = `${input.values.length} ${input.what}${binned} on a number line from ${short(scale.min)} to ${short(scale.max)}; hypothesised value ${short(input.center)}; ${bounds}.`;
  const plot = svg("svg", {
    class: "es-plot",
    attrs: { viewBox: `0 0 ${WIDTH} ${height}`, role: "img", "aria-label": summary, preserveAspectRatio: "xMidYMid meet" },
  });
  plot.appendChild(svg("title", undefined, summary));
  if (input.lower !== null || input.upper !== null) {
    const from = input.lower === null ? MARGIN : scale.x(input.lower);
    const to = input.upper === null ? WIDTH - MARGIN : scale.x(input.upper);
    plot.appendChild(
      svg("rect", {
        class: "es-band",
        attrs: { x: from.toFixed(1), y: String(top - 4), width: Math.max(1, to - from).toFixed(1), height: String(axis - top + 4) },
      }),
    );
  }
  plot.appendChild(
    svg("line", { class: "es-axis", attrs: { x1: String(MARGIN), x2: String(WIDTH - MARGIN), y1: String(axis), y2: String(axis) } }),
  );
  for (const t of scale.ticks) {
    const x = scale.x(t).toFixed(1);
    plot.appendChild(svg("line", { class: "es-axis", attrs: { x1: x, x2: x, y1: String(axis), y2: String(axis + 4) } }));
    plot.appendChild(label(Number(x), axis + 15, short(t), "middle", "es-tick"));
  }
  if (layout.kind === "dots") {
    for (const d of layout.dots) {
      plot.appendChild(
        svg("circle", {
          class: "es-dot",
          attrs: { cx: d.x.toFixed(1), cy: (axis - DOT / 2 - 1 - d.level * DOT).toFixed(1), r: String(DOT / 2 - 0.4) },
        }),
      );
    }
  } else {
    for (const b of layout.bins) {
      const h = Math.max(1, b.height * DOT);
      plot.appendChild(
        svg("rect", {
          class: "es-dot",
          attrs: {
            x: (b.x - b.width / 2 + 0.4).toFixed(1),
            y: (axis - 1 - h).toFixed(1),
            width: (b.width - 0.8).toFixed(1),
            height: h.toFixed(1),
          },
        }),
      );
    }
  }
  const cx = scale.x(input.center).toFixed(1);
  plot.appendChild(svg("line", { class: "es-center", attrs: { x1: cx, x2: cx, y1: String(top - 6), y2: String(axis) } }));
  plot.appendChild(label(Number(cx), top - 8, `H0 ${short(input.center)}`, "middle", "es-mark"));
  return plot;
}

/**
 * The null-distribution plot of a count.
 *
 * @example
 * nullDistributionPlot(nullBars(20, 0.5, 15), "count above 50"); // <svg role="img" ...>
 */
export function nullDistributionPlot(bars: readonly NullBar[], what: string): SVGElement {
  const height = 96;
  const base = height - 18;
  // The observed count's label sits on a line of its own above the bars, clear of the axis and its ticks.
  const labelLine = 11;
  const barTop = labelLine + 6;
  const n = bars.length - 1;
  const highest = bars.reduce((m, b) => Math.max(m, b.probability), 0) || 1;
  const step = (WIDTH - 2 * MARGIN) / bars.length;
  const observed = bars.find((b) => b.observed);
  const summary = `Probability of each ${what} from 0 to ${n} if H0 holds; observed ${observed ? observed.count : "none"}.`;
  const plot = svg("svg", { class: "es-plot", attrs: { viewBox: `0 0 ${WIDTH} ${height}`, role: "img", "aria-label": summary } });
  plot.appendChild(svg("title", undefined, summary));
  bars.forEach((b, i) => {
    const h = (b.probability / highest) * (base - barTop);
    plot.appendChild(
      svg("rect", {
        class: b.observed ? "es-bar es-bar-observed" : "es-bar",
        attrs: {
          x: (MARGIN + i * step + step * 0.1).toFixed(2),
          y: (base - h).toFixed(2),
          width: Math.max(0.5, step * 0.8).toFixed(2),
          height: h.toFixed(2),
        },
      }),
    );
  });
  plot.appendChild(
    svg("line", { class: "es-axis", attrs: { x1: String(MARGIN), x2: String(WIDTH - MARGIN), y1: String(base), y2: String(base) } }),
  );
  plot.appendChild(label(MARGIN, base + 14, "0", "start", "es-tick"));
  plot.appendChild(label(WIDTH - MARGIN, base + 14, String(n), "end", "es-tick"));
  if (observed) {
    const text = `observed ${observed.count}`;
    const place = labelPlace(MARGIN + (observed.count + 0.5) * step, text.length * LABEL_CHAR, MARGIN, WIDTH - MARGIN);
    plot.appendChild(label(place.x, labelLine, text, place.anchor, "es-mark"));
  }
  return plot;
}
