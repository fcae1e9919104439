import { describe, expect, it } from "vitest";
import { sprt, sprtCharacteristic, sprtLimits, sprtWaldApproximation } from "../../src/stats/sprt";
import { xorshift32 } from "../../src/stats/xorshift";

describe("SPRT: limits and the decision along the rows (Wald 1945, worked by hand)", () => {
  it("limits are log((1 − beta)/alpha) and log(beta/(1 − alpha)); steps log(2 p) and log(2 (1 − p))", () => {
    const l = sprtLimits(0.75, 0.05, 0.2);
    expect(l.rejectAt).toBeCloseTo(Math.log(16), 15);
    expect(l.acceptAt).toBeCloseTo(Math.log(0.2 / 0.95), 15);
    expect(l.stepAbove).toBeCloseTo(Math.log(1.5), 15);
    expect(l.stepBelow).toBeCloseTo(Math.log(0.5), 15);
    expect(() => sprtLimits(0.5)).toThrow(RangeError);
    expect(() => sprtLimits(0.75, 0.6, 0.5)).toThrow(RangeError);
  });

  it("continues, then rejects at the first row where the ratio reaches the upper limit, and stops there", () => {
    // 1.5^k >= 16 first at k = 7 (1.5^7 ≈ 17.1); ties (50) are left out but counted in the rows read.
    const data = [51, 52, 50, 53, 54, 55, 56, 57, 40, 40, 40];
    const early = sprt(data.slice(0, 5), 50, { pAbove: 0.75 });
    expect([early.decision, early.rowsUsed, early.above, early.below]).toEqual(["continue", 5, 4, 0]);
    const r = sprt(data, 50, { pAbove: 0.75 });
    expect([r.decision, r.rowsUsed, r.above, r.below]).toEqual(["reject", 8, 7, 0]);
    expect(r.logLikelihoodRatio).toBeCloseTo(7 * Math.log(1.5), 14);
  });

  it("accepts when values fall below: 0.5^k <= 0.2/0.95 first at k = 3", () => {
    const r = sprt([45, 46, 47, 60], 50, { pAbove: 0.75 });
    expect([r.decision, r.rowsUsed]).toEqual(["accept", 3]);
    // A stated alternative below the median (p_above < 1/2) mirrors it.
    expect(sprt([45, 46, 47, 44, 43, 42, 41], 50, { pAbove: 0.25 }).decision).toBe("reject");
    expect(sprt([], 50, { pAbove: 0.75 }).decision).toBe("continue");
  });
});

describe("SPRT: the exact operating characteristic against enumeration of every sign sequence (BigInt probabilities)", () => {
  /** Sums, over all 2^K sequences, the exact probability p^a (1 − p)^(K − a) of each, by the decision sprt() reaches on it. */
  function enumerate(K: number, num: number, den: number, pAbove: number, alpha: number, beta: number) {
    let accept = 0n;
    let reject = 0n;
    let rows = 0n;
    const total = BigInt(den) ** BigInt(K);
    for (let bits = 0; bits < 1 << K; bits++) {
      const values: number[] = [];
      let above = 0;
      for (let k = 0; k < K; k++) {
        const up = (bits >> k) & 1;
        above += up;
        values.push(up ? 1 : -1);
      }
      const weight = BigInt(num) ** BigInt(above) * BigInt(den - num) ** BigInt(K - above);
      const r = sprt(values, 0, { pAbove, alpha, beta });
      if (r.decision === "accept") accept += weight;
      if (r.decision === "reject") reject += weight;
      rows += weight * BigInt(r.rowsUsed);
    }
    const asNumber = (x: bigint) => Number((x * 10n ** 18n) / total) / 1e18;
    return { accept: asNumber(accept), reject: asNumber(reject), averageRows: asNumber(rows) };
  }

  it("agrees within 1e-14 after 14 rows for three designs at p = 1/2, 3/5 and 3/4", () => {
    for (const [pAbove, alpha, beta] of [
      [0.75, 0.05, 0.2],
      [0.6, 0.1, 0.1],
      [0.3, 0.05, 0.1],
    ]) {
      const limits = sprtLimits(pAbove, alpha, beta);
      for (const [num, den] of [
        [1, 2],
        [3, 5],
        [3, 4],
      ]) {
        const truth = enumerate(14, num, den, pAbove, alpha, beta);
        const ours = sprtCharacteristic(num / den, limits, 14);
        expect(ours.method).toBe("exact");
        expect(Math.abs(ours.accept - truth.accept), `${pAbove} at ${num}/${den}`).toBeLessThan(1e-14);
        expect(Math.abs(ours.reject - truth.reject)).toBeLessThan(1e-14);
        expect(Math.abs(ours.averageRows - truth.averageRows)).toBeLessThan(1e-13);
        expect(Math.abs(ours.accept + ours.reject + ours.undecided - 1)).toBeLessThan(1e-14);
      }
    }
  });
});

describe("SPRT: achieved error rates within Wald's bounds", () => {
  const designs: [number, number, number][] = [
    [0.75, 0.05, 0.2],
    [0.6, 0.05, 0.1],
    [0.55, 0.01, 0.05],
    [0.9, 0.1, 0.1],
    [0.35, 0.05, 0.2],
  ];

  it("exactly (dynamic programme): alpha' <= alpha/(1 − beta), beta' <= beta/(1 − alpha), alpha' + beta' <= alpha + beta", () => {
    for (const [pAbove, alpha, beta] of designs) {
      const limits = sprtLimits(pAbove, alpha, beta);
      const atNull = sprtCharacteristic(0.5, limits);
      const atAlternative = sprtCharacteristic(pAbove, limits);
      expect(atNull.method).toBe("exact");
      expect(atNull.undecided).toBeLessThan(1e-14);
      const achievedAlpha = atNull.reject;
      const achievedBeta = atAlternative.accept;
      console.log(
        `SPRT p_above ${pAbove}, alpha ${alpha}, beta ${beta}: achieved alpha ${achievedAlpha.toFixed(4)}, beta ${achievedBeta.toFixed(4)}; average rows ${atNull.averageRows.toFixed(1)} under H0, ${atAlternative.averageRows.toFixed(1)} at p_above (exact)`,
      );
      expect(achievedAlpha).toBeLessThanOrEqual(alpha / (1 - beta));
      expect(achievedBeta).toBeLessThanOrEqual(beta / (1 - alpha));
      expect(achievedAlpha + achievedBeta).toBeLessThanOrEqual(alpha + beta);
    }
  });

  it("by Monte Carlo (seeded xorshift32, 4,000 runs each way), agreeing with the exact figures", () => {
    const [pAbove, alpha, beta] = designs[0];
    const limits = sprtLimits(pAbove, alpha, beta);
    const next = xorshift32(1945);
    const runs = 4000;
    const values = new Float64Array(400);
    const rate = (p: number, decision: string) => {
      let hits = 0;
      for (let k = 0; k < runs; k++) {
        for (let i = 0; i < values.length; i++) values[i] = next() < p ? 1 : -1;
        if (sprt(values, 0, { pAbove, alpha, beta }).decision === decision) hits++;
      }
      return hits / runs;
    };
    const achievedAlpha = rate(0.5, "reject");
    const achievedBeta = rate(pAbove, "accept");
    const exactAlpha = sprtCharacteristic(0.5, limits).reject;
    const exactBeta = sprtCharacteristic(pAbove, limits).accept;
    console.log(
      `SPRT Monte Carlo, ${runs} runs: alpha ${achievedAlpha.toFixed(4)} (exact ${exactAlpha.toFixed(4)}), beta ${achievedBeta.toFixed(4)} (exact ${exactBeta.toFixed(4)})`,
    );
    const se = (x: number) => Math.sqrt((x * (1 - x)) / runs);
    expect(Math.abs(achievedAlpha - exactAlpha)).toBeLessThan(4 * se(exactAlpha));
    expect(Math.abs(achievedBeta - exactBeta)).toBeLessThan(4 * se(exactBeta));
    expect(achievedAlpha).toBeLessThanOrEqual(alpha / (1 - beta) + 3 * se(alpha));
    expect(achievedBeta).toBeLessThanOrEqual(beta / (1 - alpha) + 3 * se(beta));
  });

  it("Wald's approximations where the exact sum is too long, and near the exact sum where both run", () => {
    const tiny = sprtLimits(0.5005, 0.05, 0.2);
    const wald = sprtCharacteristic(0.5, tiny);
    expect(wald.method).toBe("wald");
    // At p = 1/2, h = 1 exactly, so L = (A − 1)/(A − B) with A = 0.8/0.05, B = 0.2/0.95 (Wald 1945).
    const A = 0.8 / 0.05;
    const B = 0.2 / 0.95;
    expect(wald.accept).toBeCloseTo((A - 1) / (A - B), 6);
    // At p = p_above, h = −1: L = (1/A − 1)/(1/A − 1/B) = B (A − 1)/(A − B).
    expect(sprtWaldApproximation(0.5005, tiny).accept).toBeCloseTo((B * (A - 1)) / (A - B), 6);
    // Small steps overshoot little, so the approximation is close to the exact figure.
    const limits = sprtLimits(0.55, 0.05, 0.1);
    let worst = 0;
    for (const p of [0.45, 0.5, 0.525, 0.55, 0.6]) {
      const exact = sprtCharacteristic(p, limits);
      expect(exact.method).toBe("exact");
      const approximate = sprtWaldApproximation(p, limits);
      worst = Math.max(worst, Math.abs(exact.accept - approximate.accept));
      expect(Math.abs(exact.averageRows - approximate.averageRows) / exact.averageRows).toBeLessThan(0.1);
    }
    console.log(`SPRT p_above 0.55: Wald's operating characteristic within ${worst.toFixed(4)} of the exact one at p = 0.45 to 0.6`);
    expect(worst).toBeLessThan(0.02);
  });
});
