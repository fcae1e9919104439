/**
 * The one place that touches the host's custom-functions runtime.
 *
 * Inside Excel, Office.js defines a global `CustomFunctions` with
 * `associate(id, fn)`, the `Error` class and the `ErrorCode` values
 * ("#VALUE!", "#N/A", ...; custom messages are shown for #VALUE! and #N/A
 * only — Microsoft, "CustomFunctions.ErrorCode enum", Office Add-ins API
 * reference, custom-functions-runtime, API set CustomFunctionsRuntime 1.2).
 * Elsewhere (the in-page demo, unit tests) there is no such global; then
 * errors are plain objects of the same shape and registration does nothing,
 * so the same code runs everywhere.
 *
 * The build appends `CustomFunctions.associate("ID", fn)` for every function
 * of functions.ts (custom-functions-metadata-plugin); webpack.config.js
 * points that free name at `registrar` below, which hands each pair on to the
 * host when there is one.
 *
 * Cost: O(1) per call.
 */

/** An error value for a cell: the code shown in the cell and the message shown on hover. */
export interface CellError {
  readonly code: string;
  readonly message?: string;
}

interface HostRuntime {
  associate(id: string, fn: (...args: never[]) => unknown): void;
  Error: new (code: string, message?: string) => CellError;
  ErrorCode: { readonly invalidValue: string; readonly notAvailable: string };
}

function host(): HostRuntime | undefined {
  const candidate = (globalThis as { CustomFunctions?: Partial<HostRuntime> }).CustomFunctions;
  return candidate && typeof candidate.Error === "function" && candidate.ErrorCode ? (candidate as HostRuntime) : undefined;
}

/** The codes this add-in answers with, as the cell shows them. */
export type CellErrorCode = "#VALUE!" | "#N/A";

/**
 * A cell error carrying a message: the host's own error object inside Excel,
 * an object of the same shape elsewhere.
 *
 * @example
 * cellError("#N/A", "No values left after setting aside the ties."); // { code: "#N/A", message: "No values ..." }
 */
export function cellError(code: CellErrorCode, message: string): CellError {
  const runtime = host();
  if (runtime === undefined) return { code, message };
  return new runtime.Error(code === "#VALUE!" ? runtime.ErrorCode.invalidValue : runtime.ErrorCode.notAvailable, message);
}

/** True for the error values `cellError` makes (either kind). */
export function isCellError(value: unknown): value is CellError {
  return typeof value === "object" && value !== null && typeof (value as { code?: unknown }).code === "string";
}

/**
 * What the build-time `CustomFunctions.associate(...)` lines call: passes each
 * registration to the host runtime when the page runs inside Excel.
 *
 * @example
 * registrar.associate("PVALUE", pvalue); // registers with Excel; no effect on a page without Office.js
 */
export const registrar = {
  associate(id: string, fn: (...args: never[]) => unknown): void {
    host()?.associate(id, fn);
  },
};
