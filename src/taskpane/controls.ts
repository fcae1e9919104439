/**
 * The pane's form controls: labelled radio groups, fields with a hint and a
 * problem line, text inputs, selects and buttons. Every control is a native,
 * labelled form control; a field's hint and problem describe it
 * (aria-describedby), and a problem marks it aria-invalid.
 *
 * Cost: O(choices) per control.
 */
import { el } from "./dom";

let idCounter = 0;

/**
 * A page-unique id for labels and descriptions.
 *
 * @example
 * newId("field"); // "es-field-7"
 */
export function newId(stem: string): string {
  idCounter++;
  return `es-${stem}-${idCounter}`;
}

/** One option of a radio group or a select: its value, its label, and an optional hint. */
export interface Choice<T extends string> {
  readonly value: T;
  readonly label: string;
  readonly hint?: string;
}

/** A labelled group of radio buttons, set and enabled from the state. */
export interface RadioGroup<T extends string> {
  readonly element: HTMLFieldSetElement;
  set(value: T): void;
  enable(value: T, available: boolean, reason?: string): void;
}

/**
 * A fieldset of radio buttons with a legend; each option has its hint and, when disabled, the reason.
 *
 * @example
 * radioGroup("Which test?", [{ value: "sign", label: "Sign test" }], "sign", (v) => events.test(v));
 */
export function radioGroup<T extends string>(
  legend: string,
  choices: readonly Choice<T>[],
  initial: T,
  onChange: (value: T) => void,
): RadioGroup<T> {
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

/** A labelled control with its hint and problem lines. */
export interface Field<E extends HTMLElement> {
  readonly element: HTMLElement;
  readonly control: E;
  readonly label: HTMLLabelElement;
  readonly hint: HTMLElement;
  readonly problem: HTMLElement;
}

/**
 * A control with its label, a hint and a problem line, both describing it (aria-describedby).
 *
 * @example
 * field("Hypothesised median", textInput(""), "The value the claim is compared with.");
 */
export function field<E extends HTMLInputElement | HTMLSelectElement>(
  labelText: string,
  control: E,
  hintText: string,
  extra?: Node,
): Field<E> {
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

/**
 * A text input that neither checks spelling nor fills itself in.
 *
 * @example
 * textInput("0.05", { inputmode: "decimal" });
 */
export function textInput(value: string, options: { inputmode?: string; autocomplete?: string } = {}): HTMLInputElement {
  const input = el("input", {
    attrs: {
      type: "text",
      spellcheck: "false",
      autocomplete: options.autocomplete ?? "off",
      ...(options.inputmode ? { inputmode: options.inputmode } : {}),
    },
  });
  input.value = value;
  return input;
}

/**
 * A select with one option per choice, the initial one selected.
 *
 * @example
 * selectControl([{ value: "drop", label: "Leave them out" }], "drop");
 */
export function selectControl<T extends string>(choices: readonly Choice<T>[], initial: T): HTMLSelectElement {
  const select = el("select");
  for (const choice of choices) {
    const option = el("option", { attrs: { value: choice.value } }, choice.label);
    option.selected = choice.value === initial;
    select.appendChild(option);
  }
  return select;
}

/**
 * Shows a field's problem (or none), marking the control aria-invalid while there is one.
 *
 * @example
 * setProblem(centerField, "The hypothesised median is empty: type a number.");
 */
export function setProblem(f: Field<HTMLElement>, message: string | null): void {
  f.problem.textContent = message ?? "";
  if (message) f.control.setAttribute("aria-invalid", "true");
  else f.control.removeAttribute("aria-invalid");
}

/**
 * A button of a kind (primary, secondary, quiet) that calls `onClick`.
 *
 * @example
 * button("Next: the question", "primary", () => events.next());
 */
export function button(text: string, kind: "primary" | "secondary" | "quiet", onClick: () => void): HTMLButtonElement {
  const b = el("button", { class: `es-button es-${kind}`, attrs: { type: "button" } }, text);
  b.addEventListener("click", onClick);
  return b;
}

/**
 * The hint of the chosen value.
 *
 * @example
 * hintFor([{ value: "drop", label: "Leave out", hint: "Ties say nothing" }], "drop"); // "Ties say nothing"
 */
export function hintFor<T extends string>(choices: readonly Choice<T>[], value: T): string {
  return choices.find((c) => c.value === value)?.hint ?? "";
}

/**
 * A labelled choice among `choices`, starting at `initial` with that choice's hint, that reports each
 * change as the chosen value.
 *
 * @example
 * choiceField("Ties", [{ value: "drop", label: "Leave out", hint: "Ties say nothing" }], "drop", (v) => console.log(v));
 */
export function choiceField<T extends string>(
  labelText: string,
  choices: readonly Choice<T>[],
  initial: T,
  onChange: (value: T) => void,
): Field<HTMLSelectElement> {
  const made = field(labelText, selectControl(choices, initial), hintFor(choices, initial));
  made.control.addEventListener("change", () => onChange(made.control.value as T));
  return made;
}
