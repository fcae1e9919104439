/**
 * The columns the demo draws for a recorded column chart: one per row while
 * the rows are few, and for many rows (100,000 readings) one per group of
 * consecutive rows holding the mean of each series' numbers in the group,
 * so the drawing stays a few hundred bars whatever the data's length. Excel
 * itself draws every row; the demo's sketch says when it grouped.
 *
 * Method: consecutive groups of ceil(rows / maxColumns) rows; cells that are
 * not numbers are left out of a group's mean (a group without numbers has
 * no bar), as a column chart leaves out text and blanks (common practice).
 * Cost: O(rows × series).
 */
import type { Scalar } from "./formula/values";

/** Bars per series, the rows each stands for, and the tallest bar (at least 1, so an empty chart still scales). */
export interface ChartColumns {
  readonly columns: readonly (readonly (number | null)[])[];
  readonly rowsPerColumn: number;
  readonly highest: number;
}

/** Drawn columns at most, so that a long table still draws quickly (a few hundred fill the 320-unit sketch). */
export const MAX_CHART_COLUMNS = 300;

/**
 * The chart's columns from its rows (header row already removed).
 *
 * @example
 * chartColumns([[1, 4], [3, "x"]], 1); // { columns: [[2, 4]], rowsPerColumn: 2, highest: 4 }
 * chartColumns([[51.8], [49.6]]).columns; // [[51.8], [49.6]]
 */
export function chartColumns(rows: readonly (readonly Scalar[])[], maxColumns = MAX_CHART_COLUMNS): ChartColumns {
  const rowsPerColumn = Math.max(1, Math.ceil(rows.length / maxColumns));
  const series = rows.reduce((most, row) => Math.max(most, row.length), 0);
  const columns: (number | null)[][] = [];
  let highest = 1;
  for (let start = 0; start < rows.length; start += rowsPerColumn) {
    const sums = new Array<number>(series).fill(0);
    const counts = new Array<number>(series).fill(0);
    for (let r = start; r < Math.min(rows.length, start + rowsPerColumn); r++) {
      rows[r].forEach((v, s) => {
        if (typeof v !== "number") return;
        sums[s] += v;
        counts[s]++;
      });
    }
    const column = sums.map((sum, s) => (counts[s] === 0 ? null : sum / counts[s]));
    for (const v of column) if (v !== null && v > highest) highest = v;
    columns.push(column);
  }
  return { columns, rowsPerColumn, highest };
}
