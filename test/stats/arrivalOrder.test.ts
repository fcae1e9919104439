import { describe, expect, it } from "vitest";
import { numbersInArrivalOrder } from "../../src/stats/arrivalOrder";

describe("numbersInArrivalOrder: down the rows, then across the columns", () => {
  it("reads a block column by column, skipping blanks, text, logicals, errors and non-finite numbers", () => {
    const cells = [
      [1, 4, "x"],
      [2, null, 7],
      [true, 5, NaN],
      [3, "", Infinity],
    ];
    expect(Array.from(numbersInArrivalOrder(cells))).toEqual([1, 2, 3, 4, 5, 7]);
  });

  it("a single column keeps its row order; an empty-looking range gives no numbers", () => {
    expect(Array.from(numbersInArrivalOrder([[3], [1], [null], [2]]))).toEqual([3, 1, 2]);
    expect(numbersInArrivalOrder([[null]]).length).toBe(0);
  });
});
