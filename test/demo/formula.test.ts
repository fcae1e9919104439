/**
 * The demo sheet's formula reader and evaluator. Expected values follow
 * Excel's documented formula behaviour (Microsoft, "Calculation operators and
 * precedence in Excel", and the INDEX, ROWS, COLUMNS, COUNT, COUNTA, IF, NA
 * function pages), as recalled — marked "from memory" where a detail is not
 * in those pages.
 */
import { describe, expect, it } from "vitest";
import { evaluate, type CustomFunction, type EvaluationContext } from "../../src/demo/formula/evaluate";
import { parseFormula } from "../../src/demo/formula/parse";
import { tokenize, FormulaSyntaxError } from "../../src/demo/formula/tokenize";
import { errorValue, isError, type ReferenceValue, type Scalar, type Value } from "../../src/demo/formula/values";

/** A little sheet: column A holds 1..4 with a blank in A3 and text in A5; B1 holds 10. */
const CELLS = new Map<string, Scalar>([
  ["0,0", 1],
  ["1,0", 2],
  ["3,0", 4],
  ["4,0", "note"],
  ["0,1", 10],
]);

function context(functions: Record<string, CustomFunction> = {}): EvaluationContext {
  return {
    sheet: "S",
    blanksAsZeros: false,
    hasSheet: (name) => name === "S" || name === "Sheet1" || name === "Paint line",
    read: (ref: ReferenceValue) => {
      const bottom = Math.min(ref.rect.bottom, 9);
      const rows: Scalar[][] = [];
      for (let r = ref.rect.top; r <= bottom; r++) {
        const row: Scalar[] = [];
        for (let c = ref.rect.left; c <= ref.rect.right; c++) row.push(CELLS.get(`${r},${c}`) ?? null);
        rows.push(row);
      }
      return rows;
    },
    tableColumn: (table, column) =>
      table === "T" && column === "Value"
        ? { kind: "reference", sheet: "S", rect: { top: 0, left: 0, bottom: 4, right: 0 } }
        : errorValue("#REF!", "no such column"),
    customFunction: (id) => functions[id],
    // One defined name, "firstTwo", for A1:A2.
    definedName: (name) =>
      name.toLowerCase() === "firsttwo" ? { kind: "reference", sheet: "S", rect: { top: 0, left: 0, bottom: 1, right: 0 } } : undefined,
  };
}

function calc(formula: string, functions?: Record<string, CustomFunction>): Value {
  return evaluate(parseFormula(formula), context(functions));
}

describe("tokenize", () => {
  it("reads references with sheet prefixes, $ signs, whole columns and structured references", () => {
    expect(tokenize("'Paint line'!$B$2:$B$25")).toEqual([{ type: "ref", text: "'Paint line'!$B$2:$B$25" }]);
    expect(tokenize("Sheet1!A:A")).toEqual([{ type: "ref", text: "Sheet1!A:A" }]);
    expect(tokenize("Table1[Thickness (µm)]")).toEqual([{ type: "table", table: "Table1", column: "Thickness (µm)" }]);
    // Structured references escape [ ] # and ' with an apostrophe (Microsoft, "Using structured references with Excel tables").
    expect(tokenize("T[Lot '#3]")).toEqual([{ type: "table", table: "T", column: "Lot #3" }]);
    expect(tokenize("T[[Value]]")).toEqual([{ type: "table", table: "T", column: "Value" }]);
    // One space is allowed inside the outer brackets, for readability (same page).
    expect(tokenize("T[ [Temp. °C] ]")).toEqual([{ type: "table", table: "T", column: "Temp. °C" }]);
  });

  it("refuses structured references Excel refuses: special characters in single brackets, bad escapes, unclosed brackets", () => {
    for (const text of [
      "T[Temp. °C]",
      "T[pH-value]",
      "T[A/B]",
      "T[Weight, g]",
      "T[Lot #3]",
      "T[a[1]",
      "T[[it's]]",
      "T[[x]",
      "T[[A]:[B]]",
      "T[]",
    ]) {
      expect(() => tokenize(text), text).toThrow(FormulaSyntaxError);
    }
  });

  it("tells a function name from a cell that looks like it (LOG10( is a call)", () => {
    expect(tokenize("LOG10(A1)").map((t) => t.type)).toEqual(["name", "paren", "ref", "paren"]);
    expect(tokenize("EVENSPLIT.PVALUE(A1:A4,2)")[0]).toEqual({ type: "name", text: "EVENSPLIT.PVALUE" });
  });

  it("reads quoted text with doubled quotes", () => {
    expect(tokenize('"say ""hi"""')).toEqual([{ type: "string", value: 'say "hi"' }]);
    expect(() => tokenize('"open')).toThrow(FormulaSyntaxError);
  });

  it("refuses a text constant longer than 255 characters inside a formula, as Excel does ([MS-XLS] PtgStr)", () => {
    expect(tokenize(`"${"a".repeat(255)}"`)).toEqual([{ type: "string", value: "a".repeat(255) }]);
    expect(tokenize(`"${'"'.repeat(2 * 255)}"`)).toEqual([{ type: "string", value: '"'.repeat(255) }]);
    expect(() => tokenize(`"${"a".repeat(256)}"`)).toThrow(FormulaSyntaxError);
  });
});

describe("array constants", () => {
  it('read columns after commas and rows after semicolons (Microsoft, "Use array constants in array formulas")', () => {
    expect(calc("{1,2;3,4}")).toEqual({
      kind: "matrix",
      rows: [
        [1, 2],
        [3, 4],
      ],
    });
    expect(calc('{-1.5;"a";TRUE}')).toEqual({ kind: "matrix", rows: [[-1.5], ["a"], [true]] });
    expect(calc("INDEX({5,6,7},1,3)")).toBe(7);
    expect(calc("{ 1E-3 , 2 }")).toEqual({ kind: "matrix", rows: [[0.001, 2]] });
  });

  it("refuse what Excel refuses in them: references, functions, nested arrays, $, %, unequal rows, no closing brace", () => {
    for (const text of ["{A1,2}", "{SQRT(4)}", "{{1}}", "{$5}", "{5%}", "{1,2;3}", "{1,2", "{}", "{1,,2}"]) {
      expect(() => parseFormula(text), text).toThrow(FormulaSyntaxError);
    }
  });

  it("reach a custom function as a matrix argument", () => {
    const sum: CustomFunction = {
      fn: (m: unknown) => (m as number[][]).flat().reduce((a, b) => a + b, 0),
      shapes: ["matrix"],
      result: "scalar",
    };
    expect(calc("EVENSPLIT.SUM({51;52;53})", { SUM: sum })).toBe(156);
  });
});

describe("evaluate: operators", () => {
  it("follows the spreadsheet's precedence: negation before ^, then * /, then + -, then &, then comparison", () => {
    expect(calc("1+2*3")).toBe(7);
    expect(calc("-2^2")).toBe(4); // Excel negates before raising to a power (Microsoft's precedence table)
    expect(calc("2^3^2")).toBe(64); // left to right, from memory
    expect(calc("1+2&3")).toBe("33");
    expect(calc("1+1=2")).toBe(true);
    expect(calc("50%")).toBe(0.5);
  });

  it("compares text without regard to case and orders numbers before text", () => {
    expect(calc('"abc"="ABC"')).toBe(true);
    expect(calc('1<"a"')).toBe(true); // from memory: any number is less than any text
    expect(calc("A3=0")).toBe(true); // a blank equals 0 ...
    expect(calc('A3=""')).toBe(true); // ... and equals the empty text
  });

  it("treats a blank as 0 in arithmetic and gives the spreadsheet's errors", () => {
    expect(calc("A3+1")).toBe(1);
    expect(calc("1/0")).toEqual(errorValue("#DIV/0!", "Division by zero."));
    expect(isError(calc('"x"*2'))).toBe(true);
    expect(isError(calc("A1:A2+1"))).toBe(true);
  });
});

describe("evaluate: built-in functions", () => {
  it("INDEX picks a cell of a range or a list; outside it is #REF!", () => {
    expect(evaluate(parseFormula("INDEX(A1:B2,1,2)"), context())).toEqual({
      kind: "reference",
      sheet: "S",
      rect: { top: 0, left: 1, bottom: 0, right: 1 },
    });
    expect(calc("INDEX(A1:B2,1,2)+0")).toBe(10);
    expect((calc("INDEX(A1:B2,3,1)") as { code: string }).code).toBe("#REF!");
  });

  it("ROWS and COLUMNS count without reading, including whole columns", () => {
    expect(calc("ROWS(A2:A26)*COLUMNS(A2:A26)")).toBe(25);
    expect(calc("ROWS(A:A)")).toBe(1048576);
    expect(calc("COLUMNS(A:C)")).toBe(3);
  });

  it("COUNT counts numbers, COUNTA every non-blank cell", () => {
    expect(calc("COUNT(A1:A5)")).toBe(3);
    expect(calc("COUNTA(A1:A5)")).toBe(4);
    expect(calc("COUNT(T[Value])")).toBe(3);
  });

  it('MEDIAN ignores blank and text cells of a range; no number is #NUM! (Microsoft, "MEDIAN function")', () => {
    // A1:A5 holds 1, 2, blank, 4, "note": the middle of 1, 2, 4.
    expect(calc("MEDIAN(A1:A5)")).toBe(2);
    // With B1's 10 added, an even count: the mean of the two middle numbers, (2 + 4) / 2.
    expect(calc("MEDIAN(A1:A5,B1)")).toBe(3);
    const none = calc("MEDIAN(A5)");
    expect(isError(none) && none.code).toBe("#NUM!");
  });

  it("IF chooses, and passes an error condition through", () => {
    expect(calc('IF(A1<=0.05,"reject","keep")')).toBe("keep");
    expect(calc('IF(A1>=1,"yes","no")')).toBe("yes");
    expect((calc('IF(1/0,"a","b")') as { code: string }).code).toBe("#DIV/0!");
  });

  it('NA() is the #N/A error value, and takes no arguments (Microsoft, "NA function")', () => {
    expect((calc("NA()") as { code: string }).code).toBe("#N/A");
    expect((calc("IF(COUNT(A1,A3)=2,A3-A1,NA())") as { code: string }).code).toBe("#N/A");
    expect(calc("IF(COUNT(A1,A2)=2,A2-A1,NA())")).toBe(1);
  });

  it('refuses more than 255 arguments or calls nested deeper than 64 (Microsoft, "Excel specifications and limits")', () => {
    const nested = (depth: number): string => `${"IF(TRUE,".repeat(depth)}1${")".repeat(depth)}`;
    expect(calc(nested(64))).toBe(1);
    expect(() => parseFormula(nested(65))).toThrow(FormulaSyntaxError);
    expect(calc(`COUNT(${Array(255).fill(1).join(",")})`)).toBe(255);
    expect(() => parseFormula(`COUNT(${Array(256).fill(1).join(",")})`)).toThrow(FormulaSyntaxError);
  });

  it("unknown names are #NAME?", () => {
    expect((calc("NOSUCH(1)") as { code: string }).code).toBe("#NAME?");
    // Excel takes a formula with a name it does not know and shows #NAME?; only malformed text is refused.
    expect((calc("nosuch+1") as { code: string }).code).toBe("#NAME?");
  });

  it("ABS takes the size of a number; IFERROR shows its second value for an error (Microsoft, ABS and IFERROR function pages)", () => {
    expect(calc("ABS(-2.5)")).toBe(2.5);
    expect(calc("ABS(A1-B1)")).toBe(9);
    expect(calc('IFERROR(1/0,"none")')).toBe("none");
    expect(calc('IFERROR(A1*2,"none")')).toBe(2);
    expect((calc('IFERROR(A1:A2,"x")') as { code: string }).code).toBe("#VALUE!");
  });

  it('COUNTIF counts the cells equal to a plain criterion, text in any case (Microsoft, "COUNTIF function")', () => {
    expect(calc('COUNTIF(A1:A5,"NOTE")')).toBe(1);
    expect(calc("COUNTIF(A1:A5,4)")).toBe(1);
    expect(calc('COUNTIF(A1:A5,"other")')).toBe(0);
    // Operators and wildcards are refused: stricter than Excel, never laxer.
    expect((calc('COUNTIF(A1:A5,">1")') as { code: string }).code).toBe("#VALUE!");
    expect((calc('COUNTIF(A1:A5,"no*")') as { code: string }).code).toBe("#VALUE!");
  });

  it("MATCH finds an exact value, text in any case; INDEX with row 0 gives a whole column (Microsoft, MATCH and INDEX function pages)", () => {
    expect(calc('MATCH("b",{"a";"B";"c"},0)')).toBe(2);
    expect(calc("MATCH(4,INDEX({1,2;3,4},0,2),0)")).toBe(2);
    expect(calc('MATCH(A1,{"1";1},0)')).toBe(2);
    expect((calc('MATCH("z",{"a";"b"},0)') as { code: string }).code).toBe("#N/A");
    expect((calc("MATCH(1,{1,2;3,4},0)") as { code: string }).code).toBe("#N/A");
    // The sorted forms (match_type 1, Excel's default, and -1) are refused: stricter than Excel, never laxer.
    expect((calc('MATCH("b",{"a";"b"})') as { code: string }).code).toBe("#VALUE!");
    expect((calc('MATCH("b",{"a";"b"},1)') as { code: string }).code).toBe("#VALUE!");
    expect((calc("INDEX({1,2;3,4},0,3)") as { code: string }).code).toBe("#REF!");
  });

  it('a defined name stands for its cells, in any case (Microsoft, "Define and use names in formulas")', () => {
    expect(calc("COUNT(FirstTwo)")).toBe(2);
    expect(calc("INDEX(firsttwo,2,1)*3")).toBe(6);
    expect(() => parseFormula("A1+")).toThrow(FormulaSyntaxError);
  });
});

describe("evaluate: custom functions", () => {
  const seen: unknown[][] = [];
  const echo: CustomFunction = {
    fn: (...args: unknown[]) => {
      seen.push(args);
      return [[1, "", 3]];
    },
    shapes: ["matrix", "scalar", "scalar"],
    result: "matrix",
  };

  it('passes a range as a matrix with "" for blanks, a one-cell reference as its value, an omitted argument as null', () => {
    seen.length = 0;
    const result = calc("EVENSPLIT.ECHO(A1:A4,B1,)", { ECHO: echo });
    expect(seen[0]).toEqual([[[1], [2], [""], [4]], 10, null]);
    expect(result).toEqual({ kind: "matrix", rows: [[1, "", 3]] });
    expect(calc("INDEX(EVENSPLIT.ECHO(A1:A4,B1),1,3)", { ECHO: echo })).toBe(3);
  });

  it("turns error objects a function answers with into cell errors, and a missing function into #NAME?", () => {
    const failing: CustomFunction = {
      fn: () => ({ code: "#N/A", message: "No numbers in the range." }),
      shapes: ["matrix"],
      result: "scalar",
    };
    expect(calc("EVENSPLIT.FAIL(A1:A4)", { FAIL: failing })).toEqual(errorValue("#N/A", "No numbers in the range."));
    expect((calc("EVENSPLIT.MISSING(A1)") as { code: string }).code).toBe("#NAME?");
  });

  it('holds a number below 2.2251E-308 as 0 (Microsoft, "Excel specifications and limits"; the flush to zero from memory)', () => {
    const tiny: CustomFunction = { fn: () => [[1e-320, 2.5e-308]], shapes: [], result: "matrix" };
    expect(calc("EVENSPLIT.TINY()", { TINY: tiny })).toEqual({ kind: "matrix", rows: [[0, 2.5e-308]] });
    expect(calc("1E-200*1E-200")).toBe(0);
  });

  it("passes a blank cell given for a single value as 0, as desktop Excel does (office-js issue 4702); an omitted one as null", () => {
    seen.length = 0;
    calc("EVENSPLIT.ECHO(A1:A2,A3,)", { ECHO: echo });
    expect(seen[0]).toEqual([[[1], [2]], 0, null]);
  });

  it("answers #VALUE! when the answer's shape is not the one the metadata declares", () => {
    const listForOne: CustomFunction = { fn: () => [[1, 2]], shapes: [], result: "scalar" };
    const oneForList: CustomFunction = { fn: () => 1, shapes: [], result: "matrix" };
    expect((calc("EVENSPLIT.A()", { A: listForOne }) as { code: string }).code).toBe("#VALUE!");
    expect((calc("EVENSPLIT.B()", { B: oneForList }) as { code: string }).code).toBe("#VALUE!");
  });

  it("shows a null inside a returned array as 0, not as a blank (office-js issue 1503, by design)", () => {
    const withNull: CustomFunction = { fn: () => [[1, null, ""]], shapes: [], result: "matrix" };
    expect(calc("EVENSPLIT.HOLES()", { HOLES: withNull })).toEqual({ kind: "matrix", rows: [[1, 0, ""]] });
  });

  it('does not call the function when a range argument holds an error cell (Microsoft, "Handle and return errors from your custom function")', () => {
    seen.length = 0;
    const withError: EvaluationContext = { ...context({ ECHO: echo }), read: () => [[1], [errorValue("#N/A", "no value")], [3]] };
    expect(evaluate(parseFormula("EVENSPLIT.ECHO(A1:A3,1)"), withError)).toEqual(errorValue("#N/A", "no value"));
    expect(seen).toEqual([]);
  });

  it("does not call the function when an argument is an error, as the spreadsheet passes the error on", () => {
    seen.length = 0;
    expect((calc("EVENSPLIT.ECHO(A1:A4,1/0)", { ECHO: echo }) as { code: string }).code).toBe("#DIV/0!");
    expect(seen).toEqual([]);
  });
});
