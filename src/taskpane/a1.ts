/**
 * A1 addresses: parsing and printing the cell and range addresses the Office
 * JavaScript API hands back ("'Paint line'!$A$1:$B$26", "Sheet1!C:C").
 *
 * Method: a single regular expression per address; sheet names that are not a
 * plain word are quoted with doubled apostrophes, as the spreadsheet does
 * (common practice, Excel's own address syntax). Rows and columns are 0-based
 * inside the program and printed 1-based / as letters.
 *
 * Cost: O(length of the address).
 */

/** Last row and column index (0-based) of an Excel worksheet: 1,048,576 rows, 16,384 columns (XFD). */
export const LAST_ROW = 1_048_575;
export const LAST_COLUMN = 16_383;

/** A rectangle of cells, 0-based and inclusive at both ends. */
export interface CellRect {
  readonly top: number;
  readonly left: number;
  readonly bottom: number;
  readonly right: number;
}

/** A parsed address: the rectangle, and the sheet when the address named one. */
export interface ParsedAddress extends CellRect {
  readonly sheet?: string;
}

/**
 * Column letters for a 0-based column index.
 *
 * @example
 * columnLetters(0);  // "A"
 * columnLetters(27); // "AB"
 */
export function columnLetters(column: number): string {
  if (!Number.isInteger(column) || column < 0 || column > LAST_COLUMN) throw new RangeError(`no column ${column}`);
  let letters = "";
  let rest = column + 1;
  while (rest > 0) {
    const digit = (rest - 1) % 26;
    letters = String.fromCharCode(65 + digit) + letters;
    rest = (rest - 1 - digit) / 26;
  }
  return letters;
}

/**
 * 0-based column index for column letters (any case).
 *
 * @example
 * columnIndex("AB"); // 27
 */
export function columnIndex(letters: string): number {
  let index = 0;
  for (const ch of letters.toUpperCase()) {
    const code = ch.charCodeAt(0);
    if (code < 65 || code > 90) throw new RangeError(`"${letters}" is not a column`);
    index = index * 26 + (code - 64);
  }
  return index - 1;
}

/**
 * Quotes a sheet name when the spreadsheet would: anything but letters, digits, points and underscores, a leading digit, or a name that reads as a cell.
 *
 * @example
 * quoteSheet("Paint line"); // "'Paint line'"
 */
export function quoteSheet(sheet: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) && !/^[A-Za-z]{1,3}[0-9]+$/.test(sheet) ? sheet : `'${sheet.replace(/'/g, "''")}'`;
}

/**
 * The A1 text of a rectangle, optionally with a sheet prefix. Full-height
 * rectangles print as column ranges ("C:C").
 *
 * @example
 * formatAddress({ top: 0, left: 0, bottom: 25, right: 1 }, "Paint line"); // "'Paint line'!A1:B26"
 */
export function formatAddress(rect: CellRect, sheet?: string): string {
  const prefix = sheet === undefined ? "" : `${quoteSheet(sheet)}!`;
  if (rect.top === 0 && rect.bottom === LAST_ROW) return `${prefix}${columnLetters(rect.left)}:${columnLetters(rect.right)}`;
  const start = `${columnLetters(rect.left)}${rect.top + 1}`;
  if (rect.top === rect.bottom && rect.left === rect.right) return prefix + start;
  return `${prefix}${start}:${columnLetters(rect.right)}${rect.bottom + 1}`;
}

const CELL = String.raw`\$?([A-Za-z]{1,3})\$?([0-9]{1,7})`;
const COLUMN = String.raw`\$?([A-Za-z]{1,3})`;
const SHEET = String.raw`(?:'((?:[^']|'')+)'|([^'!:\s]+))!`;
const CELL_RANGE = new RegExp(`^(?:${SHEET})?${CELL}(?::${CELL})?$`);
const COLUMN_RANGE = new RegExp(`^(?:${SHEET})?${COLUMN}:${COLUMN}$`);

function inSheet(row: number, column: number): boolean {
  return row >= 0 && row <= LAST_ROW && column >= 0 && column <= LAST_COLUMN;
}

/**
 * Parses an A1 address (cell, range or whole columns, with optional sheet
 * prefix and `$` signs). Returns null for anything else, so a person's typing
 * can be checked without exceptions.
 *
 * @example
 * parseAddress("'Paint line'!$A$2:A26"); // { sheet: "Paint line", top: 1, left: 0, bottom: 25, right: 0 }
 * parseAddress("B:C");                   // { top: 0, left: 1, bottom: 1048575, right: 2 }
 */
export function parseAddress(text: string): ParsedAddress | null {
  const trimmed = text.trim();
  const cells = CELL_RANGE.exec(trimmed);
  if (cells) {
    const sheet = cells[1] !== undefined ? cells[1].replace(/''/g, "'") : cells[2];
    const r1 = Number(cells[4]) - 1;
    const c1 = columnIndex(cells[3]);
    const r2 = cells[6] === undefined ? r1 : Number(cells[6]) - 1;
    const c2 = cells[5] === undefined ? c1 : columnIndex(cells[5]);
    if (!inSheet(r1, c1) || !inSheet(r2, c2)) return null;
    const rect = { top: Math.min(r1, r2), left: Math.min(c1, c2), bottom: Math.max(r1, r2), right: Math.max(c1, c2) };
    return sheet === undefined ? rect : { sheet, ...rect };
  }
  const columns = COLUMN_RANGE.exec(trimmed);
  if (columns) {
    const sheet = columns[1] !== undefined ? columns[1].replace(/''/g, "'") : columns[2];
    const c1 = columnIndex(columns[3]);
    const c2 = columnIndex(columns[4]);
    if (!inSheet(0, c1) || !inSheet(0, c2)) return null;
    const rect = { top: 0, left: Math.min(c1, c2), bottom: LAST_ROW, right: Math.max(c1, c2) };
    return sheet === undefined ? rect : { sheet, ...rect };
  }
  return null;
}

/**
 * Number of rows and columns of a rectangle.
 *
 * @example
 * rectSize({ top: 1, left: 1, bottom: 24, right: 2 }); // { rows: 24, columns: 2 }
 */
export function rectSize(rect: CellRect): { rows: number; columns: number } {
  return { rows: rect.bottom - rect.top + 1, columns: rect.right - rect.left + 1 };
}

/**
 * True when `inner` lies completely inside `outer`.
 *
 * @example
 * rectContains({ top: 0, left: 0, bottom: 9, right: 2 }, { top: 1, left: 1, bottom: 9, right: 1 }); // true
 */
export function rectContains(outer: CellRect, inner: CellRect): boolean {
  return inner.top >= outer.top && inner.bottom <= outer.bottom && inner.left >= outer.left && inner.right <= outer.right;
}

/**
 * True when the two rectangles share at least one cell.
 *
 * @example
 * rectsOverlap({ top: 0, left: 0, bottom: 4, right: 0 }, { top: 4, left: 0, bottom: 9, right: 1 }); // true
 */
export function rectsOverlap(a: CellRect, b: CellRect): boolean {
  return a.left <= b.right && b.left <= a.right && a.top <= b.bottom && b.top <= a.bottom;
}
