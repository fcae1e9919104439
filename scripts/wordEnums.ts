/**
 * The word arguments as custom enums in functions.json, so that Excel's formula
 * AutoComplete offers the words of an argument with a tooltip for each
 * (Microsoft, "Create custom enums for your custom functions"; "Manually create
 * JSON metadata for custom functions in Excel": enums, customEnumId).
 *
 * The enums are made at build time from src/functions/vocabulary.ts, the same
 * vocabularies the functions check their words against and the help pages list,
 * so the picker, the page and the check cannot disagree. The metadata generator's
 * own route (`@customenum` on a TypeScript enum, parameters typed with it) would
 * keep a second copy of the words and give the parameters an enum type that the
 * catalogue's callers (REPORT, the demo, the tests) could not pass a typed word to;
 * the JSON reference allows enums written into the metadata for any function.
 *
 * Each enum lists the canonical words (name and stringValue both the word a person
 * types, so whatever Excel inserts is accepted) with our own one-line meaning as the
 * tooltip; the synonyms stay accepted by typing. A parameter with an enum is declared
 * `"type": "string"`, the enum's type, as the reference's example pairs them. Excel
 * versions without custom enums treat such a parameter as a standard one (the enums
 * page, "Backwards compatibility"), and none of the pages ties enums to a requirement
 * set, so the manifest's CustomFunctionsRuntime is unchanged by them. The function
 * still checks every word: the pages describe the list as suggestions only.
 *
 * Cost: one pass over the parameters.
 */
import * as vocabularies from "../src/functions/vocabulary";
import type { Vocabulary } from "../src/functions/vocabulary";

/** One value of a string enum (Microsoft 365 app manifest reference, "enum values"). */
export interface EnumValue {
  readonly name: string;
  readonly stringValue: string;
  readonly tooltip: string;
}

/** A custom enum of functions.json (Microsoft 365 app manifest reference, "enum object"). */
export interface CustomEnum {
  readonly id: string;
  readonly type: "string";
  readonly values: readonly EnumValue[];
}

interface ParameterMetadata {
  readonly name: string;
  readonly description?: string;
  readonly type?: string;
  readonly customEnumId?: string;
}

function isVocabulary(value: unknown): value is Vocabulary<string> {
  return typeof value === "object" && value !== null && "argument" in value && "choices" in value && "fallback" in value;
}

/** Every vocabulary with the name vocabulary.ts exports it under, which is also its enum's id. */
const NAMED_VOCABULARIES: ReadonlyMap<Vocabulary<string>, string> = new Map(
  Object.entries(vocabularies as Record<string, unknown>)
    .filter((entry): entry is [string, Vocabulary<string>] => isVocabulary(entry[1]))
    .map(([name, vocabulary]) => [vocabulary, name]),
);

/**
 * The vocabulary an argument takes, found from its name and the words its
 * help quotes: the one for that argument name whose canonical words are
 * exactly the quoted ones, a choice's canonical word being the first of its
 * words (several options share a name, such as method).
 * Undefined for an argument that takes no words.
 *
 * @example
 * vocabularyFor({ name: "ties", description: '"drop" (default), "split" or "conservative".' }); // TIES
 */
export function vocabularyFor(parameter: { name: string; description?: string }): Vocabulary<string> | undefined {
  const quoted = new Set([...(parameter.description ?? "").matchAll(/"([^"]+)"/g)].map((m) => m[1].toLowerCase()));
  if (quoted.size === 0) return undefined;
  const sameName = [...NAMED_VOCABULARIES.keys()].filter((v) => v.argument === parameter.name);
  // The first word of each choice is the one a person types (vocabulary.ts).
  const canonical = (v: Vocabulary<string>) => v.choices.map((c) => c.words[0]);
  return sameName.find((v) => canonical(v).length === quoted.size && canonical(v).every((w) => quoted.has(w)));
}

/**
 * A vocabulary as a custom enum: its export name as the id, each choice's
 * canonical word as name and value, its meaning as the tooltip.
 *
 * @example
 * wordEnum(vocabularies.ZEROS).values[1]; // { name: "pratt", stringValue: "pratt", tooltip: "Values equal to the centre are ranked, …" }
 */
export function wordEnum(vocabulary: Vocabulary<string>): CustomEnum {
  const id = NAMED_VOCABULARIES.get(vocabulary);
  if (id === undefined) throw new Error(`vocabulary for ${vocabulary.argument} is not exported from src/functions/vocabulary.ts`);
  const values = vocabulary.choices.map((choice) => ({
    name: choice.words[0],
    stringValue: choice.words[0],
    tooltip: choice.value === vocabulary.fallback ? `${choice.meaning} The default.` : choice.meaning,
  }));
  return { id, type: "string", values };
}

/**
 * The metadata with a custom enum on every word argument and the enums it
 * uses (each once, in order of first use) in its top-level `enums`.
 */
export function withWordEnums<F extends { parameters: readonly ParameterMetadata[] }>(
  functions: readonly F[],
): { functions: F[]; enums: CustomEnum[] } {
  const enums = new Map<string, CustomEnum>();
  const withEnums = functions.map((fn) => ({
    ...fn,
    parameters: fn.parameters.map((p) => {
      const vocabulary = vocabularyFor(p);
      if (vocabulary === undefined) return p;
      const wordList = wordEnum(vocabulary);
      if (!enums.has(wordList.id)) enums.set(wordList.id, wordList);
      return { ...p, type: wordList.type, customEnumId: wordList.id };
    }),
  }));
  return { functions: withEnums, enums: [...enums.values()] };
}
