/**
 * The Data step's state for independent groups: two groups from two ranges,
 * and several groups from values with a group column, on the invented sheet
 * "Paint lines" (src/demo/inventedData.ts). Counts are by hand from that file.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { GROUPS_SHEET, groupRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { choices, dataKind, dataReady, dataStepProblem, dataView, setDataKind, setUseHeader, slotRead } from "../../src/taskpane/dataState";
import { createHost, type Host } from "../../src/taskpane/host";
import { initialState, type PaneState } from "../../src/taskpane/paneState";
import { setCenter } from "../../src/taskpane/questionState";
import { analyzeRange } from "../../src/taskpane/workflow";

function host(extra: { row: number; column: number; rows: unknown[][] } | null = null): Host {
  const workbook = new Workbook([GROUPS_SHEET]);
  workbook.writeEntries(GROUPS_SHEET, 0, 0, groupRows());
  if (extra) workbook.writeEntries(GROUPS_SHEET, extra.row, extra.column, extra.rows);
  return createHost(fakeRun(workbook));
}

async function withRange(state: PaneState, index: number, address: string, on = host()): Promise<PaneState> {
  return slotRead(state, index, address, await analyzeRange(on, address));
}

describe("choosing the kind of data", () => {
  it("starts a shift at 0 for two groups and leaves the target of several groups empty", () => {
    const two = setDataKind(setCenter(initialState(), "50"), "two-groups");
    expect(dataKind(two)).toBe("two-groups");
    expect(two.question.center).toBe("0");
    const several = setDataKind(two, "groups");
    expect(dataKind(several)).toBe("groups");
    expect(several.question.center).toBe("");
    expect(dataKind(setDataKind(several, "one"))).toBe("one");
  });

  it("drops the second range when it changes meaning (a group column is not a second group)", async () => {
    const two = await withRange(await withRange(setDataKind(initialState(), "two-groups"), 0, "E1:E12"), 1, "F1:F12");
    expect(choices(two)).toHaveLength(2);
    expect(setDataKind(two, "pairs").slots[1].text).toBe("'Paint lines'!F1:F12");
    expect(setDataKind(two, "groups").slots[1].range).toBeNull();
    expect(setDataKind(two, "groups").slots[0].text).toBe("'Paint lines'!E1:E12");
  });

  it("asks for what each kind needs", () => {
    expect(dataStepProblem(setDataKind(initialState(), "two-groups"))).toBe("Give both groups first.");
    expect(dataStepProblem(setDataKind(initialState(), "groups"))).toBe("Give the values and the group column first.");
  });
});

describe("two groups from two ranges", () => {
  it("takes groups of different sizes, each with its name", async () => {
    const state = await withRange(await withRange(setDataKind(initialState(), "two-groups"), 0, "E1:E12"), 1, "F1:F12");
    expect(dataReady(state)).toBe(true);
    const view = dataView(state);
    expect(view.slots[0].label).toBe("First group (for example, line A)");
    // By hand: the old supplier has 9 numbers and 2 blank cells below them in E2:E12; the new one 11.
    expect(view.slots[0].summary).toContain("11 cells — 9 numbers, 2 blank");
    expect(view.slots[1].summary).toContain("11 numbers");
    expect(view.problem).toBe("");
  });

  it("refuses a group without numbers and overlapping ranges", async () => {
    const noNumbers = await withRange(await withRange(setDataKind(initialState(), "two-groups"), 0, "A1:A12"), 1, "F1:F12");
    expect(dataStepProblem(noNumbers)).toBe("The first group holds no numbers.");
    const overlap = await withRange(await withRange(setDataKind(initialState(), "two-groups"), 0, "E1:F12"), 1, "F1:F12");
    expect(dataStepProblem(overlap)).toContain("overlap");
  });
});

describe("several groups from values and a group column", () => {
  it("takes the group column's first row as its name when the values have one, and counts its labels", async () => {
    const state = await withRange(await withRange(setDataKind(initialState(), "groups"), 0, "C1:C20"), 1, "B1:B20");
    expect(state.slots[1].range?.header).toBe("Line");
    expect(dataReady(state)).toBe(true);
    const view = dataView(state);
    expect(view.slots[1].label).toBe("Group column (the group of each value, beside it)");
    // By hand: North 6, South 6, East 6 panels; Q-210 has no line and is skipped.
    expect(view.slots[1].summary).toBe(
      "'Paint lines'!B2:B20: 3 groups with numbers counted — “North” (6), “South” (6), “East” (6). 1 row has a blank or error label and is skipped. Name: “Line”.",
    );
  });

  it("refuses a group column that does not line up with the values", async () => {
    const state = await withRange(await withRange(setDataKind(initialState(), "groups"), 0, "C1:C20"), 1, "B1:B15");
    expect(dataStepProblem(state)).toContain("must lie beside the values, row for row");
    const unticked = setUseHeader(
      await withRange(await withRange(setDataKind(initialState(), "groups"), 0, "C1:C20"), 1, "B1:B20"),
      1,
      false,
    );
    expect(dataStepProblem(unticked)).toContain("row for row");
  });

  it("needs at least two groups with numbers", async () => {
    const one = host({ row: 0, column: 7, rows: [["Shift"], ["Day"], ["day"], ["DAY"]] });
    const state = await withRange(await withRange(setDataKind(initialState(), "groups"), 0, "C1:C4", one), 1, "H1:H4", one);
    // Labels are matched ignoring case, as the sheet compares text.
    expect(dataStepProblem(state)).toBe("The group column names only one group with numbers (“Day”): several groups need at least two.");
  });
});
