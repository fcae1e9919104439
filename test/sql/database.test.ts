/**
 * The SQL of the README's "Data in a database" section, run as committed (ONE_COLUMN_SQL and BY_GROUP_SQL in
 * src/taskpane/databaseQuery.ts, the one copy the pane fills in too) in DuckDB (@duckdb/node-api, the embedded engine from the npm registry) on a generated table of
 * 10,000,000 rows, against the statistics core on the same values: the counts must equal countSigns, the two
 * order statistics at ORDERRANKS' ranks must equal quantileBounds' exact bounds, and COUNTPVALUE on the counts
 * must equal PVALUE on the values. The rows are made inside DuckDB from range() by a fixed formula (a
 * multiplicative hash modulo 2003, so values repeat and some equal the hypothesised 50 exactly), with every
 * 997th measurement NULL and seven groups. The figures printed are the time DuckDB took.
 */
import { DuckDBInstance, type DuckDBConnection } from "@duckdb/node-api";
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { countpvalue, orderranks, pvalue } from "../../src/functions/functions";
import { quantileBounds } from "../../src/stats/quantileBounds";
import { countSigns } from "../../src/stats/signCounts";
import { BY_GROUP_SQL as BY_GROUP, ONE_COLUMN_SQL as ONE_COLUMN } from "../../src/taskpane/databaseQuery";

const ROWS = 10_000_000;
const GROUPS = 7;
const HYPOTHESISED = 50;
const MINUTES = 180_000;

/** Seconds since `start`, for the printed figures. */
const secondsSince = (start: number): string => ((performance.now() - start) / 1000).toFixed(1);

let instance: DuckDBInstance;
let connection: DuckDBConnection;
/** The non-NULL measurements, in table order, and the group of each. */
let values: Float64Array;
let groups: Uint8Array;

/** Rows of a query as plain objects, DuckDB's BIGINT counts turned into numbers. */
async function rowsOf(sql: string): Promise<Record<string, number | null>[]> {
  const reader = await connection.runAndReadAll(sql);
  return reader.getRowObjects().map((row) => Object.fromEntries(Object.entries(row).map(([k, v]) => [k, v === null ? null : Number(v)])));
}

/** Reads the measurement and group columns once, chunk by chunk, into typed arrays. */
async function fetchColumns(): Promise<void> {
  const result = await connection.run("SELECT measurement, group_label FROM measurements WHERE measurement IS NOT NULL");
  const xs = new Float64Array(ROWS);
  const gs = new Uint8Array(ROWS);
  let k = 0;
  for (let chunk = await result.fetchChunk(); chunk !== null && chunk.rowCount > 0; chunk = await result.fetchChunk()) {
    const measurement = chunk.getColumnVector(0);
    const group = chunk.getColumnVector(1);
    for (let i = 0; i < chunk.rowCount; i++, k++) {
      xs[k] = measurement.getItem(i) as number;
      gs[k] = group.getItem(i) as number;
    }
  }
  values = xs.subarray(0, k);
  groups = gs.subarray(0, k);
}

beforeAll(async () => {
  instance = await DuckDBInstance.create(":memory:");
  connection = await instance.connect();
  const start = performance.now();
  await connection.run(`
    CREATE TABLE measurements AS
    SELECT CAST(i % ${GROUPS} AS INTEGER) AS group_label,
           CASE WHEN i % 997 = 0 THEN NULL ELSE 40 + CAST((i * 2654435761) % 2003 AS DOUBLE) / 100 END AS measurement
    FROM range(${ROWS}) AS t(i)`);
  console.log(`DuckDB: ${ROWS.toLocaleString("en-US")} generated rows in ${secondsSince(start)} s`);
  await fetchColumns();
}, MINUTES);

afterAll(() => {
  connection?.closeSync();
  instance?.closeSync();
});

describe("the README's SQL on a small table, as the README describes it", () => {
  it("leaves out NULL measurements, and gives empty bounds to a group without ranks and to a NULL label", async () => {
    const small = await DuckDBInstance.create(":memory:");
    const c = await small.connect();
    try {
      await c.run(`CREATE TABLE measurements (group_label VARCHAR, measurement DOUBLE)`);
      // Invented: line A 49, 50, 51, 52, NULL; line B 47, 53; a row with no label.
      await c.run(
        `INSERT INTO measurements VALUES ('A', 49), ('A', 50), ('A', 51), ('A', 52), ('A', NULL), ('B', 47), ('B', 53), (NULL, 50.5)`,
      );
      await c.run(`CREATE TABLE median_question AS SELECT 50 AS hypothesised_median, 2 AS lower_rank, 6 AS upper_rank`);
      await c.run(`CREATE TABLE group_ranks (group_label VARCHAR, lower_rank BIGINT, upper_rank BIGINT)`);
      await c.run(`INSERT INTO group_ranks VALUES ('A', 1, 4), (NULL, 1, 1)`);
      const one = (await c.runAndReadAll(ONE_COLUMN))
        .getRowObjects()
        .map((r) => Object.values(r).map((v) => (v === null ? null : Number(v))));
      // Seven values 47, 49, 50, 50.5, 51, 52, 53 (by hand): 2 below 50, 1 tied, 4 above; 2nd smallest 49, 6th 52.
      expect(one).toEqual([[7, 2, 1, 4, 49, 52]]);
      const grouped = (await c.runAndReadAll(BY_GROUP))
        .getRowObjects()
        .map((r) => Object.values(r).map((v) => (v === null || typeof v === "string" ? v : Number(v))));
      expect(grouped).toEqual([
        ["A", 4, 1, 1, 2, 49, 52],
        ["B", 2, 1, 0, 1, null, null],
        [null, 1, 0, 0, 1, null, null],
      ]);
    } finally {
      c.closeSync();
      small.closeSync();
    }
  });
});

describe("the README's SQL in DuckDB", () => {
  it("is the text the README quotes", () => {
    const readme = readFileSync(new URL("../../README.md", import.meta.url), "utf8");
    expect(readme).toContain("```sql\n" + ONE_COLUMN + "```");
    expect(readme).toContain("```sql\n" + BY_GROUP + "```");
  });

  it(
    "gives the core's counts and exact median bounds for one column, and COUNTPVALUE equals PVALUE",
    async () => {
      const counts = countSigns(values, HYPOTHESISED);
      const n = values.length;
      expect(n).toBe(ROWS - Math.ceil(ROWS / 997));
      const [lowerRank, upperRank, coverage] = orderranks(n)[0];
      await connection.run(
        `CREATE OR REPLACE TABLE median_question AS SELECT ${HYPOTHESISED} AS hypothesised_median, ${lowerRank} AS lower_rank, ${upperRank} AS upper_rank`,
      );
      const start = performance.now();
      const [row] = await rowsOf(ONE_COLUMN);
      console.log(`DuckDB: one-column query over ${ROWS.toLocaleString("en-US")} rows in ${secondsSince(start)} s`);
      expect(row.n).toBe(n);
      expect({ below: row.below, tied: row.tied, above: row.above }).toEqual({
        below: counts.below,
        tied: counts.tied,
        above: counts.above,
      });
      expect(counts.tied).toBeGreaterThan(0);
      const core = quantileBounds(values, { quantile: 0.5, confidence: 0.95, side: "two-sided", method: "exact" });
      if (!core.available) throw new Error("the core found no bounds");
      expect([core.lowerRank, core.upperRank, core.achievedConfidence]).toEqual([lowerRank, upperRank, coverage]);
      expect([row.lower_bound, row.upper_bound]).toEqual([core.lower, core.upper]);
      for (const alternative of ["two-sided", "greater", "less"]) {
        expect(countpvalue(row.above, row.below, alternative)).toBe(pvalue([Array.from(values)], HYPOTHESISED, alternative));
      }
    },
    MINUTES,
  );

  it(
    "gives every group's counts and bounds in one GROUP BY",
    async () => {
      const byGroup = Array.from({ length: GROUPS }, () => [] as number[]);
      for (let i = 0; i < values.length; i++) byGroup[groups[i]].push(values[i]);
      const ranks = byGroup.map((group, label) => {
        const [lower, upper] = orderranks(group.length, 0.99)[0];
        return `(${label}, ${lower}, ${upper})`;
      });
      await connection.run(`CREATE OR REPLACE TABLE median_question AS SELECT ${HYPOTHESISED} AS hypothesised_median`);
      await connection.run(`CREATE OR REPLACE TABLE group_ranks (group_label INTEGER, lower_rank BIGINT, upper_rank BIGINT)`);
      await connection.run(`INSERT INTO group_ranks VALUES ${ranks.join(", ")}`);
      const start = performance.now();
      const rows = await rowsOf(BY_GROUP);
      console.log(`DuckDB: grouped query (${GROUPS} groups) over ${ROWS.toLocaleString("en-US")} rows in ${secondsSince(start)} s`);
      expect(rows.map((row) => row.group_label)).toEqual(byGroup.map((_, label) => label));
      for (const row of rows) {
        const group = Float64Array.from(byGroup[row.group_label as number]);
        const counts = countSigns(group, HYPOTHESISED);
        const core = quantileBounds(group, { confidence: 0.99 });
        if (!core.available) throw new Error("the core found no bounds");
        expect(row).toEqual({
          group_label: row.group_label,
          n: group.length,
          below: counts.below,
          tied: counts.tied,
          above: counts.above,
          lower_bound: core.lower,
          upper_bound: core.upper,
        });
      }
    },
    MINUTES,
  );
});
