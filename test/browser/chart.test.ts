/**
 * The chart beside the block on the demo page, in Debian's Chromium: written
 * with the block in one go, a scatter chart of the values in row order with
 * H0's value and the bounds as lines; a row typed under the table adds a
 * point and moves the lines, which read the block's own bound cells; the
 * demo's drawing says it is a drawing of the recorded chart. Screenshots in
 * light and dark go to test-output/screenshots/.
 *
 * Expected values: the invented thickness column (src/demo/inventedData.ts)
 * has 24 data rows, so the lines run from 0 to 25, then 26 after a new row
 * (row count + 1, chartPlan.ts); the bound lines equal the block's bound
 * cells, whatever those are (the block's numbers are checked elsewhere
 * against R and exact sums); 53 lies inside the value axis set when written.
 */
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  browserAvailable,
  closeSession,
  eventually,
  openDemo,
  paneToResult,
  rowOfLabel,
  selectCells,
  snap,
  startSession,
  typeIntoCell,
  type Session,
} from "./browser";

const SHEET = "Paint line";
const run = browserAvailable();

interface ChartState {
  readonly count: number;
  readonly series: readonly { name: string; chartType: string; values: unknown; xValues: unknown }[];
  readonly points: { top: number; bottom: number } | null;
  readonly from: string;
  readonly to: string;
  readonly value: { minimum: number | null; maximum: number | null };
}

/** The recorded chart, read from the demo's workbook. */
function chartState(page: Page): Promise<ChartState> {
  return page.evaluate(() => {
    const workbook = window.evensplitDemo?.workbook;
    if (!workbook) throw new Error("no demo workbook");
    const [chart] = workbook.charts;
    const points = chart.series[0].values;
    return {
      count: workbook.charts.length,
      series: chart.series.map((s) => ({ name: s.name, chartType: s.chartType, values: s.values, xValues: s.xValues })),
      points: points ? workbook.linkedRect(points) : null,
      from: chart.from,
      to: chart.to,
      value: { minimum: chart.axes.value.minimum, maximum: chart.axes.value.maximum },
    };
  });
}

function cellValue(page: Page, row: number, column: number): Promise<unknown> {
  return page.evaluate(
    ([sheet, r, c]) => window.evensplitDemo?.workbook.value(sheet as string, r as number, c as number),
    [SHEET, row, column],
  );
}

describe.skipIf(!run)("the chart beside the block", () => {
  let session: Session | undefined;
  beforeAll(async () => {
    session = await startSession();
  }, 60_000);
  afterAll(async () => {
    await closeSession(session);
  });

  for (const theme of ["light", "dark"] as const) {
    it(`is written with the block, and its points and lines follow a new row (${theme})`, async () => {
      if (!session) throw new Error("no browser session");
      const page = await openDemo(session, { width: 1400, height: 1000 });
      if (theme === "dark") await page.getByRole("button", { name: "Dark theme" }).click();
      await paneToResult(page);
      await page.getByLabel("Also add a chart of the values against H0 and the bounds").check();
      expect(await page.locator(".es-check + .es-hint").last().innerText()).toContain(
        "with H0’s value and the lower and upper bounds as lines",
      );
      await page.getByRole("button", { name: /write the block/i }).click();
      await eventually(() => page.locator(".es-status").innerText()).toContain(
        "A chart was added at L1; the cells its lines read are H1:J4",
      );

      const before = await chartState(page);
      expect(before.count).toBe(1);
      expect([before.from, before.to]).toEqual(["L1", "R15"]);
      expect(before.series.map((s) => [s.name, s.chartType])).toEqual([
        ["Thickness (µm)", "XYScatter"],
        ["H0: median = 50", "XYScatterLinesNoMarkers"],
        ["95% lower bound", "XYScatterLinesNoMarkers"],
        ["95% upper bound", "XYScatterLinesNoMarkers"],
      ]);
      expect(before.points).toEqual({ top: 1, left: 1, bottom: 24, right: 1 });
      // The axis is not from 0: it starts within a few units of the data.
      expect(before.value.minimum).toBeGreaterThan(40);
      // Lines run from 0 to the rows + 1; each bound line reads the block's own bound cell.
      expect(await cellValue(page, 0, 9)).toBe(25);
      const lower = await rowOfLabel(page, 4, /lower$/);
      const upper = await rowOfLabel(page, 4, /upper$/);
      expect(await cellValue(page, 2, 8)).toBe(await cellValue(page, lower, 5));
      expect(await cellValue(page, 3, 9)).toBe(await cellValue(page, upper, 5));
      const caption = page.locator(".demo-chart figcaption");
      expect(await caption.innerText()).toContain(
        "the demo’s drawing of the chart the workbook records (XYScatter, which Excel would float over L1:R15)",
      );
      // The note "re-sprayed, not measured" in the column is text, which a scatter chart reads as 0, below the axis.
      expect(await caption.innerText()).toContain("1 of its values lie outside the axes and are not drawn");
      const marks = await page.locator(".demo-chart-point").count();
      await page.locator(".demo-chart").scrollIntoViewIfNeeded();
      await snap(page, `20-chart-written-${theme}`);

      // A new panel typed under the table: a new point, lines to 26, and the bound lines still read the block's cells.
      await typeIntoCell(page, "B26", "53");
      await eventually(() => cellValue(page, 0, 9)).toBe(26);
      const after = await chartState(page);
      expect(after.points).toEqual({ top: 1, left: 1, bottom: 25, right: 1 });
      await eventually(() => page.locator(".demo-chart-point").count()).toBe(marks + 1);
      expect(await cellValue(page, 3, 9)).toBe(await cellValue(page, upper, 5));
      expect(await cellValue(page, 2, 8)).toBe(await cellValue(page, lower, 5));
      await page.locator(".demo-chart").scrollIntoViewIfNeeded();
      await snap(page, `21-chart-row-added-${theme}`);

      // Loading the block back for editing keeps the chart asked for; writing it again replaces block, chart and helper cells in place.
      await selectCells(page, "F3");
      await page.getByRole("button", { name: "Start over" }).click();
      await page.getByRole("button", { name: "Edit the block at the selection" }).click();
      await eventually(() => page.getByLabel("Also add a chart of the values against H0 and the bounds").isChecked()).toBe(true);
      await page.getByRole("button", { name: /write the block/i }).click();
      // The block's own cells are filled: the pane lists them and asks before replacing them.
      await page.getByRole("button", { name: "Replace them" }).click();
      await eventually(() => page.locator(".es-status").innerText()).toContain("A chart was added at L1");
      expect((await chartState(page)).count).toBe(1);
      await page.close();
    });
  }
});
