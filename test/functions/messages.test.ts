/**
 * The words of the messages a cell shows on hover: they start with a capital
 * (or a count), name the argument as the function picker spells it, give an
 * example that fits that argument, never print an impossible size, and never
 * suggest a percent where none was meant. The option words the result block
 * prints are accepted back as arguments.
 */
import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { callFunction, FUNCTION_IDS } from "../../src/functions/functions";
import type { CellError } from "../../src/functions/runtime";

function col(...cells: unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

function messagesOf(answer: unknown): string[] {
  if (Array.isArray(answer)) return answer.flatMap((row: unknown) => (Array.isArray(row) ? row.flatMap(messagesOf) : messagesOf(row)));
  return typeof answer === "object" && answer !== null && "message" in answer ? [(answer as CellError).message ?? ""] : [];
}

function firstMessage(answer: unknown): string {
  return messagesOf(answer)[0] ?? "";
}

const DATA = col(51.2, 48.7, 53.1, 50.4, 52.9);

describe("messages", () => {
  it("say a quantile is too extreme instead of printing an impossible size", () => {
    for (const q of [1e-300, 1e-20, 1 - 1e-16]) {
      const message = firstMessage(callFunction("QUANTILEBOUNDS", [DATA, q]));
      expect(message).toMatch(/quantile is too extreme .* from a sample of any size a sheet can hold/);
      expect(message).not.toMatch(/Infinity|e\+\d/);
    }
  });

  it("never round a confidence below 1 up to 100%", () => {
    expect(firstMessage(callFunction("BOUNDS", [DATA, 1 - 1e-16]))).not.toMatch(/100%/);
    expect(firstMessage(callFunction("HODGESLEHMANN", [DATA, 1 - 1e-16]))).not.toMatch(/100%/);
  });

  it("give an example that fits the missing argument, named as the function picker spells it", () => {
    expect(firstMessage(callFunction("POWER", [null, 0.75]))).toBe(
      "Argument n is missing. Give a number, such as 30, or a cell that holds one.",
    );
    expect(firstMessage(callFunction("SAMPLESIZE", [null]))).toMatch(/^Argument p_above is missing\. Give a number, such as 0\.75,/);
    expect(firstMessage(callFunction("QUANTILEBOUNDS", [DATA, null]))).toMatch(
      /^Argument quantile is missing\. Give a number, such as 0\.9,/,
    );
    expect(firstMessage(callFunction("QUANTILEPVALUE", [DATA, null, 0.9]))).toMatch(
      /^Argument value is missing\. Give a number, such as 58,/,
    );
    expect(firstMessage(callFunction("PVALUE", [DATA, null]))).toMatch(
      /^Argument hypothesized_median is missing\. Give a number, such as 50,/,
    );
  });

  it("do not read confidence 1.5 as a percent, but do read 95 as one", () => {
    const slip = firstMessage(callFunction("BOUNDS", [DATA, 1.5]));
    expect(slip).toBe("Argument confidence must lie strictly between 0 and 1, such as 0.95; got 1.5.");
    expect(firstMessage(callFunction("BOUNDS", [DATA, 95]))).toMatch(/For 95% write 0\.95\.$/);
    expect(firstMessage(callFunction("POWER", [30, 0.75, 5]))).toMatch(/For 5% write 0\.05\.$/);
  });

  it("start with a capital or a count, for every function on arbitrary arguments", () => {
    const scalar = fc.oneof(
      fc.constantFrom(null, "", "sideways", 1.5, 95, -1, 0, 1, 1e-300, 0.5, "mid-p", true),
      fc.double({ noNaN: true, noDefaultInfinity: true }),
    );
    fc.assert(
      fc.property(fc.constantFrom(...FUNCTION_IDS), fc.array(scalar, { maxLength: 6 }), fc.boolean(), (id, rest, withData) => {
        const args =
          id === "POWER" || id === "SAMPLESIZE"
            ? rest
            : id.startsWith("PAIRED")
              ? [DATA, withData ? DATA : col(1), ...rest]
              : [withData ? DATA : col(), ...rest];
        for (const message of messagesOf(callFunction(id, args))) expect(message, `${id}(${JSON.stringify(args)})`).toMatch(/^[A-Z0-9]/);
      }),
      { numRuns: 600 },
    );
  });
});

describe("the block's own words are accepted back", () => {
  it("takes mid-p, exact binomial, normal approximation and ≠ as the block prints them", () => {
    const p = (alternative: string, method: string) => callFunction("PVALUE", [DATA, 50, alternative, "drop", method]);
    expect(p("≠", "mid-p")).toBe(p("two-sided", "midp"));
    expect(p("different from", "exact binomial")).toBe(p("two-sided", "exact"));
    expect(p("two-sided", "normal approximation")).toBe(p("two-sided", "normal"));
    expect(callFunction("SIGNRANK", [DATA, 50, "greater", "normal approximation"])).toBe(
      callFunction("SIGNRANK", [DATA, 50, "greater", "normal"]),
    );
  });
});

describe("the quantile test's two-sided rule is stated", () => {
  it("in QUANTILEPVALUE's help and in the README", () => {
    const source = readFileSync(new URL("../../src/functions/functions.ts", import.meta.url), "utf8");
    const help = source.slice(source.indexOf("@customfunction QUANTILEPVALUE"), source.indexOf("export function quantilepvalue"));
    expect(help).toMatch(/twice the smaller one-sided p-value, at most 1/);
    const readme = readFileSync(new URL("../../README.md", import.meta.url), "utf8");
    expect(readme).toMatch(/QUANTILEPVALUE[^\n]*twice the smaller one-sided p-value, at most 1/);
  });
});
