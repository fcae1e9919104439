/**
 * Checks of the numeric and range arguments of the EVENSPLIT functions.
 *
 * Scalars must be numbers: text that looks like a number is refused rather
 * than guessed at (a decimal comma or a stray unit would otherwise turn into a
 * different number without anyone noticing). An omitted optional argument
 * (null from the spreadsheet), a blank cell and the empty text mean the
 * default; for a required argument they are reported as missing. Every
 * refusal is a BadArgument whose message names the argument, what it got and
 * what is accepted.
 *
 * Range arguments arrive as row-major matrices (Microsoft, "Custom functions
 * parameter options", Office Add-ins documentation: a range parameter is a
 * two-dimensional array). Only their outline is checked here, in O(1), so the
 * single pass over the cells stays the only cost proportional to their size.
 *
 * Cost: O(1) per argument.
 */
import { BadArgument } from "./errors";

/** A range as the spreadsheet hands it over: rows of cells. */
export type Cells = readonly (readonly unknown[])[];

function omitted(raw: unknown): boolean {
  return raw === null || raw === undefined || raw === "";
}

function described(raw: unknown): string {
  if (typeof raw === "string") return `the text "${raw}"`;
  if (typeof raw === "boolean") return `the logical value ${raw ? "TRUE" : "FALSE"}`;
  if (typeof raw === "number") return String(raw);
  return "a value that is not a number";
}

/**
 * A finite number, or `fallback` when omitted (required when there is no fallback).
 *
 * @example
 * numberArgument("hypothesized_median", 50);       // 50
 * numberArgument("shift", null, 0);                // 0
 * numberArgument("hypothesized_median", "50 µm");  // throws BadArgument: Argument hypothesized_median must be a number ...
 */
export function numberArgument(name: string, raw: unknown, fallback?: number, example = "50"): number {
  if (omitted(raw)) {
    if (fallback !== undefined) return fallback;
    throw new BadArgument(`Argument ${name} is missing. Give a number, such as ${example}, or a cell that holds one.`);
  }
  if (typeof raw === "number" && Number.isFinite(raw)) return raw;
  throw new BadArgument(`Argument ${name} must be a number (typed without quotes, or a cell holding one); got ${described(raw)}.`);
}

/**
 * The hint for a fraction typed as a percent: 95 for 0.95, 5 for 0.05. Only from 2 up: a value between 1 and
 * 2 is far likelier a slip than a percent (confidence 1.5 is not 1.5%).
 */
function percentHint(x: number, below: number): string {
  return x >= 2 && x < below ? ` For ${x}% write ${x / 100}.` : "";
}

/**
 * A number strictly between 0 and 1, such as a confidence, alpha, power, quantile or probability.
 *
 * @example
 * fractionArgument("confidence", null, 0.95); // 0.95
 * fractionArgument("confidence", 95, 0.95);   // throws BadArgument: ... for 95% write 0.95.
 */
export function fractionArgument(name: string, raw: unknown, fallback?: number, example = "0.95"): number {
  const x = numberArgument(name, raw, fallback, example);
  if (x > 0 && x < 1) return x;
  throw new BadArgument(`Argument ${name} must lie strictly between 0 and 1, such as ${example}; got ${x}.${percentHint(x, 100)}`);
}

/**
 * A probability from 0 to 1 inclusive, such as the chance that a value lies above the hypothesised median.
 *
 * @example
 * probabilityArgument("p_above", 1, "0.75");   // 1
 * probabilityArgument("p_above", 1.2, "0.75"); // throws BadArgument
 */
export function probabilityArgument(name: string, raw: unknown, example: string): number {
  const x = numberArgument(name, raw, undefined, example);
  if (x >= 0 && x <= 1) return x;
  throw new BadArgument(`Argument ${name} must lie between 0 and 1, such as ${example}; got ${x}.${percentHint(x, 100.5)}`);
}

/** Largest sample size accepted by POWER: the binomial core is exact up to 1e9. */
export const LARGEST_N = 1e9;

/**
 * A sample size: a whole number from 1 to LARGEST_N.
 *
 * @example
 * sampleSizeArgument("n", 30);  // 30
 * sampleSizeArgument("n", 2.5); // throws BadArgument
 */
export function sampleSizeArgument(name: string, raw: unknown): number {
  const n = numberArgument(name, raw, undefined, "30");
  if (Number.isInteger(n) && n >= 1 && n <= LARGEST_N) return n;
  throw new BadArgument(`Argument ${name} must be a whole number from 1 to 1,000,000,000, such as 30; got ${n}.`);
}

/**
 * A range argument as rows of cells. A single value (a literal or one cell
 * passed where a range is expected) is taken as a range of one cell.
 *
 * @example
 * cellsArgument("data", [[1], [2]]); // [[1], [2]]
 * cellsArgument("data", 7);          // [[7]]
 */
export function cellsArgument(name: string, raw: unknown): Cells {
  if (!Array.isArray(raw)) return [[raw]];
  if (raw.length === 0 || !Array.isArray(raw[0]))
    throw new BadArgument(`Argument ${name} must be a range of cells, such as A2:A40 or Table1[Thickness].`);
  return raw as Cells;
}

function outline(cells: Cells): string {
  const rows = cells.length;
  const columns = cells[0].length;
  return `${rows} row${rows === 1 ? "" : "s"} × ${columns} column${columns === 1 ? "" : "s"}`;
}

/**
 * Two ranges of the same shape, as the paired functions need (cell k of one is paired with cell k of the other).
 *
 * @example
 * pairedCellsArgument([[1], [2]], [[3], [4]]); // { first: [[1], [2]], second: [[3], [4]] }
 * pairedCellsArgument([[1], [2]], [[3]]);      // throws BadArgument: ... first is 2 rows × 1 column, second is 1 row × 1 column.
 */
export function pairedCellsArgument(rawFirst: unknown, rawSecond: unknown): { first: Cells; second: Cells } {
  const first = cellsArgument("first", rawFirst);
  const second = cellsArgument("second", rawSecond);
  if (first.length !== second.length || first[0].length !== second[0].length) {
    throw new BadArgument(
      `Arguments first and second must have the same shape, pair by pair: first is ${outline(first)}, second is ${outline(second)}.`,
    );
  }
  return { first, second };
}
