/**
 * The block of a one-sample sign test whose result is looked at again as rows arrive. With the request's
 * `watching` flag the p-value and bounds rows use WATCHPVALUE and WATCHBOUNDS and the method row says they
 * hold however often the result is looked at; a block that follows new rows (a table column or an
 * open-ended range) but keeps the fixed-sample test shows the watching p-value beside it and a caution
 * against stopping the first time p drops below alpha (common practice: repeated looks at a fixed-sample
 * p-value inflate the false-alarm rate; the Monte Carlo figure is in test/stats). Other tests are unchanged.
 * The sheet's formulas (evaluated by the demo sheet) and REPORT's direct evaluation must agree row by row.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { Workbook } from "../../src/demo/workbook";
import { callFunction, watchbounds, watchpvalue } from "../../src/functions/functions";
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
    expect(textOf(rowOf(WATCHING, "method"))).toMatch(/one sample only/);
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

describe("other tests keep their own p-value and bounds", () => {
  const others: BlockRequest[] = [
    { ...SIGN, paired: true, center: 0, secondName: "After" },
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
        text: expect.stringContaining("use the one-sample sign test's watching p-value"),
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
