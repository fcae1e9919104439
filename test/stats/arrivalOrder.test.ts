import { describe, expect, it } from "vitest";
import { pairedDifferencesInArrivalOrder, withNumbersInArrivalOrder } from "../../src/stats/arrivalOrder";
import { pairedDifferencesFromCells } from "../../src/stats/cells";

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

describe("pairedDifferencesInArrivalOrder: pairs in the order of withNumbersInArrivalOrder, by the rules of pairedDifferencesFromCells", () => {
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
    const p = pairedDifferencesInArrivalOrder(first, second, 0.5);
    // Kept pairs (1, 11), (2, 12), (4, 14), (5, 15), (7, 17.5), (8, 18), less the shift 0.5.
    expect(Array.from(p.differences)).toEqual([9.5, 9.5, 9.5, 9.5, 10, 9.5]);
    // Counts do not depend on the order: they are pairedDifferencesFromCells' own.
    const byRows = pairedDifferencesFromCells(first, second, 0.5);
    expect({ ...p, differences: null }).toEqual({ ...byRows, differences: null });
    expect([p.pairs, p.pairsSkipped, p.emptyPairs]).toEqual([12, 4, 2]);
  });

  it("a single column is read as pairedDifferencesFromCells reads it; different shapes throw", () => {
    const a = [[3], [1], [null], ["t"], [2]];
    const b = [[4], [null], [null], [5], [2]];
    expect(pairedDifferencesInArrivalOrder(a, b, 0)).toEqual(pairedDifferencesFromCells(a, b, 0));
    expect(() =>
      pairedDifferencesInArrivalOrder(
        [[1, 2]],
        [
          [1, 2],
          [3, 4],
        ],
        0,
      ),
    ).toThrow(RangeError);
    expect(() =>
      pairedDifferencesInArrivalOrder(
        [
          [1, 2],
          [3, 4],
        ],
        [[1], [3]],
        0,
      ),
    ).toThrow(RangeError);
  });
});
