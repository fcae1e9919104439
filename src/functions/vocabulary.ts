/**
 * The words a person may type for the options of the EVENSPLIT functions,
 * and their canonical values in src/stats/types.ts.
 *
 * Matching ignores case and surrounding spaces. An omitted option (the
 * spreadsheet passes null), a blank cell and the empty text all mean the
 * default. Anything else is a BadArgument whose message lists every accepted
 * word, so the hover text alone tells the person how to fix the formula.
 *
 * Cost: O(number of accepted words) per argument.
 */
import type {
  AdjustMethod,
  Alternative,
  BoundMethod,
  BoundSide,
  SignTestMethod,
  SignedRankMethod,
  TieRule,
  ZeroRule,
} from "../stats/types";
import { BadArgument } from "./errors";

/** One canonical value and the words that select it (the canonical word first). */
export interface Choice<T extends string> {
  readonly value: T;
  readonly words: readonly string[];
}

/** An option: its argument name, its choices, and which one an omitted argument means. */
export interface Vocabulary<T extends string> {
  readonly argument: string;
  readonly choices: readonly Choice<T>[];
  readonly fallback: T;
}

function only<T extends string>(...values: T[]): Choice<T>[] {
  return values.map((value) => ({ value, words: [value] }));
}

export const ALTERNATIVE: Vocabulary<Alternative> = {
  argument: "alternative",
  choices: [
    { value: "two-sided", words: ["two-sided", "two", "both", "<>", "≠", "different", "different from"] },
    { value: "greater", words: ["greater", "above", "right", ">"] },
    { value: "less", words: ["less", "below", "left", "<"] },
  ],
  fallback: "two-sided",
};

export const TIES: Vocabulary<TieRule> = { argument: "ties", choices: only("drop", "split", "conservative"), fallback: "drop" };

/** The block's method row prints "exact binomial", "mid-p binomial" and "normal approximation"; each is accepted back. */
export const SIGN_METHOD: Vocabulary<SignTestMethod> = {
  argument: "method",
  choices: [
    { value: "exact", words: ["exact", "exact binomial"] },
    { value: "midp", words: ["midp", "mid-p", "mid-p binomial"] },
    { value: "normal", words: ["normal", "normal approximation"] },
  ],
  fallback: "exact",
};

export const SIGNED_RANK_METHOD: Vocabulary<SignedRankMethod> = {
  argument: "method",
  choices: [
    { value: "auto", words: ["auto"] },
    { value: "exact", words: ["exact"] },
    { value: "normal", words: ["normal", "normal approximation"] },
  ],
  fallback: "auto",
};

export const ZEROS: Vocabulary<ZeroRule> = { argument: "zeros", choices: only("drop", "pratt"), fallback: "drop" };

export const SIDE: Vocabulary<BoundSide> = { argument: "side", choices: only("two-sided", "lower", "upper"), fallback: "two-sided" };

/**
 * Bounds at data values, or between neighbouring values by the method of
 * Hettmansperger and Sheather (1986), named after its authors.
 */
export const BOUND_METHOD: Vocabulary<BoundMethod> = {
  argument: "method",
  choices: [
    { value: "exact", words: ["exact"] },
    { value: "interpolated", words: ["hettmansperger-sheather", "hettmansperger sheather"] },
  ],
  fallback: "exact",
};

export const ADJUST_METHOD: Vocabulary<AdjustMethod> = {
  argument: "method",
  choices: only("holm", "bonferroni", "hochberg", "bh", "by"),
  fallback: "holm",
};

/** "two-sided (the default; also two, both, <>), greater (also above, right, >) or less (also below, left, <)". */
export function acceptedWords<T extends string>(vocabulary: Vocabulary<T>): string {
  const parts = vocabulary.choices.map((choice) => {
    const [canonical, ...synonyms] = choice.words;
    const notes = choice.value === vocabulary.fallback ? ["the default"] : [];
    if (synonyms.length > 0) notes.push(`also ${synonyms.join(", ")}`);
    return notes.length > 0 ? `${canonical} (${notes.join("; ")})` : canonical;
  });
  return parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(", ")} or ${parts[parts.length - 1]}`;
}

function shown(raw: unknown): string {
  return typeof raw === "string" ? `"${raw}"` : String(raw);
}

/**
 * The canonical value a typed option stands for.
 *
 * @example
 * chooseWord(ALTERNATIVE, " Above "); // "greater"
 * chooseWord(ALTERNATIVE, null);      // "two-sided"
 * chooseWord(TIES, "keep");           // throws BadArgument: For ties, "keep" is not accepted. Use drop (the default), split or conservative.
 */
export function chooseWord<T extends string>(vocabulary: Vocabulary<T>, raw: unknown): T {
  if (raw === null || raw === undefined || raw === "") return vocabulary.fallback;
  if (typeof raw === "string") {
    const typed = raw.trim().toLowerCase();
    if (typed === "") return vocabulary.fallback;
    for (const choice of vocabulary.choices) if (choice.words.includes(typed)) return choice.value;
  }
  throw new BadArgument(`For ${vocabulary.argument}, ${shown(raw)} is not accepted. Use ${acceptedWords(vocabulary)}.`);
}
