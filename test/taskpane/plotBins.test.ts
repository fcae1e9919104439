/**
 * The dot plot with many values: up to a height of MAX_DOT_LEVELS stacked
 * dots each value is a dot; beyond, the values are counted in bins one dot
 * wide and drawn as bars no taller than that, so 10,000 values no longer make
 * a column thousands of pixels high. Counts checked by exact arithmetic.
 */
import { describe, expect, it } from "vitest";
import { fakeRun } from "../../src/demo/fakeExcel";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { slotRead } from "../../src/taskpane/dataState";
import { createHost } from "../../src/taskpane/host";
import { atStep, initialState } from "../../src/taskpane/paneState";
import { dotLayout, lineScale, MAX_DOT_LEVELS } from "../../src/taskpane/plot";
import { numberLineLayout } from "../../src/taskpane/plotView";
import { setCenter } from "../../src/taskpane/questionState";
import { resultView } from "../../src/taskpane/resultState";
import { analyzeRange } from "../../src/taskpane/workflow";

describe("the dot plot's layout", () => {
  it("keeps one dot per value while the stacks stay low", () => {
    const values = [48, 50, 50, 51, 53];
    const layout = dotLayout(values, lineScale(values, [50], 14, 286), 7);
    expect(layout.kind).toBe("dots");
    expect(layout.levels).toBeLessThanOrEqual(MAX_DOT_LEVELS);
  });

  it("bins 10,000 values into bars no taller than the dot stacks may be, counting every value once", () => {
    // 10,000 values on 100 distinct points, 100 at each: stacks of 100 dots without binning.
    const values = Array.from({ length: 10_000 }, (_, i) => 40 + (i % 100) * 0.2);
    const layout = dotLayout(values, lineScale(values, [50], 14, 286), 7);
    expect(layout.kind).toBe("bins");
    if (layout.kind !== "bins") return;
    expect(layout.levels).toBe(MAX_DOT_LEVELS);
    expect(layout.bins.reduce((sum, b) => sum + b.count, 0)).toBe(10_000);
    expect(Math.max(...layout.bins.map((b) => b.height))).toBeLessThanOrEqual(MAX_DOT_LEVELS);
  });
});

describe("the Result step with 10,000 values", () => {
  it("draws bars and says so in the caption", async () => {
    const workbook = new Workbook(["Lines"]);
    // Invented: 10,000 coating readings on a 0.1 µm grid around the 50 µm target.
    workbook.writeEntries("Lines", 0, 0, [["Thickness (µm)"], ...Array.from({ length: 10_000 }, (_, i) => [45 + (i % 101) * 0.1])]);
    const host = createHost(fakeRun(workbook));
    const state = slotRead(initialState(), 0, "A1:A10001", await analyzeRange(host, "A1:A10001"));
    const view = resultView(atStep(setCenter(state, "50"), 3), callFunction);
    expect(view.plot?.values).toHaveLength(10_000);
    expect(numberLineLayout(view.plot!).kind).toBe("bins");
    expect(view.caption.startsWith("Bars: the 10,000 values, counted in bins")).toBe(true);
  });
});
