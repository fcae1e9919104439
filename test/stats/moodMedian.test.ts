import { describe, expect, it } from "vitest";
import { fisherExactPValue, hypergeometricDraw } from "../../src/stats/fisherExact";
import { kruskalWallisTest } from "../../src/stats/kruskalWallis";
import { MONTE_CARLO_MAX_VALUES, moodMedianTest, REPLICATES, type MoodMedianResult } from "../../src/stats/moodMedian";

function available(r: ReturnType<typeof moodMedianTest>): MoodMedianResult {
  if (!r.available) throw new Error(r.message);
  return r;
}

function choose(n: number, k: number): number {
  let c = 1;
  for (let i = 1; i <= k; i++) c = (c * (n - k + i)) / i;
  return c;
}

/** Pearson's statistic of a 2 x k table, written out again for the enumeration. */
function pearson(top: number[], sizes: number[]): number {
  const total = sizes.reduce((a, b) => a + b, 0);
  const t = top.reduce((a, b) => a + b, 0);
  return sizes.reduce((s, size, j) => {
    const e1 = (size * t) / total;
    const e2 = size - e1;
    return s + (top[j] - e1) ** 2 / e1 + (size - top[j] - e2) ** 2 / e2;
  }, 0);
}

/** The exact conditional p-value: every 2 x k table with the margins, weighted by its hypergeometric probability (brute-force enumeration). */
function exactP(top: number[], sizes: number[]): number {
  const total = sizes.reduce((a, b) => a + b, 0);
  const t = top.reduce((a, b) => a + b, 0);
  const observed = pearson(top, sizes);
  let p = 0;
  const walk = (j: number, left: number, chosen: number[]) => {
    if (j === sizes.length - 1) {
      if (left > sizes[j]) return;
      const table = [...chosen, left];
      const weight = table.reduce((w, x, i) => w * choose(sizes[i], x), 1) / choose(total, t);
      if (pearson(table, sizes) >= observed * (1 - 1e-12)) p += weight;
      return;
    }
    for (let x = 0; x <= Math.min(left, sizes[j]); x++) walk(j + 1, left - x, [...chosen, x]);
  };
  walk(0, t, []);
  return p;
}

describe("Fisher's exact test and the hypergeometric draw", () => {
  it("gives 17/70 and 34/70 on [[3, 1], [1, 3]] (exact arithmetic: C(4, a) C(4, 4 - a) / 70)", () => {
    expect(fisherExactPValue(3, 1, 1, 3, "greater")).toBeCloseTo(17 / 70, 15);
    expect(fisherExactPValue(3, 1, 1, 3, "less")).toBeCloseTo(69 / 70, 15);
    expect(fisherExactPValue(3, 1, 1, 3)).toBeCloseTo(34 / 70, 15);
  });

  it("draws each count with its hypergeometric probability (inverse distribution function at the cut points)", () => {
    // Margins 3, 4 of 9: P(X = x) = C(4, x) C(5, 3 - x) / 84 = 10, 40, 30, 4 (/84).
    const cuts = [10 / 84, 50 / 84, 80 / 84];
    expect(hypergeometricDraw(3, 4, 9, cuts[0] - 1e-9)).toBe(0);
    expect(hypergeometricDraw(3, 4, 9, cuts[0] + 1e-9)).toBe(1);
    expect(hypergeometricDraw(3, 4, 9, cuts[1] + 1e-9)).toBe(2);
    expect(hypergeometricDraw(3, 4, 9, cuts[2] + 1e-9)).toBe(3);
  });
});

describe("Mood's median test", () => {
  it("two groups: the documented example gives 1/70 (Fisher, exact arithmetic)", () => {
    const r = available(
      moodMedianTest(
        [
          [1, 2, 3, 4],
          [5, 6, 7, 8],
        ],
        { alternative: "greater" },
      ),
    );
    expect(r.pooledMedian).toBe(4.5);
    expect(r.method).toBe("fisher");
    expect(r.pValue).toBeCloseTo(1 / 70, 15);
  });

  it("puts values equal to the pooled median where the chosen rule says, and says how many there were", () => {
    const groups = [
      [1, 2, 5, 5],
      [5, 8, 9],
    ]; // pooled median 5, three values equal to it
    const lower = available(moodMedianTest(groups));
    expect([lower.above, lower.notAbove, lower.equal]).toEqual([[0, 2], [4, 1], 3]);
    const upper = available(moodMedianTest(groups, { ties: "join-upper" }));
    expect([upper.above, upper.notAbove]).toEqual([
      [2, 3],
      [2, 0],
    ]);
    const out = available(moodMedianTest(groups, { ties: "leave-out" }));
    expect([out.above, out.notAbove]).toEqual([
      [0, 2],
      [2, 0],
    ]);
  });

  it("counts 0.1 + 0.2 as equal to a pooled median of 0.3, as the sheet shows them", () => {
    const r = available(
      moodMedianTest(
        [
          [0.1 + 0.2, 0.1],
          [0.3, 0.5, 0.6],
        ],
        { ties: "leave-out" },
      ),
    );
    expect(r.pooledMedian).toBeCloseTo(0.3, 15); // 0.1 + 0.2 itself, 0.30000000000000004
    expect(r.equal).toBe(2);
  });

  it("k groups with small expected counts: the seeded Monte Carlo p-value is within 4 standard errors of the exact one (enumeration)", () => {
    const cases = [
      [
        [1, 2, 3],
        [4, 5, 6, 7],
        [8, 9, 10],
      ],
      [
        [1, 9, 2, 8],
        [3, 7, 4],
        [5, 6, 10, 11, 12],
      ],
      [
        [1, 2],
        [3, 4, 5, 6, 7, 8],
        [9, 10, 11],
        [2.5, 12],
      ],
    ];
    for (const groups of cases) {
      const r = available(moodMedianTest(groups));
      expect(r.method).toBe("monte-carlo");
      const exact = exactP(
        r.above,
        r.above.map((a, j) => a + r.notAbove[j]),
      );
      const se = Math.sqrt((exact * (1 - exact)) / REPLICATES);
      expect(Math.abs(r.pValue - exact)).toBeLessThan(4 * se + 1 / REPLICATES);
      expect(available(moodMedianTest(groups)).pValue).toBe(r.pValue); // seeded: the same on recalculation
    }
  });

  it("k groups with large counts use the chi-square p-value, and say so", () => {
    const groups = [0, 1, 2].map((g) => Array.from({ length: 40 }, (_, i) => i + g * 3));
    expect(available(moodMedianTest(groups)).method).toBe("chi-square");
  });

  it("a small group among large ones is not simulated beyond MONTE_CARLO_MAX_VALUES values (chi-square, said so)", () => {
    const big = (shift: number) => Array.from({ length: MONTE_CARLO_MAX_VALUES }, (_, i) => i + shift);
    const r = available(moodMedianTest([big(0), big(5), [1, 2]]));
    expect(r.smallestExpected).toBeLessThan(5);
    expect(r.method).toBe("chi-square");
  });

  it("needs two groups with numbers", () => {
    expect(moodMedianTest([[1, 2, 3], []]).available).toBe(false);
  });
});

describe("Kruskal-Wallis", () => {
  it("gives H = 7.2 on three separated groups of three (exact arithmetic: 12/90 (36 + 225 + 576)/3 - 30)", () => {
    const r = kruskalWallisTest([
      [1, 2, 3],
      [4, 5, 6],
      [7, 8, 9],
    ]);
    if (!r.available) throw new Error(r.message);
    expect(r.statistic).toBeCloseTo(7.2, 12);
    expect(r.pValue).toBeCloseTo(Math.exp(-3.6), 14); // chi-square with 2 df: e^(-x/2)
  });

  it("does not depend on the order of the groups or of the values within them", () => {
    const a = kruskalWallisTest([
      [3, 1, 2, 2],
      [9, 5],
      [4, 4, 7],
    ]);
    const b = kruskalWallisTest([
      [4, 7, 4],
      [2, 2, 1, 3],
      [5, 9],
    ]);
    if (!a.available || !b.available) throw new Error("unavailable");
    expect(b.statistic).toBeCloseTo(a.statistic, 13);
  });

  it("refuses a single group and all-equal values", () => {
    expect(kruskalWallisTest([[1, 2, 3]]).available).toBe(false);
    expect(kruskalWallisTest([[2, 2], [2]]).available).toBe(false);
  });
});
