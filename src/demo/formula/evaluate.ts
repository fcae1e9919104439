/**
 * Evaluates an expression tree for one cell of the demo sheet: references,
 * array constants, the few built-in functions the result block, its chart's
 * helper cells and the installation check use (INDEX, ROWS, COLUMNS, COUNT,
 * COUNTA, IF, ABS, IFERROR, COUNTIF, MEDIAN, NA; MATCH exact only; INDEX with row 0 on a returned array), arithmetic, comparison, concatenation, and the
 * EVENSPLIT.* functions taken from the real cell-function bundle.
 *
 * Method: a direct tree walk. Values follow the spreadsheet's coercions
 * (common practice, as Excel documents them): a blank is 0 in arithmetic and
 * "" in text; comparisons order numbers < text < logicals, text without
 * regard to case; the first error met is the result. Custom functions get
 * their arguments as Office JavaScript custom functions do: a range as a
 * matrix of values with "" for blank cells, an omitted argument as null.
 *
 * Cost: O(size of the tree + cells read).
 */
import { formatAddress, parseAddress, rectSize } from "../../taskpane/a1";
import type { Expression } from "./parse";
import {
  errorValue,
  isError,
  isMatrix,
  isReference,
  type ErrorValue,
  type MatrixValue,
  type ReferenceValue,
  type Scalar,
  type Value,
} from "./values";

/** How a custom function wants an argument: a matrix (a range) or a single value. */
export type ArgumentShape = "matrix" | "scalar";

export interface CustomFunction {
  readonly fn: (...args: unknown[]) => unknown;
  /** Per argument position; positions past the end are taken as single values. */
  readonly shapes: readonly ArgumentShape[];
  /** The answer's shape as the metadata declares it. */
  readonly result: ArgumentShape;
  /**
   * True when the metadata asks for the arguments' addresses (requiresParameterAddresses): the call
   * then ends with an invocation object holding them, as Excel makes it (see `invocationFor`).
   */
  readonly parameterAddresses?: boolean;
}

/** What the evaluator needs from the workbook. */
export interface EvaluationContext {
  /** Sheet of the cell being calculated: references without a sheet prefix point here. */
  readonly sheet: string;
  /**
   * True to hand custom functions the blank cells of a range as 0, as some
   * Excel builds do (OfficeDev/office-js issues 5262 and 1951), instead of "".
   */
  readonly blanksAsZeros: boolean;
  /** True when the workbook has a sheet of this name (any case). */
  hasSheet(name: string): boolean;
  /** Values of a reference, row by row (null for blank cells). */
  read(reference: ReferenceValue): Scalar[][];
  /** The data-body cells of a table column, or an error when there is no such table or column. */
  tableColumn(table: string, column: string): ReferenceValue | ErrorValue;
  /** A function of the add-in's namespace by id ("PVALUE"), or undefined. */
  customFunction(id: string): CustomFunction | undefined;
  /** The cells a defined name refers to (any case), or undefined when the workbook has no such name. */
  definedName(name: string): ReferenceValue | undefined;
}

const NAMESPACE = "EVENSPLIT.";

function single(value: Value, context: EvaluationContext): Scalar {
  if (isReference(value)) {
    const { rows, columns } = rectSize(value.rect);
    if (rows !== 1 || columns !== 1) return errorValue("#VALUE!", "A range of several cells stands where one value is expected.");
    return context.read(value)[0][0];
  }
  if (isMatrix(value)) {
    if (value.rows.length !== 1 || value.rows[0].length !== 1)
      return errorValue("#VALUE!", "A list of values stands where one value is expected.");
    return value.rows[0][0];
  }
  return value;
}

function toNumber(value: Scalar): number | ErrorValue {
  if (isError(value)) return value;
  if (value === null) return 0;
  if (typeof value === "number") return value;
  if (typeof value === "boolean") return value ? 1 : 0;
  const trimmed = value.trim();
  const parsed = trimmed === "" ? NaN : Number(trimmed);
  return Number.isFinite(parsed) ? parsed : errorValue("#VALUE!", `The text "${value}" is not a number.`);
}

function toText(value: Scalar): string | ErrorValue {
  if (isError(value)) return value;
  if (value === null) return "";
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  return String(value);
}

/** Smallest positive number a cell holds (Microsoft, "Excel specifications and limits": 2.2251E-308). */
const SMALLEST_CELL_NUMBER = 2.2251e-308;

/**
 * A number as a cell holds it: infinities and NaN are #NUM!, and a magnitude
 * below the smallest a cell holds becomes 0 (the flush to zero is from
 * memory; the page gives only the limit). So a tiny p-value shows here as it
 * would in Excel, not with digits Excel cannot keep.
 */
function finite(x: number): number | ErrorValue {
  if (!Number.isFinite(x)) return errorValue("#NUM!", "The result is too large or not a number.");
  return Math.abs(x) < SMALLEST_CELL_NUMBER ? 0 : x;
}

function typeRank(value: number | string | boolean): number {
  return typeof value === "number" ? 0 : typeof value === "string" ? 1 : 2;
}

function compare(op: string, a: Scalar, b: Scalar): boolean | ErrorValue {
  if (isError(a)) return a;
  if (isError(b)) return b;
  const blankAs = (other: Scalar): number | string | boolean => (typeof other === "string" ? "" : typeof other === "boolean" ? false : 0);
  const left = a === null ? blankAs(b) : a;
  const right = b === null ? blankAs(a) : b;
  let order: number;
  if (typeRank(left) !== typeRank(right)) order = typeRank(left) - typeRank(right);
  else if (typeof left === "string") order = left.toLowerCase().localeCompare((right as string).toLowerCase());
  else order = Number(left) - Number(right);
  switch (op) {
    case "=":
      return order === 0;
    case "<>":
      return order !== 0;
    case "<":
      return order < 0;
    case ">":
      return order > 0;
    case "<=":
      return order <= 0;
    default:
      return order >= 0;
  }
}

function arithmetic(op: string, a: Scalar, b: Scalar): Scalar {
  const x = toNumber(a);
  if (isError(x)) return x;
  const y = toNumber(b);
  if (isError(y)) return y;
  switch (op) {
    case "+":
      return finite(x + y);
    case "-":
      return finite(x - y);
    case "*":
      return finite(x * y);
    case "/":
      return y === 0 ? errorValue("#DIV/0!", "Division by zero.") : finite(x / y);
    default:
      return finite(Math.pow(x, y));
  }
}

function binary(op: string, left: Value, right: Value, context: EvaluationContext): Scalar {
  const a = single(left, context);
  const b = single(right, context);
  if (op === "&") {
    const s = toText(a);
    if (isError(s)) return s;
    const t = toText(b);
    return isError(t) ? t : s + t;
  }
  if (["=", "<>", "<", ">", "<=", ">="].includes(op)) return compare(op, a, b);
  return arithmetic(op, a, b);
}

function cellsOf(value: Value, context: EvaluationContext): Scalar[][] {
  if (isReference(value)) return context.read(value);
  if (isMatrix(value)) return value.rows.map((r) => [...r]);
  return [[value]];
}

function dimensions(value: Value): { rows: number; columns: number } {
  if (isReference(value)) return rectSize(value.rect);
  if (isMatrix(value)) return { rows: value.rows.length, columns: value.rows[0]?.length ?? 0 };
  return { rows: 1, columns: 1 };
}

function firstError(cells: readonly (readonly Scalar[])[]): ErrorValue | undefined {
  for (const row of cells) for (const cell of row) if (isError(cell)) return cell;
  return undefined;
}

function whole(x: Scalar, what: string): number | ErrorValue {
  const n = toNumber(x);
  if (isError(n)) return n;
  return Number.isInteger(n) && n >= 1 ? n : errorValue("#VALUE!", `INDEX needs a ${what} number of 1 or more.`);
}

function index(args: Value[], context: EvaluationContext): Value {
  if (args.length < 2 || args.length > 3) return errorValue("#VALUE!", "INDEX takes an array, a row and a column.");
  const array = args[0];
  if (isError(array)) return array;
  if (args.length === 3 && isMatrix(array) && toNumber(single(args[1], context)) === 0) return wholeColumn(array, single(args[2], context));
  const row = whole(single(args[1], context), "row");
  if (isError(row)) return row;
  const column = args.length === 3 ? whole(single(args[2], context), "column") : 1;
  if (isError(column)) return column;
  const size = dimensions(array);
  if (row > size.rows || column > size.columns) return errorValue("#REF!", "INDEX points outside the array.");
  if (isReference(array)) {
    const cell = { top: array.rect.top + row - 1, left: array.rect.left + column - 1 };
    return { kind: "reference", sheet: array.sheet, rect: { ...cell, bottom: cell.top, right: cell.left } };
  }
  return isMatrix(array) ? array.rows[row - 1][column - 1] : array;
}

/**
 * INDEX(array, 0, column) on an array a function returned: the whole column, as Microsoft's "INDEX function"
 * page describes for a row number of 0. (Only this form: the demo's blocks use it to look a label up.)
 */
function wholeColumn(array: MatrixValue, columnArgument: Scalar): Value {
  const column = whole(columnArgument, "column");
  if (isError(column)) return column;
  if (column > dimensions(array).columns) return errorValue("#REF!", "INDEX points outside the array.");
  return { kind: "matrix", rows: array.rows.map((r) => [r[column - 1]]) };
}

/**
 * MATCH(lookup_value, lookup_array, 0) as Microsoft's "MATCH function" page describes the exact form: the
 * 1-based position of the first value equal to lookup_value (text compared without regard to case), #N/A
 * when none is; the lookup array must be one row or one column. The sorted forms (match_type 1, the
 * default, and -1) are beyond the demo and refused, so the demo never answers where Excel might not.
 */
function match(args: Value[], context: EvaluationContext): Value {
  if (args.length !== 3 || toNumber(single(args[2], context)) !== 0) {
    return errorValue("#VALUE!", "The demo sheet's MATCH finds exact matches only: give 0 as the third argument.");
  }
  const wanted = single(args[0], context);
  if (isError(wanted)) return wanted;
  const cells = cellsOf(args[1], context);
  const size = { rows: cells.length, columns: cells[0]?.length ?? 0 };
  if (size.rows !== 1 && size.columns !== 1) return errorValue("#N/A", "MATCH looks along one row or one column.");
  const line = size.columns === 1 ? cells.map((r) => r[0]) : cells[0];
  const same = (cell: Scalar): boolean =>
    typeof wanted === "string" ? typeof cell === "string" && cell.toLowerCase() === wanted.toLowerCase() : cell === wanted;
  const at = line.findIndex(same);
  return at < 0 ? errorValue("#N/A", "MATCH found no value equal to the one looked up.") : at + 1;
}

function count(args: Value[], context: EvaluationContext, counts: (cell: Scalar) => boolean): number {
  let total = 0;
  for (const arg of args) for (const row of cellsOf(arg, context)) for (const cell of row) if (counts(cell)) total++;
  return total;
}

/**
 * MEDIAN over ranges and values as Microsoft's "MEDIAN function" page describes it: text, logical values and
 * empty cells inside a range are ignored, an error met is the answer, and with no number at all the answer is
 * #NUM!; an even count gives the mean of the two middle numbers.
 */
function median(args: Value[], context: EvaluationContext): Value {
  const numbers: number[] = [];
  for (const arg of args) {
    const cells = cellsOf(arg, context);
    const error = firstError(cells);
    if (error) return error;
    for (const row of cells) for (const cell of row) if (typeof cell === "number") numbers.push(cell);
  }
  if (numbers.length === 0) return errorValue("#NUM!", "MEDIAN found no number.");
  numbers.sort((a, b) => a - b);
  const middle = numbers.length >> 1;
  return numbers.length % 2 === 1 ? numbers[middle] : (numbers[middle - 1] + numbers[middle]) / 2;
}

function truth(value: Scalar): boolean | ErrorValue {
  if (isError(value)) return value;
  if (typeof value === "boolean") return value;
  if (value === null) return false;
  if (typeof value === "number") return value !== 0;
  const upper = value.toUpperCase();
  if (upper === "TRUE" || upper === "FALSE") return upper === "TRUE";
  return errorValue("#VALUE!", `IF needs TRUE or FALSE, not the text "${value}".`);
}

/**
 * COUNTIF with a plain criterion: a number counts the cells holding that number, a text the cells holding
 * that text in any case (Microsoft, "COUNTIF function"). A text criterion with an operator in front or a
 * wildcard (* ? ~) is answered with #VALUE!, which is stricter than Excel: the demo sheet does not read them.
 */
function countIf(args: Value[], context: EvaluationContext): Value {
  if (args.length !== 2) return errorValue("#VALUE!", "COUNTIF takes a range and a criterion.");
  if (!isReference(args[0])) return errorValue("#VALUE!", "COUNTIF needs a range of cells as its first argument.");
  const criterion = single(args[1], context);
  if (isError(criterion)) return criterion;
  if (typeof criterion === "string" && /^[<>=]|[*?~]/.test(criterion)) {
    return errorValue("#VALUE!", "The demo sheet's COUNTIF reads plain values only, without operators or wildcards.");
  }
  const wanted = criterion === null ? 0 : criterion;
  return count([args[0]], context, (cell) =>
    typeof wanted === "string" ? typeof cell === "string" && cell.toLowerCase() === wanted.toLowerCase() : cell === wanted,
  );
}

function builtIn(name: string, args: Value[], context: EvaluationContext): Value {
  switch (name) {
    case "ABS": {
      if (args.length !== 1) return errorValue("#VALUE!", "ABS takes one number.");
      const x = toNumber(single(args[0], context));
      return isError(x) ? x : Math.abs(x);
    }
    case "IFERROR": {
      if (args.length !== 2) return errorValue("#VALUE!", "IFERROR takes a value and the value to show for an error.");
      const size = dimensions(args[0]);
      if (size.rows !== 1 || size.columns !== 1) return errorValue("#VALUE!", "The demo sheet's IFERROR looks at one value.");
      return isError(single(args[0], context)) ? args[1] : args[0];
    }
    case "COUNTIF":
      return countIf(args, context);
    case "INDEX":
      return index(args, context);
    case "MATCH":
      return match(args, context);
    case "ROWS":
    case "COLUMNS": {
      if (args.length !== 1) return errorValue("#VALUE!", `${name} takes one range.`);
      if (isError(args[0])) return args[0];
      const size = dimensions(args[0]);
      return name === "ROWS" ? size.rows : size.columns;
    }
    case "COUNT":
      return count(args, context, (cell) => typeof cell === "number");
    case "COUNTA":
      return count(args, context, (cell) => cell !== null);
    case "MEDIAN":
      return median(args, context);
    case "IF": {
      if (args.length < 2 || args.length > 3) return errorValue("#VALUE!", "IF takes a condition and one or two results.");
      const condition = truth(single(args[0], context));
      if (isError(condition)) return condition;
      if (condition) return args[1];
      return args.length === 3 ? args[2] : false;
    }
    case "NA":
      // Microsoft, "NA function": no arguments, and the answer is the #N/A error value.
      return args.length === 0
        ? errorValue("#N/A", "NA() marks a value as not available.")
        : errorValue("#VALUE!", "NA takes no arguments.");
    default:
      return errorValue("#NAME?", `The demo sheet does not know the function ${name}.`);
  }
}

/**
 * A custom function's answer as a sheet value: numbers, text, logicals,
 * one-row or larger matrices, error objects. A null inside a returned array
 * shows as 0, not as a blank: the behaviour Microsoft confirmed as by design
 * in the office-js tracker (OfficeDev/office-js issue 1503, "Excel custom
 * function: null is converted to 0 when returning an array"), so a function
 * that means "empty" must answer "".
 */
function fromCustom(result: unknown): Value {
  if (typeof result === "number") return finite(result);
  if (typeof result === "string" || typeof result === "boolean") return result;
  if (Array.isArray(result)) {
    const rows = result.map((row: unknown) =>
      (Array.isArray(row) ? row : [row]).map((cell: unknown) => fromCustom(cell === null ? 0 : cell)),
    );
    if (rows.some((row) => row.some((cell) => typeof cell === "object" && cell !== null && !isError(cell)))) {
      return errorValue("#VALUE!", "The function answered with nested lists.");
    }
    return { kind: "matrix", rows: rows as Scalar[][] };
  }
  if (typeof result === "object" && result !== null && typeof (result as { code?: unknown }).code === "string") {
    const error = result as { code: string; message?: string };
    return errorValue(error.code, error.message ?? "");
  }
  return errorValue("#VALUE!", "The function gave no usable answer.");
}

/**
 * The value a custom function receives for one argument, or the error that
 * stops the call: Excel does not run a custom function whose argument (a
 * range included) holds an error unless its metadata sets
 * allowErrorForDataTypeAny (Microsoft, "Handle and return errors from your
 * custom function", errors as custom function inputs). Evensplit's
 * functions.json does not set it, so the first error met is the cell's answer.
 */
function customArgument(value: Value, shape: ArgumentShape, context: EvaluationContext): unknown {
  if (shape === "matrix") {
    const cells = cellsOf(value, context);
    const blank = context.blanksAsZeros ? 0 : "";
    return firstError(cells) ?? cells.map((row) => row.map((cell) => (cell === null ? blank : cell)));
  }
  // A blank cell given for a single value arrives as 0 in desktop Excel (null on the web: OfficeDev/office-js
  // issue 4702). The harsher of the two is passed, so that a blank never quietly means "the default" here.
  const one = single(value, context);
  return one === null ? 0 : one;
}

/**
 * The answer checked against the shape the metadata declares: a list from a
 * function declared to answer one value, or one value from a function
 * declared to answer a matrix, is #VALUE! (Microsoft, "Manually create JSON
 * metadata for custom functions": result dimensionality; what Excel shows for
 * a mismatch is from memory). An error answers for either shape.
 */
function declared(value: Value, shape: ArgumentShape): Value {
  if (isError(value)) return value;
  if (shape === "scalar" && isMatrix(value))
    return errorValue("#VALUE!", "The function is declared to answer one value but answered a list.");
  if (shape === "matrix" && !isMatrix(value))
    return errorValue("#VALUE!", "The function is declared to answer a list but answered one value.");
  return value;
}

/**
 * The invocation argument for a function whose metadata asks for parameter addresses. Excel passes an
 * invocation object as the last argument, after every declared parameter (an omitted one as null), and
 * fills its parameterAddresses with one address per parameter in the form SheetName!A1 (Microsoft, "Custom
 * functions parameter options": Invocation parameter, Detect the address of a parameter; "CustomFunctions.Invocation
 * interface": parameterAddresses). The page does not say what stands for an argument that is no reference (a
 * number, an omitted one); the stand-in gives empty text there, which tells a function no more than Excel could.
 */
function invocationFor(custom: CustomFunction, passed: unknown[], addresses: string[]): unknown[] {
  while (passed.length < custom.shapes.length) passed.push(null);
  while (addresses.length < custom.shapes.length) addresses.push("");
  return [...passed, { parameterAddresses: addresses }];
}

function callCustom(id: string, args: readonly Expression[], context: EvaluationContext): Value {
  const custom = context.customFunction(id);
  if (custom === undefined) return errorValue("#NAME?", `There is no function ${NAMESPACE}${id}.`);
  const passed: unknown[] = [];
  const addresses: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg.type === "missing") {
      passed.push(null);
      addresses.push("");
      continue;
    }
    const evaluated = evaluate(arg, context);
    addresses.push(isReference(evaluated) ? formatAddress(evaluated.rect, evaluated.sheet) : "");
    const value = customArgument(evaluated, custom.shapes[i] ?? "scalar", context);
    if (isError(value)) return value;
    passed.push(value);
  }
  try {
    const call = custom.parameterAddresses === true ? invocationFor(custom, passed, addresses) : passed;
    return declared(fromCustom(custom.fn(...call)), custom.result);
  } catch (thrown) {
    return fromCustom(typeof thrown === "object" && thrown !== null && "code" in thrown ? thrown : undefined);
  }
}

function reference(text: string, context: EvaluationContext): ReferenceValue | ErrorValue {
  const parsed = parseAddress(text);
  if (!parsed) return errorValue("#REF!", `${text} is not a reference.`);
  const { sheet = context.sheet, ...rect } = parsed;
  // A reference to a sheet that is not there is #REF!, as Excel shows it once the sheet is gone.
  if (!context.hasSheet(sheet)) return errorValue("#REF!", `There is no sheet named ${sheet}.`);
  return { kind: "reference", sheet, rect };
}

/**
 * The value of an expression in the context of one cell. References stay
 * references (so ROWS and INDEX need not read them); the caller turns the
 * final value into what the cell shows.
 *
 * @example
 * evaluate(parseFormula("ROWS(A2:A26)*COLUMNS(A2:A26)"), context); // 25
 */
export function evaluate(expression: Expression, context: EvaluationContext): Value {
  switch (expression.type) {
    case "number":
    case "string":
    case "boolean":
      return expression.value;
    case "missing":
      return null;
    case "unknownName":
      // A defined name stands for its cells; any other name is #NAME? (Microsoft, "Define and use names in formulas").
      return context.definedName(expression.text) ?? errorValue("#NAME?", `The name "${expression.text}" is not known.`);
    case "ref":
      return reference(expression.text, context);
    case "array":
      return { kind: "matrix", rows: expression.rows };
    case "table":
      return context.tableColumn(expression.table, expression.column);
    case "unary": {
      const operand = toNumber(single(evaluate(expression.operand, context), context));
      return isError(operand) || expression.op === "+" ? operand : -operand;
    }
    case "percent": {
      const operand = toNumber(single(evaluate(expression.operand, context), context));
      return isError(operand) ? operand : operand / 100;
    }
    case "binary":
      return binary(expression.op, evaluate(expression.left, context), evaluate(expression.right, context), context);
    case "call":
      if (expression.name.startsWith(NAMESPACE)) return callCustom(expression.name.slice(NAMESPACE.length), expression.args, context);
      return builtIn(
        expression.name,
        expression.args.map((arg) => evaluate(arg, context)),
        context,
      );
  }
}
