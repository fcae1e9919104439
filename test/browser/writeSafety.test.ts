/**
 * Writing on the demo page when the place is wrong or taken: a top-left cell
 * whose block would run past the last column (XFD, Microsoft, "Excel
 * specifications and limits": 16,384 columns) is refused in words and the
 * Write button stays usable; a cell filled after the listing makes the pane
 * ask again; writing again at the same place replaces the earlier, longer
 * block and clears all of it.
 */
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { browserAvailable, cellText, closeSession, eventually, openDemo, startSession, typeIntoCell, type Session } from "./browser";

async function toResult(page: Page, test: "Sign test" | "Signed-rank test (Wilcoxon)"): Promise<void> {
  const values = page.getByLabel("Values", { exact: true });
  await values.fill("B1:B25");
  await values.press("Enter");
  await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
  await page.getByRole("button", { name: "Next: the question" }).click();
  await page.getByLabel(test).check();
  await page.getByLabel("Hypothesised median").fill("50");
  await page.getByRole("button", { name: "Next: settings" }).click();
  await page.getByRole("button", { name: "Next: the result" }).click();
}

const status = (page: Page): Promise<string> => page.locator(".es-status").innerText();

describe.skipIf(!browserAvailable())("writing safely on the demo page", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  it("refuses XFD1 in words, keeps the Write button usable, and then writes at E1", async () => {
    const page = await openDemo(session);
    await toResult(page, "Sign test");
    const target = page.getByLabel("Top-left cell of the block");
    await target.fill("XFD1");
    const write = page.getByRole("button", { name: "Write the block" });
    await write.click();
    await eventually(() => status(page)).toContain("does not fit on the sheet");
    expect(await write.isEnabled()).toBe(true);
    expect(await cellText(page, 0, 4)).toBe("");
    await target.fill("E1");
    await write.click();
    await eventually(() => status(page)).toContain("The block was written to 'Paint line'!E1:F");
    await page.close();
  });

  it("asks again when a cell is filled after the listing, and replaces a longer earlier block whole", async () => {
    const page = await openDemo(session);
    await toResult(page, "Signed-rank test (Wilcoxon)");
    await page.getByRole("button", { name: "Write the block" }).click();
    await eventually(() => status(page)).toContain("The block was written to 'Paint line'!E1:F");
    const longer = Number(/E1:F(\d+)/.exec(await status(page))?.[1]);

    // Back to the question by the step list: Start over would forget the data.
    await page.getByRole("button", { name: "2. Question" }).click();
    await page.getByLabel("Sign test").check();
    await page.getByRole("button", { name: "Next: settings" }).click();
    // The block follows new rows (a table); watched, the sign block has no extra rows and stays shorter than the signed-rank one.
    await page.getByLabel("Will you look at this result again as new rows arrive?").selectOption("again");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByLabel("Top-left cell of the block").fill("E1");
    await page.getByRole("button", { name: "Write the block" }).click();
    const confirm = page.getByRole("group", { name: "Some of these cells are not empty" });
    await eventually(() => confirm.innerText()).toContain("E1: Evensplit result");

    // A cell of the place that was empty when listed is filled now: replacing must not overwrite it unseen.
    await typeIntoCell(page, `E${longer + 1}`, "typed below");
    await typeIntoCell(page, "F2", "typed inside");
    await page.getByRole("button", { name: "Replace them" }).click();
    await eventually(() => status(page)).toContain("The cells changed since they were listed");
    expect(await cellText(page, 1, 5)).toBe("typed inside");
    await eventually(() => confirm.innerText()).toContain("F2: typed inside");

    await page.getByRole("button", { name: "Replace them" }).click();
    await eventually(() => status(page)).toContain("The earlier block at E1:F");
    const shorter = Number(/written to 'Paint line'!E1:F(\d+)/.exec(await status(page))?.[1]);
    expect(shorter).toBeLessThan(longer);
    for (let row = shorter; row < longer; row++) {
      expect(await cellText(page, row, 4)).toBe("");
      expect(await cellText(page, row, 5)).toBe("");
    }
    expect(await cellText(page, longer, 4)).toBe("typed below");
    await page.close();
  });
});
