import { describe, expect, it } from "vitest";
import { pairsInArrivalOrder, withNumbersInArrivalOrder } from "../../src/stats/arrivalOrder";
import { pairsFromCells } from "../../src/stats/cells";

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

describe("pairsInArrivalOrder: pairs in the order of withNumbersInArrivalOrder, by the rules of pairsFromCells", () => {
  it("reads two blocks column by column, keeping a pair only when both cells are finite numbers", () => {
    const first = [
      [1, 4, "x"],
      [2, null, 7],
      [true, 5, null],
      [3, "", 8],
    ];
    const second = [
      [11, 14, 17],
      [12, null, 17.5],
      [13, 15, null],
      [NaN, 16, 18],
    ];
    const p = pairsInArrivalOrder(first, second);
    expect(Array.from(p.first)).toEqual([1, 2, 4, 5, 7, 8]);
    expect(Array.from(p.second)).toEqual([11, 12, 14, 15, 17.5, 18]);
    // Counts do not depend on the order: they are pairsFromCells' own.
    const byRows = pairsFromCells(first, second);
    expect({ ...p, first: null, second: null }).toEqual({ ...byRows, first: null, second: null });
    expect([p.pairs, p.pairsSkipped, p.emptyPairs]).toEqual([12, 4, 2]);
  });

  it("a single column is read as pairsFromCells reads it; different shapes throw", () => {
    const a = [[3], [1], [null], ["t"], [2]];
    const b = [[4], [null], [null], [5], [2]];
    expect(pairsInArrivalOrder(a, b)).toEqual(pairsFromCells(a, b));
    expect(() =>
      pairsInArrivalOrder(
        [[1, 2]],
        [
          [1, 2],
          [3, 4],
        ],
      ),
    ).toThrow(RangeError);
    expect(() =>
      pairsInArrivalOrder(
        [
          [1, 2],
          [3, 4],
        ],
        [[1], [3]],
      ),
    ).toThrow(RangeError);
  });
});
