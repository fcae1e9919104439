/**
 * The option words of the EVENSPLIT functions. The accepted words and
 * defaults are the catalogue's own (issue "The EVENSPLIT cell functions",
 * vocabulary section); the checks are exhaustive over that list.
 */
import { describe, expect, it } from "vitest";
import { BadArgument } from "../../src/functions/errors";
import {
  ADJUST_METHOD,
  ALTERNATIVE,
  BOUND_METHOD,
  SIDE,
  SIGNED_RANK_METHOD,
  SIGN_METHOD,
  TIES,
  ZEROS,
  acceptedWords,
  chooseWord,
  type Vocabulary,
} from "../../src/functions/vocabulary";

/** The catalogue's table: option, default, and every word with the value it selects. */
const CATALOGUE: [Vocabulary<string>, string, Record<string, string>][] = [
  [
    ALTERNATIVE,
    "two-sided",
    {
      "two-sided": "two-sided",
      two: "two-sided",
      both: "two-sided",
      "<>": "two-sided",
      "≠": "two-sided",
      different: "two-sided",
      "different from": "two-sided",
      greater: "greater",
      above: "greater",
      right: "greater",
      ">": "greater",
      less: "less",
      below: "less",
      left: "less",
      "<": "less",
    },
  ],
  [TIES, "drop", { drop: "drop", split: "split", conservative: "conservative" }],
  // The block prints "exact binomial", "mid-p binomial", "normal approximation", "≠" and "different from": each is accepted back.
  [
    SIGN_METHOD,
    "exact",
    {
      exact: "exact",
      "exact binomial": "exact",
      midp: "midp",
      "mid-p": "midp",
      "mid-p binomial": "midp",
      normal: "normal",
      "normal approximation": "normal",
    },
  ],
  [SIGNED_RANK_METHOD, "auto", { auto: "auto", exact: "exact", normal: "normal", "normal approximation": "normal" }],
  [ZEROS, "drop", { drop: "drop", pratt: "pratt" }],
  [SIDE, "two-sided", { "two-sided": "two-sided", lower: "lower", upper: "upper" }],
  [BOUND_METHOD, "exact", { exact: "exact", "hettmansperger-sheather": "interpolated", "hettmansperger sheather": "interpolated" }],
  [ADJUST_METHOD, "holm", { holm: "holm", bonferroni: "bonferroni", hochberg: "hochberg", bh: "bh", by: "by" }],
];

describe("chooseWord", () => {
  it.each(CATALOGUE)("accepts exactly the catalogue's words for %s", (vocabulary, fallback, words) => {
    expect(vocabulary.fallback).toBe(fallback);
    for (const [word, value] of Object.entries(words)) {
      expect(chooseWord(vocabulary, word)).toBe(value);
      expect(chooseWord(vocabulary, word.toUpperCase())).toBe(value);
      expect(chooseWord(vocabulary, `  ${word} `)).toBe(value);
    }
    const listed = vocabulary.choices.flatMap((c) => c.words);
    expect(new Set(listed)).toEqual(new Set(Object.keys(words)));
  });

  it.each(CATALOGUE)("takes an omitted %s (null, undefined, blank) as the default", (vocabulary, fallback) => {
    for (const omitted of [null, undefined, "", "   "]) expect(chooseWord(vocabulary, omitted)).toBe(fallback);
  });

  it("refuses anything else with a message naming the option and every accepted word", () => {
    for (const [vocabulary, , words] of CATALOGUE) {
      for (const wrong of ["sideways", 1, true, "two sided", "≥"]) {
        let caught: unknown;
        try {
          chooseWord(vocabulary, wrong);
        } catch (e) {
          caught = e;
        }
        expect(caught).toBeInstanceOf(BadArgument);
        const message = (caught as BadArgument).message;
        expect(message.startsWith(`For ${vocabulary.argument}, `)).toBe(true);
        for (const word of Object.keys(words)) expect(message).toContain(word);
      }
    }
  });

  it("words the list with each choice's first word, the one a person types, not the value inside", () => {
    expect(acceptedWords(BOUND_METHOD)).toBe("exact (the default) or hettmansperger-sheather (also hettmansperger sheather)");
  });

  it("words the list as a person would read it", () => {
    expect(acceptedWords(ALTERNATIVE)).toBe(
      "two-sided (the default; also two, both, <>, ≠, different, different from), greater (also above, right, >) or less (also below, left, <)",
    );
    expect(() => chooseWord(TIES, "keep")).toThrow('For ties, "keep" is not accepted. Use drop (the default), split or conservative.');
  });
});
