/**
 * The paired functions through the whole cell layer, against a bare loop that reads both ranges once, pair by
 * pair, measured in the same run (CPU time of batches of calls, alternating rounds, as watch.bench.ts times the
 * watching functions for issue 10). On 100,000 pairs:
 * - PAIRED and PAIREDBOUNDS: at most 10x (the pairing of the cells and the rounding of the differences to the
 *   15 digits the sheet shows, cells.ts and differences.ts, then a count or a selection);
 * - PAIREDWATCHPVALUE and PAIREDWATCHBOUNDS: at most 20x (the limit of the watching functions, issue 10).
 * The pairing and the rounding alone are printed too, without a limit, to show where the time goes.
 * Data: invented coating thicknesses (µm) of the same panels before and after a nozzle change (about
 * -0.5 µm, give or take 0.6 µm), rounded to 0.01 as typed, from a fixed-seed generator (no real data). The
 * ranges are made here and the modules loaded here: arrays made in another realm read slower.
 */
import { paired, pairedbounds, pairedwatchbounds, pairedwatchpvalue } from "../src/functions/functions";
import { pairedDifferencesFromCells } from "../src/stats/cells";
import { pairedDifferences } from "../src/stats/differences";
import { xorshift32 } from "../src/stats/xorshift";
import { compareCpu } from "./timing";

const PAIRS = 100_000;

/** One-column ranges of thicknesses before and after, one array per row as the host hands them over. */
function pairsOfColumns(): { before: number[][]; after: number[][] } {
  const next = xorshift32(31);
  const before: number[][] = new Array(PAIRS);
  const after: number[][] = new Array(PAIRS);
  for (let r = 0; r < PAIRS; r++) {
    const x = Math.round((44 + 12 * next()) * 100) / 100;
    before[r] = [x];
    after[r] = [Math.round((x - 0.5 + 1.2 * (next() - 0.5)) * 100) / 100];
  }
  return { before, after };
}

/** The baseline: read both cells of every pair once and keep something, so the loop cannot be dropped. */
function bareLoopOverBoth(first: readonly (readonly unknown[])[], second: readonly (readonly unknown[])[]): number {
  let sum = 0;
  for (let r = 0; r < first.length; r++) {
    const rowA = first[r];
    const rowB = second[r];
    for (let c = 0; c < rowA.length; c++) {
      const x = rowA[c];
      const y = rowB[c];
      if (typeof x === "number") sum += x;
      if (typeof y === "number") sum += y;
    }
  }
  return sum;
}

export async function run(): Promise<void> {
  const { before, after } = pairsOfColumns();
  let sink = 0;
  const bare = () => (sink += bareLoopOverBoth(before, after));
  console.log(`answers: PAIRED ${String(paired(before, after))}, PAIREDBOUNDS ${JSON.stringify(pairedbounds(before, after, 0.95))}`);
  console.log(
    `         PAIREDWATCHPVALUE ${String(pairedwatchpvalue(before, after))}, PAIREDWATCHBOUNDS ${JSON.stringify(pairedwatchbounds(before, after, 0.95))}`,
  );
  compareCpu("PAIRED, 100,000 pairs", bare, () => paired(before, after), 10);
  compareCpu("PAIREDBOUNDS 95%, 100,000 pairs", bare, () => pairedbounds(before, after, 0.95), 10);
  compareCpu("PAIREDWATCHPVALUE, 100,000 pairs", bare, () => pairedwatchpvalue(before, after), 20);
  compareCpu("PAIREDWATCHBOUNDS 95%, 100,000 pairs", bare, () => pairedwatchbounds(before, after, 0.95), 20);
  const read = pairedDifferencesFromCells(before, after, 0);
  compareCpu("  of which: pairing and rounding (pairedDifferencesFromCells)", bare, () => pairedDifferencesFromCells(before, after, 0));
  const first = Float64Array.from(before, (row) => row[0]);
  const second = Float64Array.from(after, (row) => row[0]);
  compareCpu("  of which: rounding alone (pairedDifferences)", bare, () => pairedDifferences(first, second, 0));
  if (Number.isNaN(sink) || read.differences.length !== PAIRS) throw new Error("the pairs were not all read");
}
