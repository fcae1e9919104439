/**
 * Writes that cannot half-happen, against the demo sheet's Excel stand-in
 * with a test double around its `run`: the double makes the host refuse one
 * chosen step of the write (clearing the earlier block, making the table,
 * the formulas, the number formats, the fonts, the chart, the block's name).
 * It queues the refusal just before that step, so the steps before it are
 * carried out and the rest are not, as Excel does when a command of a batch
 * fails (Microsoft, "OfficeExtension.Error class": the trace messages are
 * those "executed before the error occurred"). After each refusal the sheet
 * must be exactly as before and the message must say so; without one it must
 * be fully written. Consent must cover exactly the cells listed.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { FakeApiError, fakeRun } from "../../src/demo/fakeExcel";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { DEMO_SHEET, demoRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";
import { createHost, type HostContext, type RunBatch } from "../../src/taskpane/host";
import { analyzeRange, placeFromText, writeResult, type DataChoice, type WriteOutcome, type WritePlan } from "../../src/taskpane/workflow";
import { catalogueFunctions } from "../demo/catalogue";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

const SIGN: BlockRequest = {
  test: "sign",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  ties: "drop",
  method: "exact",
  dataName: "Thickness (µm)",
};
const RANK: BlockRequest = {
  test: "signed-rank",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  method: "auto",
  zeros: "drop",
  dataName: "Thickness (µm)",
};

type Step = "clear" | "table" | "formulas" | "formats" | "fonts" | "chart" | "lines" | "name";

function touches(step: Step, path: string, kind: "set" | "call"): boolean {
  switch (step) {
    case "clear":
      return kind === "call" && path.endsWith(".clear");
    case "table":
      return kind === "call" && path.endsWith(".tables.add");
    case "formulas":
      return kind === "set" && path.endsWith(".formulas");
    case "formats":
      return kind === "set" && path.endsWith(".numberFormat");
    case "fonts":
      return kind === "set" && /\.font\.(bold|italic|color)$/.test(path);
    case "chart":
      return kind === "call" && path.endsWith(".charts.add");
    case "lines":
      return kind === "call" && path.endsWith(".series.add");
    case "name":
      return kind === "call" && path.endsWith("names.add");
  }
}

/** Wraps the stand-in's objects so that a property set or method call can be seen (and refused) on its way in. */
function watched<T>(target: T, path: string, touch: (path: string, kind: "set" | "call") => void): T {
  if (target === null || typeof target !== "object" || Array.isArray(target) || target instanceof Promise) return target;
  return new Proxy(target as object, {
    get(t, key) {
      const value: unknown = Reflect.get(t, key, t);
      const at = `${path}.${String(key)}`;
      if (typeof value === "function") {
        return (...args: unknown[]) => {
          touch(at, "call");
          return watched((value as (...a: unknown[]) => unknown).apply(t, args), `${at}()`, touch);
        };
      }
      return watched(value, at, touch);
    },
    set(t, key, value) {
      touch(`${path}.${String(key)}`, "set");
      return Reflect.set(t, key, value, t);
    },
  }) as T;
}

/**
 * `run` for the demo workbook that refuses `step` the first `refusals` times
 * it is queued: a failing command goes into the batch just before it.
 */
function refusingRun(workbook: Workbook, step: Step, refusals = 1): { run: RunBatch; refused: () => number } {
  let left = refusals;
  const base = fakeRun(workbook);
  const run: RunBatch = (batch) =>
    base((context) => {
      const queue = (context as unknown as { queue: { add(operation: () => void): void } }).queue;
      const touch = (path: string, kind: "set" | "call"): void => {
        if (left === 0 || !touches(step, path, kind)) return;
        left--;
        queue.add(() => {
          throw new FakeApiError("InvalidOperation", `the ${step} step was refused (injected by the test)`);
        });
      };
      return batch(watched(context, "context", touch) as HostContext);
    });
  return { run, refused: () => refusals - left };
}

function demoWorkbook(): Workbook {
  const workbook = new Workbook([DEMO_SHEET]);
  workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
  workbook.setFunctions(functions);
  return workbook;
}

async function thickness(workbook: Workbook): Promise<DataChoice> {
  const analysis = await analyzeRange(createHost(fakeRun(workbook)), "B1:B25");
  if (!analysis.ok) throw new Error(analysis.message);
  return { range: analysis.range, useHeader: true };
}

function planAt(choice: DataChoice, request: BlockRequest, overrides: Partial<WritePlan> = {}): WritePlan {
  const target = placeFromText("E1", DEMO_SHEET, resultBlockRows(request).length);
  if (!target) throw new Error("E1 is an address");
  return { choices: [choice], reference: "exact", request, target, chart: false, consent: null, calculate: callFunction, ...overrides };
}

/** Asks, then agrees to exactly what was listed. */
async function writeAgreeing(run: RunBatch, plan: WritePlan): Promise<WriteOutcome> {
  const host = createHost(run);
  const first = await writeResult(host, plan);
  if (first.kind !== "confirm") return first;
  return writeResult(host, { ...plan, consent: first.consent });
}

/**
 * Everything a write could touch: every cell's entry and format over the
 * area, the tables, the charts, and the names in use. The stand-in reports an
 * automatic font colour as "#000000" once it was read and put back, so both
 * count as the same.
 */
async function sheetState(workbook: Workbook): Promise<unknown> {
  const cells: unknown[] = [];
  for (let r = 0; r < 40; r++) {
    for (let c = 0; c < 16; c++) {
      const format = workbook.format(DEMO_SHEET, r, c);
      cells.push([workbook.entry(DEMO_SHEET, r, c), { ...format, color: format.color ?? "#000000" }]);
    }
  }
  const host = createHost(fakeRun(workbook));
  return {
    cells,
    tables: workbook.tables.map((t) => ({ name: t.name, rect: t.rect })),
    charts: workbook.charts.map((c) => ({ title: c.title, from: c.from, series: c.series.map((s) => [s.name, s.values, s.xValues]) })),
    names: (await host.takenNames([DEMO_SHEET])).sort(),
    blocks: await host.blocks(),
  };
}

/** A sheet with an earlier, longer block (signed-rank) at E1, written by the pane. */
async function sheetWithEarlierBlock(): Promise<{ workbook: Workbook; choice: DataChoice }> {
  const workbook = demoWorkbook();
  const choice = await thickness(workbook);
  const earlier = await writeResult(createHost(fakeRun(workbook)), planAt(choice, RANK));
  if (earlier.kind !== "written") throw new Error(earlier.kind);
  return { workbook, choice };
}

describe("replacing an earlier block", () => {
  it("clears the earlier block's whole region first, so a shorter block leaves none of its rows behind", async () => {
    const { workbook, choice } = await sheetWithEarlierBlock();
    const longer = resultBlockRows(RANK).length;
    const shorter = resultBlockRows(SIGN).length;
    expect(longer).toBeGreaterThan(shorter);
    expect(workbook.entry(DEMO_SHEET, longer - 1, 4)).not.toBe("");
    const outcome = await writeAgreeing(fakeRun(workbook), planAt(choice, SIGN, { reference: "table", chart: true }));
    if (outcome.kind !== "written") throw new Error(JSON.stringify(outcome));
    expect(outcome.replaced.map((b) => b.name)).toEqual(["Evensplit_block_1"]);
    for (let r = shorter; r < longer; r++) {
      for (const c of [4, 5]) {
        expect(workbook.entry(DEMO_SHEET, r, c)).toBe("");
        expect(workbook.format(DEMO_SHEET, r, c)).toMatchObject({ numberFormat: "General", bold: false, italic: false });
      }
    }
    expect(await createHost(fakeRun(workbook)).blocks()).toEqual([
      {
        name: "Evensplit_block_2",
        sheet: DEMO_SHEET,
        rect: { top: 0, left: 4, bottom: shorter - 1, right: 5 },
        chart: "Evensplit chart 2",
        helper: { name: "Evensplit_chartcells_2", sheet: DEMO_SHEET, rect: { top: 0, left: 7, bottom: 2, right: 9 } },
      },
    ]);
  });

  it("replaces the earlier block's chart and helper cells too, in the same place, leaving none of them behind", async () => {
    const workbook = demoWorkbook();
    const choice = await thickness(workbook);
    const first = await writeAgreeing(fakeRun(workbook), planAt(choice, { ...RANK, alternative: "two-sided" }, { chart: true }));
    if (first.kind !== "written") throw new Error(first.kind);
    // Two-sided: line ends, H0 and both bounds take H1:J4.
    expect(workbook.entry(DEMO_SHEET, 3, 7)).toBe("Chart line: 95% upper bound");
    const second = await writeAgreeing(fakeRun(workbook), planAt(choice, SIGN, { chart: true }));
    if (second.kind !== "written") throw new Error(JSON.stringify(second));
    // One-sided ("greater"): only the lower bound exists, so the helper cells are H1:J3 and row 4 is empty again.
    expect(second.chartAt).toBe("L1");
    for (const c of [7, 8, 9]) expect(workbook.entry(DEMO_SHEET, 3, c)).toBe("");
    expect(workbook.charts).toHaveLength(1);
    expect(workbook.charts[0].series.map((s) => s.name)).toEqual(["Thickness (µm)", "H0: median = 50", "95% lower bound"]);
    const marks = await createHost(fakeRun(workbook)).blocks();
    expect(marks.map((b) => [b.name, b.chart, b.helper?.name])).toEqual([
      ["Evensplit_block_2", "Evensplit chart 2", "Evensplit_chartcells_2"],
    ]);
  });

  it("says so when a refused write had already removed the earlier block's chart, which cannot be put back", async () => {
    const workbook = demoWorkbook();
    const choice = await thickness(workbook);
    const first = await writeAgreeing(fakeRun(workbook), planAt(choice, RANK, { chart: true }));
    if (first.kind !== "written") throw new Error(first.kind);
    const { run } = refusingRun(workbook, "formulas");
    const outcome = await writeAgreeing(run, planAt(choice, SIGN, { chart: true }));
    if (outcome.kind !== "undone") throw new Error(outcome.kind);
    expect(outcome.clean).toBe(false);
    expect(outcome.message).toContain("no chart Evensplit chart 1 any more beside the earlier block");
    // Every cell, the block's name and its helper cells' name are back.
    const marks = await createHost(fakeRun(workbook)).blocks();
    expect(marks.map((b) => [b.name, b.helper?.name])).toEqual([["Evensplit_block_1", "Evensplit_chartcells_1"]]);
  });
});

describe("a refusal at any step leaves the sheet exactly as before, and says so", () => {
  const steps: Step[] = ["clear", "table", "formulas", "formats", "fonts", "chart", "lines", "name"];
  for (const step of steps) {
    it(`refused at the ${step} step: everything undone`, async () => {
      const { workbook, choice } = await sheetWithEarlierBlock();
      const before = await sheetState(workbook);
      const { run, refused } = refusingRun(workbook, step);
      const outcome = await writeAgreeing(run, planAt(choice, SIGN, { reference: "table", chart: true }));
      expect(refused()).toBe(1);
      expect(outcome).toMatchObject({ kind: "undone", clean: true });
      if (outcome.kind !== "undone") return;
      expect(outcome.message).toContain(`the ${step} step was refused`);
      // Once the table was made (every step after it), the message also says it was turned back, and that Excel may keep its colours.
      const tableMade = !["clear", "table"].includes(step);
      expect(outcome.message).toContain(
        tableMade ? "every cell holds exactly what it held before" : "the sheet holds exactly what it held before",
      );
      expect(outcome.message.includes("The table made from 'Paint line'!B1:B25 was turned back into plain cells")).toBe(tableMade);
      expect(await sheetState(workbook)).toEqual(before);
      // And the next attempt, with the host willing, writes the whole block: no table left behind to trip over.
      const retry = await writeAgreeing(fakeRun(workbook), planAt(choice, SIGN, { reference: "table", chart: true }));
      expect(retry).toMatchObject({ kind: "written", created: [{ name: "Table1" }], chartAt: "L1" });
      expect(workbook.tables.map((t) => t.name)).toEqual(["Table1"]);
      expect(workbook.charts).toHaveLength(1);
    });
  }

  it("says what the sheet now holds when putting it back is refused too, and never that nothing was written", async () => {
    const { workbook, choice } = await sheetWithEarlierBlock();
    const { run, refused } = refusingRun(workbook, "formulas", 2);
    const outcome = await writeAgreeing(run, planAt(choice, SIGN, { reference: "table" }));
    expect(refused()).toBe(2);
    if (outcome.kind !== "undone") throw new Error(outcome.kind);
    expect(outcome.clean).toBe(false);
    // The earlier block was cleared before the formulas were refused, and putting its formulas back was refused as well.
    expect(outcome.message).toMatch(
      /not all of it could be put back\. The sheet now holds: \d+ cells of 'Paint line'!E1:F\d+ differ from before/,
    );
    expect(outcome.message).not.toMatch(/not written|exactly what it held before/);
    // The table made for the write did go again.
    expect(workbook.tables).toEqual([]);
  });

  it("refuses a block past the last column (XFD1) with a message, before anything is read or written", async () => {
    const workbook = demoWorkbook();
    const choice = await thickness(workbook);
    const before = await sheetState(workbook);
    const target = placeFromText("XFD1", DEMO_SHEET, resultBlockRows(SIGN).length);
    if (!target) throw new Error("XFD1 is an address");
    let runs = 0;
    const counting: RunBatch = (batch) => {
      runs++;
      return fakeRun(workbook)(batch);
    };
    const outcome = await writeResult(createHost(counting), planAt(choice, SIGN, { target }));
    expect(outcome).toEqual({ kind: "refused", message: expect.stringMatching(/does not fit on the sheet/) });
    expect(runs).toBe(0);
    expect(await sheetState(workbook)).toEqual(before);
  });
});

describe("names the write gives", () => {
  it('avoid a table of another sheet, since table names are unique in the workbook (Microsoft, "Rename an Excel table")', async () => {
    const workbook = new Workbook([DEMO_SHEET, "Notes"]);
    workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
    workbook.writeEntries("Notes", 0, 0, [["Batch"], [1], [2]]);
    workbook.addTable("Notes", { top: 0, left: 0, bottom: 2, right: 0 });
    workbook.setFunctions(functions);
    const choice = await thickness(workbook);
    const outcome = await writeResult(createHost(fakeRun(workbook)), planAt(choice, SIGN, { reference: "table" }));
    expect(outcome).toMatchObject({ kind: "written", created: [{ name: "Table2" }], refs: { data: "Table2[[Thickness (µm)]]" } });
    expect(workbook.tables.map((t) => t.name)).toEqual(["Table1", "Table2"]);
  });
});

describe("consent covers exactly the cells listed, with their contents", () => {
  it("asks again when a cell that was empty at the listing is filled before writing", async () => {
    const workbook = demoWorkbook();
    workbook.writeEntries(DEMO_SHEET, 4, 5, [["keep me"]]);
    const choice = await thickness(workbook);
    const host = createHost(fakeRun(workbook));
    const asked = await writeResult(host, planAt(choice, SIGN));
    if (asked.kind !== "confirm") throw new Error(asked.kind);
    expect(asked.consent.filled).toEqual([{ address: "F5", content: "keep me" }]);
    workbook.writeEntries(DEMO_SHEET, 9, 4, [["typed later"]]);
    const again = await writeResult(host, planAt(choice, SIGN, { consent: asked.consent }));
    expect(again).toMatchObject({
      kind: "confirm",
      changed: true,
      consent: {
        filled: [
          { address: "F5", content: "keep me" },
          { address: "E10", content: "typed later" },
        ],
      },
    });
    expect(workbook.entry(DEMO_SHEET, 9, 4)).toBe("typed later");
    expect(workbook.entry(DEMO_SHEET, 0, 4)).toBe("");
  });

  it("asks again when a listed cell's content changed, even past the 40 characters the list shows", async () => {
    const workbook = demoWorkbook();
    const long = `${"x".repeat(45)}A`;
    workbook.writeEntries(DEMO_SHEET, 4, 5, [[long]]);
    const choice = await thickness(workbook);
    const host = createHost(fakeRun(workbook));
    const asked = await writeResult(host, planAt(choice, SIGN));
    if (asked.kind !== "confirm") throw new Error(asked.kind);
    workbook.writeEntries(DEMO_SHEET, 4, 5, [[`${"x".repeat(45)}B`]]);
    const again = await writeResult(host, planAt(choice, SIGN, { consent: asked.consent }));
    expect(again).toMatchObject({ kind: "confirm", changed: true });
    expect(asked.consent.filled).toEqual(again.kind === "confirm" ? again.consent.filled : null);
    expect(workbook.entry(DEMO_SHEET, 4, 5)).toBe(`${"x".repeat(45)}B`);
  });

  it("checks again inside the write's own batch: a cell filled after the last listing stops the write", async () => {
    const workbook = demoWorkbook();
    const choice = await thickness(workbook);
    // Someone types into the place between the pane's listing and the batch that writes.
    let typed = false;
    const base = fakeRun(workbook);
    const run: RunBatch = (batch) =>
      base((context) => {
        const touch = (path: string): void => {
          if (typed || !path.endsWith(".getCellProperties")) return;
          typed = true;
          workbook.writeEntries(DEMO_SHEET, 2, 5, [["arrived"]]);
        };
        return batch(watched(context, "context", touch) as HostContext);
      });
    const outcome = await writeResult(createHost(run), planAt(choice, SIGN));
    expect(outcome).toMatchObject({ kind: "confirm", changed: true, consent: { filled: [{ address: "F3", content: "arrived" }] } });
    expect(workbook.entry(DEMO_SHEET, 0, 4)).toBe("");
    expect(workbook.entry(DEMO_SHEET, 2, 5)).toBe("arrived");
  });
});
