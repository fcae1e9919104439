/**
 * The demo sheet as a first experience: a column of numbers pasted from the
 * clipboard (Ctrl+V) fills one cell per value, tab-separated columns fill
 * neighbouring cells, and the second sheet holds the README's tables so an
 * example formula typed there answers; a long column is drawn only where it
 * is in view, while the name box and the arrows still reach every cell. Expected values are the pasted text
 * itself and the README's own example.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { browserAvailable, cellText, openDemo, selectCells, snap, startSession, type Session } from "./browser";
import type { Page } from "playwright-core";

const run = browserAvailable();
let session: Session;

beforeAll(async () => {
  if (run) session = await startSession();
}, 60_000);
afterAll(async () => {
  if (run) await session.close();
});

/** Puts text on the clipboard and presses Ctrl+V in the sheet, as a person pasting would. */
async function paste(page: Page, address: string, text: string): Promise<void> {
  await session.context.grantPermissions(["clipboard-read", "clipboard-write"], { origin: session.origin });
  await page.evaluate((t) => navigator.clipboard.writeText(t), text);
  await selectCells(page, address);
  await page.keyboard.press("Control+V");
}

/** True when the cell is drawn and lies inside the sheet's scrolled area, below its sticky header. */
function inView(page: Page, id: string): Promise<boolean> {
  return page.evaluate((cellId) => {
    const cell = document.getElementById(cellId)?.getBoundingClientRect();
    const wrap = document.querySelector(".demo-grid-wrap")?.getBoundingClientRect();
    // The header cells stick to the top of the scrolled area (the row itself scrolls away).
    const header = document.querySelector(".demo-grid thead th")?.getBoundingClientRect();
    if (!cell || !wrap || !header) return false;
    return cell.top >= header.bottom - 1 && cell.bottom <= wrap.bottom + 1 && cell.top >= 0 && cell.bottom <= window.innerHeight + 1;
  }, id);
}

describe.runIf(run)("the demo sheet", () => {
  it("fills one cell per value when a column of numbers is pasted", async () => {
    const page = await openDemo(session);
    await paste(page, "H2", "51.2\n49.8\n50.6\n");
    await expect.poll(() => cellText(page, 1, 7)).toBe("51.2");
    expect([await cellText(page, 2, 7), await cellText(page, 3, 7), await cellText(page, 4, 7)]).toEqual(["49.8", "50.6", ""]);
    expect(await page.getByLabel("Selected cells (type an address and press Enter)").inputValue()).toBe("H2:H4");
    await page.close();
  });

  it("fills neighbouring cells from tab-separated columns", async () => {
    const page = await openDemo(session);
    await paste(page, "H2", "P-201\t52.1\r\nP-202\t48.9\r\n");
    await expect.poll(() => cellText(page, 2, 8)).toBe("48.9");
    expect([await cellText(page, 1, 7), await cellText(page, 1, 8), await cellText(page, 2, 7)]).toEqual(["P-201", "52.1", "P-202"]);
    await page.close();
  });

  it("draws only the rows in view of a long column, and still moves there by name box, arrows and Ctrl+arrows", async () => {
    const page = await openDemo(session);
    const lines = Array.from({ length: 3000 }, (_, i) => String(40 + (i % 20)));
    await paste(page, "H1", `${lines.join("\n")}\n`);
    await expect.poll(() => cellText(page, 0, 7)).toBe("40");
    // Rows 1 to 3,000 filled; the sheet shows five empty rows below (rows are the last used index + 6) and the header row.
    // 3,000 rows in the sheet, far fewer drawn: the grid draws what is in view and a margin.
    expect(await page.locator("#sheet tbody tr[aria-rowindex]").count()).toBeLessThan(300);
    expect(await page.locator(".demo-grid").getAttribute("aria-rowcount")).toBe(String(2999 + 6 + 1));
    await selectCells(page, "H2500");
    await expect.poll(() => inView(page, "demo-cell-2499-7")).toBe(true);
    expect(await cellText(page, 2499, 7)).toBe(lines[2499]);
    await page.keyboard.press("ArrowDown");
    await expect.poll(() => page.locator(".demo-grid").getAttribute("aria-activedescendant")).toBe("demo-cell-2500-7");
    expect(await page.locator("#demo-cell-2500-7").getAttribute("class")).toContain("demo-active");
    expect(await page.getByLabel("Selected cells (type an address and press Enter)").inputValue()).toBe("H2501");
    await snap(page, "21-demo-long-column");
    await selectCells(page, "A1");
    await expect.poll(() => inView(page, "demo-cell-0-0")).toBe(true);
    // Ctrl+arrows go to the edge of the data (Microsoft, "Keyboard shortcuts in Excel").
    await selectCells(page, "H1");
    await page.keyboard.press("Control+ArrowDown");
    await expect.poll(() => page.getByLabel("Selected cells (type an address and press Enter)").inputValue()).toBe("H3000");
    await expect.poll(() => inView(page, "demo-cell-2999-7")).toBe(true);
    await page.keyboard.press("Control+ArrowUp");
    await expect.poll(() => page.getByLabel("Selected cells (type an address and press Enter)").inputValue()).toBe("H1");
    await page.close();
  });

  it("shows the README's tables on a second sheet, where the README's examples answer", async () => {
    const page = await openDemo(session);
    await page.getByRole("button", { name: "README examples" }).click();
    await expect.poll(() => cellText(page, 9, 0)).toBe("Thickness");
    expect(await cellText(page, 0, 0)).toContain("Invented data");
    await selectCells(page, "O2");
    await page.keyboard.type('=EVENSPLIT.COUNTPVALUE(18, 7, "greater")');
    await page.keyboard.press("Enter");
    // The README gives 0.0216 for this example.
    await expect.poll(async () => Number(await cellText(page, 1, 14)).toFixed(4)).toBe("0.0216");
    await snap(page, "20-demo-readme-sheet");
    await page.getByRole("button", { name: "Paint line", exact: true }).click();
    await expect.poll(() => cellText(page, 0, 1)).toBe("Thickness (µm)");
    await page.close();
  });
});
