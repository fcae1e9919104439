/**
 * The exact signed-rank p-value beside R's, on the same data, when R is installed (`npx tsx bench/signedRankVsR.ts`).
 * Not part of `npm run bench` and never needed by tests or CI: it prints nothing but a note when Rscript is missing.
 *
 * For each n from 200 to 1,000 (no ties, no zeros), a few data sets are drawn from a fixed-seed generator
 * (invented differences, symmetric about 0, so the p-values spread over (0, 1)), plus the case that costs us
 * most (V at its mean, p = 1). R 4.2's wilcox.test(x, exact = TRUE) is timed in an Rscript process per data
 * set (system.time, which counts in milliseconds: R's smallest times are coarse), ours right after it in this
 * process, on the data this process made (arrays made in another realm read slower, so none are passed in).
 * Both are the median of several runs; the p-values are compared as well.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { signedRankTest } from "../src/stats/signedRank";
import { xorshift32 as uniforms } from "../src/stats/xorshift";
import { timeMedian } from "./timing";

const SIZES = [200, 300, 400, 500, 600, 700, 800, 900, 1000];
const SETS = 3;
const REPEATS = 5;

/** Differences with distinct absolute values (ranks without ties) and random signs. */
function dataSet(n: number, seed: number): number[] {
  const next = uniforms(seed);
  return Array.from({ length: n }, (_, i) => (next() < 0.5 ? -1 : 1) * (i + 1 + next() * 0.5));
}

/** V at its mean: the positive ranks are a subset summing to n(n+1)/4 (greedy from the top), so p = 1. */
function atTheMean(n: number): number[] {
  let rest = Math.floor((n * (n + 1)) / 4);
  return Array.from({ length: n }, (_, i) => n - i).map((r) => (r <= rest ? ((rest -= r), r) : -r));
}

function main(): void {
  const probe = spawnSync("Rscript", ["--version"], { encoding: "utf8" });
  if (probe.error || probe.status !== 0) {
    console.log("Rscript not found: install r-base-core (Debian) to compare with R; nothing else needs it.");
    return;
  }
  const cases: { n: number; label: string; x: number[] }[] = [];
  for (const n of SIZES) {
    for (let s = 0; s < SETS; s++) cases.push({ n, label: `random ${s + 1}`, x: dataSet(n, 1000 * n + s) });
    cases.push({ n, label: "V at mean", x: atTheMean(n) });
  }
  const dir = mkdtempSync(join(tmpdir(), "evensplit-r-"));
  const dataFile = join(dir, "case.csv");
  const script = `
x <- as.numeric(strsplit(readLines(${JSON.stringify(dataFile)}), ",")[[1]])
p <- wilcox.test(x, exact = TRUE)$p.value
times <- sapply(1:${REPEATS}, function(i) system.time(wilcox.test(x, exact = TRUE))[["elapsed"]])
cat(sprintf("%.17g %.6f\\n", p, median(times) * 1000))`;
  console.log("n     data        R wilcox.test ms   Evensplit ms   ratio   p (R)                 relative difference in p");
  for (const c of cases) {
    // One Rscript per case, ours right after it: both meet the same load on a shared machine.
    writeFileSync(dataFile, c.x.join(",") + "\n");
    const r = spawnSync("Rscript", ["-e", script], { encoding: "utf8" });
    if (r.status !== 0) throw new Error(`Rscript failed: ${r.stderr}`);
    const [pR, msR] = r.stdout.trim().split(" ").map(Number);
    const data = Float64Array.from(c.x);
    let p = NaN;
    const ms = timeMedian(() => {
      const result = signedRankTest(data, { method: "exact" });
      if (result.available) p = result.pValue;
    }, REPEATS);
    console.log(
      `${String(c.n).padEnd(5)} ${c.label.padEnd(11)} ${msR.toFixed(1).padStart(16)} ${ms.toFixed(1).padStart(14)} ${(ms / msR).toFixed(2).padStart(7)}   ${pR.toPrecision(15).padEnd(21)} ${(Math.abs(p - pR) / pR).toExponential(1)}`,
    );
  }
}

main();
