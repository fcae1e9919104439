import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  EXACT_AUTO_LIMIT,
  EXACT_LIMIT,
  signedRankLowerTail,
  signedRankNullCdf,
  signedRankTest,
  type SignedRankResult,
} from "../../src/stats/signedRank";
import { javascriptEngine, webAssemblyEngine } from "../../src/stats/subsetSumStep";
import type { Alternative, ZeroRule } from "../../src/stats/types";
import fixture from "../fixtures/signedRank.json";

interface Case {
  kind: "exact-small" | "ties" | "exact-large" | "exact-body" | "normal-large";
  x: number[];
  alternative: Alternative;
  statistic: number;
  pNormal: number;
  pExact: number | null;
}
const cases = (fixture as unknown as { cases: Case[] }).cases;
const nullCdf = (fixture as unknown as { nullCdf: { n: number; q: number[]; p: number[] }[] }).nullCdf;

const relative = (got: number, want: number) => (want === 0 ? Math.abs(got) : Math.abs(got - want) / Math.abs(want));

function run(x: ArrayLike<number>, options: Parameters<typeof signedRankTest>[1]): SignedRankResult {
  const r = signedRankTest(x, options);
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

/**
 * Brute-force enumeration of all 2^m sign patterns of the m non-zero differences (the exact-arithmetic
 * source): midranks by counting (O(n^2), independent of the library's sort), statistics kept as integers
 * 2V, counts as integers. Returns the three p-values and the exact null mean and variance of V.
 */
function enumerate(d: number[], zeros: ZeroRule) {
  const ranked = zeros === "pratt" ? d : d.filter((v) => v !== 0);
  const abs = ranked.map(Math.abs);
  // 2 x midrank = 2 x (number below) + (number equal) + 1
  const twiceRank = abs.map((a) => 2 * abs.filter((b) => b < a).length + abs.filter((b) => b === a).length + 1);
  const scores = twiceRank.filter((_, i) => ranked[i] !== 0);
  const signs = ranked.filter((v) => v !== 0).map((v) => v > 0);
  const m = scores.length;
  const observed = scores.reduce((s, r, i) => s + (signs[i] ? r : 0), 0);
  let atMost = 0;
  let atLeast = 0;
  let sum = 0;
  let sumSquares = 0;
  for (let pattern = 0; pattern < 2 ** m; pattern++) {
    let w = 0;
    for (let i = 0; i < m; i++) if (pattern & (1 << i)) w += scores[i];
    if (w <= observed) atMost++;
    if (w >= observed) atLeast++;
    sum += w;
    sumSquares += w * w;
  }
  const total = 2 ** m;
  const meanTwice = sum / total;
  return {
    statistic: observed / 2,
    less: atMost / total,
    greater: atLeast / total,
    twoSided: Math.min(1, (2 * Math.min(atMost, atLeast)) / total),
    expected: meanTwice / 2,
    variance: (sumSquares / total - meanTwice * meanTwice) / 4,
  };
}

const pick = (e: ReturnType<typeof enumerate>, a: Alternative) => (a === "less" ? e.less : a === "greater" ? e.greater : e.twoSided);

describe("signedRankTest against R 4.2 wilcox.test (fixture test/fixtures/signedRank.R)", () => {
  it(`exact p-values without ties: ${cases.filter((c) => c.pExact !== null).length} cases, n up to 1,000 (R exact = TRUE)`, () => {
    let worst = 0;
    for (const c of cases.filter((c) => c.pExact !== null)) {
      const r = run(c.x, { alternative: c.alternative, method: "exact" });
      expect(r.method).toBe("exact");
      expect(r.statistic).toBe(c.statistic);
      worst = Math.max(worst, relative(r.pValue, c.pExact as number));
    }
    console.log(`signed rank exact vs R: worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-12);
  });

  it("auto is exact, and equal to R's exact p-value, up to 1,000 differences", () => {
    const large = cases.filter((c) => c.pExact !== null && c.x.length > 400);
    expect(large.map((c) => c.x.length).sort((a, b) => a - b)).toEqual([450, 500, 600, 700, 800, 1000, 1000]);
    for (const c of large) {
      const r = run(c.x, { alternative: c.alternative });
      expect(r.method).toBe("exact");
      expect(relative(r.pValue, c.pExact as number)).toBeLessThan(1e-12);
    }
  });

  it(`normal approximation (correct = TRUE, tie correction, zeros dropped): all ${cases.length} cases`, () => {
    let worst = 0;
    for (const c of cases) {
      const r = run(c.x, { alternative: c.alternative, method: "normal" });
      expect(r.method).toBe("normal");
      expect(r.statistic).toBe(c.statistic);
      worst = Math.max(worst, relative(r.pValue, c.pNormal));
    }
    console.log(`signed rank normal vs R: worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-12);
  });

  it("with ties R has no exact p-value: exact (conditional) p-values against brute-force enumeration, up to 16 non-zero", () => {
    let checked = 0;
    let worst = 0;
    for (const c of cases.filter((c) => c.kind === "ties" && c.x.filter((v) => v !== 0).length <= 16)) {
      for (const zeros of ["drop", "pratt"] as const) {
        const r = run(c.x, { alternative: c.alternative, zeros });
        expect(r.method).toBe("exact");
        const e = enumerate(c.x, zeros);
        expect(r.statistic).toBe(e.statistic);
        worst = Math.max(worst, relative(r.pValue, pick(e, c.alternative)));
        checked++;
      }
    }
    console.log(`signed rank exact with ties vs enumeration: ${checked} checks, worst relative error ${worst.toExponential(2)}`);
    expect(checked).toBeGreaterThan(20);
    expect(worst).toBeLessThan(1e-13);
  });
});

describe("signedRankNullCdf against R 4.2 psignrank (fixture)", () => {
  it("P(V <= q) for n = 10..400, including the far lower tail", () => {
    let worst = 0;
    for (const { n, q, p } of nullCdf) {
      const cap = Math.max(...q);
      const cdf = signedRankNullCdf(
        Array.from({ length: n }, (_, i) => i + 1),
        cap,
      );
      q.forEach((qi, i) => (worst = Math.max(worst, relative(cdf[qi], p[i]))));
    }
    console.log(`signedRankNullCdf vs R psignrank: worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-12);
  });

  it("matches the hand count for scores 1, 2, 3 and rejects bad scores", () => {
    // Subset sums of {1, 2, 3}: 0, 1, 2, 3, 3, 4, 5, 6 (counted by hand).
    expect(Array.from(signedRankNullCdf([1, 2, 3], 3))).toEqual([0.125, 0.25, 0.375, 0.625]);
    expect(() => signedRankNullCdf([1, 0], 2)).toThrow(RangeError);
    expect(() => signedRankNullCdf([1.5], 2)).toThrow(RangeError);
    expect(() => signedRankNullCdf([1], -1)).toThrow(RangeError);
  });

  it("keeps full accuracy past 500 scores (rescaling) and deep in the tail", () => {
    // P(W <= 0) = 2^-600 exactly, P(W <= 1) = 2^-599 for the scores 1..600 (one subset sums to 1).
    const cdf = signedRankNullCdf(
      Array.from({ length: 600 }, (_, i) => i + 1),
      3,
    );
    expect(cdf[0]).toBe(2 ** -600);
    expect(cdf[1]).toBe(2 ** -599);
    expect(relative(cdf[3], 5 * 2 ** -600)).toBeLessThan(1e-15); // sums 0, 1, 2, 3 (=3 or 1+2)
  });
});

describe("signedRankLowerTail (two half-sets, lower halves only)", () => {
  /** Exact P(W <= q) by enumerating every subset with BigInt counts. */
  const enumerated = (scores: number[], q: number) => {
    let ways = 0n;
    for (let mask = 0; mask < 2 ** scores.length; mask++) {
      let sum = 0;
      scores.forEach((s, i) => (sum += mask & (1 << i) ? s : 0));
      if (sum <= q) ways++;
    }
    return Number(ways) / 2 ** scores.length;
  };

  // Both engines of the subset-sum step (subsetSumStep.ts): WebAssembly where it runs, JavaScript elsewhere.
  const engines = [webAssemblyEngine(), javascriptEngine()];
  it("runs the step in WebAssembly under Node (else the WebAssembly engine would go untested here)", () => {
    expect(engines.map((engine) => engine?.name)).toEqual(["webassembly", "javascript"]);
  });

  it.each(engines.map((engine) => [engine!.name, engine!] as const))(
    "equals brute-force enumeration on random score multisets, stepping in %s (exact arithmetic, property)",
    (_, engine) => {
      fc.assert(
        fc.property(
          fc.array(fc.integer({ min: 1, max: 12 }), { minLength: 0, maxLength: 14 }),
          fc.integer({ min: -2, max: 90 }),
          (scores, q) => {
            expect(signedRankLowerTail(scores, q, engine)).toBe(enumerated(scores, q));
          },
        ),
        { numRuns: 300 },
      );
    },
  );

  it.each(engines.map((engine) => [engine!.name, engine!] as const))(
    "gives the same answers whatever ran before it, stepping in %s (the half-tables are kept between calls, never cleared)",
    (_, engine) => {
      // Exact arithmetic (enumeration) for the small sets; each is asked again after a long call has filled the
      // kept tables with large counts and a raised floor, and again after a second long one of another shape.
      const long = Array.from({ length: 1000 }, (_, i) => i + 1);
      const tied = Array.from({ length: 801 }, (_, i) => 2 * (i >> 1) + 3);
      const middle = (scores: number[]) => Math.floor(scores.reduce((x, y) => x + y, 0) / 2) - 1;
      const small = [
        { scores: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13], q: 40 },
        { scores: [3, 3, 5, 5, 7, 9, 9, 11, 14, 14, 15, 20], q: 47 },
        { scores: [2, 4, 6, 8, 10, 12, 14, 16], q: 30 },
        { scores: [1, 1, 1, 2], q: 3 },
      ];
      const first = signedRankLowerTail(long, middle(long), engine);
      const firstTied = signedRankLowerTail(tied, middle(tied), engine);
      for (const { scores, q } of small) {
        signedRankLowerTail(long, middle(long), engine);
        expect(signedRankLowerTail(scores, q, engine)).toBe(enumerated(scores, q));
        signedRankLowerTail(tied, middle(tied), engine);
        expect(signedRankLowerTail(scores, q, engine)).toBe(enumerated(scores, q));
      }
      expect(signedRankLowerTail(long, middle(long), engine)).toBe(first);
      expect(signedRankLowerTail(tied, middle(tied), engine)).toBe(firstTied);
    },
  );

  it("agrees with the plain recursion (R-checked signedRankNullCdf) on long tied and untied score sets", () => {
    for (const scores of [
      Array.from({ length: 1000 }, (_, i) => i + 1),
      Array.from({ length: 999 }, (_, i) => 2 * (i >> 1) + 3), // tie pairs: every score odd
      Array.from({ length: 700 }, (_, i) => 1 + ((i * 37) % 301)),
    ]) {
      const total = scores.reduce((x, y) => x + y, 0);
      const qs = [0, 1, 5, Math.floor(total / 8), Math.floor(total / 2) - 1, Math.floor(total / 2)];
      const cdf = signedRankNullCdf(scores, Math.max(...qs));
      for (const q of qs) expect(relative(signedRankLowerTail(scores, q), cdf[q])).toBeLessThan(1e-13);
    }
  });

  it("leaves out only a negligible far tail: agrees with the plain recursion from the middle to beyond four standard deviations below it", () => {
    // The left-out tail (Hoeffding, at most 1e-25 of the distribution) is in play only for q at most four
    // standard deviations below the mean; these q straddle that edge. Reference: signedRankNullCdf, R-checked above.
    for (const scores of [
      Array.from({ length: 1000 }, (_, i) => i + 1),
      Array.from({ length: 801 }, (_, i) => 2 * (i >> 1) + 3),
      Array.from({ length: 600 }, (_, i) => 40 + 2 * Math.floor(i / 3) + 1), // Pratt zeros below, ties in threes
    ]) {
      const total = scores.reduce((x, y) => x + y, 0);
      const sd = Math.sqrt(scores.reduce((x, y) => x + y * y, 0) / 4);
      const qs = [0.5, 1, 2, 3, 3.9, 4.1, 5].map((z) => Math.floor(total / 2 - z * sd));
      const cdf = signedRankNullCdf(scores, Math.max(...qs));
      for (const q of qs) expect(relative(signedRankLowerTail(scores, q), cdf[q])).toBeLessThan(1e-13);
    }
  });

  it("keeps full accuracy deep in the tail past the rescaling (exact arithmetic)", () => {
    const scores = Array.from({ length: 1000 }, (_, i) => i + 1);
    expect(signedRankLowerTail(scores, 0)).toBe(2 ** -1000);
    expect(relative(signedRankLowerTail(scores, 3), 5 * 2 ** -1000)).toBeLessThan(1e-15); // sums 0, 1, 2, 3, 1+2
    expect(() => signedRankLowerTail([1, 0], 2)).toThrow(RangeError);
    expect(() => signedRankLowerTail([1], 0.5)).toThrow(RangeError);
  });
});

describe("signedRankTest against brute-force enumeration (exact arithmetic), n <= 12", () => {
  const smallData = fc.array(
    fc.integer({ min: -4, max: 4 }).map((v) => v / 2),
    { minLength: 1, maxLength: 12 },
  );
  it("exact p-values, statistic, null mean and variance with ties and zeros, both zero rules", () => {
    fc.assert(
      fc.property(
        smallData,
        fc.constantFrom<Alternative>("two-sided", "greater", "less"),
        fc.constantFrom<ZeroRule>("drop", "pratt"),
        (d, alternative, zeros) => {
          const r = signedRankTest(d, { alternative, zeros, method: "exact" });
          if (d.every((v) => v === 0)) {
            expect(r.available).toBe(false);
            return;
          }
          if (!r.available) throw new Error("unavailable");
          const e = enumerate(d, zeros);
          expect(r.statistic).toBe(e.statistic);
          expect(relative(r.pValue, pick(e, alternative))).toBeLessThan(1e-14);
          expect(relative(r.expected, e.expected)).toBeLessThan(1e-14);
          expect(relative(r.variance, e.variance)).toBeLessThan(1e-12);
          expect(r.n).toBe(zeros === "pratt" ? d.length : d.filter((v) => v !== 0).length);
          expect(r.zeroCount).toBe(d.filter((v) => v === 0).length);
        },
      ),
      { numRuns: 400 },
    );
  });

  it("the normal method uses the same conditional mean and variance (Pratt's rule has no R reference)", () => {
    fc.assert(
      fc.property(smallData, (d) => {
        if (d.every((v) => v === 0)) return;
        const r = run(d, { zeros: "pratt", method: "normal", alternative: "greater" });
        const e = enumerate(d, "pratt");
        expect(relative(r.variance, e.variance)).toBeLessThan(1e-12);
        expect(r.z).toBeCloseTo((r.statistic - e.expected - 0.5) / Math.sqrt(e.variance), 12);
      }),
      { numRuns: 200 },
    );
  });
});

describe("signedRankTest by hand and properties", () => {
  it("the documented example: V = 19 and P(V >= 19) = 3/64 for n = 6", () => {
    // Ranks of |d|: 0.25->1, 0.5->2, 1.5->3, 2->4, 3->5, 4->6; subsets of 1..6 with sum <= 2: {}, {1}, {2}.
    const r = run([1.5, -0.5, 2, 3, 0.25, 4], { alternative: "greater" });
    expect(r.statistic).toBe(19);
    expect(r.pValue).toBe(3 / 64);
    expect(r.expected).toBe(10.5);
    expect(r.variance).toBe(22.75);
  });

  it("Unavailable for no differences and for zeros only; RangeError for NaN and bad options", () => {
    expect(signedRankTest([])).toMatchObject({ available: false, reason: "no-data" });
    expect(signedRankTest([0, 0, -0])).toMatchObject({ available: false, reason: "too-few-values" });
    expect(() => signedRankTest([1, NaN])).toThrow(RangeError);
    expect(() => signedRankTest([1], { alternative: "both" as Alternative })).toThrow(RangeError);
  });

  it(`auto is exact up to ${EXACT_AUTO_LIMIT} non-zero differences, exact is honoured up to ${EXACT_LIMIT}`, () => {
    const data = (m: number, zeros: number) => [
      ...Array.from({ length: m }, (_, i) => (i % 3 === 0 ? -1 : 1) * (i + 1)),
      ...Array(zeros).fill(0),
    ];
    expect(run(data(EXACT_AUTO_LIMIT, 5), {}).method).toBe("exact");
    expect(run(data(EXACT_AUTO_LIMIT + 1, 0), {}).method).toBe("normal");
    const big = run(data(EXACT_LIMIT + 1, 0), { method: "exact" });
    expect(big.method).toBe("normal");
    expect(big.requestedMethod).toBe("exact");
    expect(run(data(10, 0), { method: "normal" }).method).toBe("normal");
  });

  it("exact and normal p-values agree within 1% at the auto limit for p >= 0.01 (supports the choice of limit)", () => {
    const n = EXACT_AUTO_LIMIT;
    const cdf = signedRankNullCdf(
      Array.from({ length: n }, (_, i) => i + 1),
      (n * (n + 1)) / 4,
    );
    for (const target of [0.01, 0.05, 0.2]) {
      let q = 0;
      while (cdf[q + 1] <= target) q++;
      // Ranks 1..n, positive exactly on a subset summing to q (greedy from the top), so V = q.
      let rest = q;
      const d = Array.from({ length: n }, (_, i) => n - i).map((r) => (r <= rest ? ((rest -= r), r) : -r));
      const e = run(d, { alternative: "less", method: "exact" });
      const z = run(d, { alternative: "less", method: "normal" });
      expect(e.statistic).toBe(q);
      expect(relative(e.pValue, cdf[q])).toBeLessThan(1e-13); // two summation orders of the same exact counts
      expect(relative(z.pValue, e.pValue)).toBeLessThan(0.01);
    }
  });

  it("p in [0, 1]; mirror symmetry; two-sided = min(1, 2 x smaller one-sided); invariant to positive scaling", () => {
    const data = fc.array(fc.oneof(fc.integer({ min: -6, max: 6 }), fc.double({ min: -10, max: 10, noNaN: true })), {
      minLength: 1,
      maxLength: 40,
    });
    fc.assert(
      fc.property(
        data,
        fc.constantFrom<ZeroRule>("drop", "pratt"),
        fc.constantFrom("exact", "normal") as fc.Arbitrary<"exact" | "normal">,
        (d, zeros, method) => {
          if (d.every((v) => v === 0)) return;
          const g = run(d, { alternative: "greater", zeros, method });
          const l = run(d, { alternative: "less", zeros, method });
          const t = run(d, { alternative: "two-sided", zeros, method });
          for (const r of [g, l, t]) {
            expect(r.pValue).toBeGreaterThanOrEqual(0);
            expect(r.pValue).toBeLessThanOrEqual(1);
          }
          const mirrored = run(
            d.map((v) => -v),
            { alternative: "less", zeros, method },
          );
          expect(relative(mirrored.pValue, g.pValue)).toBeLessThan(1e-12);
          if (method === "exact") expect(relative(t.pValue, Math.min(1, 2 * Math.min(g.pValue, l.pValue)))).toBeLessThan(1e-12);
          else expect(t.pValue).toBeGreaterThanOrEqual(Math.min(g.pValue, l.pValue));
          const scaled = run(
            d.map((v) => v * 8),
            { alternative: "greater", zeros, method },
          );
          expect(scaled.pValue).toBe(g.pValue);
        },
      ),
      { numRuns: 300 },
    );
  });
});
