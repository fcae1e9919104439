/**
 * The defects of the pane's logic, each tested on the state modules without
 * a page (written before the fixes, and seen to fail on the old code): the
 * name-row choice kept when the same range is read again, the
 * value reset by a change of data kind, the plot caption when there are no
 * bounds, the observed count's label kept inside the plot, two columns
 * chosen as one set or as pairs, and the colours a write puts into cells.
 * Counts are by hand from src/demo/inventedData.ts.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { resultBlockRows } from "../../src/report/resultBlock";
import { choices, dataView, setPaired, setUseHeader, slotRead, splitIntoPairs } from "../../src/taskpane/dataState";
import { createHost, type Host } from "../../src/taskpane/host";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { labelPlace } from "../../src/taskpane/plot";
import { setCenter } from "../../src/taskpane/questionState";
import { resultView } from "../../src/taskpane/resultState";
import { setSetting } from "../../src/taskpane/settingsState";
import { analyzeRange, bodyOf, writeResult } from "../../src/taskpane/workflow";
import { contrastRatio } from "../../src/taskpane/theme";

function demo(): { workbook: Workbook; host: Host } {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  return { workbook, host: createHost(fakeRun(workbook)) };
}

async function withRange(state: PaneState, index: number, address: string, host = demo().host): Promise<PaneState> {
  return slotRead(state, index, address, await analyzeRange(host, address));
}

describe("the name-row box", () => {
  it("keeps the person's choice when the same range is read again (Enter, then leaving the field)", async () => {
    const { host } = demo();
    const read = await withRange(initialState(), 0, "B1:B25", host);
    const unticked = setUseHeader(read, 0, false);
    // Leaving the field reads the range a second time; that read must not undo the click.
    const again = await withRange(unticked, 0, "'Paint line'!B1:B25", host);
    expect(again.slots[0].useHeader).toBe(false);
    // A different range starts from its own name row again.
    expect((await withRange(unticked, 0, "C1:C25", host)).slots[0].useHeader).toBe(true);
  });
});

describe("a change of data kind", () => {
  it("a change between one set and pairs resets the hypothesised value", async () => {
    const median = setCenter(initialState(), "50");
    expect(setPaired(median, true).question.center).toBe("0");
    expect(setPaired(setPaired(median, true), false).question.center).toBe("");
    // Choosing the kind it already is changes nothing.
    expect(setPaired(median, false).question.center).toBe("50");
  });
});

describe("the plot caption", () => {
  it("speaks of shaded bounds only when there are bounds", async () => {
    // 22 values cannot reach 99.99999% two-sided (that needs 2 × 0.5^n ≤ 1e-7, n ≥ 25; exact arithmetic): no bounds.
    const state = setSetting(atStep(setCenter(await withRange(initialState(), 0, "B1:B25"), "50"), 3), "confidence", "0.9999999");
    const view = resultView(state, callFunction);
    expect(view.plot?.lower).toBeNull();
    expect(view.caption).not.toContain("Shaded");
    expect(view.caption).toContain("no bounds");
    const usual = resultView(setSetting(state, "confidence", "0.95"), callFunction);
    expect(usual.caption).toContain("Shaded: the 95% bounds");
  });
});

describe("the observed count's label", () => {
  it("stays inside the plot at either end", () => {
    // A label of 11 characters at about 5.5 units each, in a plot from 14 to 286.
    const right = labelPlace(284, 60, 14, 286);
    expect(right.anchor).toBe("end");
    expect(right.x).toBeLessThanOrEqual(286);
    const left = labelPlace(15, 60, 14, 286);
    expect(left.anchor).toBe("start");
    expect(left.x).toBeGreaterThanOrEqual(14);
    expect(labelPlace(150, 60, 14, 286)).toEqual({ x: 150, anchor: "middle" });
  });
});

describe("two columns", () => {
  it("chosen as one set of values: said to be pooled, and offered as pairs", async () => {
    const state = await withRange(initialState(), 0, "B1:C25");
    // By hand: 2 × 24 cells below the name row, 22 + 24 numbers.
    expect(dataView(state).slots[0].pooled).toContain("2 columns");
    const pairs = splitIntoPairs(state);
    expect(pairs.paired).toBe(true);
    expect(choices(pairs).map((c) => bodyOf(c).rect)).toEqual([
      { top: 1, left: 1, bottom: 24, right: 1 },
      { top: 1, left: 2, bottom: 24, right: 2 },
    ]);
    expect(choices(pairs).map((c) => bodyOf(c).name)).toEqual(["Thickness (µm)", demoRows()[0][2]]);
  });

  it("chosen as the first of pairs: fills first and second in one go", async () => {
    const state = await withRange(setPaired(initialState(), true), 0, "B1:C25");
    expect(choices(state)).toHaveLength(2);
    expect(state.slots[1].text).toBe("'Paint line'!C1:C25");
    expect(dataView(state).slots[0].pooled).toBeNull();
  });
});

describe("colours written into the block's cells", () => {
  // Cell backgrounds: white in the light theme (Excel's default fill, common practice), and the
  // dark theme's #262626 (Office's Black theme body background, as test/taskpane/contrast.test.ts reads it).
  const BACKGROUNDS = ["#ffffff", "#262626"];

  it("every fixed font colour reaches 4.5:1 (WCAG 2.1, 1.4.3) on both, cautions included", async () => {
    const { workbook, host } = demo();
    const state = setCenter(await withRange(initialState(), 0, "B1:B25", host), "50");
    const request = {
      test: "sign",
      paired: false,
      center: 50,
      alternative: "two-sided",
      alpha: 0.05,
      confidence: 0.95,
      ties: "drop",
      method: "exact",
    } as const;
    const outcome = await writeResult(host, {
      choices: choices(state),
      reference: "exact",
      request,
      target: { sheet: DEMO_SHEET, rect: { top: 0, left: 4, bottom: resultBlockRows(request).length - 1, right: 5 } },
      chart: false,
      consent: null,
      calculate: callFunction,
    });
    if (outcome.kind !== "written") throw new Error(outcome.kind);
    const cautions = outcome.rows.flatMap((row, i) => (row.style === "caution" ? [i] : []));
    expect(cautions.length).toBeGreaterThan(0);
    for (let r = 0; r < outcome.rows.length; r++) {
      for (const c of [4, 5]) {
        const { color, italic } = workbook.format(DEMO_SHEET, r, c);
        if (cautions.includes(r)) expect(italic).toBe(true);
        // An automatic colour (null) follows the theme; a fixed one must read on both backgrounds.
        if (color !== null) for (const bg of BACKGROUNDS) expect(contrastRatio(color, bg)).toBeGreaterThanOrEqual(4.5);
      }
    }
  });
});
