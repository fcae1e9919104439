/**
 * An office-addin-mock workbook with one sheet and a selection, shaped like the
 * part of Excel.run's context that src/taskpane/host.ts reads.
 */
import { OfficeMockObject } from "office-addin-mock";

/** office-addin-mock only loads properties it knows; collections' items are given as plain, already loaded objects. */
export function itemsCollection(items: unknown[], extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    items,
    ...extra,
    load(this: OfficeMockObject) {
      // "items/name" navigates into an array, which the mock cannot; load the array itself instead.
      OfficeMockObject.prototype.load.call(this, "items");
      return this;
    },
  };
}

export function workbookMock(
  sheet: Record<string, unknown>,
  selected = "'Paint line'!B1:B25",
  names: unknown[] = [],
  tables: unknown[] = [],
): OfficeMockObject {
  return new OfficeMockObject({
    context: {
      workbook: {
        names: itemsCollection(names),
        tables: itemsCollection(tables),
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
