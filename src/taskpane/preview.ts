/**
 * The Result step's preview: the block's rows evaluated now by the same code
 * the cell functions run, and the exact formulas and formats that writing
 * the block will put into the sheet.
 *
 * Method: the rows come from the one definition in src/report/resultBlock.ts;
 * each value is evaluated with `blockValue` through the catalogue's
 * `callFunction`, and shown under the number format the sheet will use.
 *
 * Cost: the cost of the catalogue functions on the data (one pass each).
 */
import {
  blockFormula,
  blockValue,
  NUMBER_FORMATS,
  resultBlockRows,
  type BlockInputs,
  type BlockRequest,
  type BlockRow,
  type CatalogueCall,
} from "../report/resultBlock";
import { isCellError } from "../functions/runtime";
import type { CellRect } from "./a1";
import type { BlockWrite } from "./host";
import { formatCell } from "./numberFormat";

export interface PreviewRow {
  readonly key: string;
  readonly label: string;
  readonly style: BlockRow["style"];
  /** The value as the sheet will show it. */
  readonly shown: string;
  /** The raw value (a number, text, "" or a cell error). */
  readonly value: unknown;
  /** For an error value: why, in the catalogue's words. */
  readonly message?: string;
  /** What goes into the value cell (for a spilled table: into the label column, spilling right and down). */
  readonly formula: string;
  readonly numberFormat: string;
  /** A spilled table: each cell as the sheet will show it, and each column's number format. */
  readonly table?: { readonly shown: readonly (readonly string[])[]; readonly numberFormats: readonly string[] };
}

/** The references the formulas use for the data and, when paired, the second range. */
export interface BlockRefs {
  readonly data: string;
  readonly second?: string;
}

function shownValue(value: unknown, numberFormat: string): string {
  if (value === null || value === undefined || value === "") return "";
  if (typeof value === "number" || typeof value === "string" || typeof value === "boolean") return formatCell(value, numberFormat);
  return isCellError(value) ? value.code : "";
}

/**
 * The rows of the block with their present values and their formulas.
 *
 * @example
 * blockPreview(request, { data: [[51.8], [49.6], [50]] }, { data: "$B$2:$B$4" }, callFunction)
 *   .find((r) => r.key === "pvalue"); // { shown: "1.0000", formula: "=EVENSPLIT.PVALUE($B$2:$B$4,50,...)", ... }
 */
export function blockPreview(request: BlockRequest, inputs: BlockInputs, refs: BlockRefs, call: CatalogueCall): PreviewRow[] {
  return resultBlockRows(request).map((row) => {
    const value = blockValue(row.value, inputs, call);
    const numberFormat = NUMBER_FORMATS[row.format];
    const message = isCellError(value) && value.message ? { message: value.message } : {};
    if (row.spill) {
      const numberFormats = row.spill.formats.map((format) => NUMBER_FORMATS[format]);
      // An answer that is not a table (an error) spills nothing: it shows in the one cell.
      const cells = Array.isArray(value) ? (value as unknown[][]) : [[value]];
      const shown = cells.map((cellsOfRow) => cellsOfRow.map((cell, c) => shownValue(cell, numberFormats[c] ?? NUMBER_FORMATS.text)));
      return {
        key: row.key,
        label: row.label,
        style: row.style,
        shown: shown[0]?.[0] ?? "",
        value,
        ...message,
        formula: blockFormula(row.value, refs),
        numberFormat: numberFormats[0],
        table: { shown, numberFormats },
      };
    }
    return {
      key: row.key,
      label: row.label,
      style: row.style,
      shown: shownValue(value, numberFormat),
      value,
      ...message,
      formula: blockFormula(row.value, refs),
      numberFormat,
    };
  });
}

/**
 * How many rows and columns a previewed block takes: two columns, label and
 * value, one row each; a spilled table takes as many rows and columns as it
 * has now (its header and a row per group), so the place is checked for all of it.
 *
 * @example
 * blockSize(signRows); // { rows: 24, columns: 2 }
 * blockSize(severalGroupRows); // { rows: 22 + 4, columns: 8 } for three groups and a row of skipped labels
 */
export function blockSize(rows: readonly PreviewRow[]): { rows: number; columns: number } {
  let height = 0;
  let width = 2;
  for (const row of rows) {
    const table = row.table?.shown;
    height += table ? Math.max(1, table.length) : 1;
    if (row.table) width = Math.max(width, row.table.numberFormats.length);
  }
  return { rows: height, columns: width };
}

/**
 * The write for a previewed block at a place: label and value columns, the
 * number formats, and which rows are the title and the cautions. A spilled
 * table's formula goes into the label column; the cells it will spill into
 * are written empty (so the place is cleared for it) under its columns' formats.
 *
 * @example
 * blockWrite(rows, "Paint line", { top: 0, left: 4, bottom: rows.length - 1, right: 5 }).formulas[0]; // ["Evensplit result", "Sign test, one sample"]
 */
export function blockWrite(rows: readonly PreviewRow[], sheet: string, rect: CellRect): BlockWrite {
  const width = rect.right - rect.left + 1;
  const pad = (cells: string[], fill: string): string[] => [...cells, ...Array<string>(Math.max(0, width - cells.length)).fill(fill)];
  const formulas: string[][] = [];
  const numberFormats: string[][] = [];
  const titleRows: number[] = [];
  const cautionRows: number[] = [];
  for (const row of rows) {
    if (row.style === "title") titleRows.push(formulas.length);
    if (row.style === "caution") cautionRows.push(formulas.length);
    if (row.table) {
      const height = Math.max(1, row.table.shown.length);
      const formats = pad([...row.table.numberFormats], NUMBER_FORMATS.text);
      for (let r = 0; r < height; r++) {
        formulas.push(pad(r === 0 ? [row.formula] : [], ""));
        numberFormats.push(formats);
      }
      continue;
    }
    formulas.push(pad([blockFormula({ kind: "text", text: row.label }, { data: "" }), row.formula], ""));
    numberFormats.push(pad([NUMBER_FORMATS.text, row.numberFormat], NUMBER_FORMATS.text));
  }
  return { sheet, rect, formulas, numberFormats, titleRows, cautionRows };
}
