/**
 * Reading a written group block back (blockEdit.ts) and loading it into the
 * pane's state: the formulas are the ones the block's one definition writes
 * (resultBlock.ts through preview.ts) on the invented sheet "Lines and
 * suppliers", so a change there that the reading cannot follow fails here.
 * The round trip: the state read back writes exactly the block read.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { GROUPS_SHEET, groupRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import type { BlockRequest } from "../../src/report/resultBlock";
import { readBlock, sameBlockFormulas } from "../../src/taskpane/blockEdit";
import { setDataKind, slotRead } from "../../src/taskpane/dataState";
import { createHost } from "../../src/taskpane/host";
import { initialState } from "../../src/taskpane/paneState";
import { blockPreview, blockSize, blockWrite } from "../../src/taskpane/preview";
import { currentRequest, setAlternative, setCenter } from "../../src/taskpane/questionState";
import { statePreview } from "../../src/taskpane/resultState";
import { setSetting } from "../../src/taskpane/settingsState";
import { analyzeRange } from "../../src/taskpane/workflow";

function column(c: number, rows: number): unknown[][] {
  return groupRows()
    .slice(1, rows + 1)
    .map((row) => [row[c] ?? ""]);
}

function written(request: BlockRequest, refs: { data: string; second: string }, inputs: { data: unknown[][]; second: unknown[][] }) {
  const rows = blockPreview(request, inputs, refs, callFunction);
  const size = blockSize(rows);
  return { rows, formulas: blockWrite(rows, GROUPS_SHEET, { top: 0, left: 7, bottom: size.rows - 1, right: 6 + size.columns }).formulas };
}

const BASE = { paired: false, alpha: 0.01, confidence: 0.9 } as const;

describe("a group block read back", () => {
  it("gives two groups' references, shift, direction, method, alpha and confidence", () => {
    const request: BlockRequest = { ...BASE, test: "two-groups", center: -0.5, alternative: "less", method: "median" };
    const { formulas } = written(request, { data: "$E$2:$E$12", second: "$F$2:$F$12" }, { data: column(4, 11), second: column(5, 11) });
    expect(readBlock(formulas)).toMatchObject({
      test: "two-groups",
      groups: "two",
      references: ["$E$2:$E$12", "$F$2:$F$12"],
      center: -0.5,
      alternative: "less",
      groupMethod: "median",
      alpha: 0.01,
      confidences: [0.9],
    });
  });

  it("gives several groups' method, target or none, direction and adjustment from GROUPS and the table's formula", () => {
    const inputs = { data: column(2, 19), second: column(1, 19) };
    const refs = { data: "Table1[[Thickness (µm)]]", second: "Table1[Line]" };
    const target: BlockRequest = {
      ...BASE,
      test: "groups",
      center: 50,
      withTarget: true,
      alternative: "greater",
      method: "rank",
      adjust: "by",
    };
    expect(readBlock(written(target, refs, inputs).formulas)).toMatchObject({
      test: "groups",
      groups: "several",
      references: ["Table1[[Thickness (µm)]]", "Table1[Line]"],
      withTarget: true,
      center: 50,
      alternative: "greater",
      groupMethod: "rank",
      adjust: "by",
      confidences: [0.9],
    });
    const none: BlockRequest = { ...BASE, test: "groups", center: 0, alternative: "two-sided", method: "median", adjust: "holm" };
    expect(readBlock(written(none, refs, inputs).formulas)).toMatchObject({ withTarget: false, groupMethod: "median" });
  });

  it("compares a block with a spilled table on what it writes, not on the cells its table spills into", () => {
    const request: BlockRequest = {
      ...BASE,
      test: "groups",
      center: 50,
      withTarget: true,
      alternative: "two-sided",
      method: "median",
      adjust: "holm",
    };
    const { rows, formulas } = written(
      request,
      { data: "$C$2:$C$20", second: "$B$2:$B$20" },
      { data: column(2, 19), second: column(1, 19) },
    );
    // The sheet's formulas of spilled cells hold the answers (or nothing): both read as the same block.
    const top = rows.findIndex((row) => row.table !== undefined);
    const spilled = formulas.map((line, r) => (r > top ? line.map((_, c) => (c === 0 ? "North" : 6)) : line));
    expect(sameBlockFormulas(formulas, spilled, rows)).toBe(true);
    const edited = formulas.map((line, r) => (r === 1 ? [line[0], "A question typed over"] : line));
    expect(sameBlockFormulas(formulas, edited, rows)).toBe(false);
    expect(sameBlockFormulas(formulas, formulas.slice(1), rows)).toBe(false);
  });

  it("reads back the question and settings of the block a pane state writes", async () => {
    const workbook = new Workbook([GROUPS_SHEET]);
    workbook.writeEntries(GROUPS_SHEET, 0, 0, groupRows());
    const host = createHost(fakeRun(workbook));
    let state = setDataKind(initialState(), "groups");
    state = slotRead(state, 0, "C1:C20", await analyzeRange(host, "C1:C20"));
    state = slotRead(state, 1, "B1:B20", await analyzeRange(host, "B1:B20"));
    state = setSetting(setAlternative(setCenter({ ...state, reference: "exact", referenceChosen: true }, "50"), "less"), "adjust", "bh");
    const built = currentRequest(state);
    if (!built.ok) throw new Error("request");
    const rows = statePreview(state, built.request, callFunction);
    const size = blockSize(rows);
    const formulas = blockWrite(rows, GROUPS_SHEET, { top: 0, left: 7, bottom: size.rows - 1, right: 6 + size.columns }).formulas;
    const reading = readBlock(formulas);
    expect(reading).toMatchObject({ references: ["$C$2:$C$20", "$B$2:$B$20"], center: 50, alternative: "less", adjust: "bh" });
  });
});
