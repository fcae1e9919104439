/**
 * What users expect of the pane, on the state modules without a page
 * (each written before the change and seen to fail on the old code): new
 * rows count by default (a table made with the person's consent at Write),
 * one notation for the hypotheses shared with the block, and the paired
 * question naming the difference in words. Data: the invented paint-line
 * sheet (src/demo/inventedData.ts).
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { resultBlockRows } from "../../src/report/resultBlock";
import { dataView, setPaired, setReference, setUseHeader, slotRead } from "../../src/taskpane/dataState";
import { createHost, type Host } from "../../src/taskpane/host";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { setCenter, questionView } from "../../src/taskpane/questionState";
import { notation } from "../../src/taskpane/request";
import { resultView } from "../../src/taskpane/resultState";
import { analyzeRange } from "../../src/taskpane/workflow";

function host(): Host {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  return createHost(fakeRun(workbook));
}

async function withRange(state: PaneState, index: number, address: string, on = host()): Promise<PaneState> {
  return slotRead(state, index, address, await analyzeRange(on, address));
}

describe("new rows count by default", () => {
  it("takes a table column as the default where a table can be made, says so, and asks at Write", async () => {
    const state = await withRange(initialState(), 0, "B1:B25");
    expect(state.reference).toBe("table");
    expect(dataView(state).note).toContain("This is the default, so that new rows count");
    const result = resultView(atStep(setCenter(state, "50"), 3), callFunction);
    expect(result.makesTable).toBe(true);
  });

  it("keeps the person's own choice, and falls back where no table can be made", async () => {
    const exact = setReference(await withRange(initialState(), 0, "B1:B25"), "exact");
    expect((await withRange(exact, 0, "B1:B25")).reference).toBe("exact");
    expect(resultView(atStep(setCenter(exact, "50"), 3), callFunction).makesTable).toBe(false);
    // Without a name row a table has no column names.
    expect(setUseHeader(await withRange(initialState(), 0, "B1:B25"), 0, false).reference).toBe("exact");
  });
});

describe("one notation", () => {
  it("writes the hypotheses with the labels the block uses (H0, H1)", () => {
    const request = { test: "sign", paired: false, center: 50, alternative: "greater", alpha: 0.05, confidence: 0.95 } as const;
    const labels = resultBlockRows(request).map((r) => r.label);
    expect(labels).toContain("H0");
    expect(labels).toContain("H1");
    const n = notation(request);
    expect(n.h0.startsWith("H0: ")).toBe(true);
    expect(n.h1.startsWith("H1: ")).toBe(true);
    expect(questionView(initialState(), false).h0).toBe("H0: …");
  });
});

describe("the paired question in words", () => {
  it("names the difference as the second column's value minus the first's, by name", async () => {
    const on = host();
    const pairs = await withRange(await withRange(setPaired(initialState(), true), 0, "B1:B25", on), 1, "C1:C25", on);
    const view = questionView(atStep(pairs, 1), false);
    expect(view.subjectLabel).toBe("The median of the differences (for each row, “After nozzle change (µm)” minus “Thickness (µm)”) is");
    expect(view.symbol).toBe("D: for each pair, the second value minus the first (“After nozzle change (µm)” minus “Thickness (µm)”)");
  });
});
