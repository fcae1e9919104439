/**
 * The Settings step's part of the pane state: alpha and the confidence
 * level as typed, and the choices for ties, zeros and how the p-value is
 * computed. Pure updates, and what the step shows.
 *
 * Cost: O(length of the inputs).
 */
import type { PaneState } from "./paneState";
import { blockFollowsNewRows } from "./dataState";
import { effectiveTest, problemsFor } from "./questionState";
import type { SettingsForm } from "./request";

/**
 * One setting changed.
 *
 * @example
 * setSetting(initialState(), "alpha", "0.01").settings.alpha; // "0.01"
 */
export function setSetting<K extends keyof SettingsForm>(state: PaneState, key: K, value: SettingsForm[K]): PaneState {
  return { ...state, settings: { ...state.settings, [key]: value } };
}

/**
 * The answer to whether the result will be looked at again as rows arrive.
 *
 * @example
 * setWatching(initialState(), true).watching; // true
 */
export function setWatching(state: PaneState, watching: boolean): PaneState {
  return { ...state, watching };
}

/**
 * Whether the Settings step asks about looking again as rows arrive: only when the block follows new rows
 * and has watching versions (the sign test, one sample or pairs).
 *
 * @example
 * asksWatching({ ...initialState(), reference: "table" }); // true
 */
export function asksWatching(state: PaneState): boolean {
  return blockFollowsNewRows(state) && effectiveTest(state) === "sign";
}

/**
 * Why the Settings step cannot be left, or null.
 *
 * @example
 * settingsStepProblem(setSetting(state, "alpha", "5")); // "Alpha must lie strictly between 0 and 1. ..."
 */
export function settingsStepProblem(state: PaneState): string | null {
  return problemsFor(state, ["alpha", "confidence"])[0]?.message ?? null;
}

/** What the Settings step shows. */
export interface SettingsView {
  readonly settings: SettingsForm;
  readonly alphaProblem: string | null;
  readonly confidenceProblem: string | null;
  /** Ties and the sign test's method: sign test only. */
  readonly signTest: boolean;
  /** The tie rule is offered: not for a database query's answer, whose counts leave the ties out. */
  readonly tiesChoice: boolean;
  /** Zeros and the signed-rank method: signed-rank test only. */
  readonly signedRank: boolean;
  readonly quantileTest: boolean;
  /** What the signed-rank test sets aside, in words for one set of values or for pairs. */
  readonly zerosLabel: string;
  /** Two groups: the choice of the rank-sum test or the median test. */
  readonly twoGroups: boolean;
  /** Several groups: the choice of the median test or the rank test, and the adjustment of the by-group p-values. */
  readonly manyGroups: boolean;
  /** The adjustment matters: several groups tested against a target median. */
  readonly adjustUsed: boolean;
  /** The question about looking again as rows arrive is shown. */
  readonly asksWatching: boolean;
  readonly watching: boolean;
}

/**
 * Everything the Settings step shows, from the state.
 *
 * @example
 * settingsView(initialState()).signTest; // true
 */
export function settingsView(state: PaneState): SettingsView {
  const test = effectiveTest(state);
  const problems = problemsFor(state, ["alpha", "confidence"]);
  return {
    settings: state.settings,
    alphaProblem: problems.find((p) => p.field === "alpha")?.message ?? null,
    confidenceProblem: problems.find((p) => p.field === "confidence")?.message ?? null,
    signTest: test === "sign",
    tiesChoice: test === "sign" && state.database === null,
    signedRank: test === "signed-rank",
    quantileTest: test === "quantile",
    twoGroups: test === "two-groups",
    manyGroups: test === "groups",
    adjustUsed: test === "groups" && state.question.center.trim() !== "",
    zerosLabel: state.paired ? "Pairs whose difference equals the shift under test" : "Values that equal the median under test",
    asksWatching: asksWatching(state),
    watching: state.watching,
  };
}
