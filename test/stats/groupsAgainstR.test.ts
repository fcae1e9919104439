/**
 * The two-group and many-group tests against R 4.2 (fixture test/fixtures/groups.R, written by
 * Debian's r-base-core): wilcox.test for two samples (exact and normal, with conf.int), fisher.test,
 * chisq.test, kruskal.test and pchisq.
 */
import { describe, expect, it } from "vitest";
import { chiSquareUpperTail } from "../../src/stats/chiSquare";
import { fisherExactPValue } from "../../src/stats/fisherExact";
import { kruskalWallisTest } from "../../src/stats/kruskalWallis";
import { moodMedianTest, type MedianTieRule } from "../../src/stats/moodMedian";
import { rankSumTest } from "../../src/stats/rankSum";
import { shiftBounds } from "../../src/stats/shiftBounds";
import type { Alternative } from "../../src/stats/types";
import fixture from "../fixtures/groups.json";

const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

describe("rank-sum test and shift bounds against R's wilcox.test, exact (no ties)", () => {
  it.each(fixture.rankSumExact.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const t = rankSumTest(c.first, c.second, { shift: c.shift, alternative: c.alternative as Alternative });
    if (!t.available) throw new Error(t.message);
    expect(t.method).toBe("exact");
    expect(t.statistic).toBe(c.statistic);
    expect(relative(t.pValue, c.pValue)).toBeLessThan(1e-12);
    const r = shiftBounds(c.first, c.second, { confidence: c.confidence });
    expect(r.available).toBe(c.interval.reachable);
    if (!r.available || !("k" in c.interval)) return;
    expect(r.boundRank).toBe(c.interval.k);
    expect(r.estimate).toBeCloseTo(c.interval.estimate as number, 12);
    expect(r.lower).toBeCloseTo(c.interval.lower as number, 12);
    expect(r.upper).toBeCloseTo(c.interval.upper as number, 12);
    expect(r.achievedConfidence).toBeCloseTo(c.interval.achieved as number, 14);
  });
});

describe("rank-sum test against R's wilcox.test, normal approximation with tie and continuity corrections", () => {
  it.each(fixture.rankSumNormal.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const t = rankSumTest(c.first, c.second, { shift: c.shift, alternative: c.alternative as Alternative, method: "normal" });
    if (!t.available) throw new Error(t.message);
    expect(t.statistic).toBe(c.statistic);
    expect(relative(t.pValue, c.pValue)).toBeLessThan(1e-9);
    if (c.interval === null) return;
    // R's normal-theory ends and estimate are roots found to 1e-4; ours are the differences of rank k.
    const r = shiftBounds(c.first, c.second);
    if (!r.available) throw new Error(r.message);
    expect(Math.abs(r.estimate - c.interval.estimate)).toBeLessThan(2e-3);
    if (r.method === "normal") {
      expect(Math.abs((r.lower as number) - c.interval.lower)).toBeLessThan(2e-3);
      expect(Math.abs((r.upper as number) - c.interval.upper)).toBeLessThan(2e-3);
    }
  });
});

describe("Fisher's exact test against R's fisher.test", () => {
  it.each(fixture.fisher.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const [a, b, cc, d] = c.table;
    expect(relative(fisherExactPValue(a, b, cc, d, c.alternative as Alternative), c.pValue)).toBeLessThan(1e-9);
  });
});

describe("Mood's median test against R's median, table, fisher.test and chisq.test", () => {
  it.each(fixture.mood.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const r = moodMedianTest(c.groups, { ties: c.ties as MedianTieRule, alternative: c.alternative as Alternative, method: "chi-square" });
    if (!r.available) throw new Error(r.message);
    expect(r.pooledMedian).toBe(c.median);
    expect(r.above).toEqual(c.above);
    expect(r.notAbove).toEqual(c.notAbove);
    expect(relative(r.statistic, c.statistic)).toBeLessThan(1e-12);
    if (c.groups.length === 2) expect(relative(r.pValue, c.fisherP as number)).toBeLessThan(1e-9);
    else expect(relative(r.pValue, c.chiSquareP)).toBeLessThan(1e-10);
  });
});

describe("Kruskal-Wallis against R's kruskal.test", () => {
  it.each(fixture.kruskalWallis.map((c, i) => [i, c] as const))("case %i", (_, c) => {
    const r = kruskalWallisTest(c.groups);
    if (!r.available) throw new Error(r.message);
    expect(relative(r.statistic, c.statistic)).toBeLessThan(1e-12);
    expect(r.degreesOfFreedom).toBe(c.df);
    expect(relative(r.pValue, c.pValue)).toBeLessThan(1e-10);
  });
});

describe("chi-square upper tail against R's pchisq", () => {
  it.each(fixture.chiSquare.map((c) => [c.x, c.df, c.upper] as const))("x = %d, df = %d", (x, df, upper) => {
    if (upper === 0) expect(chiSquareUpperTail(x, df)).toBeLessThan(1e-300);
    else expect(relative(chiSquareUpperTail(x, df), upper)).toBeLessThan(1e-10);
  });
});
