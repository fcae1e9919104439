/**
 * The Question step's page: the test, the quantile, the direction of the
 * claim and the hypothesised value, with the hypotheses in notation. It
 * renders a QuestionView (questionState.ts) and forwards events.
 *
 * Cost: O(1) nodes per render.
 */
import type { BlockTest } from "../report/resultBlock";
import type { Alternative } from "../stats/types";
import { button, field, radioGroup, selectControl, setProblem, textInput, type Choice } from "./controls";
import { el, show } from "./dom";
import type { QuestionView } from "./questionState";

const TEST_CHOICES: readonly Choice<BlockTest>[] = [
  { value: "sign", label: "Sign test", hint: "Fewest assumptions: it only counts values above and below. The default." },
  {
    value: "signed-rank",
    label: "Signed-rank test (Wilcoxon)",
    hint: "More power, if the values (for pairs: second minus first) lie roughly symmetric about their centre.",
  },
  {
    value: "quantile",
    label: "A quantile other than the median",
    hint: "For example the 0.9 quantile: is 90% of the output below a limit?",
  },
];

const ALTERNATIVE_CHOICES: readonly Choice<Alternative>[] = [
  { value: "two-sided", label: "different from" },
  { value: "greater", label: "above" },
  { value: "less", label: "below" },
];

export interface QuestionEvents {
  test(test: BlockTest): void;
  quantile(text: string): void;
  alternative(alternative: Alternative): void;
  center(text: string): void;
  back(): void;
  next(): void;
}

export interface QuestionPage {
  readonly element: HTMLElement;
  render(view: QuestionView): void;
}

/**
 * Builds the Question step under `heading`.
 *
 * @example
 * const page = questionPage(heading, events); page.render(questionView(state, false));
 */
export function questionPage(heading: HTMLElement, events: QuestionEvents): QuestionPage {
  const testGroup = radioGroup<BlockTest>("Which test?", TEST_CHOICES, "sign", (value) => events.test(value));
  const quantileField = field(
    "Quantile (between 0 and 1)",
    textInput("0.9", { inputmode: "decimal" }),
    "0.5 is the median; 0.9 leaves 90% of the values below it.",
  );
  quantileField.control.addEventListener("input", () => events.quantile(quantileField.control.value));
  const alternativeField = field(
    "The median of the values is",
    selectControl(ALTERNATIVE_CHOICES, "two-sided"),
    "The direction of the claim: “different from” looks both ways.",
  );
  alternativeField.control.addEventListener("change", () => events.alternative(alternativeField.control.value as Alternative));
  const centerField = field(
    "Hypothesised median",
    textInput("", { inputmode: "decimal" }),
    "The value the claim is compared with, such as a target.",
  );
  centerField.control.addEventListener("input", () => events.center(centerField.control.value));
  const h0 = el("p", { class: "es-formula" });
  const h1 = el("p", { class: "es-formula" });
  const symbolNote = el("p", { class: "es-hint" });
  const notationBox = el(
    "div",
    { class: "es-notation", attrs: { "aria-label": "The hypotheses in notation", role: "group" } },
    h0,
    h1,
    symbolNote,
  );
  const element = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": heading.id } },
    heading,
    testGroup.element,
    quantileField.element,
    el("fieldset", { class: "es-group" }, el("legend", undefined, "The claim"), alternativeField.element, centerField.element),
    notationBox,
    el(
      "div",
      { class: "es-actions" },
      button("Back", "secondary", () => events.back()),
      button("Next: settings", "primary", () => events.next()),
    ),
  );

  function render(view: QuestionView): void {
    show(testGroup.element, view.showTests);
    if (view.showTests) testGroup.set(view.test);
    testGroup.enable("quantile", view.quantileAvailable, "it takes one set of values in the sheet.");
    testGroup.enable("signed-rank", view.signedRankAvailable, "a database query's answer holds the sign counts only.");
    show(quantileField.element, view.showQuantile);
    alternativeField.label.textContent = view.subjectLabel;
    if (alternativeField.control.value !== view.question.alternative) alternativeField.control.value = view.question.alternative;
    centerField.label.textContent = view.centerLabel;
    if (centerField.control.value !== view.question.center) centerField.control.value = view.question.center;
    if (quantileField.control.value !== view.question.quantile) quantileField.control.value = view.question.quantile;
    setProblem(centerField, view.centerProblem);
    setProblem(quantileField, view.quantileProblem);
    h0.textContent = view.h0;
    h1.textContent = view.h1;
    symbolNote.textContent = view.symbol;
  }

  return { element, render };
}
