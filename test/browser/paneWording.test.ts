/**
 * The pane's wording on the page (written before the changes and seen to
 * fail on the old build): a subtitle that claims no freedom from
 * assumptions (the signed-rank test assumes symmetry), one-sample steps that
 * never speak of "differences", preview column headers that say what the
 * columns hold, a formula list that breaks lines between a formula's parts
 * and never inside a word, and new rows counting by default with the Write
 * button saying that a table will be made. Screenshots of each step, light
 * and dark, go to test-output/screenshots/.
 */
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  browserAvailable,
  cellText,
  closeSession,
  eventually,
  openDemo,
  rowOfLabel,
  snap,
  startSession,
  typeIntoCell,
  typeRange,
  type Session,
} from "./browser";

const visibleStep = (page: Page): Promise<string> => page.locator(".es-step:not([hidden])").innerText();

describe.skipIf(!browserAvailable())("the pane's wording, on the demo page", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  for (const theme of ["light", "dark"] as const) {
    it(`words a one-sample signed-rank test plainly, step by step (${theme})`, async () => {
      const page = await openDemo(session, { width: 420, height: 1000 });
      if (theme === "dark") await page.getByRole("button", { name: "Dark theme" }).click();
      expect(await page.locator(".es-header").innerText()).not.toMatch(/without assumptions/i);
      await typeRange(page, "Values", "B1:B25");
      await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
      expect(await page.locator(".es-note").first().innerText()).toContain("This is the default, so that new rows count");
      await snap(page, `30-data-${theme}`, true);
      await page.getByRole("button", { name: "Next: the question" }).click();
      await page.getByLabel("Signed-rank test (Wilcoxon)").check();
      await page.getByLabel("Hypothesised median").fill("50");
      expect(await visibleStep(page)).not.toMatch(/difference/i);
      await snap(page, `31-question-${theme}`, true);
      await page.getByRole("button", { name: "Next: settings" }).click();
      expect(await visibleStep(page)).not.toMatch(/difference/i);
      await snap(page, `32-settings-${theme}`, true);
      await page.getByRole("button", { name: "Next: the result" }).click();
      const headers = await page.locator(".es-preview thead th").allInnerTexts();
      expect(headers).not.toContain("Row");
      expect(headers).not.toContain("Value");
      await page.locator(".es-details summary").click();
      const breaking = await page
        .locator(".es-formulas code")
        .first()
        .evaluate((code) => {
          const style = getComputedStyle(code);
          return { wordBreak: style.wordBreak, wrap: style.overflowWrap, chances: code.querySelectorAll("wbr").length };
        });
      expect(breaking.wordBreak).not.toBe("break-all");
      expect(breaking.wrap).not.toBe("anywhere");
      expect(breaking.chances).toBeGreaterThan(0);
      await snap(page, `33-result-${theme}`, true);
      await page.close();
    });
  }

  it("makes the data a table by default, with the Write button saying so, and a new row counts", async () => {
    const page = await openDemo(session);
    await typeRange(page, "Values", "B1:B25");
    await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByLabel("Hypothesised median").fill("50");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await page.getByRole("button", { name: "Next: the result" }).click();
    const write = page.getByRole("button", { name: "Make the table and write the block" });
    await write.click();
    await eventually(() => page.locator(".es-status").innerText()).toContain("The data became table Table1");
    await snap(page, "34-written-light", true);
    // The place stays the block's own, so writing again replaces it instead of adding a second block.
    expect(await page.getByLabel("Top-left cell of the block").inputValue()).toBe("'Paint line'!E1");
    const nLine = await rowOfLabel(page, 4, "Numbers in range (n total)");
    await typeIntoCell(page, "B26", "53");
    await eventually(() => cellText(page, nLine, 5)).toBe("23");
    await page.close();
  });
});
