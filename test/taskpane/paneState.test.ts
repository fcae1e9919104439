/**
 * The pane's state without a page: the updates of each step (dataState.ts,
 * questionState.ts, settingsState.ts, resultState.ts) and what each step
 * shows, on the invented paint-line data read through the demo sheet's
 * Excel stand-in. Counts are by hand from src/demo/inventedData.ts; the
 * p-value is an exact binomial sum in BigInt (exact arithmetic).
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import {
  choices,
  dataReady,
  dataStepProblem,
  dataView,
  setDataKind,
  setPaired,
  setReference,
  setUseHeader,
  slotFailed,
  slotRead,
} from "../../src/taskpane/dataState";
import { createHost, type Host } from "../../src/taskpane/host";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { currentRequest, questionStepProblem, questionView, setAlternative, setCenter, setTest } from "../../src/taskpane/questionState";
import {
  chartWords,
  resultView,
  setChart,
  setTarget,
  settleResult,
  suggestTarget,
  targetFromSelection,
} from "../../src/taskpane/resultState";
import { setSetting, settingsStepProblem, settingsView } from "../../src/taskpane/settingsState";
import { analyzeRange } from "../../src/taskpane/workflow";
import { binomialCoefficient as choose } from "../exact";

function host(): Host {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  return createHost(fakeRun(workbook));
}

async function withRange(state: PaneState, index: number, address: string, on = host()): Promise<PaneState> {
  return slotRead(state, index, address, await analyzeRange(on, address));
}

describe("the Data step's state", () => {
  it("reads a range: address as the workbook gives it, the name row taken, the summary counted", async () => {
    const state = await withRange(initialState(), 0, "b1:b25");
    expect(state.slots[0].text).toBe("'Paint line'!B1:B25");
    expect(state.slots[0].useHeader).toBe(true);
    expect(dataReady(state)).toBe(true);
    // By hand: 24 cells below the header, 22 numbers, one blank, one note.
    expect(dataView(state).slots[0].summary).toContain("24 cells — 22 numbers, 1 blank, 1 text");
    expect(dataView(state).slots[0].canToggleHeader).toBe(true);
    expect(dataStepProblem(state)).toBeNull();
  });

  it("keeps a range it could not read as typed, with the reason", async () => {
    const state = await withRange(initialState(), 0, "nowhere");
    expect(state.slots[0].range).toBeNull();
    expect(state.slots[0].problem).toContain("is not a range address");
    expect(slotFailed(initialState(), 0, "B1:B25", "busy").slots[0].problem).toBe("The range could not be read: busy");
    expect(dataStepProblem(initialState())).toBe("Give the range with the values first.");
  });

  it("asks for both ranges of pairs, and starts their shift at 0", async () => {
    const paired = setPaired(initialState(), true);
    expect(paired.question.center).toBe("0");
    expect(dataStepProblem(paired)).toBe("Give both ranges first.");
    const both = await withRange(await withRange(paired, 0, "B1:B25"), 1, "C1:C25");
    expect(choices(both)).toHaveLength(2);
    expect(dataView(both).slots[0].label).toBe("First values (for example, before)");
  });

  it("falls back to exactly these cells when a table can no longer be made", async () => {
    const state = setReference(await withRange(initialState(), 0, "B1:B25"), "table");
    expect(state.reference).toBe("table");
    expect(dataView(state).note).toContain("will become a table");
    // Without a name row a table has no column names to take.
    expect(setUseHeader(state, 0, false).reference).toBe("exact");
  });
});

describe("the Question and Settings steps' state", () => {
  it("builds the request from the whole state, with the hypotheses in notation", async () => {
    const state = setAlternative(setCenter(atStep(await withRange(initialState(), 0, "B1:B25"), 1), "50"), "greater");
    const built = currentRequest(state);
    expect(built.ok && built.request).toMatchObject({ test: "sign", center: 50, alternative: "greater", dataName: "Thickness (µm)" });
    const view = questionView(state, false);
    expect(view.subjectLabel).toBe("The median of “Thickness (µm)” is");
    expect(view.h1).toContain("median > 50");
  });

  it("names the problem of each field, and only where it belongs", async () => {
    const state = atStep(await withRange(initialState(), 0, "B1:B25"), 1);
    // Nothing typed yet: no complaint until the person tries to move on.
    expect(questionView(state, false).centerProblem).toBeNull();
    expect(questionView(state, true).centerProblem).toContain("is empty");
    expect(questionStepProblem(setCenter(state, "50,5"))).toContain("use a point for decimals");
    expect(settingsStepProblem(setSetting(state, "alpha", "5"))).toContain("strictly between 0 and 1");
    expect(settingsView(setTest(state, "signed-rank")).signedRank).toBe(true);
    expect(settingsView(state).signTest).toBe(true);
  });
});

describe("the Result step's state", () => {
  it("previews the block only on the Result step, with the exact p-value", async () => {
    const ready = setAlternative(setCenter(await withRange(initialState(), 0, "B1:B25"), "50"), "greater");
    expect(resultView(ready, callFunction).rows).toEqual([]);
    const view = resultView(atStep(ready, 3), callFunction);
    const p = view.rows.find((r) => r.key === "pvalue")?.value as number;
    // By hand: 16 of the 22 values above 50, 5 below, one tie left out: P(X >= 16), X ~ Binomial(21, 1/2).
    let tail = 0n;
    for (let j = 16; j <= 21; j++) tail += choose(21, j);
    expect(p).toBeCloseTo(Number(tail) / 2 ** 21, 14);
    expect(view.plot?.values).toHaveLength(22);
  });

  it("keeps a place the person chose over a suggestion, and takes a selection's top-left cell", async () => {
    const state = atStep(setCenter(await withRange(initialState(), 0, "B1:B25"), "50"), 3);
    expect(suggestTarget(state, "E1").target).toBe("E1");
    expect(suggestTarget(setTarget(state, "H1"), "E1").target).toBe("H1");
    expect(targetFromSelection(state, "'Paint line'!H3:J9").target).toBe("'Paint line'!H3");
    expect(resultView(setTarget(state, "XFD1"), callFunction).targetProblem).toContain("does not fit");
  });

  it("drops the chart when the values fill more than one column, and keeps it for pairs wherever their columns are", async () => {
    const wide = await withRange(initialState(), 0, "B1:C25");
    expect(settleResult(setChart(wide, true)).chart).toBe(false);
    expect(resultView(atStep(setCenter(setChart(wide, true), "50"), 3), callFunction).chartHint).toMatch(
      /^Not available: the chart plots one column/,
    );
    const apart = await withRange(await withRange(setPaired(initialState(), true), 0, "B1:B25"), 1, "D1:D25");
    expect(settleResult(setChart(apart, true)).chart).toBe(true);
    // Two independent groups are no pairs: their difference row by row means nothing, so there is no chart.
    const groups = await withRange(await withRange(setDataKind(initialState(), "two-groups"), 0, "B1:B25"), 1, "D1:D25");
    expect(settleResult(setChart(groups, true)).chart).toBe(false);
  });

  it("describes the chart: the bounds that exist, whether new rows show, and that pairs are worked out for the rows there are", () => {
    expect(chartWords(false, "two-sided", "table")).toContain("with H0’s value and the lower and upper bounds as lines");
    expect(chartWords(false, "lower", "table")).toContain("the lower bound as lines");
    expect(chartWords(false, "two-sided", "table")).toContain("New rows of the table show up as new points.");
    expect(chartWords(false, "two-sided", "exact")).not.toContain("new rows");
    expect(chartWords(false, "two-sided", "open")).toContain("the chart plots the rows there are now");
    expect(chartWords(true, "upper", "table")).toContain("worked out in helper cells for the pairs there are now");
  });
});
