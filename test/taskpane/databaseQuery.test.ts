/**
 * The query the pane hands out for data in a database: names that cannot break it, the value as a numeric
 * literal, and, run in DuckDB (@duckdb/node-api, the embedded engine from the npm registry) on a small
 * generated table with awkward names, counts and bounds equal to the statistics core's on the same values.
 */
import { DuckDBInstance, type DuckDBConnection } from "@duckdb/node-api";
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { orderranks } from "../../src/functions/functions";
import { quantileBounds } from "../../src/stats/quantileBounds";
import { countSigns } from "../../src/stats/signCounts";
import {
  BY_GROUP_SQL,
  databaseQuery,
  ONE_COLUMN_SQL,
  readNames,
  sqlName,
  sqlNumber,
  sqlTableName,
  type DatabaseQuestion,
} from "../../src/taskpane/databaseQuery";
import { sha256Hex } from "../../src/taskpane/sha256";

describe("names and numbers in the query", () => {
  it("writes plain names as typed and quotes the rest, doubling a double quote inside", () => {
    expect(sqlName("thickness", "The column")).toEqual({ ok: true, sql: "thickness" });
    expect(sqlName("Thickness_um2", "The column")).toEqual({ ok: true, sql: "Thickness_um2" });
    expect(sqlName("Thickness (µm)", "The column")).toEqual({ ok: true, sql: '"Thickness (µm)"' });
    expect(sqlName('a"b', "The column")).toEqual({ ok: true, sql: '"a""b"' });
    expect(sqlName('x" FROM t; DROP TABLE t; --', "The column")).toEqual({ ok: true, sql: '"x"" FROM t; DROP TABLE t; --"' });
    // Reserved words (SQL:2003) are quoted, whatever their case.
    expect(sqlName("Group", "The column")).toEqual({ ok: true, sql: '"Group"' });
    expect(sqlName("2nd", "The column")).toEqual({ ok: true, sql: '"2nd"' });
  });

  it("refuses empty names, control characters and a stray space", () => {
    expect(sqlName("", "The column").ok).toBe(false);
    expect(sqlName("a\nb", "The column")).toEqual({
      ok: false,
      message: "The column holds a line break or another control character; type the name alone.",
    });
    expect(sqlName(" a", "The column").ok).toBe(false);
    expect(sqlTableName("plant..panels").ok).toBe(false);
    expect(sqlTableName("  ").ok).toBe(false);
  });

  it("takes a qualified table name part by part", () => {
    expect(sqlTableName("plant.panels")).toEqual({ ok: true, sql: "plant.panels" });
    expect(sqlTableName('plant."line 2"')).toEqual({ ok: true, sql: 'plant."""line 2"""' });
    expect(readNames({ table: "panels", column: " thickness ", group: " ", center: 50 })).toEqual({
      ok: true,
      table: "panels",
      column: "thickness",
      group: null,
    });
  });

  it("writes numbers as numeric literals that read back as the same double", () => {
    expect(sqlNumber(50)).toBe("50");
    expect(sqlNumber(-49.25)).toBe("-49.25");
    expect(sqlNumber(1e-7)).toBe("1E-7");
    expect(sqlNumber(1.5e300)).toBe("1.5E300");
    expect(() => sqlNumber(Number.NaN)).toThrow(RangeError);
  });

  it("puts the README's text after the person's tables, character for character", () => {
    const question = { table: "panels", column: "thickness", center: 50 };
    const body = (template: string): string => template.slice(template.indexOf("WITH ") + "WITH ".length);
    expect(databaseQuery(question, null).endsWith(body(ONE_COLUMN_SQL))).toBe(true);
    expect(databaseQuery({ ...question, group: "line" }, null).endsWith(body(BY_GROUP_SQL))).toBe(true);
  });
});

describe("sha256Hex", () => {
  it("gives the digests of FIPS 180-2's examples and of Node's crypto", () => {
    // FIPS 180-2, Appendix B.1 and B.2 (one-block and two-block messages).
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq")).toBe(
      "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1",
    );
    for (const text of ["", "µm", databaseQuery({ table: "panels", column: "thickness", center: 50 }, null), "x".repeat(1000)]) {
      expect(sha256Hex(text)).toBe(createHash("sha256").update(text, "utf8").digest("hex"));
    }
  });
});

/** Awkward names on purpose: a quote in the table's name, a space and a quote in the column's, a reserved word for the groups. */
const TABLE = 'paint "line" runs';
const COLUMN = "Thick'ness µm";
const GROUP = "group";
const CENTER = 50;

let instance: DuckDBInstance;
let connection: DuckDBConnection;
/** The generated rows: group label and measurement (null for a NULL). */
const rows: { group: string; x: number | null }[] = [];

beforeAll(async () => {
  instance = await DuckDBInstance.create(":memory:");
  connection = await instance.connect();
  // Invented values: 301 rows over three groups, a multiplicative hash modulo 211 so values repeat and some equal 50,
  // every 37th one NULL.
  for (let i = 0; i < 301; i++) {
    const x = i % 37 === 0 ? null : 40 + ((i * 2654435761) % 211) / 10;
    rows.push({ group: ["A", "B", "C"][i % 3], x });
  }
  const quoted = (name: string): string => `"${name.replace(/"/g, '""')}"`;
  await connection.run(`CREATE TABLE ${quoted(TABLE)} (${quoted(GROUP)} VARCHAR, ${quoted(COLUMN)} DOUBLE)`);
  const values = rows.map((r) => `('${r.group}', ${r.x === null ? "NULL" : String(r.x)})`).join(", ");
  await connection.run(`INSERT INTO ${quoted(TABLE)} VALUES ${values}`);
});

afterAll(() => {
  connection?.closeSync();
  instance?.closeSync();
});

async function run(sql: string): Promise<(string | number | null)[][]> {
  const reader = await connection.runAndReadAll(sql);
  return reader.getRows().map((row) => row.map((v) => (v === null || typeof v === "string" ? v : Number(v))));
}

function valuesOf(group?: string): Float64Array {
  return Float64Array.from(rows.filter((r) => r.x !== null && (group === undefined || r.group === group)).map((r) => r.x as number));
}

describe("the pane's query in DuckDB", () => {
  const question: DatabaseQuestion = { table: TABLE, column: COLUMN, center: CENTER };

  it("first run: the core's counts and n, the bounds empty", async () => {
    const values = valuesOf();
    const counts = countSigns(values, CENTER);
    expect(counts.tied).toBeGreaterThan(0);
    expect(await run(databaseQuery(question, null))).toEqual([[values.length, counts.below, counts.tied, counts.above, null, null]]);
  });

  it("second run with ORDERRANKS' ranks: the core's exact bounds, two-sided and one-sided", async () => {
    const values = valuesOf();
    const counts = countSigns(values, CENTER);
    for (const side of ["two-sided", "lower", "upper"] as const) {
      const [lower, upper] = orderranks(values.length, 0.9, 0.5, side)[0] as (number | "")[];
      const ranks = { lower: lower === "" ? null : lower, upper: upper === "" ? null : upper };
      const core = quantileBounds(values, { quantile: 0.5, confidence: 0.9, side, method: "exact" });
      if (!core.available) throw new Error("the core found no bounds");
      expect(await run(databaseQuery(question, ranks))).toEqual([
        [values.length, counts.below, counts.tied, counts.above, core.lower ?? null, core.upper ?? null],
      ]);
    }
  });

  it("grouped: each group's counts, then each group's bounds at its own ranks", async () => {
    const grouped = { ...question, group: GROUP };
    const first = await run(databaseQuery(grouped, null));
    expect(first.map((r) => r[0])).toEqual(["A", "B", "C"]);
    const ranks = first.map((r) => {
      const [lower, upper] = orderranks(r[1], 0.95)[0] as number[];
      return { label: r[0], lower, upper };
    });
    const second = await run(databaseQuery(grouped, ranks));
    for (const [label, n, below, tied, above, lower, upper] of second) {
      const values = valuesOf(label as string);
      const counts = countSigns(values, CENTER);
      const core = quantileBounds(values, { confidence: 0.95 });
      if (!core.available) throw new Error("the core found no bounds");
      expect([n, below, tied, above, lower, upper]).toEqual([
        values.length,
        counts.below,
        counts.tied,
        counts.above,
        core.lower,
        core.upper,
      ]);
    }
  });

  it("a name with quotes stays one name: a name the table lacks is an error, not another statement", async () => {
    const hostile = { ...question, column: `${COLUMN}" FROM x; DROP TABLE "${TABLE}"; --` };
    await expect(run(databaseQuery(hostile, null))).rejects.toThrow(/not found|does not have a column/i);
    expect(await run(`SELECT COUNT(*) FROM "${TABLE.replace(/"/g, '""')}"`)).toEqual([[rows.length]]);
  });
});
