import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { adjustPValues } from "../../src/stats/adjust";
import { summariseGroups } from "../../src/stats/byGroup";
import { groupCells } from "../../src/stats/groupedCells";
import { quantileBounds } from "../../src/stats/quantileBounds";
import { countSigns } from "../../src/stats/signCounts";
import { signTest } from "../../src/stats/signTest";

describe("groupCells", () => {
  it("groups in order of first appearance, text ignoring case, and counts what it skips", () => {
    const g = groupCells(
      [[51.2], [49.8], ["x"], [50.4], [52], [null], [53], [1], [2]],
      [["Line A"], ["line b"], ["Line A"], ["LINE B"], [null], [null], ["line a"], [1], ["1"]],
    );
    expect(g.groups.map((x) => x.label)).toEqual(["Line A", "line b", 1, "1"]);
    expect(g.groups.map((x) => Array.from(x.values))).toEqual([[51.2, 53], [49.8, 50.4], [1], [2]]);
    expect(g.valuesSkipped).toBe(1);
    expect(g.blankLabels).toBe(1); // the row with both cells blank is no row at all
  });

  it("keeps a label whose values are all skipped as a group without numbers; error labels are counted", () => {
    const g = groupCells([["a"], [3], [4]], [["G"], [{ code: "#N/A" }], ["H"]]);
    expect(g.groups.map((x) => [x.label, x.values.length])).toEqual([
      ["G", 0],
      ["H", 1],
    ]);
    expect(g.labelErrors).toBe(1);
  });

  it("tells apart labels that share a cache slot (same length, same last two characters), and still folds case", () => {
    const labels = ["Line 10", "Fine 10", "line 10", "Fine 10", "LINE 10", "Mine 10"];
    const g = groupCells(
      labels.map((_, i) => [i]),
      labels.map((l) => [l]),
    );
    expect(g.groups.map((x) => [x.label, Array.from(x.values)])).toEqual([
      ["Line 10", [0, 2, 4]],
      ["Fine 10", [1, 3]],
      ["Mine 10", [5]],
    ]);
  });

  it("refuses ranges of different shapes", () => {
    expect(() => groupCells([[1], [2]], [["a"]])).toThrow(RangeError);
  });
});

describe("summariseGroups", () => {
  it("gives the documented example (exact arithmetic: 2/64 and Holm's 2 x 2/64)", () => {
    const r = summariseGroups([Float64Array.of(51, 52, 53, 54, 55, 56), Float64Array.of(48, 49, 50.5, 47, 49.5, 46)], 50, {
      confidence: 0.9,
    });
    expect(r.rows[0]).toEqual({ n: 6, median: 53.5, lower: 51, upper: 56, coverage: 1 - 2 / 64, pValue: 2 / 64, adjustedPValue: 4 / 64 });
    expect(r.rows[1].pValue).toBe(14 / 64); // 1 above, 5 below: 2 P(Bin(6, 1/2) <= 1) = 2 x 7/64
  });

  it("each row is the one-sample sign test and bounds on that group; adjustment is ADJUST's on the groups' p-values", () => {
    const group = fc.array(fc.integer({ min: 40, max: 60 }), { minLength: 0, maxLength: 30 });
    fc.assert(
      fc.property(
        fc.array(group, { minLength: 1, maxLength: 8 }),
        fc.constantFrom("two-sided", "greater", "less" as const),
        fc.constantFrom("holm", "bh", "bonferroni" as const),
        (lists, alternative, adjust) => {
          const groups = lists.map((l) => Float64Array.from(l));
          const r = summariseGroups(
            groups.map((g) => g.slice()),
            50,
            { alternative, adjust, confidence: 0.9 },
          );
          const side = alternative === "greater" ? "lower" : alternative === "less" ? "upper" : "two-sided";
          const ps = groups.map((g) => {
            const t = signTest(countSigns(g, 50), { alternative });
            return g.length > 0 && t.available ? t.pValue : NaN;
          });
          const adjusted = adjustPValues(ps, adjust);
          groups.forEach((g, i) => {
            const row = r.rows[i];
            expect(row.n).toBe(g.length);
            if (g.length === 0) return;
            const sorted = g.slice().sort();
            const median = g.length % 2 ? sorted[(g.length - 1) / 2] : (sorted[g.length / 2 - 1] + sorted[g.length / 2]) / 2;
            expect(row.median).toBe(median);
            const b = quantileBounds(g, { confidence: 0.9, side });
            if (b.available) expect([row.lower, row.upper, row.coverage]).toEqual([b.lower, b.upper, b.achievedConfidence]);
            else expect(row.coverage).toEqual({ missing: b.message });
            if (Number.isNaN(ps[i])) expect(typeof row.pValue).toBe("object");
            else expect([row.pValue, row.adjustedPValue]).toEqual([ps[i], adjusted[i]]);
          });
        },
      ),
      { numRuns: 150 },
    );
  });
});
