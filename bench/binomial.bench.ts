/**
 * Binomial upper tail P(X >= k) against jStat.ibeta(p, k, n - k + 1) (the same quantity, I_p(k, n-k+1)) at
 * n = 1e4, 1e6, 1e8, p = 1/2, for counts 0.3, 1, 3, 8 and 20 standard deviations above the mean: the time of
 * ours relative to jstat's, measured in the same run, and both relative errors against exact 256-bit
 * fixed-point arithmetic (test/stats/binomialReference.ts). Target: ratio <= 1 with errors near 1e-13 or below.
 */
import { createRequire } from "node:module";
import { binomialUpperTail } from "../src/stats/binomial";
import { fixedPointLogs } from "../test/stats/binomialReference";
import { fastestAlternating, report } from "./timing";

interface JStat {
  ibeta(x: number, a: number, b: number): number;
}
const jStat = createRequire(import.meta.url)("jstat") as JStat;

const P = 0.5;
const DEVIATIONS = [0.3, 1, 3, 8, 20];
const CALLS = 200;

function relativeError(value: number, truth: number): number {
  return Math.abs(value - truth) / truth;
}

export async function run(): Promise<void> {
  for (const n of [1e4, 1e6, 1e8]) {
    const sd = Math.sqrt(n * P * (1 - P));
    const counts = DEVIATIONS.map((z) => Math.round(n * P + z * sd));
    // P(X >= k) = P(X > k - 1): the reference's "above" at k - 1.
    const truth = counts.map((k) => Math.exp(fixedPointLogs(k - 1, n, P).logAbove));
    let sink = 0;
    const ours = () => {
      for (let i = 0; i < CALLS; i++) for (const k of counts) sink += binomialUpperTail(k, n, P);
    };
    const theirs = () => {
      for (let i = 0; i < CALLS; i++) for (const k of counts) sink += jStat.ibeta(P, k, n - k + 1);
    };
    // Fastest of alternating runs after the same warm-up (bench/timing.ts): each run is only about 0.3 ms at
    // n = 1e4, where a ratio of medians swung between 0.9x and 1.6x from run to run on a shared machine.
    const { baseMs: theirsMs, ms: oursMs } = fastestAlternating(theirs, ours, 15, 5);
    report(`binomialUpperTail vs jStat.ibeta, n = ${n.toExponential(0)}, ${CALLS * counts.length} calls`, oursMs, theirsMs, 1);
    counts.forEach((k, i) => {
      const mine = binomialUpperTail(k, n, P);
      const jstat = jStat.ibeta(P, k, n - k + 1);
      console.log(
        `  k = mean + ${String(DEVIATIONS[i]).padEnd(3)} sd  exact ${truth[i].toExponential(6).padEnd(13)}` +
          `  ours rel. error ${relativeError(mine, truth[i]).toExponential(1).padStart(8)}` +
          `  jstat rel. error ${relativeError(jstat, truth[i]).toExponential(1).padStart(8)}`,
      );
    });
    if (sink === -1) console.log(sink); // keeps the loops from being optimised away
  }
}
