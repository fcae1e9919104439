/**
 * Parses formula tokens into an expression tree.
 *
 * Method: recursive descent with the spreadsheet's operator precedence, from
 * loosest to tightest: comparison (= <> < > <= >=), concatenation (&),
 * addition (+ -), multiplication (* /), power (^), prefix sign (- +), postfix
 * percent (%) — as in Excel's documented "operator precedence" table (common
 * practice). An empty argument ("f(a,,b)") is kept as a missing argument,
 * which the sheet passes to custom functions as null. A FormulaSyntaxError
 * means Excel would refuse the formula text itself; a name it does not know
 * is kept and shows #NAME? when evaluated.
 *
 * Cost: O(number of tokens).
 */
import { FormulaSyntaxError, tokenize, type ArrayElement, type Token } from "./tokenize";

export type Expression =
  | { readonly type: "number"; readonly value: number }
  | { readonly type: "string"; readonly value: string }
  | { readonly type: "boolean"; readonly value: boolean }
  | { readonly type: "ref"; readonly text: string }
  | { readonly type: "array"; readonly rows: readonly (readonly ArrayElement[])[] }
  | { readonly type: "table"; readonly table: string; readonly column: string }
  | { readonly type: "missing" }
  | { readonly type: "unknownName"; readonly text: string }
  | { readonly type: "call"; readonly name: string; readonly args: readonly Expression[] }
  | { readonly type: "unary"; readonly op: "-" | "+"; readonly operand: Expression }
  | { readonly type: "percent"; readonly operand: Expression }
  | { readonly type: "binary"; readonly op: string; readonly left: Expression; readonly right: Expression };

const LEVELS: readonly (readonly string[])[] = [["=", "<>", "<", ">", "<=", ">="], ["&"], ["+", "-"], ["*", "/"], ["^"]];

/**
 * Limits Excel puts on a formula (Microsoft, "Excel specifications and
 * limits": arguments in a function 255, nested levels of functions 64); a
 * formula beyond them is refused.
 */
const MAX_ARGUMENTS = 255;
const MAX_NESTED_CALLS = 64;

class Parser {
  private position = 0;
  private calls = 0;
  constructor(private readonly tokens: readonly Token[]) {}

  parseAll(): Expression {
    const expression = this.binary(0);
    if (this.position < this.tokens.length) throw new FormulaSyntaxError("The formula has something left over at its end.");
    return expression;
  }

  private peek(): Token | undefined {
    return this.tokens[this.position];
  }

  private binary(level: number): Expression {
    if (level === LEVELS.length) return this.prefix();
    let left = this.binary(level + 1);
    for (;;) {
      const token = this.peek();
      if (token?.type !== "op" || !LEVELS[level].includes(token.text)) return left;
      this.position++;
      // Power associates to the left in the spreadsheet, like the others.
      const right = this.binary(level + 1);
      left = { type: "binary", op: token.text, left, right };
    }
  }

  private prefix(): Expression {
    const token = this.peek();
    if (token?.type === "op" && (token.text === "-" || token.text === "+")) {
      this.position++;
      return { type: "unary", op: token.text, operand: this.prefix() };
    }
    return this.postfix();
  }

  private postfix(): Expression {
    let expression = this.primary();
    while (this.peek()?.type === "op" && (this.peek() as { text: string }).text === "%") {
      this.position++;
      expression = { type: "percent", operand: expression };
    }
    return expression;
  }

  private primary(): Expression {
    const token = this.peek();
    if (token === undefined) throw new FormulaSyntaxError("The formula ends too early.");
    this.position++;
    switch (token.type) {
      case "number":
        return { type: "number", value: token.value };
      case "string":
        return { type: "string", value: token.value };
      case "ref":
        return { type: "ref", text: token.text };
      case "array":
        return { type: "array", rows: token.rows };
      case "table":
        return { type: "table", table: token.table, column: token.column };
      case "name": {
        if (this.peek()?.type === "paren" && (this.peek() as { text: string }).text === "(") {
          this.position++;
          if (++this.calls > MAX_NESTED_CALLS) throw new FormulaSyntaxError("Excel nests functions at most 64 levels deep.");
          const args = this.argumentsUntilClose();
          this.calls--;
          if (args.length > MAX_ARGUMENTS)
            throw new FormulaSyntaxError(`A function takes at most 255 arguments; ${token.text} has ${args.length}.`);
          return { type: "call", name: token.text.toUpperCase(), args };
        }
        const upper = token.text.toUpperCase();
        if (upper === "TRUE" || upper === "FALSE") return { type: "boolean", value: upper === "TRUE" };
        // Excel takes a formula with an undefined name and shows #NAME? in the cell; it is not a syntax error.
        return { type: "unknownName", text: token.text };
      }
      case "paren": {
        if (token.text === ")") throw new FormulaSyntaxError("A closing bracket has no opening one.");
        const inner = this.binary(0);
        this.expectClose();
        return inner;
      }
      default:
        throw new FormulaSyntaxError("An operator or comma stands where a value is expected.");
    }
  }

  private expectClose(): void {
    const token = this.peek();
    if (token?.type !== "paren" || token.text !== ")") throw new FormulaSyntaxError("A bracket is not closed.");
    this.position++;
  }

  private argumentsUntilClose(): Expression[] {
    const args: Expression[] = [];
    const closing = (): boolean => this.peek()?.type === "paren" && (this.peek() as { text: string }).text === ")";
    if (closing()) {
      this.position++;
      return args;
    }
    for (;;) {
      args.push(this.peek()?.type === "comma" || closing() ? { type: "missing" } : this.binary(0));
      if (this.peek()?.type === "comma") {
        this.position++;
        continue;
      }
      this.expectClose();
      return args;
    }
  }
}

/**
 * The expression tree of a formula body (the text after "=").
 *
 * @example
 * parseFormula("IF(A1<=0.05,\"yes\",\"no\")");
 * // { type: "call", name: "IF", args: [{ type: "binary", op: "<=", ... }, { type: "string", value: "yes" }, ...] }
 */
export function parseFormula(body: string): Expression {
  return new Parser(tokenize(body)).parseAll();
}
