/**
 * Looking again as rows arrive, on the demo page: the Settings step asks only when the block follows new
 * rows (the range becomes a table by default; "Use exactly these cells" does not follow them), a "yes" writes
 * the watching p-value (WATCHPVALUE) into the block, and the written block loads back into the pane with
 * that answer. Data: the invented paint-line sheet (src/demo/inventedData.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  browserAvailable,
  closeSession,
  eventually,
  openDemo,
  paneToSettings,
  rowOfLabel,
  selectCells,
  startSession,
  type Session,
} from "./browser";

const QUESTION = "Will you look at this result again as new rows arrive?";

describe.skipIf(!browserAvailable())("looking again as rows arrive", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  it("asks only when the block follows new rows, writes the watching p-value, and loads the answer back", async () => {
    const page = await openDemo(session);
    await paneToSettings(page);
    const question = page.getByLabel(QUESTION);
    expect(await question.isVisible()).toBe(true);
    expect(await question.inputValue()).toBe("once");

    await page.getByRole("button", { name: "1. Data" }).click();
    await page.getByLabel("Use exactly these cells").check();
    await page.getByRole("button", { name: "3. Settings" }).click();
    expect(await question.isVisible()).toBe(false);

    await page.getByRole("button", { name: "1. Data" }).click();
    await page.getByLabel("Turn the range into a table").check();
    await page.getByRole("button", { name: "3. Settings" }).click();
    await question.selectOption("again");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByRole("button", { name: /write the block$/i }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The block was written to 'Paint line'!E1:F");
    const pLine = await rowOfLabel(page, 4, "p-value");
    const formula = await page.evaluate((row) => window.evensplitDemo?.workbook.entry("Paint line", row, 5), pLine);
    expect(formula).toBe('=EVENSPLIT.WATCHPVALUE(Table1[[Thickness (µm)]],50,"two-sided","drop")');

    await page.getByRole("button", { name: "Start over" }).click();
    await selectCells(page, "F7");
    await page.getByRole("button", { name: "Edit the block at the selection" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("is loaded");
    await page.getByRole("button", { name: "3. Settings" }).click();
    expect(await question.inputValue()).toBe("again");
    await page.close();
  });
});
