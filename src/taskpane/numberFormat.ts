/**
 * Shows a cell value under an Excel number format, for the part of the
 * format language the result block and the demo data use: General, fixed
 * decimals ("0", "0.0000"), percentages ("0.00%"), scientific ("0.00E+00"),
 * thousands separators ("#,##0"), the text format "@", sections separated by
 * ";", leading conditions such as "[<0.0001]" on the first two sections, and quoted literals.
 *
 * Method: the section rules of Excel's custom number formats (Microsoft,
 * "Review guidelines for customizing a number format"; common practice): with
 * a condition, the first section applies when it holds and the second
 * otherwise; without one, the sections are positive; negative; zero; text.
 * General shows at most 11 characters, as in a standard-width column.
 *
 * Cost: O(length of the format).
 */

const GENERAL_WIDTH = 11;

function generalNumber(x: number): string {
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  if (Number.isInteger(x) && magnitude < 1e11) return String(x);
  if (magnitude >= 1e11 || magnitude < 1e-9) {
    const [mantissa, exponent] = x.toExponential(5).split("e");
    const trimmed = mantissa.replace(/\.?0+$/, "");
    const power = Number(exponent);
    return `${trimmed}E${power < 0 ? "-" : "+"}${String(Math.abs(power)).padStart(2, "0")}`;
  }
  const integerDigits = Math.max(1, Math.floor(Math.log10(magnitude)) + 1);
  const decimals = Math.max(0, GENERAL_WIDTH - (x < 0 ? 1 : 0) - integerDigits - 1);
  return x
    .toFixed(Math.min(decimals, 20))
    .replace(/(\.\d*?)0+$/, "$1")
    .replace(/\.$/, "");
}

function splitSections(format: string): string[] {
  const sections: string[] = [];
  let current = "";
  let quoted = false;
  for (const ch of format) {
    if (ch === '"') quoted = !quoted;
    if (ch === ";" && !quoted) {
      sections.push(current);
      current = "";
    } else current += ch;
  }
  sections.push(current);
  return sections;
}

const CONDITION = /^\[(<=|>=|<>|<|>|=)(-?[0-9.]+(?:[eE][+-]?[0-9]+)?)\]/;

function holds(op: string, x: number, bound: number): boolean {
  switch (op) {
    case "<":
      return x < bound;
    case "<=":
      return x <= bound;
    case ">":
      return x > bound;
    case ">=":
      return x >= bound;
    case "=":
      return x === bound;
    default:
      return x !== bound;
  }
}

const PLACEHOLDERS = "0#?.,%";

/** Splits a section into literal text before and after its number pattern, and the pattern itself. */
function parts(section: string): { prefix: string; pattern: string; suffix: string } {
  let prefix = "";
  let pattern = "";
  let suffix = "";
  const literal = (text: string): void => {
    if (pattern === "") prefix += text;
    else suffix += text;
  };
  let i = 0;
  while (i < section.length) {
    const ch = section[i];
    if (/^general/i.test(section.slice(i))) {
      pattern += "General";
      i += 7;
    } else if (PLACEHOLDERS.includes(ch)) {
      pattern += ch;
      i++;
    } else if ((ch === "E" || ch === "e") && (section[i + 1] === "+" || section[i + 1] === "-") && pattern !== "") {
      pattern += `E${section[i + 1]}`;
      i += 2;
    } else if (ch === '"') {
      const end = section.indexOf('"', i + 1);
      literal(section.slice(i + 1, end < 0 ? section.length : end));
      i = end < 0 ? section.length : end + 1;
    } else if (ch === "\\") {
      literal(section[i + 1] ?? "");
      i += 2;
    } else if (ch === "[") {
      i = section.indexOf("]", i) + 1 || section.length;
    } else {
      literal(ch);
      i++;
    }
  }
  return { prefix, pattern, suffix };
}

function patternNumber(x: number, pattern: string): string {
  if (pattern === "") return "";
  if (/^general$/i.test(pattern)) return generalNumber(x);
  const percent = pattern.includes("%");
  const value = percent ? x * 100 : x;
  const decimals = (/\.([0#]+)/.exec(pattern)?.[1] ?? "").length;
  const scientific = /E[+-]/i.exec(pattern);
  if (scientific) {
    const [mantissa, exponent] = value.toExponential(decimals).split("e");
    const power = Number(exponent);
    return `${mantissa}E${power < 0 ? "-" : "+"}${String(Math.abs(power)).padStart(2, "0")}`;
  }
  let text = value.toFixed(decimals);
  if (pattern.includes(",")) {
    const [whole, fraction] = text.split(".");
    text = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",") + (fraction === undefined ? "" : `.${fraction}`);
  }
  return percent ? `${text}%` : text;
}

/**
 * The text a cell shows for a value under a number format.
 *
 * @example
 * formatCell(0.00001234, "[<0.0001]0.00E+00;0.0000"); // "1.23E-05"
 * formatCell(0.5, "0.00%");                           // "50.00%"
 * formatCell(1 / 3, "General");                       // "0.333333333"
 */
export function formatCell(value: number | string | boolean | null, format: string): string {
  if (value === null) return "";
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  if (typeof value === "string") return value;
  const sections = splitSections(format || "General");
  const condition = CONDITION.exec(sections[0]);
  let section: string;
  let shown = value;
  if (condition) {
    // Up to two conditions: the first section when the first holds, the second when its own condition holds,
    // and the third for every other number (Microsoft, "Review guidelines for customizing a number format").
    const second = CONDITION.exec(sections[1] ?? "");
    if (holds(condition[1], value, Number(condition[2]))) section = sections[0];
    else if (second === null) section = sections[1] ?? "General";
    else section = holds(second[1], value, Number(second[2])) ? sections[1] : (sections[2] ?? "General");
  } else if (value < 0 && sections.length > 1) {
    section = sections[1];
    shown = -value;
  } else if (value === 0 && sections.length > 2) {
    section = sections[2];
  } else {
    section = sections[0];
  }
  if (section.trim() === "@") return generalNumber(value);
  const { prefix, pattern, suffix } = parts(section);
  return prefix + patternNumber(shown, pattern) + suffix;
}
