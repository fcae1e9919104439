import { describe, expect, it } from "vitest";
import { anytimeSignTest } from "../../src/stats/anytimeSign";
import {
  confidenceSequence,
  logQuantileEvidence,
  rowsToBound,
  standingCounts,
  type ConfidenceSequenceResult,
} from "../../src/stats/confidenceSequence";
import { xorshift32 } from "../../src/stats/xorshift";

function run(values: ArrayLike<number>, quantile = 0.5, confidence = 0.95): ConfidenceSequenceResult {
  const r = confidenceSequence(values, { quantile, confidence });
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

function factorial(k: number): bigint {
  let f = 1n;
  for (let j = 2; j <= k; j++) f *= BigInt(j);
  return f;
}

/**
 * Exact rational arithmetic (BigInt): M_t(s) = s! (t − s)! / ((t + 1)! q^s (1 − q)^(t − s)) >= 1/alpha with
 * q = a/b and alpha = 1/20, cleared of fractions: s! (t − s)! b^t >= 20 (t + 1)! a^s (b − a)^(t − s).
 */
function ruledOutExactly(s: number, t: number, a: number, b: number): boolean {
  const left = factorial(s) * factorial(t - s) * BigInt(b) ** BigInt(t);
  const right = 20n * factorial(t + 1) * BigInt(a) ** BigInt(s) * BigInt(b - a) ** BigInt(t - s);
  return left >= right;
}

describe("confidence sequence: the counts left standing, against exact rational arithmetic (BigInt)", () => {
  it("agrees at every t up to 120 for q = 1/2, 1/4, 9/10 and 1/20 at alpha = 0.05", () => {
    for (const [a, b] of [
      [1, 2],
      [1, 4],
      [9, 10],
      [1, 20],
    ]) {
      for (let t = 1; t <= 120; t++) {
        const standing: number[] = [];
        for (let s = 0; s <= t; s++) if (!ruledOutExactly(s, t, a, b)) standing.push(s);
        const ours = standingCounts(t, a / b, 0.05);
        if (standing.length === 0) expect(ours, `t ${t}, q ${a}/${b}`).toBeNull();
        else {
          // Convexity: what stands is one unbroken range.
          expect(standing[standing.length - 1] - standing[0] + 1).toBe(standing.length);
          expect(ours, `t ${t}, q ${a}/${b}`).toEqual({ low: standing[0], high: standing[standing.length - 1] });
        }
      }
    }
  });

  it("the evidence in closed form equals the exact integral ∫ (θ/q)^s ((1−θ)/(1−q))^(t−s) dθ = B(s+1, t−s+1) / (q^s (1−q)^(t−s))", () => {
    // 1/4 quantile, t = 7, s = 2: B(3, 6) = 2! 5! / 8! = 1/168; q^2 (1 − q)^5 = 243 / 16384; M = 16384 / (168 · 243).
    expect(Math.exp(logQuantileEvidence(2, 7, 0.25))).toBeCloseTo(16384 / (168 * 243), 12);
  });

  it("rowsToBound is the first t at which a count of 0 (lower end) or t (upper end) is ruled out, by direct scan", () => {
    for (const q of [0.5, 0.1, 0.9, 0.25, 0.01, 0.999]) {
      for (const alpha of [0.05, 0.01, 0.2]) {
        for (const end of ["lower", "upper"] as const) {
          let t = 1;
          while (logQuantileEvidence(end === "lower" ? 0 : t, t, q) < Math.log(1 / alpha)) t++;
          expect(rowsToBound(q, alpha, end), `${q} ${alpha} ${end}`).toBe(t);
        }
      }
    }
  });
});

/**
 * A plain reference: at each row, sort the values so far and take X(low_t) and X(high_t + 1) from the counts
 * left standing; intersect as it goes. O(n² log n): for checking only.
 */
function reference(values: readonly number[], q: number, confidence: number): { lower: number; upper: number } | "crossed" {
  let lower = -Infinity;
  let upper = Infinity;
  for (let t = 1; t <= values.length; t++) {
    const sorted = values.slice(0, t).sort((x, y) => x - y);
    const c = standingCounts(t, q, 1 - confidence);
    if (c === null) return "crossed";
    if (c.low >= 1) lower = Math.max(lower, sorted[c.low - 1]);
    if (c.high + 1 <= t) upper = Math.min(upper, sorted[c.high]);
  }
  return lower > upper ? "crossed" : { lower, upper };
}

describe("confidence sequence: the running intersection against a plain reference", () => {
  it("agrees on 400 random samples with ties, drift and several quantiles and confidences", () => {
    const next = xorshift32(31);
    for (let k = 0; k < 400; k++) {
      const n = 1 + Math.floor(next() * 150);
      const q = [0.5, 0.5, 0.25, 0.9, 0.05][k % 5];
      const confidence = [0.95, 0.9, 0.99][k % 3];
      const drift = k % 7 === 0 ? 0.05 : 0;
      const values = Array.from({ length: n }, (_, i) => Math.round((next() * 10 + drift * i) * (k % 2 === 0 ? 1 : 10)) / 10);
      const truth = reference(values, q, confidence);
      const ours = confidenceSequence(values, { quantile: q, confidence });
      if (truth === "crossed") {
        expect(ours.available, `case ${k}`).toBe(false);
        continue;
      }
      if (!ours.available) throw new Error(`case ${k}: ${ours.message}`);
      expect([ours.lower ?? -Infinity, ours.upper ?? Infinity], `case ${k}`).toEqual([truth.lower, truth.upper]);
    }
  });

  it("agrees on long samples too, including one arranged so the sample that places the window misleads (every other value far off)", () => {
    /** The same reference, keeping the values so far sorted by insertion: O(n²), fine for a few thousand. */
    function longReference(values: readonly number[], q: number): { lower: number; upper: number } | "crossed" {
      const sorted: number[] = [];
      let lower = -Infinity;
      let upper = Infinity;
      for (let t = 1; t <= values.length; t++) {
        const x = values[t - 1];
        let at = sorted.length;
        while (at > 0 && sorted[at - 1] > x) at--;
        sorted.splice(at, 0, x);
        const c = standingCounts(t, q, 0.05);
        if (c === null) return "crossed";
        if (c.low >= 1) lower = Math.max(lower, sorted[c.low - 1]);
        if (c.high + 1 <= t) upper = Math.min(upper, sorted[c.high]);
      }
      return lower > upper ? "crossed" : { lower, upper };
    }
    const next = xorshift32(99);
    // 6,000 values: the window's sample takes every 2nd value, all of which sit near 10 while the others are
    // spread from 0 to 1000, so its guess is wrong and the check must catch it.
    const arranged = Array.from({ length: 6000 }, (_, i) => (i % 2 === 0 ? 10 + next() : 1000 * next()));
    const plain = Array.from({ length: 6000 }, () => Math.round(1000 * next()) / 10);
    for (const [values, q] of [
      [arranged, 0.5],
      [arranged, 0.25],
      [plain, 0.5],
      [plain, 0.9],
    ] as const) {
      const truth = longReference(values, q);
      const ours = confidenceSequence(values, { quantile: q });
      if (truth === "crossed") expect(ours.available).toBe(false);
      else {
        if (!ours.available) throw new Error(ours.message);
        expect([ours.lower, ours.upper]).toEqual([truth.lower, truth.upper]);
      }
    }
  });

  it("a worked case: ten invented coating thicknesses (µm) bound the median from row 8 on", () => {
    const r = run([49, 53, 50, 52, 48, 51, 47, 54, 46, 55]);
    expect([r.lower, r.upper, r.rows, r.rowsForLower, r.rowsForUpper]).toEqual([47, 54, 10, 8, 8]);
    const early = run([49, 53, 50, 52, 48, 51, 47]);
    expect([early.lower, early.upper]).toEqual([null, null]);
  });

  it("only narrows as rows arrive", () => {
    const next = xorshift32(5);
    const values = Array.from({ length: 300 }, () => 50 + 4 * (next() - 0.5));
    let previous = run(values.slice(0, 20));
    for (let t = 21; t <= values.length; t += 7) {
      const now = run(values.slice(0, t));
      expect(now.lower as number).toBeGreaterThanOrEqual(previous.lower as number);
      expect(now.upper as number).toBeLessThanOrEqual(previous.upper as number);
      previous = now;
    }
  });

  it("rows that shift far enough leave no common median: Unavailable, saying why", () => {
    const values = [
      ...Array.from({ length: 200 }, (_, i) => 40 + (i % 10) / 10),
      ...Array.from({ length: 400 }, (_, i) => 60 + (i % 10) / 10),
    ];
    const r = confidenceSequence(values);
    expect(r.available).toBe(false);
    if (!r.available) expect(r.message).toMatch(/shift/);
    expect(confidenceSequence([]).available).toBe(false);
    expect(() => confidenceSequence([1, NaN])).toThrow(RangeError);
    expect(() => confidenceSequence([1], { quantile: 1 })).toThrow(RangeError);
  });

  it("for the median, a centre between data values is inside exactly when the two-sided anytime sign test keeps it (same mixture)", () => {
    const next = xorshift32(77);
    for (let k = 0; k < 40; k++) {
      const values = Array.from({ length: 60 + k * 10 }, () => Math.round(1000 * (next() + next())) / 1000 + 0.3 * (k % 3));
      const r = run(values);
      for (let c = 0.0005; c < 2.6; c += 0.05) {
        const p = anytimeSignTest(values, c);
        if (!p.available) continue;
        const inside = (r.lower ?? -Infinity) <= c && c <= (r.upper ?? Infinity);
        expect(inside, `case ${k}, centre ${c}: p ${p.pValue}`).toBe(p.pValue > 0.05);
      }
    }
  });
});

describe("confidence sequence: Monte Carlo coverage (seeded xorshift32), watched at every row up to n = 500", () => {
  it("covers the true quantile at every row in at least 1 − alpha of runs", () => {
    const runs = 1000;
    const n = 500;
    for (const q of [0.5, 0.9]) {
      const next = xorshift32(q === 0.5 ? 11 : 12);
      let covered = 0;
      const values = new Float64Array(n);
      for (let k = 0; k < runs; k++) {
        // Uniform(0, 1) data: the true q-quantile is q. The running intersection at row n covers it exactly when
        // every row's bounds did.
        for (let i = 0; i < n; i++) values[i] = next();
        const r = confidenceSequence(values, { quantile: q });
        if (r.available && (r.lower ?? -Infinity) <= q && q <= (r.upper ?? Infinity)) covered++;
      }
      const rate = covered / runs;
      const se = Math.sqrt((0.05 * 0.95) / runs);
      console.log(
        `confidence sequence, quantile ${q}, ${runs} runs of ${n} rows, 95%: covered at every row in ${(100 * rate).toFixed(1)}% of runs (simulation error ${(100 * se).toFixed(2)} points)`,
      );
      expect(rate).toBeGreaterThanOrEqual(0.95 - 3 * se);
    }
  });
});
