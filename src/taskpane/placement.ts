/**
 * Where the result block goes: by default the first place to the right of
 * the data where the whole block fits on empty cells with an empty column on
 * its left;
 * and, for any place, which cells would be overwritten.
 *
 * Method: a left-to-right scan of a strip of the sheet as tall as the block;
 * a cell counts as filled when it has a formula or shows a value (so a cell
 * inside another formula's spilled answer counts as filled too).
 *
 * Cost: O(rows of the block × columns scanned).
 */
import { formatAddress, type CellRect } from "./a1";
import type { CellsRead } from "./host";

/** A cell that is not empty: its address and what it holds, shortened for a list. */
export interface FilledCell {
  readonly address: string;
  readonly content: string;
}

function empty(x: unknown): boolean {
  return x === "" || x === null || x === undefined;
}

const SHOWN_LENGTH = 40;

/** The non-empty cells of a read in reading order: address and whole content (the formula, else the value shown). */
function nonEmpty(read: CellsRead): { address: string; shown: string }[] {
  const found: { address: string; shown: string }[] = [];
  read.values.forEach((row, r) =>
    row.forEach((value, c) => {
      const formula = read.formulas[r]?.[c];
      if (empty(value) && empty(formula)) return;
      const cell = { top: read.rect.top + r, left: read.rect.left + c, bottom: read.rect.top + r, right: read.rect.left + c };
      found.push({ address: formatAddress(cell), shown: String(empty(formula) ? value : formula) });
    }),
  );
  return found;
}

/**
 * The cells of a read that are not empty, in reading order.
 *
 * @example
 * filledCells({ sheet: "S", rect: { top: 0, left: 4, bottom: 1, right: 5 }, values: [["", 3], ["", ""]], formulas: [["", 3], ["", ""]] });
 * // [{ address: "F1", content: "3" }]
 */
export function filledCells(read: CellsRead): FilledCell[] {
  return nonEmpty(read).map(({ address, shown }) => ({
    address,
    content: shown.length > SHOWN_LENGTH ? `${shown.slice(0, SHOWN_LENGTH - 1)}…` : shown,
  }));
}

/**
 * What each non-empty cell of a read holds, whole, in the order of `filledCells`: the record
 * against which a later read is compared, so that consent covers exactly what was shown.
 *
 * @example
 * cellContents({ sheet: "S", rect: { top: 0, left: 4, bottom: 0, right: 5 }, values: [["", 0.5]], formulas: [["", "=A1/2"]] });
 * // ["F1\u0000=A1/2"]
 */
export function cellContents(read: CellsRead): string[] {
  return nonEmpty(read).map(({ address, shown }) => `${address}\u0000${shown}`);
}

/**
 * The leftmost column at or after `start` where `width` columns are empty in
 * every row of a strip read from the sheet, with one empty column to their
 * left so the block never touches other cells (columns outside the strip
 * count as empty).
 *
 * @example
 * // strip from column D (3): E holds something in one row, F, G and H are empty
 * firstFreeColumn({ sheet: "S", rect: { top: 0, left: 3, bottom: 1, right: 7 }, values: [["", "x", "", "", ""], ["", "", "", "", ""]], formulas: [["", "x", "", "", ""], ["", "", "", "", ""]] }, 4, 2);
 * // 6
 */
export function firstFreeColumn(strip: CellsRead, start: number, width: number): number {
  const filledColumn = (column: number): boolean => {
    const c = column - strip.rect.left;
    if (c < 0 || c > strip.rect.right - strip.rect.left) return false;
    return strip.values.some((row, r) => !empty(row[c]) || !empty(strip.formulas[r]?.[c]));
  };
  let column = start;
  for (;;) {
    let blocked = -1;
    for (let c = column - 1; c < column + width; c++) if (filledColumn(c)) blocked = c;
    if (blocked < 0) return column;
    column = blocked + 2;
  }
}

/**
 * The rectangle a block of `rows` × `columns` takes from its top-left cell.
 *
 * @example
 * blockRect({ row: 0, column: 4 }, 24, 2); // { top: 0, left: 4, bottom: 23, right: 5 }
 */
export function blockRect(topLeft: { row: number; column: number }, rows: number, columns: number): CellRect {
  return { top: topLeft.row, left: topLeft.column, bottom: topLeft.row + rows - 1, right: topLeft.column + columns - 1 };
}
