/**
 * The installation check's reference cases (src/report/installationCheck.ts) run through the catalogue's
 * callFunction, as the cells run them: every case passes, and a deliberately broken function fails exactly its
 * own cases. The expected values are checked here once more by independent exact arithmetic in BigInt.
 */
import { describe, expect, it } from "vitest";
import { callFunction } from "../../src/functions/functions";
import { caseFormula, REFERENCE_CASES, runInstallationCheck, runReferenceCase } from "../../src/report/installationCheck";
import { binomialCoefficient as choose } from "../exact";

describe("the installation check", () => {
  it("passes every case on this build", () => {
    const outcomes = runInstallationCheck(callFunction);
    expect(outcomes.length).toBeGreaterThanOrEqual(15);
    for (const o of outcomes) expect(o, `${o.reference.id}: ${o.actual}`).toMatchObject({ passed: true });
  });

  it("names a source and a tolerance for every case, and unique ids", () => {
    expect(new Set(REFERENCE_CASES.map((c) => c.id)).size).toBe(REFERENCE_CASES.length);
    for (const c of REFERENCE_CASES) {
      expect(c.source.length, c.id).toBeGreaterThan(20);
      expect(c.tolerance, c.id).toBeGreaterThanOrEqual(0);
      expect(c.tolerance, c.id).toBeLessThan(1e-9);
    }
  });

  it("fails the cases of a function that is off by one part in a million, and only those", () => {
    const broken = (fn: string, args: unknown[]): unknown => {
      const answer = callFunction(fn, args);
      return fn === "PVALUE" && typeof answer === "number" ? answer * (1 + 1e-6) : answer;
    };
    for (const o of runInstallationCheck(broken)) expect(o.passed, o.reference.id).toBe(o.reference.fn !== "PVALUE");
  });

  it("fails a case whose function answers with an error or throws, giving the error", () => {
    const refusing = (fn: string, args: unknown[]): unknown =>
      fn === "BOUNDS" ? [[{ code: "#N/A" }, { code: "#N/A" }, { code: "#N/A" }]] : callFunction(fn, args);
    const bounds = runInstallationCheck(refusing).filter((o) => o.reference.fn === "BOUNDS");
    expect(bounds.length).toBeGreaterThan(0);
    for (const o of bounds) expect(o).toMatchObject({ actual: "#N/A", difference: null, passed: false });
    const throwing = runReferenceCase(REFERENCE_CASES[0], () => {
      throw new Error("not registered");
    });
    expect(throwing).toMatchObject({ actual: "not registered", passed: false });
  });

  it("expects what exact arithmetic in BigInt gives", () => {
    const expected = (id: string): number => REFERENCE_CASES.find((c) => c.id === id)?.expected ?? NaN;
    let tail = 0n;
    for (let k = 18; k <= 25; k++) tail += choose(25, k);
    expect(expected("sign-18-of-25")).toBe(Number(tail) / 2 ** 25);
    expect(expected("counts-18-7-midp")).toBe(Number(2n * (tail - choose(25, 18)) + choose(25, 18)) / 2 ** 26);
    expect(expected("sign-2-of-10")).toBe(Number(2n * (choose(10, 0) + choose(10, 1) + choose(10, 2))) / 2 ** 10);
    // T+ <= 8 over the subsets of ranks 1..10, by enumeration of all 1024 sign patterns.
    let atMost8 = 0;
    for (let mask = 0; mask < 1024; mask++) {
      let sum = 0;
      for (let r = 1; r <= 10; r++) if (mask & (1 << (r - 1))) sum += r;
      if (sum <= 8) atMost8++;
    }
    expect(expected("signed-rank-10")).toBe(atMost8 / 1024);
    // The watching p-value after 8 signs up: 1 / (2^8 · 8! · 0! / 9!) = 9! / (2^8 · 8!); each earlier value 2^t / (t + 1) is smaller.
    const factorial = (n: bigint): bigint => (n <= 1n ? 1n : n * factorial(n - 1n));
    expect(expected("paired-watch-8")).toBe(Number(factorial(9n)) / Number(256n * factorial(8n)));
  });

  it("writes each case as the formula a sheet would hold", () => {
    expect(caseFormula(REFERENCE_CASES[0])).toBe('=EVENSPLIT.PVALUE({51;52;53},50,"greater")');
    const formula = (id: string): string => caseFormula(REFERENCE_CASES.find((c) => c.id === id) ?? REFERENCE_CASES[0]);
    expect(formula("ranks-10")).toBe("=INDEX(EVENSPLIT.ORDERRANKS(10),1,1)");
    expect(formula("holm-3")).toBe('=INDEX(EVENSPLIT.ADJUST({0.01,0.04,0.03},"holm"),1,2)');
  });
});
