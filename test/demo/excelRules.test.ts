/**
 * Places where the demo sheet follows Excel rather than doing something
 * easier that could hide a defect in the pane. Each check names its source.
 */
import { describe, expect, it } from "vitest";
import { tableHeaders, Workbook } from "../../src/demo/workbook";

const S = "Paint line";

describe("references to a sheet that is not there", () => {
  it("are #REF!, and the rest of the sheet still calculates (Excel shows #REF! for a missing sheet)", () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["='No such sheet'!A1"], [2], ["=A2*2"], ["=ROWS('No such sheet'!A1:A5)"]]);
    expect((w.value(S, 0, 0) as { code: string }).code).toBe("#REF!");
    expect((w.value(S, 3, 0) as { code: string }).code).toBe("#REF!");
    expect(w.value(S, 2, 0)).toBe(4);
  });
});

describe("a new table's header row (Microsoft, \"Overview of Excel tables\"; numbering of repeats from memory)", () => {
  it("turns numbers into text, names blanks ColumnN and makes repeated names unique", () => {
    expect(tableHeaders(["Thickness", "thickness", 2024, null, true])).toEqual(["Thickness", "thickness2", "2024", "Column4", "TRUE"]);
  });

  it("writes those names into the sheet, so a structured reference must use them", () => {
    const w = new Workbook([S]);
    w.writeEntries(S, 0, 0, [["Thickness", "Thickness", 2024, ""], [1, 2, 3, 4], [5, 6, 7, 8]]);
    w.addTable(S, { top: 0, left: 0, bottom: 2, right: 3 });
    expect(w.tableColumns(w.tables[0])).toEqual(["Thickness", "Thickness2", "2024", "Column4"]);
    expect(w.entry(S, 0, 2)).toBe("2024");
    w.writeEntries(S, 4, 0, [["=COUNT(Table1[Thickness2])", "=COUNT(Table1[2024])"]]);
    expect([w.value(S, 4, 0), w.value(S, 4, 1)]).toEqual([2, 2]);
  });
});
