import { describe, expect, it } from "vitest";
import { anytimeSignTest, logSignEvidence, type AnytimeSignResult } from "../../src/stats/anytimeSign";
import { signTest } from "../../src/stats/signTest";
import type { Alternative, TieRule } from "../../src/stats/types";
import { xorshift32 } from "../../src/stats/xorshift";
import { compare, relativeError, type Fraction } from "./signFamilyExact";

const ALTERNATIVES: readonly Alternative[] = ["two-sided", "greater", "less"];

function run(values: ArrayLike<number>, center: number, alternative: Alternative = "two-sided", ties: TieRule = "drop"): AnytimeSignResult {
  const r = anytimeSignTest(values, center, { alternative, ties });
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

// ---------------------------------------------------------------------------
// Exact rational arithmetic (BigInt): the outside source for the evidence.

function factorial(k: number): bigint {
  let f = 1n;
  for (let j = 2; j <= k; j++) f *= BigInt(j);
  return f;
}

function choose(n: number, k: number): bigint {
  return factorial(n) / (factorial(k) * factorial(n - k));
}

/**
 * The evidence as an exact fraction, from its definition as an integral: two-sided 2^t B(s + 1, f + 1) =
 * 2^t s! f! / (t + 1)!; "greater" 2^t · 2 ∫_{1/2}^1 θ^s (1 − θ)^f dθ, which by expanding (1 − θ)^f term by term
 * and integrating each power exactly is 2^(t+1) Σ_j C(f, j) (−1)^j (1 − 2^−(s+j+1)) / (s + j + 1).
 */
function exactEvidence(above: number, below: number, alternative: Alternative): Fraction {
  const t = above + below;
  if (alternative === "two-sided") return { num: (1n << BigInt(t)) * factorial(above) * factorial(below), den: factorial(t + 1) };
  const [s, f] = alternative === "greater" ? [above, below] : [below, above];
  // Σ_j C(f, j) (−1)^j (2^(s+j+1) − 1) / ((s + j + 1) 2^(s+j+1)), summed over a common denominator.
  let num = 0n;
  let den = 1n;
  for (let j = 0; j <= f; j++) {
    const power = 1n << BigInt(s + j + 1);
    const termNum = (j % 2 === 0 ? 1n : -1n) * choose(f, j) * (power - 1n);
    const termDen = BigInt(s + j + 1) * power;
    num = num * termDen + termNum * den;
    den *= termDen;
  }
  return { num: num * (1n << BigInt(t + 1)), den };
}

/** min(1, 1 / max over the prefixes) exactly, from the signs after the tie rule as a list of +1 / −1 steps. */
function exactPValue(steps: readonly number[][], alternative: Alternative): Fraction {
  let best: Fraction = { num: 1n, den: 1n };
  let above = 0;
  let below = 0;
  for (const step of steps) {
    for (const s of step) {
      if (s > 0) above++;
      else below++;
    }
    const e = exactEvidence(above, below, alternative);
    if (compare(e, best) > 0) best = e;
  }
  return { num: best.den, den: best.num };
}

/** The tie rules as the module documents them, written out plainly: each row gives zero, one or two steps. */
function stepsOf(signs: readonly number[], alternative: Alternative, ties: TieRule): number[][] {
  const steps: number[][] = [];
  let above = 0;
  let below = 0;
  let pending = false;
  for (const sign of signs) {
    let step: number[];
    if (sign !== 0) step = [sign];
    else if (ties === "drop") step = [];
    else if (ties === "split") {
      step = pending ? [1, -1] : [];
      pending = !pending;
    } else step = [alternative === "greater" ? -1 : alternative === "less" ? 1 : above < below ? 1 : -1];
    for (const s of step) {
      if (s > 0) above++;
      else below++;
    }
    if (step.length > 0) steps.push(step);
  }
  return steps;
}

describe("anytime sign test: evidence against exact rational arithmetic (BigInt)", () => {
  it("the closed forms equal the integrals for every count up to 40", () => {
    let worst = 0;
    for (const alternative of ALTERNATIVES) {
      for (let above = 0; above <= 40; above++) {
        for (let below = 0; below + above <= 40; below++) {
          const exact = exactEvidence(above, below, alternative);
          worst = Math.max(worst, relativeError(Math.exp(logSignEvidence(above, below, alternative)), exact));
        }
      }
    }
    console.log(`anytime sign evidence, all counts to t = 40: worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-12);
  });

  it("the watched p-value equals min(1, 1 / running maximum) on 600 random sign sequences with ties, every alternative and tie rule", () => {
    const next = xorshift32(20261202);
    let worst = 0;
    for (let k = 0; k < 600; k++) {
      const n = 1 + Math.floor(next() * 30);
      const lean = next();
      const signs = Array.from({ length: n }, () => {
        const u = next();
        return u < 0.15 ? 0 : u < 0.15 + 0.85 * lean ? 1 : -1;
      });
      const values = signs.map((s) => 50 + (s * (1 + Math.floor(next() * 9))) / 10);
      const alternative = ALTERNATIVES[k % 3];
      const ties = (["drop", "split", "conservative"] as const)[Math.floor(k / 3) % 3];
      const steps = stepsOf(signs, alternative, ties);
      const r = anytimeSignTest(values, 50, { alternative, ties });
      if (steps.length === 0) {
        expect(r.available).toBe(false);
        continue;
      }
      if (!r.available) throw new Error("unavailable");
      worst = Math.max(worst, relativeError(r.pValue, exactPValue(steps, alternative)));
    }
    console.log(`anytime sign p-value, 600 sequences of up to 30 rows: worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-12);
  });
});

describe("anytime sign test: worked cases (exact arithmetic by hand)", () => {
  it("eight values above 50: two-sided M_8 = 2^8 8! / 9! = 256/9, one-sided 2 · 256/9 · 511/512 = 511/9", () => {
    const data = [51, 52, 53, 54, 55, 56, 57, 58];
    expect(run(data, 50).pValue).toBeCloseTo(9 / 256, 14);
    expect(run(data, 50, "greater").pValue).toBeCloseTo(9 / 511, 14);
    expect(run(data, 50, "less").pValue).toBe(1);
    expect(run(data, 50).rowOfLargest).toBe(8);
  });

  it("the p-value never rises as rows are added (a running maximum), though the evidence itself falls", () => {
    const data = [51, 52, 53, 54, 55, 56, 57, 58, 40, 41, 42, 43, 44, 45];
    const p = data.map((_, k) => run(data.slice(0, k + 1), 50).pValue);
    for (let k = 1; k < p.length; k++) expect(p[k]).toBeLessThanOrEqual(p[k - 1]);
    const last = run(data, 50);
    expect(last.logEvidence).toBeLessThan(last.logLargestEvidence);
    expect(last.rowOfLargest).toBe(8);
  });

  it("ties: drop leaves them out, split pairs them (an odd one left out), conservative counts them against the alternative", () => {
    const data = [50, 51, 50, 52, 50];
    const dropped = run(data, 50, "two-sided", "drop");
    expect([dropped.below, dropped.above, dropped.tiesDropped]).toEqual([0, 2, 3]);
    const split = run(data, 50, "two-sided", "split");
    expect([split.below, split.above, split.tiesDropped]).toEqual([1, 3, 1]);
    const conservative = run(data, 50, "greater", "conservative");
    expect([conservative.below, conservative.above, conservative.tiesDropped]).toEqual([3, 2, 0]);
    // 0.1 + 0.2 is a tie with 0.3 at the sheet's 15 digits (the shared tie rule).
    expect(run([0.1 + 0.2, 0.4], 0.3).tiesDropped).toBe(1);
  });

  it("no values, or only ties under drop, give Unavailable; NaN is a programming error", () => {
    expect(anytimeSignTest([], 50).available).toBe(false);
    expect(anytimeSignTest([50, 50], 50).available).toBe(false);
    expect(() => anytimeSignTest([1, NaN], 0)).toThrow(RangeError);
    expect(() => anytimeSignTest([1], NaN)).toThrow(RangeError);
  });
});

describe("anytime sign test: long runs, where the running value is rescaled", () => {
  /** A plain reference: the exact evidence (log space, binomial.ts) after every row. */
  function reference(values: ArrayLike<number>, center: number, alternative: Alternative): number {
    let best = 0;
    let above = 0;
    let below = 0;
    for (let i = 0; i < values.length; i++) {
      if (values[i] > center) above++;
      else if (values[i] < center) below++;
      else continue;
      best = Math.max(best, logSignEvidence(above, below, alternative));
    }
    return best;
  }

  it("agrees with the evidence taken afresh at every row, through 4,000 rows leaning one way and then the other", () => {
    const next = xorshift32(7);
    const values = Float64Array.from({ length: 4000 }, (_, i) => 50 + (next() < (i < 2500 ? 0.1 : 0.95) ? 1 : -1));
    for (const alternative of ALTERNATIVES) {
      const ours = run(values, 50, alternative).logLargestEvidence;
      const truth = reference(values, 50, alternative);
      expect(Math.abs(ours - truth)).toBeLessThanOrEqual(1e-9 * Math.max(1, truth));
    }
  });
});

describe("anytime sign test: Monte Carlo under H0 (seeded xorshift32), looking after every row up to n = 500", () => {
  it("the fixed-sample exact sign test rejects far more often than alpha; the watched p-value at most alpha", () => {
    const alpha = 0.05;
    const n = 500;
    const runs = 2000;
    // Smallest larger-side count at which the fixed-sample two-sided exact p-value is <= alpha, for each t.
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
    const next = xorshift32(500);
    let fixedRejects = 0;
    let watchedRejects = 0;
    const values = new Float64Array(n);
    for (let run = 0; run < runs; run++) {
      let above = 0;
      let rejectedEarly = false;
      for (let t = 1; t <= n; t++) {
        values[t - 1] = next() < 0.5 ? 49 : 51;
        if (values[t - 1] > 50) above++;
        if (Math.max(above, t - above) >= critical[t]) rejectedEarly = true;
      }
      if (rejectedEarly) fixedRejects++;
      const r = anytimeSignTest(values, 50);
      if (r.available && r.pValue <= alpha) watchedRejects++;
    }
    const fixedRate = fixedRejects / runs;
    const watchedRate = watchedRejects / runs;
    const se = Math.sqrt((alpha * (1 - alpha)) / runs);
    console.log(
      `H0, ${runs} runs, looking after every row to n = ${n}, alpha ${alpha}: fixed-sample sign test rejects in ${(100 * fixedRate).toFixed(1)}% of runs; watched p-value in ${(100 * watchedRate).toFixed(2)}% (simulation error ${(100 * se).toFixed(2)} points)`,
    );
    expect(fixedRate).toBeGreaterThan(3 * alpha);
    expect(watchedRate).toBeLessThanOrEqual(alpha + 3 * se);
  });
});

describe("anytime sign test: the one-sided version under the composite hypothesis P(above) <= 1/2 (seeded Monte Carlo)", () => {
  it("rejects 'greater' in at most alpha of runs when values lie above with chance 0.45, and often when 0.6", () => {
    const alpha = 0.05;
    const runs = 1000;
    const values = new Float64Array(500);
    const rate = (pAbove: number, seed: number) => {
      const next = xorshift32(seed);
      let rejected = 0;
      for (let k = 0; k < runs; k++) {
        for (let i = 0; i < values.length; i++) values[i] = next() < pAbove ? 51 : 49;
        const r = anytimeSignTest(values, 50, { alternative: "greater" });
        if (r.available && r.pValue <= alpha) rejected++;
      }
      return rejected / runs;
    };
    const underNull = rate(0.45, 45);
    const underAlternative = rate(0.6, 60);
    console.log(
      `one-sided watched p-value, ${runs} runs of 500 rows: rejects in ${(100 * underNull).toFixed(1)}% at P(above) = 0.45, ${(100 * underAlternative).toFixed(1)}% at 0.6`,
    );
    expect(underNull).toBeLessThanOrEqual(alpha);
    expect(underAlternative).toBeGreaterThan(0.5);
  });
});
