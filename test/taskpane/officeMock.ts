/**
 * An office-addin-mock workbook with one sheet and a selection, shaped like the
 * part of Excel.run's context that src/taskpane/host.ts reads.
 */
import { OfficeMockObject } from "office-addin-mock";

export function workbookMock(sheet: Record<string, unknown>, selected = "'Paint line'!B1:B25"): OfficeMockObject {
  return new OfficeMockObject({
    context: {
      workbook: {
        selected: { address: selected },
        getSelectedRange(this: { selected: unknown }) {
          return this.selected;
        },
        worksheets: {
          sheet,
          getItem(this: { sheet: unknown }) {
            return this.sheet;
          },
          getActiveWorksheet(this: { sheet: unknown }) {
            return this.sheet;
          },
        },
      },
    },
    run: async function (this: { context: unknown }, batch: (context: unknown) => Promise<unknown>) {
      return batch(this.context);
    },
  });
}
