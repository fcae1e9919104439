/**
 * From typed fields to the block request; references; placement; notation.
 * Expected values by hand (exact); reference syntax per Microsoft, "Using
 * structured references with Excel tables" (escape character ').
 */
import { describe, expect, it } from "vitest";
import { tokenize } from "../../src/demo/formula/tokenize";
import { blockRect, filledCells, firstFreeColumn } from "../../src/taskpane/placement";
import { absoluteReference, openEnded, structuredReference } from "../../src/taskpane/references";
import { buildRequest, notation, readFraction, readNumber } from "../../src/taskpane/request";

const SETTINGS = {
  alpha: "0.05",
  confidence: "0.95",
  ties: "drop",
  signMethod: "exact",
  rankMethod: "auto",
  zeros: "drop",
  twoGroupMethod: "rank-sum",
  manyGroupMethod: "median",
  adjust: "holm",
} as const;

describe("reading typed numbers", () => {
  it("accepts plain numbers and refuses commas, units and empty fields with a reason", () => {
    expect(readNumber(" 49.5 ", "x")).toEqual({ ok: true, value: 49.5 });
    expect(readNumber("-1e-3", "x")).toEqual({ ok: true, value: -0.001 });
    expect(readNumber("50,5", "x")).toMatchObject({ ok: false, message: expect.stringContaining("50.5") });
    expect(readNumber("50 µm", "x").ok).toBe(false);
    expect(readNumber("", "x").ok).toBe(false);
  });

  it("keeps fractions strictly inside (0, 1) and suggests 0.95 for 95", () => {
    expect(readFraction("0.95", "c")).toEqual({ ok: true, value: 0.95 });
    expect(readFraction("95", "c")).toMatchObject({ ok: false, message: expect.stringContaining("0.95") });
    expect(readFraction("1", "c").ok).toBe(false);
    expect(readFraction("0", "c").ok).toBe(false);
  });
});

describe("buildRequest", () => {
  it("builds a sign-test request with the header name", () => {
    const built = buildRequest(false, { test: "sign", alternative: "greater", center: "50", quantile: "0.9" }, SETTINGS, {
      data: "Thickness (µm)",
    });
    expect(built).toEqual({
      ok: true,
      request: {
        test: "sign",
        paired: false,
        center: 50,
        alternative: "greater",
        alpha: 0.05,
        confidence: 0.95,
        ties: "drop",
        method: "exact",
        dataName: "Thickness (µm)",
      },
    });
  });

  it("builds signed-rank and quantile requests with their own options", () => {
    const rank = buildRequest(
      true,
      { test: "signed-rank", alternative: "less", center: "0", quantile: "" },
      { ...SETTINGS, rankMethod: "exact", zeros: "pratt" },
      {},
    );
    expect(rank).toMatchObject({ ok: true, request: { test: "signed-rank", paired: true, method: "exact", zeros: "pratt" } });
    const q = buildRequest(false, { test: "quantile", alternative: "two-sided", center: "53", quantile: "0.9" }, SETTINGS, {});
    expect(q).toMatchObject({ ok: true, request: { test: "quantile", quantile: 0.9, center: 53 } });
  });

  it("lists every field that cannot be used", () => {
    const built = buildRequest(
      false,
      { test: "quantile", alternative: "two-sided", center: "", quantile: "2" },
      { ...SETTINGS, alpha: "5%", confidence: "95" },
      {},
    );
    expect(built.ok).toBe(false);
    if (!built.ok) expect(built.problems.map((p) => p.field)).toEqual(["center", "quantile", "alpha", "confidence"]);
  });

  it("falls back to the sign test for pairs (the quantile test takes one range)", () => {
    const built = buildRequest(true, { test: "quantile", alternative: "two-sided", center: "0", quantile: "0.9" }, SETTINGS, {});
    expect(built).toMatchObject({ ok: true, request: { test: "sign" } });
  });
});

describe("notation", () => {
  it("states H0 and H1 with the right relation", () => {
    expect(notation({ test: "sign", paired: false, center: 50, alternative: "greater" })).toMatchObject({
      h0: "H0: median = 50",
      h1: "H1: median > 50",
    });
    expect(notation({ test: "sign", paired: true, center: 0, alternative: "two-sided" })).toMatchObject({
      h0: "H0: median(D) = 0",
      h1: "H1: median(D) ≠ 0",
    });
    expect(notation({ test: "quantile", paired: false, center: 53, alternative: "less", quantile: 0.9 })).toMatchObject({
      h1: "H1: Q(0.9) < 53",
    });
  });
});

describe("references", () => {
  it("writes structured, absolute and open-ended references", () => {
    expect(structuredReference("Table1", "Thickness (µm)")).toBe("Table1[[Thickness (µm)]]");
    expect(structuredReference("T", "a[1]'#")).toBe("T[[a'[1']'''#]]");
    // The demo sheet's reader undoes the escapes: the column name survives the round trip.
    expect(tokenize(structuredReference("T", "a[1]'#"))).toEqual([{ type: "table", table: "T", column: "a[1]'#" }]);
    expect(absoluteReference({ top: 1, left: 1, bottom: 24, right: 1 }, "Paint line", "Paint line")).toBe("$B$2:$B$25");
    expect(absoluteReference({ top: 1, left: 1, bottom: 24, right: 1 }, "Paint line", "Summary")).toBe("'Paint line'!$B$2:$B$25");
    expect(absoluteReference(openEnded({ top: 1, left: 1, bottom: 24, right: 1 }), "S", "S")).toBe("$B$2:$B$1048576");
  });
});

describe("placement", () => {
  const strip = (values: unknown[][], left: number) => ({
    sheet: "S",
    rect: { top: 0, left, bottom: values.length - 1, right: left + values[0].length - 1 },
    values,
    formulas: values,
  });

  it("finds the first two empty columns at or after the start, with an empty column on their left", () => {
    // Strips start one column before `start`, the column that must stay empty as a gap.
    expect(
      firstFreeColumn(
        strip(
          [
            ["", "", "", ""],
            ["", "", "", ""],
          ],
          3,
        ),
        4,
        2,
      ),
    ).toBe(4);
    expect(
      firstFreeColumn(
        strip(
          [
            ["x", "", "", ""],
            ["", "", "", ""],
          ],
          3,
        ),
        4,
        2,
      ),
    ).toBe(5);
    expect(
      firstFreeColumn(
        strip(
          [
            ["", "x", "", ""],
            ["", "", "", ""],
          ],
          3,
        ),
        4,
        2,
      ),
    ).toBe(6);
    expect(
      firstFreeColumn(
        strip(
          [
            ["", "", "x", ""],
            ["", "", "", "y"],
          ],
          3,
        ),
        4,
        2,
      ),
    ).toBe(8);
  });

  it("lists filled cells with their addresses, formulas before values", () => {
    const read = {
      sheet: "S",
      rect: { top: 2, left: 4, bottom: 3, right: 5 },
      values: [
        ["", 0.5],
        ["note", ""],
      ],
      formulas: [
        ["", "=A1/2"],
        ["note", ""],
      ],
    };
    expect(filledCells(read)).toEqual([
      { address: "F3", content: "=A1/2" },
      { address: "E4", content: "note" },
    ]);
    expect(blockRect({ row: 0, column: 4 }, 24, 2)).toEqual({ top: 0, left: 4, bottom: 23, right: 5 });
  });
});
