/**
 * Signed-rank speed against a bare loop reading every cell of a 1,000,000-cell column, measured in the
 * same run, and the measurements behind EXACT_AUTO_LIMIT and EXACT_LIMIT in src/stats/signedRank.ts:
 *
 * - normal method on 10^6 differences: target <= 30x the bare loop;
 * - the exact method at both limits in its slowest configuration (tie pairs make every score odd, so the
 *   score total doubles, and a p-value near 1 needs half the distribution);
 * - how far the continuity-corrected normal p-value is from the exact one at several sizes;
 * - (issue 8, item 7) the exact p-value at n = 200..1,000 without ties against the plain recursion R 4.2's
 *   psignrank uses (the whole lower half of the table, f_k(w) += f_(k-1)(w - k) for k = 2..n), written
 *   here in the same engine and timed in the same run: limit 1x. R itself runs that recursion in C, about
 *   twice as fast as this engine runs it; `npx tsx bench/signedRankVsR.ts` prints R's own times beside ours
 *   when R is installed;
 * - the same tails with the subset-sum step in WebAssembly (what the add-in runs) against the step in
 *   JavaScript (what it falls back to where WebAssembly is refused), same run: limit 0.5x.
 *
 * Data: invented, from a fixed-seed generator.
 */
import { differencesFrom } from "../src/stats/differences";
import { normalLowerTail } from "../src/stats/normal";
import { EXACT_AUTO_LIMIT, EXACT_LIMIT, signedRankLowerTail, signedRankNullCdf, signedRankTest } from "../src/stats/signedRank";
import { javascriptEngine, webAssemblyEngine } from "../src/stats/subsetSumStep";
import { alternate, bareLoop, columnOf } from "./cells.bench";
import { fastestAlternating, report, timeMedian } from "./timing";
import { xorshift32 as uniforms } from "../src/stats/xorshift";

const N = 1_000_000;

/** Signs alternating in pairs of tied absolute values 1,1,2,2,...: scores 2r + 3 are all odd, V near its mean. */
function slowestExact(m: number): Float64Array {
  const d = new Float64Array(m);
  for (let i = 0; i < m; i++) d[i] = (i % 2 === 0 ? 1 : -1) * (1 + (i >> 1));
  return d;
}

/**
 * R's method for an untied sample (src/library/stats/src/signrank.c, csignrank, read from memory): the
 * count table up to c = floor(n(n+1)/4), the lower tail summed from it, two-sided doubled. Only a baseline.
 */
function plainRecursionPValue(n: number, v: number): number {
  const c = Math.floor((n * (n + 1)) / 4);
  const w = new Float64Array(c + 1);
  w[0] = 1;
  for (let k = 1; k <= n; k++) {
    const end = Math.min((k * (k + 1)) / 2, c);
    for (let i = end; i >= k; i--) w[i] += w[i - k];
  }
  const q = Math.min(v, (n * (n + 1)) / 2 - v);
  let sum = 0;
  for (let i = 0; i <= Math.min(q, c); i++) sum += w[i];
  return Math.min(1, 2 * sum * 2 ** -n);
}

/** Untied differences with random signs, invented from a fixed seed. */
function untied(n: number, seed: number): Float64Array {
  const next = uniforms(seed);
  return Float64Array.from({ length: n }, (_, i) => (next() < 0.5 ? -1 : 1) * (i + 1 + next() * 0.5));
}

export async function run(): Promise<void> {
  const next = uniforms(2024);
  const values = Float64Array.from({ length: N }, () => Math.round((40 + 20 * next()) * 1000) / 1000);
  const column = columnOf(values);
  let sink = 0;
  const bare = () => (sink += bareLoop(column));
  const differences = differencesFrom(values, 50);

  const normal = alternate(
    bare,
    () => {
      const r = signedRankTest(differences, { method: "normal" });
      if (r.available) sink += r.pValue;
    },
    5,
    4,
  );
  report("signedRankTest normal, 10^6 differences", normal.ms, normal.baseMs, 30);
  const withDifferences = alternate(
    bare,
    () => {
      const r = signedRankTest(differencesFrom(values, 50), { method: "normal" });
      if (r.available) sink += r.pValue;
    },
    5,
    4,
  );
  report("differencesFrom + signedRankTest normal, 10^6 values", withDifferences.ms, withDifferences.baseMs);

  const baseMs = timeMedian(bare, 7);
  const limitNames = (m: number): string =>
    [m === EXACT_AUTO_LIMIT ? "EXACT_AUTO_LIMIT" : "", m === EXACT_LIMIT ? "EXACT_LIMIT" : ""].filter(Boolean).join(" = ");
  for (const m of new Set([EXACT_AUTO_LIMIT, EXACT_LIMIT])) {
    const label = limitNames(m);
    const d = slowestExact(m);
    const ms = timeMedian(() => {
      const r = signedRankTest(d, { method: "exact" });
      if (r.available) sink += r.pValue;
    }, 3);
    report(`exact, slowest case at ${label} = ${m} (${ms.toFixed(0)} ms)`, ms, baseMs);
  }

  for (const n of [200, 400, 600, 800, 1000]) {
    const d = untied(n, n);
    const probe = signedRankTest(d, { method: "exact" });
    const v = probe.available ? probe.statistic : 0;
    const timed = fastestAlternating(
      () => (sink += plainRecursionPValue(n, v)),
      () => {
        const r = signedRankTest(d, { method: "exact" });
        if (r.available) sink += r.pValue;
      },
      3,
      2,
      2,
    );
    report(`exact, no ties, n = ${n}, against the plain recursion`, timed.ms, timed.baseMs, 1);
  }

  const webAssembly = webAssemblyEngine();
  const javascript = javascriptEngine();
  if (!webAssembly) console.log("WebAssembly step: not available in this engine");
  for (const n of webAssembly ? [200, 400, 600, 800, 1000] : []) {
    const ranks = Array.from({ length: n }, (_, i) => i + 1);
    const middle = Math.floor((n * (n + 1)) / 4) - 1;
    const timed = fastestAlternating(
      () => (sink += signedRankLowerTail(ranks, middle, javascript)),
      () => (sink += signedRankLowerTail(ranks, middle, webAssembly)),
      9,
      5,
      10,
    );
    report(`exact tail at the middle, n = ${n}, WebAssembly step against the JavaScript step`, timed.ms, timed.baseMs, 0.5);
  }

  // Relative error of the normal approximation in the lower tail, untied ranks, at exact p near each level.
  console.log("normal vs exact p-value, relative error at exact p =  0.05 / 0.01 / 0.001 / 1e-4 / 1e-6:");
  for (const n of new Set([50, 100, 200, 400, EXACT_AUTO_LIMIT, EXACT_LIMIT])) {
    const total = (n * (n + 1)) / 2;
    const sd = Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24);
    const cdf = signedRankNullCdf(
      Array.from({ length: n }, (_, i) => i + 1),
      Math.floor(total / 2),
    );
    const errors = [0.05, 0.01, 1e-3, 1e-4, 1e-6].map((level) => {
      let q = 0;
      while (cdf[q + 1] <= level) q++;
      return `${((100 * (normalLowerTail((q + 0.5 - total / 2) / sd) - cdf[q])) / cdf[q]).toFixed(2)}%`;
    });
    console.log(`  n = ${String(n).padStart(4)}: ${errors.join(" / ")}`);
  }
  if (sink === -1) console.log("unreachable");
}
