/**
 * The sequential cell functions WATCHPVALUE, WATCHBOUNDS and SPRT from source: arrival order, the wiring to
 * the core (whose own tests check it against exact arithmetic), and the messages for what cannot be given.
 * Expected p-values are worked by hand in exact arithmetic (the closed forms of src/stats/anytimeSign.ts).
 * Data: invented paint-line coating thicknesses in µm around a target of 50 (not real measurements).
 */
import { describe, expect, it } from "vitest";
import { callFunction, sprt, watchbounds, watchpvalue } from "../../src/functions/functions";
import type { CellError } from "../../src/functions/runtime";

function col(...cells: unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

function expectError(value: unknown, code: string, pattern: RegExp): void {
  expect(value).toMatchObject({ code });
  expect((value as CellError).message).toMatch(pattern);
}

describe("WATCHPVALUE", () => {
  it("eight thicknesses above the target: 9/256 two-sided, 9/511 for greater (2^8 · 8! / 9! and 2 · 256/9 · 511/512)", () => {
    const data = col(51.2, 50.4, 52.1, 50.9, 53.3, 51.7, 50.2, 52.6);
    expect(watchpvalue(data, 50) as number).toBeCloseTo(9 / 256, 14);
    expect(watchpvalue(data, 50, "above") as number).toBeCloseTo(9 / 511, 14);
    expect(watchpvalue(data, 50, "less")).toBe(1);
  });

  it("reads down the rows, then across the columns, and the order changes the answer", () => {
    // Column A: 8 above then B: 8 below. Down then across, the evidence peaks after row 8 (p = 9/256);
    // read across first the signs alternate and the evidence never leaves 1.
    const block = Array.from({ length: 8 }, (_, r) => [51 + r, 49 - r]);
    expect(watchpvalue(block, 50) as number).toBeCloseTo(9 / 256, 14);
    const acrossFirst = col(...block.flat());
    expect(watchpvalue(acrossFirst, 50)).toBe(1);
  });

  it("ties by the word given; blanks and text skipped; refusals say what is wrong", () => {
    expect(watchpvalue(col(50, 51, null, "x", 50), 50, null, "split")).toBe(watchpvalue(col(49, 51, 51), 50));
    expectError(watchpvalue(col(51, 52), "fifty"), "#VALUE!", /hypothesized_median must be a number/);
    expectError(watchpvalue(col(51, 52), 50, "bigger"), "#VALUE!", /"bigger" is not accepted/);
    expectError(watchpvalue(col(null, "a"), 50), "#N/A", /No values/);
    expectError(watchpvalue(col(50, 50), 50), "#N/A", /Every value equals/);
  });
});

describe("WATCHBOUNDS", () => {
  it("one row: lower, upper, rows used; ten invented thicknesses give 47 to 54 (see test/stats/confidenceSequence.test.ts)", () => {
    expect(watchbounds(col(49, 53, 50, 52, 48, 51, 47, 54, 46, 55))).toEqual([[47, 54, 10]]);
    expect(callFunction("WATCHBOUNDS", [col(49, 53, 50, 52, 48, 51, 47, 54, 46, 55), 0.95, 0.5])).toEqual([[47, 54, 10]]);
  });

  it("an end not bounded yet is #N/A saying from which row it comes; the other cells keep their values", () => {
    const [[lower, upper, rows]] = watchbounds(col(49, 53, 50, 52, 48));
    expectError(lower, "#N/A", /No lower bound yet: .* comes with row 8; there are 5 rows/);
    expectError(upper, "#N/A", /No upper bound yet/);
    expect(rows).toBe(5);
    // The 0.9 quantile is bounded below from row 2 but above only from row 69 at 95%.
    const [[low90, high90]] = watchbounds(col(...Array.from({ length: 20 }, (_, i) => 45 + ((7 * i) % 20) / 2)), null, 0.9);
    expect(typeof low90).toBe("number");
    expectError(high90, "#N/A", /row 69/);
  });

  it("rows that shift leave no common median: #N/A across the row, saying why; bad options are #VALUE!", () => {
    const shifted = col(...Array.from({ length: 200 }, () => 45), ...Array.from({ length: 400 }, () => 55));
    for (const cell of watchbounds(shifted)[0]) expectError(cell, "#N/A", /shift/);
    for (const cell of watchbounds(col(1, 2), 95)[0]) expectError(cell, "#VALUE!", /For 95% write 0.95/);
    for (const cell of watchbounds(col(1, 2), null, 1)[0]) expectError(cell, "#VALUE!", /quantile must lie strictly between 0 and 1/);
  });
});

describe("SPRT", () => {
  it("one row: the decision word, rows used, log likelihood ratio and Wald's two limits", () => {
    // 1.5^7 ≈ 17.1 >= (1 − 0.2)/0.05 = 16 at the 7th value above; the tie (50) is read but not counted.
    const data = col(51, 52, 50, 53, 54, 55, 56, 57, 40, 40);
    const [[decision, rows, llr, acceptAt, rejectAt]] = sprt(data, 50, 0.75);
    expect([decision, rows]).toEqual(["reject", 8]);
    expect(llr as number).toBeCloseTo(7 * Math.log(1.5), 14);
    expect(acceptAt as number).toBeCloseTo(Math.log(0.2 / 0.95), 15);
    expect(rejectAt as number).toBeCloseTo(Math.log(16), 15);
    expect(sprt(col(51, 52), 50, 0.75)[0].slice(0, 2)).toEqual(["continue", 2]);
    expect(sprt(col(45, 46, 47), 50, 0.75)[0].slice(0, 2)).toEqual(["accept", 3]);
  });

  it("refuses p_above of 0.5 or outside (0, 1), a missing p_above, and alpha + beta of 1 or more", () => {
    for (const cell of sprt(col(51), 50, 0.5)[0]) expectError(cell, "#VALUE!", /p_above must differ from 0.5/);
    for (const cell of sprt(col(51), 50, 75)[0]) expectError(cell, "#VALUE!", /For 75% write 0.75/);
    for (const cell of sprt(col(51), 50, null)[0]) expectError(cell, "#VALUE!", /p_above is missing/);
    for (const cell of sprt(col(51), 50, 0.75, 0.5, 0.6)[0]) expectError(cell, "#VALUE!", /alpha and beta must add up to less than 1/);
  });
});
