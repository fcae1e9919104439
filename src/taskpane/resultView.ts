/**
 * The Result step's page: the preview table, the plots, the formulas, the
 * place of the block, the chart choice, Write, and the listing of filled
 * cells awaiting consent. It renders a ResultView (resultState.ts) and
 * forwards events.
 *
 * Cost: O(rows of the block + values plotted) nodes per render.
 */
import { button, field, newId, setProblem, textInput } from "./controls";
import { el, replaceChildren, show } from "./dom";
import { nullDistributionPlot, numberLinePlot } from "./plotView";
import type { ResultView } from "./resultState";

/**
 * A formula with line-break chances after its commas and opening brackets, so
 * a long formula wraps between its parts, never inside a name or a number.
 */
function formulaParts(formula: string): Node[] {
  return formula
    .split(/(?<=[,(])/)
    .flatMap((part, i) => (i === 0 ? [document.createTextNode(part)] : [el("wbr"), document.createTextNode(part)]));
}

export interface ResultEvents {
  target(text: string): void;
  targetFromSelection(): void;
  showNull(show: boolean): void;
  chart(chart: boolean): void;
  write(agreed: boolean): void;
  keep(): void;
  reread(): void;
  back(): void;
  startOver(): void;
  /** Put the result on the clipboard as a sentence and the rows. */
  copy(): void;
}

export interface ResultPage {
  readonly element: HTMLElement;
  /** The place field, where the focus goes after a refused write. */
  readonly targetInput: HTMLInputElement;
  /** The heading of the listing of filled cells, where the focus goes when it opens. */
  readonly confirmTitle: HTMLElement;
  render(view: ResultView): void;
  /** Marks the place field with a problem found on writing, until the next render. */
  targetProblem(message: string): void;
}

/** A spilled table as the sheet will show it: its first row as column headers, the rest as rows. */
function spilledTable(shown: readonly (readonly string[])[]): HTMLElement {
  const [header = [], ...body] = shown;
  const table = el(
    "table",
    { class: "es-spill" },
    el("thead", undefined, el("tr", undefined, ...header.map((cell) => el("th", { attrs: { scope: "col" } }, cell)))),
    el(
      "tbody",
      undefined,
      ...body.map((cells) =>
        el("tr", undefined, ...cells.map((cell, c) => (c === 0 ? el("th", { attrs: { scope: "row" } }, cell) : el("td", undefined, cell)))),
      ),
    ),
  );
  // A narrow pane scrolls the table sideways rather than squeezing its eight columns.
  return el("div", { class: "es-spill-box", attrs: { role: "region", "aria-label": "Table by group", tabindex: "0" } }, table);
}

/**
 * Builds the Result step under `heading`.
 *
 * @example
 * const page = resultPage(heading, events); page.render(resultView(state, callFunction));
 */
export function resultPage(heading: HTMLElement, events: ResultEvents): ResultPage {
  const previewBody = el("tbody");
  const previewTable = el(
    "table",
    { class: "es-preview" },
    el("caption", undefined, "Preview, computed now from the data"),
    el(
      "thead",
      undefined,
      el(
        "tr",
        undefined,
        el("th", { attrs: { scope: "col" } }, "Line of the block"),
        el("th", { attrs: { scope: "col" } }, "Its value with the data as they are now"),
      ),
    ),
    previewBody,
  );
  const plotBox = el("div", { class: "es-plot-box" });
  const plotCaption = el("figcaption", { class: "es-hint" });
  const plotFigure = el("figure", { class: "es-figure" }, plotBox, plotCaption);
  const nullBox = el("div", { class: "es-plot-box" });
  const nullCaption = el("figcaption", { class: "es-hint" });
  const nullFigure = el("figure", { class: "es-figure" }, nullBox, nullCaption);
  const nullId = newId("null");
  const nullCheck = el("input", { id: nullId, attrs: { type: "checkbox" } });
  nullCheck.addEventListener("change", () => events.showNull(nullCheck.checked));
  const nullRow = el(
    "div",
    { class: "es-check" },
    nullCheck,
    el("label", { attrs: { for: nullId } }, "Also show the count’s distribution if H0 holds"),
  );
  const formulaList = el("ol", { class: "es-formulas" });
  const formulas = el("details", { class: "es-details" }, el("summary", undefined, "Formulas the block will hold"), formulaList);
  const targetField = field(
    "Top-left cell of the block",
    textInput("", { autocomplete: "off" }),
    "",
    button("Use the selection", "secondary", () => events.targetFromSelection()),
  );
  targetField.control.addEventListener("input", () => events.target(targetField.control.value));
  const referenceRecap = el("p", { class: "es-note" });
  const chartId = newId("chart");
  const chartCheck = el("input", { id: chartId, attrs: { type: "checkbox", "aria-describedby": `${chartId}-hint` } });
  chartCheck.addEventListener("change", () => events.chart(chartCheck.checked));
  const chartHint = el("p", { class: "es-hint", id: `${chartId}-hint` });
  const chartRow = el(
    "div",
    { class: "es-check" },
    chartCheck,
    el("label", { attrs: { for: chartId } }, "Also add a chart of the values against H0 and the bounds"),
  );
  const writeButton = button("Write the block", "primary", () => events.write(false));
  const confirmTitle = el("h3", { attrs: { tabindex: "-1" } }, "Some of these cells are not empty");
  const confirmList = el("ul", { class: "es-filled" });
  const confirmBox = el(
    "div",
    { class: "es-confirm", attrs: { role: "group", "aria-labelledby": (confirmTitle.id = newId("confirm")) } },
    confirmTitle,
    el("p", undefined, "Writing the block here would replace what they hold:"),
    confirmList,
    el(
      "div",
      { class: "es-actions" },
      button("Replace them", "primary", () => events.write(true)),
      button("Keep them", "secondary", () => events.keep()),
    ),
  );
  const element = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": heading.id } },
    heading,
    previewTable,
    el(
      "div",
      { class: "es-actions" },
      button("Copy as text", "secondary", () => events.copy()),
    ),
    plotFigure,
    nullRow,
    nullFigure,
    formulas,
    targetField.element,
    referenceRecap,
    chartRow,
    chartHint,
    el(
      "div",
      { class: "es-actions" },
      writeButton,
      button("Read the data again", "secondary", () => events.reread()),
    ),
    confirmBox,
    el(
      "div",
      { class: "es-actions" },
      button("Back", "secondary", () => events.back()),
      button("Start over", "quiet", () => events.startOver()),
    ),
  );

  function render(view: ResultView): void {
    replaceChildren(
      previewBody,
      ...view.rows.map((row) =>
        row.table
          ? el("tr", { class: "es-row-spill" }, el("td", { attrs: { colspan: "2" } }, spilledTable(row.table.shown)))
          : el(
              "tr",
              { class: `es-row-${row.style}` },
              el("th", { attrs: { scope: "row" } }, row.label),
              el(
                "td",
                undefined,
                row.shown === "" ? "—" : row.shown,
                row.message ? el("span", { class: "es-cell-message" }, row.message) : null,
              ),
            ),
      ),
    );
    if (view.rows.length > 0) {
      replaceChildren(
        formulaList,
        ...view.rows.map((row) =>
          el("li", undefined, el("span", { class: "es-formula-label" }, row.label), el("code", undefined, ...formulaParts(row.formula))),
        ),
      );
    }
    replaceChildren(plotBox, view.plot ? numberLinePlot(view.plot) : null);
    show(plotFigure, view.plot !== null);
    if (view.plot) plotCaption.textContent = view.caption;
    show(nullRow, view.countTest);
    replaceChildren(nullBox, view.bars.length > 0 ? nullDistributionPlot(view.bars, view.barsWhat) : null);
    if (view.tooManyBars) nullBox.appendChild(el("p", { class: "es-hint" }, "Too many values to draw the distribution."));
    nullCaption.textContent = view.barsCaption;
    show(nullFigure, view.bars.length > 0 || view.tooManyBars);
    if (view.rows.length > 0) {
      if (targetField.control.value !== view.target) targetField.control.value = view.target;
      targetField.hint.textContent = view.targetHint;
      setProblem(targetField, view.targetProblem);
      referenceRecap.textContent = view.recap;
      chartCheck.disabled = !view.chartAvailable;
      chartHint.textContent = view.chartHint;
    }
    chartCheck.checked = view.chart;
    writeButton.textContent = view.makesTable ? "Make the table and write the block" : "Write the block";
    writeButton.disabled = view.busy;
    writeButton.setAttribute("aria-busy", view.busy ? "true" : "false");
    show(confirmBox, view.confirm !== null);
    // Every filled cell is listed: the agreement covers exactly what is shown here.
    replaceChildren(
      confirmList,
      ...(view.confirm?.consent.filled ?? []).map((f) => el("li", undefined, el("strong", undefined, f.address), ": ", f.content)),
    );
  }

  return { element, targetInput: targetField.control, confirmTitle, render, targetProblem: (message) => setProblem(targetField, message) };
}
