/**
 * The audit line that ends every result block (src/report/resultBlock.ts): version, method with its options,
 * the exact ranges read and the time the block was written (REPORT: the time it was evaluated). The expected
 * texts are written out by hand here; the version is package.json's.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { callFunction, report } from "../../src/functions/functions";
import { auditTime, blockFormula, blockValue, resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";
import { EVENSPLIT_VERSION } from "../../src/report/version";

const SIGN: BlockRequest = { test: "sign", paired: false, center: 50, alternative: "greater", alpha: 0.05, confidence: 0.95 };
const WRITTEN = new Date(Date.UTC(2026, 0, 9, 14, 5, 7));

const requests: BlockRequest[] = [
  SIGN,
  { ...SIGN, paired: true, center: 0, alternative: "two-sided", ties: "split", method: "midp" },
  { test: "signed-rank", paired: false, center: 50, alternative: "less", alpha: 0.01, confidence: 0.9 },
  { test: "quantile", paired: false, center: 58, quantile: 0.9, alternative: "two-sided", alpha: 0.05, confidence: 0.95 },
];

function auditOf(request: BlockRequest) {
  const rows = resultBlockRows(request);
  return { row: rows[rows.length - 1], rows };
}

describe("the audit line", () => {
  it("names the version package.json gives", () => {
    const pkg = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { version: string };
    expect(EVENSPLIT_VERSION).toBe(pkg.version);
  });

  it("is the last row of every block", () => {
    for (const request of requests) {
      const { row } = auditOf(request);
      expect(row).toMatchObject({ key: "audit", label: "Audit", format: "text", value: { kind: "audit", version: EVENSPLIT_VERSION } });
    }
  });

  it("is written as fixed text naming the method, the ranges the formulas read and the time of writing", () => {
    const { row } = auditOf(SIGN);
    expect(blockFormula(row.value, { data: "Panels[Thickness]", writtenAt: WRITTEN })).toBe(
      `Evensplit ${EVENSPLIT_VERSION}; sign test, one sample (exact binomial; ties left out; greater, alpha 0.05, confidence 0.95; hypothesised 50); reads Panels[Thickness]; written 2026-01-09 14:05:07 UTC`,
    );
    const paired = auditOf(requests[1]).row;
    expect(blockFormula(paired.value, { data: "$B$2:$B$25", second: "$C$2:$C$25", writtenAt: WRITTEN })).toBe(
      `Evensplit ${EVENSPLIT_VERSION}; sign test, paired (mid-p binomial; ties shared evenly between below and above (an odd one left out); two-sided, alpha 0.05, confidence 0.95; hypothesised 0); reads $B$2:$B$25 and $C$2:$C$25; written 2026-01-09 14:05:07 UTC`,
    );
  });

  it("states every option that changes the numbers, for each test", () => {
    const words = requests.map((request) =>
      blockFormula(auditOf(request).row.value, { data: "A2:A9", second: "B2:B9", writtenAt: WRITTEN }),
    );
    expect(words[2]).toContain(
      "Wilcoxon signed-rank test, one sample (method auto; zeros drop; less, alpha 0.01, confidence 0.9; hypothesised 50)",
    );
    expect(words[3]).toContain("quantile test (quantile 0.9; exact binomial; two-sided, alpha 0.05, confidence 0.95; hypothesised 58)");
  });

  it("holds no formula, so recalculating never moves the time of writing", () => {
    for (const request of requests) {
      const text = blockFormula(auditOf(request).row.value, { data: "A2:A9", second: "B2:B9", writtenAt: WRITTEN });
      expect(text.startsWith("=")).toBe(false);
      expect(text).not.toMatch(/NOW\(|TODAY\(/i);
    }
  });

  it("in REPORT gives the outline of the cells it received and the time of evaluation", () => {
    const data = [[51.2], [49.8], [50.6]];
    const value = blockValue(auditOf(SIGN).row.value, { data, evaluatedAt: WRITTEN }, callFunction);
    expect(value).toBe(
      `Evensplit ${EVENSPLIT_VERSION}; sign test, one sample (exact binomial; ties left out; greater, alpha 0.05, confidence 0.95; hypothesised 50); reads the range given (3 rows × 1 column); evaluated 2026-01-09 14:05:07 UTC`,
    );
    const paired = blockValue(auditOf(requests[1]).row.value, { data, second: data, evaluatedAt: WRITTEN }, callFunction);
    expect(paired).toContain("reads the ranges given (3 rows × 1 column and 3 rows × 1 column); evaluated");
    const block = report(data, 50, "greater");
    const last = block[block.length - 1];
    expect(last[0]).toBe("Audit");
    expect(last[1]).toMatch(
      new RegExp(
        `^Evensplit ${EVENSPLIT_VERSION.replace(/\./g, "\\.")}; sign test, one sample .*; reads the range given \\(3 rows × 1 column\\); evaluated \\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d:\\d\\d UTC$`,
      ),
    );
  });

  it("in REPORT names the ranges by the addresses the host gave, and falls back to their outline without them", () => {
    const data = [[51.2], [49.8], [50.6]];
    const one = blockValue(auditOf(SIGN).row.value, { data, evaluatedAt: WRITTEN, addresses: { data: "Panels!B2:B4" } }, callFunction);
    expect(one).toContain("; reads Panels!B2:B4; evaluated 2026-01-09 14:05:07 UTC");
    const pairedRequest = requests[1];
    const both = { data: "'Nozzle check'!A2:A4", second: "'Nozzle check'!B2:B4" };
    const paired = blockValue(auditOf(pairedRequest).row.value, { data, second: data, addresses: both }, callFunction);
    expect(paired).toContain("; reads 'Nozzle check'!A2:A4 and 'Nozzle check'!B2:B4; evaluated");
    // A paired block whose second address is missing names neither rather than one of two.
    const half = blockValue(auditOf(pairedRequest).row.value, { data, second: data, addresses: { data: both.data } }, callFunction);
    expect(half).toContain("reads the ranges given (3 rows × 1 column and 3 rows × 1 column)");
  });

  it("in REPORT takes the addresses from the invocation Excel passes last, and the sizes without them", () => {
    const data = [[51.2], [49.8], [50.6]];
    const audit = (...args: unknown[]) => (report as (...a: unknown[]) => unknown[][])(data, 50, "greater", null, null, ...args).at(-1)![1];
    // One address per argument, in order (Microsoft, "Custom functions parameter options": SheetName!CellNumber).
    const invocation = { parameterAddresses: ["Panels!B2:B4", "", "", "", "", ""] };
    expect(audit(null, invocation)).toMatch(/; reads Panels!B2:B4; evaluated /);
    expect(audit(data, { parameterAddresses: ["Nozzle!B2:B4", "", "", "", "", "Nozzle!C2:C4"] })).toMatch(
      /; reads Nozzle!B2:B4 and Nozzle!C2:C4; evaluated /,
    );
    expect(audit(null, {})).toMatch(/; reads the range given \(3 rows × 1 column\); evaluated /);
    expect(audit(null, { parameterAddresses: ["", "", "", "", "", ""] })).toMatch(/reads the range given/);
    expect(audit()).toMatch(/reads the range given/);
  });

  it("gives times in UTC to the second", () => {
    expect(auditTime(new Date(Date.UTC(2026, 11, 2, 6, 30, 5)))).toBe("2026-12-02 06:30:05 UTC");
  });
});
