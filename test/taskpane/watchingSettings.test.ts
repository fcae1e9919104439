/**
 * The Settings step's question about looking at the result again as rows arrive, without a page: it is
 * asked only when the block follows new rows (a table column or an open-ended range) and has watching
 * versions (the sign test, one sample or pairs); the answer goes into the block request, and the Result
 * step's preview then shows the watching p-value (WATCHPVALUE, PAIREDWATCHPVALUE for pairs) or, for a kept
 * fixed-sample test, the extra row and the caution. Data: the invented paint-line sheet, read through the demo sheet's Excel stand-in.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { readBlock } from "../../src/taskpane/blockEdit";
import { blockFollowsNewRows, setPaired, setReference, slotRead } from "../../src/taskpane/dataState";
import { createHost } from "../../src/taskpane/host";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { currentRequest, setCenter, setTest } from "../../src/taskpane/questionState";
import { reportSentence } from "../../src/taskpane/reportText";
import { resultView } from "../../src/taskpane/resultState";
import { asksWatching, settingsView, setWatching } from "../../src/taskpane/settingsState";
import { analyzeRange } from "../../src/taskpane/workflow";

async function withRange(state: PaneState, index: number, address: string): Promise<PaneState> {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  return slotRead(state, index, address, await analyzeRange(createHost(fakeRun(workbook)), address));
}

async function oneSample(reference: "exact" | "table" | "open"): Promise<PaneState> {
  return atStep(setCenter(setReference(await withRange(initialState(), 0, "B1:B25"), reference), "50"), 2);
}

/** Thickness before and after the nozzle change, as pairs, shift 0. */
async function pairs(reference: "exact" | "table" | "open"): Promise<PaneState> {
  const read = await withRange(await withRange(setPaired(initialState(), true), 0, "B1:B25"), 1, "C1:C25");
  return atStep(setCenter(setReference(read, reference), "0"), 2);
}

describe("the question about looking again", () => {
  it("is asked only when the block follows new rows", async () => {
    for (const reference of ["table", "open"] as const) {
      const state = await oneSample(reference);
      expect(state.reference).toBe(reference);
      expect(blockFollowsNewRows(state)).toBe(true);
      expect(settingsView(state).asksWatching).toBe(true);
    }
    const exact = await oneSample("exact");
    expect(blockFollowsNewRows(exact)).toBe(false);
    expect(settingsView(exact).asksWatching).toBe(false);
  });

  it("is asked for pairs too, when their block follows new rows", async () => {
    for (const reference of ["table", "open"] as const) expect(settingsView(await pairs(reference)).asksWatching).toBe(true);
    expect(settingsView(await pairs("exact")).asksWatching).toBe(false);
  });

  it("is not asked for tests without watching versions", async () => {
    for (const state of [await oneSample("open"), await pairs("open")]) {
      expect(asksWatching(setTest(state, "signed-rank"))).toBe(false);
    }
    expect(asksWatching(setTest(await oneSample("open"), "quantile"))).toBe(false);
  });

  it("starts unanswered as no, and keeps the answer", async () => {
    const state = await oneSample("open");
    expect(settingsView(state).watching).toBe(false);
    expect(settingsView(setWatching(state, true)).watching).toBe(true);
  });
});

describe("the answer in the request and the preview", () => {
  it("tells the block that it follows new rows, and whether it is watched", async () => {
    const state = await oneSample("open");
    const kept = currentRequest(state);
    expect(kept.ok && kept.request).toMatchObject({ followsNewRows: true, watching: false });
    const watched = currentRequest(setWatching(state, true));
    expect(watched.ok && watched.request).toMatchObject({ followsNewRows: true, watching: true });
  });

  it("leaves both flags out for an exact range, whatever was answered before", async () => {
    const built = currentRequest(setWatching(await oneSample("exact"), true));
    expect(built.ok && built.request.followsNewRows).toBeUndefined();
    expect(built.ok && built.request.watching).toBeUndefined();
  });

  it("previews the watching p-value in the p-value row when watched, beside the fixed one otherwise", async () => {
    const state = await oneSample("open");
    const rows = (s: PaneState) => resultView(atStep(s, 3), callFunction).rows;
    const watched = rows(setWatching(state, true));
    expect(watched.find((r) => r.key === "pvalue")?.formula).toMatch(/^=EVENSPLIT\.WATCHPVALUE\(/);
    expect(watched.map((r) => r.key)).not.toContain("lookingAgain");
    const kept = rows(state);
    expect(kept.find((r) => r.key === "pvalue")?.formula).toMatch(/^=EVENSPLIT\.PVALUE\(/);
    expect(kept.find((r) => r.key === "watchPvalue")?.formula).toMatch(/^=EVENSPLIT\.WATCHPVALUE\(/);
    expect(kept.map((r) => r.key)).toContain("lookingAgain");
    const exact = rows(await oneSample("exact")).map((r) => r.key);
    expect(exact).not.toContain("watchPvalue");
    expect(exact).not.toContain("lookingAgain");
  });

  it("calls the watching p-value so in the report sentence, never exact", async () => {
    const state = atStep(setWatching(await oneSample("open"), true), 3);
    const built = currentRequest(state);
    const sentence = built.ok ? reportSentence(built.request, resultView(state, callFunction).rows) : "";
    expect(sentence).toMatch(/; watching p = /);
    expect(sentence).not.toMatch(/exact p = /);
  });

  it("writes a watched block that reads back as the question that made it", async () => {
    const state = atStep(setWatching(await oneSample("open"), true), 3);
    const rows = resultView(state, callFunction).rows;
    const reading = readBlock(rows.map((r) => [r.label, r.formula]));
    expect(reading).toMatchObject({ test: "sign", paired: false, center: 50, alternative: "two-sided", ties: "drop", alpha: 0.05 });
    expect(reading?.confidences).toEqual([0.95]);
  });

  it("previews PAIREDWATCHPVALUE and PAIREDWATCHBOUNDS for watched pairs, PAIRED with the watching p-value beside it otherwise", async () => {
    const state = await pairs("open");
    const rows = (s: PaneState) => resultView(atStep(s, 3), callFunction).rows;
    const watched = rows(setWatching(state, true));
    expect(watched.find((r) => r.key === "pvalue")?.formula).toMatch(/^=EVENSPLIT\.PAIREDWATCHPVALUE\(\$B\$2:\$B\$\d+,\$C\$2:\$C\$\d+,0,/);
    expect(watched.find((r) => r.key === "lower")?.formula).toMatch(/^=INDEX\(EVENSPLIT\.PAIREDWATCHBOUNDS\(/);
    expect(typeof watched.find((r) => r.key === "pvalue")?.value).toBe("number");
    expect(watched.map((r) => r.key)).not.toContain("lookingAgain");
    const kept = rows(state);
    expect(kept.find((r) => r.key === "pvalue")?.formula).toMatch(/^=EVENSPLIT\.PAIRED\(/);
    expect(kept.find((r) => r.key === "watchPvalue")?.formula).toMatch(/^=EVENSPLIT\.PAIREDWATCHPVALUE\(/);
    expect(kept.map((r) => r.key)).toContain("lookingAgain");
  });

  it("writes a watched paired block that reads back as the question that made it, watching p-value in the sentence", async () => {
    const state = atStep(setWatching(await pairs("open"), true), 3);
    const rows = resultView(state, callFunction).rows;
    const reading = readBlock(rows.map((r) => [r.label, r.formula]));
    expect(reading).toMatchObject({ test: "sign", paired: true, center: 0, alternative: "two-sided", ties: "drop", alpha: 0.05 });
    expect(reading?.references).toHaveLength(2);
    expect(reading?.confidences).toEqual([0.95]);
    const built = currentRequest(state);
    const sentence = built.ok ? reportSentence(built.request, rows) : "";
    expect(sentence).toMatch(/; watching p = /);
  });
});
