/**
 * The block of a sign test whose result is looked at again as rows arrive. With the request's `watching`
 * flag the p-value and bounds rows use WATCHPVALUE and WATCHBOUNDS (for pairs PAIREDWATCHPVALUE and
 * PAIREDWATCHBOUNDS) and the method row says they
 * hold however often the result is looked at; a block that follows new rows (a table column or an
 * open-ended range) but keeps the fixed-sample test shows the watching p-value beside it and a caution
 * against stopping the first time p drops below alpha (common practice: repeated looks at a fixed-sample
 * p-value inflate the false-alarm rate; the Monte Carlo figure is in test/stats). Other tests are unchanged.
 * The sheet's formulas (evaluated by the demo sheet) and REPORT's direct evaluation must agree row by row.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { callFunction, pairedwatchbounds, pairedwatchpvalue, watchbounds, watchpvalue } from "../../src/functions/functions";
import { blockFormula, blockValue, resultBlockRows, type BlockRequest, type BlockRow } from "../../src/report/resultBlock";
import { catalogueFunctions } from "../demo/catalogue";

const SHEET = "Paint line";

/** Invented coating thicknesses (µm), in the order the panels came off the line; mostly above the target 50. */
const THICKNESS: number[] = Array.from({ length: 40 }, (_, i) => 50 + ((i * 7) % 11) / 2 - 1.25 + (i % 3 === 0 ? 0 : 0.5));

const SIGN: BlockRequest = {
  test: "sign",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  ties: "drop",
  method: "exact",
  dataName: "Thickness",
};
const WATCHING: BlockRequest = { ...SIGN, followsNewRows: true, watching: true };
const FOLLOWING: BlockRequest = { ...SIGN, followsNewRows: true, watching: false };

/** The same panels measured again after a nozzle change (invented): mostly thinner, one pair incomplete, one unreadable. */
const BEFORE: unknown[] = THICKNESS.map((x) => x);
const AFTER: unknown[] = THICKNESS.map((x, i) => Math.round((x - 0.6 + ((i * 5) % 7) / 5 - 0.4) * 10) / 10);
BEFORE[6] = null;
AFTER[11] = "re-measure";
AFTER[17] = null;
BEFORE[17] = null;
const PAIRED: BlockRequest = { ...SIGN, paired: true, center: 0, alternative: "less", dataName: "Before", secondName: "After" };
const PAIRED_WATCHING: BlockRequest = { ...PAIRED, followsNewRows: true, watching: true };
const PAIRED_FOLLOWING: BlockRequest = { ...PAIRED, followsNewRows: true, watching: false };

const keysOf = (request: BlockRequest): string[] => resultBlockRows(request).map((r) => r.key);
const rowOf = (request: BlockRequest, key: string): BlockRow | undefined => resultBlockRows(request).find((r) => r.key === key);
const textOf = (r: BlockRow | undefined): string => (r?.value.kind === "text" ? r.value.text : "");

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

describe("a watched one-sample sign block", () => {
  it("takes its p-value from WATCHPVALUE and decides on it", () => {
    const p = { kind: "call", fn: "WATCHPVALUE", args: [{ ref: "data" }, { number: 50 }, { text: "greater" }, { text: "drop" }] };
    expect(rowOf(WATCHING, "pvalue")!.value).toEqual(p);
    expect(rowOf(WATCHING, "decision")!.value).toMatchObject({ kind: "decision", pValue: p });
  });

  it("takes its bounds from WATCHBOUNDS and states the rows they read instead of a fixed-sample coverage", () => {
    const bound = (key: string) => rowOf(WATCHING, key)!.value;
    expect(bound("lower")).toEqual({ kind: "call", fn: "WATCHBOUNDS", args: [{ ref: "data" }, { number: 0.95 }], column: 1 });
    expect(bound("upper")).toEqual({ kind: "call", fn: "WATCHBOUNDS", args: [{ ref: "data" }, { number: 0.95 }], column: 2 });
    expect(bound("rowsRead")).toEqual({ kind: "call", fn: "WATCHBOUNDS", args: [{ ref: "data" }, { number: 0.95 }], column: 3 });
    expect(keysOf(WATCHING)).not.toContain("coverage");
  });

  it("says in the method row that these hold however often the result is looked at as rows arrive", () => {
    expect(textOf(rowOf(WATCHING, "method"))).toMatch(/hold however often the result is looked at as rows arrive/);
    expect(textOf(rowOf(WATCHING, "method"))).toMatch(/rows read in sheet order/);
    expect(rowOf(WATCHING, "audit")!.value).toMatchObject({ method: expect.stringMatching(/watching p-value and bounds/) });
  });

  it("shows neither the extra watching row nor the caution about stopping early", () => {
    expect(keysOf(WATCHING)).not.toContain("watchPvalue");
    expect(keysOf(WATCHING)).not.toContain("lookingAgain");
  });
});

describe("a sign block that follows new rows but keeps the fixed-sample test", () => {
  it("keeps the fixed-sample p-value and shows the watching one beside it", () => {
    const keys = keysOf(FOLLOWING);
    expect(rowOf(FOLLOWING, "pvalue")!.value).toMatchObject({ fn: "PVALUE" });
    expect(keys.indexOf("watchPvalue")).toBe(keys.indexOf("pvalue") + 1);
    expect(rowOf(FOLLOWING, "watchPvalue")).toMatchObject({ label: "Watching p-value", format: "pvalue", value: { fn: "WATCHPVALUE" } });
    expect(rowOf(FOLLOWING, "coverage")).toBeDefined();
  });

  it("cautions that stopping the first time p drops below alpha raises false alarms", () => {
    const caution = rowOf(FOLLOWING, "lookingAgain")!;
    expect(caution.style).toBe("caution");
    expect(textOf(caution)).toMatch(/stopping the first time it drops below alpha raises false alarms/);
  });

  it("adds exactly those two rows to the block that does not follow new rows", () => {
    const still = keysOf(SIGN);
    expect(keysOf(FOLLOWING).filter((key) => !still.includes(key))).toEqual(["watchPvalue", "lookingAgain"]);
    expect(keysOf(FOLLOWING)).toHaveLength(still.length + 2);
    expect(keysOf({ ...SIGN, followsNewRows: false })).toEqual(still);
  });
});

describe("a watched paired sign block", () => {
  const pairs = [{ ref: "data" }, { ref: "second" }];
  it("takes its p-value from PAIREDWATCHPVALUE on both ranges with the shift, and decides on it", () => {
    const p = { kind: "call", fn: "PAIREDWATCHPVALUE", args: [...pairs, { number: 0 }, { text: "less" }, { text: "drop" }] };
    expect(rowOf(PAIRED_WATCHING, "pvalue")!.value).toEqual(p);
    expect(rowOf(PAIRED_WATCHING, "decision")!.value).toMatchObject({ kind: "decision", pValue: p });
  });

  it("takes its bounds for the median difference from PAIREDWATCHBOUNDS and states the pairs they read", () => {
    for (const [key, column] of [
      ["lower", 1],
      ["upper", 2],
      ["rowsRead", 3],
    ] as const) {
      expect(rowOf(PAIRED_WATCHING, key)!.value).toEqual({
        kind: "call",
        fn: "PAIREDWATCHBOUNDS",
        args: [...pairs, { number: 0.95 }],
        column,
      });
    }
    expect(rowOf(PAIRED_WATCHING, "lower")!.label).toBe("95% bounds for the median difference, at every pair count at once: lower");
    expect(rowOf(PAIRED_WATCHING, "rowsRead")!.label).toBe("Pairs read by these bounds");
    expect(keysOf(PAIRED_WATCHING)).not.toContain("coverage");
  });

  it("says so in the method row and the audit line, and carries no caution about stopping early", () => {
    expect(textOf(rowOf(PAIRED_WATCHING, "method"))).toMatch(
      /hold however often the result is looked at as rows arrive \(pairs read in sheet order\)/,
    );
    expect(rowOf(PAIRED_WATCHING, "audit")!.value).toMatchObject({ method: expect.stringMatching(/paired \(watching p-value and bounds/) });
    expect(keysOf(PAIRED_WATCHING)).not.toContain("watchPvalue");
    expect(keysOf(PAIRED_WATCHING)).not.toContain("lookingAgain");
  });

  it("keeps the pair rows of the fixed-sample paired block, with the watching rows in place of the bounds", () => {
    expect(keysOf(PAIRED_WATCHING)).toEqual(keysOf(PAIRED).map((key) => (key === "coverage" ? "rowsRead" : key)));
    expect(keysOf(PAIRED_WATCHING)).toContain("pairs");
  });
});

describe("a paired sign block that follows new rows but keeps the fixed-sample test", () => {
  it("keeps PAIRED and shows PAIREDWATCHPVALUE beside it, with the caution naming the watching p-value", () => {
    const keys = keysOf(PAIRED_FOLLOWING);
    expect(rowOf(PAIRED_FOLLOWING, "pvalue")!.value).toMatchObject({ fn: "PAIRED" });
    expect(keys.indexOf("watchPvalue")).toBe(keys.indexOf("pvalue") + 1);
    expect(rowOf(PAIRED_FOLLOWING, "watchPvalue")).toMatchObject({ label: "Watching p-value", value: { fn: "PAIREDWATCHPVALUE" } });
    expect(textOf(rowOf(PAIRED_FOLLOWING, "lookingAgain"))).toMatch(/the watching p-value may be checked at every new row/);
    expect(keys.filter((key) => !keysOf(PAIRED).includes(key))).toEqual(["watchPvalue", "lookingAgain"]);
  });
});

describe("other tests keep their own p-value and bounds", () => {
  const others: BlockRequest[] = [
    { ...SIGN, test: "signed-rank", method: "auto", zeros: "drop", ties: undefined },
    { ...SIGN, test: "quantile", quantile: 0.9, ties: undefined, method: undefined },
  ];
  it.each(others)("and gain only the caution about looking again when they follow new rows (%#)", (request) => {
    const still = keysOf(request);
    for (const watching of [true, false]) {
      const rows = resultBlockRows({ ...request, followsNewRows: true, watching });
      expect(rows.map((r) => r.key).filter((key) => key !== "lookingAgain")).toEqual(still);
      const caution = rows.find((r) => r.key === "lookingAgain")!;
      expect(caution.style).toBe("caution");
      expect(caution.value).toMatchObject({
        kind: "text",
        text: expect.stringContaining("use the sign test's watching p-value (WATCHPVALUE, or PAIREDWATCHPVALUE for pairs)"),
      });
    }
    expect(resultBlockRows({ ...request, followsNewRows: false })).toEqual(resultBlockRows(request));
  });
});

describe("the sheet's formulas and REPORT's direct evaluation agree", () => {
  const data = THICKNESS.map((x) => [x]);
  it.each([WATCHING, FOLLOWING])("row by row (%#)", (request) => {
    const workbook = new Workbook([SHEET]);
    workbook.writeEntries(SHEET, 0, 0, [["Thickness"], ...data]);
    workbook.setFunctions(functions);
    const rows = resultBlockRows(request).filter((r) => r.key !== "audit");
    workbook.writeEntries(
      SHEET,
      0,
      3,
      rows.map((r) => [blockFormula(r.value, { data: `$A$2:$A$${THICKNESS.length + 1}` })]),
    );
    rows.forEach((r, i) => {
      const direct = blockValue(r.value, { data }, callFunction);
      expect([r.key, workbook.value(SHEET, i, 3)]).toEqual([r.key, direct]);
    });
  });

  it("shows the cell functions' own values, and a watching p-value above the fixed-sample one", () => {
    const at = (request: BlockRequest, key: string) => blockValue(rowOf(request, key)!.value, { data }, callFunction);
    const watched = watchpvalue(data, 50, "greater", "drop");
    expect(typeof watched).toBe("number");
    expect(at(WATCHING, "pvalue")).toBe(watched);
    expect(at(FOLLOWING, "watchPvalue")).toBe(watched);
    expect(at(WATCHING, "lower")).toBe(watchbounds(data, 0.95)[0][0]);
    expect(at(WATCHING, "rowsRead")).toBe(THICKNESS.length);
    // The watching p-value pays for every look it allows: here it is larger than the one-look p-value.
    expect(watched as number).toBeGreaterThan(at(FOLLOWING, "pvalue") as number);
  });
});

describe("the sheet's formulas and REPORT's direct evaluation agree for pairs, blanks and text skipped as pairs", () => {
  const first = BEFORE.map((x) => [x]);
  const second = AFTER.map((x) => [x]);
  it.each([PAIRED_WATCHING, PAIRED_FOLLOWING])("row by row (%#)", (request) => {
    const workbook = new Workbook([SHEET]);
    workbook.writeEntries(SHEET, 0, 0, [["Before", "After"], ...BEFORE.map((b, i) => [b, AFTER[i]])] as never);
    workbook.setFunctions(functions);
    const rows = resultBlockRows(request).filter((r) => r.key !== "audit");
    const last = BEFORE.length + 1;
    workbook.writeEntries(
      SHEET,
      0,
      3,
      rows.map((r) => [blockFormula(r.value, { data: `$A$2:$A$${last}`, second: `$B$2:$B$${last}` })]),
    );
    rows.forEach((r, i) => {
      const direct = blockValue(r.value, { data: first, second }, callFunction);
      expect([r.key, workbook.value(SHEET, i, 3)]).toEqual([r.key, direct]);
    });
  });

  it("shows the paired cell functions' own values", () => {
    const at = (request: BlockRequest, key: string) => blockValue(rowOf(request, key)!.value, { data: first, second }, callFunction);
    const watched = pairedwatchpvalue(first, second, 0, "less", "drop");
    expect(typeof watched).toBe("number");
    expect(at(PAIRED_WATCHING, "pvalue")).toBe(watched);
    expect(at(PAIRED_FOLLOWING, "watchPvalue")).toBe(watched);
    expect(at(PAIRED_WATCHING, "lower")).toBe(pairedwatchbounds(first, second, 0.95)[0][0]);
    expect(at(PAIRED_WATCHING, "upper")).toBe(pairedwatchbounds(first, second, 0.95)[0][1]);
    // 40 positions: one both blank (no pair), two with one side blank or text (skipped).
    expect(at(PAIRED_WATCHING, "rowsRead")).toBe(37);
    expect(at(PAIRED_WATCHING, "skipped")).toBe(2);
  });
});
