/**
 * The Data step's page: the kind of data, one or two ranges with their
 * summaries and name-row boxes, and how the block refers to the cells. It
 * renders a DataView (dataState.ts) and forwards events; it holds no state.
 *
 * Cost: O(1) nodes per render.
 */
import { button, field, newId, radioGroup, setProblem, textInput } from "./controls";
import { databasePage, type DatabaseEvents } from "./databaseView";
import type { DataKind, DataView } from "./dataState";
import { el, show } from "./dom";
import type { ReferenceChoice } from "./workflow";

export interface DataEvents {
  kind(kind: DataKind): void;
  /** A range typed and committed (Enter, or leaving the field). */
  rangeTyped(index: number, text: string): void;
  useSelection(index: number): void;
  header(index: number, useHeader: boolean): void;
  reference(choice: ReferenceChoice): void;
  /** Take a two-column range chosen as one set of values as pairs instead. */
  asPairs(): void;
  /** Two groups: each its own range (false) or both in one column of values with a group column (true). */
  groupColumn(on: boolean): void;
  /** Two groups from a group column: the label seen second is the first group. */
  swapGroups(on: boolean): void;
  /** Load the block that holds the selected cell, to change it and write it again. */
  editBlock(): void;
  next(): void;
  /** The part for data in a database. */
  readonly database: DatabaseEvents;
}

export interface DataPage {
  readonly element: HTMLElement;
  /** The ranges' text fields, in slot order. */
  readonly inputs: readonly HTMLInputElement[];
  render(view: DataView, texts: readonly string[]): void;
}

/**
 * Builds the Data step under `heading`.
 *
 * @example
 * const page = dataPage(heading, events); page.render(dataView(state), state.slots.map((s) => s.text));
 */
export function dataPage(heading: HTMLElement, events: DataEvents): DataPage {
  const kindGroup = radioGroup<DataKind>(
    "What kind of data?",
    [
      { value: "one", label: "One set of values", hint: "Test where the median of one column lies." },
      {
        value: "pairs",
        label: "Pairs of values",
        hint: "Two columns, a first and a second value for each item (such as before and after); the test looks at second − first.",
      },
      {
        value: "two-groups",
        label: "Two groups",
        hint: "Two ranges from different items (such as line A and line B), of any sizes; compares them and estimates the shift between them.",
      },
      {
        value: "groups",
        label: "Several groups",
        hint: "One range of values and a column beside it naming each value's group; compares all groups and gives a row for each.",
      },
      {
        value: "database",
        label: "Data in a database",
        hint: "Too many rows for a sheet: the pane gives the SQL to run in your own tool, and you paste its answer back.",
      },
    ],
    "one",
    (value) => events.kind(value),
  );
  const formGroup = radioGroup<"ranges" | "column">(
    "How are the two groups given?",
    [
      { value: "ranges", label: "Two ranges", hint: "Each group in its own range." },
      {
        value: "column",
        label: "Values with a group column",
        hint: "One range of values and a column beside it naming each value's group, with exactly two labels.",
      },
    ],
    "ranges",
    (value) => events.groupColumn(value === "column"),
  );
  const pickedText = el("p", { class: "es-picked-text", attrs: { "aria-live": "polite" } });
  const swapId = newId("swap");
  const swapBox = el("input", { id: swapId, attrs: { type: "checkbox" } });
  swapBox.addEventListener("change", () => events.swapGroups(swapBox.checked));
  const swapRow = el("div", { class: "es-check" }, swapBox, el("label", { attrs: { for: swapId } }, "Swap the first and the second group"));
  const pickedPart = el("div", { class: "es-picked" }, pickedText, swapRow);
  const database = databasePage(events.database);
  const slotViews = [0, 1].map((index) => {
    const input = textInput("", { autocomplete: "off" });
    const pick = button("Use the selection", "secondary", () => events.useSelection(index));
    const f = field(index === 0 ? "Values" : "Second values", input, "A range such as B1:B25; the first row may hold the name.", pick);
    const summary = el("p", { class: "es-summary", attrs: { "aria-live": "polite" } });
    const headerId = newId("header");
    const headerBox = el("input", { id: headerId, attrs: { type: "checkbox" } });
    headerBox.checked = true;
    const headerRow = el(
      "div",
      { class: "es-check" },
      headerBox,
      el("label", { attrs: { for: headerId } }, "The first row is a name: leave it out of the test"),
    );
    input.addEventListener("change", () => events.rangeTyped(index, input.value));
    input.addEventListener("keydown", (event) => {
      if (event.key === "Enter") {
        event.preventDefault();
        events.rangeTyped(index, input.value);
      }
    });
    headerBox.addEventListener("change", () => events.header(index, headerBox.checked));
    const pooledText = el("p", { class: "es-pooled-text" });
    const pairButton = button("Use them as pairs", "secondary", () => events.asPairs());
    const pooled = el("div", { class: "es-pooled", attrs: { role: "group", "aria-label": "Several columns" } }, pooledText, pairButton);
    const element = el("div", { class: "es-slot" }, f.element, summary, pooled, headerRow);
    return { element, field: f, input, summary, headerBox, headerRow, pooled, pooledText, pairButton, shownText: "" };
  });
  const referenceGroup = radioGroup<ReferenceChoice>(
    "When rows are added later",
    [
      { value: "exact", label: "Use exactly these cells", hint: "Nothing in the workbook changes." },
      { value: "table", label: "Turn the range into a table", hint: "Rows added to the table then count automatically." },
      { value: "open", label: "Read down to the end of the sheet", hint: "Values typed below count too." },
    ],
    "exact",
    (value) => events.reference(value),
  );
  const referenceNote = el("p", { class: "es-note", attrs: { "aria-live": "polite" } });
  const problemText = el("p", { class: "es-problem", attrs: { "aria-live": "polite" } });
  const element = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": heading.id } },
    heading,
    el("p", { class: "es-intro" }, "Choose the cells with your measurements. Blank cells, text and TRUE/FALSE are skipped and counted."),
    el(
      "div",
      { class: "es-edit" },
      el("p", { class: "es-hint" }, "To change a block written earlier, select one of its cells:"),
      button("Edit the block at the selection", "secondary", () => events.editBlock()),
    ),
    kindGroup.element,
    formGroup.element,
    slotViews[0].element,
    slotViews[1].element,
    pickedPart,
    database.element,
    referenceGroup.element,
    referenceNote,
    problemText,
    el(
      "div",
      { class: "es-actions" },
      button("Next: the question", "primary", () => events.next()),
    ),
  );

  function render(view: DataView, texts: readonly string[]): void {
    kindGroup.set(view.kind);
    show(formGroup.element, view.kind === "two-groups");
    formGroup.set(view.groupColumn ? "column" : "ranges");
    show(pickedPart, view.picked !== null);
    pickedText.textContent = view.picked?.words ?? "";
    swapBox.checked = view.picked?.swapped ?? false;
    show(slotViews[0].element, view.database === null);
    show(slotViews[1].element, view.twoRanges);
    show(database.element, view.database !== null);
    if (view.database !== null) database.render(view.database, texts[0]);
    view.slots.forEach((slot, i) => {
      const page = slotViews[i];
      page.field.label.textContent = slot.label;
      // The field shows the address as read; typing in progress is left alone until it is committed.
      if (texts[i] !== page.shownText) {
        page.input.value = texts[i];
        page.shownText = texts[i];
      }
      setProblem(page.field, slot.problem);
      page.summary.textContent = slot.summary;
      show(page.pooled, slot.pooled !== null);
      page.pooledText.textContent = slot.pooled ?? "";
      show(page.pairButton, slot.canPair);
      show(page.headerRow, slot.canToggleHeader);
      page.headerBox.checked = slot.useHeader;
    });
    const offered = view.options !== null && !view.options.allTableColumns && view.database === null;
    show(referenceGroup.element, offered);
    if (view.options && offered) {
      referenceGroup.enable("table", view.options.table.available, view.options.table.reason);
      referenceGroup.enable("open", view.options.open.available, view.options.open.reason);
    }
    referenceGroup.set(view.reference);
    referenceNote.textContent = view.database === null ? view.note : "";
    // For a database the part's own line says what is left to do.
    problemText.textContent = view.database === null ? view.problem : "";
  }

  return { element, inputs: slotViews.map((s) => s.input), render };
}
