/**
 * Keep what can be given: a row-valued function whose data suffice for some
 * of its cells answers those and puts #N/A with the reason only where a value
 * cannot be given (issue: 95% Hodges–Lehmann bounds need six values, the
 * estimate one).
 */
import { describe, expect, it } from "vitest";
import { hodgeslehmann, pairedhodgeslehmann } from "../../src/functions/functions";
import type { CellError } from "../../src/functions/runtime";

function col(...cells: unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

/** Median of all pairwise averages (x_i + x_j)/2, i <= j, by brute-force enumeration. */
function walshMedian(values: number[]): number {
  const walsh: number[] = [];
  for (let i = 0; i < values.length; i++) for (let j = i; j < values.length; j++) walsh.push((values[i] + values[j]) / 2);
  walsh.sort((a, b) => a - b);
  const m = walsh.length;
  return m % 2 ? walsh[(m - 1) / 2] : (walsh[m / 2 - 1] + walsh[m / 2]) / 2;
}

describe("Hodges–Lehmann with too few values for the bounds", () => {
  const values = [2.1, 3.4, 1.7, 5.0, 2.9];

  it("gives the estimate and #N/A with the reason in the three bound cells", () => {
    const [[estimate, lower, upper, achieved]] = hodgeslehmann(col(...values), 0.95);
    // Brute-force enumeration of the 15 Walsh averages; R 4.2 wilcox.test(x, conf.int = TRUE)$estimate gives 2.9 too (as quoted in the issue).
    expect(estimate).toBeCloseTo(walshMedian(values), 12);
    expect(estimate).toBeCloseTo(2.9, 12);
    for (const cell of [lower, upper, achieved]) {
      expect(cell).toMatchObject({ code: "#N/A" });
      // 2^-5 = 0.03125 > 0.025: five values cannot reach 95%, six can (exact arithmetic).
      expect((cell as CellError).message).toMatch(/at least 6 values; there are 5/);
    }
  });

  it("does the same for pairs", () => {
    const [[estimate, lower]] = pairedhodgeslehmann(col(0, 0, 0, 0, 0), col(...values), 0.95);
    expect(estimate).toBeCloseTo(2.9, 12);
    expect(lower).toMatchObject({ code: "#N/A" });
  });

  it("still answers #N/A in every cell when there are no values at all", () => {
    const [row] = hodgeslehmann(col("n/a", null), 0.95);
    expect(row.every((cell) => (cell as CellError).code === "#N/A")).toBe(true);
  });
});
