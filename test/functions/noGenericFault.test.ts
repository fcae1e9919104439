/**
 * No generic fault on any input a sheet can pass. Every catalogue function is
 * run on adversarial arguments of the kinds a spreadsheet hands over (Microsoft,
 * "Custom functions parameter options": ranges as matrices of numbers, text,
 * logicals and blanks; omitted arguments as null): numbers up to the sheet's
 * largest, 9.99999999999999E+307 (Microsoft, "Excel specifications and
 * limits"), the smallest positive double, -0, confidences and quantiles at the
 * edges of (0, 1), option words and near-misses, ranges of other shapes. An
 * answer may be a number, a row, #VALUE! or #N/A with a message that says
 * what; the generic "could not work this out" message, kept for faults of
 * ours, must never appear.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { GENERIC_MESSAGE } from "../../src/functions/errors";
import { callFunction, FUNCTION_IDS } from "../../src/functions/functions";

const LARGEST = 9.99999999999999e307;

const number = fc.oneof(
  fc.constantFrom(0, -0, 1, -1, 0.5, 50, LARGEST, -LARGEST, 5e-324, -5e-324, 1e-11, 1 - 1e-11, 1e-300, 2 ** 53, 0.1 + 0.2, 1e15, 1000, 1e9),
  fc.double({ min: -LARGEST, max: LARGEST, noNaN: true }),
  fc.integer({ min: -5, max: 60 }),
);

const word = fc.constantFrom(
  "two-sided",
  "greater",
  "less",
  "above",
  "below",
  "<>",
  ">",
  "<",
  "drop",
  "split",
  "conservative",
  "exact",
  "midp",
  "mid-p",
  "normal",
  "auto",
  "pratt",
  "lower",
  "upper",
  "hettmansperger-sheather",
  "interpolated",
  "holm",
  "bonferroni",
  "hochberg",
  "bh",
  "by",
  "",
  " ",
  "GREATER ",
  "x",
  "50",
);

const cell = fc.oneof(
  { weight: 6, arbitrary: number },
  { weight: 1, arbitrary: word },
  fc.constant(null),
  fc.constant(""),
  fc.boolean(),
  // An error cell, as the host hands it where it does not short-circuit the call.
  fc.constantFrom({ code: "#N/A" }, { code: "#DIV/0!", message: "" }),
);

/** A range of one shape, as rows of cells; sometimes one value repeated (many ties). */
function range(rows: number, columns: number): fc.Arbitrary<unknown[][]> {
  const filled = fc.array(fc.array(cell, { minLength: columns, maxLength: columns }), { minLength: rows, maxLength: rows });
  const tied = fc
    .tuple(number, fc.boolean())
    .map(([x, withBlank]) =>
      Array.from({ length: rows }, (_, r) => Array.from({ length: columns }, (_, c) => (withBlank && r === 0 && c === 0 ? null : x))),
    );
  return fc.oneof({ weight: 4, arbitrary: filled }, { weight: 1, arbitrary: tied });
}

const shape = fc.record({ rows: fc.integer({ min: 1, max: 40 }), columns: fc.integer({ min: 1, max: 3 }) });
const anyRange = shape.chain(({ rows, columns }) => range(rows, columns));
/** Two ranges, usually of the same shape (as paired functions need), sometimes not. */
const twoRanges = fc.oneof(
  { weight: 5, arbitrary: shape.chain(({ rows, columns }) => fc.tuple(range(rows, columns), range(rows, columns))) },
  { weight: 1, arbitrary: fc.tuple(anyRange, anyRange) },
);

const scalar = fc.oneof({ weight: 4, arbitrary: number }, { weight: 3, arbitrary: word }, fc.constant(null), fc.boolean(), anyRange);

/** Arguments for a function: its ranges first (one or two), then scalars for the rest. */
function argumentsFor(id: string): fc.Arbitrary<unknown[]> {
  const rest = fc.array(scalar, { minLength: 0, maxLength: 6 });
  if (id === "POWER" || id === "SAMPLESIZE") return rest;
  if (id === "REPORT") {
    return fc
      .tuple(anyRange, fc.array(scalar, { minLength: 0, maxLength: 4 }), fc.option(anyRange))
      .map(([data, middle, second]) => [
        data,
        ...middle,
        ...(second === null ? [] : [...Array(Math.max(0, 4 - middle.length)).fill(null), second]),
      ]);
  }
  if (id.startsWith("PAIRED")) return fc.tuple(twoRanges, rest).map(([[a, b], r]) => [a, b, ...r]);
  return fc.tuple(anyRange, rest).map(([a, r]) => [a, ...r]);
}

function generic(answer: unknown): boolean {
  if (Array.isArray(answer)) return answer.some((row: unknown) => (Array.isArray(row) ? row.some(generic) : generic(row)));
  return typeof answer === "object" && answer !== null && (answer as { message?: string }).message === GENERIC_MESSAGE;
}

function notFinite(answer: unknown): boolean {
  if (Array.isArray(answer)) return answer.some((row: unknown) => (Array.isArray(row) ? row.some(notFinite) : notFinite(row)));
  return typeof answer === "number" && !Number.isFinite(answer);
}

describe("every function on adversarial arguments", () => {
  it.each(FUNCTION_IDS.map((id) => [id]))("%s never answers the generic fault message", (id) => {
    fc.assert(
      fc.property(argumentsFor(id), (args) => {
        const answer = callFunction(id, args);
        expect(generic(answer), `${id}(${JSON.stringify(args)})`).toBe(false);
        expect(notFinite(answer)).toBe(false);
      }),
      { numRuns: 400 },
    );
  });

  it.each([
    ["BOUNDS", [[[1], [2], [3]], 1e-11, "upper"]],
    ["QUANTILEBOUNDS", [[[1], [2], [3]], 0.5, 1e-11, "upper"]],
    ["QUANTILEBOUNDS", [[[1], [2], [3]], 0.5, 1e-11, "lower"]],
    [
      "PAIREDBOUNDS",
      [
        [[-LARGEST], [0], [1]],
        [[LARGEST], [1], [2]],
      ],
    ],
    [
      "PAIREDSIGNRANK",
      [
        [[-LARGEST], [0], [1]],
        [[LARGEST], [1], [2]],
      ],
    ],
    [
      "PAIREDHODGESLEHMANN",
      [
        [[-LARGEST], [0], [1]],
        [[LARGEST], [1], [2]],
      ],
    ],
    [
      "PAIRED",
      [
        [[-LARGEST], [0], [1]],
        [[LARGEST], [1], [2]],
      ],
    ],
    ["SIGNRANK", [[[LARGEST], [-LARGEST], [1]], 0]],
    ["HODGESLEHMANN", [[[LARGEST], [LARGEST], [1]], 0.5]],
  ] as const)("%s on the cases named in the issue answers with what went wrong", (id, args) => {
    expect(generic(callFunction(id, args as unknown as unknown[]))).toBe(false);
  });
});
