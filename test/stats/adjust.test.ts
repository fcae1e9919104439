import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { adjustPValues } from "../../src/stats/adjust";
import type { AdjustMethod } from "../../src/stats/types";
import fixture from "../fixtures/adjust.json";

const METHODS: AdjustMethod[] = ["holm", "bonferroni", "hochberg", "bh", "by"];

type FixtureSet = { p: (number | null)[] } & Record<AdjustMethod, (number | null)[]>;
const sets = (fixture as { sets: FixtureSet[] }).sets;
const toNumbers = (v: (number | null)[]) => v.map((x) => (x === null ? NaN : x));

describe("adjustPValues against R 4.2 p.adjust (fixture test/fixtures/adjust.R)", () => {
  for (const method of METHODS) {
    it(`${method}: ${sets.length} generated sets, NaN entries kept and not counted`, () => {
      let worst = 0;
      for (const set of sets) {
        const got = adjustPValues(toNumbers(set.p), method);
        const want = toNumbers(set[method]);
        expect(got.length).toBe(want.length);
        for (let i = 0; i < want.length; i++) {
          if (Number.isNaN(want[i])) {
            expect(got[i]).toBeNaN();
            continue;
          }
          const rel = want[i] === 0 ? Math.abs(got[i]) : Math.abs(got[i] - want[i]) / want[i];
          worst = Math.max(worst, rel);
        }
      }
      console.log(`adjust ${method}: worst relative error vs R p.adjust ${worst.toExponential(2)}`);
      // R sums 1/j for BY in long double; otherwise the same operations in the same order.
      expect(worst).toBeLessThanOrEqual(method === "by" ? 1e-14 : 0);
    });
  }
});

describe("adjustPValues by hand", () => {
  // Worked by hand from the definitions (Holm 1979; Benjamini & Hochberg 1995).
  it("holm and bh on three values with a NaN", () => {
    expect(Array.from(adjustPValues([0.01, 0.04, 0.03, NaN], "holm"))).toEqual([0.03, 0.06, 0.06, NaN]);
    expect(Array.from(adjustPValues([0.01, 0.04, 0.03], "bh"))).toEqual([0.03, 0.04, 0.04]);
  });
  it("defaults to holm; empty and all-NaN inputs give NaN only", () => {
    expect(Array.from(adjustPValues([0.02, 0.5]))).toEqual(Array.from(adjustPValues([0.02, 0.5], "holm")));
    expect(adjustPValues([]).length).toBe(0);
    expect(Array.from(adjustPValues([NaN, NaN], "by"))).toEqual([NaN, NaN]);
  });
  it("rejects p outside [0, 1] and unknown methods", () => {
    expect(() => adjustPValues([0.2, 1.5])).toThrow(RangeError);
    expect(() => adjustPValues([-0.1])).toThrow(RangeError);
    expect(() => adjustPValues([0.1], "sidak" as AdjustMethod)).toThrow(RangeError);
  });
});

/**
 * The definitions applied literally (sort the indices with a comparison, then the running maximum or
 * minimum), as a reference for the radix-sorted version on inputs larger than the R fixture's sets.
 */
function byDefinition(p: number[], method: AdjustMethod): number[] {
  const present = p.map((_, i) => i).filter((i) => !Number.isNaN(p[i]));
  const m = present.length;
  const out = p.map(() => NaN);
  if (method === "bonferroni") {
    for (const i of present) out[i] = Math.min(1, m * p[i]);
    return out;
  }
  const order = present.sort((a, b) => p[a] - p[b]);
  if (method === "holm") {
    let running = 0;
    order.forEach((i, r) => (out[i] = Math.min(1, (running = Math.max(running, (m - r) * p[i])))));
    return out;
  }
  let harmonic = 1;
  if (method === "by") {
    harmonic = 0;
    for (let j = 1; j <= m; j++) harmonic += 1 / j;
  }
  let running = Infinity;
  for (let r = m - 1; r >= 0; r--) {
    const scaled = method === "hochberg" ? (m - r) * p[order[r]] : ((harmonic * m) / (r + 1)) * p[order[r]];
    out[order[r]] = Math.min(1, (running = Math.min(running, scaled)));
  }
  return out;
}

describe("adjustPValues on large sets, against the definitions applied literally", () => {
  it("agrees exactly on 20,000 p-values with ties, zeros, -0, ones, tiny values and blanks", () => {
    let seed = 7;
    const next = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32;
    const p = Array.from({ length: 20000 }, (_, i) =>
      i % 97 === 0 ? NaN : i % 89 === 0 ? -0 : i % 83 === 0 ? 1 : i % 79 === 0 ? 1e-300 * next() : i % 7 === 0 ? 0.05 : next(),
    );
    // -0 is adjusted as 0 (a cell shows both as 0; the sign of a zero p-value means nothing).
    const plus = p.map((x) => x + 0);
    for (const method of METHODS) expect([method, ...adjustPValues(p, method)]).toEqual([method, ...byDefinition(plus, method)]);
  });

  it("agrees exactly when most p-values share their leading bits (the ordering's slower path)", () => {
    // 0.05 + k 2^-60: all share sign, exponent and the first 20 fraction bits, so only the low word orders them.
    const p = Array.from({ length: 5000 }, (_, i) => 0.05 + ((i * 7919) % 5000) * 2 ** -60);
    for (const method of METHODS) expect([method, ...adjustPValues(p, method)]).toEqual([method, ...byDefinition(p, method)]);
  });
});

describe("adjustPValues properties (fast-check)", () => {
  const pvals = fc.array(fc.oneof(fc.double({ min: 0, max: 1, noNaN: true }), fc.constant(NaN)), { maxLength: 40 });
  it("adjusted values lie in [p, 1], keep the order of the raw values, and bonferroni >= holm >= hochberg >= bh", () => {
    fc.assert(
      fc.property(pvals, (p) => {
        const adj = Object.fromEntries(METHODS.map((m) => [m, adjustPValues(p, m)])) as Record<AdjustMethod, Float64Array>;
        for (let i = 0; i < p.length; i++) {
          if (Number.isNaN(p[i])) {
            for (const m of METHODS) expect(adj[m][i]).toBeNaN();
            continue;
          }
          for (const m of METHODS) {
            expect(adj[m][i]).toBeGreaterThanOrEqual(p[i] * (1 - 1e-15));
            expect(adj[m][i]).toBeLessThanOrEqual(1);
          }
          // Common practice (each step-up/step-down procedure is uniformly more powerful than the previous).
          expect(adj.bonferroni[i]).toBeGreaterThanOrEqual(adj.holm[i] * (1 - 1e-15));
          expect(adj.holm[i]).toBeGreaterThanOrEqual(adj.hochberg[i] * (1 - 1e-15));
          expect(adj.hochberg[i]).toBeGreaterThanOrEqual(adj.bh[i] * (1 - 1e-15));
          expect(adj.by[i]).toBeGreaterThanOrEqual(adj.bh[i] * (1 - 1e-15));
          for (let j = 0; j < p.length; j++) {
            if (Number.isNaN(p[j]) || !(p[i] < p[j])) continue;
            for (const m of METHODS) expect(adj[m][i]).toBeLessThanOrEqual(adj[m][j]);
          }
        }
      }),
      { numRuns: 300 },
    );
  });
});
