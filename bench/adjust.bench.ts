/**
 * ADJUST against PVALUE on the same range, measured in the same run: a whole column of 1,048,576 p-values,
 * adjusted by each of the five methods, at most 10x the PVALUE cell on that column. Also the core
 * (adjustPValues) alone against a bare pass over a Float64Array of the same p-values.
 *
 * Times are the fastest of several alternating runs (bench/timing.ts, fastestAlternating).
 * Data: invented p-values, uniform on (0, 1) from a fixed-seed generator, every 50th tied at 0.05.
 */
import { adjust, pvalue } from "../src/functions/functions";
import { adjustPValues } from "../src/stats/adjust";
import type { AdjustMethod } from "../src/stats/types";
import { xorshift32 as uniforms } from "../src/stats/xorshift";
import { columnOf } from "./cells.bench";
import { barePass } from "./signTest.bench";
import { fastestAlternating, report } from "./timing";

const ROWS = 1_048_576;

export async function run(): Promise<void> {
  const next = uniforms(31);
  const values = new Float64Array(ROWS);
  for (let i = 0; i < ROWS; i++) values[i] = i % 50 === 0 ? 0.05 : next();
  const column = columnOf(values);
  let sink = 0;
  for (const method of ["holm", "bonferroni", "hochberg", "bh", "by"] as AdjustMethod[]) {
    const cell = fastestAlternating(
      () => (sink += pvalue(column, 0.5) as number),
      () => (sink += adjust(column, method)[0][0] as number),
      3,
      3,
      3,
    );
    report(`ADJUST "${method}" against PVALUE, 1,048,576 cells`, cell.ms, cell.baseMs, 10);
  }
  const core = fastestAlternating(
    () => (sink += barePass(values)),
    () => (sink += adjustPValues(values, "holm")[0]),
    3,
    3,
    3,
  );
  report("adjustPValues holm, 1,048,576 values, against a bare pass", core.ms, core.baseMs);
  if (Number.isNaN(sink)) console.log("unreachable");
}
