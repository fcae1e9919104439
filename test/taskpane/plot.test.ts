/**
 * Plot geometry. Tick steps per Heckbert (1990), "Nice numbers for graph
 * labels" (steps 1, 2, 5 × 10^k); the null-distribution bars against exact
 * binomial coefficients in BigInt (exact arithmetic): with p = 1/2 each bar is
 * C(n, k) / 2^n.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { lineScale, nullBars, niceTicks, stackDots, MAX_NULL_BARS } from "../../src/taskpane/plot";
import { binomialCoefficient as choose } from "../exact";

describe("ticks and scale", () => {
  it("uses nice steps inside the range", () => {
    expect(niceTicks(47.9, 54, 5)).toEqual([48, 50, 52, 54]);
    expect(niceTicks(0, 1, 5)).toEqual([0, 0.5, 1]);
    expect(niceTicks(0, 100, 6)).toEqual([0, 20, 40, 60, 80, 100]);
  });

  it("covers every value and mark, in order", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 40 }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        (values, mark) => {
          const scale = lineScale(values, [mark], 10, 290);
          for (const v of [...values, mark]) {
            expect(scale.x(v)).toBeGreaterThanOrEqual(10);
            expect(scale.x(v)).toBeLessThanOrEqual(290);
          }
          for (let i = 1; i < scale.ticks.length; i++) expect(scale.ticks[i]).toBeGreaterThan(scale.ticks[i - 1]);
        },
      ),
      { numRuns: 200 },
    );
  });

  it("stacks dots that would overlap", () => {
    const scale = lineScale([50, 51], [], 0, 100);
    expect(stackDots([50, 50, 51, 50], scale, 6).map((d) => [d.value, d.level])).toEqual([
      [50, 0],
      [50, 1],
      [50, 2],
      [51, 0],
    ]);
  });

  it("puts a dot that would stack above the ceiling at the ceiling", () => {
    const scale = lineScale([50, 51], [], 0, 100);
    expect(stackDots([50, 50, 50, 50, 51], scale, 6, 2).map((d) => d.level)).toEqual([0, 1, 2, 2, 0]);
  });
});

describe("null distribution bars", () => {
  it("are the exact binomial probabilities for p = 1/2", () => {
    for (const n of [1, 5, 22, 60]) {
      const bars = nullBars(n, 0.5, 3);
      const total = 2n ** BigInt(n);
      bars.forEach((b, k) => {
        const exact = Number(choose(n, k)) / Number(total);
        expect(Math.abs(b.probability - exact)).toBeLessThanOrEqual(1e-12 * Math.max(exact, 1e-300));
      });
      expect(bars.filter((b) => b.observed).map((b) => b.count)).toEqual(n >= 3 ? [3] : []);
    }
  });

  it("are left out when there is nothing to draw or too much", () => {
    expect(nullBars(0, 0.5, 0)).toEqual([]);
    expect(nullBars(MAX_NULL_BARS + 1, 0.5, 3)).toEqual([]);
  });
});
