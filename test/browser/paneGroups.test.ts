/**
 * The pane on the demo page, in Debian's Chromium, for independent groups:
 * two groups from two ranges, two groups from values with a group column
 * (an invented shift log typed beside the data), and several groups from
 * values with a group column, each walked through all four steps on the invented sheet "Lines
 * and suppliers" (src/demo/inventedData.ts), the block written as formulas,
 * a new row typed under the table updating it, the block loaded back with
 * "Edit the block at the selection", and the Result step shot in the light
 * and the dark theme (test-output/screenshots/).
 *
 * Expected numbers are counted by hand from the invented data; p-values of
 * the by-group table are exact binomial sums (exact arithmetic).
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
  typeRange,
  type Session,
} from "./browser";

const SHEET = "Lines and suppliers";
const run = browserAvailable();

function statusText(page: Page): Promise<string> {
  return page.locator(".es-status").innerText();
}

/** The value the preview shows on the row labelled exactly `label`. */
function previewValue(page: Page, label: string): Promise<string> {
  return page
    .locator(".es-preview tbody tr")
    .filter({ has: page.getByRole("rowheader", { name: label, exact: true }) })
    .locator("td")
    .first()
    .innerText();
}

async function toGroupsSheet(page: Page): Promise<void> {
  await page.getByRole("button", { name: SHEET }).click();
  await eventually(() => cellText(page, 0, 4)).toBe("Old supplier (µm)");
}

/** The Result step in the light theme, then in the dark one, and back. */
async function shootBothThemes(page: Page, name: string): Promise<void> {
  await snap(page, `${name}-light`, true);
  await page.getByRole("button", { name: "Dark theme" }).click();
  await snap(page, `${name}-dark`, true);
  await page.getByRole("button", { name: "Dark theme" }).click();
}

describe.skipIf(!run)("the pane with groups in Chromium", () => {
  let session: Session;
  beforeAll(async () => {
    session = await startSession();
  });
  afterAll(async () => {
    await closeSession(session);
  });

  it("walks two groups from two ranges, writes the block, follows a new row and loads the block back", async () => {
    const page = await openDemo(session);
    await toGroupsSheet(page);
    await page.getByLabel("Two groups", { exact: true }).check();
    await typeRange(page, "First group (for example, line A)", `'${SHEET}'!E1:E12`);
    await typeRange(page, "Second group (for example, line B)", `'${SHEET}'!F1:F12`);
    await eventually(() => page.locator(".es-summary").nth(1).innerText()).toContain("11 numbers");
    await snap(page, "30-two-groups-data");
    await page.getByRole("button", { name: "Next: the question" }).click();
    // The shift starts at 0; the claim is worded about the two groups.
    await expect.poll(() => page.getByLabel(/^Hypothesised shift/).inputValue()).toBe("0");
    await page.getByLabel(/^Compared with/).selectOption("greater");
    await expect
      .poll(() => page.locator(".es-notation").innerText())
      .toContain("H1: the values of “New supplier (µm)” tend to lie above those of “Old supplier (µm)”");
    await snap(page, "31-two-groups-question");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await expect.poll(() => page.getByLabel("Test for two groups").isVisible()).toBe(true);
    expect(await page.getByLabel("Values equal to the hypothesised value (ties)").isVisible()).toBe(false);
    await snap(page, "32-two-groups-settings");
    await page.getByRole("button", { name: "Next: the result" }).click();
    await eventually(() => previewValue(page, "Median of Old supplier (µm)")).toBe("50.4");
    expect(await previewValue(page, "Median of New supplier (µm)")).toBe("51.7");
    expect(await previewValue(page, "Numbers in Old supplier (µm) (n)")).toBe("9");
    await shootBothThemes(page, "33-two-groups-result");

    await page.getByRole("button", { name: "Make the table and write the block" }).click();
    await eventually(() => statusText(page)).toContain(`The block was written to '${SHEET}'!H1:I`);
    const nLine = await rowOfLabel(page, 7, "Numbers in Old supplier (µm) (n)");
    expect(await cellText(page, nLine, 8)).toBe("9");
    const pLine = await rowOfLabel(page, 7, "p-value");
    const formula = await page.evaluate(
      ([sheet, row]) => window.evensplitDemo?.workbook.entry(sheet as string, row as number, 8),
      [SHEET, pLine],
    );
    expect(formula).toBe('=EVENSPLIT.TWOGROUPS(Table1[[Old supplier (µm)]],Table1[[New supplier (µm)]],0,"greater","rank-sum")');

    // A tenth old-supplier panel typed below the table: the table grows and the block counts it.
    await typeIntoCell(page, "E13", "50.2");
    await eventually(() => cellText(page, nLine, 8)).toBe("10");
    const medianLine = await rowOfLabel(page, 7, "Median of Old supplier (µm)");
    // By hand: 49.5 49.8 49.9 50.1 50.2 | 50.4 50.7 50.9 51.2 51.6 → (50.2 + 50.4) / 2.
    await eventually(() => cellText(page, medianLine, 8)).toBe("50.3");
    await snap(page, "34-two-groups-row-added", true);

    // The block loads back into the pane from its own formulas.
    await selectCells(page, `I${pLine + 1}`);
    await page.getByRole("button", { name: "1. Data" }).click();
    await page.getByRole("button", { name: "Edit the block at the selection" }).click();
    await eventually(() => statusText(page)).toContain("is loaded");
    await eventually(() => previewValue(page, "Numbers in Old supplier (µm) (n)")).toBe("10");
    await page.close();
  });

  it("walks two groups from values with a group column, swaps them, writes the block, follows a new row and loads it back", async () => {
    const page = await openDemo(session);
    await toGroupsSheet(page);
    await page.getByLabel("Two groups", { exact: true }).check();
    await page.getByLabel("Values with a group column", { exact: true }).check();
    // The lines' column holds three labels: they are listed and several groups suggested.
    await typeRange(page, "Values (both groups in one column)", `'${SHEET}'!C1:C20`);
    await typeRange(page, "Group column (two labels: the group of each value, beside it)", `'${SHEET}'!B1:B20`);
    await eventually(() => page.locator(".es-problem", { hasText: "Two groups need" }).innerText()).toContain(
      "it holds 3: “North” (6 numbers), “South” (6 numbers), “East” (6 numbers). To compare them all, choose Several groups.",
    );
    // Invented: coating thickness by work shift, one shift not noted.
    const log = [
      ["Shift", "Thickness (µm)"],
      ["Early", "50.2"],
      ["Late", "51.4"],
      ["Early", "49.8"],
      ["", "50.9"],
      ["Late", "52"],
      ["Early", "50.6"],
      ["Late", "51.1"],
    ];
    for (const [r, [shift, thickness]] of log.entries()) {
      if (shift !== "") await typeIntoCell(page, `Q${r + 1}`, shift);
      await typeIntoCell(page, `R${r + 1}`, thickness);
    }
    await typeRange(page, "Values (both groups in one column)", `'${SHEET}'!R1:R8`);
    await typeRange(page, "Group column (two labels: the group of each value, beside it)", `'${SHEET}'!Q1:Q8`);
    await eventually(() => page.locator(".es-picked").innerText()).toContain("First group: “Early”; second group: “Late”.");
    await page.getByLabel("Swap the first and the second group").check();
    await eventually(() => page.locator(".es-picked").innerText()).toContain("First group: “Late”; second group: “Early”.");
    await page.getByLabel("Swap the first and the second group").uncheck();
    await snap(page, "40-labeled-groups-data");
    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByLabel(/^Compared with/).selectOption("greater");
    await expect
      .poll(() => page.locator(".es-notation").innerText())
      .toContain("H1: the values of “Late” tend to lie above those of “Early”");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await expect.poll(() => page.getByLabel("Test for two groups").isVisible()).toBe(true);
    await page.getByRole("button", { name: "Next: the result" }).click();
    // By hand: Early 49.8, 50.2, 50.6; Late 51.1, 51.4, 52.0.
    await eventually(() => previewValue(page, "Median of Early")).toBe("50.2");
    expect(await previewValue(page, "Median of Late")).toBe("51.4");
    expect(await previewValue(page, "Numbers in Late (n)")).toBe("3");
    await shootBothThemes(page, "41-labeled-groups-result");

    await page.getByRole("button", { name: "Make the table and write the block" }).click();
    await eventually(() => statusText(page)).toContain(`The block was written to '${SHEET}'!`);
    const column = (await statusText(page)).match(/!([A-Z]+)1:/)?.[1] ?? "";
    const at = column.charCodeAt(0) - 65;
    const pLine = await rowOfLabel(page, at, "p-value");
    const formula = await page.evaluate(
      ([sheet, row, c]) => window.evensplitDemo?.workbook.entry(sheet as string, row as number, c as number),
      [SHEET, pLine, at + 1],
    );
    expect(formula).toMatch(/^=EVENSPLIT\.LABELEDTWOGROUPS\(.*,"Early","Late",0,"greater","rank-sum"\)$/);
    const nLine = await rowOfLabel(page, at, "Numbers in Late (n)");
    expect(await cellText(page, nLine, at + 1)).toBe("3");

    // A fourth late-shift panel typed below the table: the block counts it.
    await typeIntoCell(page, "Q9", "Late");
    await typeIntoCell(page, "R9", "51.8");
    await eventually(() => cellText(page, nLine, at + 1)).toBe("4");
    await snap(page, "42-labeled-groups-row-added", true);

    await selectCells(page, `${String.fromCharCode(65 + at + 1)}${pLine + 1}`);
    await page.getByRole("button", { name: "1. Data" }).click();
    await page.getByRole("button", { name: "Edit the block at the selection" }).click();
    await eventually(() => statusText(page)).toContain("is loaded");
    await eventually(() => previewValue(page, "Numbers in Late (n)")).toBe("4");
    await page.close();
  });

  it("walks several groups with a target, writes the table by group as a spill, and follows a new row", async () => {
    const page = await openDemo(session);
    await toGroupsSheet(page);
    await page.getByLabel("Several groups", { exact: true }).check();
    await typeRange(page, "Values (all groups in one column)", `'${SHEET}'!C1:C20`);
    await typeRange(page, "Group column (the group of each value, beside it)", `'${SHEET}'!B1:B20`);
    await eventually(() => page.locator(".es-summary").nth(1).innerText()).toContain(
      "3 groups with numbers counted — “North” (6), “South” (6), “East” (6). 1 row has a blank or error label and is skipped.",
    );
    await snap(page, "35-several-groups-data");
    await page.getByRole("button", { name: "Next: the question" }).click();
    expect(
      await page
        .getByLabel("Which test?")
        .isVisible()
        .catch(() => false),
    ).toBe(false);
    await page.getByLabel("Target median for every group (optional)").fill("50");
    await expect.poll(() => page.locator(".es-notation").innerText()).toContain("tested against 50");
    await snap(page, "36-several-groups-question");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await page.getByLabel("Test for several groups").selectOption("rank");
    await expect.poll(() => page.getByLabel("Adjusting the p-values of the groups' table").isVisible()).toBe(true);
    await snap(page, "37-several-groups-settings");
    await page.getByRole("button", { name: "Next: the result" }).click();
    const spill = page.locator(".es-spill");
    await eventually(() => spill.locator("tbody th").allInnerTexts()).toEqual([
      "North",
      "South",
      "East",
      "Rows without a usable label (skipped)",
    ]);
    expect(await page.locator(".es-result-target, .es-step").last().innerText()).toContain("The block takes 8 columns");
    await shootBothThemes(page, "38-several-groups-result");

    await page.getByRole("button", { name: "Make the table and write the block" }).click();
    await eventually(() => statusText(page)).toContain(`The block was written to '${SHEET}'!H1:O`);
    const top = await rowOfLabel(page, 7, "Group");
    expect(await cellText(page, top + 1, 7)).toBe("North");
    expect(await cellText(page, top + 1, 8)).toBe("6");
    // South: 6 of 6 panels above 50, two-sided sign test: 2/64 (exact arithmetic).
    expect(await cellText(page, top + 2, 13)).toBe("0.03125");

    // A seventh North panel typed under the table: the spilled table counts it.
    await typeIntoCell(page, "A21", "Q-220");
    await typeIntoCell(page, "B21", "North");
    await typeIntoCell(page, "C21", "50.9");
    await eventually(() => cellText(page, top + 1, 8)).toBe("7");
    await snap(page, "39-several-groups-row-added", true);

    // The block loads back into the pane from its own formulas.
    await selectCells(page, `H${top}`);
    await page.getByRole("button", { name: "1. Data" }).click();
    await page.getByRole("button", { name: "Edit the block at the selection" }).click();
    await eventually(() => statusText(page)).toContain("is loaded");
    await page.getByRole("button", { name: "2. Question" }).click();
    expect(await page.getByLabel("Target median for every group (optional)").inputValue()).toBe("50");
    await page.close();
  });
});
