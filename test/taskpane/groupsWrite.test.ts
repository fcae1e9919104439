/**
 * Writing a several-groups block through the pane's workflow into the demo
 * workbook (the Excel stand-in): the place checked is the whole block, the
 * table by group included (k + 2 rows for three invented lines and a panel
 * without one), the formulas land as written and the sheet spills the table
 * exactly where the place was cleared; a filled cell in the table's way is
 * listed before anything is written.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { GROUPS_SHEET, groupRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { createHost, type Host } from "../../src/taskpane/host";
import { dataReady, setDataKind, slotRead } from "../../src/taskpane/dataState";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { currentRequest, setCenter } from "../../src/taskpane/questionState";
import { setTarget, targetPlace } from "../../src/taskpane/resultState";
import { analyzeRange, writeResult, type WritePlan } from "../../src/taskpane/workflow";
import { choices } from "../../src/taskpane/dataState";
import { catalogueFunctions } from "../demo/catalogue";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

function book(): { workbook: Workbook; host: Host } {
  const workbook = new Workbook([GROUPS_SHEET]);
  workbook.writeEntries(GROUPS_SHEET, 0, 0, groupRows());
  workbook.setFunctions(functions);
  return { workbook, host: createHost(fakeRun(workbook)) };
}

async function ready(host: Host, target: string): Promise<{ state: PaneState; plan: WritePlan }> {
  let state = setDataKind(initialState(), "groups");
  state = slotRead(state, 0, "C1:C20", await analyzeRange(host, "C1:C20"));
  state = slotRead(state, 1, "B1:B20", await analyzeRange(host, "B1:B20"));
  state = setTarget(atStep(setCenter({ ...state, reference: "exact", referenceChosen: true }, "50"), 3), target);
  expect(dataReady(state)).toBe(true);
  const built = currentRequest(state);
  if (!built.ok) throw new Error("request");
  const place = targetPlace(state, built.request, callFunction);
  if (!place) throw new Error("place");
  return {
    state,
    plan: {
      choices: choices(state),
      reference: "exact",
      request: built.request,
      target: place,
      chart: false,
      consent: null,
      calculate: callFunction,
    },
  };
}

describe("writing a several-groups block", () => {
  it("writes the block and its table's formula, and the sheet spills the table where the place was cleared", async () => {
    const { workbook, host } = book();
    const { plan } = await ready(host, "H1");
    expect(plan.target.rect.right - plan.target.rect.left + 1).toBe(8);
    const outcome = await writeResult(host, plan);
    expect(outcome.kind).toBe("written");
    const height = plan.target.rect.bottom + 1;
    // The table's anchor is the block's fifth row from the bottom: header, North, South, East, skipped row.
    const anchor = height - 5;
    expect(workbook.entry(GROUPS_SHEET, anchor, 7)).toBe('=EVENSPLIT.BYGROUP($C$2:$C$20,$B$2:$B$20,50,"two-sided",0.95,"holm")');
    expect([0, 1, 2, 3, 4].map((r) => workbook.value(GROUPS_SHEET, anchor + r, 7))).toEqual([
      "Group",
      "North",
      "South",
      "East",
      "Rows without a usable label (skipped)",
    ]);
    // South: 6 of 6 above 50, two-sided sign test 2/64 (exact arithmetic).
    expect(workbook.value(GROUPS_SHEET, anchor + 2, 13)).toBeCloseTo(2 / 64, 15);
  });

  it("lists a filled cell where the table will spill before writing anything", async () => {
    const { workbook, host } = book();
    const { plan } = await ready(host, "H1");
    const corner = { row: plan.target.rect.bottom, column: plan.target.rect.right };
    workbook.writeEntries(GROUPS_SHEET, corner.row, corner.column, [["in the way"]]);
    const outcome = await writeResult(host, plan);
    expect(outcome.kind).toBe("confirm");
    if (outcome.kind === "confirm") expect(outcome.consent.filled.map((cell) => cell.content)).toEqual(["in the way"]);
    expect(workbook.entry(GROUPS_SHEET, 0, 7)).toBe("");
  });

  it("refuses a place whose size no longer matches the block", async () => {
    const { host } = book();
    const { plan } = await ready(host, "H1");
    const shorter = { ...plan, target: { ...plan.target, rect: { ...plan.target.rect, bottom: plan.target.rect.bottom - 1 } } };
    const outcome = await writeResult(host, shorter);
    expect(outcome.kind === "refused" && outcome.message).toContain("size changed");
  });
});
