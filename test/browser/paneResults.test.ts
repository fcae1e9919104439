/**
 * Results out of the pane, on the demo page: "Copy as text" puts one report
 * sentence and then the block's rows on the clipboard, as plain text and as
 * an HTML table (read back from the page's copy event, as a paste target
 * would receive them); and a written block loaded again from one of its
 * cells, changed, and replaced where it is. Expected p-value: exact binomial sum in BigInt
 * (exact arithmetic); counts by hand from src/demo/inventedData.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { NUMBER_FORMATS } from "../../src/report/resultBlock";
import { formatCell } from "../../src/taskpane/numberFormat";
import {
  browserAvailable,
  cellText,
  closeSession,
  eventually,
  openDemo,
  paneToResult,
  rowOfLabel,
  selectCells,
  snap,
  startSession,
  type Session,
} from "./browser";
import { binomialCoefficient as choose } from "../exact";

describe.skipIf(!browserAvailable())("results out of the pane", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  it("copies one report sentence and the rows, as text and as an HTML table", async () => {
    const page = await openDemo(session);
    await paneToResult(page);
    await page.evaluate(() => {
      window.addEventListener("copy", (event) => {
        const data = (event as ClipboardEvent).clipboardData;
        (window as unknown as { copied: { text: string; html: string } }).copied = {
          text: data?.getData("text/plain") ?? "",
          html: data?.getData("text/html") ?? "",
        };
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

  it("loads a written block from one of its cells, and replaces it in place after a change", async () => {
    const page = await openDemo(session);
    await paneToResult(page);
    await page.getByRole("button", { name: "2. Question" }).click();
    await page.getByLabel(/^The median of “Thickness/).selectOption("greater");
    await page.getByRole("button", { name: "3. Settings" }).click();
    await page.getByLabel("Alpha (significance level)").fill("0.01");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByRole("button", { name: /write the block$/i }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The block was written to 'Paint line'!E1:F");
    await page.getByRole("button", { name: "Start over" }).click();

    await selectCells(page, "F7");
    await page.getByRole("button", { name: "Edit the block at the selection" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The block at 'Paint line'!E1:F");
    expect(await page.getByLabel("Top-left cell of the block").inputValue()).toBe("'Paint line'!E1");
    await page.getByRole("button", { name: "2. Question" }).click();
    expect(await page.getByLabel("Hypothesised median").inputValue()).toBe("50");
    expect(await page.getByLabel(/^The median of “Thickness/).inputValue()).toBe("greater");
    await page.getByLabel("Signed-rank test (Wilcoxon)").check();
    await page.getByRole("button", { name: "3. Settings" }).click();
    expect(await page.getByLabel("Alpha (significance level)").inputValue()).toBe("0.01");
    await snap(page, "36-edit-loaded-light");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByRole("button", { name: /write the block$/i }).click();
    await page.getByRole("button", { name: "Replace them" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The earlier block at E1:F");
    expect(await cellText(page, 0, 5)).toBe("Wilcoxon signed-rank test, one sample");
    const decision = await rowOfLabel(page, 4, "Decision at alpha = 0.01");
    expect(decision).toBeGreaterThan(0);
    await page.close();
  });
});
