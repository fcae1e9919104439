/**
 * The finite numbers of a range in the order the rows arrived: down the first
 * column, then down the next. The sequential tests (anytimeSign.ts,
 * confidenceSequence.ts, sprt.ts) depend on this order, unlike every other
 * test of the catalogue, which depends only on the set of values.
 *
 * Method: one pass per column over the row-major matrix the host hands over
 * (Microsoft, "Custom functions parameter options", Office Add-ins
 * documentation: a range parameter is a two-dimensional array of rows). Only
 * finite numbers are kept; blank cells, text, logical values and errors are
 * skipped as everywhere else (common practice). The numbers are lent to a
 * callback in a buffer that is kept between calls: a fresh array the size of a
 * long column costs more to touch for the first time (the system maps its
 * memory page by page) than the whole pass over the cells.
 *
 * Pairs (`pairedDifferencesInArrivalOrder`) are read in the same order,
 * position by position, by the one paired reading of the catalogue (cells.ts,
 * `pairedDifferencesFromCells`), so which positions count as pairs, what is
 * skipped and how differences are rounded is what PAIREDCOUNTS and PAIRED
 * see; only the order differs, and only for ranges of more than one column.
 *
 * Cost: O(cells) time; O(cells) memory, kept and reused (pairs: O(pairs), plus
 * a copy of the cells for ranges of more than one column).
 */
import { pairedDifferencesFromCells, type CellDifferences } from "./cells";

/** The buffer lent by the last call, grown as needed; null while it is lent out. */
let BUFFER: Float64Array | null = new Float64Array(4096);

/**
 * Calls `use` with the finite numbers of `cells`, column by column, each column top to bottom, and returns
 * what it returns. The array is valid only during the call (it is reused by the next one): copy it to keep it.
 * A call made from inside `use` gets an array of its own.
 *
 * @example
 * withNumbersInArrivalOrder([[1, 4], [2, null], ["a", 5]], (v) => Array.from(v)); // [1, 2, 4, 5]
 */
export function withNumbersInArrivalOrder<T>(cells: readonly (readonly unknown[])[], use: (values: Float64Array) => T): T {
  const rows = cells.length;
  const width = rows === 0 ? 0 : cells[0].length;
  const lent = BUFFER !== null && BUFFER.length >= rows * width ? BUFFER : new Float64Array(Math.max(rows * width, 4096));
  BUFFER = null;
  try {
    let count = 0;
    for (let c = 0; c < width; c++) {
      for (let r = 0; r < rows; r++) {
        const v = cells[r][c];
        if (typeof v === "number" && v - v === 0) lent[count++] = v; // v - v is NaN for NaN and ±Infinity
      }
    }
    return use(lent.subarray(0, count));
  } finally {
    BUFFER = lent;
  }
}

/** The cells of a matrix column by column, each column as one row: reading the result row by row is arrival order. */
function columnsAsRows(cells: readonly (readonly unknown[])[]): unknown[][] {
  const rows = cells.length;
  const width = rows === 0 ? 0 : cells[0].length;
  const out: unknown[][] = new Array(width);
  for (let c = 0; c < width; c++) {
    const column: unknown[] = new Array(rows);
    for (let r = 0; r < rows; r++) column[r] = cells[r][c];
    out[c] = column;
  }
  return out;
}

/**
 * The differences second − first − shift of the pairs of two ranges of the same shape, in the order the rows
 * arrived: down the first column, then down the next, as `withNumbersInArrivalOrder` reads one range. A pair
 * is kept, skipped or counted as empty, and its difference rounded, by `pairedDifferencesFromCells`, which
 * does the reading. Throws a RangeError when the shapes differ.
 *
 * @example
 * pairedDifferencesInArrivalOrder([[1, 4], [2, null]], [[1.5, 4.5], ["x", null]], 0).differences; // [0.5, 0.5]
 */
export function pairedDifferencesInArrivalOrder(
  first: readonly (readonly unknown[])[],
  second: readonly (readonly unknown[])[],
  shift: number,
): CellDifferences {
  const width = first.length === 0 ? 0 : first[0].length;
  if (width <= 1) return pairedDifferencesFromCells(first, second, shift);
  if (second.length !== first.length)
    throw new RangeError(`pairedDifferencesInArrivalOrder: ${first.length} rows against ${second.length}`);
  return pairedDifferencesFromCells(columnsAsRows(first), columnsAsRows(second), shift);
}
