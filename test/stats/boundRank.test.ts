/**
 * The rank of Hodges–Lehmann bounds from a null distribution. Expected values
 * by exact arithmetic: the signed-rank statistic V of n values takes 0 and 1
 * each in exactly one of the 2^n sign patterns, so P(V <= 0) = 2^-n and
 * P(V <= 1) = 2^-(n-1); for n = 5, V <= 2 in 3 of 32 patterns ({}, {1}, {2}) and
 * V <= 3 in 5 ({3} and {1, 2} besides).
 */
import { describe, expect, it } from "vitest";
import { boundRank } from "../../src/stats/boundRank";
import { signedRankNullCdf } from "../../src/stats/signedRank";

function signedRankNull(n: number, exact: boolean) {
  const scores = Array.from({ length: n }, (_, i) => i + 1);
  return {
    count: (n * (n + 1)) / 2,
    sd: Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24),
    exactCdf: exact ? (cap: number) => signedRankNullCdf(scores, cap) : undefined,
  };
}

describe("boundRank", () => {
  it("takes the extreme averages when only they reach the confidence, with their exact coverage 1 - 2 * 2^-n", () => {
    expect(boundRank(signedRankNull(5, true), 0.9, 2)).toEqual({ k: 1, achieved: 1 - 2 / 32, method: "exact" });
    // One-sided 90%: P(V <= 2) = 3/32 stays within 0.1, P(V <= 3) = 5/32 does not.
    expect(boundRank(signedRankNull(5, true), 0.9, 1)).toEqual({ k: 3, achieved: 1 - 3 / 32, method: "exact" });
  });

  it("answers null when even the extremes fall short: five values cannot give two-sided 95% (2 * 2^-5 > 0.05), six can", () => {
    expect(boundRank(signedRankNull(5, true), 0.95, 2)).toBeNull();
    expect(boundRank(signedRankNull(6, true), 0.95, 2)).toEqual({ k: 1, achieved: 1 - 2 / 64, method: "exact" });
  });

  it("never gives less coverage than asked for when exact, and the normal ranks come within a point of that coverage at n = 60", () => {
    for (const confidence of [0.8, 0.9, 0.95, 0.99]) {
      const exact = boundRank(signedRankNull(60, true), confidence, 2)!;
      const normal = boundRank(signedRankNull(60, false), confidence, 2)!;
      expect(exact.achieved).toBeGreaterThanOrEqual(confidence);
      expect(normal.method).toBe("normal");
      expect(Math.abs(exact.achieved - normal.achieved)).toBeLessThan(0.01);
    }
  });
});
