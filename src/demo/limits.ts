/**
 * What Excel refuses to put into a cell, so that the demo sheet refuses the
 * same entries instead of storing them.
 *
 * Method: Microsoft, "Excel specifications and limits": a worksheet has
 * 1,048,576 rows by 16,384 columns, a cell holds at most 32,767 characters
 * and a formula's contents at most 8,192 characters (counted here with the
 * leading "=", one stricter than needed). A formula whose text Excel cannot
 * read is refused rather than shown as #NAME? (the formula reader's
 * FormulaSyntaxError, which also enforces the 255-character limit on a text
 * constant inside a formula). Excel's API reports such a refusal as
 * InvalidArgument (Microsoft, "Error handling with the application-specific
 * JavaScript APIs", error codes).
 *
 * Cost: O(1) per entry, apart from reading the formula.
 */
import { LAST_COLUMN, LAST_ROW, type CellRect } from "../taskpane/a1";

/** Characters in one cell (Microsoft, "Excel specifications and limits"). */
export const MAX_CELL_CHARACTERS = 32_767;
/** Characters of a formula's contents (same page). */
export const MAX_FORMULA_CHARACTERS = 8_192;

/**
 * An entry or an area Excel would refuse; nothing of the write it belongs to has been applied.
 *
 * @example
 * throw new RefusedEntry("A cell holds at most 32,767 characters; this text has 40,000.");
 */
export class RefusedEntry extends Error {
  constructor(message: string) {
    super(message);
    this.name = "RefusedEntry";
  }
}

/**
 * Why Excel would refuse a text or formula of this length in one cell, or null when it fits.
 *
 * @example
 * lengthRefusal("=" + "1+".repeat(5000) + "1"); // "A formula holds at most 8,192 characters; this one has 10,002."
 * lengthRefusal("Thickness");                    // null
 */
export function lengthRefusal(text: string, isFormula: boolean): string | null {
  if (isFormula && text.length > MAX_FORMULA_CHARACTERS) {
    return `A formula holds at most 8,192 characters; this one has ${text.length.toLocaleString("en-US")}.`;
  }
  if (!isFormula && text.length > MAX_CELL_CHARACTERS) {
    return `A cell holds at most 32,767 characters; this text has ${text.length.toLocaleString("en-US")}.`;
  }
  return null;
}

/**
 * Why an area does not fit on a worksheet, or null when it does.
 *
 * @example
 * areaRefusal({ top: 0, left: 16_383, bottom: 0, right: 16_384 }); // "The area runs past column XFD, the last of the sheet."
 */
export function areaRefusal(rect: CellRect): string | null {
  if (![rect.top, rect.left, rect.bottom, rect.right].every(Number.isInteger) || rect.top < 0 || rect.left < 0) {
    return "The area does not start on the sheet.";
  }
  if (rect.bottom > LAST_ROW) return "The area runs past row 1,048,576, the last of the sheet.";
  if (rect.right > LAST_COLUMN) return "The area runs past column XFD, the last of the sheet.";
  return null;
}

/** Characters of a worksheet's name (Microsoft Support, "Rename a worksheet"). */
export const MAX_SHEET_NAME_CHARACTERS = 31;

/**
 * Why Excel would refuse this name for a new worksheet, or null when it may
 * have it. Microsoft Support, "Rename a worksheet" (its note on names, from
 * memory: the page was not at hand): a name is not blank, has at most 31
 * characters, holds none of / \ ? * : [ ], neither starts nor ends with an
 * apostrophe, and is not "History", which Excel keeps for itself. No two
 * sheets share a name, compared without regard to case (from memory).
 *
 * @example
 * sheetNameRefusal("Q1/Q2", ["Sheet1"]); // 'A sheet name cannot hold / \ ? * : [ or ]; "Q1/Q2" does.'
 * sheetNameRefusal("Evensplit check", ["Sheet1"]); // null
 */
export function sheetNameRefusal(name: string, existing: readonly string[]): string | null {
  if (name.trim() === "") return "A sheet name cannot be blank.";
  if (name.length > MAX_SHEET_NAME_CHARACTERS) return `A sheet name has at most 31 characters; "${name}" has ${name.length}.`;
  if (/[/\\?*:[\]]/.test(name)) return `A sheet name cannot hold / \\ ? * : [ or ]; "${name}" does.`;
  if (name.startsWith("'") || name.endsWith("'")) return `A sheet name cannot start or end with an apostrophe; "${name}" does.`;
  if (name.toLowerCase() === "history") return "Excel keeps the sheet name History for itself.";
  if (existing.some((other) => other.toLowerCase() === name.toLowerCase())) return `The workbook already has a sheet named ${name}.`;
  return null;
}
