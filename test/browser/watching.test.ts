/**
 * Looking again as rows arrive, on the demo page: the Settings step asks only when the block follows new
 * rows (the range becomes a table by default; "Use exactly these cells" does not follow them), a "yes" writes
 * the watching p-value (WATCHPVALUE, or PAIREDWATCHPVALUE and PAIREDWATCHBOUNDS for pairs) into the block,
 * the block follows a new row, and the written block loads back into the pane with that answer. Expected
 * values come from the cell functions run in Node on the same invented rows (their own tests check them
 * against exact arithmetic). Data: the invented paint-line sheet (src/demo/inventedData.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demoRows } from "../../src/demo/inventedData";
import { pairedwatchbounds, pairedwatchpvalue } from "../../src/functions/functions";
import {
  browserAvailable,
  closeSession,
  eventually,
  openDemo,
  paneToPairedSettings,
  paneToSettings,
  rowOfLabel,
  selectCells,
  startSession,
  typeIntoCell,
  type Session,
} from "./browser";

/** A column of the demo sheet's body as the pane reads it (blank as ""). */
function demoColumn(c: number, extra: unknown[] = []): unknown[][] {
  return [
    ...demoRows()
      .slice(1)
      .map((row) => [row[c] ?? ""]),
    ...extra.map((x) => [x]),
  ];
}

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

  it("for pairs: asks, writes PAIREDWATCHPVALUE and PAIREDWATCHBOUNDS, follows a new pair, and loads the answer back", async () => {
    const page = await openDemo(session);
    await paneToPairedSettings(page);
    const question = page.getByLabel(QUESTION);
    expect(await question.isVisible()).toBe(true);
    await question.selectOption("again");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await eventually(() => page.locator(".es-preview").innerText()).toContain("pairs read in sheet order");
    await page.getByRole("button", { name: /write the block$/i }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The block was written to 'Paint line'!E1:F");

    const entry = (row: number) => page.evaluate((r) => window.evensplitDemo?.workbook.entry("Paint line", r, 5), row);
    const value = (row: number) => page.evaluate((r) => window.evensplitDemo?.workbook.value("Paint line", r, 5), row);
    const pLine = await rowOfLabel(page, 4, "p-value");
    const lowerLine = await rowOfLabel(page, 4, /^95% bounds for the median difference, at every pair count at once: lower$/);
    const readLine = await rowOfLabel(page, 4, "Pairs read by these bounds");
    expect(await entry(pLine)).toMatch(/^=EVENSPLIT\.PAIREDWATCHPVALUE\(Table1\[\[[^\]]+\]\],Table1\[\[[^\]]+\]\],0,"two-sided","drop"\)$/);
    expect(await entry(lowerLine)).toMatch(
      /^=INDEX\(EVENSPLIT\.PAIREDWATCHBOUNDS\(Table1\[\[[^\]]+\]\],Table1\[\[[^\]]+\]\],0\.95\),1,1\)$/,
    );
    expect(await value(pLine)).toBe(pairedwatchpvalue(demoColumn(1), demoColumn(2)));
    expect(await value(lowerLine)).toBe(pairedwatchbounds(demoColumn(1), demoColumn(2))[0][0]);
    expect(await value(readLine)).toBe(22);
    const labels = await page.evaluate(() =>
      Array.from({ length: 40 }, (_, r) => window.evensplitDemo?.workbook.entry("Paint line", r, 4)),
    );
    expect(labels).toContain("Pairs read by these bounds");
    expect(labels).not.toContain("Looking again as rows arrive");
    expect(labels).not.toContain("Watching p-value");

    // A new panel measured before and after, typed under the table: the watched block reads it.
    await typeIntoCell(page, "B26", "51.3");
    await typeIntoCell(page, "C26", "50.1");
    await eventually(() => value(readLine)).toBe(23);
    expect(await value(pLine)).toBe(pairedwatchpvalue(demoColumn(1, [51.3]), demoColumn(2, [50.1])));

    await page.getByRole("button", { name: "Start over" }).click();
    await selectCells(page, `F${pLine + 1}`);
    await page.getByRole("button", { name: "Edit the block at the selection" }).click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("is loaded");
    expect(await page.getByLabel("Pairs of values").isChecked()).toBe(true);
    await page.getByRole("button", { name: "3. Settings" }).click();
    expect(await question.inputValue()).toBe("again");
    await page.close();
  });
});
