/**
 * The pane on the demo page, in Debian's Chromium: the four steps for a
 * one-sample and a paired case, writing the block, a new row updating it,
 * the overwrite check, keyboard-only use, and the dark theme at a narrow
 * width. Screenshots of each step go to test-output/screenshots/.
 *
 * Expected numbers come from the invented data (src/demo/inventedData.ts)
 * counted by hand, and p-values from exact binomial sums in BigInt (exact
 * arithmetic): the sign test's p-value for k of n above is
 * sum_{j>=k} C(n, j) / 2^n (two-sided: twice the smaller tail).
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
  selectCells,
  snap,
  startSession,
  typeIntoCell,
  type Session,
} from "./browser";
import { NUMBER_FORMATS } from "../../src/report/resultBlock";
import { formatCell } from "../../src/taskpane/numberFormat";
import { fairCoinUpperTail as upperTail } from "../exact";

/** A p-value as the block's number format shows it (test/report/formats.test.ts checks that format against Excel's rules). */
function shownPValue(p: number): string {
  return formatCell(p, NUMBER_FORMATS.pvalue);
}

const SHEET = "Paint line";

const run = browserAvailable();

/** Presses Tab until the focused element matches, as a keyboard user moves on until the focus ring reaches it. */
async function tabTo(page: Page, matches: (name: string, tag: string) => boolean, limit = 80): Promise<void> {
  const seen: string[] = [];
  for (let i = 0; i < limit; i++) {
    await page.keyboard.press("Tab");
    const focused = await page.evaluate(() => {
      const e = document.activeElement as HTMLElement | null;
      if (!e) return { name: "", tag: "" };
      const labelled = e.id ? document.querySelector(`label[for="${e.id}"]`)?.textContent : null;
      return { name: (e.getAttribute("aria-label") ?? labelled ?? e.textContent ?? "").trim(), tag: e.tagName.toLowerCase() };
    });
    if (matches(focused.name, focused.tag)) return;
    seen.push(`${focused.tag}:${focused.name.slice(0, 30)}`);
  }
  throw new Error(`the focus never reached the control; it went through ${seen.join(" | ")}`);
}

/** The value the preview shows on the row labelled exactly `label`. */
function previewValue(page: Page, label: string): Promise<string> {
  return page
    .locator(".es-preview tbody tr")
    .filter({ has: page.getByRole("rowheader", { name: label, exact: true }) })
    .locator("td")
    .innerText();
}

async function statusText(page: Page): Promise<string> {
  return page.locator(".es-status").innerText();
}

describe.skipIf(!run)("the pane on the demo page", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  it("walks a one-sample sign test, turns the range into a table, writes the block and follows a new row", async () => {
    const page = await openDemo(session);
    await selectCells(page, "B1:B25");
    await page.getByRole("button", { name: "Use the selection" }).first().click();
    const summary = page.locator(".es-summary").first();
    // By hand: 24 cells below the header, 22 numbers, the blank of P-108, the note of P-113.
    await eventually(() => summary.innerText()).toContain("24 cells — 22 numbers, 1 blank, 1 text");
    await eventually(() => summary.innerText()).toContain("Name: “Thickness (µm)”");
    await page.getByLabel("Turn the range into a table").check();
    await eventually(() => page.locator(".es-note").first().innerText()).toContain("will become a table");
    await snap(page, "01-one-sample-data");

    await page.getByRole("button", { name: "Next: the question" }).click();
    await expect(page.getByRole("heading", { name: "2. Question" }).evaluate((h) => h === document.activeElement)).resolves.toBe(true);
    await page.getByLabel("Hypothesised median").fill("50");
    await page.getByLabel(/^The median of “Thickness/).selectOption("greater");
    await eventually(() => page.locator(".es-notation").innerText()).toContain("H1: median > 50");
    await snap(page, "02-one-sample-question");

    await page.getByRole("button", { name: "Next: settings" }).click();
    expect(await page.getByLabel("Values equal to the hypothesised value (ties)").inputValue()).toBe("drop");
    await snap(page, "03-one-sample-settings");

    await page.getByRole("button", { name: "Next: the result" }).click();
    // By hand: 16 of the 22 values lie above 50, 5 below, 1 tie left out: n = 21.
    const expected = shownPValue(upperTail(16, 21));
    await eventually(() => previewValue(page, "p-value")).toBe(expected);
    expect(await page.locator(".es-plot").first().isVisible()).toBe(true);
    expect(await page.getByLabel("Top-left cell of the block").inputValue()).toBe("E1");
    await snap(page, "04-one-sample-result");

    await page.getByLabel("Also add a chart of the values against H0 and the bounds").check();
    await page.getByRole("button", { name: "Write the block" }).click();
    await eventually(() => statusText(page)).toContain("The block was written to 'Paint line'!E1:F24");
    expect(await statusText(page)).toContain(
      "The data became table Table1. A chart was added at L1; the cells its lines read are H1:J3, beside the block.",
    );
    expect(await cellText(page, 0, 4)).toBe("Evensplit result");
    const chart = page.locator(".demo-chart figcaption");
    expect(await chart.innerText()).toContain("the demo’s drawing of the chart the workbook records (XYScatter");
    const pLine = await rowOfLabel(page, 4, "p-value");
    expect(await cellText(page, pLine, 5)).toBe(expected);
    const formula = await page.evaluate(
      ([sheet, row]) => window.evensplitDemo?.workbook.entry(sheet as string, row as number, 5),
      [SHEET, pLine],
    );
    expect(formula).toBe('=EVENSPLIT.PVALUE(Table1[[Thickness (µm)]],50,"greater","drop","exact")');
    await snap(page, "05-one-sample-written", true);

    // A new panel typed below the table: the table grows and the block recalculates.
    await typeIntoCell(page, "B26", "53");
    const nLine = await rowOfLabel(page, 4, "Numbers in range (n total)");
    await eventually(() => cellText(page, nLine, 5)).toBe("23");
    await eventually(() => cellText(page, pLine, 5)).toBe(shownPValue(upperTail(17, 22)));
    // The chart follows the new row too: test/browser/chart.test.ts.
    await snap(page, "06-one-sample-row-added", true);
    await page.close();
  });

  it("walks a paired sign test and refuses to overwrite a filled cell until confirmed", async () => {
    const page = await openDemo(session);
    await page.getByLabel("Pairs of values").check();
    const first = page.getByLabel("First values (for example, before)");
    await first.fill("B1:B25");
    await first.press("Enter");
    const second = page.getByLabel("Second values (for example, after)");
    await second.fill("C1:C25");
    await second.press("Enter");
    await eventually(() => page.locator(".es-summary").nth(1).innerText()).toContain("24 numbers, 0 blank, 0 text");
    await snap(page, "07-paired-data");

    await page.getByRole("button", { name: "Next: the question" }).click();
    expect(await page.getByLabel("Hypothesised shift (often 0)").inputValue()).toBe("0");
    await eventually(() => page.locator(".es-notation").innerText()).toContain("H0: median(D) = 0");
    await snap(page, "08-paired-question");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await snap(page, "09-paired-settings");
    await page.getByRole("button", { name: "Next: the result" }).click();
    // By hand: of the 22 complete pairs, 18 differences are negative, 3 positive, 1 zero; two-sided p = 2 P(X <= 3), n = 21.
    const expected = shownPValue(2 * upperTail(18, 21));
    await eventually(() => previewValue(page, "p-value")).toBe(expected);
    await eventually(() => previewValue(page, "Pairs skipped (one side blank or not a number)")).toBe("2");
    await snap(page, "10-paired-result");

    // Something appears inside the place the pane chose: writing must stop and ask.
    await typeIntoCell(page, "F5", "keep me");
    await page.getByRole("button", { name: "Write the block" }).click();
    const confirm = page.getByRole("group", { name: "Some of these cells are not empty" });
    await eventually(() => confirm.innerText()).toContain("F5: keep me");
    expect(await cellText(page, 4, 5)).toBe("keep me");
    expect(await cellText(page, 0, 4)).toBe("");
    await snap(page, "11-paired-overwrite-check");
    await page.getByRole("button", { name: "Keep them" }).click();
    await eventually(() => confirm.isHidden()).toBe(true);
    expect(await cellText(page, 4, 5)).toBe("keep me");

    await page.getByRole("button", { name: "Write the block" }).click();
    await page.getByRole("button", { name: "Replace them" }).click();
    // 24 rows: the paired block follows the table's new rows, so it shows the watching p-value beside the fixed one
    // and carries the caution about looking again.
    await eventually(() => statusText(page)).toContain("The block was written to 'Paint line'!E1:F24");
    expect(await rowOfLabel(page, 4, "Looking again as rows arrive")).toBeGreaterThan(0);
    expect(await rowOfLabel(page, 4, "Watching p-value")).toBe((await rowOfLabel(page, 4, "p-value")) + 1);
    expect(await cellText(page, 4, 5)).not.toBe("keep me");
    const pLine = await rowOfLabel(page, 4, "p-value");
    expect(await cellText(page, pLine, 5)).toBe(expected);
    await snap(page, "12-paired-written", true);
    await page.close();
  });

  it("can be operated with the keyboard alone, with a visible focus ring", async () => {
    const page = await openDemo(session);
    await page.locator("body").focus();
    await tabTo(page, (name) => name.startsWith("Selected cells"));
    await page.keyboard.type("B1:B25");
    await page.keyboard.press("Enter");
    await tabTo(page, (name, tag) => tag === "button" && name === "Use the selection");
    await page.keyboard.press("Enter");
    await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
    await tabTo(page, (name, tag) => tag === "button" && name === "Next: the question");
    await page.keyboard.press("Enter");
    await eventually(() => page.evaluate(() => document.activeElement?.textContent)).toBe("2. Question");
    await tabTo(page, (name) => name === "Sign test");
    await page.keyboard.press("ArrowDown");
    expect(await page.getByLabel("Signed-rank test (Wilcoxon)").isChecked()).toBe(true);
    await tabTo(page, (name) => name === "Hypothesised median");
    await page.keyboard.type("50");
    await tabTo(page, (name, tag) => tag === "button" && name === "Next: settings");
    await page.keyboard.press("Enter");
    await tabTo(page, (name, tag) => tag === "button" && name === "Next: the result");
    await page.keyboard.press("Enter");
    // The button names the table it will make first: new rows count by default.
    await tabTo(page, (name, tag) => tag === "button" && /write the block$/i.test(name));
    const ring = await page.evaluate(() => {
      const style = getComputedStyle(document.activeElement as Element);
      return { style: style.outlineStyle, width: parseFloat(style.outlineWidth) };
    });
    expect(ring.style).not.toBe("none");
    expect(ring.width).toBeGreaterThanOrEqual(2);
    await snap(page, "13-keyboard-focus");
    await page.keyboard.press("Enter");
    await eventually(() => statusText(page)).toContain("The block was written");
    const statistic = await rowOfLabel(page, 4, /^Signed-rank statistic V/);
    expect(Number(await cellText(page, statistic, 5))).toBeGreaterThan(0);
    await page.close();
  });

  it("follows the dark theme and fits a narrow width", async () => {
    const page = await openDemo(session, { width: 360, height: 900 });
    await page.getByRole("button", { name: "Dark theme" }).click();
    expect(await page.locator("html").getAttribute("data-theme")).toBe("dark");
    const first = page.getByLabel("Values", { exact: true });
    await first.fill("B1:B25");
    await first.press("Enter");
    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByLabel("Hypothesised median").fill("50");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.getByLabel("Also show the count’s distribution if H0 holds").check();
    await eventually(() => page.locator(".es-plot").count()).toBe(2);
    const overflow = await page.evaluate(() => {
      const pane = document.querySelector(".es-pane") as HTMLElement;
      return pane.scrollWidth - pane.clientWidth;
    });
    expect(overflow).toBeLessThanOrEqual(0);
    await snap(page, "14-dark-narrow-result", true);
    await page.close();
  });
});
