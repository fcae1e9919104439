/**
 * Ctrl+arrow in the demo sheet, as Excel moves (Microsoft, "Keyboard
 * shortcuts in Excel": Ctrl+Arrow moves to the edge of the current data
 * region; the cases below from memory of Excel's behaviour).
 */
import { describe, expect, it } from "vitest";
import { dataEdge, type Line } from "../../src/demo/dataEdge";

/** Rows 0 (header) to 100,000 filled, a gap, then rows 100,005 to 100,007. */
const column: Line = {
  lastUsed: 100_007,
  last: 1_048_575,
  filled: (i) => i <= 100_000 || (i >= 100_005 && i <= 100_007),
};

describe("dataEdge", () => {
  it("runs to the end of a filled run", () => {
    expect(dataEdge(0, 1, column)).toBe(100_000);
    expect(dataEdge(100_000, -1, column)).toBe(0);
  });

  it("jumps over blanks to the next filled cell", () => {
    expect(dataEdge(100_000, 1, column)).toBe(100_005);
    expect(dataEdge(100_005, -1, column)).toBe(100_000);
    expect(dataEdge(100_002, 1, column)).toBe(100_005);
  });

  it("goes to the sheet's edge when nothing filled lies ahead, and stays at the edge", () => {
    expect(dataEdge(100_007, 1, column)).toBe(1_048_575);
    expect(dataEdge(1_048_575, 1, column)).toBe(1_048_575);
    expect(dataEdge(0, -1, column)).toBe(0);
    const blank: Line = { lastUsed: -1, last: 16_383, filled: () => false };
    expect(dataEdge(5, -1, blank)).toBe(0);
    expect(dataEdge(5, 1, blank)).toBe(16_383);
  });
});
