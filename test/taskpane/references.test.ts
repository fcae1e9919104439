/**
 * Structured references to table columns. The rules are Microsoft's, "Using
 * structured references with Excel tables" (special characters that need a
 * second pair of brackets; [ ] # and ' escaped with an apostrophe). Each
 * header is written by the pane's references module and read back by the demo
 * sheet's own reader, which follows the same page independently.
 */
import { describe, expect, it } from "vitest";
import { tokenize, FormulaSyntaxError } from "../../src/demo/formula/tokenize";
import { Workbook } from "../../src/demo/workbook";
import { structuredReference } from "../../src/taskpane/references";

/** Headers with the special characters the page lists, and plain ones. */
const SPECIAL = [
  "Temp. °C",
  "Weight, g",
  "pH-value",
  "A/B",
  "Lot #3",
  "it's",
  "a]b",
  "=1+1",
  "Thickness (µm)",
  "x[1]",
  "Cost $",
  "line\nbreak",
  "a@b",
];
const PLAIN = ["Thickness", "Dicke_µm", "2024", "Schichtdicke"];

describe("structuredReference", () => {
  it("keeps single brackets for names of letters, digits and underscores only", () => {
    expect(structuredReference("Table1", "Thickness")).toBe("Table1[Thickness]");
    expect(structuredReference("Table1", "Dicke_µm")).toBe("Table1[Dicke_µm]");
  });

  it("puts every other name in a second pair of brackets, escaping [ ] # and ' with an apostrophe", () => {
    expect(structuredReference("Table1", "Temp. °C")).toBe("Table1[[Temp. °C]]");
    expect(structuredReference("Table1", "Weight, g")).toBe("Table1[[Weight, g]]");
    expect(structuredReference("Table1", "pH-value")).toBe("Table1[[pH-value]]");
    expect(structuredReference("Table1", "A/B")).toBe("Table1[[A/B]]");
    expect(structuredReference("Table1", "Lot #3")).toBe("Table1[[Lot '#3]]");
    expect(structuredReference("Table1", "it's")).toBe("Table1[[it''s]]");
    expect(structuredReference("Table1", "a]b")).toBe("Table1[[a']b]]");
    expect(structuredReference("Table1", "=1+1")).toBe("Table1[[=1+1]]");
    expect(structuredReference("T", "a[1]'#")).toBe("T[[a'[1']'''#]]");
  });

  it("round trip: every header it writes reads back as the same column", () => {
    for (const header of [...SPECIAL, ...PLAIN]) {
      expect(tokenize(structuredReference("Table1", header))).toEqual([{ type: "table", table: "Table1", column: header }]);
    }
  });

  it("round trip through a table: a formula over each column counts that column's numbers", () => {
    const headers = [...SPECIAL, ...PLAIN];
    const workbook = new Workbook(["S"]);
    // A leading apostrophe keeps "=1+1" a text header, as typing it in Excel would need.
    workbook.writeEntries("S", 0, 0, [
      headers.map((h) => `'${h}`),
      ...[1, 2, 3].map((row) => headers.map((_, c) => (c % 3 === row % 3 ? "text" : row))),
    ]);
    workbook.addTable("S", { top: 0, left: 0, bottom: 3, right: headers.length - 1 });
    workbook.writeEntries("S", 5, 0, [headers.map((h) => `=COUNT(${structuredReference("Table1", h)})`)]);
    headers.forEach((h, c) => expect([h, workbook.value("S", 5, c)]).toEqual([h, 2]));
  });

  it("the single-bracket form Excel refuses is refused by the demo sheet too", () => {
    // The old writer's form: escapes only, no inner brackets.
    const single = (column: string): string => `Table1[${column.replace(/['[\]#]/g, (ch) => `'${ch}`)}]`;
    for (const header of ["Temp. °C", "Weight, g", "pH-value", "A/B", "=1+1", "line\nbreak", "Cost $"]) {
      expect(() => tokenize(single(header)), header).toThrow(FormulaSyntaxError);
    }
    // The page's own single-bracket examples stay readable: a space alone, and escaped characters.
    expect(tokenize("DeptSales[Sales Amount]")).toEqual([{ type: "table", table: "DeptSales", column: "Sales Amount" }]);
    expect(tokenize("DeptSalesFYSummary['#OfItems]")).toEqual([{ type: "table", table: "DeptSalesFYSummary", column: "#OfItems" }]);
  });
});
