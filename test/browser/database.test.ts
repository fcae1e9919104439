/**
 * Data in a database, walked on the demo page: the pane's first query is copied from the page and run in
 * DuckDB (@duckdb/node-api) on a table holding the demo's invented thickness column under awkward names;
 * its answer is typed into the sheet and given to the pane, whose second query (with ORDERRANKS' ranks) is
 * run the same way and typed over it; the block written from those cells must show PVALUE's p-value and
 * BOUNDS' bounds on the demo's own column. The session's ending checks that no request left the loopback
 * server: the add-in runs no query itself.
 */
import { DuckDBInstance, type DuckDBConnection } from "@duckdb/node-api";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { bounds, pvalue } from "../../src/functions/functions";
import { browserAvailable, closeSession, eventually, openDemo, snap, startSession, typeIntoCell, typeRange, type Session } from "./browser";

const ANSWER = "Cells holding the pasted answer";
/** Where the answers are typed: the header row at E1:J1, the numbers at E2:J2. */
const COLUMNS = ["E", "F", "G", "H", "I", "J"];

describe.skipIf(!browserAvailable())("data in a database, on the demo page", () => {
  let session: Session;
  let instance: DuckDBInstance;
  let connection: DuckDBConnection;
  /** The demo's thickness column as cells (B2:B25). */
  const thickness = demoRows()
    .slice(1)
    .map((row) => [row[1] ?? ""]);

  beforeAll(async () => {
    session = await startSession();
    instance = await DuckDBInstance.create(":memory:");
    connection = await instance.connect();
    await connection.run(`CREATE TABLE "paint ""line"" panels" ("Thickness (µm)" DOUBLE)`);
    const values = thickness.map(([x]) => (typeof x === "number" ? String(x) : "NULL"));
    await connection.run(`INSERT INTO "paint ""line"" panels" VALUES ${values.map((v) => `(${v})`).join(", ")}`);
  });

  afterAll(async () => {
    connection?.closeSync();
    instance?.closeSync();
    await closeSession(session);
  });

  /** Runs a query shown by the pane in DuckDB and types its one answer row into E2:J2. */
  async function runAndPaste(page: Page, which: "First" | "Second"): Promise<unknown[]> {
    const sql = await page.getByLabel(`${which} query`).innerText();
    const reader = await connection.runAndReadAll(sql);
    const [row] = reader.getRows().map((r) => r.map((v) => (v === null ? null : Number(v))));
    for (let i = 0; i < row.length; i++) if (row[i] !== null) await typeIntoCell(page, `${COLUMNS[i]}2`, String(row[i]));
    return row;
  }

  it("gives the queries, reads the pasted answers and writes a block that equals PVALUE and BOUNDS on the column", async () => {
    const page = await openDemo(session);
    await page.getByRole("radio", { name: "Data in a database" }).check();
    const part = page.locator(".es-database");
    await part.getByLabel("Table", { exact: true }).fill('paint "line" panels');
    await part.getByLabel("Column with the values").fill("Thickness (µm)");
    await part.getByLabel("Median the counts compare with").fill("50");
    await eventually(() => page.getByLabel("First query").innerText()).toContain('FROM "paint ""line"" panels"');
    await page.getByRole("button", { name: "Copy the first query" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The first query was copied");

    for (const [i, name] of ["n", "below", "tied", "above", "lower_bound", "upper_bound"].entries())
      await typeIntoCell(page, `${COLUMNS[i]}1`, name);
    const first = await runAndPaste(page, "First");
    expect(first.slice(4)).toEqual([null, null]);
    await typeRange(page, ANSWER, "E1:J2");
    await eventually(() => part.locator(".es-database-next").innerText()).toContain("Run the second query");
    await snap(page, "database-first-answer");

    const second = await runAndPaste(page, "Second");
    await typeRange(page, ANSWER, "E1:J2");
    await eventually(() => part.locator(".es-database-next").innerText()).toBe("The answer is complete: go on to the question.");
    expect(second.slice(0, 4)).toEqual(first.slice(0, 4));

    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByLabel(/The median of “Thickness \(µm\)” is/).selectOption("greater");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByRole("button", { name: /write the block$/i }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The block was written to 'Paint line'!L2:M");
    await snap(page, "database-block", true);

    const valueOf = (label: string): Promise<unknown> =>
      page.evaluate(
        ([sheet, wanted]) => {
          const book = window.evensplitDemo?.workbook;
          for (let r = 0; r < 60; r++) if (book?.value(sheet, r, 11) === wanted) return book.value(sheet, r, 12);
          return undefined;
        },
        [DEMO_SHEET, label] as const,
      );
    expect(await valueOf("p-value")).toBe(pvalue(thickness, 50, "greater"));
    const [lower, upper, coverage] = bounds(thickness, 0.95, "two-sided", "exact")[0];
    expect(await valueOf("95% bounds for the median (two-sided): lower")).toBe(lower);
    expect(await valueOf("95% bounds for the median (two-sided): upper")).toBe(upper);
    expect(await valueOf("Exact coverage of these bounds")).toBe(coverage);
    expect(await valueOf("Pasted counts (n against below + tied + above)")).toBe("Agrees: n equals below + tied + above");
    const audit = String(await valueOf("Audit"));
    expect(audit).toContain('table paint "line" panels, column Thickness (µm); query SHA-256 ');
    expect(audit).toMatch(/SHA-256 [0-9a-f]{64}; reads \$E\$2:\$J\$2; written /);
    await page.close();
  });
});
