/**
 * The demo's custom-functions runtime arrives in the same two steps as
 * Excel's: office.js's stub with `associate` only, then the error class from
 * Excel's host script (node_modules/@microsoft/office-js/dist: office.debug.js
 * defines the stub and files ids in upper case; excel-web-16.00.debug.js adds
 * `Error` and `ErrorCode`).
 */
import { describe, expect, it } from "vitest";
import { addHostErrors, ERROR_CODES, installStandIn, StandInError } from "../../src/demo/standIn";

describe("the demo's custom-functions runtime", () => {
  it("offers associate only until the host's errors are added, like office.js before Excel's host script", () => {
    const page = {} as { CustomFunctions?: Record<string, unknown> };
    const registered = installStandIn(page);
    expect(Object.keys(page.CustomFunctions ?? {})).toEqual(["associate"]);
    (page.CustomFunctions?.associate as (id: string, fn: () => number) => void)("pValue", () => 1);
    expect([...registered.keys()]).toEqual(["PVALUE"]);
    addHostErrors(page);
    expect(page.CustomFunctions?.Error).toBe(StandInError);
    expect(page.CustomFunctions?.ErrorCode).toEqual(ERROR_CODES);
  });
});
