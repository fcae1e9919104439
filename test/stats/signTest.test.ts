import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { signTestFixture as fixtures } from "../fixtures/signTestFixture";
import { signTest, type SignTestResult } from "../../src/stats/signTest";
import type { SignCounts } from "../../src/stats/signCounts";
import type { Alternative, SignTestMethod } from "../../src/stats/types";
import { TRIOLA_A7, TRIOLA_ALPHAS } from "./signFamilyTables";
import {
  HALF,
  ONE,
  exactBinomial,
  exactLower,
  exactPmf,
  exactUpper,
  relativeError,
  subtract,
  times,
  toNumber,
  type Fraction,
} from "./signFamilyExact";

function run(counts: SignCounts, options: Parameters<typeof signTest>[1] = {}): SignTestResult {
  const r = signTest(counts, options);
  if (!r.available) throw new Error(`unexpectedly unavailable: ${r.message}`);
  return r;
}

function relErr(a: number, b: number): number {
  return a === b ? 0 : Math.abs(a - b) / Math.abs(b);
}

const ALTERNATIVES: readonly Alternative[] = ["two-sided", "greater", "less"];
const METHODS: readonly SignTestMethod[] = ["exact", "midp", "normal"];

describe("signTest against R 4.2 (test/fixtures/signTest.R: binom.test, pbinom/dbinom, prop.test)", () => {
  const cases = fixtures.sign;
  it(`matches ${cases.length} generated cases for every alternative and method`, () => {
    let worst = 0;
    for (const c of cases) {
      const counts = { below: c.below, tied: 0, above: c.above };
      const expected: Record<SignTestMethod, Record<Alternative, number | null>> = {
        exact: { greater: c.greater, less: c.less, "two-sided": c.twoSided },
        midp: { greater: c.midpGreater, less: c.midpLess, "two-sided": c.midpTwoSided },
        normal: { greater: c.normalGreater, less: c.normalLess, "two-sided": c.normalTwoSided },
      };
      for (const method of METHODS) {
        for (const alternative of ALTERNATIVES) {
          const want = expected[method][alternative];
          if (want === null) continue; // prop.test's one-sided correction differs on the far side (see the R script)
          const got = run(counts, { alternative, method }).pValue;
          const e = relErr(got, want);
          worst = Math.max(worst, e);
          if (e > 1e-11) expect({ ...c, method, alternative, got }).toEqual({ ...c, method, alternative, got: want });
        }
      }
    }
    expect(worst).toBeLessThan(1e-11);
  });
});

/** Exact p-values by BigInt rational arithmetic, for S ~ Bin(n, 1/2). */
function exactPValue(below: number, above: number, alternative: Alternative, midp: boolean): Fraction {
  const n = below + above;
  const dist = exactBinomial(n, 1, 2);
  const tail = (s: number): Fraction => (midp ? subtract(exactUpper(dist, s), times(HALF, exactPmf(dist, s))) : exactUpper(dist, s));
  if (alternative === "greater") return tail(above);
  if (alternative === "less") return tail(below);
  const doubled = times({ num: 2n, den: 1n }, tail(Math.max(below, above)));
  return doubled.num > doubled.den ? ONE : doubled;
}

describe("signTest against exact BigInt binomial sums", () => {
  it("exact and mid-p p-values agree to 1e-12 for every count with n <= 70", () => {
    let worst = 0;
    for (let n = 1; n <= 70; n++) {
      for (let above = 0; above <= n; above++) {
        const below = n - above;
        for (const alternative of ALTERNATIVES) {
          for (const midp of [false, true]) {
            const got = run({ below, tied: 0, above }, { alternative, method: midp ? "midp" : "exact" }).pValue;
            worst = Math.max(worst, relativeError(got, exactPValue(below, above, alternative, midp)));
          }
        }
      }
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it("stays accurate in far tails at n = 3000", () => {
    for (const above of [2999, 2400, 1700, 1501]) {
      const below = 3000 - above;
      const got = run({ below, tied: 0, above }, { alternative: "greater" }).pValue;
      expect(relativeError(got, exactPValue(below, above, "greater", false))).toBeLessThan(1e-12);
    }
  });
});

// Published source: M. F. Triola, "Elementary Statistics", Table A-7 (details beside the table in signFamilyTables.ts).
describe("signTest against a published table of critical values (Triola, Table A-7)", () => {
  it("rejects exactly at and below the tabled count, two-sided", () => {
    for (const [nText, row] of Object.entries(TRIOLA_A7)) {
      const n = Number(nText);
      row.forEach((critical, column) => {
        const alpha = TRIOLA_ALPHAS[column];
        const p = (fewer: number) => run({ below: fewer, tied: 0, above: n - fewer }).pValue;
        const largestRejected = critical ?? -1;
        if (largestRejected >= 0) expect(p(largestRejected)).toBeLessThanOrEqual(alpha);
        if (largestRejected + 1 <= n / 2) expect(p(largestRejected + 1)).toBeGreaterThan(alpha);
      });
    }
  });

  it("the one-tailed columns agree with the one-sided test", () => {
    for (const [nText, row] of Object.entries(TRIOLA_A7)) {
      const n = Number(nText);
      row.forEach((critical, column) => {
        const alpha = TRIOLA_ALPHAS[column] / 2;
        const p = (fewer: number) => run({ below: n - fewer, tied: 0, above: fewer }, { alternative: "less" }).pValue;
        if (critical !== null) expect(p(critical)).toBeLessThanOrEqual(alpha);
        if ((critical ?? -1) + 1 <= n) expect(p((critical ?? -1) + 1)).toBeGreaterThan(alpha);
      });
    }
  });
});

describe("signTest tie rules", () => {
  it("drop leaves ties out", () => {
    const r = run({ below: 2, tied: 3, above: 9 });
    expect([r.below, r.above, r.used, r.tiesDropped, r.tiesToBelow, r.tiesToAbove]).toEqual([2, 9, 11, 3, 0, 0]);
    // 2 × P(Bin(11, 1/2) <= 2) = 2 × 67/2048, hand computation (to the last few bits of a double)
    expect(Math.abs(r.pValue - 134 / 2048) / (134 / 2048)).toBeLessThan(1e-14);
    expect(r.counts).toEqual({ below: 2, tied: 3, above: 9 });
  });

  it("split shares ties evenly and drops an odd one", () => {
    const odd = run({ below: 2, tied: 3, above: 9 }, { ties: "split" });
    expect([odd.below, odd.above, odd.used, odd.tiesDropped]).toEqual([3, 10, 13, 1]);
    const even = run({ below: 2, tied: 4, above: 9 }, { ties: "split" });
    expect([even.below, even.above, even.used, even.tiesDropped]).toEqual([4, 11, 15, 0]);
  });

  it("conservative counts ties against a one-sided alternative", () => {
    const greater = run({ below: 2, tied: 3, above: 9 }, { ties: "conservative", alternative: "greater" });
    expect([greater.below, greater.above, greater.statistic]).toEqual([5, 9, 9]);
    const less = run({ below: 9, tied: 3, above: 2 }, { ties: "conservative", alternative: "less" });
    expect([less.below, less.above, less.statistic]).toEqual([9, 5, 9]);
    expect(less.pValue).toBe(greater.pValue);
  });

  it("conservative two-sided gives the largest p-value over every way of assigning the ties (brute-force enumeration)", () => {
    for (let below = 0; below <= 9; below++) {
      for (let above = 0; above <= 9; above++) {
        for (let tied = 0; tied <= 9; tied++) {
          if (below + above + tied === 0) continue;
          for (const method of METHODS) {
            let largest = 0;
            for (let toBelow = 0; toBelow <= tied; toBelow++) {
              const p = run({ below: below + toBelow, tied: 0, above: above + tied - toBelow }, { method }).pValue;
              largest = Math.max(largest, p);
            }
            const r = run({ below, tied, above }, { ties: "conservative", method });
            expect(r.pValue).toBe(largest);
            expect(r.used).toBe(below + above + tied);
            expect(r.tiesDropped).toBe(0);
          }
        }
      }
    }
  });

  it("conservative one-sided gives the largest p-value over every assignment (brute-force enumeration)", () => {
    for (const alternative of ["greater", "less"] as const) {
      for (let below = 0; below <= 8; below++) {
        for (let above = 0; above <= 8; above++) {
          for (let tied = 0; tied <= 8; tied++) {
            if (below + above + tied === 0) continue;
            let largest = 0;
            for (let toBelow = 0; toBelow <= tied; toBelow++) {
              largest = Math.max(largest, run({ below: below + toBelow, tied: 0, above: above + tied - toBelow }, { alternative }).pValue);
            }
            expect(run({ below, tied, above }, { alternative, ties: "conservative" }).pValue).toBe(largest);
          }
        }
      }
    }
  });
});

describe("signTest result fields", () => {
  it("states the statistic, majority, expectation and z", () => {
    const r = run({ below: 30, tied: 0, above: 70 }, { method: "normal" });
    expect(r.statistic).toBe(70);
    expect(r.majority).toBe("above");
    expect(r.expected).toBe(50);
    // (70 - 0.5 - 50) / (sqrt(100) / 2) = 3.9, hand computation
    expect(r.z).toBeCloseTo(3.9, 14);
    expect(run({ below: 3, tied: 0, above: 3 }).majority).toBe("neither");
    expect(run({ below: 5, tied: 0, above: 3 }, { alternative: "less" }).statistic).toBe(5);
    expect(run({ below: 5, tied: 0, above: 3 }).z).toBeNull();
  });

  it("gives p = 1 two-sided for balanced counts", () => {
    for (const method of METHODS) expect(run({ below: 6, tied: 0, above: 6 }, { method }).pValue).toBe(1);
  });

  it("is unavailable when nothing is left to count", () => {
    const allTied = signTest({ below: 0, tied: 4, above: 0 });
    expect(allTied.available).toBe(false);
    if (!allTied.available) {
      expect(allTied.reason).toBe("no-data");
      expect(allTied.message).toMatch(/equals the hypothesised median/);
    }
    const none = signTest({ below: 0, tied: 0, above: 0 });
    expect(none.available === false && none.reason === "no-data" && /No values/.test(none.message)).toBe(true);
    expect(signTest({ below: 0, tied: 1, above: 0 }, { ties: "split" }).available).toBe(false);
    expect(signTest({ below: 0, tied: 1, above: 0 }, { ties: "conservative" }).available).toBe(true);
  });

  it("throws RangeError for impossible counts or options", () => {
    expect(() => signTest({ below: -1, tied: 0, above: 2 })).toThrow(RangeError);
    expect(() => signTest({ below: 1.5, tied: 0, above: 2 })).toThrow(RangeError);
    expect(() => signTest({ below: 1, tied: 0, above: 2 }, { method: "bogus" as SignTestMethod })).toThrow(RangeError);
    expect(() => signTest({ below: 1, tied: 0, above: 2 }, { alternative: "up" as Alternative })).toThrow(RangeError);
    expect(() => signTest({ below: 1, tied: 1, above: 2 }, { ties: "keep" as "drop" })).toThrow(RangeError);
  });

  it("handles a very large sample (n = 1e9)", () => {
    const r = run({ below: 499_990_000, tied: 0, above: 500_010_000 });
    // z = (500 010 000 - 0.5 - 5e8) / (sqrt(1e9) / 2) = 0.6324... ; exact and normal agree closely here (common practice)
    const normal = run({ below: 499_990_000, tied: 0, above: 500_010_000 }, { method: "normal" });
    expect(relErr(r.pValue, normal.pValue)).toBeLessThan(1e-4);
  });
});

describe("signTest properties (fast-check)", () => {
  const counts = fc.record({ below: fc.nat({ max: 400 }), tied: fc.nat({ max: 20 }), above: fc.nat({ max: 400 }) });
  const options = fc.record({
    method: fc.constantFrom<SignTestMethod>(...METHODS),
    ties: fc.constantFrom("drop" as const, "split" as const, "conservative" as const),
  });

  it("p lies in [0, 1]", () => {
    fc.assert(
      fc.property(counts, options, fc.constantFrom<Alternative>(...ALTERNATIVES), (c, o, alternative) => {
        const r = signTest(c, { ...o, alternative });
        if (r.available) expect(r.pValue >= 0 && r.pValue <= 1).toBe(true);
      }),
    );
  });

  it("less and greater are mirror images (swapping below and above)", () => {
    fc.assert(
      fc.property(counts, options, (c, o) => {
        const greater = signTest(c, { ...o, alternative: "greater" });
        const less = signTest({ below: c.above, tied: c.tied, above: c.below }, { ...o, alternative: "less" });
        if (greater.available && less.available) expect(less.pValue).toBe(greater.pValue);
        else expect(greater.available).toBe(less.available);
      }),
    );
  });

  it("two-sided is at least the one-sided p-value in the direction of the data, and at most twice it", () => {
    fc.assert(
      fc.property(counts, fc.constantFrom<SignTestMethod>(...METHODS), (c, method) => {
        const two = signTest(c, { method });
        const greater = signTest(c, { method, alternative: "greater" });
        const less = signTest(c, { method, alternative: "less" });
        if (!two.available || !greater.available || !less.available) return;
        const smaller = Math.min(greater.pValue, less.pValue);
        expect(two.pValue).toBeGreaterThanOrEqual(smaller);
        expect(two.pValue).toBeLessThanOrEqual(Math.min(1, 2 * smaller) * (1 + 1e-15));
      }),
    );
  });

  it("p falls as the statistic grows (same n, fewer on the other side)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 500 }), fc.nat(), fc.constantFrom<SignTestMethod>(...METHODS), (n, raw, method) => {
        const above = raw % n; // 0..n-1, so above + 1 is possible
        const p = (a: number, alternative: Alternative) => run({ below: n - a, tied: 0, above: a }, { method, alternative }).pValue;
        expect(p(above + 1, "greater")).toBeLessThanOrEqual(p(above, "greater"));
        expect(p(above + 1, "less")).toBeGreaterThanOrEqual(p(above, "less"));
        if (above + 1 > n / 2) expect(p(above + 1, "two-sided")).toBeLessThanOrEqual(p(above, "two-sided"));
      }),
    );
  });

  it("exact p-values equal BigInt sums on random counts", () => {
    fc.assert(
      fc.property(
        fc.nat({ max: 150 }),
        fc.nat({ max: 150 }),
        fc.constantFrom<Alternative>(...ALTERNATIVES),
        (below, above, alternative) => {
          if (below + above === 0) return;
          const got = run({ below, tied: 0, above }, { alternative }).pValue;
          expect(relativeError(got, exactPValue(below, above, alternative, false))).toBeLessThan(1e-12);
        },
      ),
    );
  });
});

describe("exact helper", () => {
  it("rounds fractions to the nearest double (hand values)", () => {
    expect(toNumber({ num: 134n, den: 2048n })).toBe(0.0654296875);
    expect(toNumber(exactLower(exactBinomial(10, 1, 2), 2))).toBe(56 / 1024);
  });
});
