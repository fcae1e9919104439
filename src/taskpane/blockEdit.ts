/**
 * Editing a block the pane wrote: the block's own formulas are where the
 * workbook keeps what the pane needs. Its defined name (Evensplit_block_N)
 * marks where it is; its title cell names the test; its p-value formula
 * holds the data references, the hypothesised value, the direction, the tie
 * or zero rule and the method; its decision formula holds alpha, its bound
 * formula the confidence level. This module reads them back into a
 * candidate state; the pane accepts it only when the block it would write
 * has exactly the formulas read, so a block from another version, or edited
 * by hand, is never misread.
 *
 * Method: a small scanner of formula arguments (quoted text with doubled
 * quotes, brackets of structured references, nested parentheses).
 *
 * Cost: O(characters of the block's formulas).
 */
import type { BlockTest, ManyGroupMethod, TwoGroupMethod } from "../report/resultBlock";
import type { AdjustMethod, Alternative, SignTestMethod, SignedRankMethod, TieRule, ZeroRule } from "../stats/types";
import type { GroupsKind } from "./paneState";
import type { CellRect } from "./a1";
import type { BlockMark } from "./writePlan";

/** A literal or a reference among a formula's arguments. */
export type FormulaArgument =
  | { readonly kind: "number"; readonly value: number }
  | { readonly kind: "text"; readonly value: string }
  | { readonly kind: "reference"; readonly text: string };

/**
 * The arguments of the first call of `EVENSPLIT.<name>(` in a formula, any name; null when there is none.
 *
 * @example
 * callArguments('=EVENSPLIT.PVALUE($B$2:$B$25,50,"greater")');
 * // { name: "PVALUE", args: [{ kind: "reference", text: "$B$2:$B$25" }, { kind: "number", value: 50 }, { kind: "text", value: "greater" }] }
 */
export function callArguments(formula: string): { name: string; args: FormulaArgument[] } | null {
  const found = /EVENSPLIT\.([A-Z0-9_.]+)\(/i.exec(formula);
  if (!found) return null;
  const args: string[] = [];
  let depth = 0;
  let current = "";
  for (let i = found.index + found[0].length; i < formula.length; i++) {
    const ch = formula[i];
    if (ch === '"') {
      let j = i + 1;
      while (j < formula.length && !(formula[j] === '"' && formula[j + 1] !== '"')) j += formula[j] === '"' ? 2 : 1;
      current += formula.slice(i, j + 1);
      i = j;
      continue;
    }
    if (ch === "(" || ch === "[") depth++;
    if (ch === ")" || ch === "]") {
      if (depth === 0) {
        args.push(current);
        return { name: found[1].toUpperCase(), args: args.map(argumentOf) };
      }
      depth--;
    }
    if (ch === "," && depth === 0) {
      args.push(current);
      current = "";
      continue;
    }
    current += ch;
  }
  return null;
}

function argumentOf(text: string): FormulaArgument {
  const trimmed = text.trim();
  if (trimmed.startsWith('"') && trimmed.endsWith('"')) return { kind: "text", value: trimmed.slice(1, -1).replace(/""/g, '"') };
  if (/^[+-]?(?:\d+\.?\d*|\.\d+)(?:E[+-]?\d+)?$/i.test(trimmed)) return { kind: "number", value: Number(trimmed) };
  return { kind: "reference", text: trimmed };
}

/** What a block's formulas say about the question that made it. */
export interface BlockReading {
  readonly test: BlockTest;
  readonly paired: boolean;
  /** Independent groups: two from two ranges, several from values and labels; "none" otherwise. */
  readonly groups: GroupsKind;
  /** Two groups: true when both come from one column of values and a group column (LABELEDTWOGROUPS). */
  readonly groupColumn: boolean;
  /** Groups: the method word of TWOGROUPS or GROUPS; null otherwise. */
  readonly groupMethod: TwoGroupMethod | ManyGroupMethod | null;
  /** Several groups: the adjustment of the table by group; null otherwise. */
  readonly adjust: AdjustMethod | null;
  /** Several groups: false when the table by group tests against no target median. */
  readonly withTarget: boolean;
  /** The data references as the formulas give them: the first range, then the second for pairs. */
  readonly references: readonly string[];
  readonly center: number;
  readonly quantile: number | null;
  readonly alternative: Alternative;
  readonly ties: TieRule | null;
  readonly signMethod: SignTestMethod | null;
  readonly rankMethod: SignedRankMethod | null;
  readonly zeros: ZeroRule | null;
  readonly alpha: number;
  /** The confidence level: one of these literals of the bound formula (the pane tries each against the whole block). */
  readonly confidences: readonly number[];
}

const ALTERNATIVES: readonly string[] = ["two-sided", "greater", "less"];

function testOf(title: string): { test: BlockTest; paired: boolean } | null {
  if (/^two groups,/i.test(title)) return { test: "two-groups", paired: false };
  if (/^several groups,/i.test(title)) return { test: "groups", paired: false };
  const paired = /,\s*paired$/i.test(title.trim());
  if (/^sign test/i.test(title)) return { test: "sign", paired };
  if (/signed-rank/i.test(title)) return { test: "signed-rank", paired };
  if (/^quantile test/i.test(title)) return { test: "quantile", paired };
  return null;
}

/**
 * Reads a block's two columns of formulas (labels, values) back into its question and settings; null when it does not read as a block.
 *
 * @example
 * readBlock(formulas)?.center; // 50
 */
export function readBlock(formulas: readonly (readonly unknown[])[]): BlockReading | null {
  const labelled = (label: RegExp): string => String(formulas.find((row) => label.test(String(row[0] ?? "")))?.[1] ?? "");
  const kind = testOf(String(formulas[0]?.[1] ?? ""));
  const p = callArguments(labelled(/^p-value$/));
  if (!kind || !p) return null;
  if (kind.test === "two-groups" || kind.test === "groups") return readGroupBlock(formulas, kind.test, p);
  const references = p.args.flatMap((a) => (a.kind === "reference" ? [a.text] : []));
  const numbers = p.args.flatMap((a) => (a.kind === "number" ? [a.value] : []));
  const texts = p.args.flatMap((a) => (a.kind === "text" ? [a.value] : []));
  const alternative = texts.find((t) => ALTERNATIVES.includes(t)) as Alternative | undefined;
  const rest = texts.filter((t) => !ALTERNATIVES.includes(t));
  const alpha = /<=\s*([0-9.Ee+-]+)\s*,/.exec(labelled(/^Decision at alpha/));
  const bound = callArguments(labelled(/bound/i));
  if (references.length !== (kind.paired ? 2 : 1) || numbers.length === 0 || !alternative || !alpha || !bound) return null;
  const methodWord = rest.find((t) => ["exact", "midp", "normal", "auto"].includes(t));
  const ruleWord = rest.find((t) => ["drop", "split", "conservative", "pratt"].includes(t));
  return {
    ...kind,
    groups: "none",
    groupColumn: false,
    groupMethod: null,
    adjust: null,
    withTarget: false,
    references,
    center: numbers[0],
    quantile: kind.test === "quantile" ? (numbers[1] ?? null) : null,
    alternative,
    ties: kind.test === "sign" ? ((ruleWord as TieRule | undefined) ?? null) : null,
    signMethod: kind.test === "sign" ? ((methodWord as SignTestMethod | undefined) ?? null) : null,
    rankMethod: kind.test === "signed-rank" ? ((methodWord as SignedRankMethod | undefined) ?? null) : null,
    zeros: kind.test === "signed-rank" ? ((ruleWord as ZeroRule | undefined) ?? null) : null,
    alpha: Number(alpha[1]),
    confidences: bound.args.flatMap((a) => (a.kind === "number" && a.value > 0 && a.value < 1 ? [a.value] : [])),
  };
}

const TWO_GROUP_METHODS: readonly string[] = ["rank-sum", "median"];
const MANY_GROUP_METHODS: readonly string[] = ["median", "rank"];
const ADJUST_METHODS: readonly string[] = ["holm", "bonferroni", "hochberg", "bh", "by"];

function textAt(args: readonly FormulaArgument[], i: number): string | null {
  const a = args[i];
  return a?.kind === "text" ? a.value : null;
}

function numberAt(args: readonly FormulaArgument[], i: number): number | null {
  const a = args[i];
  return a?.kind === "number" ? a.value : null;
}

/** Both ranges of a group call: its first two arguments, each a reference. */
function twoReferences(args: readonly FormulaArgument[]): string[] | null {
  const [a, b] = args;
  return a?.kind === "reference" && a.text !== "" && b?.kind === "reference" && b.text !== "" ? [a.text, b.text] : null;
}

/**
 * A group block read back: TWOGROUPS(first, second, shift, alternative, method) and SHIFT's confidence for two
 * groups (LABELEDTWOGROUPS and LABELEDSHIFT, with the two labels after the ranges, for two groups from a group
 * column; which label is first is settled by writing the block again each way); GROUPS(values, labels, method) and BYGROUP(values, labels, [target], alternative, confidence, adjust),
 * whose formula sits in the label column, for several groups.
 */
function readGroupBlock(
  formulas: readonly (readonly unknown[])[],
  test: "two-groups" | "groups",
  p: { name: string; args: readonly FormulaArgument[] },
): BlockReading | null {
  const pArgs = p.args;
  const labelled = (label: RegExp): string => String(formulas.find((row) => label.test(String(row[0] ?? "")))?.[1] ?? "");
  const alpha = /<=\s*([0-9.Ee+-]+)\s*,/.exec(labelled(/^Decision at alpha/));
  const references = twoReferences(pArgs);
  if (!alpha || !references) return null;
  const common = { test, paired: false, references, quantile: null, ties: null, signMethod: null, rankMethod: null, zeros: null };
  if (test === "two-groups") {
    const groupColumn = /^LABELEDTWOGROUPS$/i.test(p.name);
    // The labels stand between the ranges and the rest.
    const at = groupColumn ? 4 : 2;
    const shift = numberAt(pArgs, at);
    const alternative = textAt(pArgs, at + 1);
    const method = textAt(pArgs, at + 2);
    const bounds = callArguments(labelled(/bounds for the shift/));
    const confidence = bounds ? numberAt(bounds.args, at) : null;
    if (shift === null || !alternative || !ALTERNATIVES.includes(alternative) || !method || !TWO_GROUP_METHODS.includes(method))
      return null;
    if (confidence === null) return null;
    return {
      ...common,
      groups: "two",
      groupColumn,
      groupMethod: method as TwoGroupMethod,
      adjust: null,
      withTarget: false,
      center: shift,
      alternative: alternative as Alternative,
      alpha: Number(alpha[1]),
      confidences: [confidence],
    };
  }
  const method = textAt(pArgs, 2);
  const tableFormula = formulas.map((row) => String(row[0] ?? "")).find((cell) => /EVENSPLIT\.BYGROUP\(/i.test(cell));
  const table = tableFormula ? callArguments(tableFormula) : null;
  if (!method || !MANY_GROUP_METHODS.includes(method) || !table) return null;
  const target = numberAt(table.args, 2);
  const alternative = textAt(table.args, 3);
  const confidence = numberAt(table.args, 4);
  const adjust = textAt(table.args, 5);
  if (!alternative || !ALTERNATIVES.includes(alternative) || confidence === null || !adjust || !ADJUST_METHODS.includes(adjust))
    return null;
  return {
    ...common,
    groups: "several",
    groupColumn: false,
    groupMethod: method as ManyGroupMethod,
    adjust: adjust as AdjustMethod,
    withTarget: target !== null,
    center: target ?? 0,
    alternative: alternative as Alternative,
    alpha: Number(alpha[1]),
    confidences: [confidence],
  };
}

/**
 * Whether a block written again from a candidate state (`again`, blockWrite's formulas for the preview `rows`)
 * is the block read from the sheet, cell for cell. The audit line is passed over: it carries the time of
 * writing, which a second writing cannot repeat. From a spilled table on, only the cells the block itself
 * writes are compared: the cells its table spills into hold the sheet's answers, not what was written.
 *
 * @example
 * sameBlockFormulas(blockWrite(rows, sheet, mark.rect).formulas, read.formulas, rows); // true for an untouched block
 */
export function sameBlockFormulas(
  again: readonly (readonly string[])[],
  formulas: readonly (readonly unknown[])[],
  rows: readonly { readonly key: string; readonly table?: unknown }[],
): boolean {
  const audit = rows.findIndex((row) => row.key === "audit");
  // The rows before a table take one line each, so a preview row's index is its line in the block.
  const table = rows.findIndex((row) => row.table !== undefined);
  if (again.length !== formulas.length) return false;
  return again.every(
    (line, r) =>
      r === audit || line.every((cell, c) => (table >= 0 && r >= table && cell === "") || cell === String(formulas[r]?.[c] ?? "")),
  );
}

/**
 * The block, among those the pane wrote, that holds a selected cell.
 *
 * @example
 * blockAt(blocks, "Paint line", { top: 4, left: 5, bottom: 4, right: 5 }); // { name: "Evensplit_block_1", sheet: "Paint line", rect: E1:F22 }
 */
export function blockAt(blocks: readonly BlockMark[], sheet: string, cell: CellRect): BlockMark | null {
  return (
    blocks.find(
      (b) =>
        b.sheet.toLowerCase() === sheet.toLowerCase() &&
        cell.top >= b.rect.top &&
        cell.top <= b.rect.bottom &&
        cell.left >= b.rect.left &&
        cell.left <= b.rect.right,
    ) ?? null
  );
}
