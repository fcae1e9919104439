/**
 * Number formats as the sheet shows them. Expected texts are what Excel
 * displays for these format codes (Microsoft, "Review guidelines for
 * customizing a number format"; the General examples from memory, for a
 * standard-width column).
 */
import { describe, expect, it } from "vitest";
import { NUMBER_FORMATS } from "../../src/report/resultBlock";
import { formatCell } from "../../src/taskpane/numberFormat";

describe("formatCell", () => {
  it("shows the result block's formats", () => {
    expect(formatCell(0.03125, NUMBER_FORMATS.pvalue)).toBe("0.03125");
    expect(formatCell(0.0000123, NUMBER_FORMATS.pvalue)).toBe("1.23E-05");
    expect(formatCell(1, NUMBER_FORMATS.pvalue)).toBe("1");
    expect(formatCell(0.9567, NUMBER_FORMATS.percent)).toBe("95.67%");
    expect(formatCell(22, NUMBER_FORMATS.integer)).toBe("22");
    expect(formatCell("Sign test", NUMBER_FORMATS.text)).toBe("Sign test");
  });

  it("shows General as a standard-width column does", () => {
    expect(formatCell(51.8, "General")).toBe("51.8");
    expect(formatCell(1 / 3, "General")).toBe("0.333333333");
    expect(formatCell(-2 / 3, "General")).toBe("-0.66666667");
    expect(formatCell(123456789012, "General")).toBe("1.23457E+11");
    expect(formatCell(0, "General")).toBe("0");
    expect(formatCell(true, "General")).toBe("TRUE");
    expect(formatCell(null, "0.00")).toBe("");
  });

  it("handles sections, literals and thousands separators", () => {
    expect(formatCell(-3, "0.0;(0.0)")).toBe("(3.0)");
    expect(formatCell(0, '0;-0;"zero"')).toBe("zero");
    expect(formatCell(1234567.891, "#,##0.00")).toBe("1,234,567.89");
    expect(formatCell(5, '0" µm"')).toBe("5 µm");
  });
});
