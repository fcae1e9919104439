/**
 * The one place that touches the host's custom-functions runtime.
 *
 * Inside Excel the runtime arrives in two steps. Office.js (office.js, loaded
 * by the page) first defines a global `CustomFunctions` stub holding only
 * `associate(id, fn)` (and the association table it fills); the `Error`
 * class and the `ErrorCode` values ("#VALUE!", "#N/A", ...) come later with
 * Excel's host script, which Office.js loads asynchronously once it knows it
 * runs in Excel (seen in the package @microsoft/office-js: office.js defines
 * the stub, excel-web-16.00.js and its siblings add `Error` and `ErrorCode`).
 * So registration needs `associate` only, and the error class is looked up
 * each time a function answers with an error, by which time the host script
 * is there. Custom messages are shown for #VALUE! and #N/A (Microsoft,
 * "CustomFunctions.ErrorCode enum", Office Add-ins API reference,
 * custom-functions-runtime, API set CustomFunctionsRuntime 1.2).
 *
 * Elsewhere (the in-page demo without Office.js, unit tests) there may be no
 * such global; then errors are plain objects of the same shape and
 * registration does nothing, so the same code runs everywhere.
 *
 * The build appends `CustomFunctions.associate("ID", fn)` for every function
 * of functions.ts (custom-functions-metadata-plugin); webpack.config.js
 * points that free name at `registrar` below, which hands each pair on to the
 * host's `associate` when there is one.
 *
 * Cost: O(1) per call.
 */

/** An error value for a cell: the code shown in the cell and the message shown on hover. */
export interface CellError {
  readonly code: string;
  readonly message?: string;
}

type Registration = (...args: never[]) => unknown;

/** What office.js defines before Excel's host script has loaded (types: @types/custom-functions-runtime). */
type RuntimeStub = Pick<typeof CustomFunctions, "associate">;

/** What Excel's host script adds to the stub. */
type RuntimeErrors = Pick<typeof CustomFunctions, "Error" | "ErrorCode">;

function customFunctionsGlobal(): Partial<RuntimeStub & RuntimeErrors> | undefined {
  return (globalThis as { CustomFunctions?: Partial<RuntimeStub & RuntimeErrors> }).CustomFunctions;
}

/** The host's error class and codes, when its script has loaded them. */
function runtimeErrors(): RuntimeErrors | undefined {
  const candidate = customFunctionsGlobal();
  return candidate && typeof candidate.Error === "function" && candidate.ErrorCode ? (candidate as RuntimeErrors) : undefined;
}

/** The codes this add-in answers with, as the cell shows them. */
export type CellErrorCode = "#VALUE!" | "#N/A";

/**
 * A cell error carrying a message: the host's own error object inside Excel,
 * an object of the same shape elsewhere (or before the host script is there).
 *
 * @example
 * cellError("#N/A", "No values left after setting aside the ties."); // { code: "#N/A", message: "No values ..." }
 */
export function cellError(code: CellErrorCode, message: string): CellError {
  const runtime = runtimeErrors();
  if (runtime === undefined) return { code, message };
  return new runtime.Error(code === "#VALUE!" ? runtime.ErrorCode.invalidValue : runtime.ErrorCode.notAvailable, message);
}

/** True for the error values `cellError` makes (either kind). */
export function isCellError(value: unknown): value is CellError {
  return typeof value === "object" && value !== null && typeof (value as { code?: unknown }).code === "string";
}

/**
 * What the build-time `CustomFunctions.associate(...)` lines call: passes each
 * registration to the host's `associate` whenever the page has one, whether
 * or not the rest of the runtime has arrived yet.
 *
 * @example
 * registrar.associate("PVALUE", pvalue); // registers with Excel; no effect on a page without Office.js
 */
export const registrar = {
  associate(id: string, fn: Registration): void {
    const runtime = customFunctionsGlobal();
    if (typeof runtime?.associate === "function") runtime.associate(id, fn);
  },
};
