/**
 * The two-group and many-group tests against SciPy (fixture test/fixtures/groupsScipy.py, written by
 * Debian's python3-scipy): mannwhitneyu (exact and asymptotic with continuity correction), median_test
 * (each ties= option, Pearson's statistic without Yates's correction) and kruskal.
 */
import { describe, expect, it } from "vitest";
import { kruskalWallisTest } from "../../src/stats/kruskalWallis";
import { moodMedianTest, type MedianTieRule } from "../../src/stats/moodMedian";
import { rankSumTest } from "../../src/stats/rankSum";
import type { Alternative } from "../../src/stats/types";
import fixture from "../fixtures/groupsScipy.json";

const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

describe("rank-sum test against scipy.stats.mannwhitneyu", () => {
  it.each(fixture.rankSum.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const r = rankSumTest(c.first, c.second, { alternative: c.alternative as Alternative, method: c.method as "exact" | "normal" });
    if (!r.available) throw new Error(r.message);
    expect(r.statistic).toBe(c.statistic);
    expect(relative(r.pValue, c.pValue)).toBeLessThan(1e-9);
  });
});

describe("Mood's median test against scipy.stats.median_test", () => {
  it.each(fixture.median.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const r = moodMedianTest(c.groups, { ties: c.ties as MedianTieRule, method: "chi-square" });
    if (!r.available) throw new Error(r.message);
    expect(r.pooledMedian).toBe(c.median);
    expect(r.above).toEqual(c.above);
    expect(r.notAbove).toEqual(c.notAbove);
    expect(relative(r.statistic, c.statistic)).toBeLessThan(1e-12);
    expect(relative(r.pValue, c.pValue)).toBeLessThan(1e-9);
  });
});

describe("Kruskal-Wallis against scipy.stats.kruskal", () => {
  it.each(fixture.kruskal.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const r = kruskalWallisTest(c.groups);
    if (!r.available) throw new Error(r.message);
    expect(relative(r.statistic, c.statistic)).toBeLessThan(1e-12);
    expect(relative(r.pValue, c.pValue)).toBeLessThan(1e-9);
  });
});
