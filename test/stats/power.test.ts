import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { SAMPLE_SIZE_LIMIT, signTestPower, signTestSampleSize } from "../../src/stats/power";
import type { Alternative } from "../../src/stats/types";
import { ratioValue } from "./binomialReference";
import fixture from "../fixtures/power.json";

const ALTERNATIVES: Alternative[] = ["two-sided", "greater", "less"];

function relativeError(ours: number, truth: number): number {
  return ours === truth ? 0 : Math.abs(ours - truth) / Math.abs(truth);
}

/** The double x as an exact fraction num / 2^shift. */
function dyadic(x: number): { num: bigint; shift: number } {
  let shift = 0;
  while (!Number.isInteger(x)) {
    x *= 2;
    shift++;
  }
  return { num: BigInt(x), shift };
}

/**
 * Brute force: enumerate every count above (0..n), decide rejection by comparing its exact rational p-value with
 * the exact value of the double alpha, and sum the exact Bin(n, a/c) probabilities of the rejected counts.
 */
function bruteForce(n: number, a: number, c: number, alpha: number, alternative: Alternative) {
  const choose: bigint[] = [1n];
  for (let k = 0; k < n; k++) choose.push((choose[k] * BigInt(n - k)) / BigInt(k + 1));
  const atLeast = (s: number) => choose.slice(s).reduce((x, y) => x + y, 0n); // 2^n P0(S >= s)
  const { num, shift } = dyadic(alpha);
  // p-value <= alpha  <=>  sides * atLeast * 2^shift <= num * 2^n   (the cap at 1 never matters for alpha < 1)
  const rejects = (tail: bigint, sides: bigint) => sides * tail * (1n << BigInt(shift)) <= num * (1n << BigInt(n));
  const rejected: number[] = [];
  for (let above = 0; above <= n; above++) {
    const below = n - above;
    const reject =
      alternative === "greater"
        ? rejects(atLeast(above), 1n)
        : alternative === "less"
          ? rejects(atLeast(below), 1n)
          : rejects(atLeast(Math.max(above, below)), 2n);
    if (reject) rejected.push(above);
  }
  let powerNum = 0n;
  let nullNum = 0n;
  for (const k of rejected) {
    powerNum += choose[k] * BigInt(a) ** BigInt(k) * BigInt(c - a) ** BigInt(n - k);
    nullNum += choose[k];
  }
  return {
    power: ratioValue(powerNum, BigInt(c) ** BigInt(n)).value,
    attainedAlpha: ratioValue(nullNum, 1n << BigInt(n)).value,
    rejected,
  };
}

describe("sign-test power against brute-force enumeration with exact BigInt arithmetic", () => {
  it("power, attained alpha and rejection region for n <= 40", () => {
    let worst = 0;
    for (let n = 0; n <= 40; n++) {
      for (const [a, c] of [
        [4, 5],
        [3, 5],
        [1, 3],
        [1, 2],
        [19, 20],
      ] as const) {
        for (const alpha of [0.01, 0.05, 0.2]) {
          for (const alternative of ALTERNATIVES) {
            const ours = signTestPower(n, a / c, { alpha, alternative });
            const exact = bruteForce(n, a, c, alpha, alternative);
            const region: number[] = [];
            for (let k = 0; k <= n; k++) {
              if (
                (ours.rejectAtOrAbove !== null && k >= ours.rejectAtOrAbove) ||
                (ours.rejectAtOrBelow !== null && k <= ours.rejectAtOrBelow)
              )
                region.push(k);
            }
            expect(region, `n=${n} p=${a}/${c} alpha=${alpha} ${alternative}`).toEqual(exact.rejected);
            if (exact.power === 0) expect(ours.power).toBe(0);
            else worst = Math.max(worst, relativeError(ours.power, exact.power));
            if (exact.attainedAlpha === 0) expect(ours.attainedAlpha).toBe(0);
            else worst = Math.max(worst, relativeError(ours.attainedAlpha, exact.attainedAlpha));
          }
        }
      }
    }
    console.log(`sign-test power vs exact enumeration (n <= 40): worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-13);
  });
});

describe("sign-test power against R 4.2 pbinom (fixture test/fixtures/power.R)", () => {
  it(`${fixture.power.length} cases up to n = 1e7: same critical counts, power within 1e-11`, () => {
    let worst = 0;
    for (const c of fixture.power) {
      const ours = signTestPower(c.n, c.pAbove, { alpha: c.alpha, alternative: c.alternative as Alternative });
      const label = JSON.stringify(c);
      expect(ours.rejectAtOrAbove, label).toBe(c.rejectAtOrAbove);
      expect(ours.rejectAtOrBelow, label).toBe(c.rejectAtOrBelow);
      for (const [mine, theirs] of [
        [ours.power, c.power],
        [ours.attainedAlpha, c.attainedAlpha],
      ]) {
        if (theirs < 1e-300) expect(mine, label).toBeLessThan(1e-300);
        else worst = Math.max(worst, relativeError(mine, theirs));
      }
    }
    console.log(`sign-test power vs R: worst relative error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-11);
  });

  it(`${fixture.sampleSize.length} sample sizes: first n and stable n equal R's brute-force scan of a long range`, () => {
    let worst = 0;
    for (const c of fixture.sampleSize) {
      const result = signTestSampleSize(c.pAbove, { power: c.power, alpha: c.alpha, alternative: c.alternative as Alternative });
      const label = JSON.stringify(c);
      expect(result.available, label).toBe(true);
      if (!result.available) continue;
      expect(result.n, label).toBe(c.n);
      expect(result.stableN, label).toBe(c.stableN);
      expect(result.checkedThrough).toBeLessThanOrEqual(c.scannedTo); // R's scan covered our whole window and more
      worst = Math.max(worst, relativeError(result.power, c.powerAtN), relativeError(result.stablePower, c.powerAtStableN));
    }
    console.log(`sample sizes vs R: all equal; worst power error ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-11);
  });
});

describe("sign-test power properties (common practice)", () => {
  const setting = fc.record({
    n: fc.integer({ min: 0, max: 3000 }),
    pAbove: fc.double({ min: 0, max: 1, noNaN: true }),
    alpha: fc.double({ min: 0.001, max: 0.5, noNaN: true }),
    alternative: fc.constantFrom<Alternative>(...ALTERNATIVES),
  });

  it("power lies in [0, 1], attained alpha <= alpha, and at pAbove = 1/2 the power is the attained alpha", () => {
    fc.assert(
      fc.property(setting, ({ n, pAbove, alpha, alternative }) => {
        const r = signTestPower(n, pAbove, { alpha, alternative });
        expect(r.power).toBeGreaterThanOrEqual(0);
        expect(r.power).toBeLessThanOrEqual(1);
        expect(r.attainedAlpha).toBeLessThanOrEqual(alpha);
        const atNull = signTestPower(n, 0.5, { alpha, alternative });
        // The two sums run over the same terms in a different order: equal to a few ulps of the larger.
        expect(Math.abs(atNull.power - atNull.attainedAlpha)).toBeLessThanOrEqual(1e-14 * Math.max(atNull.power, 1e-300));
      }),
      { numRuns: 200 },
    );
  });

  it("one-sided power rises with pAbove in the direction of the alternative; two-sided is symmetric", () => {
    fc.assert(
      fc.property(setting, fc.double({ min: 0, max: 1, noNaN: true }), ({ n, pAbove, alpha }, other) => {
        const [lowP, highP] = pAbove < other ? [pAbove, other] : [other, pAbove];
        const greaterLow = signTestPower(n, lowP, { alpha, alternative: "greater" }).power;
        const greaterHigh = signTestPower(n, highP, { alpha, alternative: "greater" }).power;
        expect(greaterHigh).toBeGreaterThanOrEqual(greaterLow * (1 - 1e-12));
        const m = Math.round(pAbove * 2 ** 20) / 2 ** 20; // 1 - m is exact
        const left = signTestPower(n, m, { alpha }).power;
        const right = signTestPower(n, 1 - m, { alpha }).power;
        expect(Math.abs(left - right)).toBeLessThanOrEqual(1e-12 * Math.max(left, right) + 1e-300);
      }),
      { numRuns: 200 },
    );
  });

  it("reported sample sizes reach the target and the power never dips below it from stableN through checkedThrough", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.56, max: 0.99, noNaN: true }),
        fc.constantFrom(0.01, 0.05, 0.1),
        fc.double({ min: 0.5, max: 0.95, noNaN: true }),
        fc.constantFrom<Alternative>("two-sided", "greater"),
        (pAbove, alpha, power, alternative) => {
          const r = signTestSampleSize(pAbove, { alpha, power, alternative });
          expect(r.available).toBe(true);
          if (!r.available) return;
          expect(r.power).toBeGreaterThanOrEqual(power);
          expect(signTestPower(r.n - 1, pAbove, { alpha, alternative }).power).toBeLessThan(power);
          expect(r.stableN).toBeGreaterThanOrEqual(r.n);
          if (r.stableN > r.n) expect(signTestPower(r.stableN - 1, pAbove, { alpha, alternative }).power).toBeLessThan(power);
          for (let m = r.stableN; m <= r.checkedThrough; m += 7) {
            expect(signTestPower(m, pAbove, { alpha, alternative }).power).toBeGreaterThanOrEqual(power);
          }
        },
      ),
      { numRuns: 25 },
    );
  });
});

describe("sign-test power: examples, unavailable results and argument checks", () => {
  it("the documented examples (values from the R fixture)", () => {
    const r = signTestPower(20, 0.8);
    expect([r.rejectAtOrAbove, r.rejectAtOrBelow]).toEqual([15, 5]);
    expect(r.power).toBeCloseTo(0.80420796573594688, 14);
    const s = signTestSampleSize(0.8);
    expect(s.available && [s.n, s.stableN]).toEqual([20, 23]);
  });

  it("no rejection is possible with too few values: power 0, null counts", () => {
    const r = signTestPower(4, 0.9, { alpha: 0.05 }); // smallest two-sided p-value with 4 values is 2/16
    expect(r).toMatchObject({ power: 0, attainedAlpha: 0, rejectAtOrAbove: null, rejectAtOrBelow: null });
    expect(signTestPower(0, 0.9).power).toBe(0);
  });

  it("unreachable targets are Unavailable, not errors", () => {
    for (const [pAbove, alternative] of [
      [0.5, "two-sided"],
      [0.3, "greater"],
      [0.7, "less"],
      [0.5, "greater"],
    ] as const) {
      const r = signTestSampleSize(pAbove, { alternative });
      expect(r.available).toBe(false);
      if (!r.available) expect(r.reason).toBe("unreachable");
    }
    const tiny = signTestSampleSize(0.5001); // would need about 8e8 values
    expect(tiny.available).toBe(false);
    if (!tiny.available) expect(tiny.message).toContain(String(SAMPLE_SIZE_LIMIT));
  });

  it("large n is exact and quick (n = 1e9)", () => {
    const r = signTestPower(1e9, 0.5001);
    expect(r.rejectAtOrAbove! + r.rejectAtOrBelow!).toBe(1e9);
    expect(r.attainedAlpha).toBeLessThanOrEqual(0.05);
    expect(r.power).toBeGreaterThan(0.99);
  });

  it("programmer errors throw RangeError", () => {
    expect(() => signTestPower(2.5, 0.6)).toThrow(RangeError);
    expect(() => signTestPower(-1, 0.6)).toThrow(RangeError);
    expect(() => signTestPower(10, 1.5)).toThrow(RangeError);
    expect(() => signTestPower(10, 0.6, { alpha: 0 })).toThrow(RangeError);
    expect(() => signTestPower(10, 0.6, { alpha: 1 })).toThrow(RangeError);
    expect(() => signTestPower(10, 0.6, { alternative: "both" as Alternative })).toThrow(RangeError);
    expect(() => signTestSampleSize(0.6, { power: 1 })).toThrow(RangeError);
    expect(() => signTestSampleSize(NaN)).toThrow(RangeError);
  });
});
