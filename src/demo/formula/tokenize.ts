/**
 * Splits the text of a formula (after its "=") into tokens: numbers, strings,
 * cell and range references (optional sheet prefix, `$` signs, whole
 * columns), structured table references (Table[Column]), names, operators.
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
  | { readonly type: "comma" };

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

/** Reads a bracketed column specifier, unescaping the apostrophe escapes; returns the column and the end index. */
function readColumn(text: string, open: number): { column: string; end: number } {
  let i = open + 1;
  const doubled = text[i] === "[";
  if (doubled) i++;
  let column = "";
  while (i < text.length && text[i] !== "]") {
    if (text[i] === "'" && i + 1 < text.length) i++;
    column += text[i];
    i++;
  }
  if (i >= text.length) throw new FormulaSyntaxError("A table column reference is not closed with ].");
  i++;
  if (doubled) {
    if (text[i] !== "]") throw new FormulaSyntaxError("A table column reference is not closed with ]].");
    i++;
  }
  return { column, end: i };
}

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
      return { value, end: i + 1 };
    }
    value += text[i];
    i++;
  }
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
