/**
 * The demo's sketch of a column chart: one column per row while the rows are
 * few, grouped means for many rows. Expected values by exact arithmetic.
 */
import { describe, expect, it } from "vitest";
import { chartColumns } from "../../src/demo/chartColumns";

describe("chartColumns", () => {
  it("draws one column per row while the rows are few, text and blanks without a bar", () => {
    expect(
      chartColumns([
        [51.8, 50.2],
        ["note", null],
        [49.6, 49.1],
      ]),
    ).toEqual({
      columns: [
        [51.8, 50.2],
        [null, null],
        [49.6, 49.1],
      ],
      rowsPerColumn: 1,
      highest: 51.8,
    });
  });

  it("groups many rows into at most the given number of columns, each the mean of its group's numbers", () => {
    const rows = Array.from({ length: 100_000 }, (_, i) => [i % 2 === 0 ? 40 : 60]);
    const drawn = chartColumns(rows, 300);
    // ceil(100,000 / 300) = 334 rows per column, 300 columns (the last one of 100,000 − 299 × 334 = 134 rows).
    expect(drawn.rowsPerColumn).toBe(334);
    expect(drawn.columns).toHaveLength(300);
    // 334 alternating rows: 167 of 40 and 167 of 60, mean 50.
    expect(drawn.columns[0]).toEqual([50]);
    expect(drawn.highest).toBe(50);
  });

  it("scales an empty or all-text chart to 1 rather than to nothing", () => {
    expect(chartColumns([])).toEqual({ columns: [], rowsPerColumn: 1, highest: 1 });
    expect(chartColumns([["a"]]).highest).toBe(1);
  });
});
