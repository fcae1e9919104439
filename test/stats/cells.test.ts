import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  boundedNumbersFromCells,
  cellsFromValues,
  numbersFromCells,
  pairedDifferencesFromCells,
  pairsFromCells,
  signCountsFromCells,
  type CellDifferences,
  type CellPairs,
  type SkippedCells,
} from "../../src/stats/cells";
import { compareAsShown, pairedDifferences } from "../../src/stats/differences";

/**
 * Reference: the definition applied cell by cell to the flattened matrix (blank = null, undefined or "";
 * finite numbers kept; every other value counted by kind), with no attempt at speed.
 */
function kindOf(v: unknown): keyof SkippedCells | "number" {
  if (typeof v === "number") return Number.isFinite(v) ? "number" : "other";
  if (v === null || v === undefined || v === "") return "blank";
  if (typeof v === "string") return "text";
  if (typeof v === "boolean") return "boolean";
  return "other";
}
function reference(cells: unknown[][]) {
  const flat = cells.flat();
  const skipped: SkippedCells = { blank: 0, text: 0, boolean: 0, other: 0 };
  for (const v of flat) {
    const k = kindOf(v);
    if (k !== "number") skipped[k]++;
  }
  return { values: flat.filter((v) => kindOf(v) === "number") as number[], cells: flat.length, skipped };
}

const anyCell = fc.oneof(
  { weight: 4, arbitrary: fc.constant(null) },
  { weight: 3, arbitrary: fc.double() }, // includes NaN, ±Infinity and -0
  { weight: 1, arbitrary: fc.constantFrom(undefined, "", " ", "12", "text", true, false, {}, new Error("#N/A"), [1]) },
);
const matrix = (width: fc.Arbitrary<number>) =>
  fc
    .tuple(fc.integer({ min: 0, max: 60 }), width)
    .chain(([rows, w]) => fc.array(fc.array(anyCell, { minLength: w, maxLength: w }), { minLength: rows, maxLength: rows }));

describe("numbersFromCells", () => {
  it("classifies every kind of cell (worked by hand)", () => {
    const r = numbersFromCells([
      [1, "a", null],
      [undefined, true, ""],
      [2.5, NaN, Infinity],
      [-0, "3", { type: "error" }],
    ]);
    expect(Array.from(r.values)).toEqual([1, 2.5, -0]);
    expect(r.cells).toBe(12);
    expect(r.skipped).toEqual({ blank: 3, text: 2, boolean: 1, other: 3 });
  });

  it("matches the cell-by-cell definition, in reading order, also past the initial capacity", () => {
    fc.assert(
      fc.property(matrix(fc.integer({ min: 0, max: 12 })), (cells) => {
        const got = numbersFromCells(cells);
        const want = reference(cells);
        expect(Array.from(got.values)).toEqual(want.values);
        expect(got.cells).toBe(want.cells);
        expect(got.skipped).toEqual(want.skipped);
      }),
      { numRuns: 300 },
    );
    const column = Array.from({ length: 5000 }, (_, i) => [i % 3 === 0 ? null : i]);
    const big = numbersFromCells(column);
    expect(Array.from(big.values)).toEqual(reference(column).values);
  });

  it("accepts jagged rows and an empty range", () => {
    expect(Array.from(numbersFromCells([[1], [2, 3], []]).values)).toEqual([1, 2, 3]);
    expect(numbersFromCells([])).toEqual({ values: new Float64Array(0), cells: 0, skipped: { blank: 0, text: 0, boolean: 0, other: 0 } });
  });
});

describe("signCountsFromCells", () => {
  it("counts as the sheet shows the numbers, in the one pass over the cells (exact decimals, worked by hand)", () => {
    const r = signCountsFromCells(
      [
        [0.1 + 0.2, 0.7 - 0.4],
        [0.31, "0.3"],
        [null, true],
        [0.29, 0.32],
      ],
      0.3,
    );
    expect(r.counts).toEqual({ below: 1, tied: 2, above: 2 });
    expect(r.cells).toBe(8);
    expect(r.skipped).toEqual({ blank: 1, text: 1, boolean: 1, other: 0 });
    expect(() => signCountsFromCells([[1]], NaN)).toThrow(RangeError);
  });

  it("matches the cell-by-cell definition with compareAsShown for every kind of cell (property)", () => {
    const near = fc.oneof(fc.constantFrom(0, 0.3, 50, -2.5), fc.double({ noNaN: true, noDefaultInfinity: true, min: -100, max: 100 }));
    fc.assert(
      fc.property(matrix(fc.integer({ min: 0, max: 6 })), near, (cells, center) => {
        const want = reference(cells);
        const signs = want.values.map((v) => compareAsShown(v, center));
        const got = signCountsFromCells(cells, center);
        expect(got.counts).toEqual({
          below: signs.filter((s) => s < 0).length,
          tied: signs.filter((s) => s === 0).length,
          above: signs.filter((s) => s > 0).length,
        });
        expect(got.cells).toBe(want.cells);
        expect(got.skipped).toEqual(want.skipped);
      }),
      { numRuns: 300 },
    );
  });
});

describe("boundedNumbersFromCells and cellsFromValues", () => {
  it("reads numbers in bounds and blanks, and stops at the first other cell (worked by hand)", () => {
    const read = boundedNumbersFromCells(
      [
        [0.01, null],
        [undefined, ""],
        [1, 0],
      ],
      0,
      1,
    );
    expect(Array.from(read.values)).toEqual([0.01, NaN, NaN, NaN, 1, 0]);
    expect(read.refused).toBeNull();
    for (const bad of ["0.02", true, 1.5, -0.1, NaN, Infinity, { code: "#N/A" }]) {
      expect(
        boundedNumbersFromCells(
          [
            [0.01, 0.2],
            [0.3, bad],
            ["x", 0.4],
          ],
          0,
          1,
        ).refused,
      ).toEqual({ row: 1, column: 1, cell: bad });
    }
  });

  it("puts the values back in the range's shape, blank where NaN, for every shape (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 1, max: 5 }), (rows, width) => {
        const cells = Array.from({ length: rows }, () => new Array(width).fill(null));
        const values = Array.from({ length: rows * width }, (_, k) => (k % 3 === 0 ? NaN : k / 100));
        const out = cellsFromValues(cells, values, "");
        expect(out.length).toBe(rows);
        expect(out.flat()).toEqual(values.map((v) => (Number.isNaN(v) ? "" : v)));
        out.forEach((row) => expect(row.length).toBe(width));
      }),
    );
  });

  it("gives a column's equal values one shared row, and still every value at its place past the shared table's size", () => {
    // Equal values far apart share a row; blanks share one; -0 shows as 0 (exact: the values themselves).
    const values = [0.25, NaN, 1, 0.25, 1, -0, NaN, 0.5, 1];
    const out = cellsFromValues(
      values.map(() => [null]),
      values,
      "",
    );
    expect(out).toEqual([[0.25], [""], [1], [0.25], [1], [0], [""], [0.5], [1]]);
    expect(Object.is(out[5][0], 0)).toBe(true);
    expect(out[3]).toBe(out[0]);
    expect(out[4]).toBe(out[2]);
    expect(out[8]).toBe(out[2]);
    expect(out[6]).toBe(out[1]);
    expect(out[7]).not.toBe(out[0]);
    // More distinct values than the table shares (2^16): each still lands at its place, repeats after it too.
    const many = Array.from({ length: 200_000 }, (_, k) => (k < 100_000 ? k / 7 : (k - 100_000) / 7));
    const column = cellsFromValues(
      many.map(() => [null]),
      many,
      "",
    );
    many.forEach((v, k) => {
      if (column[k][0] !== v) throw new Error(`row ${k}: ${String(column[k][0])} instead of ${v}`);
    });
    expect(column[100_000]).toBe(column[0]);
    // A second call starts afresh: no row of the first call's values comes back for other values.
    expect(cellsFromValues([[null]], [0.125], "")).toEqual([[0.125]]);
  });
});

describe("pairsFromCells", () => {
  it("keeps a pair only when both cells are finite numbers (worked by hand)", () => {
    const p = pairsFromCells([[1], [2], ["x"], [4]], [[1.5], [null], [4], [NaN]]);
    expect(Array.from(p.first)).toEqual([1]);
    expect(Array.from(p.second)).toEqual([1.5]);
    expect(p.pairs).toBe(4);
    expect(p.pairsSkipped).toBe(3);
    expect(p.skippedFirst).toEqual({ blank: 0, text: 1, boolean: 0, other: 0 });
    expect(p.skippedSecond).toEqual({ blank: 1, text: 0, boolean: 0, other: 1 });
  });

  it("matches the definition on random ranges of one shape", () => {
    fc.assert(
      fc.property(
        fc
          .tuple(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 1, max: 3 }))
          .chain(([rows, w]) =>
            fc.tuple(
              ...[0, 1].map(() => fc.array(fc.array(anyCell, { minLength: w, maxLength: w }), { minLength: rows, maxLength: rows })),
            ),
          ),
        ([a, b]) => {
          const p = pairsFromCells(a, b);
          const fa = a.flat();
          const fb = b.flat();
          const keep = fa.map((v, i) => kindOf(v) === "number" && kindOf(fb[i]) === "number");
          expect(Array.from(p.first)).toEqual(fa.filter((_, i) => keep[i]));
          expect(Array.from(p.second)).toEqual(fb.filter((_, i) => keep[i]));
          const empty = fa.map((v, i) => kindOf(v) === "blank" && kindOf(fb[i]) === "blank");
          const tallyOutsideEmpty = (cells: unknown[]) => reference([cells.filter((_, i) => !empty[i])]).skipped;
          expect(p.pairs).toBe(fa.length);
          expect(p.emptyPairs).toBe(empty.filter(Boolean).length);
          expect(p.pairsSkipped).toBe(keep.filter((k, i) => !k && !empty[i]).length);
          expect(p.skippedFirst).toEqual(tallyOutsideEmpty(fa));
          expect(p.skippedSecond).toEqual(tallyOutsideEmpty(fb));
        },
      ),
      { numRuns: 200 },
    );
  });

  it("does not count a position blank on both sides as a skipped pair (an open-ended range's empty rows)", () => {
    const first = [[1], [2], [null], ["note"], ...Array.from({ length: 1000 }, () => [null])];
    const second = [[1.5], [null], [3], [null], ...Array.from({ length: 1000 }, () => [""])];
    const p = pairsFromCells(first, second);
    expect(p.pairs).toBe(1004);
    expect(p.pairsSkipped).toBe(3);
    expect(p.emptyPairs).toBe(1000);
    expect(p.skippedFirst).toEqual({ blank: 1, text: 1, boolean: 0, other: 0 });
    expect(p.skippedSecond).toEqual({ blank: 2, text: 0, boolean: 0, other: 0 });
  });

  it("throws a RangeError when the shapes differ", () => {
    expect(() => pairsFromCells([[1], [2]], [[1]])).toThrow(RangeError);
    expect(() => pairsFromCells([[1, 2]], [[1]])).toThrow(RangeError);
  });
});

describe("pairedDifferencesFromCells", () => {
  it("is pairedDifferences on the pairs of pairsFromCells, with the same counts, on random ranges of one shape", () => {
    const numberish = fc.oneof(
      anyCell,
      fc.integer({ min: -500, max: 500 }).map((k) => k / 100),
    );
    fc.assert(
      fc.property(
        fc.tuple(fc.integer({ min: 0, max: 700 }), fc.integer({ min: 1, max: 3 })).chain(([rows, w]) => {
          const range = fc.array(fc.array(numberish, { minLength: w, maxLength: w }), { minLength: rows, maxLength: rows });
          return fc.tuple(range, range, fc.constantFrom(0, 1.2, -0.35));
        }),
        ([a, b, shift]) => {
          const d = pairedDifferencesFromCells(a, b, shift);
          const p = pairsFromCells(a, b);
          expect(Array.from(d.differences)).toEqual(Array.from(pairedDifferences(p.first, p.second, shift)));
          const counts = (x: CellDifferences | CellPairs) => [x.pairs, x.pairsSkipped, x.emptyPairs, x.skippedFirst, x.skippedSecond];
          expect(counts(d)).toEqual(counts(p));
        },
      ),
      { numRuns: 200 },
    );
  });

  it("rounds as the sheet shows the numbers, and throws a RangeError when the shapes differ (worked by hand)", () => {
    const d = pairedDifferencesFromCells([[1.1], [5], ["x"]], [[2.3], [4], [7]], 1.2);
    expect(Array.from(d.differences)).toEqual([0, -2.2]); // 2.3 - 1.1 - 1.2 is a tie; 4 - 5 - 1.2 = -2.2
    expect([d.pairs, d.pairsSkipped, d.emptyPairs]).toEqual([3, 1, 0]);
    expect(d.skippedFirst.text).toBe(1);
    expect(() => pairedDifferencesFromCells([[1], [2]], [[1]], 0)).toThrow(RangeError);
  });
});
