/**
 * Describing a range: counts by kind (the same single pass as the cell
 * functions), header guess and table membership. Expected counts are by
 * hand from the listed cells (exact).
 */
import { describe, expect, it } from "vitest";
import { headerName, tablePlace, tallyCells } from "../../src/taskpane/dataInfo";
import type { TableInfo } from "../../src/taskpane/host";

const TABLE: TableInfo = {
  name: "Table1",
  sheet: "S",
  rect: { top: 0, left: 0, bottom: 24, right: 2 },
  columns: ["Panel", "Thickness (µm)", "After"],
};

describe("tallyCells", () => {
  it("counts numbers and skipped cells by kind", () => {
    expect(tallyCells([[51.8], [""], ["re-sprayed"], [true], [50], [null]])).toEqual({
      cells: 6,
      numbers: 2,
      skipped: { blank: 2, text: 1, boolean: 1, other: 0 },
    });
  });
});

describe("headerName", () => {
  it("takes a text first row over numbers as the name", () => {
    expect(headerName([["Thickness (µm)"], [51.8], [49.6]])).toBe("Thickness (µm)");
    expect(
      headerName([
        ["Before", "After"],
        [1, 2],
      ]),
    ).toBe("Before / After");
  });

  it("does not take numbers, number-like text, blanks or a lone row as a name", () => {
    expect(headerName([[51.8], [49.6]])).toBeNull();
    expect(headerName([["50"], [49.6]])).toBeNull();
    expect(headerName([[""], [49.6]])).toBeNull();
    expect(headerName([["Name"]])).toBeNull();
    expect(headerName([["Name"], ["text only"]])).toBeNull();
  });
});

describe("tablePlace", () => {
  it("recognises a whole table column, with or without its header cell", () => {
    const withHeader = tablePlace({ top: 0, left: 1, bottom: 24, right: 1 }, [TABLE]);
    expect(withHeader).toMatchObject({
      kind: "column",
      match: { column: "Thickness (µm)", headerIncluded: true, body: { top: 1, bottom: 24, left: 1, right: 1 } },
    });
    expect(tablePlace({ top: 1, left: 1, bottom: 24, right: 1 }, [TABLE])).toMatchObject({
      kind: "column",
      match: { headerIncluded: false },
    });
  });

  it("tells part of a table from a column, and a range outside any table", () => {
    expect(tablePlace({ top: 3, left: 1, bottom: 10, right: 1 }, [TABLE]).kind).toBe("part");
    expect(tablePlace({ top: 0, left: 1, bottom: 24, right: 2 }, [TABLE]).kind).toBe("part");
    expect(tablePlace({ top: 0, left: 4, bottom: 24, right: 4 }, [TABLE]).kind).toBe("none");
  });
});
