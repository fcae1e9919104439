/**
 * Numbers out of a spreadsheet range: the hot loop in front of every cell function.
 *
 * Method: a single pass over the rows of the matrix the host hands over, keeping
 * finite numbers in a growable Float64Array (doubling, so O(1) amortised per
 * number) and counting everything else by kind. No intermediate arrays are
 * built: a column of a million mostly blank cells costs one read per cell.
 * Which cells count as blank (null, undefined and the empty string) follows the
 * values Office JavaScript custom functions pass for empty cells (common practice).
 * Reference for the growth rule and its amortised cost: T. H. Cormen, C. E.
 * Leiserson, R. L. Rivest, C. Stein (2009), "Introduction to Algorithms", 3rd ed.,
 * section 17.4 "Dynamic tables" (from memory).
 *
 * A test that needs only the counts below, at and above a centre (the sign
 * test, COUNTS) takes them in the same pass (`signCountsFromCells`) and keeps
 * no numbers at all; the comparison is the shared tie rule of differences.ts.
 * The paired tests read two ranges in one pass into buffers kept between calls
 * and round the differences from there (`pairedDifferencesFromCells`), so the
 * only new array is the differences themselves.
 *
 * Cost: O(cells) time; O(numbers) extra memory (at most twice the numbers kept),
 * none for the counts.
 */
import { compareAsShown, pairedDifferences, tieWindow } from "./differences";
import type { SignCounts } from "./signCounts";

/** Cells that were not numbers, by kind. `other` holds error values, objects and non-finite numbers. */
export interface SkippedCells {
  blank: number;
  text: number;
  boolean: number;
  other: number;
}

/** The finite numbers of a range in reading order (row by row), and what was skipped. */
export interface CellNumbers {
  values: Float64Array;
  /** Cells visited (numbers plus skipped). */
  cells: number;
  skipped: SkippedCells;
}

/** The sign counts of a range's finite numbers against a centre, and what was skipped. */
export interface CellSignCounts {
  readonly counts: SignCounts;
  /** Cells visited (numbers plus skipped). */
  readonly cells: number;
  readonly skipped: SkippedCells;
}

/** Numbers taken pairwise from two ranges of the same shape: a pair is kept only when both cells are numbers. */
export interface CellPairs {
  first: Float64Array;
  second: Float64Array;
  /** Cell pairs visited. */
  pairs: number;
  /**
   * Pairs left out because one cell is not a finite number, or both are but one is
   * text, logical or an error. A position where both cells are blank is no pair at
   * all and is counted in `emptyPairs` instead, so an open-ended range (B2:C1048576)
   * reports only what it really set aside.
   */
  pairsSkipped: number;
  /** Positions where both cells are blank. */
  emptyPairs: number;
  /** Non-number cells of the first range, by kind (whether or not the partner was a number; empty pairs not included). */
  skippedFirst: SkippedCells;
  /** Non-number cells of the second range, by kind. */
  skippedSecond: SkippedCells;
}

const INITIAL_CAPACITY = 256;

/** Kind codes returned by `cellKind`; small integers keep the pair loop branch-cheap. */
const NUMBER = 0;
const BLANK = 1;
const TEXT = 2;
const BOOLEAN = 3;
const OTHER = 4;

function cellKind(v: unknown): number {
  if (typeof v === "number") return v - v === 0 ? NUMBER : OTHER; // v - v is NaN exactly for NaN and ±Infinity
  if (v === null || v === undefined || v === "") return BLANK;
  if (typeof v === "string") return TEXT;
  if (typeof v === "boolean") return BOOLEAN;
  return OTHER;
}

/** Counts a cell already known not to be null nor a finite number (the rare path, kept out of the hot loop). */
function tallyNonNumber(skipped: SkippedCells, v: unknown): void {
  if (v === undefined || v === "") skipped.blank++;
  else if (typeof v === "string") skipped.text++;
  else if (typeof v === "boolean") skipped.boolean++;
  else skipped.other++;
}

function tally(skipped: SkippedCells, kind: number): void {
  if (kind === BLANK) skipped.blank++;
  else if (kind === TEXT) skipped.text++;
  else if (kind === BOOLEAN) skipped.boolean++;
  else skipped.other++;
}

function grow(values: Float64Array): Float64Array {
  const bigger = new Float64Array(values.length * 2);
  bigger.set(values);
  return bigger;
}

/**
 * Collects the finite numbers of a range, row by row, and counts the cells that are not numbers.
 * The returned `values` may be a view on a larger buffer.
 *
 * @example
 * const r = numbersFromCells([[1, "a"], [null, true], [2.5, ""]]);
 * // r.values: Float64Array [1, 2.5]; r.cells: 6
 * // r.skipped: { blank: 2, text: 1, boolean: 1, other: 0 }
 */
export function numbersFromCells(cells: readonly (readonly unknown[])[]): CellNumbers {
  let values: Float64Array = new Float64Array(INITIAL_CAPACITY);
  let capacity = values.length; // a local copy: re-reading values.length after a reassignment slows the loop
  let count = 0;
  let visited = 0;
  let nulls = 0;
  const skipped: SkippedCells = { blank: 0, text: 0, boolean: 0, other: 0 };
  const rows = cells.length;
  for (let r = 0; r < rows; r++) {
    const row = cells[r];
    const width = row.length;
    visited += width;
    for (let c = 0; c < width; c++) {
      const v = row[c];
      // null first: in a whole-column reference nearly every cell is an empty one.
      if (v === null) {
        nulls++;
        continue;
      }
      if (typeof v === "number" && v - v === 0) {
        if (count === capacity) {
          const bigger = new Float64Array(capacity * 2); // inline, not grow(): a call here measurably slows the loop
          bigger.set(values);
          values = bigger;
          capacity = bigger.length;
        }
        values[count++] = v;
      } else tallyNonNumber(skipped, v);
    }
  }
  skipped.blank += nulls;
  return { values: values.subarray(0, count), cells: visited, skipped };
}

/**
 * Counts the finite numbers of a range below, at and above `center` as the sheet shows them (the tie rule
 * of `compareAsShown`), in the one pass that reads the cells, and counts the cells that are not numbers.
 * The same counts as `countSigns(numbersFromCells(cells).values, center)`, without keeping the numbers.
 * Throws a RangeError when `center` is NaN.
 *
 * @example
 * const r = signCountsFromCells([[0.1 + 0.2], [0.31], ["a"], [null], [0.29]], 0.3);
 * // r.counts: { below: 1, tied: 1, above: 1 }; r.cells: 5; r.skipped: { blank: 1, text: 1, boolean: 0, other: 0 }
 */
export function signCountsFromCells(cells: readonly (readonly unknown[])[], center: number): CellSignCounts {
  if (Number.isNaN(center)) throw new RangeError("signCountsFromCells: the centre is NaN");
  const { low, high } = tieWindow(center);
  let below = 0;
  let above = 0;
  let visited = 0;
  let nulls = 0;
  let inside: Float64Array = INSIDE;
  let insideCount = 0;
  const skipped: SkippedCells = { blank: 0, text: 0, boolean: 0, other: 0 };
  const rows = cells.length;
  for (let r = 0; r < rows; r++) {
    const row = cells[r];
    const width = row.length;
    visited += width;
    for (let c = 0; c < width; c++) {
      const v = row[c];
      // null first: in a whole-column reference nearly every cell is an empty one.
      if (v === null) {
        nulls++;
        continue;
      }
      if (typeof v === "number" && v - v === 0) {
        // Branch-free counting: the side of a value is unpredictable in real data, and a mispredicted branch
        // costs more than the comparison. Values inside the narrow tie window (rare) are kept and settled
        // by the shared rounding after the pass, which keeps this loop small.
        const isBelow = +(v < low);
        const isAbove = +(v > high);
        below = (below + isBelow) | 0;
        above = (above + isAbove) | 0;
        if ((isBelow | isAbove) === 0) {
          if (insideCount === inside.length) inside = INSIDE = grow(inside);
          inside[insideCount++] = v;
        }
      } else tallyNonNumber(skipped, v);
    }
  }
  for (let k = 0; k < insideCount; k++) {
    const sign = compareAsShown(inside[k], center);
    below += +(sign < 0);
    above += +(sign > 0);
  }
  skipped.blank += nulls;
  const numbers = visited - skipped.blank - skipped.text - skipped.boolean - skipped.other;
  return { counts: { below, tied: numbers - below - above, above }, cells: visited, skipped };
}

/** Where values inside the tie window wait to be settled; grown (and kept) when a range needs more. */
let INSIDE: Float64Array = new Float64Array(INITIAL_CAPACITY);

/** The first cell a bounded read refused, by position in the range (0-based) and value. */
export interface RefusedCell {
  readonly row: number;
  readonly column: number;
  readonly cell: unknown;
}

/** Every cell of a range as a number, NaN for a blank one, in reading order; or the first cell refused. */
export interface BoundedNumbers {
  readonly values: Float64Array;
  readonly refused: RefusedCell | null;
}

/**
 * Reads a range whose every cell must be blank or a number in [low, high] (such as the p-values ADJUST
 * adjusts): values[k] is the k-th cell in reading order, NaN where the cell is blank; the reading stops at
 * the first cell that is neither, which comes back as `refused` so that the caller can say which cell.
 * Rows must all have the width of the first (as host ranges do).
 *
 * @example
 * boundedNumbersFromCells([[0.01], [null], [0.2]], 0, 1);  // values [0.01, NaN, 0.2]; refused null
 * boundedNumbersFromCells([[0.01], ["0.02"]], 0, 1).refused; // { row: 1, column: 0, cell: "0.02" }
 */
export function boundedNumbersFromCells(cells: readonly (readonly unknown[])[], low: number, high: number): BoundedNumbers {
  const rows = cells.length;
  const width = rows === 0 ? 0 : cells[0].length;
  const values = new Float64Array(rows * width);
  let k = 0;
  for (let r = 0; r < rows; r++) {
    const row = cells[r];
    for (let c = 0; c < width; c++) {
      const v = row[c];
      if (typeof v === "number" && v >= low && v <= high) values[k++] = v;
      else if (v === null || v === undefined || v === "") values[k++] = NaN;
      else return { values, refused: { row: r, column: c, cell: v } };
    }
  }
  return { values, refused: null };
}

/** Slots of the table that finds the one-cell row already made for a value (2^17: 1.5 MB, kept between calls). */
const ROW_SLOTS = 1 << 17;
/** Distinct values given a shared row, at most: past this (half the table) further values get rows of their own. */
const SHARED_ROWS = ROW_SLOTS >> 1;
const ROW_KEYS = new Float64Array(ROW_SLOTS);
/** Index + 1 of the row holding the key's value, 0 for an empty slot. */
const ROW_OF = new Int32Array(ROW_SLOTS);
const KEY_BITS = new Float64Array(1);
const KEY_WORDS = new Uint32Array(KEY_BITS.buffer);

/**
 * A matrix of the shape of `cells` holding values[k] in reading order, with `blank` where values[k] is
 * NaN: the answer of a function that returns a range the shape of its input. For a one-column range,
 * rows holding the same value are the same one-cell array (found through a hash table on the value's
 * bits, multiplicative hashing as in distinctValues.ts): the host copies the answer, and a column of a
 * million adjusted p-values holds far fewer distinct ones, so most of a million small arrays, and the
 * collections that promote them, are saved. Callers must not change the rows.
 *
 * @example
 * cellsFromValues([[1, 2], [3, 4]], [0.5, NaN, 1, 0.25], ""); // [[0.5, ""], [1, 0.25]]
 */
export function cellsFromValues(
  cells: readonly (readonly unknown[])[],
  values: ArrayLike<number>,
  blank: number | string,
): (number | string)[][] {
  const rows = cells.length;
  const width = rows === 0 ? 0 : cells[0].length;
  const out: (number | string)[][] = new Array(rows);
  if (width === 1) return sharedRows(values, rows, blank, out);
  for (let r = 0, k = 0; r < rows; r++) {
    const row: (number | string)[] = new Array(width);
    for (let c = 0; c < width; c++, k++) {
      const v = values[k];
      row[c] = v === v ? v : blank;
    }
    out[r] = row;
  }
  return out;
}

/** One-cell rows for values[0..rows), equal values sharing a row (see cellsFromValues). */
function sharedRows(values: ArrayLike<number>, rows: number, blank: number | string, out: (number | string)[][]): (number | string)[][] {
  const made: (number | string)[][] = [];
  const blankRow = [blank];
  ROW_OF.fill(0);
  let last = NaN;
  let lastRow = blankRow;
  for (let r = 0; r < rows; r++) {
    const v = values[r] + 0; // -0 and +0 show alike
    if (v !== v) {
      out[r] = blankRow;
      continue;
    }
    if (v === last) {
      out[r] = lastRow;
      continue;
    }
    KEY_BITS[0] = v;
    let slot = Math.imul(KEY_WORDS[0] ^ Math.imul(KEY_WORDS[1], 0x9e3779b1), 0x85ebca6b) >>> 15; // 17 bits
    while (ROW_OF[slot] !== 0 && ROW_KEYS[slot] !== v) slot = (slot + 1) & (ROW_SLOTS - 1);
    let row: (number | string)[];
    if (ROW_OF[slot] !== 0) row = made[ROW_OF[slot] - 1];
    else {
      row = [v];
      if (made.length < SHARED_ROWS) {
        made.push(row);
        ROW_KEYS[slot] = v;
        ROW_OF[slot] = made.length;
      }
    }
    out[r] = row;
    last = v;
    lastRow = row;
  }
  return out;
}

/** The differences second − first − shift of the pairs of two ranges, and what the pairing set aside. */
export interface CellDifferences {
  /** One per pair kept, in reading order, rounded as `pairedDifferences` rounds them; owned by the caller. */
  differences: Float64Array;
  /** Cell pairs visited. */
  pairs: number;
  /** As in `CellPairs`. */
  pairsSkipped: number;
  /** Positions where both cells are blank. */
  emptyPairs: number;
  skippedFirst: SkippedCells;
  skippedSecond: SkippedCells;
}

/** What one pass over two ranges found; the numbers themselves are in SCRATCH_FIRST and SCRATCH_SECOND. */
interface PairTally {
  count: number;
  visited: number;
  emptyPairs: number;
  skippedFirst: SkippedCells;
  skippedSecond: SkippedCells;
}

/**
 * Where `readPairs` puts the numbers of the kept pairs: kept between calls and grown when a range needs more.
 * A fresh array the size of a long range costs more to touch for the first time (the system maps its memory
 * page by page) than the pass over the cells, and growing one by doubling touches twice as much again; the
 * callers copy out, or derive, what they return before the next call, and nothing they call reads ranges.
 */
let SCRATCH_FIRST: Float64Array = new Float64Array(INITIAL_CAPACITY);
let SCRATCH_SECOND: Float64Array = new Float64Array(INITIAL_CAPACITY);

/**
 * The one paired reading of two ranges of the same shape, cell by cell in reading order: a pair is kept when
 * both cells are finite numbers (the first test, which nearly every pair of a table passes, is four type and
 * finiteness checks), a position blank on both sides is no pair, and the rest is tallied by kind.
 * Throws a RangeError when the shapes differ.
 */
function readPairs(first: readonly (readonly unknown[])[], second: readonly (readonly unknown[])[], caller: string): PairTally {
  const rows = first.length;
  if (second.length !== rows) throw new RangeError(`${caller}: ${rows} rows against ${second.length}`);
  let a = SCRATCH_FIRST;
  let b = SCRATCH_SECOND;
  let capacity = a.length; // a local copy: re-reading a.length after a reassignment slows the loop
  let count = 0;
  let visited = 0;
  let emptyPairs = 0;
  const skippedFirst: SkippedCells = { blank: 0, text: 0, boolean: 0, other: 0 };
  const skippedSecond: SkippedCells = { blank: 0, text: 0, boolean: 0, other: 0 };
  for (let r = 0; r < rows; r++) {
    const rowA = first[r];
    const rowB = second[r];
    const width = rowA.length;
    if (rowB.length !== width) throw new RangeError(`${caller}: row ${r} has ${width} cells against ${rowB.length}`);
    visited += width;
    for (let c = 0; c < width; c++) {
      const x = rowA[c];
      const y = rowB[c];
      // x - x is NaN exactly for NaN and ±Infinity
      if (typeof x === "number" && typeof y === "number" && x - x === 0 && y - y === 0) {
        if (count === capacity) {
          a = SCRATCH_FIRST = grow(a); // doubling: the buffers end at most twice the most pairs a range held
          b = SCRATCH_SECOND = grow(b);
          capacity = a.length;
        }
        a[count] = x;
        b[count] = y;
        count++;
        continue;
      }
      const kindX = cellKind(x);
      const kindY = cellKind(y);
      if (kindX === BLANK && kindY === BLANK) {
        emptyPairs++;
      } else {
        if (kindX !== NUMBER) tally(skippedFirst, kindX);
        if (kindY !== NUMBER) tally(skippedSecond, kindY);
      }
    }
  }
  return { count, visited, emptyPairs, skippedFirst, skippedSecond };
}

/**
 * Pairs up two ranges of the same shape cell by cell, keeping the pairs where both cells are finite numbers.
 * Throws a RangeError when the shapes differ (the cell-function layer checks this first and says so to the user).
 *
 * @example
 * const p = pairsFromCells([[1], [2], ["x"], [null]], [[1.5], [null], [4], [""]]);
 * // p.first: [1]; p.second: [1.5]; p.pairs: 4; p.pairsSkipped: 2; p.emptyPairs: 1
 * // p.skippedFirst.text: 1; p.skippedSecond.blank: 1
 */
export function pairsFromCells(first: readonly (readonly unknown[])[], second: readonly (readonly unknown[])[]): CellPairs {
  const t = readPairs(first, second, "pairsFromCells");
  return {
    first: SCRATCH_FIRST.slice(0, t.count),
    second: SCRATCH_SECOND.slice(0, t.count),
    pairs: t.visited,
    pairsSkipped: t.visited - t.count - t.emptyPairs,
    emptyPairs: t.emptyPairs,
    skippedFirst: t.skippedFirst,
    skippedSecond: t.skippedSecond,
  };
}

/**
 * The differences second − first − shift of the pairs `pairsFromCells` keeps, rounded by `pairedDifferences`
 * (the shared tie rule), with the same counts of what was set aside: the same as
 * `pairedDifferences(p.first, p.second, shift)` for p = `pairsFromCells(first, second)`, in one reading
 * that keeps no copy of the pairs. Throws a RangeError when the shapes differ.
 *
 * @example
 * const d = pairedDifferencesFromCells([[1.1], [5], ["x"]], [[2.3], [4], [7]], 1.2);
 * // d.differences: Float64Array [0, -2.2]; d.pairs: 3; d.pairsSkipped: 1; d.skippedFirst.text: 1
 */
export function pairedDifferencesFromCells(
  first: readonly (readonly unknown[])[],
  second: readonly (readonly unknown[])[],
  shift: number,
): CellDifferences {
  const t = readPairs(first, second, "pairedDifferencesFromCells");
  return {
    differences: pairedDifferences(SCRATCH_FIRST.subarray(0, t.count), SCRATCH_SECOND.subarray(0, t.count), shift),
    pairs: t.visited,
    pairsSkipped: t.visited - t.count - t.emptyPairs,
    emptyPairs: t.emptyPairs,
    skippedFirst: t.skippedFirst,
    skippedSecond: t.skippedSecond,
  };
}

// Warm-up at load time, on a small range holding every kind of cell. The engine compiles a long scan while
// its loop is running (on-stack replacement); code after the loop that has not yet run has no type
// feedback then, and that compiled loop bails out at its exit at the end of every later call (measured with
// node --trace-deopt: 120 bail-outs in bench/cells.bench.ts, 1.5x slower scans; with the warm-up: one).
// Feedback is only recorded once a function has been called a few times, hence the repetitions.
for (let i = 0; i < 20; i++) {
  numbersFromCells(Array.from({ length: 40 }, () => [0, null, undefined, "", "a", true, {}, NaN]));
  signCountsFromCells(
    Array.from({ length: 40 }, () => [0, -1, 1, 1e-20, null, undefined, "", "a", true, {}, NaN]),
    0,
  );
  pairedDifferencesFromCells(
    Array.from({ length: 40 }, () => [0, null, "a", true, {}, 1, null, 2.5]),
    Array.from({ length: 40 }, () => [0, 1, 2, 3, 4, NaN, null, -1.25]),
    0,
  );
}
