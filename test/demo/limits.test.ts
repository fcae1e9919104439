/**
 * The demo sheet refuses what Excel refuses to hold. Limits from Microsoft,
 * "Excel specifications and limits": 1,048,576 rows by 16,384 columns,
 * 32,767 characters in a cell, 8,192 characters of formula contents; 255
 * characters for a text constant inside a formula ([MS-XLS] 2.5.198.91
 * PtgStr); malformed formula text is refused, not stored as #NAME?. A refused
 * write leaves every cell of it as it was.
 */
import { describe, expect, it } from "vitest";
import { LAST_COLUMN, LAST_ROW } from "../../src/taskpane/a1";
import { RefusedEntry } from "../../src/demo/limits";
import { Workbook } from "../../src/demo/workbook";

const S = "Paint line";

function sheet(): Workbook {
  const workbook = new Workbook([S]);
  workbook.writeEntries(S, 0, 0, [["before"], [1]]);
  return workbook;
}

/** Writes and expects a refusal that left A1:A2 and B1 as they were. */
function refused(workbook: Workbook, top: number, left: number, entries: unknown[][]): void {
  expect(() => workbook.writeEntries(S, top, left, entries)).toThrow(RefusedEntry);
  expect([workbook.entry(S, 0, 0), workbook.entry(S, 1, 0), workbook.entry(S, 0, 1)]).toEqual(["before", 1, ""]);
}

describe("limits of a cell", () => {
  it("takes text up to 32,767 characters and refuses more", () => {
    const w = sheet();
    w.writeEntries(S, 5, 0, [["x".repeat(32_767)]]);
    expect((w.value(S, 5, 0) as string).length).toBe(32_767);
    refused(w, 0, 1, [["ok"], ["x".repeat(32_768)]]);
  });

  it("takes a formula of 8,192 characters and refuses a longer one", () => {
    const w = sheet();
    const sum = (n: number): string => `=${"1+".repeat((n - 2) / 2)}1`;
    expect(sum(8_192)).toHaveLength(8_192);
    w.writeEntries(S, 5, 0, [[sum(8_192)]]);
    expect(w.value(S, 5, 0)).toBe(4_096);
    refused(w, 0, 1, [[sum(8_194)]]);
  });

  it("refuses a formula holding a text constant of 256 characters", () => {
    const w = sheet();
    w.writeEntries(S, 5, 0, [[`="${"a".repeat(255)}"&"b"`]]);
    expect((w.value(S, 5, 0) as string).length).toBe(256);
    refused(w, 0, 1, [[`="${"a".repeat(256)}"`]]);
  });

  it("refuses malformed formula text, and keeps a formula with an unknown name as #NAME?", () => {
    const w = sheet();
    refused(w, 0, 1, [["=1+"]]);
    refused(w, 0, 1, [["=Table1[Temp. °C]"]]);
    w.writeEntries(S, 5, 0, [["=nosuch+1"]]);
    expect((w.value(S, 5, 0) as { code: string }).code).toBe("#NAME?");
  });
});

describe("limits of the sheet", () => {
  it("writes in the last row and column, and refuses anything past them", () => {
    const w = sheet();
    w.writeEntries(S, LAST_ROW, LAST_COLUMN, [[7]]);
    expect(w.value(S, LAST_ROW, LAST_COLUMN)).toBe(7);
    refused(w, LAST_ROW, 0, [[1], [2]]);
    refused(w, 0, LAST_COLUMN, [[1, 2]]);
  });
});
