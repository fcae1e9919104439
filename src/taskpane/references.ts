/**
 * How the result block's formulas point at the data: a table column
 * (structured reference, so rows added to the table count), the exact cells,
 * or an open-ended range down to the last row of the sheet.
 *
 * Method: Excel's reference syntax. A column name goes inside a second pair
 * of brackets (Table1[[Temp. °C]]) whenever it holds anything but letters,
 * digits and underscores, and the characters [ ] # and ' are escaped with a
 * leading apostrophe (Microsoft, "Using structured references with Excel
 * tables", the rules on special characters and escape characters). The page
 * lists the characters that need the inner brackets (space only excepted);
 * the doubled form is valid for every name, so it is used for any character
 * outside the plain ones rather than trusting that list to be complete (an @,
 * for one, would otherwise read as "this row"). Cell references are absolute
 * ($B$2) so that a copied block keeps pointing at the same data.
 *
 * Cost: O(length of the names).
 */
import { columnLetters, LAST_ROW, quoteSheet, type CellRect } from "./a1";

/** A column name that needs no inner brackets: letters, digits and underscores of any script only. */
const PLAIN_NAME = /^[\p{L}\p{N}_]+$/u;

/**
 * A structured reference to a table column, in the form Excel accepts for any header.
 *
 * @example
 * structuredReference("Table1", "Thickness");      // "Table1[Thickness]"
 * structuredReference("Table1", "Temp. °C");       // "Table1[[Temp. °C]]"
 * structuredReference("Table1", "Lot #3");         // "Table1[[Lot '#3]]"
 */
export function structuredReference(table: string, column: string): string {
  const escaped = column.replace(/['[\]#]/g, (ch) => `'${ch}`);
  return PLAIN_NAME.test(column) ? `${table}[${escaped}]` : `${table}[[${escaped}]]`;
}

/**
 * An absolute A1 reference, with the sheet only when it differs from the sheet the formula is on.
 *
 * @example
 * absoluteReference({ top: 1, left: 1, bottom: 24, right: 1 }, "Paint line", "Paint line"); // "$B$2:$B$25"
 * absoluteReference({ top: 1, left: 1, bottom: 24, right: 1 }, "Paint line", "Summary");    // "'Paint line'!$B$2:$B$25"
 */
export function absoluteReference(rect: CellRect, sheet: string, formulaSheet: string): string {
  const prefix = sheet.toLowerCase() === formulaSheet.toLowerCase() ? "" : `${quoteSheet(sheet)}!`;
  const start = `$${columnLetters(rect.left)}$${rect.top + 1}`;
  const end = `$${columnLetters(rect.right)}$${rect.bottom + 1}`;
  return prefix + (start === end ? start : `${start}:${end}`);
}

/**
 * The same columns from the first data row down to the last row of the sheet.
 *
 * @example
 * openEnded({ top: 1, left: 1, bottom: 24, right: 1 }); // { top: 1, left: 1, bottom: 1048575, right: 1 }
 */
export function openEnded(rect: CellRect): CellRect {
  return { ...rect, bottom: LAST_ROW };
}
