/**
 * The two-group and several-group blocks two ways: their formulas entered in
 * the demo sheet and calculated by its evaluator with the catalogue's
 * functions, against direct evaluation (blockValue with callFunction) on the
 * invented "Lines and suppliers" sheet (two groups also picked by label from the lines) (src/demo/inventedData.ts). Every row must
 * agree, and the by-group table spilled in the sheet must equal the matrix
 * BYGROUP answers directly, cell by cell. Hand counts are from that file. LABELEDTWOGROUPS and
 * LABELEDSHIFT, typed in the sheet, must give what they give called directly.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { isError } from "../../src/demo/formula/values";
import { GROUPS_SHEET, groupRows } from "../../src/demo/inventedData";
import { Workbook } from "../../src/demo/workbook";
import { callFunction } from "../../src/functions/functions";
import { isCellError } from "../../src/functions/runtime";
import { blockFormula, blockValue, resultBlockRows, type BlockRequest } from "../../src/report/resultBlock";
import { catalogueFunctions } from "./catalogue";

let functions: Map<string, CustomFunction>;
beforeAll(async () => {
  functions = await catalogueFunctions();
});

const BASE = { paired: false, alpha: 0.05, confidence: 0.95 } as const;

const TWO: BlockRequest[] = [
  { ...BASE, test: "two-groups", center: 0, alternative: "two-sided", dataName: "Old supplier (µm)", secondName: "New supplier (µm)" },
  { ...BASE, test: "two-groups", center: 0.5, alternative: "greater", method: "median" },
  { ...BASE, test: "two-groups", center: -1, alternative: "less", method: "rank-sum", confidence: 0.9, followsNewRows: true },
];

const SEVERAL: BlockRequest[] = [
  { ...BASE, test: "groups", center: 0, alternative: "two-sided", dataName: "Thickness (µm)", secondName: "Line" },
  { ...BASE, test: "groups", center: 50, withTarget: true, alternative: "greater", method: "rank", adjust: "bh" },
  { ...BASE, test: "groups", center: 51, withTarget: true, alternative: "two-sided", method: "median", confidence: 0.9, adjust: "holm" },
];

/** A column of the sheet's body (rows 2 to 20) as Range.values gives it (blank as ""). */
function column(c: number, rows = 19): unknown[][] {
  return groupRows()
    .slice(1, rows + 1)
    .map((row) => [row[c] ?? ""]);
}

function sheet(): Workbook {
  const workbook = new Workbook([GROUPS_SHEET]);
  workbook.writeEntries(GROUPS_SHEET, 0, 0, groupRows());
  workbook.setFunctions(functions);
  return workbook;
}

/** Writes the block's formulas in column H from row 1 and returns the sheet's workbook. */
function written(workbook: Workbook, request: BlockRequest, refs: { data: string; second?: string }): Workbook {
  workbook.writeEntries(
    GROUPS_SHEET,
    0,
    7,
    resultBlockRows(request).map((row) => [blockFormula(row.value, refs)]),
  );
  return workbook;
}

function expectSame(sheetValue: unknown, direct: unknown, label: string): void {
  if (label === "Audit") {
    expect(String(sheetValue).split("; reads ")[0], label).toBe(String(direct).split("; reads ")[0]);
    return;
  }
  if (isCellError(direct)) expect(isError(sheetValue) ? sheetValue.code : sheetValue, label).toBe(direct.code);
  else if (direct === "" || direct === null || direct === undefined) expect(sheetValue === "" || sheetValue === null, label).toBe(true);
  else expect(sheetValue, label).toEqual(direct);
}

function agree(
  request: BlockRequest,
  refs: { data: string; second: string },
  inputs: { data: unknown[][]; second: unknown[][] },
): Workbook {
  const workbook = written(sheet(), request, refs);
  resultBlockRows(request).forEach((row, i) => {
    const direct = blockValue(row.value, inputs, callFunction);
    if (!row.spill) {
      expectSame(workbook.value(GROUPS_SHEET, i, 7), direct, row.label);
      return;
    }
    // The spilled table, cell by cell, against the matrix BYGROUP answers.
    const matrix = direct as unknown[][];
    expect(matrix[0]).toHaveLength(row.spill.columns);
    matrix.forEach((cells, r) =>
      cells.forEach((cell, c) => expectSame(workbook.value(GROUPS_SHEET, i + r, 7 + c), cell, `${row.label} ${r},${c}`)),
    );
  });
  return workbook;
}

/** The sheet's value of the block row with `key` (the block is written in column H from row 1). */
function blockCell(workbook: Workbook, request: BlockRequest, key: string): unknown {
  return workbook.value(
    GROUPS_SHEET,
    resultBlockRows(request).findIndex((r) => r.key === key),
    7,
  );
}

describe("two groups: the block's formulas agree with direct evaluation", () => {
  it.each(TWO.map((r) => [`${r.method ?? "rank-sum"} ${r.alternative} shift ${r.center}`, r] as const))("%s", (_, request) => {
    agree(request, { data: "$E$2:$E$12", second: "$F$2:$F$12" }, { data: column(4, 11), second: column(5, 11) });
  });

  it("gives the hand-counted numbers and medians", () => {
    const request = TWO[0];
    const workbook = agree(request, { data: "$E$2:$E$12", second: "$F$2:$F$12" }, { data: column(4, 11), second: column(5, 11) });
    const at = (key: string): unknown => blockCell(workbook, request, key);
    // By hand: 9 and 11 panels; sorted old 49.5 ... 51.6 has 50.4 in the middle, new 50.5 ... 52.9 has 51.7.
    expect([at("firstNumbers"), at("secondNumbers"), at("firstMedian"), at("secondMedian")]).toEqual([9, 11, 50.4, 51.7]);
    expect(at("estimate")).toBeTypeOf("number");
  });
});

/** Two lines picked by label from the values and group column, found in BYGROUP's table by their labels. */
const LABELED: BlockRequest[] = [
  { ...TWO[0], dataName: "North", secondName: "South", groupLabels: { first: "North", second: "South" } },
  { ...TWO[1], dataName: "South", secondName: "North", groupLabels: { first: "South", second: "North" } },
  { ...TWO[2], dataName: "East", secondName: "North", groupLabels: { first: "East", second: "North" } },
];

describe("two groups from a group column: the block's formulas agree with direct evaluation", () => {
  it.each(
    LABELED.map((r) => [`${r.method ?? "rank-sum"} ${String(r.groupLabels?.first)} then ${String(r.groupLabels?.second)}`, r] as const),
  )("%s", (_, request) => {
    agree(request, { data: "$C$2:$C$20", second: "$B$2:$B$20" }, { data: column(2), second: column(1) });
  });

  it("gives the hand-counted numbers and medians of the two lines, and the p-value and shift of the split ranges", () => {
    const request = LABELED[0];
    const workbook = agree(request, { data: "$C$2:$C$20", second: "$B$2:$B$20" }, { data: column(2), second: column(1) });
    const rows = resultBlockRows(request);
    const at = (key: string): unknown => blockCell(workbook, request, key);
    // By hand: North 50.8, 51.3, 49.9, 50.5, 51.0, 50.1 (median 50.65); South 52.1, 53.0, 51.7, 52.8, 51.9, 52.5 (median 52.3).
    expect([at("firstNumbers"), at("secondNumbers"), at("firstMedian"), at("secondMedian")]).toEqual([6, 6, 50.65, 52.3]);
    const north = [[50.8], [51.3], [49.9], [50.5], [51.0], [50.1]];
    const south = [[52.1], [53.0], [51.7], [52.8], [51.9], [52.5]];
    expect(at("pvalue")).toBe(callFunction("TWOGROUPS", [north, south, 0, "two-sided", "rank-sum"]));
    expect(at("estimate")).toBe((callFunction("SHIFT", [north, south, 0.95]) as unknown[][])[0][0]);
    expect(blockFormula(rows.find((r) => r.key === "firstMedian")!.value, { data: "D", second: "L" })).toBe(
      '=INDEX(EVENSPLIT.BYGROUP(D,L),MATCH("North",INDEX(EVENSPLIT.BYGROUP(D,L),0,1),0),3)',
    );
  });

  it("keeps each line's count and median when an edit makes another label come first", () => {
    const request = LABELED[0];
    const workbook = agree(request, { data: "$C$2:$C$20", second: "$B$2:$B$20" }, { data: column(2), second: column(1) });
    const at = (key: string): unknown => blockCell(workbook, request, key);
    // Q-201 (50.8) moves from North to South, so South now appears first in the group column.
    workbook.writeEntries(GROUPS_SHEET, 1, 1, [["South"]]);
    // By hand: North 51.3, 49.9, 50.5, 51.0, 50.1 (median 50.5); South 50.8 and its six (median 52.1).
    expect([at("firstNumbers"), at("secondNumbers"), at("firstMedian"), at("secondMedian")]).toEqual([5, 7, 50.5, 52.1]);
  });
});

describe("several groups: the block's formulas agree with direct evaluation, the by-group table spilled", () => {
  it.each(SEVERAL.map((r) => [`${r.method ?? "median"} ${r.withTarget ? `target ${r.center}` : "no target"}`, r] as const))(
    "%s",
    (_, request) => {
      agree(request, { data: "$C$2:$C$20", second: "$B$2:$B$20" }, { data: column(2), second: column(1) });
    },
  );

  it("spills a header, a row per line in order of first appearance and the count of the panel without a line", () => {
    const request = SEVERAL[1];
    const workbook = agree(request, { data: "$C$2:$C$20", second: "$B$2:$B$20" }, { data: column(2), second: column(1) });
    const top = resultBlockRows(request).findIndex((r) => r.key === "byGroup");
    const cell = (r: number, c: number): unknown => workbook.value(GROUPS_SHEET, top + r, 7 + c);
    // By hand: North, South, East with 6 panels each; Q-210 has no line.
    expect([cell(1, 0), cell(2, 0), cell(3, 0), cell(4, 0)]).toEqual(["North", "South", "East", "Rows without a usable label (skipped)"]);
    expect([cell(1, 1), cell(2, 1), cell(3, 1), cell(4, 1)]).toEqual([6, 6, 6, 1]);
    // South: all 6 above 50, one-sided sign test: 1/64 (exact arithmetic).
    expect(cell(2, 6)).toBeCloseTo(1 / 64, 15);
  });

  it("leaves the p-value columns empty without a target", () => {
    const request = SEVERAL[0];
    const workbook = agree(request, { data: "$C$2:$C$20", second: "$B$2:$B$20" }, { data: column(2), second: column(1) });
    const top = resultBlockRows(request).findIndex((r) => r.key === "byGroup");
    expect(resultBlockRows(request).find((r) => r.key === "byGroup")?.value).toMatchObject({ fn: "BYGROUP" });
    expect(blockFormula(resultBlockRows(request)[top].value, { data: "D", second: "L" })).toBe(
      '=EVENSPLIT.BYGROUP(D,L,,"two-sided",0.95,"holm")',
    );
    expect([workbook.value(GROUPS_SHEET, top + 1, 13), workbook.value(GROUPS_SHEET, top + 1, 14)]).toEqual(["", ""]);
  });
});

describe("two groups picked by label: LABELEDTWOGROUPS and LABELEDSHIFT typed in the sheet", () => {
  const VALUES = "$C$2:$C$20";
  const LABELS = "$B$2:$B$20";

  it("the sheet's answers equal direct evaluation, for both methods and every alternative", () => {
    for (const method of ["rank-sum", "median"]) {
      for (const alternative of ["two-sided", "greater", "less"]) {
        const workbook = sheet();
        const args = `${VALUES},${LABELS},"North","south",0.5,"${alternative}","${method}"`;
        workbook.writeEntries(GROUPS_SHEET, 0, 7, [[`=EVENSPLIT.LABELEDTWOGROUPS(${args})`]]);
        const direct = callFunction("LABELEDTWOGROUPS", [column(2), column(1), "North", "south", 0.5, alternative, method]);
        expect(typeof direct).toBe("number");
        expect(workbook.value(GROUPS_SHEET, 0, 7), `${method} ${alternative}`).toBe(direct);
      }
    }
  });

  it("LABELEDSHIFT spills its row, equal to direct evaluation; a label not in the column is #N/A", () => {
    const workbook = sheet();
    workbook.writeEntries(GROUPS_SHEET, 0, 7, [[`=EVENSPLIT.LABELEDSHIFT(${VALUES},${LABELS},"North","East",0.9)`]]);
    const [direct] = callFunction("LABELEDSHIFT", [column(2), column(1), "North", "East", 0.9]) as unknown[][];
    direct.forEach((cell, c) => expectSame(workbook.value(GROUPS_SHEET, 0, 7 + c), cell, `column ${c + 1}`));
    expect(direct[0]).toBeTypeOf("number");
    workbook.writeEntries(GROUPS_SHEET, 2, 7, [[`=EVENSPLIT.LABELEDTWOGROUPS(${VALUES},${LABELS},"North","West")`]]);
    const missing = workbook.value(GROUPS_SHEET, 2, 7);
    expect(isError(missing) && missing.code).toBe("#N/A");
  });
});
