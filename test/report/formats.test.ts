/**
 * Words and numbers on screen: how the block's p-values and coverages show.
 * Expected texts follow Excel's custom number formats (Microsoft, "Review
 * guidelines for customizing a number format": up to two conditions, a third
 * section for the rest); the smallest positive number a cell holds is
 * 2.2251E-308 (Microsoft, "Excel specifications and limits").
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { callFunction } from "../../src/functions/functions";
import { NUMBER_FORMATS, reportCell, resultBlockRows } from "../../src/report/resultBlock";
import { formatCell } from "../../src/taskpane/numberFormat";

describe("p-values", () => {
  it("show a p-value too small for a cell as < 1E-307, never 0.00E+00", () => {
    expect(formatCell(0, NUMBER_FORMATS.pvalue)).toBe("< 1E-307");
    expect(formatCell(1e-310, NUMBER_FORMATS.pvalue)).toBe("< 1E-307");
    expect(formatCell(2.5e-300, NUMBER_FORMATS.pvalue)).toBe("2.50E-300");
    expect(formatCell(0.0000123, NUMBER_FORMATS.pvalue)).toBe("1.23E-05");
  });

  it("show 1 as 1 and an ordinary p-value as it is", () => {
    expect(formatCell(1, NUMBER_FORMATS.pvalue)).toBe("1");
    expect(formatCell(0.046875, NUMBER_FORMATS.pvalue)).toBe("0.046875");
  });

  it("come out of REPORT as the same words when too small for a cell", () => {
    // 3000 values all above 50: the two-sided p-value 2 × 2^-3000 underflows a double to 0 (exact arithmetic).
    const report = callFunction("REPORT", [Array.from({ length: 3000 }, (_, i) => [51 + i / 1000]), 50]) as unknown[][];
    expect(report.find((r) => r[0] === "p-value")![1]).toBe("< 1E-307");
    expect(reportCell("pvalue", 0.03)).toBe(0.03);
    expect(reportCell("integer", 0)).toBe(0);
  });
});

describe("coverage", () => {
  it("never rounds up to 100%", () => {
    expect(formatCell(0.99999952, NUMBER_FORMATS.percent)).toBe("99.99995%");
    expect(formatCell(0.978515625, NUMBER_FORMATS.percent)).toBe("97.85%");
    expect(formatCell(1 - 1e-12, NUMBER_FORMATS.percent)).toBe("> 99.99999%");
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 1, maxExcluded: true, noNaN: true }), (c) => {
        expect(formatCell(c, NUMBER_FORMATS.percent)).not.toMatch(/^100/);
      }),
    );
  });
});

describe("the block's wording of the confidence", () => {
  it("never rounds a confidence below 1 up to 100%", () => {
    const labels = resultBlockRows({
      test: "sign",
      paired: false,
      center: 50,
      alternative: "two-sided",
      alpha: 0.05,
      confidence: 0.999999999,
    }).map((r) => r.label);
    expect(labels.join(" ")).not.toMatch(/100%/);
    expect(labels).toContain("0.999999999 bounds for the median: lower");
  });
});
