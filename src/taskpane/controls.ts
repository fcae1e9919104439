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

/** A page-unique id for labels and descriptions. */
export function newId(stem: string): string {
  idCounter++;
  return `es-${stem}-${idCounter}`;
}

export interface Choice<T extends string> {
  readonly value: T;
  readonly label: string;
  readonly hint?: string;
}

export interface RadioGroup<T extends string> {
  readonly element: HTMLFieldSetElement;
  set(value: T): void;
  enable(value: T, available: boolean, reason?: string): void;
}

export function radioGroup<T extends string>(legend: string, choices: readonly Choice<T>[], initial: T, onChange: (value: T) => void): RadioGroup<T> {
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

export interface Field<E extends HTMLElement> {
  readonly element: HTMLElement;
  readonly control: E;
  readonly label: HTMLLabelElement;
  readonly hint: HTMLElement;
  readonly problem: HTMLElement;
}

export function field<E extends HTMLInputElement | HTMLSelectElement>(labelText: string, control: E, hintText: string, extra?: Node): Field<E> {
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

export function textInput(value: string, options: { inputmode?: string; autocomplete?: string } = {}): HTMLInputElement {
  const input = el("input", { attrs: { type: "text", spellcheck: "false", autocomplete: options.autocomplete ?? "off", ...(options.inputmode ? { inputmode: options.inputmode } : {}) } });
  input.value = value;
  return input;
}

export function selectControl<T extends string>(choices: readonly Choice<T>[], initial: T): HTMLSelectElement {
  const select = el("select");
  for (const choice of choices) {
    const option = el("option", { attrs: { value: choice.value } }, choice.label);
    option.selected = choice.value === initial;
    select.appendChild(option);
  }
  return select;
}

export function setProblem(f: Field<HTMLElement>, message: string | null): void {
  f.problem.textContent = message ?? "";
  if (message) f.control.setAttribute("aria-invalid", "true");
  else f.control.removeAttribute("aria-invalid");
}

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
