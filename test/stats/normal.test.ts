import { describe, it, expect } from "vitest";
import { normalLowerTail, normalQuantile, normalUpperTail, scaledErfc } from "../../src/stats/normal";
import fixture from "../fixtures/normal.json";

/** Smallest positive normal double: below it a result carries fewer than 53 significant bits. */
const MIN_NORMAL = 2.2250738585072014e-308;

function relativeError(ours: number, truth: number): number {
  if (ours === truth) return 0;
  return Math.abs(ours - truth) / Math.abs(truth);
}

describe("normal tails against R 4.2 pnorm (fixture test/fixtures/normal.R)", () => {
  it("lower and upper tails agree to 2e-15 relative, out to the smallest normal double", () => {
    let worst = 0;
    let worstAt = NaN;
    for (const row of fixture.cdf) {
      for (const [ours, truth] of [
        [normalLowerTail(row.z), row.lower],
        [normalUpperTail(row.z), row.upper],
      ]) {
        if (truth < MIN_NORMAL) {
          // R gives 0 or a subnormal here; we must not invent probability mass.
          expect(ours).toBeLessThan(1e-300);
          continue;
        }
        const err = relativeError(ours, truth);
        if (err > worst) [worst, worstAt] = [err, row.z];
      }
    }
    console.log(`normal tails vs R pnorm: worst relative error ${worst.toExponential(2)} at z = ${worstAt}`);
    expect(worst).toBeLessThan(2e-15);
  });

  it("the far upper tail is computed directly, not as 1 - lower (R: pnorm(10, lower.tail = FALSE))", () => {
    expect(relativeError(normalUpperTail(10), 7.6198530241605269e-24)).toBeLessThan(1e-15);
    expect(normalLowerTail(-10)).toBe(normalUpperTail(10));
  });

  it("tails of symmetric points sum to 1 and the density is symmetric (common practice)", () => {
    for (const z of [0, 0.1, 0.5, 0.66, 0.67, 1, 2, 3.9, 4.1, 6]) {
      expect(Math.abs(normalLowerTail(z) + normalUpperTail(z) - 1)).toBeLessThan(2e-16);
      expect(normalLowerTail(-z)).toBe(normalUpperTail(z));
    }
  });

  it("edge values", () => {
    expect(normalUpperTail(Infinity)).toBe(0);
    expect(normalUpperTail(-Infinity)).toBe(1);
    expect(normalLowerTail(0)).toBe(0.5);
    expect(Number.isNaN(normalUpperTail(NaN))).toBe(true);
  });
});

describe("normal quantile against R 4.2 qnorm (fixture test/fixtures/normal.R)", () => {
  it("matches to 2e-15 relative, including p = 2^-1074", () => {
    let worst = 0;
    let worstAt = NaN;
    for (const row of fixture.quantile) {
      const err = row.z === 0 ? Math.abs(normalQuantile(row.p)) : relativeError(normalQuantile(row.p), row.z);
      if (err > worst) [worst, worstAt] = [err, row.p];
    }
    console.log(`normal quantile vs R qnorm: worst relative error ${worst.toExponential(2)} at p = ${worstAt}`);
    expect(worst).toBeLessThan(2e-15);
  });

  it("inverts the lower tail (round trip, common practice)", () => {
    // Positive z go through the upper tail: 1 - tiny is not representable, so the lower tail cannot carry them.
    for (const z of [-37, -20, -8, -3, -1, -0.2, 0.2, 1]) {
      expect(Math.abs(normalQuantile(normalLowerTail(z)) - z)).toBeLessThan(1e-14 * Math.max(1, Math.abs(z)));
    }
    for (const z of [3, 8, 20, 37]) {
      expect(Math.abs(-normalQuantile(normalUpperTail(z)) - z)).toBeLessThan(1e-14 * z);
    }
  });

  it("ends and programmer errors", () => {
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(0.5)).toBe(0);
    expect(() => normalQuantile(-0.1)).toThrow(RangeError);
    expect(() => normalQuantile(1.5)).toThrow(RangeError);
    expect(() => normalQuantile(NaN)).toThrow(RangeError);
  });
});

describe("scaled complementary error function exp(x^2) erfc(x)", () => {
  it("matches R 4.2 (via log pnorm, fixture test/fixtures/normal.R) within 2e-15 (1 + x^2), R's own error growing like x^2", () => {
    let worst = 0;
    for (const row of fixture.scaledErfc) {
      const err = relativeError(scaledErfc(row.x), row.value) / (1 + row.x * row.x);
      worst = Math.max(worst, err);
    }
    console.log(`scaledErfc vs R: worst relative error / (1 + x^2) ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(2e-15);
  });

  it("follows the asymptotic series 1/(x sqrt(pi)) (1 - t + 3t^2 - 15t^3 + 105t^4), t = 1/(2x^2), far out (Abramowitz & Stegun 7.1.23, from memory)", () => {
    for (const x of [50, 300, 1e4, 1e8]) {
      const t = 1 / (2 * x * x);
      const series = (1 - t + 3 * t ** 2 - 15 * t ** 3 + 105 * t ** 4) / (x * Math.sqrt(Math.PI));
      expect(relativeError(scaledErfc(x), series)).toBeLessThan(2e-15);
    }
    expect(scaledErfc(0)).toBe(1);
    expect(() => scaledErfc(-1)).toThrow(RangeError);
    expect(() => scaledErfc(NaN)).toThrow(RangeError);
  });
});
