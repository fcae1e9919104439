/**
 * The cell scan against a bare loop: a whole-column reference (1,048,576 rows of
 * one cell) holding 100,000 numbers at random rows, the rest blank (null).
 * Target: numbersFromCells plus the sign count <= 1.5x a loop that reads every cell once.
 * Also exports the baseline loop and the alternating timer for the other benches of src/stats.
 * Data: invented, from a fixed-seed generator.
 */
import { numbersFromCells } from "../src/stats/cells";
import { countSigns } from "../src/stats/signCounts";
import { report, timeMedian } from "./timing";

const ROWS = 1_048_576;
const NUMBERS = 100_000;

/** A column as the host hands it over: one array per row. Positions come from a fixed-seed generator. */
function sparseColumn(): unknown[][] {
  const column: unknown[][] = new Array(ROWS);
  for (let r = 0; r < ROWS; r++) column[r] = [null];
  let seed = 12345;
  let placed = 0;
  while (placed < NUMBERS) {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    const r = seed % ROWS;
    if (column[r][0] === null) {
      column[r][0] = (seed % 2001) / 10 - 100;
      placed++;
    }
  }
  return column;
}

/** Reads every cell once and keeps a result that depends on each read, so the loop cannot be dropped. */
export function bareLoop(cells: readonly (readonly unknown[])[]): number {
  let numbers = 0;
  for (let r = 0; r < cells.length; r++) {
    const row = cells[r];
    for (let c = 0; c < row.length; c++) if (typeof row[c] === "number") numbers++;
  }
  return numbers;
}

/** Median of `rounds` alternating measurements of baseline and candidate, so both see the same machine load and JIT state. */
export function alternate(base: () => unknown, candidate: () => unknown, rounds = 5, warmups = 20): { baseMs: number; ms: number } {
  const b: number[] = [];
  const c: number[] = [];
  for (let i = 0; i < warmups; i++) {
    base(); // many calls, not one: a loop first compiled on stack replacement runs slower than the later full compile
    candidate();
  }
  for (let i = 0; i < rounds; i++) {
    b.push(timeMedian(base, 7));
    c.push(timeMedian(candidate, 7));
  }
  const median = (xs: number[]) => xs.sort((x, y) => x - y)[Math.floor(xs.length / 2)];
  return { baseMs: median(b), ms: median(c) };
}

/** A one-column range (one array per row) holding the given numbers. */
export function columnOf(values: ArrayLike<number>): number[][] {
  const column: number[][] = new Array(values.length);
  for (let r = 0; r < values.length; r++) column[r] = [values[r]];
  return column;
}

export async function run(): Promise<void> {
  const column = sparseColumn();
  let sink = 0;
  const bare = () => (sink += bareLoop(column));
  const both = alternate(bare, () => {
    const { values } = numbersFromCells(column);
    sink += countSigns(values, 0).above;
  });
  report("numbersFromCells + countSigns, 1,048,576 rows, 100k numbers", both.ms, both.baseMs, 1.5);
  const scanOnly = alternate(bare, () => (sink += numbersFromCells(column).values.length));
  report("numbersFromCells alone", scanOnly.ms, scanOnly.baseMs);
  if (sink === -1) console.log("unreachable");
}
