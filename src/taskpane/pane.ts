/**
 * The guided side pane: Data → Question → Settings → Result, ending in a live
 * result block of EVENSPLIT formulas written beside the data.
 *
 * Method: the page is built once from DOM nodes (dom.ts: text nodes only, no
 * markup strings) and a single `refresh` brings every dynamic part in line
 * with the pane's state, so typing never loses focus. All workbook access
 * goes through the host (host.ts) by way of workflow.ts; the preview runs the
 * catalogue's own functions. Every control is a native, labelled form
 * control; moving to a step puts the focus on its heading; messages go to a
 * polite live region.
 *
 * Cost: O(cells of the data) per refresh of the preview.
 */
import { resultBlockRows, type BlockRequest, type BlockTest, type CatalogueCall } from "../report/resultBlock";
import { pairedDifferences } from "../stats/differences";
import { EXACT_AUTO_LIMIT, EXACT_LIMIT } from "../stats/signedRank";
import { numbersFromCells, pairsFromCells } from "../stats/cells";
import type { Alternative, SignTestMethod, SignedRankMethod, TieRule, ZeroRule } from "../stats/types";
import { formatAddress, type CellRect } from "./a1";
import { el, replaceChildren, show } from "./dom";
import type { Host } from "./host";
import { nullBars } from "./plot";
import { nullDistributionPlot, numberLinePlot } from "./plotView";
import { blockPreview, type PreviewRow } from "./preview";
import { buildRequest, notation, type FieldName, type QuestionForm, type SettingsForm } from "./request";
import { absoluteReference, openEnded } from "./references";
import {
  analyzeRange,
  blockInputs,
  blockRefs,
  bodyOf,
  chartSource,
  dataProblem,
  defaultPlace,
  placeFromText,
  referenceOptions,
  tablesToCreate,
  writeResult,
  type AnalyzedRange,
  type DataChoice,
  type Consent,
  type ReferenceChoice,
  type WriteOutcome,
} from "./workflow";
import { onSheet, wordingRequest } from "./writePlan";

export interface PaneOptions {
  readonly host: Host;
  /** Runs a catalogue function by id: the preview's calculator (functions.ts callFunction). */
  readonly calculate: CatalogueCall;
}

const STEPS = ["Data", "Question", "Settings", "Result"] as const;

interface RangeSlot {
  text: string;
  range: AnalyzedRange | null;
  useHeader: boolean;
  problem: string | null;
}

interface State {
  step: number;
  paired: boolean;
  slots: [RangeSlot, RangeSlot];
  reference: ReferenceChoice;
  question: QuestionForm;
  settings: SettingsForm;
  target: string;
  targetEdited: boolean;
  chart: boolean;
  showNull: boolean;
  confirm: { place: string; consent: Consent } | null;
  busy: boolean;
}

let idCounter = 0;
function newId(stem: string): string {
  idCounter++;
  return `es-${stem}-${idCounter}`;
}

interface Choice<T extends string> {
  readonly value: T;
  readonly label: string;
  readonly hint?: string;
}

interface RadioGroup<T extends string> {
  readonly element: HTMLFieldSetElement;
  set(value: T): void;
  enable(value: T, available: boolean, reason?: string): void;
}

function radioGroup<T extends string>(legend: string, choices: readonly Choice<T>[], initial: T, onChange: (value: T) => void): RadioGroup<T> {
  const name = newId("radio");
  const inputs = new Map<T, { input: HTMLInputElement; reason: HTMLElement }>();
  const element = el("fieldset", { class: "es-group" }, el("legend", undefined, legend));
  for (const choice of choices) {
    const id = newId("option");
    const hintId = newId("hint");
    const input = el("input", { id, attrs: { type: "radio", name, value: choice.value, "aria-describedby": hintId } });
    input.checked = choice.value === initial;
    input.addEventListener("change", () => {
      if (input.checked) onChange(choice.value);
    });
    const reason = el("span", { class: "es-reason" });
    element.appendChild(
      el(
        "div",
        { class: "es-choice" },
        input,
        el("label", { attrs: { for: id } }, choice.label),
        el("p", { class: "es-hint", id: hintId }, choice.hint ?? "", reason),
      ),
    );
    inputs.set(choice.value, { input, reason });
  }
  return {
    element,
    set(value: T) {
      for (const [v, { input }] of inputs) input.checked = v === value;
    },
    enable(value: T, available: boolean, reason?: string) {
      const entry = inputs.get(value);
      if (!entry) return;
      entry.input.disabled = !available;
      entry.reason.textContent = available || !reason ? "" : ` Not available: ${reason}`;
    },
  };
}

interface Field<E extends HTMLElement> {
  readonly element: HTMLElement;
  readonly control: E;
  readonly label: HTMLLabelElement;
  readonly hint: HTMLElement;
  readonly problem: HTMLElement;
}

function field<E extends HTMLInputElement | HTMLSelectElement>(labelText: string, control: E, hintText: string, extra?: Node): Field<E> {
  const id = newId("field");
  const hintId = newId("hint");
  const problemId = newId("problem");
  control.id = id;
  control.setAttribute("aria-describedby", `${hintId} ${problemId}`);
  const label = el("label", { attrs: { for: id } }, labelText);
  const hint = el("p", { class: "es-hint", id: hintId }, hintText);
  const problem = el("p", { class: "es-problem", id: problemId });
  const row = el("div", { class: "es-control-row" }, control, extra ?? null);
  return { element: el("div", { class: "es-field" }, label, row, hint, problem), control, label, hint, problem };
}

function textInput(value: string, options: { inputmode?: string; autocomplete?: string } = {}): HTMLInputElement {
  const input = el("input", { attrs: { type: "text", spellcheck: "false", autocomplete: options.autocomplete ?? "off", ...(options.inputmode ? { inputmode: options.inputmode } : {}) } });
  input.value = value;
  return input;
}

function selectControl<T extends string>(choices: readonly Choice<T>[], initial: T): HTMLSelectElement {
  const select = el("select");
  for (const choice of choices) {
    const option = el("option", { attrs: { value: choice.value } }, choice.label);
    option.selected = choice.value === initial;
    select.appendChild(option);
  }
  return select;
}

function setProblem(f: Field<HTMLElement>, message: string | null): void {
  f.problem.textContent = message ?? "";
  if (message) f.control.setAttribute("aria-invalid", "true");
  else f.control.removeAttribute("aria-invalid");
}

function button(text: string, kind: "primary" | "secondary" | "quiet", onClick: () => void): HTMLButtonElement {
  const b = el("button", { class: `es-button es-${kind}`, attrs: { type: "button" } }, text);
  b.addEventListener("click", onClick);
  return b;
}

const TEST_CHOICES: readonly Choice<BlockTest>[] = [
  { value: "sign", label: "Sign test", hint: "Fewest assumptions: it only counts values above and below. The default." },
  { value: "signed-rank", label: "Signed-rank test (Wilcoxon)", hint: "More power, if the differences are roughly symmetric about their centre." },
  { value: "quantile", label: "A quantile other than the median", hint: "For example the 0.9 quantile: is 90% of the output below a limit?" },
];

const ALTERNATIVE_CHOICES: readonly Choice<Alternative>[] = [
  { value: "two-sided", label: "different from" },
  { value: "greater", label: "above" },
  { value: "less", label: "below" },
];

const TIE_CHOICES: readonly Choice<TieRule>[] = [
  { value: "drop", label: "Leave them out (default)", hint: "A tie says nothing about the direction, so the test uses the other values." },
  { value: "split", label: "Share them between below and above", hint: "Keeps them in n; with an odd number of ties, one is left out." },
  { value: "conservative", label: "Count them against the claim", hint: "The most cautious choice: the p-value can only grow." },
];

const SIGN_METHOD_CHOICES: readonly Choice<SignTestMethod>[] = [
  { value: "exact", label: "Exact binomial (default)", hint: "Exact probabilities: the chance of a false alarm never exceeds alpha." },
  { value: "midp", label: "Mid-p", hint: "Counts half the probability of the observed count: closer to alpha on average, but may exceed it." },
  { value: "normal", label: "Normal approximation", hint: "For very large samples; continuity-corrected." },
];

const RANK_METHOD_CHOICES: readonly Choice<SignedRankMethod>[] = [
  {
    value: "auto",
    label: "Exact when feasible (default)",
    hint: `Exact distribution up to ${EXACT_AUTO_LIMIT.toLocaleString("en-US")} non-zero differences, normal approximation beyond; the block states which ran.`,
  },
  {
    value: "exact",
    label: "Exact",
    hint: `Exact distribution given the ties, for up to ${EXACT_LIMIT.toLocaleString("en-US")} non-zero differences (slower as they grow); beyond that the cells answer #N/A and say so.`,
  },
  { value: "normal", label: "Normal approximation", hint: "With continuity and tie corrections." },
];

const ZERO_CHOICES: readonly Choice<ZeroRule>[] = [
  { value: "drop", label: "Leave zero differences out (default)", hint: "Values equal to the hypothesised value are set aside before ranking." },
  { value: "pratt", label: "Rank them, then leave them out of V (Pratt)", hint: "Zeros take part in the ranking, which shifts the other ranks up." },
];

function hintFor<T extends string>(choices: readonly Choice<T>[], value: T): string {
  return choices.find((c) => c.value === value)?.hint ?? "";
}

const PAST_EDGE = "The block does not fit on the sheet there (1,048,576 rows, columns A to XFD): pick a top-left cell further up or to the left.";

function errorMessage(thrown: unknown): string {
  return thrown instanceof Error && thrown.message ? thrown.message : "The workbook did not answer.";
}

/** Numbers for the plot: the values, or the paired differences second − first. */
function plotValues(choices: readonly DataChoice[]): Float64Array {
  const bodies = choices.map(bodyOf);
  if (bodies.length === 1) return numbersFromCells(bodies[0].values).values;
  const pairs = pairsFromCells(bodies[0].values, bodies[1].values);
  return pairedDifferences(pairs.first, pairs.second, 0);
}

function numberOrNull(value: unknown): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

/**
 * Builds the pane inside `root` and wires it to the workbook.
 *
 * @example
 * mountPane(document.getElementById("app")!, { host: createHost((b) => Excel.run(b)), calculate: callFunction });
 */
export function mountPane(root: HTMLElement, options: PaneOptions): void {
  const { host, calculate } = options;
  const emptySlot = (): RangeSlot => ({ text: "", range: null, useHeader: true, problem: null });
  const state: State = {
    step: 0,
    paired: false,
    slots: [emptySlot(), emptySlot()],
    reference: "exact",
    question: { test: "sign", alternative: "two-sided", center: "", quantile: "0.9" },
    settings: { alpha: "0.05", confidence: "0.95", ties: "drop", signMethod: "exact", rankMethod: "auto", zeros: "drop" },
    target: "",
    targetEdited: false,
    chart: false,
    showNull: false,
    confirm: null,
    busy: false,
  };

  const status = el("p", { class: "es-status", attrs: { role: "status", "aria-live": "polite" } });
  const say = (message: string): void => {
    status.textContent = message;
  };

  const choices = (): DataChoice[] => {
    const used = state.paired ? state.slots : [state.slots[0]];
    return used.flatMap((slot) => (slot.range ? [{ range: slot.range, useHeader: slot.useHeader }] : []));
  };
  const dataReady = (): boolean => {
    const c = choices();
    return c.length === (state.paired ? 2 : 1) && dataProblem(c) === null;
  };
  const currentRequest = (): ReturnType<typeof buildRequest> => {
    const c = choices();
    const names = c.map((choice) => bodyOf(choice).name);
    return buildRequest(state.paired, state.question, state.settings, { data: names[0], second: names[1] });
  };
  const problemsFor = (fields: readonly FieldName[]): { field: FieldName; message: string }[] => {
    const built = currentRequest();
    return built.ok ? [] : built.problems.filter((p) => fields.includes(p.field));
  };

  // ---- Step navigation -----------------------------------------------------
  const stepButtons = STEPS.map((name, i) =>
    button(`${i + 1}. ${name}`, "quiet", () => {
      void goTo(i);
    }),
  );
  const nav = el("nav", { class: "es-steps", attrs: { "aria-label": "Steps" } }, el("ol", undefined, ...stepButtons.map((b) => el("li", undefined, b))));
  const headings = STEPS.map((name, i) => el("h2", { attrs: { tabindex: "-1" } }, `${i + 1}. ${name}`));

  // ---- Step 1: Data --------------------------------------------------------
  const kindGroup = radioGroup<"one" | "pairs">(
    "What kind of data?",
    [
      { value: "one", label: "One set of values", hint: "Test where the median of one column lies." },
      { value: "pairs", label: "Pairs of values", hint: "Two columns, a first and a second value for each item (such as before and after); the test looks at second − first." },
    ],
    "one",
    (value) => {
      state.paired = value === "pairs";
      if (state.paired && state.question.test === "quantile") state.question = { ...state.question, test: "sign" };
      if (state.paired && state.question.center.trim() === "") state.question = { ...state.question, center: "0" };
      refresh();
    },
  );

  const slotViews = state.slots.map((_, index) => {
    const input = textInput("", { autocomplete: "off" });
    const pick = button("Use the selection", "secondary", () => void useSelection(index));
    const f = field(index === 0 ? "Values" : "Second values", input, "A range such as B1:B25; the first row may hold the name.", pick);
    const summary = el("p", { class: "es-summary", attrs: { "aria-live": "polite" } });
    const headerId = newId("header");
    const headerBox = el("input", { id: headerId, attrs: { type: "checkbox" } });
    headerBox.checked = true;
    const headerRow = el("div", { class: "es-check" }, headerBox, el("label", { attrs: { for: headerId } }, "The first row is a name: leave it out of the test"));
    input.addEventListener("change", () => void analyzeSlot(index, input.value));
    input.addEventListener("keydown", (event) => {
      if (event.key === "Enter") {
        event.preventDefault();
        void analyzeSlot(index, input.value);
      }
    });
    headerBox.addEventListener("change", () => {
      state.slots[index].useHeader = headerBox.checked;
      refresh();
    });
    const element = el("div", { class: "es-slot" }, f.element, summary, headerRow);
    return { element, field: f, input, summary, headerBox, headerRow };
  });

  const referenceGroup = radioGroup<ReferenceChoice>(
    "When rows are added later",
    [
      { value: "exact", label: "Use exactly these cells", hint: "Nothing in the workbook changes." },
      { value: "table", label: "Turn the range into a table", hint: "Rows added to the table then count automatically." },
      { value: "open", label: "Read down to the end of the sheet", hint: "Values typed below count too." },
    ],
    "exact",
    (value) => {
      state.reference = value;
      state.confirm = null;
      refresh();
    },
  );
  const referenceNote = el("p", { class: "es-note", attrs: { "aria-live": "polite" } });
  const dataProblemText = el("p", { class: "es-problem", attrs: { "aria-live": "polite" } });
  const dataStep = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": (headings[0].id = newId("step")) } },
    headings[0],
    el("p", { class: "es-intro" }, "Choose the cells with your measurements. Blank cells, text and TRUE/FALSE are skipped and counted."),
    kindGroup.element,
    slotViews[0].element,
    slotViews[1].element,
    referenceGroup.element,
    referenceNote,
    dataProblemText,
    el("div", { class: "es-actions" }, button("Next: the question", "primary", () => void goTo(1))),
  );

  // ---- Step 2: Question ----------------------------------------------------
  const testGroup = radioGroup<BlockTest>("Which test?", TEST_CHOICES, "sign", (value) => {
    state.question = { ...state.question, test: value };
    refresh();
  });
  const quantileField = field("Quantile (between 0 and 1)", textInput("0.9", { inputmode: "decimal" }), "0.5 is the median; 0.9 leaves 90% of the values below it.");
  quantileField.control.addEventListener("input", () => {
    state.question = { ...state.question, quantile: quantileField.control.value };
    refresh();
  });
  const alternativeField = field("The median of the values is", selectControl(ALTERNATIVE_CHOICES, "two-sided"), "The direction of the claim: “different from” looks both ways.");
  alternativeField.control.addEventListener("change", () => {
    state.question = { ...state.question, alternative: alternativeField.control.value as Alternative };
    refresh();
  });
  const centerField = field("Hypothesised median", textInput("", { inputmode: "decimal" }), "The value the claim is compared with, such as a target.");
  centerField.control.addEventListener("input", () => {
    state.question = { ...state.question, center: centerField.control.value };
    refresh();
  });
  const h0 = el("p", { class: "es-formula" });
  const h1 = el("p", { class: "es-formula" });
  const symbolNote = el("p", { class: "es-hint" });
  const notationBox = el("div", { class: "es-notation", attrs: { "aria-label": "The hypotheses in notation", role: "group" } }, h0, h1, symbolNote);
  const questionStep = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": (headings[1].id = newId("step")) } },
    headings[1],
    testGroup.element,
    quantileField.element,
    el("fieldset", { class: "es-group" }, el("legend", undefined, "The claim"), alternativeField.element, centerField.element),
    notationBox,
    el("div", { class: "es-actions" }, button("Back", "secondary", () => void goTo(0)), button("Next: settings", "primary", () => void goTo(2))),
  );

  // ---- Step 3: Settings ----------------------------------------------------
  const alphaField = field("Alpha (significance level)", textInput("0.05", { inputmode: "decimal" }), "The risk you accept of rejecting H₀ when it is true. A common choice is 0.05.");
  alphaField.control.addEventListener("input", () => {
    state.settings = { ...state.settings, alpha: alphaField.control.value };
    refresh();
  });
  const confidenceField = field(
    "Confidence level of the bounds",
    textInput("0.95", { inputmode: "decimal" }),
    "The bounds cover the true value at least this often; the block also shows the level actually reached.",
  );
  confidenceField.control.addEventListener("input", () => {
    state.settings = { ...state.settings, confidence: confidenceField.control.value };
    refresh();
  });
  const tiesField = field("Values equal to the hypothesised value (ties)", selectControl(TIE_CHOICES, "drop"), hintFor(TIE_CHOICES, "drop"));
  tiesField.control.addEventListener("change", () => {
    state.settings = { ...state.settings, ties: tiesField.control.value as TieRule };
    refresh();
  });
  const signMethodField = field("How the p-value is computed", selectControl(SIGN_METHOD_CHOICES, "exact"), hintFor(SIGN_METHOD_CHOICES, "exact"));
  signMethodField.control.addEventListener("change", () => {
    state.settings = { ...state.settings, signMethod: signMethodField.control.value as SignTestMethod };
    refresh();
  });
  const rankMethodField = field("How the p-value is computed", selectControl(RANK_METHOD_CHOICES, "auto"), hintFor(RANK_METHOD_CHOICES, "auto"));
  rankMethodField.control.addEventListener("change", () => {
    state.settings = { ...state.settings, rankMethod: rankMethodField.control.value as SignedRankMethod };
    refresh();
  });
  const zerosField = field("Differences of zero", selectControl(ZERO_CHOICES, "drop"), hintFor(ZERO_CHOICES, "drop"));
  zerosField.control.addEventListener("change", () => {
    state.settings = { ...state.settings, zeros: zerosField.control.value as ZeroRule };
    refresh();
  });
  const quantileNote = el("p", { class: "es-note" }, "The quantile test is exact and leaves out values equal to the hypothesised value.");
  const settingsStep = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": (headings[2].id = newId("step")) } },
    headings[2],
    alphaField.element,
    confidenceField.element,
    tiesField.element,
    signMethodField.element,
    rankMethodField.element,
    zerosField.element,
    quantileNote,
    el("div", { class: "es-actions" }, button("Back", "secondary", () => void goTo(1)), button("Next: the result", "primary", () => void goTo(3))),
  );

  // ---- Step 4: Result ------------------------------------------------------
  const previewBody = el("tbody");
  const previewTable = el(
    "table",
    { class: "es-preview" },
    el("caption", undefined, "Preview, computed now from the data"),
    el("thead", undefined, el("tr", undefined, el("th", { attrs: { scope: "col" } }, "Row"), el("th", { attrs: { scope: "col" } }, "Value"))),
    previewBody,
  );
  const plotBox = el("div", { class: "es-plot-box" });
  const plotCaption = el("figcaption", { class: "es-hint" });
  const nullBox = el("div", { class: "es-plot-box" });
  const nullId = newId("null");
  const nullCheck = el("input", { id: nullId, attrs: { type: "checkbox" } });
  nullCheck.addEventListener("change", () => {
    state.showNull = nullCheck.checked;
    refresh();
  });
  const nullRow = el("div", { class: "es-check" }, nullCheck, el("label", { attrs: { for: nullId } }, "Also show the count’s distribution if H₀ holds"));
  const formulaList = el("ol", { class: "es-formulas" });
  const formulas = el("details", { class: "es-details" }, el("summary", undefined, "Formulas the block will hold"), formulaList);
  const targetField = field("Top-left cell of the block", textInput("", { autocomplete: "off" }), "", button("Use the selection", "secondary", () => void useSelectionAsTarget()));
  targetField.control.addEventListener("input", () => {
    state.target = targetField.control.value;
    state.targetEdited = true;
    state.confirm = null;
    refresh();
  });
  const referenceRecap = el("p", { class: "es-note" });
  const chartId = newId("chart");
  const chartCheck = el("input", { id: chartId, attrs: { type: "checkbox", "aria-describedby": `${chartId}-hint` } });
  chartCheck.addEventListener("change", () => {
    state.chart = chartCheck.checked;
    refresh();
  });
  const chartHint = el("p", { class: "es-hint", id: `${chartId}-hint` });
  const chartRow = el("div", { class: "es-check" }, chartCheck, el("label", { attrs: { for: chartId } }, "Also add a chart of the data beside the block"));
  const writeButton = button("Write the block", "primary", () => void write(false));
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
      button("Replace them", "primary", () => void write(true)),
      button("Keep them", "secondary", () => {
        state.confirm = null;
        refresh();
        targetField.control.focus();
        say("Nothing was written. Choose another place for the block.");
      }),
    ),
  );
  const resultStep = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": (headings[3].id = newId("step")) } },
    headings[3],
    previewTable,
    el("figure", { class: "es-figure" }, plotBox, nullBox, plotCaption),
    nullRow,
    formulas,
    targetField.element,
    referenceRecap,
    chartRow,
    chartHint,
    el("div", { class: "es-actions" }, writeButton, button("Read the data again", "secondary", () => void rereadData())),
    confirmBox,
    el("div", { class: "es-actions" }, button("Back", "secondary", () => void goTo(2)), button("Start over", "quiet", () => void goTo(0))),
  );

  const steps = [dataStep, questionStep, settingsStep, resultStep];
  replaceChildren(
    root,
    el(
      "div",
      { class: "es-pane" },
      el("header", { class: "es-header" }, el("h1", undefined, "Evensplit"), el("p", undefined, "Median tests without assumptions about the distribution")),
      nav,
      el("main", undefined, ...steps),
      status,
    ),
  );

  // ---- Behaviour -----------------------------------------------------------
  let preview: PreviewRow[] = [];

  async function analyzeSlot(index: number, text: string): Promise<void> {
    const slot = state.slots[index];
    slot.text = text;
    state.confirm = null;
    if (text.trim() === "") {
      slot.range = null;
      slot.problem = null;
      refresh();
      return;
    }
    try {
      const analysis = await analyzeRange(host, text);
      slot.range = analysis.ok ? analysis.range : null;
      slot.problem = analysis.ok ? null : analysis.message;
      if (analysis.ok) {
        slot.useHeader = analysis.range.header !== null;
        slot.text = formatAddress(analysis.range.rect, analysis.range.sheet);
        slotViews[index].input.value = slot.text;
      }
    } catch (thrown) {
      slot.range = null;
      slot.problem = `The range could not be read: ${errorMessage(thrown)}`;
    }
    refresh();
  }

  async function useSelection(index: number): Promise<void> {
    try {
      const address = await host.selection();
      slotViews[index].input.value = address;
      await analyzeSlot(index, address);
      say(`Read ${slotViews[index].input.value}.`);
    } catch (thrown) {
      say(`The selection could not be read: ${errorMessage(thrown)}`);
    }
  }

  async function useSelectionAsTarget(): Promise<void> {
    try {
      const address = await host.selection();
      const top = address.split(":")[0];
      state.target = top;
      state.targetEdited = true;
      state.confirm = null;
      targetField.control.value = top;
      refresh();
    } catch (thrown) {
      say(`The selection could not be read: ${errorMessage(thrown)}`);
    }
  }

  async function rereadData(): Promise<void> {
    const used = state.paired ? [0, 1] : [0];
    for (const i of used) if (state.slots[i].text) await analyzeSlot(i, state.slots[i].text);
    await placeBlock();
    refresh();
    say("The data were read again.");
  }

  function stepProblems(step: number): string | null {
    if (step === 0) {
      const c = choices();
      if (c.length < (state.paired ? 2 : 1)) return state.paired ? "Give both ranges first." : "Give the range with the values first.";
      return dataProblem(c);
    }
    if (step === 1) return problemsFor(["center", "quantile"])[0]?.message ?? null;
    if (step === 2) return problemsFor(["alpha", "confidence"])[0]?.message ?? null;
    return null;
  }

  async function placeBlock(): Promise<void> {
    const built = currentRequest();
    if (!built.ok || !dataReady() || state.targetEdited) return;
    try {
      const place = await defaultPlace(host, choices(), resultBlockRows(built.request).length);
      state.target = formatAddress({ ...place.rect, bottom: place.rect.top, right: place.rect.left });
      targetField.control.value = state.target;
    } catch (thrown) {
      say(`The sheet could not be searched for an empty place: ${errorMessage(thrown)}`);
    }
  }

  async function goTo(step: number): Promise<void> {
    for (let s = 0; s < step; s++) {
      const problem = stepProblems(s);
      if (problem) {
        state.step = s;
        refresh(true);
        say(problem);
        focusFirstProblem(s);
        return;
      }
    }
    state.step = step;
    if (step === 3) await placeBlock();
    refresh();
    headings[step].focus();
  }

  function focusFirstProblem(step: number): void {
    const invalid = steps[step].querySelector<HTMLElement>("[aria-invalid='true']");
    (invalid ?? headings[step]).focus();
  }

  function targetPlace(request: BlockRequest): { sheet: string; rect: CellRect } | null {
    const c = choices();
    if (c.length === 0) return null;
    return placeFromText(state.target, c[0].range.sheet, resultBlockRows(request).length);
  }

  async function write(agreed: boolean): Promise<void> {
    const built = currentRequest();
    if (!built.ok || !dataReady() || state.busy) return;
    const target = targetPlace(built.request);
    if (!target || !onSheet(target.rect)) {
      setProblem(targetField, target ? PAST_EDGE : "Type a cell address such as E1 for the block’s top-left corner.");
      targetField.control.focus();
      say(target ? PAST_EDGE : "Type a cell address such as E1 for the block’s top-left corner.");
      return;
    }
    const place = formatAddress(target.rect, target.sheet);
    // Consent holds only for the place, and the cells, the person was shown.
    const consent = agreed && state.confirm?.place === place ? state.confirm.consent : null;
    state.busy = true;
    refresh();
    let outcome: WriteOutcome;
    try {
      outcome = await writeResult(host, { choices: choices(), reference: state.reference, request: built.request, target, chart: state.chart, consent, calculate });
    } catch (thrown) {
      // writeResult only throws before the workbook was changed: while reading it or planning.
      state.busy = false;
      refresh();
      say(`Nothing was written: ${errorMessage(thrown)}`);
      return;
    }
    state.busy = false;
    if (outcome.kind === "confirm") {
      state.confirm = { place, consent: outcome.consent };
      refresh();
      const count = outcome.consent.filled.length;
      say(
        outcome.changed
          ? `The cells changed since they were listed, so nothing was written. Look at the list again: ${count} of them are not empty.`
          : `${count} of the cells at ${formatAddress(target.rect)} are not empty. Nothing was written yet.`,
      );
      confirmTitle.focus();
      return;
    }
    state.confirm = null;
    if (outcome.kind === "refused" || outcome.kind === "undone") {
      refresh();
      if (outcome.kind === "refused") setProblem(targetField, outcome.message);
      targetField.control.focus();
      say(outcome.message);
      return;
    }
    const chart = outcome.chartAt ? ` A chart was added at ${outcome.chartAt}.` : "";
    const made = outcome.created.length > 0 ? ` The data became table ${outcome.created.map((t) => t.name).join(" and ")}.` : "";
    const cleared = outcome.replaced.length > 0 ? ` The earlier block at ${outcome.replaced.map((b) => formatAddress(b.rect)).join(" and ")} was cleared first.` : "";
    const written = `The block was written to ${outcome.address} as formulas; it recalculates when the data change.${cleared}${made}${chart}`;
    say(written);
    if (outcome.created.length > 0) {
      state.reference = "exact";
      referenceGroup.set("exact");
      await rereadData();
      say(written);
    }
    refresh();
  }

  // ---- Refresh: bring every dynamic part in line with the state ------------
  function refreshData(): void {
    kindGroup.set(state.paired ? "pairs" : "one");
    show(slotViews[1].element, state.paired);
    slotViews[0].field.label.textContent = state.paired ? "First values (for example, before)" : "Values";
    slotViews[1].field.label.textContent = "Second values (for example, after)";
    state.slots.forEach((slot, i) => {
      const view = slotViews[i];
      setProblem(view.field, slot.problem);
      if (!slot.range) {
        view.summary.textContent = "";
        show(view.headerRow, false);
        return;
      }
      const body = bodyOf({ range: slot.range, useHeader: slot.useHeader });
      const { blank, text, boolean, other } = body.tally.skipped;
      const parts = [`${body.tally.numbers} numbers`, `${blank} blank`, `${text} text`];
      if (boolean > 0) parts.push(`${boolean} TRUE/FALSE`);
      if (other > 0) parts.push(`${other} errors`);
      const where = formatAddress(body.rect, body.sheet);
      const named = body.name === undefined ? "No name row." : slot.range.place.kind === "column" ? `Table column “${body.name}”.` : `Name: “${body.name}”.`;
      view.summary.textContent = `${where}: ${body.tally.cells} cells — ${parts.join(", ")}. ${named}`;
      const canToggle = slot.range.place.kind !== "column" && slot.range.header !== null;
      show(view.headerRow, canToggle);
      view.headerBox.checked = slot.useHeader;
    });
    const c = choices();
    const complete = c.length === (state.paired ? 2 : 1);
    const options = complete ? referenceOptions(c) : null;
    show(referenceGroup.element, options !== null && !options.allTableColumns);
    if (options && !options.allTableColumns) {
      referenceGroup.enable("table", options.table.available, options.table.reason);
      referenceGroup.enable("open", options.open.available, options.open.reason);
      if ((state.reference === "table" && !options.table.available) || (state.reference === "open" && !options.open.available)) {
        state.reference = "exact";
        referenceGroup.set("exact");
      }
    }
    referenceNote.textContent = complete ? referenceSentence(c, options) : "";
    dataProblemText.textContent = complete ? (dataProblem(c) ?? "") : "";
  }

  function referenceSentence(c: readonly DataChoice[], options: ReturnType<typeof referenceOptions> | null): string {
    const sheet = c[0].range.sheet;
    const refs = blockRefs(c, state.reference, [], sheet);
    const list = refs.second === undefined ? refs.data : `${refs.data} and ${refs.second}`;
    if (options?.allTableColumns) return `The block will refer to ${list}, so rows added to the table count automatically.`;
    if (state.reference === "table") {
      const rects = tablesToCreate(c).map((t) => formatAddress(t.rect));
      return `With your agreement, ${rects.join(" and ")} will become a table when the block is written, and the block will follow its columns, so rows added to the table count automatically.`;
    }
    if (state.reference === "open") {
      const open = c.map((choice) => absoluteReference(openEnded(bodyOf(choice).rect), sheet, sheet)).join(" and ");
      return `The block will read ${open}, down to the last row of the sheet, so values typed below count; keep anything else out of those columns.`;
    }
    return `The block will read exactly ${list}; values added below are not counted until you write the block again.`;
  }

  function refreshQuestion(): void {
    const test = state.paired && state.question.test === "quantile" ? "sign" : state.question.test;
    testGroup.set(test);
    testGroup.enable("quantile", !state.paired, "it takes one set of values.");
    show(quantileField.element, test === "quantile");
    const names = choices().map((choice) => bodyOf(choice).name);
    const subject = state.paired
      ? `The median of the differences (${names[1] ?? "second"} − ${names[0] ?? "first"}) is`
      : test === "quantile"
        ? `The ${state.question.quantile.trim() || "chosen"} quantile of ${names[0] ? `“${names[0]}”` : "the values"} is`
        : `The median of ${names[0] ? `“${names[0]}”` : "the values"} is`;
    alternativeField.label.textContent = subject;
    centerField.label.textContent = state.paired ? "Hypothesised shift (often 0)" : test === "quantile" ? "Hypothesised value of the quantile" : "Hypothesised median";
    if (centerField.control.value !== state.question.center) centerField.control.value = state.question.center;
    const problems = problemsFor(["center", "quantile"]);
    const showProblems = state.step >= 1 && (state.question.center !== "" || state.step > 1);
    setProblem(centerField, showProblems ? (problems.find((p) => p.field === "center")?.message ?? null) : null);
    setProblem(quantileField, problems.find((p) => p.field === "quantile")?.message ?? null);
    const center = Number(state.question.center.trim());
    const q = Number(state.question.quantile.trim());
    if (state.question.center.trim() !== "" && Number.isFinite(center)) {
      const n = notation({ test, paired: state.paired, center, alternative: state.question.alternative, quantile: Number.isFinite(q) ? q : 0.5 });
      h0.textContent = n.h0;
      h1.textContent = n.h1;
      symbolNote.textContent = n.symbol;
    } else {
      h0.textContent = "H₀: …";
      h1.textContent = "H₁: …";
      symbolNote.textContent = "Type the hypothesised value to see the hypotheses.";
    }
  }

  function refreshSettings(): void {
    const test = state.paired && state.question.test === "quantile" ? "sign" : state.question.test;
    const problems = problemsFor(["alpha", "confidence"]);
    setProblem(alphaField, problems.find((p) => p.field === "alpha")?.message ?? null);
    setProblem(confidenceField, problems.find((p) => p.field === "confidence")?.message ?? null);
    show(tiesField.element, test === "sign");
    show(signMethodField.element, test === "sign");
    show(rankMethodField.element, test === "signed-rank");
    show(zerosField.element, test === "signed-rank");
    show(quantileNote, test === "quantile");
    tiesField.hint.textContent = hintFor(TIE_CHOICES, state.settings.ties);
    signMethodField.hint.textContent = hintFor(SIGN_METHOD_CHOICES, state.settings.signMethod);
    rankMethodField.hint.textContent = hintFor(RANK_METHOD_CHOICES, state.settings.rankMethod);
    zerosField.hint.textContent = hintFor(ZERO_CHOICES, state.settings.zeros);
  }

  function refreshResult(): void {
    const built = currentRequest();
    // The preview runs the tests on the data: only while the Result step is shown.
    if (state.step !== 3 || !built.ok || !dataReady()) {
      preview = [];
      replaceChildren(previewBody);
      replaceChildren(plotBox);
      replaceChildren(nullBox);
      return;
    }
    const c = choices();
    const refs = blockRefs(c, state.reference, [], c[0].range.sheet);
    preview = blockPreview(wordingRequest(built.request), blockInputs(c), refs, calculate);
    replaceChildren(
      previewBody,
      ...preview.map((row) =>
        el(
          "tr",
          { class: `es-row-${row.style}` },
          el("th", { attrs: { scope: "row" } }, row.label),
          el("td", undefined, row.shown === "" ? "—" : row.shown, row.message ? el("span", { class: "es-cell-message" }, row.message) : null),
        ),
      ),
    );
    replaceChildren(formulaList, ...preview.map((row) => el("li", undefined, el("span", { class: "es-formula-label" }, row.label), el("code", undefined, row.formula))));
    const value = (key: string): unknown => preview.find((r) => r.key === key)?.value;
    const values = plotValues(c);
    const request = built.request;
    const what = state.paired ? "differences" : "values";
    replaceChildren(plotBox, numberLinePlot({ values, center: request.center, lower: numberOrNull(value("lower")), upper: numberOrNull(value("upper")), what }));
    const level = `${Math.round(request.confidence * 1000) / 10}%`;
    plotCaption.textContent = `Dots: the ${values.length} ${what}. Dashed line: the hypothesised value ${request.center}. Shaded: the ${level} bounds${request.test === "signed-rank" ? " (Hodges–Lehmann)" : ""}.`;
    const countTest = request.test !== "signed-rank";
    show(nullRow, countTest);
    const used = numberOrNull(value("used"));
    const observed = request.test === "quantile" ? numberOrNull(value("below")) : numberOrNull(value("statistic"));
    const bars = countTest && state.showNull && used !== null && observed !== null ? nullBars(used, request.quantile ?? 0.5, observed) : [];
    replaceChildren(nullBox, bars.length > 0 ? nullDistributionPlot(bars, request.test === "quantile" ? "count below" : "sign statistic") : null);
    if (state.showNull && countTest && bars.length === 0) nullBox.appendChild(el("p", { class: "es-hint" }, "Too many values to draw the distribution."));

    const target = targetPlace(request);
    const fits = target !== null && onSheet(target.rect);
    if (targetField.control.value !== state.target) targetField.control.value = state.target;
    targetField.hint.textContent = fits
      ? `The block takes 2 columns × ${preview.length} rows: ${formatAddress(target.rect, target.sheet)}.${state.targetEdited ? "" : " Suggested: the first empty area to the right of the data."}`
      : `The block takes 2 columns × ${preview.length} rows; type the cell for its top-left corner, such as E1.`;
    setProblem(targetField, state.target.trim() === "" ? null : !target ? "That is not a cell address; type one such as E1." : fits ? null : PAST_EDGE);
    referenceRecap.textContent = referenceSentence(c, referenceOptions(c));
    const source = chartSource(c, []);
    chartCheck.disabled = source === null;
    if (source === null) {
      chartCheck.checked = false;
      state.chart = false;
    }
    chartHint.textContent =
      source === null
        ? "Not available: the two columns are not side by side."
        : `A clustered column chart of ${formatAddress(source.rect)}, linked to the same cells, placed to the right of the block.`;
    writeButton.disabled = state.busy;
    writeButton.setAttribute("aria-busy", state.busy ? "true" : "false");
    show(confirmBox, state.confirm !== null);
    // Every filled cell is listed: the agreement covers exactly what is shown here.
    replaceChildren(confirmList, ...(state.confirm?.consent.filled ?? []).map((f) => el("li", undefined, el("strong", undefined, f.address), ": ", f.content)));
  }

  function refresh(showStepProblems = false): void {
    steps.forEach((s, i) => show(s, i === state.step));
    stepButtons.forEach((b, i) => {
      if (i === state.step) b.setAttribute("aria-current", "step");
      else b.removeAttribute("aria-current");
    });
    refreshData();
    refreshQuestion();
    refreshSettings();
    refreshResult();
    if (showStepProblems && state.step === 1) setProblem(centerField, problemsFor(["center"])[0]?.message ?? null);
  }

  refresh();
}
