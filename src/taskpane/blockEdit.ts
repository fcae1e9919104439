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
import type { BlockTest } from "../report/resultBlock";
import type { Alternative, SignTestMethod, SignedRankMethod, TieRule, ZeroRule } from "../stats/types";
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
