/**
 * The finite numbers of a range in the order the rows arrived: down the first
 * column, then down the next. The sequential tests (anytimeSign.ts,
 * confidenceSequence.ts, sprt.ts) depend on this order, unlike every other
 * test of the catalogue, which depends only on the set of values.
 *
 * Method: one pass per column over the row-major matrix the host hands over
 * (Microsoft, "Custom functions parameter options", Office Add-ins
 * documentation: a range parameter is a two-dimensional array of rows). A
 * single column, by far the usual shape, is read by `numbersFromCells`, whose
 * row order is then the same. Blank cells, text, logical values and errors are
 * skipped as everywhere else (common practice).
 *
 * Cost: O(cells) time, O(numbers) extra memory.
 */
import { numbersFromCells } from "./cells";

/**
 * The finite numbers of `cells`, column by column, each column top to bottom.
 *
 * @example
 * numbersInArrivalOrder([[1, 4], [2, null], ["a", 5]]); // Float64Array [1, 2, 4, 5]
 */
export function numbersInArrivalOrder(cells: readonly (readonly unknown[])[]): Float64Array {
  const width = cells.length === 0 ? 0 : cells[0].length;
  if (width <= 1) return numbersFromCells(cells).values;
  const out = new Float64Array(cells.length * width);
  let count = 0;
  for (let c = 0; c < width; c++) {
    for (let r = 0; r < cells.length; r++) {
      const v = cells[r][c];
      if (typeof v === "number" && v - v === 0) out[count++] = v; // v - v is NaN for NaN and ±Infinity
    }
  }
  return out.subarray(0, count);
}
