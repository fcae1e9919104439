/**
 * The exact signed-rank p-value beside R's, on the same data, when R is installed (`npx tsx bench/signedRankVsR.ts`).
 * Not part of `npm run bench` and never needed by tests or CI: it prints nothing but a note when Rscript is missing.
 *
 * For each n from 200 to 1,000 (no ties, no zeros), a few data sets are drawn from a fixed-seed generator
 * (invented differences, symmetric about 0, so the p-values spread over (0, 1)), plus the case that costs us
 * most (V at its mean, p = 1). R 4.2's wilcox.test(x, exact = TRUE) is timed in an Rscript process per data
 * set: system.time counts in milliseconds, so calls are repeated in batches of at least 0.2 s and the
 * fastest of three batches, divided by the calls, is R's time per call. Ours is timed right after it in this
 * process, on the data this process made (arrays made in another realm read slower, so none are passed in),
 * the same way: batches of at least 0.2 s, the fastest of three, divided by the calls. Every call works from
 * the data (nothing is remembered between calls but scratch memory), as a recalculation would. Fastest, not
 * median, on both sides: on a shared machine other work only ever adds time (bench/timing.ts). The p-values
 * are compared as well.
 *
 * Then, ours alone, the exact test with ties and Pratt's zeros at the same sizes (differences rounded to
 * whole numbers, so many share a rank and some are zero): R's wilcox.test has no exact method with ties or
 * zeros, so only our time is printed, beside R's untied time at that size for scale.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { signedRankTest } from "../src/stats/signedRank";
import { xorshift32 as uniforms } from "../src/stats/xorshift";
/** Time per call in milliseconds as R's side measures it: batches of at least 0.2 s, fastest of three. */
function perCall(fn: () => unknown): number {
  const batch = (reps: number): number => {
    const start = performance.now();
    for (let i = 0; i < reps; i++) fn();
    return performance.now() - start;
  };
  let reps = 1;
  while (batch(reps) < 200) reps *= 4;
  return Math.min(batch(reps), batch(reps), batch(reps)) / reps;
}

const SIZES = [200, 300, 400, 500, 600, 700, 800, 900, 1000];
const SETS = 3;

/** Differences with distinct absolute values (ranks without ties) and random signs. */
function dataSet(n: number, seed: number): number[] {
  const next = uniforms(seed);
  return Array.from({ length: n }, (_, i) => (next() < 0.5 ? -1 : 1) * (i + 1 + next() * 0.5));
}

/** Differences rounded to whole numbers: many tied ranks and some zeros, symmetric about 0. */
function tiedWithZeros(n: number, seed: number): number[] {
  const next = uniforms(seed);
  return Array.from({ length: n }, () => Math.round((next() - 0.5) * (n / 8)));
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
batch <- function(reps) system.time(for (i in seq_len(reps)) wilcox.test(x, exact = TRUE))[["elapsed"]]
reps <- 1L
while (batch(reps) < 0.2) reps <- reps * 4L
times <- sapply(1:3, function(i) batch(reps) / reps)
cat(sprintf("%.17g %.6f\\n", p, min(times) * 1000))`;
  console.log("n     data        R wilcox.test ms   Evensplit ms   ratio   p (R)                 relative difference in p");
  const untiedR = new Map<number, number>();
  for (const c of cases) {
    // One Rscript per case, ours right after it: both meet the same load on a shared machine.
    writeFileSync(dataFile, c.x.join(",") + "\n");
    const r = spawnSync("Rscript", ["-e", script], { encoding: "utf8" });
    if (r.status !== 0) throw new Error(`Rscript failed: ${r.stderr}`);
    const [pR, msR] = r.stdout.trim().split(" ").map(Number);
    const data = Float64Array.from(c.x);
    let p = NaN;
    const ms = perCall(() => {
      const result = signedRankTest(data, { method: "exact" });
      if (result.available) p = result.pValue;
    });
    untiedR.set(c.n, Math.max(untiedR.get(c.n) ?? 0, msR));
    console.log(
      `${String(c.n).padEnd(5)} ${c.label.padEnd(11)} ${msR.toFixed(2).padStart(16)} ${ms.toFixed(2).padStart(14)} ${(ms / msR).toFixed(2).padStart(7)}   ${pR.toPrecision(15).padEnd(21)} ${(Math.abs(p - pR) / pR).toExponential(1)}`,
    );
  }
  console.log("\nTies and Pratt zeros, exact (ours only; R's slowest untied time at that n for scale)");
  console.log("n     ranked  R untied ms   Evensplit ms   ratio");
  for (const n of SIZES) {
    const data = Float64Array.from(tiedWithZeros(n, 7000 + n));
    let ranked = 0;
    const ms = perCall(() => {
      const result = signedRankTest(data, { method: "exact", zeros: "pratt" });
      if (result.available && result.method === "exact") ranked = result.n;
    });
    const msR = untiedR.get(n) ?? NaN;
    console.log(
      `${String(n).padEnd(5)} ${String(ranked).padStart(6)} ${msR.toFixed(2).padStart(12)} ${ms.toFixed(2).padStart(14)} ${(ms / msR).toFixed(2).padStart(7)}`,
    );
  }
}

main();
