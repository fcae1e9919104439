import { describe, expect, it } from "vitest";
import { withNumbersInArrivalOrder } from "../../src/stats/arrivalOrder";

const listed = (cells: unknown[][]) => withNumbersInArrivalOrder(cells, (values) => Array.from(values));

describe("withNumbersInArrivalOrder: down the rows, then across the columns", () => {
  it("reads a block column by column, skipping blanks, text, logicals, errors and non-finite numbers", () => {
    const cells = [
      [1, 4, "x"],
      [2, null, 7],
      [true, 5, NaN],
      [3, "", Infinity],
    ];
    expect(listed(cells)).toEqual([1, 2, 3, 4, 5, 7]);
  });

  it("a single column keeps its row order; an empty-looking range gives no numbers", () => {
    expect(listed([[3], [1], [null], [2]])).toEqual([3, 1, 2]);
    expect(listed([[null]])).toEqual([]);
  });

  it("lends a reused buffer, but a call from inside the callback gets its own, and a larger range a larger one", () => {
    const outer = withNumbersInArrivalOrder([[1], [2]], (values) => {
      const inner = listed([[7], [8], [9]]);
      return [...Array.from(values), ...inner];
    });
    expect(outer).toEqual([1, 2, 7, 8, 9]);
    const big = Array.from({ length: 10000 }, (_, i) => [i]);
    expect(withNumbersInArrivalOrder(big, (values) => values[9999])).toBe(9999);
    expect(listed([[5], [6]])).toEqual([5, 6]);
  });
});
