/**
 * The Data step for data in a database, in Node: the names and the median give the first query; its answer
 * pasted into a demo sheet gives the second query with ORDERRANKS' ranks for that n; the second answer makes
 * the data ready, and the request carries the query's source. The answers here are invented numbers typed
 * as a database tool would paste them; that the queries give the core's figures is test/taskpane/databaseQuery.test.ts's.
 */
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { Workbook } from "../../src/demo/workbook";
import { callFunction, countpvalue, orderranks } from "../../src/functions/functions";
import { databaseQuery } from "../../src/taskpane/databaseQuery";
import {
  databaseAnswerRead,
  databaseChoices,
  databaseView,
  readPasted,
  secondQuery,
  setDatabaseField,
  setDatabaseRow,
} from "../../src/taskpane/databaseState";
import { blockFollowsNewRows, choices, dataKind, dataReady, dataStepProblem, setDataKind, slotRead } from "../../src/taskpane/dataState";
import { createHost } from "../../src/taskpane/host";
import { atStep, initialState, type PaneState } from "../../src/taskpane/paneState";
import { currentRequest, effectiveTest, setAlternative, setCenter, setTest } from "../../src/taskpane/questionState";
import { resultView, setChart, settleResult } from "../../src/taskpane/resultState";
import { setSetting } from "../../src/taskpane/settingsState";
import { analyzeRange, blockRefs, defaultPlace, writeResult } from "../../src/taskpane/workflow";
import { catalogueFunctions } from "../demo/catalogue";

const SHEET = "Query answers";
const HEADER = ["n", "below", "tied", "above", "lower_bound", "upper_bound"];

/** A sheet holding pasted answers (invented numbers) from A1. */
async function pasted(state: PaneState, rows: unknown[][], address: string): Promise<PaneState> {
  const workbook = new Workbook([SHEET]);
  workbook.writeEntries(SHEET, 0, 0, rows);
  return slotRead(state, 0, address, await analyzeRange(createHost(fakeRun(workbook)), address));
}

function named(group = ""): PaneState {
  let state = setDataKind(setCenter(initialState(), "50"), "database");
  state = setCenter(state, "50");
  state = setDatabaseField(state, "table", "plant.panels");
  state = setDatabaseField(state, "column", "Thickness (µm)");
  return setDatabaseField(state, "group", group);
}

describe("choosing data in a database", () => {
  it("is a kind of its own that reads exactly the pasted cells and asks for the sign test", () => {
    const state = setTest(setDataKind(initialState(), "database"), "signed-rank");
    expect(dataKind(state)).toBe("database");
    expect(state.reference).toBe("exact");
    expect(effectiveTest(state)).toBe("sign");
    expect(dataStepProblem(state)).toBe("The table is empty: type its name as the database knows it (schema.table if need be).");
    const back = setDataKind(state, "one");
    expect(back.database).toBeNull();
    expect(back.referenceChosen).toBe(false);
  });

  it("gives the first query once the names and the median can be used, with the names quoted where needed", () => {
    const state = named();
    const view = databaseView(state);
    expect(view?.firstQuery).toBe(databaseQuery({ table: "plant.panels", column: "Thickness (µm)", center: 50 }, null));
    expect(view?.firstQuery).toContain('SELECT "Thickness (µm)" AS measurement\n  FROM plant.panels');
    expect(view?.secondQuery).toBe("");
    expect(dataStepProblem(state)).toBe("Run the first query, paste its answer into the sheet, and give its cells.");
    expect(databaseView(setCenter(state, "fifty"))?.namesProblem).toContain("must be a plain number");
    expect(databaseView(setDatabaseField(state, "column", "a\nb"))?.firstQuery).toBe("");
  });
});

describe("the pasted answers", () => {
  it("reads an optional row of names, then the counts and bounds; refuses a row that does not add up", () => {
    expect(readPasted([HEADER, [151, 70, 10, 71, "", ""]], false)).toEqual({
      ok: true,
      headerRows: 1,
      rows: [{ n: 151, below: 70, tied: 10, above: 71, lower: null, upper: null, index: 1 }],
    });
    expect(readPasted([[151, 70, 10, 71, 49.5, 50.8]], false)).toMatchObject({ ok: true, headerRows: 0 });
    expect(readPasted([[151, 70, 10, 70, 49.5, 50.8]], false)).toEqual({
      ok: false,
      message: "n is not below + tied + above: paste the query's answer again, its columns in order.",
    });
    expect(readPasted([[151, 70, 10, 71]], false).ok).toBe(false);
    expect(readPasted([[151, 70.5, 10, 70.5, "", ""]], false).ok).toBe(false);
    expect(readPasted([[151, 70, 10, 71, "x", ""]], false).ok).toBe(false);
    expect(
      readPasted(
        [
          ["A", 3, 1, 0, 2, "", ""],
          [null, 1, 0, 0, 1, "", ""],
        ],
        true,
      ),
    ).toMatchObject({
      ok: true,
      rows: [
        { label: "A", n: 3 },
        { label: null, n: 1 },
      ],
    });
  });

  it("after the first answer: the second query carries ORDERRANKS' two-sided ranks for that n at the confidence asked", async () => {
    const state = await pasted(setSetting(named(), "confidence", "0.9"), [HEADER, [151, 70, 10, 71, "", ""]], "A1:F2");
    const [lower, upper] = orderranks(151, 0.9)[0] as number[];
    expect(secondQuery(state)).toBe(databaseQuery({ table: "plant.panels", column: "Thickness (µm)", center: 50 }, { lower, upper }));
    expect(secondQuery(state)).toContain(`50 AS hypothesised_median, ${lower} AS lower_rank, ${upper} AS upper_rank`);
    expect(dataReady(state)).toBe(false);
    expect(dataStepProblem(state)).toBe("Run the second query (it carries the ranks for this n) and paste its answer over the first.");
    expect(databaseView(state)?.pastedSummary).toBe(
      "Read one answer row under a row of names: n 151 (70 below, 10 tied, 71 above), bounds blank and blank.",
    );
  });

  it("says when n is too small for any bounds at that confidence", async () => {
    const state = await pasted(named(), [[5, 2, 0, 3, "", ""]], "A1:F1");
    expect(dataStepProblem(state)).toBe("5 values cannot give bounds at this confidence; choose a lower confidence or count more values.");
  });

  it("after the second answer: ready, the block reads that row alone as exactly those cells, and the request names the query", async () => {
    const state = await pasted(named(), [HEADER, [151, 70, 10, 71, 49.25, 50.75]], "A1:F2");
    expect(dataReady(state)).toBe(true);
    expect(blockFollowsNewRows(state)).toBe(false);
    expect(blockRefs(choices(state), state.reference, [], SHEET)).toEqual({ data: "$A$2:$F$2" });
    const built = currentRequest(state);
    if (!built.ok) throw new Error("no request");
    const query = secondQuery(state) as string;
    expect(built.request).toMatchObject({
      test: "sign",
      paired: false,
      center: 50,
      ties: "drop",
      dataName: "Thickness (µm)",
      // SHA-256 by Node's crypto (OpenSSL) of the very text the pane shows.
      database: { table: "plant.panels", column: "Thickness (µm)", queryHash: createHash("sha256").update(query, "utf8").digest("hex") },
    });
  });

  it("with groups: one answer row per group, the block reads the chosen group's row", async () => {
    const rows = [
      ["line", ...HEADER],
      ["A", 80, 30, 5, 45, 48.5, 52],
      ["B", 71, 40, 5, 26, 47, 50.5],
    ];
    let state = await pasted(named("line"), rows, "A1:G3");
    expect(databaseView(state)?.groupLabels).toEqual(["A", "B"]);
    expect(dataReady(state)).toBe(true);
    expect(databaseChoices(state)[0].range.rect).toEqual({ top: 1, bottom: 1, left: 0, right: 6 });
    state = setDatabaseRow(state, 1);
    expect(blockRefs(choices(state), "exact", [], SHEET)).toEqual({ data: "$A$3:$G$3" });
    const built = currentRequest(state);
    expect(built.ok && built.request.database?.group).toEqual({ column: "line", label: "B" });
    expect(secondQuery(state)).toContain("SELECT 'A' AS group_label, ");
  });
});

describe("the Result step and the write for a database's answer", () => {
  it("previews the block without a plot or chart, and writes it beside the answer as formulas the sheet calculates", async () => {
    const workbook = new Workbook([SHEET]);
    workbook.setFunctions(await catalogueFunctions());
    workbook.writeEntries(SHEET, 0, 0, [HEADER, [151, 70, 10, 71, 49.25, 50.75]]);
    const host = createHost(fakeRun(workbook));
    let state = slotRead(named(), 0, "A1:F2", await analyzeRange(host, "A1:F2"));
    state = setChart(atStep(setAlternative(state, "greater"), 3), true);
    state = settleResult(state);
    expect(state.chart).toBe(false);
    const view = resultView(state, callFunction);
    expect(view.plot).toBeNull();
    expect(view.chartAvailable).toBe(false);
    expect(view.recap).toBe(
      "The block will read the query's answer in $A$2:$F$2: its formulas recalculate when a new answer is pasted there.",
    );
    const pvalue = view.rows.find((r) => r.key === "pvalue");
    expect(pvalue?.value).toBe(countpvalue(71, 70, "greater"));
    expect(pvalue?.formula).toBe('=EVENSPLIT.COUNTPVALUE(INDEX($A$2:$F$2,1,4),INDEX($A$2:$F$2,1,2),"greater","exact")');
    const built = currentRequest(state);
    if (!built.ok) throw new Error("no request");
    const place = await defaultPlace(host, choices(state), view.rows.length);
    expect(place.rect.left).toBe(7);
    const outcome = await writeResult(host, {
      choices: choices(state),
      reference: state.reference,
      request: built.request,
      target: place,
      chart: state.chart,
      consent: null,
      calculate: callFunction,
    });
    expect(outcome.kind).toBe("written");
    const shown = view.rows.map((_, i) => workbook.value(SHEET, place.rect.top + i, 8));
    view.rows.forEach((row, i) => {
      if (row.key !== "audit") expect(shown[i], row.label).toEqual(row.value === "" ? null : row.value);
    });
  });
});

describe("an answer older than the question", () => {
  it("keeps the query an answer came from, and holds the data back once the median or confidence changes after it", async () => {
    const before = await pasted(named(), [HEADER, [151, 70, 10, 71, "", ""]], "A1:F2");
    expect(databaseAnswerRead(named(), before).database?.answeredBy).toBeNull();
    const answered = databaseAnswerRead(before, await pasted(before, [HEADER, [151, 70, 10, 71, 49.25, 50.75]], "A1:F2"));
    const query = secondQuery(answered);
    expect(answered.database?.answeredBy).toBe(query);
    expect(dataReady(answered)).toBe(true);

    const moved = setSetting(answered, "confidence", "0.9");
    expect(dataReady(moved)).toBe(false);
    expect(dataStepProblem(moved)).toBe(
      "The names, the median or the confidence changed after this answer was pasted: run the second query again (it has changed) and paste its answer over this one.",
    );
    expect(dataReady(setCenter(answered, "49"))).toBe(false);
    // The same cells read again (the focus coming back to the pane) do not make the old answer new.
    const reread = databaseAnswerRead(moved, await pasted(moved, [HEADER, [151, 70, 10, 71, 49.25, 50.75]], "A1:F2"));
    expect(dataReady(reread)).toBe(false);
    // A new answer pasted after the change is the new query's.
    const fresh = databaseAnswerRead(reread, await pasted(reread, [HEADER, [151, 70, 10, 71, 49.5, 50.5]], "A1:F2"));
    expect(dataReady(fresh)).toBe(true);
    expect(fresh.database?.answeredBy).toBe(secondQuery(moved));
    // Back to the confidence the first answer was for: that answer fits again.
    expect(dataReady(setSetting(answered, "confidence", "0.95"))).toBe(true);
  });
});
