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
import type { MedianTieRule } from "../stats/moodMedian";
import { BadArgument } from "./errors";

/**
 * One canonical value, the words that select it (the canonical word first), and what it means in a
 * few words of our own: the help page prints it beside the word, and the function picker shows it as
 * the word's tooltip (functions.json's custom enums, made from these vocabularies at build time).
 */
export interface Choice<T extends string> {
  readonly value: T;
  readonly words: readonly string[];
  readonly meaning: string;
}

/** An option: its argument name, its choices, and which one an omitted argument means. */
export interface Vocabulary<T extends string> {
  readonly argument: string;
  readonly choices: readonly Choice<T>[];
  readonly fallback: T;
}

export const ALTERNATIVE: Vocabulary<Alternative> = {
  argument: "alternative",
  choices: [
    {
      value: "two-sided",
      words: ["two-sided", "two", "both", "<>", "≠", "different", "different from"],
      meaning: "A difference from the hypothesised value in either direction.",
    },
    {
      value: "greater",
      words: ["greater", "above", "right", ">"],
      meaning: "Larger than hypothesised: the median, the median difference or the second group.",
    },
    {
      value: "less",
      words: ["less", "below", "left", "<"],
      meaning: "Smaller than hypothesised: the median, the median difference or the second group.",
    },
  ],
  fallback: "two-sided",
};

export const TIES: Vocabulary<TieRule> = {
  argument: "ties",
  choices: [
    { value: "drop", words: ["drop"], meaning: "Values equal to the hypothesised median are left out of the test." },
    { value: "split", words: ["split"], meaning: "Ties are shared evenly between below and above; with an odd number, one is left out." },
    {
      value: "conservative",
      words: ["conservative"],
      meaning: "Ties are kept and counted against the alternative, which can only raise the p-value.",
    },
  ],
  fallback: "drop",
};

/** The block's method row prints "exact binomial", "mid-p binomial" and "normal approximation"; each is accepted back. */
export const SIGN_METHOD: Vocabulary<SignTestMethod> = {
  argument: "method",
  choices: [
    { value: "exact", words: ["exact", "exact binomial"], meaning: "The exact binomial p-value." },
    {
      value: "midp",
      words: ["midp", "mid-p", "mid-p binomial"],
      meaning: "The binomial p-value with half the chance of the observed count.",
    },
    { value: "normal", words: ["normal", "normal approximation"], meaning: "The normal approximation with continuity correction." },
  ],
  fallback: "exact",
};

export const SIGNED_RANK_METHOD: Vocabulary<SignedRankMethod> = {
  argument: "method",
  choices: [
    { value: "auto", words: ["auto"], meaning: "Exact for small samples, the normal approximation for large ones." },
    { value: "exact", words: ["exact"], meaning: "The exact distribution of the signed-rank sum, given the ties." },
    {
      value: "normal",
      words: ["normal", "normal approximation"],
      meaning: "The normal approximation with continuity and tie corrections.",
    },
  ],
  fallback: "auto",
};

export const ZEROS: Vocabulary<ZeroRule> = {
  argument: "zeros",
  choices: [
    { value: "drop", words: ["drop"], meaning: "Values equal to the centre are left out before ranking (Wilcoxon)." },
    { value: "pratt", words: ["pratt"], meaning: "Values equal to the centre are ranked, then left out of the sum (Pratt)." },
  ],
  fallback: "drop",
};

export const SIDE: Vocabulary<BoundSide> = {
  argument: "side",
  choices: [
    { value: "two-sided", words: ["two-sided"], meaning: "A lower and an upper bound." },
    { value: "lower", words: ["lower"], meaning: "A lower bound only; the upper end is open." },
    { value: "upper", words: ["upper"], meaning: "An upper bound only; the lower end is open." },
  ],
  fallback: "two-sided",
};

/**
 * Bounds at data values, or between neighbouring values by the method of
 * Hettmansperger and Sheather (1986), named after its authors.
 */
export const BOUND_METHOD: Vocabulary<BoundMethod> = {
  argument: "method",
  choices: [
    { value: "exact", words: ["exact"], meaning: "Bounds are data values; the coverage is at least the confidence asked." },
    {
      value: "interpolated",
      words: ["hettmansperger-sheather", "hettmansperger sheather"],
      meaning: "Bounds between neighbouring values, with coverage closer to the confidence asked.",
    },
  ],
  fallback: "exact",
};

const ADJUST_CHOICES: readonly Choice<AdjustMethod>[] = [
  { value: "holm", words: ["holm"], meaning: "Holm's step-down method; controls the chance of any false finding." },
  { value: "bonferroni", words: ["bonferroni"], meaning: "Each p-value times the number of tests, at most 1." },
  { value: "hochberg", words: ["hochberg"], meaning: "Hochberg's step-up method; for independent tests." },
  { value: "bh", words: ["bh"], meaning: "Benjamini–Hochberg; controls the expected share of false findings." },
  { value: "by", words: ["by"], meaning: "Benjamini–Yekutieli; like bh, under any dependence between the tests." },
];

export const ADJUST_METHOD: Vocabulary<AdjustMethod> = { argument: "method", choices: ADJUST_CHOICES, fallback: "holm" };

/** The same adjustments, as BYGROUP's argument adjust names them (so a wrong word is reported under that name). */
export const ADJUST_ACROSS_GROUPS: Vocabulary<AdjustMethod> = { argument: "adjust", choices: ADJUST_CHOICES, fallback: "holm" };

export const TWO_GROUP_METHOD: Vocabulary<"rank-sum" | "median"> = {
  argument: "method",
  choices: [
    {
      value: "rank-sum",
      words: ["rank-sum", "rank sum", "ranksum", "wilcoxon", "mann-whitney"],
      meaning: "The Wilcoxon–Mann–Whitney rank-sum test; exact for small groups.",
    },
    { value: "median", words: ["median", "mood"], meaning: "Mood's median test: above or not above the pooled median, Fisher exact." },
  ],
  fallback: "rank-sum",
};

export const MANY_GROUP_METHOD: Vocabulary<"median" | "rank"> = {
  argument: "method",
  choices: [
    { value: "median", words: ["median", "mood"], meaning: "Mood's median test across the groups." },
    { value: "rank", words: ["rank", "ranks", "kruskal-wallis"], meaning: "The Kruskal–Wallis rank test, tie-corrected." },
  ],
  fallback: "median",
};

/** Values equal to the pooled median in the median test (common practice varies, so it is a choice). */
export const AT_MEDIAN: Vocabulary<MedianTieRule> = {
  argument: "at_median",
  choices: [
    { value: "join-lower", words: ["join-lower", "lower"], meaning: "Values at the pooled median count as not above it." },
    { value: "join-upper", words: ["join-upper", "upper"], meaning: "Values at the pooled median count as above it." },
    { value: "leave-out", words: ["leave-out", "leave out"], meaning: "Values at the pooled median are left out." },
  ],
  fallback: "join-lower",
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
