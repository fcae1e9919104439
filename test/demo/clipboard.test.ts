/**
 * Pasted text as cells. The expected splits follow how a spreadsheet puts a
 * selection on the clipboard as text/plain: rows on lines, cells separated by
 * tabs, a cell holding a line break or a quote wrapped in double quotes with
 * the quote doubled (common practice; the quoting as Excel writes it, from
 * memory).
 */
import { describe, expect, it } from "vitest";
import { clipboardCells } from "../../src/demo/clipboard";

describe("clipboardCells", () => {
  it("gives one cell per line for a column of numbers, whatever the line ends", () => {
    expect(clipboardCells("51.8\n49.6\n52.4\n")).toEqual([["51.8"], ["49.6"], ["52.4"]]);
    expect(clipboardCells("51.8\r\n49.6\r\n")).toEqual([["51.8"], ["49.6"]]);
    expect(clipboardCells("51.8\r49.6")).toEqual([["51.8"], ["49.6"]]);
  });

  it("splits tab-separated columns and keeps empty fields as empty cells", () => {
    expect(clipboardCells("P-101\t51.8\t50.2\nP-108\t\t50.4\n")).toEqual([
      ["P-101", "51.8", "50.2"],
      ["P-108", "", "50.4"],
    ]);
  });

  it("keeps a blank line inside the text as an empty row, but not the final line break", () => {
    expect(clipboardCells("1\n\n3\n")).toEqual([["1"], [""], ["3"]]);
    expect(clipboardCells("")).toEqual([]);
  });

  it("reads a quoted field with a tab, a line break or a doubled quote as one cell", () => {
    expect(clipboardCells('"re-sprayed,\nnot measured"\t49.7\n"a ""note"""\t1')).toEqual([
      ["re-sprayed,\nnot measured", "49.7"],
      ['a "note"', "1"],
    ]);
    // A lone quote with no closing one is plain text.
    expect(clipboardCells('5" panel\n')).toEqual([['5" panel']]);
    expect(clipboardCells('"5 panel\n7')).toEqual([['"5 panel'], ["7"]]);
  });
});
