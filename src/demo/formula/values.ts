/**
 * The values a formula in the demo sheet can produce: the scalars a cell can
 * hold, error values, matrices (function results that spill) and references
 * (kept lazy so ROWS and COLUMNS never read the cells).
 *
 * Method: plain tagged objects; error codes are the spreadsheet's own (common
 * practice: #VALUE!, #N/A, #REF!, #NAME?, #DIV/0!, #NUM!, #SPILL!).
 *
 * Cost: O(1) per value.
 */
import type { CellRect } from "../../taskpane/a1";

/** An error value with the code the cell shows and a message shown on hover. */
export interface ErrorValue {
  readonly kind: "error";
  readonly code: string;
  readonly message: string;
}

/** What one cell holds after calculation; null is a blank cell. */
export type Scalar = number | string | boolean | null | ErrorValue;

export interface MatrixValue {
  readonly kind: "matrix";
  readonly rows: readonly (readonly Scalar[])[];
}

/** A rectangle of cells on a sheet, not yet read. */
export interface ReferenceValue {
  readonly kind: "reference";
  readonly sheet: string;
  readonly rect: CellRect;
}

export type Value = Scalar | MatrixValue | ReferenceValue;

/**
 * An error value.
 *
 * @example
 * errorValue("#VALUE!", "Text cannot be multiplied."); // { kind: "error", code: "#VALUE!", message: "..." }
 */
export function errorValue(code: string, message: string): ErrorValue {
  return { kind: "error", code, message };
}

/**
 * True for error values.
 *
 * @example
 * isError(errorValue("#N/A", "")); // true
 */
export function isError(value: unknown): value is ErrorValue {
  return typeof value === "object" && value !== null && (value as { kind?: unknown }).kind === "error";
}

/**
 * True for matrix values (a function's answer of several cells).
 *
 * @example
 * isMatrix({ kind: "matrix", rows: [[1, 2]] }); // true
 */
export function isMatrix(value: Value): value is MatrixValue {
  return typeof value === "object" && value !== null && value.kind === "matrix";
}

/**
 * True for references not yet read.
 *
 * @example
 * isReference({ kind: "reference", sheet: "S", rect: { top: 0, left: 0, bottom: 0, right: 0 } }); // true
 */
export function isReference(value: Value): value is ReferenceValue {
  return typeof value === "object" && value !== null && value.kind === "reference";
}
