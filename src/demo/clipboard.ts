/**
 * Text from the clipboard as the cells it fills: one line per row, one
 * tab-separated field per cell, as spreadsheets and text editors put a
 * selection of cells on the clipboard (text/plain). A field in double quotes
 * may hold tabs, line breaks and doubled quotes ("" for "), the way Excel
 * writes a cell holding a line break; one line break at the end is not an
 * empty row.
 *
 * Method: one pass over the characters (common practice for tab-separated
 * text). Cost: O(length of the text).
 */

/**
 * The rows and fields of pasted text; the rows may be of different lengths.
 *
 * @example
 * clipboardCells("51.8\n49.6\n");      // [["51.8"], ["49.6"]]
 * clipboardCells("P-1\t51.8\r\nP-2\t49.6"); // [["P-1", "51.8"], ["P-2", "49.6"]]
 */
export function clipboardCells(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = "";
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    if (ch === '"' && field === "") {
      const end = closingQuote(text, i + 1);
      // Without a closing quote the quote is plain text.
      if (end >= 0) {
        field = text.slice(i + 1, end).replace(/""/g, '"');
        i = end + 1;
        continue;
      }
    }
    if (ch === "\t") {
      row.push(field);
      field = "";
      i++;
    } else if (ch === "\r" || ch === "\n") {
      row.push(field);
      rows.push(row);
      row = [];
      field = "";
      i += ch === "\r" && text[i + 1] === "\n" ? 2 : 1;
    } else {
      field += ch;
      i++;
    }
  }
  if (field !== "" || row.length > 0) {
    row.push(field);
    rows.push(row);
  }
  return rows;
}

/** Index of the quote that closes a quoted field opened before `from` (doubled quotes skipped), or -1. */
function closingQuote(text: string, from: number): number {
  for (let j = from; j < text.length; j++) {
    if (text[j] !== '"') continue;
    if (text[j + 1] === '"') {
      j++;
      continue;
    }
    return j;
  }
  return -1;
}
