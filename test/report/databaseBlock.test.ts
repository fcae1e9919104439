/**
 * The block fed by a database query's answer pasted into cells: the pane's query (databaseQuery.ts) run in
 * DuckDB (@duckdb/node-api) on a small invented table, its row pasted into the demo sheet, the block's
 * formulas calculated there; every row must equal the block evaluated directly (blockValue, as the pane's
 * preview does), and the p-value and bounds must equal PVALUE and BOUNDS on the raw values (the catalogue's
 * own functions, checked elsewhere against R and exact arithmetic).
 */
import { DuckDBInstance, type DuckDBConnection } from "@duckdb/node-api";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { isError } from "../../src/demo/formula/values";
import { Workbook } from "../../src/demo/workbook";
import { bounds, callFunction, orderranks, pvalue } from "../../src/functions/functions";
import { isCellError } from "../../src/functions/runtime";
import {
  blockFormula,
  blockValue,
  PASTED_CHECK_WORDS,
  resultBlockRows,
  type BlockRequest,
  type DatabaseSource,
} from "../../src/report/resultBlock";
import type { Alternative } from "../../src/stats/types";
import { databaseQuery, type DatabaseQuestion } from "../../src/taskpane/databaseQuery";
import { catalogueFunctions } from "../demo/catalogue";

const SHEET = "Query answers";
const CENTER = 50;
const QUESTION: DatabaseQuestion = { table: "panels", column: "thickness", center: CENTER };
const SOURCE: DatabaseSource = { table: "panels", column: "thickness", queryHash: "0".repeat(64) };

let functions: Map<string, CustomFunction>;
let instance: DuckDBInstance;
let connection: DuckDBConnection;
/** The invented measurements, NULLs left out: 151 panels from a hash, some exactly 50. */
const values: number[] = [];

beforeAll(async () => {
  functions = await catalogueFunctions();
  instance = await DuckDBInstance.create(":memory:");
  connection = await instance.connect();
  const rows: string[] = [];
  for (let i = 0; i < 160; i++) {
    const x = i % 17 === 0 ? null : 47 + ((i * 2654435761) % 97) / 12;
    if (x !== null) values.push(x);
    rows.push(`('${["A", "B"][i % 2]}', ${x === null ? "NULL" : String(x)})`);
  }
  await connection.run("CREATE TABLE panels (line VARCHAR, thickness DOUBLE)");
  await connection.run(`INSERT INTO panels VALUES ${rows.join(", ")}`);
});

afterAll(() => {
  connection?.closeSync();
  instance?.closeSync();
});

async function run(sql: string): Promise<unknown[][]> {
  const reader = await connection.runAndReadAll(sql);
  return reader.getRows().map((row) => row.map((v) => (v === null ? "" : typeof v === "string" ? v : Number(v))));
}

/** What a person does: the first run for n, ORDERRANKS for the ranks, the second run with them. */
async function answer(question: DatabaseQuestion, confidence: number): Promise<unknown[]> {
  const [first] = await run(databaseQuery(question, null));
  const [lower, upper] = orderranks(first[0], confidence)[0] as number[];
  const [second] = await run(databaseQuery(question, { lower, upper }));
  return second;
}

/** The row pasted at A2 under its header, the block's formulas in column H; the sheet's value of each row. */
function sheetValues(pasted: readonly unknown[], request: BlockRequest): unknown[] {
  const workbook = new Workbook([SHEET]);
  workbook.setFunctions(functions);
  const header = ["n", "below", "tied", "above", "lower_bound", "upper_bound"];
  workbook.writeEntries(SHEET, 0, 0, [pasted.length === 7 ? ["line", ...header] : header, [...pasted]]);
  const right = String.fromCharCode(64 + pasted.length);
  const rows = resultBlockRows(request);
  workbook.writeEntries(
    SHEET,
    0,
    7,
    rows.map((row) => [blockFormula(row.value, { data: `$A$2:$${right}$2` })]),
  );
  return rows.map((_, i) => workbook.value(SHEET, i, 7));
}

function expectSame(sheet: unknown, direct: unknown, label: string): void {
  if (label === "Audit") {
    expect(String(sheet).split("; reads ")[0], label).toBe(String(direct).split("; reads ")[0]);
  } else if (isCellError(direct)) {
    expect(isError(sheet) ? sheet.code : sheet, label).toBe(direct.code);
  } else if (direct === "" || direct === null) {
    expect(sheet === "" || sheet === null, label).toBe(true);
  } else {
    expect(sheet, label).toEqual(direct);
  }
}

function request(alternative: Alternative, method: "exact" | "midp" | "normal", confidence: number): BlockRequest {
  return {
    test: "sign",
    paired: false,
    center: CENTER,
    alternative,
    alpha: 0.05,
    confidence,
    ties: "drop",
    method,
    dataName: "thickness",
    database: SOURCE,
  };
}

describe("the block from a database query's pasted answer", () => {
  const cases: [Alternative, "exact" | "midp" | "normal", number][] = [
    ["two-sided", "exact", 0.95],
    ["greater", "midp", 0.9],
    ["less", "normal", 0.99],
  ];

  it.each(cases)(
    "%s, %s, confidence %s: the sheet equals the direct evaluation, and PVALUE and BOUNDS on the values",
    async (alt, method, level) => {
      const pasted = await answer(QUESTION, level);
      const req = request(alt, method, level);
      const rows = resultBlockRows(req);
      const direct = rows.map((row) => blockValue(row.value, { data: [pasted] }, callFunction));
      const sheet = sheetValues(pasted, req);
      rows.forEach((row, i) => expectSame(sheet[i], direct[i], row.label));
      const value = (key: string): unknown => direct[rows.findIndex((r) => r.key === key)];
      const cells = values.map((x) => [x]);
      expect(value("pvalue")).toBe(pvalue(cells, CENTER, alt, "drop", method));
      // Two-sided bounds whatever the alternative (the query's ranks are chosen before the direction is).
      const [lower, upper, coverage] = bounds(cells, level, "two-sided", "exact")[0];
      expect([value("lower"), value("upper"), value("coverage")]).toEqual([lower, upper, coverage]);
      expect(value("numbers")).toBe(values.length);
      expect(value("addsUp")).toBe(PASTED_CHECK_WORDS.agree);
      expect(value("used")).toBe((value("below") as number) + (value("above") as number));
    },
  );

  it("a group's row, its label first: the same figures as PVALUE and BOUNDS on that group's values", async () => {
    const grouped = { ...QUESTION, group: "line" };
    const first = await run(databaseQuery(grouped, null));
    const ranks = first.map((r) => {
      const [lower, upper] = orderranks(r[1], 0.95)[0] as number[];
      return { label: r[0] as string, lower, upper };
    });
    const second = await run(databaseQuery(grouped, ranks));
    const lineB = second.find((r) => r[0] === "B") as unknown[];
    const req = { ...request("two-sided", "exact", 0.95), database: { ...SOURCE, group: { column: "line", label: "B" } } };
    const rows = resultBlockRows(req);
    const direct = rows.map((row) => blockValue(row.value, { data: [lineB] }, callFunction));
    const sheet = sheetValues(lineB, req);
    rows.forEach((row, i) => expectSame(sheet[i], direct[i], row.label));
    const value = (key: string): unknown => direct[rows.findIndex((r) => r.key === key)];
    const lineValues = (await run("SELECT thickness FROM panels WHERE line = 'B' AND thickness IS NOT NULL")).map((r) => [r[0]]);
    expect(lineValues.length).toBe(lineB[1]);
    expect(value("pvalue")).toBe(pvalue(lineValues, CENTER, "two-sided"));
    expect([value("lower"), value("upper"), value("coverage")]).toEqual(bounds(lineValues, 0.95, "two-sided", "exact")[0]);
    expect(sheet[0]).toBe("Sign test, one sample, from a database query, group B");
  });

  it("shows a bound the query did not fetch as empty, not 0, and flags a row pasted out of line", () => {
    const req = request("greater", "exact", 0.95);
    const rows = resultBlockRows(req);
    // 70 + 71 + 10 is not 150: a count pasted into the wrong cell, or a row from another run.
    const shifted = [150, 70, 71, 10, 49.5, ""];
    const sheet = sheetValues(shifted, req);
    const at = (key: string): unknown => sheet[rows.findIndex((r) => r.key === key)];
    expect(at("upper") === "" || at("upper") === null).toBe(true);
    expect(at("lower")).toBe(49.5);
    expect(at("addsUp")).toBe(PASTED_CHECK_WORDS.differ);
  });

  it("writes its audit line with the table, the column and the query's fingerprint", () => {
    const rows = resultBlockRows({ ...request("two-sided", "exact", 0.95), database: { ...SOURCE, queryHash: "ab".repeat(32) } });
    const audit = blockFormula(rows[rows.length - 1].value, { data: "$A$2:$F$2", writtenAt: new Date(Date.UTC(2026, 11, 2, 8, 0, 0)) });
    expect(audit).toContain("table panels, column thickness; query SHA-256 " + "ab".repeat(32));
    expect(audit).toContain("reads $A$2:$F$2; written 2026-12-02 08:00:00 UTC");
    expect(() => resultBlockRows({ ...request("two-sided", "exact", 0.95), test: "quantile", quantile: 0.5 })).toThrow(RangeError);
  });
});
