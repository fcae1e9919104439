/**
 * How failures become cell errors. The rule that only #VALUE! and #N/A carry
 * messages is from Microsoft, "CustomFunctions.ErrorCode enum" (Office Add-ins
 * API reference, custom-functions-runtime); the stand-in runtime in dist.ts
 * follows that reference.
 */
import { afterEach, describe, expect, it } from "vitest";
import { BadArgument, GENERIC_MESSAGE, errorFor, finiteOrFault, oneRow, scalar, unavailableError } from "../../src/functions/errors";
import { cellError, isCellError, registrar } from "../../src/functions/runtime";
import { unavailable } from "../../src/stats/types";
import { ERROR_CODES, StandInError } from "./dist";

const globals = globalThis as { CustomFunctions?: unknown };

afterEach(() => {
  delete globals.CustomFunctions;
});

function installStandIn(): string[] {
  const registered: string[] = [];
  globals.CustomFunctions = { associate: (id: string) => registered.push(id), Error: StandInError, ErrorCode: ERROR_CODES };
  return registered;
}

describe("cell errors", () => {
  it("are the host's own error objects inside Excel", () => {
    installStandIn();
    const e = cellError("#N/A", "No numbers in the range.");
    expect(e).toBeInstanceOf(StandInError);
    expect(e).toEqual(new StandInError("#N/A", "No numbers in the range."));
    expect(cellError("#VALUE!", "bad").code).toBe("#VALUE!");
  });

  it("are plain objects of the same shape where there is no Office.js", () => {
    expect(cellError("#VALUE!", "bad")).toEqual({ code: "#VALUE!", message: "bad" });
    expect(isCellError(cellError("#N/A", "x"))).toBe(true);
    expect(isCellError(0.5)).toBe(false);
    expect(isCellError(null)).toBe(false);
  });

  it("registers with office.js's stub before Excel's host script brings the error class, which is looked up when a function answers", () => {
    // office.js defines CustomFunctions with associate() only; Error and ErrorCode arrive later
    // (node_modules/@microsoft/office-js/dist: office.debug.js, then excel-web-16.00.debug.js).
    const registered: string[] = [];
    globals.CustomFunctions = { associate: (id: string) => registered.push(id), _association: { mappings: {} } };
    registrar.associate("PVALUE", () => 1);
    expect(registered).toEqual(["PVALUE"]);
    expect(cellError("#N/A", "too few")).toEqual({ code: "#N/A", message: "too few" });
    Object.assign(globals.CustomFunctions as object, { Error: StandInError, ErrorCode: ERROR_CODES });
    expect(cellError("#N/A", "too few")).toBeInstanceOf(StandInError);
  });

  it("registration reaches the host when there is one and does nothing otherwise", () => {
    expect(() => registrar.associate("PVALUE", () => 1)).not.toThrow();
    const registered = installStandIn();
    registrar.associate("PVALUE", () => 1);
    expect(registered).toEqual(["PVALUE"]);
  });
});

describe("mapping failures", () => {
  it("gives a bad argument's own message as #VALUE!", () => {
    expect(errorFor(new BadArgument("confidence must lie strictly between 0 and 1."))).toEqual({
      code: "#VALUE!",
      message: "confidence must lie strictly between 0 and 1.",
    });
  });

  it("never shows the text of any other exception", () => {
    for (const thrown of [
      new TypeError("Cannot read properties of undefined (reading 'length')"),
      new RangeError("countSigns: value 3 is NaN"),
      "boom",
      42,
    ]) {
      const e = errorFor(thrown);
      expect(e).toEqual({ code: "#VALUE!", message: GENERIC_MESSAGE });
      expect(e.message).not.toMatch(/undefined|countSigns|boom|42/);
    }
  });

  it("gives an Unavailable result's message as #N/A", () => {
    expect(unavailableError(unavailable("too-few-values", "3 values are too few: at least 6 are needed.", 6))).toEqual({
      code: "#N/A",
      message: "3 values are too few: at least 6 are needed.",
    });
  });

  it("never lets NaN or an infinity through as a number", () => {
    expect(finiteOrFault(0.25)).toBe(0.25);
    expect(scalar(() => NaN)).toEqual({ code: "#VALUE!", message: GENERIC_MESSAGE });
    expect(scalar(() => Infinity)).toEqual({ code: "#VALUE!", message: GENERIC_MESSAGE });
    expect(oneRow(3, () => [1, NaN, 0.9])).toEqual([Array(3).fill({ code: "#VALUE!", message: GENERIC_MESSAGE })]);
  });

  it("fills the whole row with the error, so every INDEX into it shows it", () => {
    const na = cellError("#N/A", "too few");
    expect(oneRow(4, () => na)).toEqual([[na, na, na, na]]);
    expect(
      oneRow(2, () => {
        throw new BadArgument("side");
      }),
    ).toEqual([
      [
        { code: "#VALUE!", message: "side" },
        { code: "#VALUE!", message: "side" },
      ],
    ]);
    expect(oneRow(3, () => [1, "", 0.95])).toEqual([[1, "", 0.95]]);
  });
});
