/**
 * From what a person typed and picked in the pane to the result block's
 * request, with a plain message for every field that cannot be used, and the
 * hypotheses in notation for the Question step.
 *
 * Method: numbers are read with a decimal point only (a decimal comma or a
 * unit is refused rather than guessed, so "50,5" never silently becomes 505);
 * fractions such as alpha must lie strictly between 0 and 1. Defaults are the
 * catalogue's (alpha 0.05, confidence 0.95; common practice).
 *
 * Cost: O(length of the inputs).
 */
import type { BlockRequest, BlockTest, ManyGroupMethod, TwoGroupMethod } from "../report/resultBlock";
import type { AdjustMethod, Alternative, SignTestMethod, SignedRankMethod, TieRule, ZeroRule } from "../stats/types";
import type { GroupsKind } from "./paneState";

export interface QuestionForm {
  readonly test: BlockTest;
  readonly alternative: Alternative;
  /** Hypothesised median, shift or quantile value, as typed. */
  readonly center: string;
  /** Quantile test only, as typed. */
  readonly quantile: string;
}

export interface SettingsForm {
  readonly alpha: string;
  readonly confidence: string;
  readonly ties: TieRule;
  readonly signMethod: SignTestMethod;
  readonly rankMethod: SignedRankMethod;
  readonly zeros: ZeroRule;
  /** Two groups: the rank-sum test (default) or Mood's median test. */
  readonly twoGroupMethod: TwoGroupMethod;
  /** Several groups: Mood's median test (default) or Kruskal–Wallis. */
  readonly manyGroupMethod: ManyGroupMethod;
  /** Several groups with a target median: how the by-group p-values are adjusted. */
  readonly adjust: AdjustMethod;
}

export type FieldName = "center" | "quantile" | "alpha" | "confidence";

export interface FieldProblem {
  readonly field: FieldName;
  readonly message: string;
}

export type NumberRead = { readonly ok: true; readonly value: number } | { readonly ok: false; readonly message: string };

const PLAIN_NUMBER = /^[+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?$/;

/**
 * A number typed into a field: digits with an optional decimal point and exponent.
 *
 * @example
 * readNumber("50.5", "The hypothesised median"); // { ok: true, value: 50.5 }
 * readNumber("50,5", "The hypothesised median"); // { ok: false, message: "... use a point for decimals ..." }
 */
export function readNumber(text: string, what: string): NumberRead {
  const trimmed = text.trim();
  if (trimmed === "") return { ok: false, message: `${what} is empty: type a number.` };
  if (/^[+-]?[0-9]+,[0-9]+$/.test(trimmed))
    return { ok: false, message: `${what}: use a point for decimals, such as ${trimmed.replace(",", ".")}.` };
  if (!PLAIN_NUMBER.test(trimmed) || !Number.isFinite(Number(trimmed))) {
    return { ok: false, message: `${what} must be a plain number, such as 50 or 49.5 (no units).` };
  }
  return { ok: true, value: Number(trimmed) };
}

/**
 * A number strictly between 0 and 1.
 *
 * @example
 * readFraction("0.95", "The confidence level"); // { ok: true, value: 0.95 }
 * readFraction("95", "The confidence level");   // { ok: false, message: "... for 95% type 0.95." }
 */
export function readFraction(text: string, what: string): NumberRead {
  const read = readNumber(text, what);
  if (!read.ok) return read;
  if (read.value > 0 && read.value < 1) return read;
  const hint = read.value > 1 && read.value < 100 ? ` For ${read.value}% type ${read.value / 100}.` : "";
  return { ok: false, message: `${what} must lie strictly between 0 and 1.${hint}` };
}

/** Names of the data for the wording, taken from the headers when there are any. */
export interface DataNames {
  readonly data?: string;
  readonly second?: string;
}

/**
 * The block request, or the problems that stop it.
 *
 * @example
 * buildRequest(false, { test: "sign", alternative: "greater", center: "50", quantile: "" },
 *   { alpha: "0.05", confidence: "0.95", ties: "drop", signMethod: "exact", rankMethod: "auto", zeros: "drop" }, { data: "Thickness (µm)" });
 * // { ok: true, request: { test: "sign", paired: false, center: 50, alternative: "greater", alpha: 0.05, confidence: 0.95, ties: "drop", method: "exact", dataName: "Thickness (µm)" } }
 */
export function buildRequest(
  paired: boolean,
  question: QuestionForm,
  settings: SettingsForm,
  names: DataNames,
  groups: GroupsKind = "none",
): { readonly ok: true; readonly request: BlockRequest } | { readonly ok: false; readonly problems: readonly FieldProblem[] } {
  if (groups !== "none") return buildGroupRequest(groups, question, settings, names);
  const problems: FieldProblem[] = [];
  const test: BlockTest = paired && question.test === "quantile" ? "sign" : question.test;
  const centerWhat = paired
    ? "The hypothesised shift"
    : test === "quantile"
      ? "The hypothesised value of the quantile"
      : "The hypothesised median";
  const center = readNumber(question.center, centerWhat);
  if (!center.ok) problems.push({ field: "center", message: center.message });
  const quantile = test === "quantile" ? readFraction(question.quantile, "The quantile") : ({ ok: true, value: 0.5 } as const);
  if (!quantile.ok) problems.push({ field: "quantile", message: quantile.message });
  const alpha = readFraction(settings.alpha, "Alpha");
  if (!alpha.ok) problems.push({ field: "alpha", message: alpha.message });
  const confidence = readFraction(settings.confidence, "The confidence level");
  if (!confidence.ok) problems.push({ field: "confidence", message: confidence.message });
  if (!center.ok || !quantile.ok || !alpha.ok || !confidence.ok) return { ok: false, problems };
  const base = {
    test,
    paired,
    center: center.value,
    alternative: question.alternative,
    alpha: alpha.value,
    confidence: confidence.value,
    ...(names.data === undefined ? {} : { dataName: names.data }),
    ...(names.second === undefined ? {} : { secondName: names.second }),
  };
  if (test === "sign") return { ok: true, request: { ...base, ties: settings.ties, method: settings.signMethod } };
  if (test === "signed-rank") return { ok: true, request: { ...base, method: settings.rankMethod, zeros: settings.zeros } };
  return { ok: true, request: { ...base, quantile: quantile.value } };
}

/**
 * The block request for independent groups: two groups take a shift (second − first, required, often 0) and
 * the two-group method; several groups take an optional target median for the by-group table (blank: no
 * target, no p-values there), the several-group method and the adjustment.
 *
 * @example
 * buildGroupRequest("several", { test: "sign", alternative: "two-sided", center: "", quantile: "" }, settings, { data: "Thickness", second: "Line" });
 * // { ok: true, request: { test: "groups", paired: false, center: 0, withTarget: false, method: "median", adjust: "holm", ... } }
 */
export function buildGroupRequest(
  groups: Exclude<GroupsKind, "none">,
  question: QuestionForm,
  settings: SettingsForm,
  names: DataNames,
): { readonly ok: true; readonly request: BlockRequest } | { readonly ok: false; readonly problems: readonly FieldProblem[] } {
  const problems: FieldProblem[] = [];
  const blankTarget = groups === "several" && question.center.trim() === "";
  const center = blankTarget
    ? ({ ok: true, value: 0 } as const)
    : readNumber(question.center, groups === "two" ? "The hypothesised shift" : "The target median");
  if (!center.ok) problems.push({ field: "center", message: center.message });
  const alpha = readFraction(settings.alpha, "Alpha");
  if (!alpha.ok) problems.push({ field: "alpha", message: alpha.message });
  const confidence = readFraction(settings.confidence, "The confidence level");
  if (!confidence.ok) problems.push({ field: "confidence", message: confidence.message });
  if (!center.ok || !alpha.ok || !confidence.ok) return { ok: false, problems };
  const base = {
    paired: false,
    center: center.value,
    alternative: question.alternative,
    alpha: alpha.value,
    confidence: confidence.value,
    ...(names.data === undefined ? {} : { dataName: names.data }),
    ...(names.second === undefined ? {} : { secondName: names.second }),
  };
  if (groups === "two") return { ok: true, request: { ...base, test: "two-groups", method: settings.twoGroupMethod } };
  return {
    ok: true,
    request: { ...base, test: "groups", withTarget: !blankTarget, method: settings.manyGroupMethod, adjust: settings.adjust },
  };
}

const RELATION: Readonly<Record<Alternative, string>> = { "two-sided": "≠", greater: ">", less: "<" };

/** The hypotheses in notation, and what the symbol stands for. */
export interface Notation {
  readonly h0: string;
  readonly h1: string;
  readonly symbol: string;
}

/**
 * H0 and H1 in notation for the Question step, with the labels the block uses
 * (resultBlock.ts writes "H0" and "H1"), so the pane and the sheet use one notation.
 *
 * @example
 * notation({ test: "sign", paired: false, center: 50, alternative: "greater" });
 * // { h0: "H0: median = 50", h1: "H1: median > 50", symbol: "median: the median of the values" }
 */
export function notation(request: Pick<BlockRequest, "test" | "paired" | "center" | "alternative" | "quantile">): Notation {
  const value = String(request.center);
  const name = request.test === "quantile" ? `Q(${request.quantile ?? 0.5})` : request.paired ? "median(D)" : "median";
  const symbol =
    request.test === "quantile"
      ? `Q(${request.quantile ?? 0.5}): the ${request.quantile ?? 0.5} quantile of the values`
      : request.paired
        ? "D: for each pair, the second value minus the first"
        : "median: the median of the values";
  return { h0: `H0: ${name} = ${value}`, h1: `H1: ${name} ${RELATION[request.alternative]} ${value}`, symbol };
}
