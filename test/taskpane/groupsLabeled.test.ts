/**
 * Two groups from one column of values and a group column beside it: the Data step's reading of the labels
 * (exactly two, blank labels skipped and counted, first and second in order of first appearance, swapped on
 * request), the request and question named with the labels, the preview equal to TWOGROUPS and SHIFT on the
 * split ranges, Copy as text, and the block read back. Data: the invented "Lines and suppliers" sheet
 * (src/demo/inventedData.ts) and a small invented shift log written beside it; counts by hand from these.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { GROUPS_SHEET, groupRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { readBlock, sameBlockFormulas } from "../../src/taskpane/blockEdit";
import {
  dataReady,
  dataStepProblem,
  dataView,
  pickedGroups,
  setDataKind,
  setGroupColumn,
  setSwapGroups,
  slotRead,
} from "../../src/taskpane/dataState";
import { createHost, type Host } from "../../src/taskpane/host";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { blockSize, blockWrite } from "../../src/taskpane/preview";
import { currentRequest, questionView, setCenter } from "../../src/taskpane/questionState";
import { reportCopy } from "../../src/taskpane/reportText";
import { resultView, statePreview } from "../../src/taskpane/resultState";
import { analyzeRange } from "../../src/taskpane/workflow";

/** Invented: coating thickness logged by work shift, one label blank (the shift was not noted). */
const SHIFT_LOG: (string | number | null)[][] = [
  ["Shift", "Thickness (µm)"],
  ["Early", 50.2],
  ["Late", 51.4],
  ["Early", 49.8],
  [null, 50.9],
  ["Late", 52.0],
  ["early", 50.6],
  ["Late", 51.1],
];
const EARLY = [[50.2], [49.8], [50.6]];
const LATE = [[51.4], [52.0], [51.1]];

function host(): Host {
  const workbook = new Workbook([GROUPS_SHEET]);
  workbook.writeEntries(GROUPS_SHEET, 0, 0, groupRows());
  workbook.writeEntries(GROUPS_SHEET, 0, 8, SHIFT_LOG);
  return createHost(fakeRun(workbook));
}

async function labeled(values: string, labels: string): Promise<PaneState> {
  const on = host();
  let state = setGroupColumn(setDataKind(initialState(), "two-groups"), true);
  state = slotRead(state, 0, values, await analyzeRange(on, values));
  state = slotRead(state, 1, labels, await analyzeRange(on, labels));
  return { ...state, reference: "exact", referenceChosen: true };
}

describe("two groups from a group column: the Data step", () => {
  it("offers the form for two groups only, asks for values and the group column, and drops the second range on a change", async () => {
    expect(setGroupColumn(initialState(), true).groupColumn).toBe(false);
    const state = setGroupColumn(setDataKind(initialState(), "two-groups"), true);
    expect(dataView(state).groupColumn).toBe(true);
    expect(dataView(state).slots[1].label).toBe("Group column (two labels: the group of each value, beside it)");
    expect(dataStepProblem(state)).toBe("Give the values and the group column first.");
    const ready = await labeled("J1:J8", "I1:I8");
    expect(setGroupColumn(ready, false).slots[1].range).toBeNull();
    expect(setDataKind(ready, "groups").slots[1].text).toBe(ready.slots[1].text);
  });

  it("takes exactly two labels in order of first appearance, text matched ignoring case, the blank label skipped and counted", async () => {
    const state = await labeled("J1:J8", "I1:I8");
    expect(dataReady(state)).toBe(true);
    expect(pickedGroups(state)).toEqual({ first: "Early", second: "Late" });
    expect(dataView(state).slots[1].summary).toContain("2 groups with numbers counted — “Early” (3), “Late” (3). 1 row has a blank");
    expect(dataView(state).picked?.words).toBe("First group: “Early”; second group: “Late”. The shift is “Late” − “Early”.");
    expect(pickedGroups(setSwapGroups(state, true))).toEqual({ first: "Late", second: "Early" });
  });

  it("names the labels it found and suggests several groups when the column holds more than two", async () => {
    const state = await labeled("C1:C20", "B1:B20");
    expect(dataReady(state)).toBe(false);
    expect(dataStepProblem(state)).toBe(
      "Two groups need a group column with exactly two labels; it holds 3: “North” (6 numbers), “South” (6 numbers), “East” (6 numbers). To compare them all, choose Several groups.",
    );
  });
});

describe("two groups from a group column: question, result and copy", () => {
  it("names the shift with the labels and gives TWOGROUPS and SHIFT of the split groups", async () => {
    const state = atStep(setCenter(await labeled("J1:J8", "I1:I8"), "0.5"), 1);
    expect(questionView(state, false).h0).toBe("H0: “Late” and “Early” + 0.5 have the same distribution");
    const built = currentRequest(state);
    expect(built.ok && built.request).toMatchObject({
      test: "two-groups",
      center: 0.5,
      dataName: "Early",
      secondName: "Late",
      groupLabels: { first: "Early", second: "Late" },
    });
    const view = resultView(atStep(state, 3), callFunction);
    const shown = (key: string): unknown => view.rows.find((r) => r.key === key)?.value;
    // By hand: Early 49.8, 50.2, 50.6 (median 50.2); Late 51.1, 51.4, 52.0 (median 51.4).
    expect([shown("firstNumbers"), shown("secondNumbers"), shown("firstMedian"), shown("secondMedian")]).toEqual([3, 3, 50.2, 51.4]);
    expect(shown("pvalue")).toBe(callFunction("TWOGROUPS", [EARLY, LATE, 0.5, "two-sided", "rank-sum"]));
    expect(shown("estimate")).toBe((callFunction("SHIFT", [EARLY, LATE, 0.95]) as unknown[][])[0][0]);
    if (!built.ok) throw new Error("request");
    expect(reportCopy(built.request, view.rows).text.split("\n")[0]).toMatch(/^Two groups, .*: n = 3 and 3; medians 50\.2 and 51\.4; p = /);
  });

  it("reads the written block back as two groups from a group column; only the written order writes the same block", async () => {
    const state = atStep(setSwapGroups(await labeled("J1:J8", "I1:I8"), true), 3);
    const write = (s: PaneState): string[][] => {
      const built = currentRequest(s);
      if (!built.ok) throw new Error("request");
      const rows = statePreview(s, built.request, callFunction);
      const size = blockSize(rows);
      return blockWrite(rows, GROUPS_SHEET, { top: 0, left: 11, bottom: size.rows - 1, right: 10 + size.columns }).formulas;
    };
    const formulas = write(state);
    expect(formulas.find((line) => line[0] === "p-value")?.[1]).toBe(
      '=EVENSPLIT.LABELEDTWOGROUPS($J$2:$J$8,$I$2:$I$8,"Late","Early",0,"two-sided","rank-sum")',
    );
    expect(readBlock(formulas)).toMatchObject({
      groups: "two",
      groupColumn: true,
      references: ["$J$2:$J$8", "$I$2:$I$8"],
      center: 0,
      confidences: [0.95],
    });
    const built = currentRequest(state);
    if (!built.ok) throw new Error("request");
    const rows = statePreview(state, built.request, callFunction);
    expect(sameBlockFormulas(write(state), formulas, rows)).toBe(true);
    expect(sameBlockFormulas(write(setSwapGroups(state, false)), formulas, rows)).toBe(false);
  });
});
