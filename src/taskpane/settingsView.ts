/**
 * The Settings step's page: alpha, the confidence level, and the choices of
 * the chosen test. It renders a SettingsView (settingsState.ts) and forwards
 * events.
 *
 * Cost: O(1) nodes per render.
 */
import { EXACT_AUTO_LIMIT, EXACT_LIMIT } from "../stats/signedRank";
import type { ManyGroupMethod, TwoGroupMethod } from "../report/resultBlock";
import { EXACT_AUTO_SIZE, EXACT_AUTO_TIED_SIZE } from "../stats/rankSum";
import type { AdjustMethod, SignTestMethod, SignedRankMethod, TieRule, ZeroRule } from "../stats/types";
import { button, choiceField, field, hintFor, setProblem, textInput, type Choice } from "./controls";
import { el, show } from "./dom";
import type { SettingsForm } from "./request";
import type { SettingsView } from "./settingsState";

const TIE_CHOICES: readonly Choice<TieRule>[] = [
  { value: "drop", label: "Leave them out (default)", hint: "A tie says nothing about the direction, so the test uses the other values." },
  { value: "split", label: "Share them between below and above", hint: "Keeps them in n; with an odd number of ties, one is left out." },
  { value: "conservative", label: "Count them against the claim", hint: "The most cautious choice: the p-value can only grow." },
];

const SIGN_METHOD_CHOICES: readonly Choice<SignTestMethod>[] = [
  { value: "exact", label: "Exact binomial (default)", hint: "Exact probabilities: the chance of a false alarm never exceeds alpha." },
  {
    value: "midp",
    label: "Mid-p",
    hint: "Counts half the probability of the observed count: closer to alpha on average, but may exceed it.",
  },
  { value: "normal", label: "Normal approximation", hint: "For very large samples; continuity-corrected." },
];

const RANK_METHOD_CHOICES: readonly Choice<SignedRankMethod>[] = [
  {
    value: "auto",
    label: "Exact when feasible (default)",
    hint: `Exact distribution up to ${EXACT_AUTO_LIMIT.toLocaleString("en-US")} values away from the hypothesised value, normal approximation beyond; the block states which ran.`,
  },
  {
    value: "exact",
    label: "Exact",
    hint: `Exact distribution given the ties, for up to ${EXACT_LIMIT.toLocaleString("en-US")} values away from the hypothesised value (slower as they grow); beyond that the cells answer #N/A and say so.`,
  },
  { value: "normal", label: "Normal approximation", hint: "With continuity and tie corrections." },
];

const ZERO_CHOICES: readonly Choice<ZeroRule>[] = [
  { value: "drop", label: "Leave them out (default)", hint: "Values equal to the hypothesised value are set aside before ranking." },
  {
    value: "pratt",
    label: "Rank them, then leave them out of V (Pratt)",
    hint: "They take part in the ranking, which shifts the other ranks up.",
  },
];

const TWO_GROUP_CHOICES: readonly Choice<TwoGroupMethod>[] = [
  {
    value: "rank-sum",
    label: "Rank-sum test, Wilcoxon–Mann–Whitney (default)",
    hint: `Ranks all values together; exact up to ${EXACT_AUTO_SIZE} values without ties (${EXACT_AUTO_TIED_SIZE} with ties), normal approximation beyond. It compares whole distributions.`,
  },
  {
    value: "median",
    label: "Median test (Mood)",
    hint: "Counts each group's values above the pooled median; Fisher's exact test. Asks about the medians alone, with less power when the shapes match.",
  },
];

const MANY_GROUP_CHOICES: readonly Choice<ManyGroupMethod>[] = [
  {
    value: "median",
    label: "Median test (Mood, default)",
    hint: "Counts each group's values above the pooled median: asks about the medians alone, whatever the shapes.",
  },
  {
    value: "rank",
    label: "Rank test (Kruskal–Wallis)",
    hint: "Ranks all values together: more power when the groups have the same shape; it compares whole distributions.",
  },
];

const ADJUST_CHOICES: readonly Choice<AdjustMethod>[] = [
  {
    value: "holm",
    label: "Holm (default)",
    hint: "Keeps the chance of any false alarm across the groups at alpha; never weaker than Bonferroni.",
  },
  { value: "bonferroni", label: "Bonferroni", hint: "Each p-value times the number of groups: the simplest, most cautious choice." },
  { value: "hochberg", label: "Hochberg", hint: "Like Holm, a little more power; assumes the groups' tests are not negatively related." },
  { value: "bh", label: "Benjamini–Hochberg", hint: "Keeps the expected share of false alarms among the groups flagged at alpha." },
  {
    value: "by",
    label: "Benjamini–Yekutieli",
    hint: "Like Benjamini–Hochberg, valid however the groups' tests are related; more cautious.",
  },
];

type LookingAgain = "once" | "again";

const LOOKING_CHOICES: readonly Choice<LookingAgain>[] = [
  {
    value: "once",
    label: "No: one look at the rows there are (default)",
    hint: "The ordinary p-value and bounds. The block also shows the watching p-value, which stays valid if you do check again.",
  },
  {
    value: "again",
    label: "Yes: I will check it as rows come in",
    hint: "The block uses the watching p-value and bounds: you may stop the first time the p-value drops below alpha without raising false alarms. They need more rows to show an effect.",
  },
];

export interface SettingsEvents {
  setting<K extends keyof SettingsForm>(key: K, value: SettingsForm[K]): void;
  watching(watching: boolean): void;
  back(): void;
  next(): void;
}

export interface SettingsPage {
  readonly element: HTMLElement;
  render(view: SettingsView): void;
}

/**
 * Builds the Settings step under `heading`.
 *
 * @example
 * const page = settingsPage(heading, events); page.render(settingsView(state));
 */
export function settingsPage(heading: HTMLElement, events: SettingsEvents): SettingsPage {
  const alphaField = field(
    "Alpha (significance level)",
    textInput("0.05", { inputmode: "decimal" }),
    "The risk you accept of rejecting H0 when it is true. A common choice is 0.05.",
  );
  alphaField.control.addEventListener("input", () => events.setting("alpha", alphaField.control.value));
  const confidenceField = field(
    "Confidence level of the bounds",
    textInput("0.95", { inputmode: "decimal" }),
    "The bounds cover the true value at least this often; the block also shows the level actually reached.",
  );
  confidenceField.control.addEventListener("input", () => events.setting("confidence", confidenceField.control.value));
  const tiesField = choiceField("Values equal to the hypothesised value (ties)", TIE_CHOICES, "drop", (value) =>
    events.setting("ties", value),
  );
  const signMethodField = choiceField("How the p-value is computed", SIGN_METHOD_CHOICES, "exact", (value) =>
    events.setting("signMethod", value),
  );
  const rankMethodField = choiceField("How the p-value is computed", RANK_METHOD_CHOICES, "auto", (value) =>
    events.setting("rankMethod", value),
  );
  const zerosField = choiceField("Values that equal the median under test", ZERO_CHOICES, "drop", (value) =>
    events.setting("zeros", value),
  );
  const twoGroupField = choiceField("Test for two groups", TWO_GROUP_CHOICES, "rank-sum", (value) =>
    events.setting("twoGroupMethod", value),
  );
  const manyGroupField = choiceField("Test for several groups", MANY_GROUP_CHOICES, "median", (value) =>
    events.setting("manyGroupMethod", value),
  );
  const adjustField = choiceField("Adjusting the p-values of the groups' table", ADJUST_CHOICES, "holm", (value) =>
    events.setting("adjust", value),
  );
  const lookingField = choiceField("Will you look at this result again as new rows arrive?", LOOKING_CHOICES, "once", (value) =>
    events.watching(value === "again"),
  );
  const quantileNote = el("p", { class: "es-note" }, "The quantile test is exact and leaves out values equal to the hypothesised value.");
  const element = el(
    "section",
    { class: "es-step", attrs: { "aria-labelledby": heading.id } },
    heading,
    alphaField.element,
    confidenceField.element,
    tiesField.element,
    signMethodField.element,
    rankMethodField.element,
    zerosField.element,
    twoGroupField.element,
    manyGroupField.element,
    adjustField.element,
    lookingField.element,
    quantileNote,
    el(
      "div",
      { class: "es-actions" },
      button("Back", "secondary", () => events.back()),
      button("Next: the result", "primary", () => events.next()),
    ),
  );
  const keep = (control: HTMLInputElement | HTMLSelectElement, value: string): void => {
    if (control.value !== value) control.value = value;
  };

  function render(view: SettingsView): void {
    const { settings } = view;
    keep(alphaField.control, settings.alpha);
    keep(confidenceField.control, settings.confidence);
    keep(tiesField.control, settings.ties);
    keep(signMethodField.control, settings.signMethod);
    keep(rankMethodField.control, settings.rankMethod);
    keep(zerosField.control, settings.zeros);
    keep(twoGroupField.control, settings.twoGroupMethod);
    keep(manyGroupField.control, settings.manyGroupMethod);
    keep(adjustField.control, settings.adjust);
    show(twoGroupField.element, view.twoGroups);
    show(manyGroupField.element, view.manyGroups);
    show(adjustField.element, view.adjustUsed);
    twoGroupField.hint.textContent = hintFor(TWO_GROUP_CHOICES, settings.twoGroupMethod);
    manyGroupField.hint.textContent = hintFor(MANY_GROUP_CHOICES, settings.manyGroupMethod);
    adjustField.hint.textContent = hintFor(ADJUST_CHOICES, settings.adjust);
    const looking: LookingAgain = view.watching ? "again" : "once";
    keep(lookingField.control, looking);
    setProblem(alphaField, view.alphaProblem);
    setProblem(confidenceField, view.confidenceProblem);
    show(tiesField.element, view.tiesChoice);
    show(signMethodField.element, view.signTest);
    show(rankMethodField.element, view.signedRank);
    show(zerosField.element, view.signedRank);
    show(quantileNote, view.quantileTest);
    show(lookingField.element, view.asksWatching);
    lookingField.hint.textContent = hintFor(LOOKING_CHOICES, looking);
    zerosField.label.textContent = view.zerosLabel;
    tiesField.hint.textContent = hintFor(TIE_CHOICES, settings.ties);
    signMethodField.hint.textContent = hintFor(SIGN_METHOD_CHOICES, settings.signMethod);
    rankMethodField.hint.textContent = hintFor(RANK_METHOD_CHOICES, settings.rankMethod);
    zerosField.hint.textContent = hintFor(ZERO_CHOICES, settings.zeros);
  }

  return { element, render };
}
