/**
 * LABELEDTWOGROUPS and LABELEDSHIFT: two groups picked by label from one values column and one label column.
 * The reference is the cell layer's own TWOGROUPS and SHIFT on the two groups split into ranges by hand
 * (exact equality: the same numbers reach the same core), whose numbers test/functions/groups.test.ts and
 * the core's tests check against R 4.2 and enumeration. Label rules are groupCells' (src/stats/groupedCells.ts).
 */
import { describe, expect, it } from "vitest";
import { callFunction, labeledshift, labeledtwogroups, shift, twogroups } from "../../src/functions/functions";
import { isCellError } from "../../src/functions/runtime";

const col = (v: unknown[]) => v.map((x) => [x]);

// Invented paint-line panels, interleaved, with a third line, a blank label, a text value and a blank value.
const values = col([51.2, 49.8, 50.6, 52.4, 48.9, 53.1, 50.2, "n/a", 51.7, 49.5, 52.9, 50.0, 47.7, null, 51.1, 52.2]);
const labels = col([
  "Line A",
  "line b",
  "Line C",
  "LINE B",
  "Line A",
  "Line B",
  "line a",
  "Line A",
  "Line B",
  "Line A",
  null,
  "Line C",
  "Line A",
  "Line B",
  "Line B",
  "Line A",
]);
const lineA = col([51.2, 48.9, 50.2, 49.5, 47.7, 52.2]);
const lineB = col([49.8, 52.4, 53.1, 51.7, 51.1]);

const ALTERNATIVES = ["two-sided", "greater", "less"];
const METHODS = ["rank-sum", "median"];

function expectError(cell: unknown, code: string, pattern: RegExp): void {
  expect(isCellError(cell), JSON.stringify(cell)).toBe(true);
  if (!isCellError(cell)) return;
  expect(cell.code).toBe(code);
  expect(cell.message ?? "").toMatch(pattern);
}

describe("LABELEDTWOGROUPS is TWOGROUPS on the two labels' values", () => {
  for (const alternative of ALTERNATIVES) {
    for (const method of METHODS) {
      for (const moved of [null, 1.5]) {
        it(`${alternative}, ${method}, shift ${moved ?? "left out"}`, () => {
          const split = twogroups(lineA, lineB, moved, alternative, method);
          expect(typeof split).toBe("number");
          expect(labeledtwogroups(values, labels, "Line A", "Line B", moved, alternative, method)).toBe(split);
          expect(labeledtwogroups(values, labels, "line b", "LINE A", moved, alternative, method)).toBe(
            twogroups(lineB, lineA, moved, alternative, method),
          );
        });
      }
    }
  }

  it("passes the at_median rule on", () => {
    for (const rule of ["join-lower", "join-upper", "leave-out"]) {
      expect(labeledtwogroups(values, labels, "Line A", "Line B", null, null, "median", rule)).toBe(
        twogroups(lineA, lineB, null, null, "median", rule),
      );
    }
  });

  it("takes the labels from one-cell ranges, and by id from the catalogue", () => {
    expect(labeledtwogroups(values, labels, [["Line A"]], [["Line B"]])).toBe(twogroups(lineA, lineB));
    expect(callFunction("LABELEDTWOGROUPS", [values, labels, "Line A", "Line B"])).toBe(twogroups(lineA, lineB));
  });

  it("number labels match numbers, not text that looks the same, and the message says so", () => {
    const heads = col([3, 1, 2, 1, 2, 1, 2, 3]);
    const nums = col([10, 11, 12, 13, 14, 15, 16, 17]);
    expect(labeledtwogroups(nums, heads, 1, 2)).toBe(twogroups(col([11, 13, 15]), col([12, 14, 16])));
    expectError(labeledtwogroups(nums, heads, "1", 2), "#N/A", /Label "1" \(first_label\) was not found/);
    const textHeads = col(["1", "2", "1", "2"]);
    expectError(labeledtwogroups(col([1, 2, 3, 4]), textHeads, 1, "2"), "#N/A", /holds "1" as text/);
    const logical = col([true, false, true, false, true, false]);
    expect(labeledtwogroups(col([1, 2, 3, 4, 5, 6]), logical, true, false)).toBe(twogroups(col([1, 3, 5]), col([2, 4, 6])));
  });
});

describe("LABELEDSHIFT is SHIFT on the two labels' values", () => {
  for (const confidence of [null, 0.9, 0.8]) {
    it(`confidence ${confidence ?? "left out"}`, () => {
      const split = shift(lineA, lineB, confidence);
      const labeled = labeledshift(values, labels, "Line A", "Line B", confidence);
      expect(labeled).toHaveLength(1);
      labeled[0].forEach((cell, i) => expect(cell).toBe(split[0][i]));
      expect(callFunction("LABELEDSHIFT", [values, labels, "line b", "line a", confidence])).toEqual(shift(lineB, lineA, confidence));
    });
  }

  it("groups too small for bounds: the estimate, and the bound cells as SHIFT gives them", () => {
    const row = labeledshift(col([1, 2, 3, 4]), col(["x", "x", "y", "y"]), "x", "y")[0];
    expect(row[0]).toBe(2);
    expect(row).toEqual(shift(col([1, 2]), col([3, 4]))[0]);
  });
});

describe("labels the column does not hold, and wrong arguments", () => {
  it("a label not found is #N/A naming it and listing the labels found", () => {
    expectError(
      labeledtwogroups(values, labels, "Line A", "Line D"),
      "#N/A",
      /Label "Line D" \(second_label\) was not found in labels; found "Line A", "line b", "Line C"\./,
    );
    const row = labeledshift(values, labels, "Line Z", "Line B")[0];
    expect(row).toHaveLength(4);
    for (const cell of row) expectError(cell, "#N/A", /"Line Z" \(first_label\)/);
  });

  it("a label with no numbers beside it is #N/A naming it", () => {
    expectError(
      labeledtwogroups(col([1, 2, "x", null]), col(["a", "a", "b", "b"]), "a", "b"),
      "#N/A",
      /Label "b" \(second_label\) has no numbers/,
    );
  });

  it("blank labels are skipped (their values belong to no group)", () => {
    const withBlank = labeledtwogroups(col([1, 2, 3, 99, 4, 5, 6]), col(["a", "a", "a", "", "b", "b", "b"]), "a", "b", null, "greater");
    expect(withBlank).toBe(twogroups(col([1, 2, 3]), col([4, 5, 6]), null, "greater"));
  });

  it("the same label twice, a blank label, different shapes and a wrong word are #VALUE! with a message", () => {
    expectError(labeledtwogroups(values, labels, "Line A", "LINE A"), "#VALUE!", /same group/);
    expectError(labeledtwogroups(values, labels, "", "Line B"), "#VALUE!", /first_label must be a group label/);
    expectError(labeledtwogroups(values, labels, null, "Line B"), "#VALUE!", /first_label/);
    expectError(labeledtwogroups(col([1, 2]), col(["a"]), "a", "b"), "#VALUE!", /same shape/);
    expectError(labeledtwogroups(values, labels, "Line A", "Line B", null, null, "t-test"), "#VALUE!", /rank-sum/);
    expectError(labeledshift(values, labels, "Line A", "Line B", 95)[0][0], "#VALUE!", /confidence/);
  });
});
