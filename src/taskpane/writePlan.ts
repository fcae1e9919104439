/**
 * The checks a write of the result block must pass before anything in the
 * workbook changes, and the names the write gives what it makes (the table
 * made from the data, the chart, the block itself), so that a failed write can
 * find them again and take them away.
 *
 * Method: Excel's own limits (Microsoft, "Excel specifications and limits":
 * a worksheet has 1,048,576 rows by 16,384 columns; a cell holds at most
 * 32,767 characters; a formula's contents are at most 8,192 characters), and
 * the 255-character limit on one text value typed inside a formula (Excel's
 * refusal message "Text values in formulas are limited to 255 characters",
 * from memory; common practice). Names follow the workbook's rules for
 * defined names (Microsoft, "Names in formulas": letters, digits, points and
 * underscores, not shaped like a cell reference), and table names share the
 * workbook's one namespace with defined names, so a new name avoids both.
 * Header names that are long are shortened in the block's wording only; the
 * references keep the full name, or they would point at nothing.
 *
 * Cost: O(characters of the block's formulas).
 */
import type { BlockRequest } from "../report/resultBlock";
import { LAST_COLUMN, LAST_ROW, type CellRect } from "./a1";
import type { BlockWrite, SheetRect, TableInfo } from "./host";
import type { PlannedChart } from "./chartPlan";
import type { BlockRefs, PreviewRow } from "./preview";

/** Microsoft, "Excel specifications and limits": length of formula contents. */
export const FORMULA_LIMIT = 8192;
/** Excel's message "Text values in formulas are limited to 255 characters" (from memory). */
export const FORMULA_TEXT_LIMIT = 255;
/** Microsoft, "Excel specifications and limits": total number of characters that a cell can contain. */
export const CELL_TEXT_LIMIT = 32_767;
/** How much of a header name the wording keeps: two names and the fixed words stay well under FORMULA_TEXT_LIMIT. */
export const WORDING_NAME_LIMIT = 60;
/** Defined names the pane gives its blocks start with this. */
export const BLOCK_NAME_PREFIX = "Evensplit_block_";

/**
 * A name as the block's wording uses it: whole when short, else cut with an ellipsis.
 *
 * @example
 * wordingName("Thickness (µm)"); // "Thickness (µm)"
 * wordingName("x".repeat(300)).length; // 60
 */
export function wordingName(name: string, limit = WORDING_NAME_LIMIT): string {
  const chars = [...name];
  return chars.length <= limit ? name : `${chars.slice(0, limit - 1).join("")}…`;
}

/**
 * The request with its data names shortened for the wording.
 *
 * @example
 * wordingRequest({ ...request, dataName: "x".repeat(300) }).dataName?.length; // 60
 */
export function wordingRequest(request: BlockRequest): BlockRequest {
  const shortened: { dataName?: string; secondName?: string } = {};
  if (request.dataName !== undefined) shortened.dataName = wordingName(request.dataName);
  if (request.secondName !== undefined) shortened.secondName = wordingName(request.secondName);
  return { ...request, ...shortened };
}

/**
 * The text values typed inside a formula ("..." with "" for a quote), as the cell will read them.
 *
 * @example
 * formulaTexts('=IF(A1<=0.05,"Reject ""H0""","Keep")'); // ['Reject "H0"', "Keep"]
 */
export function formulaTexts(formula: string): string[] {
  const found: string[] = [];
  let i = 0;
  while (i < formula.length) {
    if (formula[i] !== '"') {
      i++;
      continue;
    }
    let text = "";
    i++;
    while (i < formula.length) {
      if (formula[i] === '"' && formula[i + 1] === '"') {
        text += '"';
        i += 2;
      } else if (formula[i] === '"') break;
      else text += formula[i++];
    }
    found.push(text);
    i++;
  }
  return found;
}

/**
 * Why Excel would refuse this cell content, or null when it fits: a formula
 * over 8,192 characters or with a text value over 255, or text over 32,767.
 *
 * @example
 * cellContentProblem("=COUNT($B$2:$B$25)"); // null
 * cellContentProblem("x".repeat(40000));     // "holds 40000 characters; a cell takes at most 32,767"
 */
export function cellContentProblem(content: string): string | null {
  if (content.startsWith("=") && content.length > 1) {
    if (content.length > FORMULA_LIMIT) return `its formula has ${content.length} characters; Excel takes at most 8,192`;
    const long = formulaTexts(content).find((t) => [...t].length > FORMULA_TEXT_LIMIT);
    if (long !== undefined) return `its formula holds a text of ${[...long].length} characters; Excel takes at most 255 inside a formula`;
    return null;
  }
  const shown = content.startsWith("'") ? content.slice(1) : content;
  return shown.length > CELL_TEXT_LIMIT ? `holds ${shown.length} characters; a cell takes at most 32,767` : null;
}

/**
 * True when every cell of the rectangle lies on the sheet (rows 1 to 1,048,576, columns A to XFD).
 *
 * @example
 * onSheet({ top: 0, left: 16383, bottom: 19, right: 16384 }); // false: the block's second column would be past XFD
 */
export function onSheet(rect: CellRect): boolean {
  return (
    rect.top >= 0 &&
    rect.left >= 0 &&
    rect.bottom <= LAST_ROW &&
    rect.right <= LAST_COLUMN &&
    rect.top <= rect.bottom &&
    rect.left <= rect.right
  );
}

/**
 * The first name `stem` + 1, 2, ... not already taken (compared without regard to case, as the workbook does).
 *
 * @example
 * freeName("Table", ["Table1", "table2"]); // "Table3"
 */
export function freeName(stem: string, taken: readonly string[]): string {
  const used = new Set(taken.map((t) => t.toLowerCase()));
  let n = 1;
  while (used.has(`${stem}${n}`.toLowerCase())) n++;
  return `${stem}${n}`;
}

/**
 * Why Excel might name a new table's columns differently from the header cells (so the block's references would miss), or null.
 *
 * @example
 * tableHeaderProblem(["Before", "before"]); // "two columns are both named “Before”; ..."
 */
export function tableHeaderProblem(headers: readonly string[]): string | null {
  const seen = new Map<string, string>();
  for (const header of headers) {
    if (header === "" || header !== header.trim() || /[\r\n]/.test(header)) {
      return `the name “${wordingName(header.trim())}” has spaces at its ends or a line break, which a table would change; tidy the name row first`;
    }
    const key = header.toLowerCase();
    if (seen.has(key)) return `two columns are both named “${wordingName(header)}”; a table needs different names, so rename one first`;
    seen.set(key, header);
  }
  return null;
}

/** A table the write makes from the data: where, the name it is given, its columns as the header row names them. */
export type PlannedTable = TableInfo;

/** The chart a write adds, with its helper cells (chartPlan.ts). */
export type { PlannedChart } from "./chartPlan";

/** A block the pane wrote earlier: its defined name and where it is, and its chart and helper cells when it has them. */
export interface BlockMark extends SheetRect {
  readonly name: string;
  /** The name of the block's chart, on the block's sheet. */
  readonly chart?: string;
  /** The chart's helper cells and the defined name that marks them. */
  readonly helper?: SheetRect & { readonly name: string };
}

/** Defined names that mark a chart's helper cells start with this; the number is the block's. */
export const HELPER_NAME_PREFIX = "Evensplit_chartcells_";
/** A block's chart is named this and the block's number. */
export const CHART_NAME_PREFIX = "Evensplit chart ";

/**
 * The names of a block's chart and helper cells, from the block's own name: one number ties the three together,
 * so a later write that replaces the block finds its chart and helper cells too.
 *
 * @example
 * companionNames("Evensplit_block_3"); // { chart: "Evensplit chart 3", helper: "Evensplit_chartcells_3" }
 */
export function companionNames(blockName: string): { chart: string; helper: string } {
  const number = blockName.slice(BLOCK_NAME_PREFIX.length);
  return { chart: `${CHART_NAME_PREFIX}${number}`, helper: `${HELPER_NAME_PREFIX}${number}` };
}

/**
 * The first block name whose chart and helper names are free too (compared without regard to case).
 *
 * @example
 * freeBlockName(["Evensplit_block_1", "Evensplit chart 2"]); // "Evensplit_block_3"
 */
export function freeBlockName(taken: readonly string[]): string {
  const used = new Set(taken.map((t) => t.toLowerCase()));
  for (let n = 1; ; n++) {
    const name = `${BLOCK_NAME_PREFIX}${n}`;
    const { chart, helper } = companionNames(name);
    if (![name, chart, helper].some((x) => used.has(x.toLowerCase()))) return name;
  }
}

/** Everything one write does, decided and checked before the workbook changes. */
export interface PlannedWrite {
  readonly tables: readonly PlannedTable[];
  readonly refs: BlockRefs;
  readonly rows: readonly PreviewRow[];
  readonly block: BlockWrite;
  readonly chart: PlannedChart | null;
  /** The defined name that marks the block, so a later write at the same place can clear all of it. */
  readonly blockName: string;
  /** Blocks written earlier that the new one replaces: their whole regions are cleared first and their names dropped. */
  readonly replaces: readonly BlockMark[];
}

/**
 * Checks a planned write completely: every rectangle on the sheet, every
 * cell's content within Excel's limits. Returns the first problem in words,
 * or null.
 *
 * @example
 * writeProblem(plan); // null, or "The block would need rows past the last row of the sheet (1,048,576): ..."
 */
export function writeProblem(plan: PlannedWrite): string | null {
  const { block, chart } = plan;
  if (!onSheet(block.rect)) {
    return "The block does not fit on the sheet there (1,048,576 rows, columns A to XFD): pick a top-left cell further up or to the left.";
  }
  if (chart && (!onSheet(chart.area) || !onSheet(chart.helper.rect))) {
    return "The chart beside the block would run past the edge of the sheet: pick a place further to the left or up, or leave the chart out.";
  }
  for (let r = 0; r < block.formulas.length; r++) {
    for (let c = 0; c < block.formulas[r].length; c++) {
      const problem = cellContentProblem(block.formulas[r][c]);
      if (problem) return `Excel would refuse row ${r + 1} of the block (${plan.rows[r]?.label ?? ""}): the cell ${problem}.`;
    }
  }
  for (const row of chart?.helper.formulas ?? []) {
    for (const content of row) {
      const problem = cellContentProblem(content);
      if (problem) return `Excel would refuse a helper cell of the chart: the cell ${problem}. Leave the chart out.`;
    }
  }
  return null;
}
