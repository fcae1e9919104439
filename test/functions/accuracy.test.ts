/**
 * The add-in layer loses no accuracy: the shipped dist/functions.js is called
 * on generated ranges built to match the cases of the core's reference
 * fixtures, and its answers are compared with the fixtures to 1e-10 relative.
 *
 * Sources, from R 4.2 (Debian r-base-core): test/fixtures/signTest.json,
 * written by test/fixtures/signTest.R (binom.test and prop.test p-values, mid-p
 * from pbinom/dbinom, quantile-test p-values, order-statistic bound ranks with
 * their coverage from pbinom), and test/fixtures/signedRank.json, written by
 * test/fixtures/signedRank.R (wilcox.test statistics, exact and normal
 * p-values and intervals; Walsh-average order statistics for large samples).
 *
 * The ranges are invented panel coating thicknesses in µm around a target of
 * 50 µm, with blanks, text and logical cells mixed in (which must be skipped)
 * and, for the sign test, values exactly at the target (ties, left out by the
 * default rule), in a shuffled order. The signed-rank cases use R's own data,
 * about a centre of 0, with the same kind of non-number cells mixed in.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { loadFunctionsBundle, StandInError } from "./dist";
import { xorshift32 as uniforms } from "../../src/stats/xorshift";
import { signTestFixture } from "../fixtures/signTestFixture";

const bundle = loadFunctionsBundle();
const fixtures = signTestFixture;

interface SignedRankCase {
  kind: string;
  x: number[];
  alternative: string;
  confidence: number;
  statistic: number;
  pNormal: number;
  pExact: number | null;
  interval:
    | null
    | { reachable: false }
    | { reachable: true; estimate: number; lower: number; upper: number; achieved: number }
    | { walshMedian: number; normalLower: number; normalUpper: number };
}

const TOLERANCE = 1e-10;
const TARGET = 50;

function expectClose(actual: unknown, expected: number, what: string): void {
  expect(typeof actual, `${what}: ${JSON.stringify(actual)}`).toBe("number");
  const error = Math.abs((actual as number) - expected);
  expect(error <= TOLERANCE * Math.abs(expected), `${what}: got ${actual as number}, expected ${expected}`).toBe(true);
}

function shuffle<T>(items: T[], next: () => number): T[] {
  for (let i = items.length - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1));
    [items[i], items[j]] = [items[j], items[i]];
  }
  return items;
}

const FILLERS: unknown[] = [null, "", "panel missing", true, false];

/** A one-column range with `below` values under `at`, `above` over it, `ties` equal to it, and some cells that are not numbers. */
function thicknesses(below: number, above: number, ties: number, at: number, seed: number): unknown[][] {
  const next = uniforms(seed);
  const cells: unknown[] = [];
  for (let i = 0; i < below; i++) cells.push(at - 0.01 - Math.round(next() * 600) / 100);
  for (let i = 0; i < above; i++) cells.push(at + 0.01 + Math.round(next() * 600) / 100);
  for (let i = 0; i < ties; i++) cells.push(at);
  const fillers = Math.min(7, Math.floor(next() * 8));
  for (let i = 0; i < fillers; i++) cells.push(FILLERS[i % FILLERS.length]);
  return shuffle(cells, next).map((c) => [c]);
}

describe("sign test through the bundle matches R", () => {
  const cases = fixtures.sign.filter((c) => c.below + c.above <= 200_000);

  it("has cases to check", () => expect(cases.length).toBeGreaterThan(400));

  it("PVALUE, every alternative and method", () => {
    cases.forEach((c, i) => {
      const data = thicknesses(c.below, c.above, i % 4, TARGET, i + 1);
      const check = (alternative: string, method: string, expected: number | null) => {
        if (expected === null) return;
        expectClose(
          bundle.call("PVALUE", data, TARGET, alternative, null, method),
          expected,
          `PVALUE ${c.below}/${c.above} ${alternative} ${method}`,
        );
      };
      check("greater", "exact", c.greater);
      check("less", "exact", c.less);
      check("two-sided", "exact", c.twoSided);
      check(">", "midp", c.midpGreater);
      check("<", "midp", c.midpLess);
      check("both", "midp", c.midpTwoSided);
      check("greater", "normal", c.normalGreater);
      check("less", "normal", c.normalLess);
      check(null as never, "normal", c.normalTwoSided);
    });
  });

  it("PAIRED on second − first − shift", () => {
    const shift = 1.5;
    cases
      .filter((c) => c.below + c.above <= 20_000)
      .forEach((c, i) => {
        const next = uniforms(1000 + i);
        const differences = thicknesses(c.below, c.above, i % 3, 0, 2000 + i).map(([d]) => d);
        const first = differences.map(() => [Math.round((44 + 12 * next()) * 100) / 100]);
        const second = differences.map((d, k) => [typeof d === "number" ? Math.round((first[k][0] + shift + d) * 100) / 100 : d]);
        expectClose(bundle.call("PAIRED", first, second, shift, "greater"), c.greater, `PAIRED ${c.below}/${c.above} greater`);
        expectClose(bundle.call("PAIRED", first, second, shift), c.twoSided, `PAIRED ${c.below}/${c.above} two-sided`);
      });
  });
});

describe("quantile test through the bundle matches R", () => {
  const cases = fixtures.quantile.filter((c) => c.below + c.above <= 30_000);

  it("QUANTILEPVALUE, every alternative (two-sided by doubling)", () => {
    expect(cases.length).toBeGreaterThan(700);
    cases.forEach((c, i) => {
      const data = thicknesses(c.below, c.above, i % 3, 58, 5000 + i);
      const label = `QUANTILEPVALUE ${c.below}/${c.above} q=${c.quantile}`;
      expectClose(bundle.call("QUANTILEPVALUE", data, 58, c.quantile, "greater"), c.greater, `${label} greater`);
      expectClose(bundle.call("QUANTILEPVALUE", data, 58, c.quantile, "less"), c.less, `${label} less`);
      expectClose(bundle.call("QUANTILEPVALUE", data, 58, c.quantile), c.doubling, `${label} two-sided`);
    });
  });
});

describe("order-statistic bounds through the bundle match R's ranks and coverage", () => {
  const cases = fixtures.bounds.filter((c) => c.n <= 12_345);

  /** n distinct thicknesses, shuffled, whose r-th smallest is sorted[r - 1]. */
  function distinct(n: number, seed: number): { data: unknown[][]; sorted: number[] } {
    const sorted = Array.from({ length: n }, (_, i) => Math.round((40 + i * 0.003) * 1000) / 1000);
    const next = uniforms(seed);
    const cells: unknown[] = [...sorted, ...FILLERS.slice(0, Math.floor(next() * 5))];
    return { data: shuffle(cells, next).map((c) => [c]), sorted };
  }

  it("BOUNDS (median) and QUANTILEBOUNDS give the fixture's order statistics and achieved confidence", () => {
    expect(cases.length).toBeGreaterThan(1500);
    cases.forEach((c, i) => {
      const { data, sorted } = distinct(c.n, 9000 + i);
      const label = `n=${c.n} q=${c.quantile} conf=${c.confidence} ${c.side}`;
      const rows = [bundle.call("QUANTILEBOUNDS", data, c.quantile, c.confidence, c.side) as unknown[][]];
      if (c.quantile === 0.5) rows.push(bundle.call("BOUNDS", data, c.confidence, c.side) as unknown[][]);
      for (const [row] of rows) {
        expect(row, label).toHaveLength(3);
        if (!c.available) {
          for (const cell of row) {
            expect(cell, label).toBeInstanceOf(StandInError);
            expect((cell as StandInError).code).toBe("#N/A");
            expect((cell as StandInError).message, label).toMatch(/at least \d+/);
          }
          continue;
        }
        expect(row[0], label).toBe(c.lowerRank === null ? "" : sorted[c.lowerRank - 1]);
        expect(row[1], label).toBe(c.upperRank === null ? "" : sorted[c.upperRank - 1]);
        expectClose(row[2], c.achievedConfidence as number, `${label} achieved`);
      }
    });
  });
});

describe("signed-rank test and Hodges–Lehmann through the bundle match R", () => {
  const signedRank = JSON.parse(readFileSync(new URL("../fixtures/signedRank.json", import.meta.url), "utf8")) as {
    cases: SignedRankCase[];
  };

  it("SIGNRANK (exact and normal), SIGNRANKSTATISTIC and HODGESLEHMANN", () => {
    expect(signedRank.cases.length).toBeGreaterThan(300);
    signedRank.cases.forEach((c, i) => {
      const next = uniforms(20_000 + i);
      const cells = shuffle([...c.x, ...FILLERS.slice(0, Math.floor(next() * 5))], next).map((v) => [v]);
      const label = `${c.kind} case ${i} (n=${c.x.length}, ${c.alternative})`;
      expectClose(bundle.call("SIGNRANKSTATISTIC", cells, 0), c.statistic, `${label} V`);
      expectClose(bundle.call("SIGNRANK", cells, 0, c.alternative, "normal"), c.pNormal, `${label} normal p`);
      if (c.pExact !== null) expectClose(bundle.call("SIGNRANK", cells, 0, c.alternative, "exact"), c.pExact, `${label} exact p`);
      const interval = c.interval;
      if (interval === null) return;
      const [row] = bundle.call("HODGESLEHMANN", cells, c.confidence) as unknown[][];
      if ("reachable" in interval) {
        if (!interval.reachable) {
          // Too few values for the bounds (R's k = 0): the bound cells say so, the estimate is still given.
          for (const cell of row.slice(1)) expect((cell as StandInError).code, label).toBe("#N/A");
          const walsh = c.x.flatMap((a, i) => c.x.slice(i).map((b) => (a + b) / 2)).sort((a, b) => a - b);
          const m = walsh.length;
          expectClose(
            row[0],
            m % 2 ? walsh[(m - 1) / 2] : (walsh[m / 2 - 1] + walsh[m / 2]) / 2,
            `${label} estimate (all Walsh averages, brute force)`,
          );
          return;
        }
        expectClose(row[0], interval.estimate, `${label} estimate`);
        expectClose(row[1], interval.lower, `${label} lower`);
        expectClose(row[2], interval.upper, `${label} upper`);
        expectClose(row[3], interval.achieved, `${label} achieved`);
      } else {
        expectClose(row[0], interval.walshMedian, `${label} estimate`);
        expectClose(row[1], interval.normalLower, `${label} lower`);
        expectClose(row[2], interval.normalUpper, `${label} upper`);
      }
    });
  });
});
