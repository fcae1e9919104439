/**
 * Checks of numeric and range arguments. The rules are the catalogue's
 * (issue "The EVENSPLIT cell functions": omitted means the default, bad
 * arguments are #VALUE! with a message saying what is accepted, paired ranges
 * must have the same shape); the boundary cases are chosen by hand.
 */
import { describe, expect, it } from "vitest";
import {
  LARGEST_N,
  cellsArgument,
  fractionArgument,
  numberArgument,
  pairedCellsArgument,
  probabilityArgument,
  sampleSizeArgument,
} from "../../src/functions/argumentChecks";
import { BadArgument } from "../../src/functions/errors";

function refusal(run: () => unknown): string {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(BadArgument);
    return (e as BadArgument).message;
  }
  throw new Error("expected a refusal");
}

describe("numberArgument", () => {
  it("takes finite numbers as they are, -0 included", () => {
    expect(numberArgument("x", 50)).toBe(50);
    expect(numberArgument("x", -2.5e-300)).toBe(-2.5e-300);
    expect(Object.is(numberArgument("x", -0), -0)).toBe(true);
  });

  it("uses the fallback for an omitted optional argument and reports a missing required one", () => {
    for (const omitted of [null, undefined, ""]) {
      expect(numberArgument("shift", omitted, 0)).toBe(0);
      expect(refusal(() => numberArgument("hypothesized_median", omitted))).toMatch(/^Argument hypothesized_median is missing/);
    }
  });

  it("refuses text (even text that looks like a number), logical values and non-finite numbers", () => {
    expect(refusal(() => numberArgument("hypothesized_median", "50"))).toBe(
      'Argument hypothesized_median must be a number (typed without quotes, or a cell holding one); got the text "50".',
    );
    expect(refusal(() => numberArgument("x", true))).toContain("the logical value TRUE");
    expect(refusal(() => numberArgument("x", NaN))).toContain("got NaN");
    expect(refusal(() => numberArgument("x", Infinity))).toContain("got Infinity");
    expect(refusal(() => numberArgument("x", [[1]]))).toContain("a value that is not a number");
  });
});

describe("fractionArgument", () => {
  it("accepts numbers strictly between 0 and 1 and the default", () => {
    expect(fractionArgument("confidence", 0.95, 0.95)).toBe(0.95);
    expect(fractionArgument("confidence", null, 0.95)).toBe(0.95);
    expect(fractionArgument("alpha", Number.MIN_VALUE, 0.05)).toBe(Number.MIN_VALUE);
    expect(fractionArgument("alpha", 1 - 2 ** -53, 0.05)).toBe(1 - 2 ** -53);
  });

  it("refuses 0, 1 and beyond, and suggests the fraction for a percentage", () => {
    for (const x of [0, 1, -0.1, 1.5, 100])
      expect(refusal(() => fractionArgument("confidence", x, 0.95))).toMatch(/strictly between 0 and 1/);
    expect(refusal(() => fractionArgument("confidence", 95, 0.95))).toBe(
      "Argument confidence must lie strictly between 0 and 1, such as 0.95; got 95. For 95% write 0.95.",
    );
    expect(refusal(() => fractionArgument("quantile", null, undefined, "0.9"))).toMatch(
      /^Argument quantile is missing\. Give a number, such as 0\.9,/,
    );
  });
});

describe("probabilityArgument", () => {
  it("accepts 0 to 1 inclusive and refuses the rest", () => {
    for (const x of [0, 0.75, 1]) expect(probabilityArgument("p_above", x, "0.75")).toBe(x);
    expect(refusal(() => probabilityArgument("p_above", 75, "0.75"))).toBe(
      "Argument p_above must lie between 0 and 1, such as 0.75; got 75. For 75% write 0.75.",
    );
    expect(refusal(() => probabilityArgument("p_above", -0.1, "0.75"))).toMatch(/^Argument p_above must lie between 0 and 1/);
    expect(refusal(() => probabilityArgument("p_above", null, "0.75"))).toMatch(
      /^Argument p_above is missing\. Give a number, such as 0\.75,/,
    );
  });
});

describe("sampleSizeArgument", () => {
  it("accepts whole numbers from 1 to 1e9 only", () => {
    expect(sampleSizeArgument("n", 1)).toBe(1);
    expect(sampleSizeArgument("n", LARGEST_N)).toBe(1e9);
    for (const x of [0, -3, 2.5, 1e9 + 1])
      expect(refusal(() => sampleSizeArgument("n", x))).toMatch(/^Argument n must be a whole number from 1/);
  });
});

describe("range arguments", () => {
  it("takes a matrix as it is and a single value as a one-cell range", () => {
    const m = [
      [1, 2],
      [3, 4],
    ];
    expect(cellsArgument("data", m)).toBe(m);
    expect(cellsArgument("data", 7)).toEqual([[7]]);
    expect(cellsArgument("data", null)).toEqual([[null]]);
    expect(refusal(() => cellsArgument("data", []))).toMatch(/^Argument data must be a range/);
    expect(refusal(() => cellsArgument("data", [1, 2]))).toMatch(/^Argument data must be a range/);
  });

  it("requires paired ranges of the same shape and says what each one is", () => {
    const column = (n: number) => Array.from({ length: n }, (_, i) => [i]);
    expect(pairedCellsArgument(column(3), column(3)).second).toHaveLength(3);
    expect(refusal(() => pairedCellsArgument(column(3), column(2)))).toBe(
      "Arguments first and second must have the same shape, pair by pair: first is 3 rows × 1 column, second is 2 rows × 1 column.",
    );
    expect(refusal(() => pairedCellsArgument([[1, 2, 3]], column(3)))).toContain("first is 1 row × 3 columns");
  });
});
