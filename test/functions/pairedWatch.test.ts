/**
 * The paired watching cell functions PAIREDWATCHPVALUE, PAIREDWATCHBOUNDS and PAIREDSPRT from source.
 *
 * Their one promise beyond the one-sample versions is the pairing: each is checked to agree exactly (toBe, not
 * close) with WATCHPVALUE, WATCHBOUNDS and SPRT on a range of differences laid out as the sheet would hold them,
 * the same shape as the pairs, with a blank where a position is no complete pair, each difference worked
 * out here pair by pair (second − first − shift to 15 significant digits, as differences.ts rounds it). The
 * one-sample functions are checked against exact arithmetic in watch.test.ts and test/stats; the worked values
 * below are exact arithmetic too (the closed forms of src/stats/anytimeSign.ts), and the seeded Monte Carlo
 * repeats test/stats/anytimeSign.test.ts's check under H0 through the paired cells.
 * Data: invented paint-line coating thicknesses in µm before and after a nozzle change (not real measurements).
 */
import { describe, expect, it } from "vitest";
import {
  pairedwatchbounds,
  pairedwatchpvalue,
  pairedsprt,
  pairedcounts,
  callFunction,
  sprt,
  watchbounds,
  watchpvalue,
} from "../../src/functions/functions";
import type { CellError } from "../../src/functions/runtime";
import { pairedDifferences } from "../../src/stats/differences";
import { xorshift32 } from "../../src/stats/xorshift";

function col(...cells: unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

function expectError(value: unknown, code: string, pattern: RegExp): void {
  expect(value).toMatchObject({ code });
  expect((value as CellError).message).toMatch(pattern);
}

const isNumber = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);

/**
 * The range of differences second − first − shift a careful sheet would hold beside the pairs: same shape,
 * blank where either cell is not a finite number, so the one-sample functions skip exactly those positions.
 */
function differenceRange(first: unknown[][], second: unknown[][], shift: number): unknown[][] {
  return first.map((row, r) =>
    row.map((a, c) => {
      const b = second[r][c];
      return isNumber(a) && isNumber(b) ? pairedDifferences([a], [b], shift)[0] : null;
    }),
  );
}

/** An invented table of pairs: thicknesses near 50 µm, a change near `drift`, some blanks, text and logical cells, ties. */
function inventedPairs(seed: number, rows: number, columns: number, drift: number): { first: unknown[][]; second: unknown[][] } {
  const next = xorshift32(seed);
  const cell = (v: number): unknown => {
    const u = next();
    return u < 0.05 ? null : u < 0.07 ? "n/a" : u < 0.08 ? true : v;
  };
  const first: unknown[][] = [];
  const second: unknown[][] = [];
  for (let r = 0; r < rows; r++) {
    const a: unknown[] = [];
    const b: unknown[] = [];
    for (let c = 0; c < columns; c++) {
      const before = Math.round((45 + 10 * next()) * 10) / 10;
      // One pair in eight unchanged, to the digit: zero differences for the tie rules.
      const change = next() < 0.125 ? 0 : Math.round((drift + 4 * (next() - 0.5)) * 10) / 10;
      a.push(cell(before));
      b.push(cell(before + change));
    }
    first.push(a);
    second.push(b);
  }
  return { first, second };
}

describe("PAIREDWATCHPVALUE", () => {
  it("eight panels all thicker after: 9/256 two-sided, 9/511 for greater (2^8 · 8! / 9! and 2 · 256/9 · 511/512)", () => {
    const before = col(50.1, 49.6, 51.2, 50.4, 49.9, 50.7, 50.3, 49.8);
    const after = col(51.2, 50.4, 52.1, 50.9, 53.3, 51.7, 50.5, 52.6);
    expect(pairedwatchpvalue(before, after) as number).toBeCloseTo(9 / 256, 14);
    expect(pairedwatchpvalue(before, after, 0, "greater") as number).toBeCloseTo(9 / 511, 14);
    expect(pairedwatchpvalue(before, after, 0, "less")).toBe(1);
    expect(callFunction("PAIREDWATCHPVALUE", [before, after, 0, "greater"])).toBe(pairedwatchpvalue(before, after, 0, "greater"));
  });

  it("equals WATCHPVALUE on the range of differences, for every alternative, tie rule and shift, one column or several", () => {
    for (const [seed, rows, columns] of [
      [1, 40, 1],
      [2, 120, 1],
      [3, 25, 3],
      [4, 300, 2],
    ]) {
      for (const drift of [0, 0.6, -1.1]) {
        const { first, second } = inventedPairs(seed * 10 + drift * 10, rows, columns, drift);
        for (const shift of [0, 0.5, -0.3]) {
          const differences = differenceRange(first, second, shift);
          for (const alternative of ["two-sided", "greater", "less"]) {
            for (const ties of ["drop", "split", "conservative"]) {
              const paired = pairedwatchpvalue(first, second, shift, alternative, ties);
              expect(typeof paired, `${seed} ${drift} ${shift} ${alternative} ${ties}`).toBe("number");
              expect(paired, `${seed} ${drift} ${shift} ${alternative} ${ties}`).toBe(watchpvalue(differences, 0, alternative, ties));
            }
          }
        }
      }
    }
  });

  it("reads the pairs down the rows, then across the columns, as WATCHPVALUE reads one range", () => {
    // Column A: 8 panels thicker after, column B: 8 thinner. Down then across, the evidence peaks after the
    // 8th pair (p = 9/256); across first the changes alternate and the evidence never leaves 1.
    const before = Array.from({ length: 8 }, () => [50, 50]);
    const after = Array.from({ length: 8 }, (_, r) => [51 + r, 49 - r]);
    expect(pairedwatchpvalue(before, after) as number).toBeCloseTo(9 / 256, 14);
    expect(pairedwatchpvalue(col(...before.flat()), col(...after.flat()))).toBe(1);
  });

  it("skips a pair with a blank side instead of reading the blank as 0, and compares differences at 15 digits", () => {
    // Worksheet arithmetic (After − Before) would turn the blank into 0 and count a difference of −51.
    const withBlank = pairedwatchpvalue(col(50, 51, 52, 53), col(52, null, 54, 55));
    expect(withBlank).toBe(pairedwatchpvalue(col(50, 52, 53), col(52, 54, 55)));
    expect(pairedcounts(col(50, 51, 52, 53), col(52, null, 54, 55))).toEqual([[0, 0, 3, 3, 1]]);
    // 2.3 − 1.1 − 1.2 is a tie as the sheet shows it (raw binary arithmetic gives −2.2e-16).
    expectError(pairedwatchpvalue(col(1.1, 1.1), col(2.3, 2.3), 1.2), "#N/A", /Every value equals/);
    expect(pairedwatchpvalue(col(1.1, 1.1, 50), col(2.3, 2.3, 51.2), 1.2, "greater", "split")).toBe(
      watchpvalue(col(0, 0, 0), 0, "greater", "split"),
    );
  });

  it("refuses what the paired functions refuse, with their messages", () => {
    expectError(pairedwatchpvalue(col(1, 2, 3), col(1, 2)), "#VALUE!", /same shape.*3 rows × 1 column.*2 rows × 1 column/);
    expectError(pairedwatchpvalue(col(1), col(2), "none"), "#VALUE!", /shift must be a number/);
    expectError(pairedwatchpvalue(col(1), col(2), 0, "bigger"), "#VALUE!", /"bigger" is not accepted/);
    expectError(pairedwatchpvalue(col(1), col(2), 0, null, "even"), "#VALUE!", /"even" is not accepted/);
    expectError(pairedwatchpvalue(col(null, "a"), col(1, 2)), "#N/A", /No values/);
  });
});

describe("PAIREDWATCHPVALUE under H0: seeded Monte Carlo through the cells (xorshift32), looking after every pair", () => {
  it("rejects in at most alpha of runs, within simulation error, when the changes are symmetric about 0", () => {
    // The p-value after the last pair is the smallest over every earlier look, so one call per run gives
    // whether any look up to n would have rejected.
    const alpha = 0.05;
    const n = 300;
    const runs = 2000;
    const next = xorshift32(20261203);
    let rejects = 0;
    for (let run = 0; run < runs; run++) {
      const before = new Array<unknown[]>(n);
      const after = new Array<unknown[]>(n);
      for (let i = 0; i < n; i++) {
        const b = 45 + Math.round(100 * next()) / 10;
        before[i] = [b];
        after[i] = [b + Math.round(20 * (next() - 0.5)) / 10];
      }
      const p = pairedwatchpvalue(before, after);
      if (typeof p === "number" && p <= alpha) rejects++;
    }
    const rate = rejects / runs;
    const se = Math.sqrt((alpha * (1 - alpha)) / runs);
    console.log(
      `H0, paired, ${runs} runs, looking after every pair to n = ${n}, alpha ${alpha}: PAIREDWATCHPVALUE rejects in ${(100 * rate).toFixed(2)}% of runs (simulation error ${(100 * se).toFixed(2)} points)`,
    );
    expect(rate).toBeLessThanOrEqual(alpha + 3 * se);
  });
});

describe("PAIREDWATCHBOUNDS", () => {
  it("equals WATCHBOUNDS on the range of differences, for the median and another quantile, at two confidences", () => {
    for (const [seed, rows, columns] of [
      [5, 60, 1],
      [6, 400, 1],
      [7, 50, 2],
    ]) {
      const { first, second } = inventedPairs(seed, rows, columns, 0.4);
      const differences = differenceRange(first, second, 0);
      for (const confidence of [0.95, 0.8]) {
        for (const quantile of [0.5, 0.25]) {
          const paired = pairedwatchbounds(first, second, confidence, quantile);
          expect(paired, `${seed} ${confidence} ${quantile}`).toEqual(watchbounds(differences, confidence, quantile));
          expect(typeof paired[0][0], `${seed} ${confidence} ${quantile}`).toBe("number");
        }
      }
    }
  });

  it("one row: lower, upper, pairs used; an end not bounded yet says from which pair it comes", () => {
    // The differences of test/functions/watch.test.ts's ten values (47 to 54 after 10 rows).
    const before = col(50, 50, 50, 50, 50, 50, 50, 50, 50, 50);
    const after = col(49, 53, 50, 52, 48, 51, 47, 54, 46, 55);
    expect(pairedwatchbounds(before, after)).toEqual([[-3, 4, 10]]);
    const [[lower, upper, pairs]] = pairedwatchbounds(col(1, 2, 3), col(2, 2, 5));
    expectError(lower, "#N/A", /No lower bound yet: .* comes with row 8; there are 3 rows/);
    expectError(upper, "#N/A", /No upper bound yet/);
    expect(pairs).toBe(3);
  });

  it("differences too large to hold, different shapes and bad options are refused across the row", () => {
    for (const cell of pairedwatchbounds(col(-1e308, 1), col(1e308, 2))[0]) expectError(cell, "#N/A", /too large to hold/);
    for (const cell of pairedwatchbounds(col(1, 2), col(1))[0]) expectError(cell, "#VALUE!", /same shape/);
    for (const cell of pairedwatchbounds(col(1, 2), col(2, 3), 95)[0]) expectError(cell, "#VALUE!", /For 95% write 0.95/);
    for (const cell of pairedwatchbounds(col(1, 2), col(2, 3), null, 1)[0]) expectError(cell, "#VALUE!", /quantile must lie strictly/);
  });
});

describe("PAIREDSPRT", () => {
  it("equals SPRT on the range of differences: decision, pairs read, log likelihood ratio and limits", () => {
    for (const [seed, drift] of [
      [8, 0],
      [9, 1],
      [10, -1],
      [11, 0.3],
    ]) {
      const { first, second } = inventedPairs(seed, 200, 1, drift);
      for (const shift of [0, 0.5]) {
        for (const pAbove of [0.75, 0.3]) {
          const differences = differenceRange(first, second, shift);
          expect(pairedsprt(first, second, shift, pAbove), `${seed} ${shift} ${pAbove}`).toEqual(sprt(differences, 0, pAbove));
          expect(pairedsprt(first, second, shift, pAbove, 0.01, 0.1)).toEqual(sprt(differences, 0, pAbove, 0.01, 0.1));
        }
      }
    }
  });

  it("counts the pairs read up to the decision; an empty shift means 0; bad options refused across the row", () => {
    // Seven panels thicker after and one unchanged: 1.5^7 ≈ 17.1 >= 16 at the 8th pair read.
    const before = col(50, 50, 50, 50, 50, 50, 50, 50, 50);
    const after = col(51, 52, 50, 53, 54, 55, 56, 57, 40);
    expect(pairedsprt(before, after, null, 0.75)[0].slice(0, 2)).toEqual(["reject", 8]);
    expect(pairedsprt(before, after, 0, 0.75)[0][2] as number).toBeCloseTo(7 * Math.log(1.5), 14);
    for (const cell of pairedsprt(before, after, 0, 0.5)[0]) expectError(cell, "#VALUE!", /p_above must differ from 0.5/);
    for (const cell of pairedsprt(before, after, 0, null)[0]) expectError(cell, "#VALUE!", /p_above is missing/);
    for (const cell of pairedsprt(before, after, 0, 0.75, 0.5, 0.6)[0]) expectError(cell, "#VALUE!", /add up to less than 1/);
    for (const cell of pairedsprt(before, col(1), 0, 0.75)[0]) expectError(cell, "#VALUE!", /same shape/);
  });
});
