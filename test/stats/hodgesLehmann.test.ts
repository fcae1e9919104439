import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  EXACT_RANK_LIMIT,
  hodgesLehmann,
  hodgesLehmannEstimate,
  walshAverageOrderStatistic,
  type HodgesLehmannResult,
} from "../../src/stats/hodgesLehmann";
import { signedRankTest } from "../../src/stats/signedRank";
import { xorshift32 } from "../../src/stats/xorshift";
import fixture from "../fixtures/signedRank.json";

interface ExactInterval {
  reachable: boolean;
  k: number;
  estimate?: number;
  lower?: number;
  upper?: number;
  achieved?: number;
}
interface LargeInterval {
  walshMedian: number;
  normalK: number;
  normalLower: number;
  normalUpper: number;
  exactK: number | null;
  exactLower: number | null;
  exactUpper: number | null;
  rEstimate: number;
  rLower: number;
  rUpper: number;
}
interface Case {
  kind: string;
  x: number[];
  confidence: number;
  interval: ExactInterval | LargeInterval | null;
}
const cases = (fixture as unknown as { cases: Case[] }).cases;
const relative = (got: number, want: number) => (want === 0 ? Math.abs(got) : Math.abs(got - want) / Math.abs(want));

function run(x: ArrayLike<number>, confidence?: number): HodgesLehmannResult {
  const r = hodgesLehmann(x, confidence === undefined ? {} : { confidence });
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

/** All Walsh averages, sorted: the brute-force reference for the selection. */
function walshAverages(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  const w = new Float64Array((n * (n + 1)) / 2);
  let p = 0;
  for (let i = 0; i < n; i++) for (let j = i; j < n; j++) w[p++] = (x[i] + x[j]) / 2;
  return w.sort();
}

describe("hodgesLehmann against R 4.2 wilcox.test(conf.int = TRUE) (fixture test/fixtures/signedRank.R)", () => {
  const exactCases = cases.filter((c) => c.kind === "exact-small" || c.kind === "exact-large");

  it(`exact intervals without ties: estimate, bounds, rank and achieved level (${exactCases.length} cases, n up to 400)`, () => {
    let worst = 0;
    let reachable = 0;
    for (const c of exactCases) {
      const want = c.interval as ExactInterval;
      const r = hodgesLehmann(c.x, { confidence: c.confidence });
      if (!want.reachable) {
        // R warns and falls back to the extreme averages; we say what sample size would do.
        expect(r).toMatchObject({ available: false, reason: "unreachable" });
        if (!r.available) expect(r.minimumN).toBeGreaterThan(c.x.length);
        continue;
      }
      reachable++;
      if (!r.available) throw new Error(r.message);
      expect(r.method).toBe("exact");
      expect(r.boundRank).toBe(want.k);
      // Walsh averages are the same doubles as R's (x_i + x_j)/2; R's median averages two of them in long double.
      expect(r.lower).toBe(want.lower);
      expect(r.upper).toBe(want.upper);
      worst = Math.max(worst, relative(r.estimate, want.estimate as number), relative(r.achievedConfidence, want.achieved as number));
    }
    console.log(
      `Hodges-Lehmann exact vs R: ${reachable} intervals, bounds identical, worst relative error (estimate, level) ${worst.toExponential(2)}`,
    );
    expect(reachable).toBeGreaterThan(200);
    expect(worst).toBeLessThan(1e-14);
  });

  it("beyond the exact limit: normal-approximation rank; order statistics as computed by R from all Walsh averages", () => {
    for (const c of cases.filter((c) => c.kind === "normal-large")) {
      const want = c.interval as LargeInterval;
      const r = run(c.x, c.confidence);
      expect(c.x.length).toBeGreaterThan(EXACT_RANK_LIMIT);
      expect(r.method).toBe("normal");
      expect(r.boundRank).toBe(want.normalK);
      expect(r.lower).toBe(want.normalLower);
      expect(r.upper).toBe(want.normalUpper);
      expect(relative(r.estimate, want.walshMedian)).toBeLessThan(1e-15);
    }
  });

  it("R's normal-case interval (uniroot on the corrected z) is comparable only loosely: it lies within a few dozen Walsh ranks of ours", () => {
    // R's bounds are roots of a step function found to uniroot's tolerance, not Walsh averages, and its estimate
    // is the root of z(mu) = 0 rather than the median of the averages (tol.root = 1e-4). Measured: at most 22 ranks
    // (n = 2000), estimate within 1.2e-4 relative; tested at 40 ranks and 1e-3.
    const lines: string[] = [];
    for (const c of cases.filter((c) => c.kind === "normal-large")) {
      const want = c.interval as LargeInterval;
      const r = run(c.x, c.confidence);
      const w = walshAverages(c.x);
      const rankOf = (v: number) => {
        let lo = 0;
        let hi = w.length;
        while (lo < hi) {
          const mid = (lo + hi) >>> 1;
          if (w[mid] < v) lo = mid + 1;
          else hi = mid;
        }
        return lo; // averages below v
      };
      const lowerGap = Math.abs(rankOf(want.rLower) - r.boundRank);
      const upperGap = Math.abs(rankOf(want.rUpper) - (w.length - r.boundRank));
      const exactGap = want.exactK === null ? "n/a" : String(Math.abs(want.exactK - r.boundRank));
      lines.push(
        `n=${c.x.length}: R bounds ${lowerGap}/${upperGap} ranks off, estimate rel. diff ${relative(r.estimate, want.rEstimate).toExponential(1)}, exact-vs-normal rank gap ${exactGap}`,
      );
      expect(lowerGap).toBeLessThanOrEqual(40);
      expect(upperGap).toBeLessThanOrEqual(40);
      expect(relative(r.estimate, want.rEstimate)).toBeLessThan(1e-3);
    }
    console.log(`Hodges-Lehmann vs R uniroot (normal case):\n  ${lines.join("\n  ")}`);
  });
});

describe("Walsh-average selection against brute force (all averages sorted)", () => {
  it("every rank of small samples, with heavy ties, and sampled ranks up to n = 300", () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -3, max: 3 }), fc.double({ min: -1e6, max: 1e6, noNaN: true })), {
          minLength: 1,
          maxLength: 300,
        }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), { minLength: 1, maxLength: 4 }),
        (x, fractions) => {
          const w = walshAverages(x);
          const ranks = x.length <= 12 ? w.map((_, i) => i + 1) : fractions.map((f) => 1 + Math.floor(f * w.length));
          // + 0: -0 and +0 tie, and the library reports a tie at zero as +0.
          for (const k of ranks) expect(walshAverageOrderStatistic(x, k)).toBe(w[k - 1] + 0);
          const N = w.length;
          const median = N % 2 === 1 ? w[(N - 1) / 2] : (w[N / 2 - 1] + w[N / 2]) / 2;
          expect(hodgesLehmannEstimate(x)).toBe(median + 0);
        },
      ),
      { numRuns: 150 },
    );
  });

  it("large samples, both ways (rounds on mostly distinct data, full-matrix brackets on repeats), at extreme and middle ranks, by brute-force counting", () => {
    const next = xorshift32(2024);
    /** Whether w is the k-th Walsh average: fewer than k averages lie below it and at least k at or below it. */
    const isKth = (x: readonly number[], k: number, w: number): boolean => {
      let less = 0;
      let atMost = 0;
      for (let i = 0; i < x.length; i++)
        for (let j = i; j < x.length; j++) {
          const a = (x[i] + x[j]) / 2;
          if (a < w) less++;
          if (a <= w) atMost++;
        }
      return less < k && k <= atMost;
    };
    const n = 10_000;
    const distinct = Array.from({ length: n }, () => 100 * next() - 50);
    const tied = Array.from({ length: n }, () => Math.round(20 * next()) / 4);
    const tiedOutliers = tied.map((x, i) => (i % 1000 === 0 ? (x + 1) * 1e298 : i % 1000 === 1 ? (x + 1) * 1e-300 : x));
    const count = (n * (n + 1)) / 2;
    const middle = count / 2; // n(n+1)/2 is even for n = 10,000
    for (const x of [distinct, tied, tiedOutliers])
      for (const k of [1, n, n + 1, middle - 3 * n, middle, middle + 1, count - n, count])
        expect([k, isKth(x, k, walshAverageOrderStatistic(x, k))]).toEqual([k, true]);
    // Every value twice: 10,000 distinct values on each side of the full matrix, enough for thinned brackets (differenceSelection.ts).
    const twice = [...distinct, ...distinct];
    const all = (2 * n * (2 * n + 1)) / 2;
    for (const k of [2, all / 2, all - 2 * n]) expect([k, isKth(twice, k, walshAverageOrderStatistic(twice, k))]).toEqual([k, true]);
    // Runs of consecutive ranks, where the averages change value, on a smaller sample of every value twice.
    const pairs = [...distinct.slice(0, 1000), ...distinct.slice(0, 1000)];
    const w = walshAverages(pairs);
    for (const start of [1, 50_000, w.length / 2 - 100, w.length - 200])
      for (let k = start; k < start + 200; k++) expect([k, walshAverageOrderStatistic(pairs, k)]).toEqual([k, w[k - 1] + 0]);
  });

  it("a constant sample (every average tied) and the documented examples", () => {
    expect(walshAverageOrderStatistic(new Float64Array(500).fill(7), 60000)).toBe(7);
    // Averages of 1, 3, 10 by hand: 1, 2, 3, 5.5, 6.5, 10.
    expect(walshAverageOrderStatistic([1, 3, 10], 2)).toBe(2);
    expect(hodgesLehmannEstimate([1, 3, 10])).toBe(4.25);
    expect(() => walshAverageOrderStatistic([1, 2], 4)).toThrow(RangeError);
    expect(() => hodgesLehmannEstimate([])).toThrow(RangeError);
  });
});

describe("hodgesLehmann: duality with the signed-rank test, coverage, data conditions", () => {
  it("centres strictly inside the bounds are not rejected by the exact two-sided test at 1 - confidence; just outside they are", () => {
    // Bauer (1972): the interval is the set of centres the signed-rank test accepts.
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: 6, maxLength: 25 }),
        fc.constantFrom(0.8, 0.9, 0.95),
        (x, confidence) => {
          const w = walshAverages(x);
          if (w.some((v, i) => i > 0 && v === w[i - 1])) return; // duality needs distinct averages
          const r = hodgesLehmann(x, { confidence });
          if (!r.available) return;
          const k = r.boundRank;
          const alpha = 1 - confidence;
          const p = (mu: number) => {
            const t = signedRankTest(
              x.map((v) => v - mu),
              { method: "exact" },
            );
            if (!t.available) throw new Error("unavailable");
            return t.pValue;
          };
          expect(p((w[k - 1] + w[k]) / 2)).toBeGreaterThan(alpha); // just inside the lower bound
          if (k >= 2) expect(p((w[k - 2] + w[k - 1]) / 2)).toBeLessThanOrEqual(alpha); // just outside
          expect(r.achievedConfidence).toBeGreaterThanOrEqual(confidence);
          expect(r.lower).toBeLessThanOrEqual(r.estimate);
          expect(r.estimate).toBeLessThanOrEqual(r.upper!);
        },
      ),
      { numRuns: 150 },
    );
  });

  it("shifts and positive scalings carry over exactly (dyadic data)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 6, maxLength: 60 }),
        fc.integer({ min: -50, max: 50 }),
        (ints, shift) => {
          const x = ints.map((v) => v / 8);
          const a = run(x);
          const b = run(x.map((v) => 4 * v + shift));
          expect(b.estimate).toBe(4 * a.estimate + shift);
          expect(b.lower).toBe(4 * a.lower! + shift);
          expect(b.upper).toBe(4 * a.upper! + shift);
          expect(b.achievedConfidence).toBe(a.achievedConfidence);
        },
      ),
      { numRuns: 100 },
    );
  });

  it("the documented example", () => {
    // n = 8, confidence 0.9: P(V <= 5) = 10/256 <= 0.05 < P(V <= 6) = 14/256, so k = 6 (counted by hand from the
    // subset sums of 1..8), achieved 1 - 2 x 10/256 = 0.921875.
    const r = run([1.2, 3.4, -0.5, 2.2, 5.1, 0.7, 2.9, 4.4], 0.9);
    expect(r).toMatchObject({ boundRank: 6, achievedConfidence: 0.921875, method: "exact", n: 8 });
    const w = walshAverages([1.2, 3.4, -0.5, 2.2, 5.1, 0.7, 2.9, 4.4]);
    expect(r.lower).toBe(w[5]);
    expect(r.upper).toBe(w[w.length - 6]);
    expect(r.estimate).toBe((w[17] + w[18]) / 2);
  });

  it("Unavailable for no values or a confidence too high for n (with the n that suffices); RangeError for bad input", () => {
    expect(hodgesLehmann([])).toMatchObject({ available: false, reason: "no-data" });
    // k = 1 covers with probability 1 - 2^(1-n): 0.9375 at n = 5, 0.96875 at n = 6 (exact arithmetic).
    expect(hodgesLehmann([1, 2, 3, 4, 5])).toMatchObject({ available: false, reason: "unreachable", minimumN: 6 });
    expect(run([1, 2, 3, 4, 5, 6]).boundRank).toBe(1);
    // 1 - 2^-10 = 0.99902 >= 0.999 > 1 - 2^-9.
    expect(hodgesLehmann([1, 2, 3], { confidence: 0.999 })).toMatchObject({ available: false, minimumN: 11 });
    expect(() => hodgesLehmann([1, 2], { confidence: 1 })).toThrow(RangeError);
    expect(() => hodgesLehmann([1, 2], { confidence: NaN })).toThrow(RangeError);
    expect(() => hodgesLehmann([1, Infinity])).toThrow(RangeError);
  });

  it("bound rank k at ordinary and extreme confidences equals the exact count (BigInt subset sums of 1..n)", () => {
    for (const n of [6, 10, 20, 30, 45, 60, 90]) {
      // counts[w] = number of subsets of {1..n} with sum w, exactly.
      const half = Math.floor((n * (n + 1)) / 4);
      const counts = Array<bigint>(half + 1).fill(0n);
      counts[0] = 1n;
      for (let i = 1; i <= n; i++) for (let w = half; w >= i; w--) counts[w] += counts[w - i];
      for (const confidence of [0.5, 0.8, 0.95, 0.99, 1 - 2e-6, 1 - 2e-9, 1 - 2e-12]) {
        const halfAlpha = (1 - confidence) / 2;
        const limit = BigInt(Math.floor(halfAlpha * 2 ** n)); // P(V <= x) <= alpha/2  <=>  count <= alpha/2 * 2^n
        let cumulative = 0n;
        let k = 0; // largest k with P(V <= k - 1) <= alpha/2
        for (let x = 0; x <= half; x++) {
          cumulative += counts[x];
          if (cumulative > limit) break;
          k = x + 1;
        }
        const r = hodgesLehmann(
          Array.from({ length: n }, (_, i) => i * 1.5 - 7),
          { confidence },
        );
        if (k === 0) expect(r).toMatchObject({ available: false, reason: "unreachable" });
        else expect(r).toMatchObject({ available: true, boundRank: k, method: "exact" });
      }
    }
  });

  it("switches to the normal rank above the exact limit", () => {
    const x = Array.from({ length: EXACT_RANK_LIMIT + 1 }, (_, i) => Math.sin(i) * 10);
    const r = run(x);
    const n = x.length;
    const sd = Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24);
    expect(r.method).toBe("normal");
    // k = floor(N/2 + 1/2 + z_0.025 sd), z_0.025 = -1.959963984540054 (standard normal table value).
    expect(r.boundRank).toBe(Math.floor((n * (n + 1)) / 4 + 0.5 - 1.959963984540054 * sd));
    expect(r.achievedConfidence).toBeGreaterThanOrEqual(0.95);
  });
});

describe("one-sided Hodges–Lehmann bounds", () => {
  /** P(V <= v) for ranks 1..n by enumerating all 2^n sign patterns (exact arithmetic). */
  function enumeratedCdf(n: number): number[] {
    const counts = new Array<number>((n * (n + 1)) / 2 + 1).fill(0);
    for (let mask = 0; mask < 2 ** n; mask++) {
      let v = 0;
      for (let i = 0; i < n; i++) if (mask & (1 << i)) v += i + 1;
      counts[v]++;
    }
    let running = 0;
    return counts.map((c) => (running += c) / 2 ** n);
  }

  const x = [1.2, 3.4, -0.5, 2.2, 5.1, 0.7, 2.9, 4.4];

  it("takes the whole miss in one tail: rank and coverage by enumeration, bound by brute force", () => {
    const cdf = enumeratedCdf(x.length);
    let k = 0;
    while (cdf[k] <= 0.1) k++; // largest k with P(V <= k - 1) <= 0.1
    const walsh = walshAverages(x);
    const lower = hodgesLehmann(x, { confidence: 0.9, side: "lower" });
    expect(lower).toMatchObject({ available: true, boundRank: k, upper: null, achievedConfidence: 1 - cdf[k - 1] });
    expect((lower as HodgesLehmannResult).lower).toBe(walsh[k - 1]);
    const upper = hodgesLehmann(x, { confidence: 0.9, side: "upper" }) as HodgesLehmannResult;
    expect([upper.lower, upper.upper]).toEqual([null, walsh[walsh.length - k]]);
  });

  it("is the end of the two-sided bounds at confidence 2γ − 1 (the same tail allowance)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -500, max: 500 }), { minLength: 6, maxLength: 80 }),
        fc.constantFrom(0.9, 0.95, 0.975, 0.99),
        (ints, level) => {
          const data = ints.map((v) => v / 4);
          const one = hodgesLehmann(data, { confidence: level, side: "lower" });
          const two = hodgesLehmann(data, { confidence: 2 * level - 1 });
          expect(one.available).toBe(two.available);
          if (one.available && two.available) expect(one.lower).toBe(two.lower);
        },
      ),
      { numRuns: 100 },
    );
  });

  it("needs fewer values than two-sided bounds: 2^-n <= 0.05 at n = 5", () => {
    expect(hodgesLehmann([1, 2, 3, 4, 5], { side: "lower" }).available).toBe(true);
    expect(hodgesLehmann([1, 2, 3, 4], { side: "upper" })).toMatchObject({ available: false, minimumN: 5 });
    expect(() => hodgesLehmann([1, 2], { side: "left" as never })).toThrow(RangeError);
  });
});
