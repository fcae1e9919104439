import { describe, expect, it } from "vitest";
import { blockFormula, blockValue, NUMBER_FORMATS, resultBlockRows, type BlockRequest, type CallValue } from "../../src/report/resultBlock";
import { callFunction } from "../../src/functions/functions";

const oneSample: BlockRequest = {
  test: "sign",
  paired: false,
  center: 50,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  dataName: "Thickness",
};

const paired: BlockRequest = { ...oneSample, paired: true, center: 0, alternative: "two-sided", dataName: "Before", secondName: "After" };

const refs = { data: "Panels[Before]", second: "Panels[After]" };

function callsOf(request: BlockRequest): CallValue[] {
  return resultBlockRows(request).flatMap((r) =>
    r.value.kind === "call" ? [r.value] : r.value.kind === "decision" ? [r.value.pValue] : [],
  );
}

describe("resultBlockRows", () => {
  const requests: BlockRequest[] = [
    oneSample,
    paired,
    { ...oneSample, test: "signed-rank" },
    { ...paired, test: "signed-rank", zeros: "pratt", method: "exact" },
    { ...oneSample, test: "quantile", quantile: 0.9, alternative: "less" },
  ];

  it.each(requests)("gives unique keys, the cautions and the core rows (%#)", (request) => {
    const rows = resultBlockRows(request);
    const keys = rows.map((r) => r.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const key of ["title", "h0", "h1", "used", "tied", "statistic", "pvalue", "method", "decision", "lower", "upper", "coverage"]) {
      expect(keys).toContain(key);
    }
    const cautions = rows.filter((r) => r.style === "caution").map((r) => (r.value.kind === "text" ? r.value.text : ""));
    expect(cautions.join(" ")).toMatch(/independent observations/);
    expect(cautions.join(" ")).toMatch(/does not show/);
    expect(cautions.join(" ")).toMatch(/qualified person/);
    for (const r of rows) expect(NUMBER_FORMATS[r.format]).toBeTypeOf("string");
  });

  it("words a kept H0 as what the data do not show, and labels the review caution by when it applies", () => {
    const rows = resultBlockRows(oneSample);
    const decision = rows.find((r) => r.key === "decision")!.value;
    expect(decision).toMatchObject({
      kind: "decision",
      keep: "Do not reject H0: these data do not show that the median of Thickness is above 50",
      reject: "Reject H0: evidence that the median of Thickness is above 50",
    });
    expect(rows.find((r) => r.key === "review")!.label).toBe("Before acting on it");
  });

  it("states the hypotheses in notation for each alternative", () => {
    const h1 = (alternative: BlockRequest["alternative"]) =>
      resultBlockRows({ ...oneSample, alternative }).find((r) => r.key === "h1")!.value;
    expect(h1("greater")).toEqual({ kind: "text", text: "the median of Thickness > 50" });
    expect(h1("less")).toEqual({ kind: "text", text: "the median of Thickness < 50" });
    expect(h1("two-sided")).toEqual({ kind: "text", text: "the median of Thickness ≠ 50" });
    expect(resultBlockRows(paired).find((r) => r.key === "h0")!.value).toEqual({
      kind: "text",
      text: "the median of After − Before = 0",
    });
  });

  it("passes the tie rule, method and alternative into the p-value call", () => {
    const p = resultBlockRows({ ...oneSample, ties: "split", method: "midp" }).find((r) => r.key === "pvalue")!.value;
    expect(p).toEqual({
      kind: "call",
      fn: "PVALUE",
      args: [{ ref: "data" }, { number: 50 }, { text: "greater" }, { text: "split" }, { text: "midp" }],
    });
  });

  it("pairs a one-sided alternative with the matching one-sided bound", () => {
    const side = (request: BlockRequest) => {
      const lower = resultBlockRows(request).find((r) => r.key === "lower")!.value as CallValue;
      return lower.args.find((a) => "text" in a && ["two-sided", "lower", "upper"].includes(a.text));
    };
    expect(side(oneSample)).toEqual({ text: "lower" });
    expect(side({ ...oneSample, alternative: "less" })).toEqual({ text: "upper" });
    expect(side(paired)).toEqual({ text: "two-sided" });
  });

  it("uses only paired functions for a paired request", () => {
    const fns = callsOf(paired).map((c) => c.fn);
    expect(fns.every((fn) => fn.startsWith("PAIRED"))).toBe(true);
  });

  it("rejects requests that cannot be stated", () => {
    expect(() => resultBlockRows({ ...oneSample, alpha: 0 })).toThrow(RangeError);
    expect(() => resultBlockRows({ ...oneSample, confidence: 1 })).toThrow(RangeError);
    expect(() => resultBlockRows({ ...oneSample, center: Number.NaN })).toThrow(RangeError);
    expect(() => resultBlockRows({ ...oneSample, test: "quantile" })).toThrow(RangeError);
    expect(() => resultBlockRows({ ...paired, test: "quantile", quantile: 0.5 })).toThrow(RangeError);
  });
});

describe("blockFormula", () => {
  it("renders calls, columns, counts and decisions in locale-independent syntax", () => {
    expect(blockFormula({ kind: "call", fn: "COUNTS", args: [{ ref: "data" }, { number: 50 }], column: 3 }, refs)).toBe(
      "=INDEX(EVENSPLIT.COUNTS(Panels[Before],50),1,3)",
    );
    expect(
      blockFormula({ kind: "call", fn: "PAIRED", args: [{ ref: "data" }, { ref: "second" }, { number: -0.25 }, { text: "less" }] }, refs),
    ).toBe('=EVENSPLIT.PAIRED(Panels[Before],Panels[After],-0.25,"less")');
    expect(blockFormula({ kind: "numbers", of: "data" }, { data: "A2:A9" })).toBe("=COUNT(A2:A9)");
    expect(blockFormula({ kind: "skipped", of: "data" }, { data: "A2:A9" })).toBe("=COUNTA(A2:A9)-COUNT(A2:A9)");
    const counts = (column: number): CallValue => ({
      kind: "call",
      fn: "PAIREDCOUNTS",
      args: [{ ref: "data" }, { ref: "second" }],
      column,
    });
    expect(blockFormula({ kind: "sum", terms: [counts(2), counts(4)] }, refs)).toBe(
      "=INDEX(EVENSPLIT.PAIREDCOUNTS(Panels[Before],Panels[After]),1,2)+INDEX(EVENSPLIT.PAIREDCOUNTS(Panels[Before],Panels[After]),1,4)",
    );
    const pValue: CallValue = { kind: "call", fn: "PVALUE", args: [{ ref: "data" }, { number: 1e-7 }] };
    expect(blockFormula({ kind: "decision", pValue, alpha: 0.05, reject: 'say "no"', keep: "keep" }, { data: "B:B" })).toBe(
      '=IF(EVENSPLIT.PVALUE(B:B,1E-7)<=0.05,"say ""no""","keep")',
    );
  });

  it("never lets a text row be read as a formula", () => {
    expect(blockFormula({ kind: "text", text: "=HYPERLINK(1)" }, refs)).toBe("'=HYPERLINK(1)");
    expect(blockFormula({ kind: "text", text: "-3 below" }, refs)).toBe("'-3 below");
    expect(blockFormula({ kind: "text", text: "plain words" }, refs)).toBe("plain words");
  });

  it("refuses a second-range operand without a second range", () => {
    const value: CallValue = { kind: "call", fn: "PAIRED", args: [{ ref: "data" }, { ref: "second" }] };
    expect(() => blockFormula(value, { data: "A1:A3" })).toThrow(RangeError);
  });

  it("writes every row of every block as a formula or guarded text", () => {
    for (const request of [oneSample, paired]) {
      for (const r of resultBlockRows(request)) {
        const f = blockFormula(r.value, refs);
        if (r.value.kind === "text" || r.value.kind === "audit") expect(f.startsWith("=")).toBe(false);
        else expect(f.startsWith("=")).toBe(true);
      }
    }
  });
});

describe("blockValue", () => {
  const cells = [[49], [null], ["note"], [51], [true], [52]];
  const run = (fn: string, args: unknown[]): unknown => {
    if (fn === "COUNTS") return [[1, 0, 2, 3]];
    if (fn === "PVALUE") return args[1] === 50 ? 0.03 : 0.5;
    if (fn === "BOUNDS") return { code: "#N/A" };
    throw new Error(`unexpected ${fn}`);
  };

  it("counts numbers and filled non-number cells, as COUNT and COUNTA − COUNT do", () => {
    expect(blockValue({ kind: "numbers", of: "data" }, { data: cells }, run)).toBe(3);
    expect(blockValue({ kind: "skipped", of: "data" }, { data: cells }, run)).toBe(2);
    expect(blockValue({ kind: "skipped", of: "data" }, { data: [...cells, [""], [null], [undefined]] }, run)).toBe(2);
  });

  it("adds the terms of a sum and passes the first error through", () => {
    const column = (k: number): CallValue => ({ kind: "call", fn: "COUNTS", args: [{ ref: "data" }, { number: 50 }], column: k });
    expect(blockValue({ kind: "sum", terms: [column(2), column(4)] }, { data: cells }, run)).toBe(3);
    const failing: CallValue = { kind: "call", fn: "BOUNDS", args: [{ ref: "data" }], column: 1 };
    expect(blockValue({ kind: "sum", terms: [column(2), failing] }, { data: cells }, run)).toEqual({ code: "#N/A" });
  });

  it("picks a column of a one-row result and passes ranges and literals through", () => {
    expect(blockValue({ kind: "call", fn: "COUNTS", args: [{ ref: "data" }, { number: 50 }], column: 3 }, { data: cells }, run)).toBe(2);
  });

  it("decides at alpha and passes an error through the decision", () => {
    const decide = (center: number) =>
      blockValue(
        {
          kind: "decision",
          pValue: { kind: "call", fn: "PVALUE", args: [{ ref: "data" }, { number: center }] },
          alpha: 0.05,
          reject: "R",
          keep: "K",
        },
        { data: cells },
        run,
      );
    expect(decide(50)).toBe("R");
    expect(decide(40)).toBe("K");
    const failing = { kind: "call", fn: "BOUNDS", args: [{ ref: "data" }] } as const;
    expect(blockValue({ kind: "decision", pValue: failing, alpha: 0.05, reject: "R", keep: "K" }, { data: cells }, run)).toEqual({
      code: "#N/A",
    });
  });
});

describe("bound labels", () => {
  it("names the one bound a one-sided alternative gets, and the two of a two-sided one", () => {
    const labels = (request: BlockRequest) =>
      resultBlockRows(request)
        .filter((r) => r.key === "lower" || r.key === "upper")
        .map((r) => r.label);
    expect(labels(oneSample)).toEqual(["95% lower bound for the median (one-sided)", "Upper bound (none: one-sided)"]);
    expect(labels({ ...oneSample, alternative: "less", confidence: 0.9 })).toEqual([
      "Lower bound (none: one-sided)",
      "90% upper bound for the median (one-sided)",
    ]);
    expect(labels(paired)).toEqual(["95% bounds for the median difference: lower", "95% bounds for the median difference: upper"]);
  });
});

/** Old against new supplier's panels (invented), one-sided: the two-group block's request in the tests below. */
const SUPPLIERS: BlockRequest = {
  test: "two-groups",
  paired: false,
  center: 0,
  alternative: "greater",
  alpha: 0.05,
  confidence: 0.95,
  dataName: "Old supplier",
  secondName: "New supplier",
};

describe("the two-group block's question and hypotheses", () => {
  const textOf = (r: BlockRequest, key: string): unknown => {
    const value = resultBlockRows(r).find((row) => row.key === key)!.value;
    return "text" in value ? value.text : undefined;
  };

  it.each([
    ["greater", "above"],
    ["less", "below"],
    ["two-sided", "above or below"],
  ] as const)("%s: asks with “tend” and states H1 with “tends”", (alternative, direction) => {
    const r = { ...SUPPLIERS, alternative };
    expect(textOf(r, "question")).toBe(`Does New supplier tend to lie ${direction} Old supplier?`);
    expect(textOf(r, "h1")).toBe(`New supplier tends to lie ${direction} Old supplier`);
  });
});

describe("the two-group block's rank-sum statistic row", () => {
  const labelOf = (r: BlockRequest): string | undefined => resultBlockRows(r).find((row) => row.key === "statistic")?.label;

  it("names the comparison U counts, with the shift when there is one", () => {
    expect(labelOf(SUPPLIERS)).toBe("Rank-sum statistic U (pairs in which New supplier exceeds Old supplier; a tie counts ½)");
    expect(labelOf({ ...SUPPLIERS, center: 0.5 })).toBe(
      "Rank-sum statistic U (pairs in which New supplier exceeds Old supplier + 0.5; a tie counts ½)",
    );
  });

  it("gives U as TWOGROUPSSTATISTIC's first cell: 8 for 1, 2, 2 against 2, 3, 4 (exact arithmetic)", () => {
    const row = resultBlockRows(SUPPLIERS).find((r) => r.key === "statistic")!;
    expect(blockValue(row.value, { data: [[1], [2], [2]], second: [[2], [3], [4]] }, callFunction)).toBe(8);
  });
});
