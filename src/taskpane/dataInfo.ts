/**
 * What the pane tells a person about a range before any test: how many cells
 * are numbers, blank, text or logical; whether the first row is a header (a
 * name over numbers); and whether the range is a column of an Excel table.
 *
 * Method: the counting is the core's own single pass (numbersFromCells in
 * src/stats/cells.ts), so the pane and the cell functions skip the same
 * cells. A first row counts as a header when every one of its cells is
 * non-empty text that is not a number and the rows below hold at least one
 * number (common practice: the spreadsheet's own "my table has headers"
 * guess works the same way).
 *
 * Cost: O(cells).
 */
import { numbersFromCells, type SkippedCells } from "../stats/cells";
import { rectContains, type CellRect } from "./a1";
import type { TableInfo } from "./host";

export interface CellTally {
  readonly cells: number;
  readonly numbers: number;
  readonly skipped: SkippedCells;
}

/**
 * Numbers and skipped cells of a block of values.
 *
 * @example
 * tallyCells([[51.2], [""], ["not measured"], [50]]); // { cells: 4, numbers: 2, skipped: { blank: 1, text: 1, boolean: 0, other: 0 } }
 */
export function tallyCells(values: readonly (readonly unknown[])[]): CellTally {
  const read = numbersFromCells(values);
  return { cells: read.cells, numbers: read.values.length, skipped: read.skipped };
}

function isNameText(cell: unknown): cell is string {
  return typeof cell === "string" && cell.trim() !== "" && !Number.isFinite(Number(cell.trim()));
}

/**
 * The header of a range, when its first row looks like one: the names of its
 * columns joined with " / " (a plain string, shown with textContent only).
 *
 * @example
 * headerName([["Thickness (µm)"], [51.2], [49.6]]); // "Thickness (µm)"
 * headerName([[51.2], [49.6]]);                     // null
 */
export function headerName(values: readonly (readonly unknown[])[]): string | null {
  if (values.length < 2 || values[0].length === 0) return null;
  if (!values[0].every(isNameText)) return null;
  const below = values.slice(1).some((row) => row.some((cell) => typeof cell === "number"));
  return below ? (values[0] as string[]).map((s) => s.trim()).join(" / ") : null;
}

/** A range that is exactly one column of a table (with or without its header cell). */
export interface TableColumnMatch {
  readonly table: TableInfo;
  readonly column: string;
  /** The column's data rows, header excluded. */
  readonly body: CellRect;
  readonly headerIncluded: boolean;
}

/** Where a range stands with respect to the tables of its sheet. */
export type TablePlace =
  | { readonly kind: "column"; readonly match: TableColumnMatch }
  | { readonly kind: "part"; readonly table: TableInfo }
  | { readonly kind: "none" };

/**
 * Whether a range is a whole table column, lies inside a table without being
 * one, or has nothing to do with a table.
 *
 * @example
 * tablePlace({ top: 0, left: 1, bottom: 24, right: 1 }, [{ name: "Table1", sheet: "S", rect: { top: 0, left: 0, bottom: 24, right: 2 }, columns: ["Panel", "Thickness", "After"] }]);
 * // { kind: "column", match: { column: "Thickness", headerIncluded: true, ... } }
 */
export function tablePlace(rect: CellRect, tables: readonly TableInfo[]): TablePlace {
  for (const table of tables) {
    if (!rectContains(table.rect, rect)) continue;
    const bodyTop = table.rect.top + 1;
    const oneColumn = rect.left === rect.right;
    const wholeColumn =
      (rect.top === table.rect.top || rect.top === bodyTop) && rect.bottom === table.rect.bottom && bodyTop <= table.rect.bottom;
    if (oneColumn && wholeColumn) {
      return {
        kind: "column",
        match: {
          table,
          column: table.columns[rect.left - table.rect.left],
          body: { top: bodyTop, bottom: table.rect.bottom, left: rect.left, right: rect.left },
          headerIncluded: rect.top === table.rect.top,
        },
      };
    }
    return { kind: "part", table };
  }
  return { kind: "none" };
}
