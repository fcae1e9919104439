/**
 * How failures reach a cell. Only #VALUE! and #N/A carry a message in the
 * spreadsheet (see runtime.ts), so every failure becomes one of the two:
 *
 * - a bad argument (`BadArgument`, thrown by the argument checks) becomes
 *   #VALUE! with its message, which says what was wrong and what is accepted;
 * - an ordinary data condition (the core's `Unavailable`) becomes #N/A with
 *   the core's message, which says why and, where it helps, how many values
 *   would do;
 * - anything else is a fault of ours: it becomes #VALUE! with a calm generic
 *   message, never the exception's own text (which would mean nothing to the
 *   person at the sheet and could expose internals).
 *
 * A result that is not a finite number is treated as a fault too: a cell must
 * never show a wrong number.
 *
 * Cost: O(1) per failure.
 */
import type { Unavailable } from "../stats/types";
import { cellError, type CellError } from "./runtime";

/** A bad argument, phrased for the person who typed the formula. */
export class BadArgument extends Error {
  constructor(message: string) {
    super(message);
    this.name = "BadArgument";
  }
}

/** The message for faults of ours; deliberately says nothing about the inside of the code. */
export const GENERIC_MESSAGE =
  "Evensplit could not work this result out. Check that the ranges hold numbers and the options are accepted words; if they are, please report the formula.";

/**
 * The cell error for anything thrown while a function ran.
 *
 * @example
 * errorFor(new BadArgument("confidence must be between 0 and 1, such as 0.95.")); // #VALUE! with that message
 * errorFor(new TypeError("x is undefined")); // #VALUE! with GENERIC_MESSAGE
 */
export function errorFor(thrown: unknown): CellError {
  if (thrown instanceof BadArgument) return cellError("#VALUE!", thrown.message);
  return cellError("#VALUE!", GENERIC_MESSAGE);
}

/**
 * The cell error for a result the data cannot give.
 *
 * @example
 * unavailableError(unavailable("no-data", "No numbers in the range.")); // #N/A "No numbers in the range."
 */
export function unavailableError(result: Unavailable): CellError {
  return cellError("#N/A", result.message);
}

/**
 * A number for a cell, or the generic error when the core produced NaN or an infinity.
 *
 * @example
 * finiteOrFault(0.25); // 0.25
 * finiteOrFault(NaN);  // #VALUE! with GENERIC_MESSAGE
 */
export function finiteOrFault(x: number): number | CellError {
  return Number.isFinite(x) ? x : cellError("#VALUE!", GENERIC_MESSAGE);
}

/**
 * Runs a scalar function body; anything it throws becomes a cell error.
 *
 * @example
 * scalar(() => { throw new BadArgument("..."); }); // #VALUE! "..."
 */
export function scalar(body: () => number | CellError): number | CellError {
  try {
    const result = body();
    return typeof result === "number" ? finiteOrFault(result) : result;
  } catch (thrown) {
    return errorFor(thrown);
  }
}

/** A value in a one-row result: a number, an empty end of a one-sided bound (""), a word (a method's name), or an error. */
export type RowCell = number | string | CellError;

/**
 * Runs a function body that answers with one row of `width` cells; a failure
 * fills the whole row with the error, so every spilled cell (and every
 * INDEX(…,1,k) into it) shows it.
 *
 * @example
 * oneRow(3, () => [1, 2, 0.95]);                  // [[1, 2, 0.95]]
 * oneRow(3, () => unavailableError(someResult));  // [[#N/A, #N/A, #N/A]]
 */
export function oneRow(width: number, body: () => RowCell[] | CellError): RowCell[][] {
  let cells: RowCell[] | CellError;
  try {
    cells = body();
  } catch (thrown) {
    cells = errorFor(thrown);
  }
  if (!Array.isArray(cells)) return [new Array<RowCell>(width).fill(cells)];
  const faulty = cells.some((c) => typeof c === "number" && !Number.isFinite(c));
  return [faulty ? new Array<RowCell>(width).fill(cellError("#VALUE!", GENERIC_MESSAGE)) : cells];
}
