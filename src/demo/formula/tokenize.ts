/**
 * Splits the text of a formula (after its "=") into tokens: numbers, strings,
 * cell and range references (optional sheet prefix, `$` signs, whole
 * columns), structured table references (Table[Column]), array constants
 * ({1,2;3,4}), names, operators.
 *
 * Method: a hand-written scanner that tries each token pattern at the current
 * position, longest form first. The grammar is the locale-independent English
 * formula syntax that Range.formulas uses (comma separators, "." decimals) —
 * common practice, as documented for Excel's Range.formulas property.
 *
 * Cost: O(length of the formula).
 */

export type Token =
  | { readonly type: "number"; readonly value: number }
  | { readonly type: "string"; readonly value: string }
  | { readonly type: "ref"; readonly text: string }
  | { readonly type: "table"; readonly table: string; readonly column: string }
  | { readonly type: "name"; readonly text: string }
  | { readonly type: "op"; readonly text: string }
  | { readonly type: "paren"; readonly text: "(" | ")" }
  | { readonly type: "comma" }
  | { readonly type: "array"; readonly rows: readonly (readonly ArrayElement[])[] };

/** What an array constant may hold: a number, a text or a logical. */
export type ArrayElement = number | string | boolean;

/**
 * A formula the scanner or the parser cannot read; the sheet shows it as #NAME?.
 *
 * @example
 * tokenize('"open'); // throws FormulaSyntaxError("A text in quotes is not closed.")
 */
export class FormulaSyntaxError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "FormulaSyntaxError";
  }
}

const SHEET_PREFIX = String.raw`(?:'(?:[^']|'')+'|[A-Za-z_][A-Za-z0-9_.]*)!`;
const CELL = String.raw`\$?[A-Za-z]{1,3}\$?[0-9]+`;
const COLUMN = String.raw`\$?[A-Za-z]{1,3}`;
// A reference must not run on into a name or a call: "LOG10(" is a function, not cell LOG10.
const REFERENCE = new RegExp(String.raw`^(?:${SHEET_PREFIX})?(?:${CELL}(?::${CELL})?|${COLUMN}:${COLUMN})(?![A-Za-z0-9_.(\[!])`);
const NUMBER = /^(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?/;
const NAME = /^[A-Za-z_\\][A-Za-z0-9_.]*/;
const OPERATORS = ["<=", ">=", "<>", "=", "<", ">", "+", "-", "*", "/", "^", "&", "%"];

/**
 * Characters that a column name may hold only inside the inner brackets of
 * Table1[[...]], as listed by Microsoft, "Using structured references with
 * Excel tables" (special characters): tab, line feed, carriage return, comma,
 * colon, period, brackets, pound sign, quotation marks, braces, dollar sign,
 * caret, ampersand, asterisk, plus, equal and minus signs, greater-than and
 * less-than, division sign. A space alone is the page's one exception. The @
 * is added here because in single brackets it means "this row", which the
 * demo sheet does not read: refusing it is stricter than Excel, never laxer.
 */
const NEEDS_INNER_BRACKETS = new Set([
  "\t",
  "\n",
  "\r",
  ",",
  ":",
  ".",
  "[",
  "]",
  "#",
  "'",
  '"',
  "{",
  "}",
  "$",
  "^",
  "&",
  "*",
  "+",
  "=",
  "-",
  ">",
  "<",
  "/",
  "@",
]);
/** Characters that take the apostrophe escape inside a column name (same page, escape characters). */
const ESCAPABLE = new Set(["[", "]", "#", "'"]);

/**
 * Reads a column name up to its closing ], undoing the apostrophe escapes.
 * Spaces at either end belong to the bracket, not to the name (Microsoft,
 * [MS-OE376] 3.2.3.1.1 "Structure References": a simple column name starts
 * and ends with a character other than a space).
 */
function readColumnName(text: string, start: number, inner: boolean): { name: string; end: number } {
  let name = "";
  let i = start;
  for (;;) {
    if (i >= text.length) throw new FormulaSyntaxError("A table column reference is not closed with ].");
    const ch = text[i];
    if (ch === "]") break;
    if (ch === "'") {
      const next = text[i + 1];
      if (next === undefined || !ESCAPABLE.has(next))
        throw new FormulaSyntaxError("In a column name an apostrophe must be followed by [, ], # or ' (the escape).");
      name += next;
      i += 2;
      continue;
    }
    if (ch === "[") throw new FormulaSyntaxError("A [ inside a column name needs the escape '[.");
    if (ch === "#")
      throw new FormulaSyntaxError("A # inside a column name needs the escape '#; the demo sheet reads no items such as [#All].");
    if (!inner && NEEDS_INNER_BRACKETS.has(ch)) {
      throw new FormulaSyntaxError(
        `The column name holds "${ch}", so Excel needs it in a second pair of brackets, as in Table1[[Temp. °C]].`,
      );
    }
    name += ch;
    i++;
  }
  const trimmed = name.replace(/^ +| +$/g, "");
  if (trimmed === "") throw new FormulaSyntaxError("A table column reference names no column.");
  return { name: trimmed, end: i };
}

/**
 * Reads the bracketed part after a table name: Table1[Name] or
 * Table1[[Name]], one optional space inside the outer brackets (Microsoft,
 * "Using structured references with Excel tables": spaces for readability).
 * Column ranges and lists ([[A]:[B]], [[#Headers],[A]]) are not read.
 */
function readColumn(text: string, open: number): { column: string; end: number } {
  let i = open + 1;
  if (text[i] === " ") i++;
  const inner = text[i] === "[";
  const read = readColumnName(text, inner ? i + 1 : i, inner);
  i = read.end + 1;
  if (inner) {
    if (text[i] === " ") i++;
    if (text[i] !== "]") throw new FormulaSyntaxError("The demo sheet reads one table column per reference, closed with ]].");
    i++;
  }
  return { column: read.name, end: i };
}

/**
 * Characters of a text constant inside a formula. Excel refuses longer ones
 * ("Text values in formulas are limited to 255 characters", its message when
 * one is entered, from memory); the file format stores a formula's string
 * constant with a count of at most 255 (Microsoft, [MS-XLS] 2.5.198.91 PtgStr).
 */
const MAX_TEXT_CONSTANT = 255;

function readString(text: string, start: number): { value: string; end: number } {
  let i = start + 1;
  let value = "";
  for (;;) {
    if (i >= text.length) throw new FormulaSyntaxError("A text in quotes is not closed.");
    if (text[i] === '"') {
      if (text[i + 1] === '"') {
        value += '"';
        i += 2;
        continue;
      }
      if (value.length > MAX_TEXT_CONSTANT) {
        throw new FormulaSyntaxError(`A text in quotes holds at most 255 characters in a formula; this one has ${value.length}.`);
      }
      return { value, end: i + 1 };
    }
    value += text[i];
    i++;
  }
}

const ARRAY_NUMBER = /^-?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?/;

/**
 * Reads an array constant from its "{" to its "}": commas separate the
 * columns, semicolons the rows (the English syntax Range.formulas uses).
 * Microsoft, "Use array constants in array formulas": an array constant holds
 * numbers, text, logicals and error values; it cannot hold cell references,
 * formulas, functions or other arrays, and numbers cannot carry $, %, commas
 * or parentheses; every row has as many values as the first. Error values
 * are refused here too, which is stricter than Excel: the demo sheet has no
 * use for them.
 */
function readArray(text: string, start: number): { rows: ArrayElement[][]; end: number } {
  const rows: ArrayElement[][] = [[]];
  let i = start + 1;
  const skipSpaces = (): void => {
    while (text[i] === " ") i++;
  };
  for (;;) {
    skipSpaces();
    const rest = text.slice(i);
    const number = ARRAY_NUMBER.exec(rest);
    let element: ArrayElement;
    if (text[i] === '"') {
      const s = readString(text, i);
      element = s.value;
      i = s.end;
    } else if (number) {
      element = Number(number[0]);
      i += number[0].length;
    } else if (/^(TRUE|FALSE)(?![A-Za-z0-9_.(])/i.test(rest)) {
      element = rest.slice(0, 4).toUpperCase() === "TRUE";
      i += element ? 4 : 5;
    } else {
      throw new FormulaSyntaxError(
        "An array constant holds only numbers, texts in quotes and TRUE or FALSE: no references, functions or other arrays.",
      );
    }
    rows[rows.length - 1].push(element);
    skipSpaces();
    const separator = text[i];
    i++;
    if (separator === ",") continue;
    if (separator === ";") {
      rows.push([]);
      continue;
    }
    if (separator === "}") break;
    throw new FormulaSyntaxError(
      separator === undefined
        ? "An array constant is not closed with }."
        : `The character "${separator}" cannot stand in an array constant.`,
    );
  }
  if (rows.some((row) => row.length !== rows[0].length))
    throw new FormulaSyntaxError("Every row of an array constant must have as many values.");
  return { rows, end: i };
}

/**
 * Tokens of a formula body (the text after "=").
 *
 * @example
 * tokenize('INDEX(EVENSPLIT.COUNTS(Table1[Thickness],50),1,3)').map((t) => t.type);
 * // ["name","paren","name","paren","table","comma","number","paren","comma","number","comma","number","paren"]
 */
export function tokenize(formula: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < formula.length) {
    const ch = formula[i];
    if (ch === " " || ch === "\n" || ch === "\t") {
      i++;
      continue;
    }
    const rest = formula.slice(i);
    if (ch === '"') {
      const s = readString(formula, i);
      tokens.push({ type: "string", value: s.value });
      i = s.end;
      continue;
    }
    if (ch === "{") {
      const array = readArray(formula, i);
      tokens.push({ type: "array", rows: array.rows });
      i = array.end;
      continue;
    }
    const reference = REFERENCE.exec(rest);
    if (reference) {
      tokens.push({ type: "ref", text: reference[0] });
      i += reference[0].length;
      continue;
    }
    if (ch === "'") {
      throw new FormulaSyntaxError("A quoted sheet name must be followed by ! and a cell reference.");
    }
    const number = NUMBER.exec(rest);
    if (number && /[0-9.]/.test(ch)) {
      tokens.push({ type: "number", value: Number(number[0]) });
      i += number[0].length;
      continue;
    }
    const name = NAME.exec(rest);
    if (name) {
      const end = i + name[0].length;
      if (formula[end] === "[") {
        const column = readColumn(formula, end);
        tokens.push({ type: "table", table: name[0], column: column.column });
        i = column.end;
      } else {
        tokens.push({ type: "name", text: name[0] });
        i = end;
      }
      continue;
    }
    if (ch === "(" || ch === ")") {
      tokens.push({ type: "paren", text: ch });
      i++;
      continue;
    }
    if (ch === ",") {
      tokens.push({ type: "comma" });
      i++;
      continue;
    }
    const op = OPERATORS.find((o) => rest.startsWith(o));
    if (op) {
      tokens.push({ type: "op", text: op });
      i += op.length;
      continue;
    }
    throw new FormulaSyntaxError(`The character "${ch}" cannot be read here.`);
  }
  return tokens;
}
