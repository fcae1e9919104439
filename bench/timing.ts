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
