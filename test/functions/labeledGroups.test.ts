/**
 * LABELEDTWOGROUPS, LABELEDSHIFT and LABELEDTWOGROUPSSTATISTIC: two groups picked by label from one values
 * column and one label column; and TWOGROUPSSTATISTIC, whose U is checked by exact arithmetic and whose
 * method word against the core's own choice.
 * The reference is the cell layer's own TWOGROUPS and SHIFT on the two groups split into ranges by hand
 * (exact equality: the same numbers reach the same core), whose numbers test/functions/groups.test.ts and
 * the core's tests check against R 4.2 and enumeration. Label rules are groupCells' (src/stats/groupedCells.ts).
 */
import { describe, expect, it } from "vitest";
import {
  callFunction,
  labeledshift,
  labeledtwogroups,
  labeledtwogroupsstatistic,
  shift,
  twogroups,
  twogroupsstatistic,
} from "../../src/functions/functions";
import { rankSumTest } from "../../src/stats/rankSum";
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

describe("TWOGROUPSSTATISTIC: U and the method TWOGROUPS' rank-sum p-value uses", () => {
  it("counts the pairs in which second − shift exceeds first, a tie counting 1/2 (exact arithmetic)", () => {
    // 1, 2, 2 against 2, 3, 4: second's 2 beats 1 and ties two 2s (2), 3 and 4 beat all three (6): U = 8.
    expect(twogroupsstatistic(col([1, 2, 2]), col([2, 3, 4]))).toEqual([[8, "exact"]]);
    // With shift 1 the second group becomes 1, 2, 3: 1 ties 1 (0.5), 2 beats 1 and ties two 2s (2), 3 beats all (3).
    expect(twogroupsstatistic(col([1, 2, 2]), col([2, 3, 4]), 1)).toEqual([[5.5, "exact"]]);
  });

  it("names the method TWOGROUPS used, on both sides of each size limit, with and without ties", () => {
    // Invented readings: distinct in steps of 0.01, or each twice (ties).
    const group = (n: number, start: number, tied: boolean) =>
      col(Array.from({ length: n }, (_, i) => Number((start + (tied ? i >> 1 : i) * 0.01).toFixed(3))));
    for (const [m, n, tied] of [
      [80, 80, true],
      [81, 80, true],
      [81, 80, false],
      [200, 200, false],
      [201, 200, false],
    ] as const) {
      const first = group(m, 50, tied);
      const second = group(n, 50.005, tied);
      const core = rankSumTest(first.flat() as number[], second.flat() as number[]);
      expect(core.available).toBe(true);
      if (!core.available) continue;
      expect(twogroupsstatistic(first, second), `${m} + ${n}, ties ${tied}`).toEqual([[core.statistic, core.method]]);
    }
  });

  it("answers #N/A in both cells for an empty group, and #VALUE! for a bad shift", () => {
    const [row] = twogroupsstatistic(col(["x"]), col([1, 2]));
    for (const cell of row) expectError(cell, "#N/A", /first has 0/);
    const [bad] = twogroupsstatistic(col([1]), col([2]), "up");
    for (const cell of bad) expectError(cell, "#VALUE!", /shift/);
  });
});

describe("LABELEDTWOGROUPSSTATISTIC is TWOGROUPSSTATISTIC on the two labels' values", () => {
  it.each([null, 1.5])("shift %s", (moved) => {
    expect(labeledtwogroupsstatistic(values, labels, "Line A", "Line B", moved)).toEqual(twogroupsstatistic(lineA, lineB, moved));
    expect(labeledtwogroupsstatistic(values, labels, "line b", "LINE A", moved)).toEqual(twogroupsstatistic(lineB, lineA, moved));
  });

  it("answers #N/A naming a label that is not there, in both cells", () => {
    const [row] = labeledtwogroupsstatistic(values, labels, "Line A", "Line D");
    for (const cell of row) expectError(cell, "#N/A", /Line D/);
  });
});
