/**
 * The Question step's part of the pane state: which test, the direction of
 * the claim, the hypothesised value and the quantile, as typed. Pure
 * updates; the block request built from the whole state; and what the step
 * shows (labels, the hypotheses in notation, the problems of the fields).
 *
 * Method: numbers are read by request.ts (a decimal point only, fractions
 * strictly between 0 and 1).
 *
 * Cost: O(length of the inputs).
 */
import type { BlockTest } from "../report/resultBlock";
import type { Alternative } from "../stats/types";
import { blockFollowsNewRows, choices, dataKind, pickedGroups, type DataKind } from "./dataState";
import type { PaneState } from "./paneState";
import { buildRequest, notation, type FieldName, type FieldProblem } from "./request";
import { bodyOf } from "./workflow";
import { databaseRequest } from "./databaseState";

/**
 * The test chosen.
 *
 * @example
 * setTest(initialState(), "signed-rank").question.test; // "signed-rank"
 */
export function setTest(state: PaneState, test: BlockTest): PaneState {
  return { ...state, question: { ...state.question, test } };
}

/**
 * The direction of the claim.
 *
 * @example
 * setAlternative(initialState(), "greater").question.alternative; // "greater"
 */
export function setAlternative(state: PaneState, alternative: Alternative): PaneState {
  return { ...state, question: { ...state.question, alternative } };
}

/**
 * The hypothesised value, as typed.
 *
 * @example
 * setCenter(initialState(), "50").question.center; // "50"
 */
export function setCenter(state: PaneState, center: string): PaneState {
  return { ...state, question: { ...state.question, center } };
}

/**
 * The quantile, as typed.
 *
 * @example
 * setQuantile(initialState(), "0.8").question.quantile; // "0.8"
 */
export function setQuantile(state: PaneState, quantile: string): PaneState {
  return { ...state, question: { ...state.question, quantile } };
}

/** The test that runs: pairs take no quantile test; groups take their own tests, whatever was picked for one sample. */
export function effectiveTest(state: PaneState): BlockTest {
  // A database query gives the sign counts only.
  if (state.database !== null) return "sign";
  if (state.groups === "two") return "two-groups";
  if (state.groups === "several") return "groups";
  return state.paired && state.question.test === "quantile" ? "sign" : state.question.test;
}

/**
 * The names of the data for the wording: the two labels for two groups from a group column, else each range's name row.
 *
 * @example
 * dataNames(stateWithNorthAndSouth); // ["North", "South"]
 */
export function dataNames(state: PaneState): (string | undefined)[] {
  const picked = pickedGroups(state);
  if (picked) return [String(picked.first), String(picked.second)];
  return choices(state).map((choice) => bodyOf(choice).name);
}

/**
 * The block request for the whole state, or the problems of its fields.
 *
 * @example
 * currentRequest(setCenter(state, "50")); // { ok: true, request: { test: "sign", center: 50, ... } }
 */
export function currentRequest(state: PaneState): ReturnType<typeof buildRequest> {
  if (state.database !== null) return databaseRequest(state);
  const names = dataNames(state);
  const built = buildRequest(state.paired, state.question, state.settings, { data: names[0], second: names[1] }, state.groups);
  const picked = pickedGroups(state);
  const labeled = built.ok && picked ? { ok: true as const, request: { ...built.request, groupLabels: picked } } : built;
  // The block learns whether it follows new rows and, if so, the Settings step's answer about looking again.
  if (!labeled.ok || !blockFollowsNewRows(state)) return labeled;
  return { ok: true, request: { ...labeled.request, followsNewRows: true, watching: state.watching } };
}

/**
 * The problems of some fields.
 *
 * @example
 * problemsFor(initialState(), ["center"]); // [{ field: "center", message: "The hypothesised median is empty: type a number." }]
 */
export function problemsFor(state: PaneState, fields: readonly FieldName[]): FieldProblem[] {
  const built = currentRequest(state);
  return built.ok ? [] : built.problems.filter((p) => fields.includes(p.field));
}

/**
 * Why the Question step cannot be left, or null.
 *
 * @example
 * questionStepProblem(setCenter(state, "fifty")); // "The hypothesised median must be a plain number, ..."
 */
export function questionStepProblem(state: PaneState): string | null {
  return problemsFor(state, ["center", "quantile"])[0]?.message ?? null;
}

/** What the Question step shows. */
export interface QuestionView {
  readonly kind: DataKind;
  /** The choice of test is offered (one set of values or pairs; groups have their own tests, chosen in Settings). */
  readonly showTests: boolean;
  readonly test: BlockTest;
  readonly quantileAvailable: boolean;
  /** False for a database query's answer, which holds the sign counts only. */
  readonly signedRankAvailable: boolean;
  readonly showQuantile: boolean;
  readonly subjectLabel: string;
  readonly centerLabel: string;
  readonly question: PaneState["question"];
  readonly centerProblem: string | null;
  readonly quantileProblem: string | null;
  readonly h0: string;
  readonly h1: string;
  readonly symbol: string;
}

/**
 * Everything the Question step shows, from the state. `showStepProblems`
 * shows the hypothesised value's problem even before anything was typed (after
 * an attempt to move on).
 *
 * @example
 * questionView(setCenter(state, "50"), false).h0; // "H0: median = 50"
 */
export function questionView(state: PaneState, showStepProblems: boolean): QuestionView {
  if (state.groups !== "none") return groupQuestionView(state, showStepProblems);
  const test = effectiveTest(state);
  // A database's pasted answer has no name row of its own: the column named for the query names the values.
  const column = state.database?.column.trim();
  const names = state.database !== null ? [column === "" ? undefined : column] : choices(state).map((choice) => bodyOf(choice).name);
  const { question } = state;
  const second = names[1] === undefined ? "the second value" : `“${names[1]}”`;
  const first = names[0] === undefined ? "the first value" : `“${names[0]}”`;
  const pairNames = state.paired && (names[0] !== undefined || names[1] !== undefined) ? ` (${second} minus ${first})` : "";
  const subjectLabel = state.paired
    ? `The median of the differences (for each row, ${second} minus ${first}) is`
    : test === "quantile"
      ? `The ${question.quantile.trim() || "chosen"} quantile of ${names[0] ? `“${names[0]}”` : "the values"} is`
      : `The median of ${names[0] ? `“${names[0]}”` : "the values"} is`;
  const centerLabel = state.paired
    ? "Hypothesised shift (often 0)"
    : test === "quantile"
      ? "Hypothesised value of the quantile"
      : "Hypothesised median";
  const problems = problemsFor(state, ["center", "quantile"]);
  const showCenterProblem = showStepProblems || (state.step >= 1 && (question.center !== "" || state.step > 1));
  const center = Number(question.center.trim());
  const q = Number(question.quantile.trim());
  const typed = question.center.trim() !== "" && Number.isFinite(center);
  const n = typed
    ? notation({ test, paired: state.paired, center, alternative: question.alternative, quantile: Number.isFinite(q) ? q : 0.5 })
    : null;
  return {
    kind: dataKind(state),
    showTests: true,
    test,
    quantileAvailable: !state.paired && state.database === null,
    signedRankAvailable: state.database === null,
    showQuantile: test === "quantile",
    subjectLabel,
    centerLabel,
    question,
    centerProblem: showCenterProblem ? (problems.find((p) => p.field === "center")?.message ?? null) : null,
    quantileProblem: problems.find((p) => p.field === "quantile")?.message ?? null,
    h0: n ? n.h0 : "H0: …",
    h1: n ? n.h1 : "H1: …",
    symbol: n ? `${n.symbol}${pairNames}` : "Type the hypothesised value to see the hypotheses.",
  };
}

function quoted(name: string | undefined, otherwise: string): string {
  return name === undefined ? otherwise : `“${name}”`;
}

/**
 * The Question step for groups. Two groups: the claim about how the second group lies against the first
 * moved by a hypothesised shift (second − first, often 0), in plain words. Several groups: the test always
 * asks whether the typical values differ between the groups; a target median is optional and, when given,
 * each group is tested against it in the by-group table, in the chosen direction.
 */
function groupQuestionView(state: PaneState, showStepProblems: boolean): QuestionView {
  const test = effectiveTest(state);
  const names = dataNames(state);
  const { question } = state;
  const problems = problemsFor(state, ["center"]);
  const showCenterProblem = showStepProblems || (state.step >= 1 && (question.center !== "" || state.step > 1));
  const typed = question.center.trim();
  const value = Number(typed);
  const known = typed !== "" && Number.isFinite(value);
  const relation = { "two-sided": "≠", greater: ">", less: "<" }[question.alternative];
  const common = {
    kind: dataKind(state),
    showTests: false,
    test,
    quantileAvailable: false,
    signedRankAvailable: false,
    showQuantile: false,
    question,
    centerProblem: showCenterProblem ? (problems.find((p) => p.field === "center")?.message ?? null) : null,
    quantileProblem: null,
  };
  if (test === "two-groups") {
    const first = quoted(names[0], "the first group");
    const second = quoted(names[1], "the second group");
    const moved = known && value !== 0 ? `${first} ${value > 0 ? "+" : "−"} ${Math.abs(value)}` : first;
    const words: Record<string, string> = {
      "two-sided": `the values of ${second} lie above or below those of ${moved}`,
      greater: `the values of ${second} tend to lie above those of ${moved}`,
      less: `the values of ${second} tend to lie below those of ${moved}`,
    };
    return {
      ...common,
      subjectLabel: `Compared with ${first} moved by the shift, the values of ${second} tend to be`,
      centerLabel: `Hypothesised shift: how much ${second} lies above ${first} (second − first; 0 asks whether they differ at all)`,
      h0: known ? `H0: ${second} and ${moved} have the same distribution` : "H0: …",
      h1: known ? `H1: ${words[question.alternative]}` : "H1: …",
      symbol: known
        ? `The shift is second − first: a positive shift says ${second} is higher. The block also estimates the shift with bounds.`
        : "Type the hypothesised shift (often 0) to see the hypotheses.",
    };
  }
  const values = quoted(names[0], "the values");
  const labels = quoted(names[1], "the group column");
  const target = known
    ? ` Each group's median is also tested against ${typed} (H1: median ${relation} ${typed}), with the p-values adjusted across the groups.`
    : " No target median: the table by group gives counts, medians and bounds without p-values.";
  return {
    ...common,
    subjectLabel: "Against the target, each group's median is",
    centerLabel: "Target median for every group (optional)",
    h0: `H0: the typical values of ${values} are the same in every group of ${labels}`,
    h1: `H1: the typical values differ between at least two groups`,
    symbol: `The test compares the groups with one another.${target}`,
  };
}
