/**
 * Speed of the cell functions through the whole layer (argument checks, the
 * pass over the cells, the core, the answer), each against a bare loop that
 * reads every cell of the same range once, measured in the same run:
 *
 * - PVALUE over a whole column (1,048,576 rows, the first 100,000 numbers, the rest blank): at most 1.5x;
 * - BOUNDS on 1,000,000 numbers: at most 6x;
 * - SIGNRANK with the normal method on 1,000,000 numbers: at most 30x;
 * - HODGESLEHMANN on 100,000 numbers: at most 100x.
 *
 * Data: invented measurements from a fixed-seed generator (no real data).
 */
import { bounds, hodgeslehmann, pvalue, signrank } from "../src/functions/functions";
import { report, timeMedian } from "./timing";
import { xorshift32 as uniforms } from "../src/stats/xorshift";

/** A one-column range of `rows` cells whose first `numbers` cells hold coating thicknesses around 50 µm; the rest are blank. */
function column(rows: number, numbers: number, seed: number): (number | null)[][] {
  const next = uniforms(seed);
  const cells: (number | null)[][] = new Array(rows);
  for (let r = 0; r < rows; r++) cells[r] = [r < numbers ? Math.round((44 + 12 * next()) * 100) / 100 : null];
  return cells;
}

/** The baseline: read every cell once and keep something, so the loop cannot be optimised away. */
function bareLoop(cells: readonly (readonly unknown[])[]): number {
  let sum = 0;
  for (let r = 0; r < cells.length; r++) {
    const row = cells[r];
    for (let c = 0; c < row.length; c++) {
      const v = row[c];
      if (typeof v === "number") sum += v;
    }
  }
  return sum;
}

/**
 * Times the function and the bare loop in alternating rounds, so both see the same machine load and
 * JIT state, and reports the median of each.
 */
function compare(name: string, cells: (number | null)[][], candidate: () => unknown, limit: number, repeats: number): void {
  const answer = candidate();
  if (typeof answer !== "number" && !(Array.isArray(answer) && typeof answer[0][0] === "number")) {
    throw new Error(`${name} did not give a number: ${JSON.stringify(answer)}`);
  }
  let sink = 0;
  const baseline = () => (sink += bareLoop(cells));
  for (let i = 0; i < 3; i++) {
    baseline();
    candidate();
  }
  const base: number[] = [];
  const timed: number[] = [];
  for (let round = 0; round < 5; round++) {
    base.push(timeMedian(baseline, repeats));
    timed.push(timeMedian(candidate, repeats));
  }
  const median = (xs: number[]) => xs.sort((x, y) => x - y)[Math.floor(xs.length / 2)];
  if (Number.isNaN(sink)) throw new Error("the bare loop read a NaN");
  report(name, median(timed), median(base), limit);
}

export async function run(): Promise<void> {
  const wholeColumn = column(1_048_576, 100_000, 11);
  compare("PVALUE, 1,048,576-row column, 100,000 numbers", wholeColumn, () => pvalue(wholeColumn, 50, "greater"), 1.5, 7);

  const million = column(1_000_000, 1_000_000, 12);
  compare("BOUNDS, 1,000,000 numbers", million, () => bounds(million, 0.95), 6, 5);
  compare("SIGNRANK normal, 1,000,000 numbers", million, () => signrank(million, 50, "two-sided", "normal"), 30, 3);

  const hundredThousand = column(100_000, 100_000, 13);
  compare("HODGESLEHMANN, 100,000 numbers", hundredThousand, () => hodgeslehmann(hundredThousand, 0.95), 100, 3);
}
