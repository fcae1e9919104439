/**
 * The built add-in for the tests that check what ships: dist/ as `npm run build`
 * leaves it, and dist/functions.js loaded in a fresh JavaScript context with a
 * stand-in for Excel's custom-functions runtime.
 *
 * The stand-in follows the runtime's documented surface: `associate(id, fn)`,
 * `new Error(code, message)` and the `ErrorCode` strings ("#VALUE!", "#N/A", ...)
 * (Microsoft, "CustomFunctions.ErrorCode enum" and "CustomFunctions.Error class",
 * Office Add-ins API reference, custom-functions-runtime).
 */
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { createContext, runInContext } from "node:vm";
import { ERROR_CODES, StandInError } from "../../src/demo/standIn";

/** The built add-in; EVENSPLIT_DIST points at a private build (as for the browser tests). */
export const DIST = process.env.EVENSPLIT_DIST ?? fileURLToPath(new URL("../../dist", import.meta.url));

/** Contents of a file in dist/; a clear failure when the build has not run. */
export function distText(name: string): string {
  const file = join(DIST, name);
  if (!existsSync(file)) throw new Error(`dist/${name} is missing: run \`npm run build\` before these tests (npm test does).`);
  return readFileSync(file, "utf8");
}

export { ERROR_CODES, StandInError };

export type Registered = (...args: unknown[]) => unknown;

export interface LoadedBundle {
  /** Ids in the order functions.js registered them. */
  readonly ids: string[];
  /** The registered function for an id. */
  readonly fns: ReadonlyMap<string, Registered>;
  /** Calls a registered function; throws when the id was never registered. */
  call(id: string, ...args: unknown[]): unknown;
}

/**
 * Runs dist/functions.js in a new context whose only globals are the
 * JavaScript built-ins, `console` and `CustomFunctions` as Excel builds it:
 * first office.js's stub (`associate`, `_association`, `delayInitialization`:
 * node_modules/@microsoft/office-js/dist/office.debug.js, where `associate`
 * files each function under its id in upper case), and only after the bundle
 * has run the `Error` class and `ErrorCode` values, which Excel's host script
 * adds later (excel-web-16.00.js in the same package). A bundle that waited
 * for `Error` before registering would register nothing here. With
 * `webAssembly: false` the context has no `WebAssembly`, as in a runtime that
 * lacks it or refuses it.
 */
export function loadFunctionsBundle(options: { webAssembly?: boolean } = {}): LoadedBundle {
  const ids: string[] = [];
  const fns = new Map<string, Registered>();
  const mappings: Record<string, Registered> = {};
  const CustomFunctions: Record<string, unknown> = {
    delayInitialization() {},
    _association: { mappings },
    associate(id: string, fn: Registered) {
      ids.push(id);
      fns.set(id, fn);
      mappings[id.toUpperCase()] = fn;
    },
  };
  const context = createContext({ CustomFunctions, console, ...(options.webAssembly === false ? { WebAssembly: undefined } : {}) });
  runInContext(distText("functions.js"), context, { filename: "dist/functions.js" });
  Object.assign(CustomFunctions, { Error: StandInError, ErrorCode: ERROR_CODES });
  return {
    ids,
    fns,
    call(id, ...args) {
      const fn = fns.get(id);
      if (fn === undefined) throw new Error(`functions.js did not register ${id}`);
      return fn(...args);
    },
  };
}

/** The ids dist/functions.json declares. */
export function metadataIds(): string[] {
  const metadata = JSON.parse(distText("functions.json")) as { functions: { id: string }[] };
  return metadata.functions.map((f) => f.id);
}
