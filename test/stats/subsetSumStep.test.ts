import { describe, expect, it } from "vitest";
import fc from "fast-check";
import wabt from "wabt";
import { BYTES_PATH, bytesModule, compileSubsetSumStep, WAT_PATH } from "../../scripts/subsetSumWasm";
import { signedRankLowerTail, signedRankNullCdf } from "../../src/stats/signedRank";
import { javascriptEngine, subsetSumEngine, webAssemblyEngine } from "../../src/stats/subsetSumStep";
import { SUBSET_SUM_STEP_HEX } from "../../src/stats/subsetSumStepBytes";
import { readFileSync } from "node:fs";

/** The step as its definition reads, one entry at a time from the top (the reference for both engines). */
function definition(counts: number[], low: number, high: number, shift: number): number[] {
  const after = counts.slice();
  for (let w = high; w >= low; w--) after[w] += after[w - shift];
  return after;
}

describe("the WebAssembly module", () => {
  it("is the .wat as wabt compiles it today (the committed bytes are not stale)", async () => {
    const binary = await compileSubsetSumStep();
    expect(Buffer.from(binary).toString("hex")).toBe(SUBSET_SUM_STEP_HEX);
    expect(readFileSync(BYTES_PATH, "utf8")).toBe(bytesModule(binary));
  });

  it("is the engine Node uses", () => {
    expect(subsetSumEngine().name).toBe("webassembly");
  });

  it("hands out JavaScript tables, stepped in JavaScript, when its memory cannot grow", async () => {
    // The same module with a memory of at most one page (64 KiB): a table of 100,000 entries cannot fit.
    const tools = await wabt();
    const source = readFileSync(WAT_PATH, "utf8").replace('(memory (export "memory") 1 32767)', '(memory (export "memory") 1 1)');
    expect(source).toContain("1 1)");
    const parsed = tools.parseWat("small.wat", source, { simd: true });
    const engine = webAssemblyEngine(Uint8Array.from(parsed.toBinary({}).buffer))!;
    parsed.destroy();
    expect(engine.name).toBe("webassembly");
    const [inside] = engine.tables([1000]);
    const [outside] = engine.tables([100_000]);
    expect(outside.buffer).not.toBe(inside.buffer);
    outside.fill(1);
    engine.step(outside, 3, 99_999, 3);
    expect([outside[2], outside[3], outside[99_999]]).toEqual([1, 2, 2]);
  });

  it("is given up, for JavaScript, when the bytes cannot be compiled (as under a policy refusing WebAssembly)", () => {
    const broken = Uint8Array.from([0, 97, 115, 109, 1, 0, 0, 0, 255]);
    expect(webAssemblyEngine(broken)).toBeUndefined();
  });
});

describe.each([
  ["webassembly", webAssemblyEngine()!],
  ["javascript", javascriptEngine()],
])("the step in %s", (_, engine) => {
  it("equals the definition on random tables, ranges and shifts, bit for bit (property)", () => {
    // Shifts 1-3 make the entries read overlap the four written at a time; ranges of 0-3 entries use only the
    // one-at-a-time loop; high < low does nothing.
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 40 }),
        fc.integer({ min: 1, max: 12 }),
        fc.nat(),
        fc.nat(),
        (values, shift, a, b) => {
          fc.pre(values.length > shift);
          const low = shift + (a % (values.length - shift));
          const high = low - 1 + (b % (values.length - low + 1));
          const [table] = engine.tables([values.length]);
          table.set(values);
          engine.step(table, low, high, shift);
          expect(Array.from(table.subarray(0, values.length))).toEqual(definition(values, low, high, shift));
        },
      ),
      { numRuns: 2000 },
    );
  });

  it("hands out tables that do not overlap, on 16-byte boundaries, and still step after the memory grows", () => {
    const [small] = engine.tables([5]);
    small.set([1, 2, 3, 4, 5]);
    const [first, second] = engine.tables([3_000_001, 1_000_003]); // over 32 MB: the memory grows
    expect(first.byteOffset % 16).toBe(0);
    expect(second.byteOffset % 16).toBe(0);
    if (first.buffer === second.buffer) expect(second.byteOffset).toBeGreaterThanOrEqual(first.byteOffset + first.byteLength);
    first.fill(1, 0, 3_000_001);
    second.fill(2, 0, 1_000_003);
    engine.step(first, 1, 3_000_000, 1);
    engine.step(second, 7, 1_000_002, 7);
    expect([first[0], first[1], first[3_000_000], second[6], second[7], second[1_000_002]]).toEqual([1, 2, 2, 2, 4, 4]);
  });

  it("steps a table it did not hand out (in JavaScript)", () => {
    const outside = Float64Array.from([1, 2, 3, 4, 5, 6]);
    engine.step(outside, 2, 5, 2);
    expect(Array.from(outside)).toEqual(definition([1, 2, 3, 4, 5, 6], 2, 5, 2));
  });
});

describe("exact signed-rank tails: the two engines agree bit for bit", () => {
  const wasm = webAssemblyEngine()!;
  const js = javascriptEngine();
  it.each([
    ["ranks 1-1,000, the middle", Array.from({ length: 1000 }, (_, i) => i + 1), 125_000],
    ["ranks 1-1,000, a far tail", Array.from({ length: 1000 }, (_, i) => i + 1), 90_000],
    ["tie pairs (every score odd), 999 scores", Array.from({ length: 999 }, (_, i) => 2 * (i >> 1) + 3), 250_000],
    ["ties and Pratt-style small scores", Array.from({ length: 600 }, (_, i) => 1 + ((i * 37) % 301)), 40_000],
  ])("%s", (_, scores, q) => {
    expect(signedRankLowerTail(scores, q, wasm)).toBe(signedRankLowerTail(scores, q, js));
  });

  it("the plain recursion (signedRankNullCdf) through the engine matches the definition on small cases", () => {
    // Exact arithmetic: scores 1, 2, 3 give sums 0, 1, 2, 3, 3, 4, 5, 6, each with probability 1/8.
    expect(Array.from(signedRankNullCdf([1, 2, 3], 6))).toEqual([0.125, 0.25, 0.375, 0.625, 0.75, 0.875, 1]);
  });
});
