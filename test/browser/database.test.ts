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
import { DEMO_SHEET, demoRows, groupRows } from "../../src/demo/inventedData";
import { bounds, pvalue } from "../../src/functions/functions";
import { browserAvailable, closeSession, eventually, openDemo, snap, startSession, typeIntoCell, typeRange, type Session } from "./browser";

const ANSWER = "Cells holding the pasted answer";
/** Where the answers are typed: the header row at E1, the numbers from E2 (a seventh column, K, for groups). */
const COLUMNS = ["E", "F", "G", "H", "I", "J", "K"];

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
    // The demo's second sheet: panels from three lines, one with no line written down (a NULL group).
    await connection.run(`CREATE TABLE line_panels (line VARCHAR, thickness DOUBLE)`);
    const lines = groupRows()
      .slice(1)
      .filter((row) => typeof row[2] === "number")
      .map((row) => `(${row[1] === null ? "NULL" : `'${row[1]}'`}, ${row[2]})`);
    await connection.run(`INSERT INTO line_panels VALUES ${lines.join(", ")}`);
  });

  afterAll(async () => {
    connection?.closeSync();
    instance?.closeSync();
    await closeSession(session);
  });

  /** Runs a query shown by the pane in DuckDB and types its answer rows from E2 (blank for NULL). */
  async function runAndPasteAll(page: Page, which: "First" | "Second"): Promise<unknown[][]> {
    const sql = await page.getByLabel(`${which} query`).innerText();
    const reader = await connection.runAndReadAll(sql);
    const rows = reader.getRows().map((r) => r.map((v) => (v === null ? null : typeof v === "string" ? v : Number(v))));
    for (const [r, row] of rows.entries())
      for (let i = 0; i < row.length; i++) if (row[i] !== null) await typeIntoCell(page, `${COLUMNS[i]}${r + 2}`, String(row[i]));
    return rows;
  }

  async function runAndPaste(page: Page, which: "First" | "Second"): Promise<unknown[]> {
    return (await runAndPasteAll(page, which))[0];
  }

  /** The value beside a label in the block's label column (L by default), on the demo's first sheet. */
  function valueBeside(page: Page, label: string, column = 11): Promise<unknown> {
    return page.evaluate(
      ([sheet, wanted, c]) => {
        const book = window.evensplitDemo?.workbook;
        for (let r = 0; r < 60; r++) if (book?.value(sheet, r, c) === wanted) return book.value(sheet, r, c + 1);
        return undefined;
      },
      [DEMO_SHEET, label, column] as const,
    );
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

    const valueOf = (label: string): Promise<unknown> => valueBeside(page, label);
    expect(await valueOf("p-value")).toBe(pvalue(thickness, 50, "greater"));
    const [lower, upper, coverage] = bounds(thickness, 0.95, "two-sided", "exact")[0];
    expect(await valueOf("95% bounds for the median (two-sided): lower")).toBe(lower);
    expect(await valueOf("95% bounds for the median (two-sided): upper")).toBe(upper);
    expect(await valueOf("Exact coverage of these bounds")).toBe(coverage);
    expect(await valueOf("Pasted counts (n against below + tied + above)")).toBe("Agrees: n equals below + tied + above");
    const audit = String(await valueOf("Audit"));
    expect(audit).toContain('table paint "line" panels, column Thickness (µm); query SHA-256 ');
    expect(audit).toMatch(/SHA-256 [0-9a-f]{64}; reads \$E\$2:\$J\$2; written /);

    // A confidence changed after the answer was pasted: the answer no longer fits, and the pane says so.
    await page.getByRole("button", { name: "3. Settings" }).click();
    await page.getByLabel("Confidence level of the bounds").fill("0.9");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("changed after this answer was pasted");
    await page.close();
  });

  it("with a group column: one answer row per group, and the block for the group chosen", async () => {
    const page = await openDemo(session);
    await page.getByRole("radio", { name: "Data in a database" }).check();
    const part = page.locator(".es-database");
    await part.getByLabel("Table", { exact: true }).fill("line_panels");
    await part.getByLabel("Column with the values").fill("thickness");
    await part.getByLabel("Group column (optional)").fill("line");
    await part.getByLabel("Median the counts compare with").fill("50");
    await eventually(() => page.getByLabel("First query").innerText()).toContain("SELECT line AS group_label, thickness AS measurement");
    const first = await runAndPasteAll(page, "First");
    // By hand from src/demo/inventedData.ts: East, North, South, and the panel with no line (NULL, sorted last).
    expect(first.map((row) => row[0])).toEqual(["East", "North", "South", null]);
    const end = first.length + 1;
    await typeRange(page, ANSWER, `E2:K${end}`);
    await eventually(() => part.locator(".es-database-next").innerText()).toContain("Run the second query");
    await runAndPasteAll(page, "Second");
    await typeRange(page, ANSWER, `E2:K${end}`);
    await part.getByLabel("The block reads the row of group").selectOption({ label: "South" });
    await eventually(() => part.locator(".es-database-next").innerText()).toBe("The answer is complete: go on to the question.");
    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByRole("button", { name: "Next: settings" }).click();
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByRole("button", { name: /write the block$/i }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The block was written to 'Paint line'!M4:N");
    const south = groupRows()
      .slice(1)
      .filter((row) => row[1] === "South" && typeof row[2] === "number")
      .map((row) => [row[2]]);
    expect(await valueBeside(page, "Evensplit result", 12)).toBe("Sign test, one sample, from a database query, group South");
    expect(await valueBeside(page, "p-value", 12)).toBe(pvalue(south, 50, "two-sided"));
    const [lower, upper] = bounds(south, 0.95, "two-sided", "exact")[0];
    expect(await valueBeside(page, "95% bounds for the median (two-sided): lower", 12)).toBe(lower);
    expect(await valueBeside(page, "95% bounds for the median (two-sided): upper", 12)).toBe(upper);
    await page.close();
  });
});
