/**
 * The shipped dist/functions.js, loaded on its own in a fresh context with a
 * stand-in for Excel's custom-functions runtime (dist.ts), and the
 * dist/functions.json beside it. Expected values are worked by hand from the
 * binomial distribution (exact arithmetic: P(X >= 2) for X ~ Bin(3, 1/2) is
 * 4/8) or follow from the catalogue's rules (issue "The EVENSPLIT cell
 * functions"); the metadata fields are those of Microsoft, "Manually create
 * JSON metadata for custom functions in Excel" (Office Add-ins documentation).
 */
import { describe, expect, it } from "vitest";
import { loadFunctionsBundle, metadataIds, distText, StandInError } from "./dist";

const bundle = loadFunctionsBundle();

interface Metadata {
  functions: {
    id: string;
    name: string;
    description?: string;
    parameters: { name: string; description?: string; optional?: boolean; dimensionality?: string; type?: string; customEnumId?: string }[];
    result: { dimensionality?: string };
    options?: Record<string, boolean>;
  }[];
}
const metadata = JSON.parse(distText("functions.json")) as Metadata;

/** A one-column range of the given cells. */
function col(...cells: unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

function expectError(value: unknown, code: string, pattern: RegExp): void {
  expect(value).toBeInstanceOf(StandInError);
  const e = value as StandInError;
  expect(e.code).toBe(code);
  expect(e.message).toMatch(pattern);
}

describe("dist/functions.js", () => {
  it("registers exactly the ids functions.json lists, each once", () => {
    expect(bundle.ids.length).toBe(new Set(bundle.ids).size);
    expect([...bundle.ids].sort()).toEqual([...metadataIds()].sort());
  });

  it("registers functions whose metadata gives help for the function and every argument", () => {
    for (const f of metadata.functions) {
      expect(f.name).toBe(f.id);
      expect(f.description, f.id).toMatch(/\w{3,}/);
      expect(f.options?.volatile ?? false, f.id).toBe(false);
      expect(f.options?.stream ?? false, f.id).toBe(false);
      for (const p of f.parameters) {
        expect(p.description, `${f.id}(${p.name})`).toMatch(/\w{3,}/);
        // Every argument is checked by the function itself, so Excel passes it as it is ("any"); a word
        // argument carries its custom enum and the enum's type, "string" (customEnums.test.ts).
        expect(p.type ?? "any", `${f.id}(${p.name})`).toBe(p.customEnumId === undefined ? "any" : "string");
      }
      const ranges = f.parameters.filter((p) => p.dimensionality === "matrix").map((p) => p.name);
      const expectedRanges = { pvalues: true, data: true, first: true, second: true, values: true, labels: true };
      for (const p of f.parameters) expect(ranges.includes(p.name), `${f.id}(${p.name})`).toBe(p.name in expectedRanges);
      expect(bundle.fns.get(f.id)?.length ?? -1, f.id).toBeGreaterThanOrEqual(f.parameters.filter((p) => !p.optional).length);
    }
  });

  it("marks the catalogue's optional arguments as optional, in the catalogue's order", () => {
    const signature = (id: string) =>
      metadata.functions
        .find((f) => f.id === id)!
        .parameters.map((p) => (p.optional ? `[${p.name}]` : p.name))
        .join(", ");
    expect(signature("PVALUE")).toBe("data, hypothesized_median, [alternative], [ties], [method]");
    expect(signature("PAIRED")).toBe("first, second, [shift], [alternative], [ties], [method]");
    expect(signature("QUANTILEPVALUE")).toBe("data, value, quantile, [alternative]");
    expect(signature("SAMPLESIZE")).toBe("p_above, [power], [alpha], [alternative]");
    expect(signature("PAIREDWATCHPVALUE")).toBe("first, second, [shift], [alternative], [ties]");
    expect(signature("PAIREDWATCHBOUNDS")).toBe("first, second, [confidence], [quantile]");
    expect(signature("PAIREDSPRT")).toBe("first, second, shift, p_above, [alpha], [beta]");
    expect(signature("REPORT")).toBe("data, hypothesized_median, [alternative], [alpha], [confidence], [second]");
  });

  it("computes through the bundle, skipping blanks, text and logical values", () => {
    // 52 and 55 above 50, 49 below: P(Bin(3, 1/2) >= 2) = 4/8.
    const data = col(52, null, 49, "n/a", 55, true, "", 50);
    expect(bundle.call("PVALUE", data, 50, "greater", null, null)).toBeCloseTo(0.5, 14);
    expect(bundle.call("COUNTS", data, 50)).toEqual([[1, 1, 2, 3]]);
    expect(bundle.call("STATISTIC", data, 50, ">")).toBe(2);
    expect(bundle.call("PAIREDCOUNTS", col(1, 2, 3, "x"), col(2, 2, 1, 4), null)).toEqual([[1, 1, 1, 2, 1]]);
    // Three pairs up, a blank and a text side skipped: the watching p-value of three signs up, 1/(2^3 · 3! / 4!) = 1/2.
    expect(bundle.call("PAIREDWATCHPVALUE", col(1, 2, 3, 4, "x"), col(2, 3, null, 5, 6))).toBeCloseTo(0.5, 14);
    expect(bundle.call("PAIREDWATCHBOUNDS", col(1, 2), col(2, 4), 0.95) as unknown[][]).toHaveLength(1);
    expect((bundle.call("PAIREDSPRT", col(1, 2), col(2, 4), 0, 0.75) as unknown[][])[0].slice(0, 2)).toEqual(["continue", 2]);
    const block = bundle.call("REPORT", data, 50, "greater") as unknown[][];
    expect(block.every((row) => row.length === 2)).toBe(true);
    expect(block.find((row) => row[0] === "p-value")?.[1]).toBeCloseTo(0.5, 14);
  });

  it("names REPORT's ranges in its audit row by the addresses Excel passes, and gives their sizes without them", () => {
    // Microsoft, "Manually create JSON metadata for custom functions": requiresParameterAddresses, with a matrix
    // result; "Custom functions parameter options": the invocation comes last, one SheetName!A1 address per argument.
    const meta = metadata.functions.find((f) => f.id === "REPORT")!;
    expect(meta.options?.requiresParameterAddresses).toBe(true);
    expect(meta.result.dimensionality).toBe("matrix");
    const data = col(52, 49, 55);
    const audit = (...args: unknown[]) => (bundle.call("REPORT", data, 50, "greater", ...args) as unknown[][]).at(-1)![1];
    const addresses = (first: string, second = "") => ({ parameterAddresses: [first, "", "", "", "", second] });
    expect(audit(null, null, null, addresses("Panels!B2:B4"))).toMatch(/; reads Panels!B2:B4; evaluated /);
    expect(audit(null, null, data, addresses("Nozzle!B2:B4", "Nozzle!C2:C4"))).toMatch(/; reads Nozzle!B2:B4 and Nozzle!C2:C4; evaluated /);
    // An Excel before CustomFunctionsRuntime 1.3 leaves parameterAddresses undefined; a call without an invocation has none.
    expect(audit(null, null, null, {})).toMatch(/; reads the range given \(3 rows × 1 column\); evaluated /);
    expect(audit()).toMatch(/; reads the range given \(3 rows × 1 column\); evaluated /);
  });

  it("answers a bad word with #VALUE! listing what is accepted", () => {
    expectError(
      bundle.call("PVALUE", col(1, 2), 0, "upwards"),
      "#VALUE!",
      /For alternative, "upwards" is not accepted\. Use two-sided .*greater .*less/,
    );
    const row = (bundle.call("BOUNDS", col(1, 2), 0.95, "middle") as unknown[][])[0];
    expect(row).toHaveLength(3);
    for (const cell of row)
      expectError(cell, "#VALUE!", /^For side, "middle" is not accepted\. Use two-sided \(the default\), lower or upper\.$/);
  });

  it("answers data that cannot give a result with #N/A and the reason", () => {
    expectError(bundle.call("PVALUE", col(50, 50, "x"), 50), "#N/A", /\w/);
    const row = bundle.call("BOUNDS", col(1, 2, 3), 0.99) as unknown[][];
    expect(row[0]).toHaveLength(3);
    for (const cell of row[0]) expectError(cell, "#N/A", /at least \d+/);
  });

  it("refuses paired ranges of different shapes", () => {
    expectError(bundle.call("PAIRED", col(1, 2, 3), col(1, 2)), "#VALUE!", /same shape.*3 rows × 1 column.*2 rows × 1 column/);
  });

  it("gives the same exact signed-rank p-values, bit for bit, in a runtime without WebAssembly (its JavaScript step)", () => {
    const withoutWebAssembly = loadFunctionsBundle({ webAssembly: false });
    // Invented differences: untied, tied with zeros (Pratt), and 1,000 untied (the slowest exact size).
    const untied = Array.from({ length: 300 }, (_, i) => [(i % 3 === 0 ? -1 : 1) * (i + 1 + (i % 7) / 10)]);
    const tied = Array.from({ length: 500 }, (_, i) => [Math.round(Math.sin(i * 1.3) * 20)]);
    const large = Array.from({ length: 1000 }, (_, i) => [(i % 5 < 2 ? -1 : 1) * (i + 1)]);
    for (const [data, zeros] of [
      [untied, "drop"],
      [tied, "pratt"],
      [large, "drop"],
    ] as const) {
      for (const alternative of ["two-sided", "greater", "less"]) {
        const fast = bundle.call("SIGNRANK", data, 0, alternative, "exact", zeros);
        expect(typeof fast).toBe("number");
        expect(withoutWebAssembly.call("SIGNRANK", data, 0, alternative, "exact", zeros)).toBe(fast);
      }
    }
  });

  it("turns an unexpected failure inside into a calm #VALUE!, never the exception's text", () => {
    const treacherous: unknown[] = [1];
    Object.defineProperty(treacherous, 0, {
      get() {
        throw new Error("internal detail: cells[0] exploded");
      },
    });
    const answers = [
      bundle.call("PVALUE", [treacherous], 0),
      (bundle.call("BOUNDS", [treacherous]) as unknown[][])[0][0],
      (bundle.call("REPORT", [treacherous], 0) as unknown[][])[0][0],
    ];
    for (const answer of answers) {
      expectError(answer, "#VALUE!", /could not work this result out/);
      expect((answer as StandInError).message).not.toMatch(/internal|exploded|cells\[0\]/);
    }
  });
});
