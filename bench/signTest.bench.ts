/**
 * The sign test against a bare pass, measured in the same run (issue 8, item 7):
 *
 * - the core (countSigns, then signTest) on 10^6 and 10^7 values in a Float64Array: at most 1.2x a bare pass
 *   that adds up the same array;
 * - the PVALUE cell on 10^6 and 4 × 10^6 rows of one number each, as the host hands a column over: at most 2x
 *   a bare pass that reads every cell of the rows once (counting happens inside the one pass over the cells).
 *
 * Times are the fastest of several alternating runs (bench/timing.ts, fastestAlternating).
 *
 * Data: invented coating thicknesses around 50 µm, two decimals, from a fixed-seed generator.
 */
import { pvalue } from "../src/functions/functions";
import { countSigns } from "../src/stats/signCounts";
import { signTest } from "../src/stats/signTest";
import { xorshift32 as uniforms } from "../src/stats/xorshift";
import { columnOf } from "./cells.bench";
import { fastestAlternating, report } from "./timing";

function thicknesses(n: number, seed: number): Float64Array {
  const next = uniforms(seed);
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = Math.round((44 + 12 * next()) * 100) / 100;
  return values;
}

/** The baseline over an array: one read and one addition per value, kept so it cannot be dropped. */
export function barePass(values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  return sum;
}

/** The baseline over rows: read every cell once, add the numbers. */
export function bareRowPass(cells: readonly (readonly unknown[])[]): number {
  let sum = 0;
  for (let r = 0; r < cells.length; r++) {
    const row = cells[r];
    for (let c = 0; c < row.length; c++) {
      const v = row[c];
      if (typeof v === "number") sum += v;
    }
  }
  return sum;
}

export async function run(): Promise<void> {
  let sink = 0;
  for (const n of [1_000_000, 10_000_000]) {
    const values = thicknesses(n, 21);
    const core = fastestAlternating(
      () => (sink += barePass(values)),
      () => {
        const r = signTest(countSigns(values, 50), { alternative: "greater" });
        sink += r.available ? r.pValue : 0;
      },
    );
    report(`sign-test core (countSigns + signTest), ${n.toLocaleString("en")} values`, core.ms, core.baseMs, 1.2);
  }
  for (const n of [1_000_000, 4_000_000]) {
    const rows = columnOf(thicknesses(n, 22));
    const cell = fastestAlternating(
      () => (sink += bareRowPass(rows)),
      () => (sink += pvalue(rows, 50, "greater") as number),
      7,
      3,
      5,
    );
    report(`PVALUE cell, ${n.toLocaleString("en")} rows`, cell.ms, cell.baseMs, 2);
  }
  if (Number.isNaN(sink)) console.log("unreachable");
}
