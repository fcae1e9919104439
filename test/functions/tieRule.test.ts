/**
 * One tie rule across the catalogue and the pane: every function that compares values with a hypothesised
 * centre takes a tie at the 15 significant digits the sheet shows (src/stats/differences.ts, compareAsShown).
 * Expected counts are exact decimal arithmetic: 0.1 + 0.2 and 0.7 - 0.4 both read 0.3 on the sheet (Microsoft,
 * "Floating-point arithmetic may give inaccurate results in Excel", from memory: 15 significant digits),
 * while 0.31, 0.32 and 0.29 differ from 0.3 in the second decimal.
 */
import { describe, expect, it } from "vitest";
import {
  callFunction,
  counts,
  pairedcounts,
  paired,
  pairedsignrankstatistic,
  pvalue,
  quantilepvalue,
  report,
  signrankstatistic,
  statistic,
} from "../../src/functions/functions";
import { blockPreview } from "../../src/taskpane/preview";
import type { BlockRequest } from "../../src/report/resultBlock";

const col = (...cells: unknown[]): unknown[][] => cells.map((c) => [c]);
const values = col(0.1 + 0.2, 0.7 - 0.4, 0.31, 0.32, 0.29);
const zeros = col(0, 0, 0, 0, 0);
const centres = col(0.3, 0.3, 0.3, 0.3, 0.3);

describe("one tie rule for every function and the pane", () => {
  it("COUNTS and PAIREDCOUNTS on the same numbers agree: two ties", () => {
    expect(counts(values, 0.3)).toEqual([[1, 2, 2, 3]]);
    expect(pairedcounts(centres, values)).toEqual([[1, 2, 2, 3, 0]]);
    expect(pairedcounts(zeros, values, 0.3)).toEqual([[1, 2, 2, 3, 0]]);
  });

  it("the one-sample sign test uses the same three values as the paired one", () => {
    // Ties dropped: 2 above, 1 below of 3; P(Bin(3, 1/2) >= 2) = 4/8 (exact arithmetic).
    expect(pvalue(values, 0.3, "greater")).toBe(0.5);
    expect(paired(centres, values, 0, "greater")).toBe(0.5);
    expect(statistic(values, 0.3, "greater")).toBe(2);
  });

  it("the quantile test leaves the same two ties out", () => {
    // q = 0.5, 1 below of 3 used: "less" is P(Bin(3, 1/2) >= 1) = 7/8 (exact arithmetic).
    expect(quantilepvalue(values, 0.3, 0.5, "less")).toBe(0.875);
  });

  it("the signed-rank statistic sees the same two zeros", () => {
    // Zeros dropped: |0.01|, |0.02|, |-0.01| ranked 1.5, 3, 1.5; V = 1.5 + 3 = 4.5 (by hand).
    expect(signrankstatistic(values, 0.3)).toBe(4.5);
    expect(pairedsignrankstatistic(centres, values)).toBe(4.5);
  });

  it("REPORT and the pane's preview count two ties", () => {
    const tiesRow = (rows: unknown[][]) => rows.find((r) => String(r[0]).includes("(ties)"));
    expect(tiesRow(report(values, 0.3, "greater"))?.[1]).toBe(2);
    const request: BlockRequest = {
      test: "sign",
      paired: false,
      center: 0.3,
      alternative: "greater",
      alpha: 0.05,
      confidence: 0.95,
      dataName: "Thickness",
    };
    const preview = blockPreview(request, { data: values }, { data: "A2:A6" }, callFunction);
    expect(preview.find((r) => r.key === "tied")?.value).toBe(2);
  });
});
