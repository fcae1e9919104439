/**
 * The sequential functions: speed through the cell layer, and the larger Monte Carlo runs of issue 10.
 *
 * Speed, each against a bare loop that reads every cell of the same range once, measured in the same run:
 * - WATCHPVALUE on 100,000 rows: at most 20x (two-sided and one-sided);
 * - WATCHBOUNDS on 100,000 rows: at most 20x (median and the 0.9 quantile);
 * - PAIREDWATCHPVALUE and PAIREDWATCHBOUNDS on 100,000 pairs: at most 2x the fixed-sample PAIRED and
 *   PAIREDBOUNDS on the same pairs, which share their reading of the pairs and rounding of the differences
 *   (cells.ts, differences.ts); paired.bench.ts times all four against the bare loop over both ranges.
 * Data: invented coating thicknesses (µm) around a target of 50 from a fixed-seed generator (no real data);
 * a second column drifts upwards, so the one-sided p-value keeps setting new highs of its evidence.
 *
 * Monte Carlo (seeded xorshift32), looking after every row up to n = 500, alpha 0.05: under H0 the rate at
 * which the fixed-sample exact sign test rejects at some row, and the watched p-value does (20,000 runs);
 * the rate at which the confidence sequence covers the true median and 0.9 quantile at every row (20,000
 * runs); the SPRT's achieved error rates against Wald's bounds alpha / (1 − beta) and beta / (1 − alpha).
 */
import {
  paired,
  pairedbounds,
  pairedwatchbounds,
  pairedwatchpvalue,
  sprt as sprtCell,
  watchbounds,
  watchpvalue,
} from "../src/functions/functions";
import { anytimeSignTest } from "../src/stats/anytimeSign";
import { confidenceSequence } from "../src/stats/confidenceSequence";
import { signTest } from "../src/stats/signTest";
import { sprt, sprtCharacteristic, sprtLimits } from "../src/stats/sprt";
import { xorshift32 } from "../src/stats/xorshift";
import { compareCpu } from "./timing";

/** A one-column range of coating thicknesses around 50 µm, rounded to 0.01 as typed; `drift` µm added per 100,000 rows. */
function column(rows: number, seed: number, drift: number): number[][] {
  const next = xorshift32(seed);
  return Array.from({ length: rows }, (_, r) => [Math.round((44 + 12 * next() + (drift * r) / rows) * 100) / 100]);
}

/** The baseline: read every cell once and keep something, so the loop cannot be optimised away. */
function bareLoop(cells: readonly (readonly unknown[])[]): number {
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

/** Times the function and the bare loop in alternating rounds (CPU time) and reports the medians. */
function compare(name: string, cells: number[][], candidate: () => unknown, limit: number): void {
  let sink = 0;
  compareCpu(name, () => (sink += bareLoop(cells)), candidate, limit);
  if (Number.isNaN(sink)) throw new Error("the bare loop read a NaN");
}

export function speed(): void {
  const steady = column(100_000, 21, 0);
  const drifting = column(100_000, 22, 3);
  console.log(
    `answers: WATCHPVALUE ${String(watchpvalue(steady, 50))}, one-sided on the drifting column ${String(watchpvalue(drifting, 50, "greater"))}`,
  );
  console.log(
    `         WATCHBOUNDS ${JSON.stringify(watchbounds(steady))}, 0.9 quantile ${JSON.stringify(watchbounds(steady, 0.95, 0.9))}`,
  );
  console.log(`         SPRT (p_above 0.55) on the drifting column ${JSON.stringify(sprtCell(drifting, 50, 0.55))}`);
  compare("WATCHPVALUE two-sided, 100,000 rows", steady, () => watchpvalue(steady, 50), 20);
  compare("WATCHPVALUE greater, 100,000 drifting rows", drifting, () => watchpvalue(drifting, 50, "greater"), 20);
  compare("WATCHBOUNDS median 95%, 100,000 rows", steady, () => watchbounds(steady, 0.95), 20);
  compare("WATCHBOUNDS 0.9 quantile 95%, 100,000 rows", steady, () => watchbounds(steady, 0.95, 0.9), 20);
  // Pairs: the same panels measured again after a change of about -0.5 µm, give or take 0.6 µm.
  const after = column(100_000, 23, 0).map(([x], r) => [Math.round((steady[r][0] - 0.5 + (x - 50) / 10) * 100) / 100]);
  console.log(
    `         PAIREDWATCHPVALUE ${String(pairedwatchpvalue(steady, after))}, PAIREDWATCHBOUNDS ${JSON.stringify(pairedwatchbounds(steady, after))}`,
  );
  compareCpu(
    "PAIREDWATCHPVALUE over PAIRED, 100,000 pairs",
    () => paired(steady, after),
    () => pairedwatchpvalue(steady, after),
    2,
  );
  compareCpu(
    "PAIREDWATCHBOUNDS over PAIREDBOUNDS, 100,000 pairs",
    () => pairedbounds(steady, after, 0.95),
    () => pairedwatchbounds(steady, after, 0.95),
    2,
  );
}

function monteCarlo(): void {
  const alpha = 0.05;
  const n = 500;
  const runs = 20_000;
  const se = Math.sqrt((alpha * (1 - alpha)) / runs);
  // Smallest larger-side count with a fixed-sample two-sided exact p-value <= alpha, for each row count t.
  const critical = new Int32Array(n + 1);
  for (let t = 1; t <= n; t++) {
    let c = t + 1;
    for (let k = t; k >= Math.ceil(t / 2); k--) {
      const r = signTest({ below: t - k, tied: 0, above: k });
      if (r.available && r.pValue <= alpha) c = k;
      else break;
    }
    critical[t] = c;
  }
  const next = xorshift32(2026);
  const values = new Float64Array(n);
  let fixed = 0;
  let watched = 0;
  let coveredMedian = 0;
  let covered90 = 0;
  for (let k = 0; k < runs; k++) {
    let above = 0;
    let early = false;
    for (let t = 1; t <= n; t++) {
      const u = next();
      values[t - 1] = u; // Uniform(0, 1): median 0.5, 0.9 quantile 0.9
      if (u > 0.5) above++;
      if (Math.max(above, t - above) >= critical[t]) early = true;
    }
    if (early) fixed++;
    const p = anytimeSignTest(values, 0.5);
    if (p.available && p.pValue <= alpha) watched++;
    const m = confidenceSequence(values);
    if (m.available && (m.lower ?? -Infinity) <= 0.5 && 0.5 <= (m.upper ?? Infinity)) coveredMedian++;
    const q = confidenceSequence(values, { quantile: 0.9 });
    if (q.available && (q.lower ?? -Infinity) <= 0.9 && 0.9 <= (q.upper ?? Infinity)) covered90++;
  }
  const pct = (x: number) => `${((100 * x) / runs).toFixed(2)}%`;
  console.log(
    `\nMonte Carlo, ${runs} runs under H0, looking after every row to n = ${n}, alpha ${alpha} (simulation error ${(100 * se).toFixed(2)} points):`,
  );
  console.log(`  fixed-sample exact sign test rejects at some row: ${pct(fixed)}`);
  console.log(
    `  watched p-value (WATCHPVALUE) rejects:            ${pct(watched)}  (at most alpha + 3 SE: ${watched / runs <= alpha + 3 * se ? "ok" : "OVER"})`,
  );
  console.log(
    `  confidence sequence covers the median at every row:       ${pct(coveredMedian)}  (at least 1 − alpha − 3 SE: ${coveredMedian / runs >= 1 - alpha - 3 * se ? "ok" : "UNDER"})`,
  );
  console.log(
    `  confidence sequence covers the 0.9 quantile at every row: ${pct(covered90)}  (${covered90 / runs >= 1 - alpha - 3 * se ? "ok" : "UNDER"})`,
  );

  for (const [pAbove, a, b] of [
    [0.75, 0.05, 0.2],
    [0.6, 0.05, 0.1],
  ]) {
    const limits = sprtLimits(pAbove, a, b);
    const rate = (p: number, decision: string) => {
      let hits = 0;
      const signs = new Float64Array(2000);
      for (let k = 0; k < runs; k++) {
        for (let i = 0; i < signs.length; i++) signs[i] = next() < p ? 1 : -1;
        if (sprt(signs, 0, { pAbove, alpha: a, beta: b }).decision === decision) hits++;
      }
      return hits / runs;
    };
    const achievedAlpha = rate(0.5, "reject");
    const achievedBeta = rate(pAbove, "accept");
    const exactAlpha = sprtCharacteristic(0.5, limits);
    const exactBeta = sprtCharacteristic(pAbove, limits);
    console.log(
      `  SPRT p_above ${pAbove}, alpha ${a}, beta ${b}: achieved alpha ${achievedAlpha.toFixed(4)} (${exactAlpha.method} ${exactAlpha.reject.toFixed(4)}; Wald's bound ${(a / (1 - b)).toFixed(4)}), beta ${achievedBeta.toFixed(4)} (${exactBeta.method} ${exactBeta.accept.toFixed(4)}; bound ${(b / (1 - a)).toFixed(4)}); average rows ${exactAlpha.averageRows.toFixed(1)} under H0, ${exactBeta.averageRows.toFixed(1)} at p_above`,
    );
  }
}

export async function run(): Promise<void> {
  speed();
  monteCarlo();
}
