/**
 * The Data step's part for data in a database: the names for the query, the
 * two queries to copy, the cells where their answers were pasted, and which
 * group's row the block reads. It renders a DatabaseView (databaseState.ts)
 * and forwards events; it holds no state and runs no query.
 *
 * Cost: O(1) nodes per render, plus one option per group label.
 */
import { button, field, textInput } from "./controls";
import type { DatabaseView } from "./databaseState";
import { el, replaceChildren, show } from "./dom";

export interface DatabaseEvents {
  name(field: "table" | "column" | "group", text: string): void;
  center(text: string): void;
  confidence(text: string): void;
  /** Copy the first or the second query. */
  copy(which: "first" | "second"): void;
  /** The cells holding the pasted answer, typed and committed. */
  answerTyped(text: string): void;
  answerFromSelection(): void;
  row(index: number): void;
}

export interface DatabasePage {
  readonly element: HTMLElement;
  readonly answerInput: HTMLInputElement;
  render(view: DatabaseView, answerText: string): void;
}

/** A text input that reports what is typed as it is typed, and is left alone while it has the focus. */
function liveInput(onInput: (text: string) => void): HTMLInputElement {
  const input = textInput("", { autocomplete: "off" });
  input.addEventListener("input", () => onInput(input.value));
  return input;
}

function keep(input: HTMLInputElement, value: string): void {
  if (document.activeElement !== input && input.value !== value) input.value = value;
}

/**
 * Builds the database part of the Data step.
 *
 * @example
 * const page = databasePage(events); page.render(databaseView(state)!, state.slots[0].text);
 */
export function databasePage(events: DatabaseEvents): DatabasePage {
  const table = field(
    "Table",
    liveInput((t) => events.name("table", t)),
    "As your database names it; schema.table if need be.",
  );
  const column = field(
    "Column with the values",
    liveInput((t) => events.name("column", t)),
    "NULLs are left out, as blank cells are.",
  );
  const group = field(
    "Group column (optional)",
    liveInput((t) => events.name("group", t)),
    "To have one answer row per group (a line, a site); leave empty for one column.",
  );
  const center = field(
    "Median the counts compare with",
    liveInput(events.center),
    "The hypothesised median; the Question step shows it too.",
  );
  const confidence = field(
    "Confidence for the ranks",
    liveInput(events.confidence),
    "Such as 0.95; the second query fetches the values at the ranks for this confidence.",
  );
  const firstSql = el("pre", { class: "es-sql", attrs: { tabindex: "0", "aria-label": "First query" } });
  const secondSql = el("pre", { class: "es-sql", attrs: { tabindex: "0", "aria-label": "Second query" } });
  const copyFirst = button("Copy the first query", "secondary", () => events.copy("first"));
  const copySecond = button("Copy the second query", "secondary", () => events.copy("second"));
  const answerInput = textInput("", { autocomplete: "off" });
  answerInput.addEventListener("change", () => events.answerTyped(answerInput.value));
  answerInput.addEventListener("keydown", (event) => {
    if (event.key === "Enter") {
      event.preventDefault();
      events.answerTyped(answerInput.value);
    }
  });
  const answer = field(
    "Cells holding the pasted answer",
    answerInput,
    "Such as A1:F2, the row of column names included if you pasted it.",
    button("Use the selection", "secondary", () => events.answerFromSelection()),
  );
  const summary = el("p", { class: "es-database-summary", attrs: { "aria-live": "polite" } });
  const rowSelect = el("select");
  rowSelect.addEventListener("change", () => events.row(Number(rowSelect.value)));
  const rowField = field("The block reads the row of group", rowSelect, "One block per group: write it, then choose the next group.");
  const firstPart = el("div", undefined, el("h3", undefined, "First query: the counts and each n"), firstSql, copyFirst);
  const secondPart = el("div", undefined, el("h3", undefined, "Second query: the bounds at the ranks for this n"), secondSql, copySecond);
  const next = el("p", { class: "es-database-next", attrs: { "aria-live": "polite" } });
  const namesProblem = el("p", { class: "es-problem", attrs: { "aria-live": "polite" } });
  const element = el(
    "div",
    { class: "es-database", attrs: { role: "group", "aria-label": "The queries and their answers" } },
    el(
      "p",
      { class: "es-intro" },
      "Run the queries in your own database tool and paste each answer into the sheet; the add-in connects to nothing.",
    ),
    table.element,
    column.element,
    group.element,
    center.element,
    confidence.element,
    namesProblem,
    firstPart,
    answer.element,
    summary,
    secondPart,
    rowField.element,
    next,
  );

  function render(view: DatabaseView, answerText: string): void {
    keep(table.control, view.table);
    keep(column.control, view.column);
    keep(group.control, view.group);
    keep(center.control, view.center);
    keep(confidence.control, view.confidence);
    namesProblem.textContent = view.namesProblem ?? "";
    firstSql.textContent = view.firstQuery;
    show(firstPart, view.firstQuery !== "");
    secondSql.textContent = view.secondQuery;
    show(secondPart, view.secondQuery !== "");
    keep(answerInput, answerText);
    summary.textContent = view.pastedSummary;
    show(rowField.element, view.groupLabels.length > 1);
    if (rowSelect.options.length !== view.groupLabels.length || view.groupLabels.some((label, i) => rowSelect.options[i].text !== label)) {
      replaceChildren(rowSelect, ...view.groupLabels.map((label, i) => el("option", { attrs: { value: String(i) } }, label)));
    }
    rowSelect.value = String(view.row);
    next.textContent = view.next;
  }

  return { element, answerInput, render };
}
