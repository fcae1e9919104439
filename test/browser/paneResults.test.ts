/**
 * Results out of the pane, on the demo page: "Copy as text" puts one report
 * sentence and then the block's rows on the clipboard, as plain text and as
 * an HTML table (read back from the page's copy event, as a paste target
 * would receive them). Expected p-value: exact binomial sum in BigInt
 * (exact arithmetic); counts by hand from src/demo/inventedData.ts.
 */
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { NUMBER_FORMATS } from "../../src/report/resultBlock";
import { formatCell } from "../../src/taskpane/numberFormat";
import { browserAvailable, openDemo, snap, startSession, type Session } from "./browser";

function eventually<T>(read: () => Promise<T> | T) {
  return expect.poll(read, { timeout: 15_000, interval: 50 });
}

function choose(n: number, k: number): bigint {
  let c = 1n;
  for (let i = 1; i <= k; i++) c = (c * BigInt(n - k + i)) / BigInt(i);
  return c;
}

async function toResult(page: Page): Promise<void> {
  const values = page.getByLabel("Values", { exact: true });
  await values.fill("B1:B25");
  await values.press("Enter");
  await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
  await page.getByRole("button", { name: "Next: the question" }).click();
  await page.getByLabel("Hypothesised median").fill("50");
  await page.getByRole("button", { name: "Next: settings" }).click();
  await page.getByRole("button", { name: "Next: the result" }).click();
}

describe.skipIf(!browserAvailable())("results out of the pane", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(async () => {
    if (!session) return;
    const problems = [...session.problems];
    await session.close();
    expect(problems).toEqual([]);
  });

  it("copies one report sentence and the rows, as text and as an HTML table", async () => {
    const page = await openDemo(session);
    await toResult(page);
    await page.evaluate(() => {
      window.addEventListener("copy", (event) => {
        const data = (event as ClipboardEvent).clipboardData;
        (window as unknown as { copied: { text: string; html: string } }).copied = { text: data?.getData("text/plain") ?? "", html: data?.getData("text/html") ?? "" };
      });
    });
    await page.getByRole("button", { name: "Copy as text" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The result was copied");
    const copied = await page.evaluate(() => (window as unknown as { copied: { text: string; html: string } }).copied);
    const lines = copied.text.split("\n");
    // By hand: 16 of 22 above 50, 5 below, one tie: two-sided p = 2 P(X >= 16), X ~ Binomial(21, 1/2).
    let tail = 0n;
    for (let j = 16; j <= 21; j++) tail += choose(21, j);
    const p = formatCell((2 * Number(tail)) / 2 ** 21, NUMBER_FORMATS.pvalue);
    expect(lines[0]).toContain("Sign test, one sample");
    expect(lines[0]).toContain("n = 21 of 22 numbers (1 equal to 50 left out)");
    expect(lines[0]).toContain(`exact p = ${p}`);
    expect(lines).toContain(`p-value\t${p}`);
    expect(copied.html).toContain("<table>");
    expect(copied.html).toContain(`<th>p-value</th><td>${p}</td>`);
    await snap(page, "35-copied-light");
    await page.close();
  });
});
