/**
 * The demo page's workbook as it opens: the sheet "Paint line" with the
 * invented panels (inventedData.ts), the sheet "Lines and suppliers" with invented
 * panels from several lines and two suppliers, and the sheet "README examples" with the
 * tables and names the README's example formulas use (readmeData.ts).
 *
 * Cost: O(cells).
 */
import type { CustomFunction } from "./formula/evaluate";
import { DEMO_SHEET, demoRows, GROUPS_SHEET, groupRows } from "./inventedData";
import { README_SHEET, readmeBlocks, readmeNames, readmeTables } from "./readmeData";
import { Workbook } from "./workbook";

/**
 * A new demo workbook with its data, tables and names, calculating with `functions`.
 *
 * @example
 * const workbook = demoWorkbook(functions);
 * workbook.value("Paint line", 1, 1); // 51.8
 */
export function demoWorkbook(functions: ReadonlyMap<string, CustomFunction>): Workbook {
  const workbook = new Workbook([DEMO_SHEET, GROUPS_SHEET, README_SHEET]);
  workbook.batch(() => {
    workbook.writeEntries(DEMO_SHEET, 0, 0, demoRows());
    workbook.setFormat(DEMO_SHEET, { top: 0, left: 0, bottom: 0, right: 2 }, { bold: true });
    [64, 150, 210].forEach((width, column) => workbook.setColumnWidth(DEMO_SHEET, column, width));
    workbook.writeEntries(GROUPS_SHEET, 0, 0, groupRows());
    workbook.setFormat(GROUPS_SHEET, { top: 0, left: 0, bottom: 0, right: 5 }, { bold: true });
    [64, 80, 130, 40, 150, 150].forEach((width, column) => workbook.setColumnWidth(GROUPS_SHEET, column, width));

    for (const block of readmeBlocks()) workbook.writeEntries(README_SHEET, block.top, block.left, block.rows);
    workbook.setFormat(README_SHEET, { top: 0, left: 0, bottom: 2, right: 0 }, { italic: true });
    workbook.setFormat(README_SHEET, { top: 0, left: 4, bottom: 0, right: 5 }, { bold: true });
    for (const table of readmeTables()) {
      workbook.writeEntries(README_SHEET, table.top, table.left, table.rows);
      const rect = {
        top: table.top,
        left: table.left,
        bottom: table.top + table.rows.length - 1,
        right: table.left + table.rows[0].length - 1,
      };
      workbook.addTable(README_SHEET, rect, table.name);
    }
    for (const { name, row, column, label, value } of readmeNames()) {
      workbook.writeEntries(README_SHEET, row, column - 1, [[label, value]]);
      workbook.names.set(name.toLowerCase(), { name, sheet: README_SHEET, rect: { top: row, left: column, bottom: row, right: column } });
    }
    workbook.setColumnWidth(README_SHEET, 11, 110);
    workbook.setFunctions(functions);
  });
  return workbook;
}
