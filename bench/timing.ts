/**
 * Timing helpers for the benchmarks. Machines here are noisy, so every figure
 * is the median of several repeats and is reported as a ratio against a
 * baseline measured in the same run.
 */

/** Median wall time in milliseconds of `repeats` calls of `fn`, after one warm-up call. */
export function timeMedian(fn: () => unknown, repeats = 7): number {
  fn();
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    fn();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

/** One benchmark line: name, time, baseline, ratio and the limit the ratio should stay under. */
export function report(name: string, ms: number, baselineMs: number, limit?: number): void {
  const ratio = ms / baselineMs;
  const verdict = limit === undefined ? "" : ratio <= limit ? `  (limit ${limit}x: ok)` : `  (limit ${limit}x: OVER)`;
  console.log(
    `${name.padEnd(58)} ${ms.toFixed(3).padStart(10)} ms  baseline ${baselineMs.toFixed(3).padStart(9)} ms  ratio ${ratio.toFixed(2).padStart(7)}x${verdict}`,
  );
}

/**
 * Fastest of `rounds` × `repeats` runs of each, alternating baseline and candidate so that both meet the
 * same JIT state. On a shared machine other processes only ever add time, so the fastest run is the one
 * closest to what the code itself costs (common practice for micro-benchmarks); the ratio of two fastest
 * runs stays steady under load where a ratio of medians swings widely.
 */
export function fastestAlternating(
  base: () => unknown,
  candidate: () => unknown,
  rounds = 9,
  repeats = 5,
  warmups = 20,
): { baseMs: number; ms: number } {
  for (let i = 0; i < warmups; i++) {
    base();
    candidate();
  }
  let baseMs = Infinity;
  let ms = Infinity;
  for (let r = 0; r < rounds; r++) {
    for (let i = 0; i < repeats; i++) {
      let start = performance.now();
      base();
      baseMs = Math.min(baseMs, performance.now() - start);
      start = performance.now();
      candidate();
      ms = Math.min(ms, performance.now() - start);
    }
  }
  return { baseMs, ms };
}

/**
 * CPU time in milliseconds per call (user + system, process.cpuUsage), median of `rounds` batches of calls
 * lasting at least 20 ms each. CPU time, unlike wall time, does not count the time other processes hold the
 * core, which on a shared machine otherwise inflates long calls more than the short baseline.
 */
export function cpuPerCall(fn: () => unknown, rounds: number): number {
  const t0 = process.cpuUsage();
  fn();
  const once = Math.max(1e-3, (process.cpuUsage(t0).user + process.cpuUsage(t0).system) / 1000);
  const calls = Math.max(1, Math.ceil(20 / once));
  const times: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const start = process.cpuUsage();
    for (let k = 0; k < calls; k++) fn();
    const used = process.cpuUsage(start);
    times.push((used.user + used.system) / 1000 / calls);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

/** Times a candidate and a baseline in alternating rounds (CPU time, `cpuPerCall`) and reports the medians. */
export function compareCpu(name: string, baseline: () => unknown, candidate: () => unknown, limit?: number): void {
  for (let i = 0; i < 5; i++) {
    baseline();
    candidate();
  }
  const base: number[] = [];
  const timed: number[] = [];
  for (let round = 0; round < 5; round++) {
    base.push(cpuPerCall(baseline, 5));
    timed.push(cpuPerCall(candidate, 5));
  }
  const median = (xs: number[]) => xs.sort((x, y) => x - y)[Math.floor(xs.length / 2)];
  report(name, median(timed), median(base), limit);
}
