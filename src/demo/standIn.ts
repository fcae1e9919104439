/**
 * A stand-in for Excel's custom-functions runtime, so that the demo sheet
 * evaluates formulas with the very bundle Excel loads (dist/functions.js):
 * the bundle registers each function through `CustomFunctions.associate`,
 * and the stand-in keeps them, with the argument shapes from the bundle's
 * metadata (dist/functions.json: a "matrix" parameter gets a range).
 *
 * Method: the runtime's documented surface — associate(id, fn) (or a map of
 * ids to functions), the Error class and the ErrorCode strings (Microsoft,
 * "CustomFunctions namespace", Office Add-ins API reference,
 * custom-functions-runtime).
 *
 * Cost: O(number of functions).
 */
import type { ArgumentShape, CustomFunction } from "./formula/evaluate";

type AnyFunction = (...args: unknown[]) => unknown;

/** The error codes a custom function can answer with, as the cell shows them. */
export const ERROR_CODES = {
  divisionByZero: "#DIV/0!",
  invalidName: "#NAME?",
  invalidNumber: "#NUM!",
  invalidReference: "#REF!",
  invalidValue: "#VALUE!",
  notAvailable: "#N/A",
  nullReference: "#NULL!",
} as const;

/** An error value as the stand-in runtime makes it: the code the cell shows and the message behind it. */
export class StandInError {
  constructor(
    readonly code: string,
    readonly message?: string,
  ) {}
}

/**
 * Installs `CustomFunctions` on a global object as office.js first defines
 * it, with `associate` only (node_modules/@microsoft/office-js/dist/
 * office.debug.js), and returns the map that fills up as the bundle registers
 * its functions (ids in upper case, as office.js files them). The error class
 * is not there yet: `addHostErrors` brings it, as Excel's host script does
 * later, so a bundle that waits for it before registering fails here as it
 * would in Excel.
 *
 * @example
 * const registered = installStandIn(window);
 * await loadScript("functions.js"); // registered.get("PVALUE") is now the bundle's function
 * addHostErrors(window);
 */
export function installStandIn(target: object): Map<string, AnyFunction> {
  const registered = new Map<string, AnyFunction>();
  const associate = (idOrMap: string | Record<string, AnyFunction>, fn?: AnyFunction): void => {
    if (typeof idOrMap === "string") {
      if (fn) registered.set(idOrMap.toUpperCase(), fn);
      return;
    }
    for (const [id, f] of Object.entries(idOrMap)) registered.set(id.toUpperCase(), f);
  };
  Object.defineProperty(target, "CustomFunctions", {
    value: { associate },
    configurable: true,
    writable: true,
  });
  return registered;
}

/**
 * Adds the `Error` class and `ErrorCode` values to the stand-in, as Excel's
 * host script (excel-web-16.00.js in the same package) adds them to
 * office.js's stub after the page's scripts have run.
 *
 * @example
 * addHostErrors(window); // CustomFunctions.Error is now StandInError
 */
export function addHostErrors(target: object): void {
  const runtime = (target as { CustomFunctions?: object }).CustomFunctions;
  if (runtime) Object.assign(runtime, { Error: StandInError, ErrorCode: { ...ERROR_CODES } });
}

/**
 * Loads a script of the page's own origin and waits for it to run.
 *
 * @example
 * await loadScript("functions.js");
 */
export function loadScript(src: string): Promise<void> {
  return new Promise((resolve, reject) => {
    const script = document.createElement("script");
    script.src = src;
    script.addEventListener("load", () => resolve());
    script.addEventListener("error", () => reject(new Error(`${src} could not be loaded; run npm run build first.`)));
    document.head.appendChild(script);
  });
}

interface MetadataParameter {
  readonly dimensionality?: string;
}

interface MetadataFunction {
  readonly id?: string;
  readonly parameters?: readonly MetadataParameter[];
  readonly result?: { readonly dimensionality?: string };
  readonly options?: { readonly requiresParameterAddresses?: boolean };
}

/** What a function's metadata declares: the shape of each argument and of the answer, and whether it wants the arguments' addresses. */
export interface FunctionShape {
  readonly args: readonly ArgumentShape[];
  readonly result: ArgumentShape;
  readonly parameterAddresses: boolean;
}

/**
 * Argument and result shapes per function id from custom-functions metadata
 * (functions.json; a missing dimensionality means scalar — Microsoft,
 * "Manually create JSON metadata for custom functions").
 *
 * @example
 * shapesFrom({ functions: [{ id: "PVALUE", parameters: [{ dimensionality: "matrix" }, { }] }] }).get("PVALUE"); // { args: ["matrix", "scalar"], result: "scalar", parameterAddresses: false }
 */
export function shapesFrom(metadata: unknown): Map<string, FunctionShape> {
  const shapes = new Map<string, FunctionShape>();
  const list = (metadata as { functions?: readonly MetadataFunction[] } | null)?.functions ?? [];
  const shape = (dimensionality: string | undefined): ArgumentShape => (dimensionality === "matrix" ? "matrix" : "scalar");
  for (const f of list) {
    if (typeof f.id !== "string") continue;
    shapes.set(f.id.toUpperCase(), {
      args: (f.parameters ?? []).map((p) => shape(p.dimensionality)),
      result: shape(f.result?.dimensionality),
      parameterAddresses: f.options?.requiresParameterAddresses === true,
    });
  }
  return shapes;
}

/**
 * The registered functions joined with their shapes, ready for the workbook.
 * A function the metadata does not declare is left out: Excel knows a custom
 * function only through its metadata, so a formula calling it shows #NAME?
 * (same page).
 *
 * @example
 * withShapes(registered, shapesFrom(metadata)).get("PVALUE"); // { fn, shapes: ["matrix", "scalar", ...], result: "scalar" }
 */
export function withShapes(
  registered: ReadonlyMap<string, AnyFunction>,
  shapes: ReadonlyMap<string, FunctionShape>,
): Map<string, CustomFunction> {
  const joined = new Map<string, CustomFunction>();
  for (const [id, fn] of registered) {
    const shape = shapes.get(id);
    if (shape) joined.set(id, { fn, shapes: shape.args, result: shape.result, parameterAddresses: shape.parameterAddresses });
  }
  return joined;
}
