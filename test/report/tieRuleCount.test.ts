/**
 * The block states the n its p-value used. Under the tie rules "split" and
 * "conservative" the sign test keeps ties, so the used row must count them as
 * the p-value does, and the statistic row must be the count after the rule.
 */
import { describe, expect, it } from "vitest";
import { callFunction } from "../../src/functions/functions";
import { blockFormula, blockValue, resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";

/** Invented thicknesses (µm): 6 below 50, two exactly 50, 14 above; 22 numbers. */
const CELLS = [
  ...[47.9, 48.4, 49.1, 49.5, 48.8, 49.9].map((x) => [x]),
  [50],
  [50],
  ...[50.2, 51.4, 52.3, 50.7, 53.0, 51.9, 50.4, 52.8, 51.1, 50.9, 54.2, 51.6, 50.3, 52.1].map((x) => [x]),
];

/** P(X >= k), X ~ Bin(n, 1/2), by exact BigInt arithmetic. */
function fairUpperTail(k: number, n: number): number {
  let numerator = 0n;
  let choose = 1n;
  for (let j = 0; j <= n; j++) {
    if (j > 0) choose = (choose * BigInt(n - j + 1)) / BigInt(j);
    if (j >= k) numerator += choose;
  }
  return Number(numerator) / 2 ** n;
}

function rowsOf(request: BlockRequest, data = CELLS, second?: unknown[][]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const row of resultBlockRows(request)) out[row.key] = blockValue(row.value, second ? { data, second } : { data }, callFunction);
  return out;
}

const BASE: BlockRequest = { test: "sign", paired: false, center: 50, alternative: "greater", alpha: 0.05, confidence: 0.95 };

describe("the used row states the n the p-value used", () => {
  it("keeps both ties under split: n 22, statistic 15", () => {
    const rows = rowsOf({ ...BASE, ties: "split" });
    expect(rows.used).toBe(22);
    expect(rows.statistic).toBe(15);
    // Exact arithmetic: P(Bin(22, 1/2) >= 15).
    expect(rows.pvalue as number).toBeCloseTo(fairUpperTail(15, 22), 14);
  });

  it("keeps both ties under conservative (counted below for greater): n 22, statistic 14", () => {
    const rows = rowsOf({ ...BASE, ties: "conservative" });
    expect(rows.used).toBe(22);
    expect(rows.statistic).toBe(14);
    expect(rows.pvalue as number).toBeCloseTo(fairUpperTail(14, 22), 14);
  });

  it("leaves the ties out under drop: n 20", () => {
    const rows = rowsOf({ ...BASE, ties: "drop" });
    expect(rows.used).toBe(20);
    expect(rows.pvalue as number).toBeCloseTo(fairUpperTail(14, 20), 14);
  });

  it("splits an odd number of ties with one left out, for pairs too", () => {
    const first = CELLS.map(() => [0]);
    const second = CELLS.map((r, i) => (i === 0 ? [50] : r)); // three differences of exactly 50
    const rows = rowsOf({ ...BASE, paired: true, ties: "split" }, first, second);
    expect(rows.tied).toBe(3);
    expect(rows.used).toBe(21);
  });

  it("names the rule in the label and passes it into the formula", () => {
    const used = resultBlockRows({ ...BASE, ties: "split" }).find((r) => r.key === "used")!;
    expect(used.label).toMatch(/^Used by the test \(n, ties shared evenly/);
    expect(blockFormula(used.value, { data: "Panels[Thickness]" })).toBe('=INDEX(EVENSPLIT.COUNTS(Panels[Thickness],50,"split"),1,4)');
  });
});
