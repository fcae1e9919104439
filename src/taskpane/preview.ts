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
  /** What goes into the value cell. */
  readonly formula: string;
  readonly numberFormat: string;
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
 * The write for a previewed block at a place: label and value columns, the
 * number formats, and which rows are the title and the cautions.
 *
 * @example
 * blockWrite(rows, "Paint line", { top: 0, left: 4, bottom: rows.length - 1, right: 5 }).formulas[0]; // ["Evensplit result", "Sign test, one sample"]
 */
export function blockWrite(rows: readonly PreviewRow[], sheet: string, rect: CellRect): BlockWrite {
  return {
    sheet,
    rect,
    formulas: rows.map((row) => [blockFormula({ kind: "text", text: row.label }, { data: "" }), row.formula]),
    numberFormats: rows.map((row) => [NUMBER_FORMATS.text, row.numberFormat]),
    titleRows: rows.flatMap((row, i) => (row.style === "title" ? [i] : [])),
    cautionRows: rows.flatMap((row, i) => (row.style === "caution" ? [i] : [])),
  };
}
