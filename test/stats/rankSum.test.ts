import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { EXACT_AUTO_SIZE, rankSumTest, type RankSumResult } from "../../src/stats/rankSum";
import { mannWhitneyNullCdf, subsetSumNullCdf } from "../../src/stats/rankSumNull";
import type { Alternative } from "../../src/stats/types";

function available(r: ReturnType<typeof rankSumTest>): RankSumResult {
  if (!r.available) throw new Error(r.message);
  return r;
}

/** Every way of choosing `size` of `items` positions (brute-force enumeration). */
function* subsets(items: number, size: number, start = 0, chosen: number[] = []): Generator<number[]> {
  if (chosen.length === size) {
    yield chosen;
    return;
  }
  for (let i = start; i <= items - (size - chosen.length); i++) yield* subsets(items, size, i + 1, [...chosen, i]);
}

/**
 * The exact p-value by brute-force enumeration: every assignment of the pooled values to the second
 * group is equally likely under the null hypothesis; U counts pairs second > first, ties 1/2.
 */
function bruteForceP(first: number[], second: number[], alternative: Alternative): number {
  const pooled = [...first, ...second];
  const n = second.length;
  const uOf = (x: number[], y: number[]) => {
    let u = 0;
    for (const b of y) for (const a of x) u += b > a ? 1 : b === a ? 0.5 : 0;
    return u;
  };
  const observed = uOf(first, second);
  let below = 0;
  let above = 0;
  let all = 0;
  for (const chosen of subsets(pooled.length, n)) {
    const set = new Set(chosen);
    const u = uOf(
      pooled.filter((_, i) => !set.has(i)),
      chosen.map((i) => pooled[i]),
    );
    all++;
    if (u <= observed + 1e-9) below++;
    if (u >= observed - 1e-9) above++;
  }
  if (alternative === "less") return below / all;
  if (alternative === "greater") return above / all;
  return Math.min(1, (2 * Math.min(below, above)) / all);
}

/**
 * The exact conditional p-value with ties by exact integer arithmetic: BigInt counts of the size-n subsets of
 * the pooled values by their sum of doubled mid-ranks (a plain recursion over every row and sum), so that
 * groups far too large to enumerate are checked at the sizes `auto` now reaches.
 */
function bigIntP(first: number[], second: number[], alternative: Alternative): number {
  const pooled = [...first, ...second].map((value, i) => ({ value, second: i >= first.length })).sort((a, b) => a.value - b.value);
  const scores: number[] = [];
  for (let i = 0; i < pooled.length;) {
    let j = i;
    while (j < pooled.length && pooled[j].value === pooled[i].value) j++;
    for (let k = i; k < j; k++) scores.push(i + j + 1); // doubled mid-rank of positions i+1..j
    i = j;
  }
  const observed = pooled.reduce((sum, item, i) => sum + (item.second ? scores[i] : 0), 0);
  const n = second.length;
  const top = scores.reduce((a, b) => a + b, 0);
  let rows = Array.from({ length: n + 1 }, () => new Array<bigint>(top + 1).fill(0n));
  rows[0][0] = 1n;
  for (const s of scores) {
    const next = rows.map((row) => row.slice());
    for (let k = 1; k <= n; k++) for (let w = s; w <= top; w++) next[k][w] += rows[k - 1][w - s];
    rows = next;
  }
  let below = 0n;
  let above = 0n;
  let all = 0n;
  rows[n].forEach((count, w) => {
    all += count;
    if (w <= observed) below += count;
    if (w >= observed) above += count;
  });
  const ratio = (part: bigint): number => Number((part * 10n ** 30n) / all) / 1e30;
  if (alternative === "less") return ratio(below);
  if (alternative === "greater") return ratio(above);
  return Math.min(1, 2 * Math.min(ratio(below), ratio(above)));
}

describe("exact null distributions against brute-force enumeration", () => {
  it("mannWhitneyNullCdf counts every arrangement (sizes up to 7 and 6)", () => {
    for (let m = 1; m <= 7; m++) {
      for (let n = 1; n <= 6; n++) {
        const counts = new Array(m * n + 1).fill(0);
        let all = 0;
        for (const chosen of subsets(m + n, n)) {
          // U = sum of the second group's ranks less n(n+1)/2
          counts[chosen.reduce((a, i) => a + i + 1, 0) - (n * (n + 1)) / 2]++;
          all++;
        }
        const cdf = mannWhitneyNullCdf(m, n, m * n);
        let running = 0;
        for (let u = 0; u <= m * n; u++) {
          running += counts[u];
          expect(cdf[u]).toBeCloseTo(running / all, 14);
        }
      }
    }
  });

  it("mannWhitneyNullCdf agrees with BigInt arithmetic (exact integers) at 100 and 100, to 1e-14 relative", () => {
    const m = 100;
    const n = 100;
    const cap = (m * n) / 2;
    const c: bigint[] = new Array(cap + 1).fill(0n);
    c[0] = 1n;
    for (let i = 1; i <= m; i++) {
      for (let u = cap; u >= n + i; u--) c[u] -= c[u - n - i];
      for (let u = i; u <= cap; u++) c[u] += c[u - i];
    }
    let total = 1n;
    for (let i = 1; i <= m; i++) total = (total * BigInt(n + i)) / BigInt(i);
    const cdf = mannWhitneyNullCdf(m, n, cap);
    for (let u = 0; u <= cap; u += 97) {
      const running = c.slice(0, u + 1).reduce((a, b) => a + b, 0n);
      const exact = Number(running) / Number(total); // each conversion rounds by at most 2^-53 relative
      expect(Math.abs(cdf[u] - exact) / exact).toBeLessThan(1e-14);
    }
  });

  it("subsetSumNullCdf matches enumeration on tied scores", () => {
    const scores = [0, 1, 1, 3, 3, 3, 6, 8, 8];
    for (let size = 0; size <= scores.length; size++) {
      const max = scores.reduce((a, b) => a + b, 0);
      const counts = new Array(max + 1).fill(0);
      let all = 0;
      for (const chosen of subsets(scores.length, size)) {
        counts[chosen.reduce((a, i) => a + scores[i], 0)]++;
        all++;
      }
      const cdf = subsetSumNullCdf(scores, size, max);
      let running = 0;
      for (let w = 0; w <= max; w++) {
        running += counts[w];
        expect(cdf[w]).toBeCloseTo(running / all, 14);
      }
    }
  });

  it("rankSumTest's exact p-values, with and without ties, match enumeration (groups of 1 to 6)", () => {
    const value = fc.integer({ min: 0, max: 6 }).map((k) => k / 2);
    fc.assert(
      fc.property(
        fc.array(value, { minLength: 1, maxLength: 6 }),
        fc.array(value, { minLength: 1, maxLength: 6 }),
        fc.constantFrom<Alternative>("two-sided", "greater", "less"),
        (first, second, alternative) => {
          const r = available(rankSumTest(first, second, { alternative, method: "exact" }));
          expect(r.method).toBe("exact");
          expect(r.pValue).toBeCloseTo(bruteForceP(first, second, alternative), 12);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("rankSumTest's exact p-values with ties at larger sizes", () => {
  it("match exact integer arithmetic (BigInt counts) for groups of 12 to 30 with many ties", () => {
    let next = 17;
    const uniform = (): number => ((next = (next * 48271) % 2147483647) - 1) / 2147483646; // Park-Miller, seeded
    for (const [m, n] of [
      [12, 14],
      [20, 17],
      [25, 30],
      [30, 30],
    ]) {
      // Invented readings on a coarse scale (whole units from 0 to 9), so most values are shared.
      const first = Array.from({ length: m }, () => Math.floor(uniform() * 10));
      const second = Array.from({ length: n }, () => Math.floor(uniform() * 10 + uniform() * 2));
      for (const alternative of ["two-sided", "greater", "less"] as const) {
        const r = available(rankSumTest(first, second, { alternative }));
        expect(r.method).toBe("exact");
        expect(r.tiesPresent).toBe(true);
        const exact = bigIntP(first, second, alternative);
        expect(Math.abs(r.pValue - exact) / exact, `${m} + ${n} ${alternative}`).toBeLessThan(1e-12);
      }
    }
  });
});

describe("rankSumTest", () => {
  it("gives the documented example: U = 11, p = 2/35 (exact arithmetic)", () => {
    const r = available(rankSumTest([1.1, 2.4, 3.0], [2.9, 4.2, 5.5, 6.1], { alternative: "greater" }));
    expect(r.statistic).toBe(11);
    expect(r.pValue).toBeCloseTo(2 / 35, 15);
  });

  it("swapping the groups flips the alternative and the sign of the shift", () => {
    const value = fc.double({ min: -50, max: 50, noNaN: true }).map((v) => Math.round(v * 4) / 4);
    fc.assert(
      fc.property(
        fc.array(value, { minLength: 1, maxLength: 30 }),
        fc.array(value, { minLength: 1, maxLength: 30 }),
        fc.constantFrom(0, 1.5, -2),
        fc.constantFrom<"auto" | "normal">("auto", "normal"),
        (x, y, shift, method) => {
          const forward = available(rankSumTest(x, y, { shift, alternative: "greater", method }));
          // second − first > shift  <=>  first − second < −shift; moving first by −shift is moving second by +shift
          const back = available(
            rankSumTest(
              y.map((v) => v - shift),
              x,
              { alternative: "less", method },
            ),
          );
          expect(back.pValue).toBeCloseTo(forward.pValue, 12);
          const two = available(rankSumTest(x, y, { shift, method }));
          const twoBack = available(
            rankSumTest(
              y.map((v) => v - shift),
              x,
              { method },
            ),
          );
          expect(twoBack.pValue).toBeCloseTo(two.pValue, 12);
        },
      ),
      { numRuns: 150 },
    );
  });

  it("auto is exact without ties up to EXACT_AUTO_SIZE values and normal beyond, and says so", () => {
    const half = EXACT_AUTO_SIZE / 2;
    const x = Array.from({ length: half }, (_, i) => 2 * i);
    const y = Array.from({ length: half }, (_, i) => 2 * i + 1.5);
    expect(available(rankSumTest(x, y)).method).toBe("exact");
    expect(available(rankSumTest([...x, -1], y)).method).toBe("normal");
    expect(available(rankSumTest(x, y, { method: "normal" })).method).toBe("normal");
  });

  it("every value tied gives p = 1 by each method", () => {
    for (const method of ["exact", "normal"] as const) {
      for (const alternative of ["two-sided", "greater", "less"] as const) {
        expect(available(rankSumTest([5, 5], [5, 5, 5], { method, alternative })).pValue).toBe(1);
      }
    }
  });

  it("refuses an empty group with a message, and a shift that overflows", () => {
    const r = rankSumTest([], [1]);
    expect(r.available).toBe(false);
    expect(rankSumTest([1], [-1.7e308], { shift: 1.7e308 }).available).toBe(false);
  });
});
