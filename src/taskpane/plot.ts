/**
 * Geometry of the Result step's small plots: a number line holding the data,
 * the hypothesised value and the bounds; and the null distribution of the
 * sign (or quantile) count with the observed count marked.
 *
 * Method: tick steps are 1, 2 or 5 times a power of ten — P. S. Heckbert
 * (1990), "Nice numbers for graph labels", in Graphics Gems (A. Glassner,
 * ed.), Academic Press, 61-63. Dots that would overlap are stacked upward
 * (a dot plot). The null distribution is the binomial pmf from the core
 * (src/stats/binomial.ts), so the bars are the exact probabilities the
 * p-value sums.
 *
 * Cost: O(n log n) for the dots (one sort), O(n) for the bars.
 */
import { binomialPmf } from "../stats/binomial";

export interface LineScale {
  readonly min: number;
  readonly max: number;
  readonly ticks: readonly number[];
  /** Position in drawing units of a value. */
  x(value: number): number;
}

function niceStep(rough: number): number {
  const power = Math.pow(10, Math.floor(Math.log10(rough)));
  const fraction = rough / power;
  return (fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10) * power;
}

/**
 * Ticks for a range of values, at about `count` nice steps.
 *
 * @example
 * niceTicks(47.9, 54, 5); // [48, 50, 52, 54]
 */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!(max > min)) return [min];
  const step = niceStep((max - min) / Math.max(1, count - 1));
  const first = Math.ceil(min / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let t = first; t <= max + step * 1e-9; t += step) ticks.push(Number(t.toPrecision(12)));
  return ticks;
}

/**
 * A scale from values to drawing positions between `left` and `right`,
 * covering every value and every mark (hypothesised value, bounds) with a
 * little room at both ends.
 *
 * @example
 * lineScale([48, 52], [50], 10, 290).x(50); // 150
 */
export function lineScale(values: ArrayLike<number>, marks: readonly number[], left: number, right: number): LineScale {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < values.length; i++) {
    lo = Math.min(lo, values[i]);
    hi = Math.max(hi, values[i]);
  }
  for (const m of marks) {
    lo = Math.min(lo, m);
    hi = Math.max(hi, m);
  }
  if (!Number.isFinite(lo)) {
    lo = 0;
    hi = 1;
  }
  if (hi === lo) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.1 : 1;
    lo -= pad;
    hi += pad;
  }
  const pad = (hi - lo) * 0.05;
  const min = lo - pad;
  const max = hi + pad;
  const ticks = niceTicks(min, max, 5).filter((t) => t >= min && t <= max);
  return { min, max, ticks, x: (value: number) => left + ((value - min) / (max - min)) * (right - left) };
}

export interface PlacedDot {
  readonly value: number;
  readonly x: number;
  /** 0 on the line, 1 one dot above, ... */
  readonly level: number;
}

/**
 * Positions of the data dots: each dot goes on the lowest level where it does
 * not overlap a dot already placed (dots closer than `diameter` overlap). A
 * dot that would go above `ceiling` is put at `ceiling`: the caller then bins
 * instead, and the search stays O(n × ceiling) rather than O(n²) for 100,000
 * values.
 *
 * @example
 * stackDots([50, 50, 51], lineScale([50, 51], [], 0, 100), 6).map((d) => d.level); // [0, 1, 0]
 */
export function stackDots(values: ArrayLike<number>, scale: LineScale, diameter: number, ceiling = Infinity): PlacedDot[] {
  // A typed array sorts numerically without a comparator: about ten times faster at 100,000 values.
  const sorted = Float64Array.from(values).sort();
  const lastX: number[] = [];
  return Array.from(sorted, (value) => {
    const x = scale.x(value);
    let level = 0;
    while (level < ceiling && lastX[level] !== undefined && x - lastX[level] < diameter) level++;
    lastX[level] = x;
    return { value, x, level };
  });
}

export interface NullBar {
  readonly count: number;
  readonly probability: number;
  readonly observed: boolean;
}

/** Above this many used values the bars are too thin to read; the plot leaves them out. */
export const MAX_NULL_BARS = 200;

/**
 * The probability of each count 0..n under H0 (count ~ Binomial(n, p)), with the observed count marked.
 * Empty when n is 0 or too large to draw.
 *
 * @example
 * nullBars(4, 0.5, 3).map((b) => b.probability); // [0.0625, 0.25, 0.375, 0.25, 0.0625]
 */
export function nullBars(n: number, p: number, observed: number): NullBar[] {
  if (!Number.isInteger(n) || n < 1 || n > MAX_NULL_BARS) return [];
  const bars: NullBar[] = [];
  for (let k = 0; k <= n; k++) bars.push({ count: k, probability: binomialPmf(k, n, p), observed: k === observed });
  return bars;
}

/**
 * Where a label of about `width` drawing units goes so that it stays between
 * `left` and `right`: centred on `x`, or held against the nearer end.
 *
 * @example
 * labelPlace(284, 60, 14, 286); // { x: 286, anchor: "end" }
 * labelPlace(150, 60, 14, 286); // { x: 150, anchor: "middle" }
 */
export function labelPlace(x: number, width: number, left: number, right: number): { x: number; anchor: "start" | "middle" | "end" } {
  if (x - width / 2 < left) return { x: left, anchor: "start" };
  if (x + width / 2 > right) return { x: right, anchor: "end" };
  return { x, anchor: "middle" };
}

/** The most dots stacked in one column before the plot counts values in bins instead. */
export const MAX_DOT_LEVELS = 14;

/** A bin of the binned dot plot: its centre, how many values fell in it, and its height in dot levels. */
export interface DotBin {
  readonly x: number;
  readonly width: number;
  readonly count: number;
  readonly height: number;
}

export type DotLayout =
  | { readonly kind: "dots"; readonly dots: readonly PlacedDot[]; readonly levels: number }
  | { readonly kind: "bins"; readonly bins: readonly DotBin[]; readonly levels: number; readonly largest: number };

/**
 * How the values are drawn: stacked dots while no stack passes
 * MAX_DOT_LEVELS, otherwise bins one dot wide whose bars are scaled so the
 * fullest reaches MAX_DOT_LEVELS.
 *
 * @example
 * dotLayout([48, 50, 51], lineScale([48, 51], [50], 14, 286), 7).kind; // "dots"
 */
export function dotLayout(values: ArrayLike<number>, scale: LineScale, diameter: number): DotLayout {
  // A dot at level MAX_DOT_LEVELS (the ceiling) means bins, which need only the dots' x.
  const dots = stackDots(values, scale, diameter, MAX_DOT_LEVELS);
  const levels = dots.reduce((m, d) => Math.max(m, d.level), 0) + 1;
  if (levels <= MAX_DOT_LEVELS) return { kind: "dots", dots, levels };
  const left = scale.x(scale.min);
  const counts = new Map<number, number>();
  for (const d of dots) {
    const bin = Math.floor((d.x - left) / diameter);
    counts.set(bin, (counts.get(bin) ?? 0) + 1);
  }
  const largest = Math.max(...counts.values());
  const bins = [...counts]
    .sort((a, b) => a[0] - b[0])
    .map(([bin, count]) => ({ x: left + (bin + 0.5) * diameter, width: diameter, count, height: (count / largest) * MAX_DOT_LEVELS }));
  return { kind: "bins", bins, levels: MAX_DOT_LEVELS, largest };
}
