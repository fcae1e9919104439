/**
 * The Data step's state for independent groups: two groups from two ranges,
 * and several groups from values with a group column, on the invented sheet
 * "Lines and suppliers" (src/demo/inventedData.ts). Counts are by hand from that file.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { GROUPS_SHEET, groupRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { choices, dataKind, dataReady, dataStepProblem, dataView, setDataKind, setUseHeader, slotRead } from "../../src/taskpane/dataState";
import { createHost, type Host } from "../../src/taskpane/host";
import { callFunction } from "../../src/functions/functions";
import { resultBlockRows } from "../../src/report/resultBlock";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { currentRequest, questionStepProblem, questionView, setAlternative, setCenter } from "../../src/taskpane/questionState";
import { reportCopy } from "../../src/taskpane/reportText";
import { resultView, setChart, setTarget, settleResult, suggestTarget, targetSize } from "../../src/taskpane/resultState";
import { setSetting, settingsView } from "../../src/taskpane/settingsState";
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
    expect(setDataKind(two, "pairs").slots[1].text).toBe("'Lines and suppliers'!F1:F12");
    expect(setDataKind(two, "groups").slots[1].range).toBeNull();
    expect(setDataKind(two, "groups").slots[0].text).toBe("'Lines and suppliers'!E1:E12");
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
      "'Lines and suppliers'!B2:B20: 3 groups with numbers counted — “North” (6), “South” (6), “East” (6). 1 row has a blank or error label and is skipped. Name: “Line”.",
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

async function twoGroups(): Promise<PaneState> {
  return withRange(await withRange(setDataKind(initialState(), "two-groups"), 0, "E1:E12"), 1, "F1:F12");
}

async function severalGroups(): Promise<PaneState> {
  return withRange(await withRange(setDataKind(initialState(), "groups"), 0, "C1:C20"), 1, "B1:B20");
}

describe("the Question step for groups", () => {
  it("two groups: a shift second − first in words, required, with the test of the kind", async () => {
    const state = atStep(await twoGroups(), 1);
    const view = questionView(setCenter(state, "0.5"), false);
    expect(view.showTests).toBe(false);
    expect(view.test).toBe("two-groups");
    expect(view.centerLabel).toBe(
      "Hypothesised shift: how much “New supplier (µm)” lies above “Old supplier (µm)” (second − first; 0 asks whether they differ at all)",
    );
    expect(view.h0).toBe("H0: “New supplier (µm)” and “Old supplier (µm)” + 0.5 have the same distribution");
    expect(questionView(setAlternative(setCenter(state, "0"), "greater"), false).h1).toBe(
      "H1: the values of “New supplier (µm)” tend to lie above those of “Old supplier (µm)”",
    );
    expect(questionStepProblem(setCenter(state, ""))).toBe("The hypothesised shift is empty: type a number.");
    const built = currentRequest(setCenter(state, "0.5"));
    expect(built.ok && built.request).toMatchObject({
      test: "two-groups",
      paired: false,
      center: 0.5,
      method: "rank-sum",
      dataName: "Old supplier (µm)",
      secondName: "New supplier (µm)",
    });
  });

  it("several groups: any difference between the groups, and an optional target median for the table", async () => {
    const state = atStep(await severalGroups(), 1);
    expect(questionStepProblem(state)).toBeNull();
    const none = currentRequest(state);
    expect(none.ok && none.request).toMatchObject({
      test: "groups",
      withTarget: false,
      method: "median",
      adjust: "holm",
      secondName: "Line",
    });
    expect(questionView(state, false).h0).toBe("H0: the typical values of “Thickness (µm)” are the same in every group of “Line”");
    expect(questionView(state, false).symbol).toContain("No target median");
    const target = currentRequest(setCenter(state, "50"));
    expect(target.ok && target.request).toMatchObject({ withTarget: true, center: 50 });
    expect(questionView(setCenter(state, "50"), false).symbol).toContain("tested against 50 (H1: median ≠ 50)");
    expect(questionStepProblem(setCenter(state, "fifty"))).toContain("The target median must be a plain number");
  });
});

describe("the Settings step for groups", () => {
  it("offers each kind's methods, and the adjustment only with a target", async () => {
    const two = settingsView(await twoGroups());
    expect([two.twoGroups, two.manyGroups, two.signTest, two.signedRank, two.asksWatching]).toEqual([true, false, false, false, false]);
    const several = await severalGroups();
    expect(settingsView(several).manyGroups).toBe(true);
    expect(settingsView(several).adjustUsed).toBe(false);
    expect(settingsView(setCenter(several, "50")).adjustUsed).toBe(true);
    const built = currentRequest(setSetting(setSetting(setCenter(several, "50"), "manyGroupMethod", "rank"), "adjust", "bh"));
    expect(built.ok && built.request).toMatchObject({ method: "rank", adjust: "bh" });
    const median = currentRequest(setSetting(await twoGroups(), "twoGroupMethod", "median"));
    expect(median.ok && median.request.method).toBe("median");
  });
});

describe("the Result step for groups", () => {
  it("two groups: the preview from the same core, no number line, the block two columns wide", async () => {
    const view = resultView(atStep(await twoGroups(), 3), callFunction);
    const shown = (key: string): unknown => view.rows.find((r) => r.key === key)?.value;
    // By hand from the invented data: 9 and 11 numbers, medians 50.4 and 51.7.
    expect([shown("firstNumbers"), shown("secondNumbers"), shown("firstMedian"), shown("secondMedian")]).toEqual([9, 11, 50.4, 51.7]);
    expect(shown("pvalue")).toBe(callFunction("TWOGROUPS", [column(4, 11), column(5, 11), 0, "two-sided", "rank-sum"]));
    expect(view.plot).toBeNull();
    expect(view.targetHint).toContain("The block takes 2 columns ×");
  });

  it("several groups: the table by group spills k + 2 rows (header, three lines, the skipped row) and eight columns", async () => {
    const state = atStep(setCenter(await severalGroups(), "50"), 3);
    const request = currentRequest(state);
    if (!request.ok) throw new Error("request");
    const size = targetSize(state, request.request, callFunction);
    const rows = resultBlockRows(request.request).length;
    expect(size).toEqual({ rows: rows - 1 + 5, columns: 8 });
    const view = resultView(suggestTarget(state, "H1"), callFunction);
    expect(view.targetHint).toBe(
      `The block takes 8 columns × ${size.rows} rows, the table by group taking a row per group: 'Lines and suppliers'!H1:O${size.rows}. Suggested: the first empty area to the right of the data.`,
    );
    const table = view.rows.find((r) => r.key === "byGroup")?.table?.shown ?? [];
    expect(table.map((cells) => cells[0])).toEqual(["Group", "North", "South", "East", "Rows without a usable label (skipped)"]);
    expect(view.chartAvailable).toBe(false);
    expect(settleResult(setChart(state, true)).chart).toBe(false);
    // A place near the sheet's right edge is refused for the whole table, not only the two label and value columns.
    expect(resultView(setTarget(state, "XFA1"), callFunction).targetProblem).toContain("does not fit");
  });

  it("copies a sentence with each group, and the table as tab-separated lines", async () => {
    const state = atStep(setCenter(await severalGroups(), "50"), 3);
    const request = currentRequest(state);
    if (!request.ok) throw new Error("request");
    const rows = resultView(state, callFunction).rows;
    const copy = reportCopy(request.request, rows);
    expect(copy.text.split("\n")[0]).toMatch(
      /^Several groups, Mood's median test, H1: .*: n = 19; p = .*; .* at alpha = 0\.05\. By group: North n = 6, median /,
    );
    expect(copy.text).toContain("Group\tCount\tMedian\tLower bound\tUpper bound\tCoverage\tSign-test p\tAdjusted p");
    expect(copy.html).toContain("<td>North</td>");
    const two = atStep(await twoGroups(), 3);
    const twoRequest = currentRequest(two);
    if (!twoRequest.ok) throw new Error("request");
    expect(reportCopy(twoRequest.request, resultView(two, callFunction).rows).text.split("\n")[0]).toMatch(
      /^Two groups, Wilcoxon–Mann–Whitney rank-sum test, H1: .*: n = 9 and 11; medians 50\.4 and 51\.7; p = .*Shift estimate, .* 95% bounds .* to .* \(exact coverage .*; a shift for groups of the same shape\)\.$/,
    );
  });
});

/** A column of the groups sheet's body (rows 2 to rows + 1) as Range.values gives it. */
function column(c: number, rows: number): unknown[][] {
  return groupRows()
    .slice(1, rows + 1)
    .map((row) => [row[c] ?? ""]);
}
