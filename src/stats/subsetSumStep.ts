/**
 * The inner loop of the exact signed-rank distribution (signedRank.ts): the subset-sum step
 *
 *   counts[w] += counts[w - shift]   for w from high down to low (low >= shift >= 1),
 *
 * which adds one score to a table of subset-sum counts, and the tables it runs on.
 *
 * Two engines, giving bit-identical tables (each entry receives the same one addition):
 * - WebAssembly with 128-bit SIMD (subsetSumStep.wat), four entries per turn of the loop. It needs the
 *   tables in its own memory, so the engine hands them out. `npm run bench -- signedRank` times it
 *   against the JavaScript loop; in the pane's page it needs 'wasm-unsafe-eval' in the content security
 *   policy (taskpane.html).
 * - JavaScript, wherever WebAssembly is missing, refused (a content security policy without
 *   'wasm-unsafe-eval', an engine without SIMD) or out of memory.
 * The WebAssembly engine is compiled on first use, so a workbook that never asks for an exact
 * signed-rank p-value never compiles it.
 *
 * Cost: the step is O(high - low); handing out tables is O(1), plus growing the memory when a call needs
 * more than any before.
 */
import { SUBSET_SUM_STEP_HEX } from "./subsetSumStepBytes";

export interface SubsetSumEngine {
  readonly name: "webassembly" | "javascript";
  /**
   * Tables of the given lengths that `step` can run on. They are valid until the next call of `tables` and
   * hold whatever an earlier call left in them: the caller writes every entry before reading it.
   */
  tables(lengths: readonly number[]): Float64Array[];
  /** counts[w] += counts[w - shift] for w from high down to low; nothing when high < low. */
  step(counts: Float64Array, low: number, high: number, shift: number): void;
}

/** The step in plain JavaScript, on any Float64Array. */
function javascriptStep(counts: Float64Array, low: number, high: number, shift: number): void {
  for (let w = high; w >= low; w--) counts[w] += counts[w - shift];
}

/** An engine stepping in JavaScript on tables kept between calls and grown when a call needs more. */
export function javascriptEngine(): SubsetSumEngine {
  const kept: Float64Array[] = [];
  return {
    name: "javascript",
    tables(lengths) {
      return lengths.map((length, k) => {
        if (!kept[k] || kept[k].length < length) kept[k] = new Float64Array(Math.max(length, 2 * (kept[k]?.length ?? 0)));
        return kept[k];
      });
    },
    step: javascriptStep,
  };
}

const PAGE_BYTES = 65536;

/** The module's memory maximum (subsetSumStep.wat): addresses stay below 2 GiB. */
const MAX_PAGES = 32767;

interface StepExports {
  memory: WebAssembly.Memory;
  step(base: number, low: number, high: number, shift: number): void;
}

/**
 * An engine stepping in WebAssembly, or undefined where the module cannot be compiled or run (no
 * WebAssembly, no SIMD, or a content security policy that refuses it). Tables too large for its memory
 * come from a JavaScript engine instead, and are stepped in JavaScript.
 */
export function webAssemblyEngine(binary?: Uint8Array<ArrayBuffer>): SubsetSumEngine | undefined {
  let exports: StepExports;
  try {
    // Synchronous compilation: the module is 232 bytes, well under the 4 KB browsers allow on the main thread.
    const module = new WebAssembly.Module(binary ?? bytesOfHex(SUBSET_SUM_STEP_HEX));
    exports = new WebAssembly.Instance(module).exports as unknown as StepExports;
    const probe = new Float64Array(exports.memory.buffer, 0, 6);
    probe.set([1, 2, 3, 4, 5, 6]);
    exports.step(0, 1, 5, 1);
    if (probe.join() !== "1,3,5,7,9,11") return undefined;
  } catch {
    return undefined;
  }
  const overflow = javascriptEngine();
  const { memory, step } = exports;
  return {
    name: "webassembly",
    tables(lengths) {
      // Each table starts on a 16-byte boundary, so the four-entry loads line up with the tables.
      const starts = lengths.map((_, k) => lengths.slice(0, k).reduce((sum, length) => sum + 2 * Math.ceil(length / 2), 0));
      const needed = 8 * (starts[starts.length - 1] + lengths[lengths.length - 1]);
      const pages = Math.ceil(needed / PAGE_BYTES);
      const current = memory.buffer.byteLength / PAGE_BYTES;
      if (pages > MAX_PAGES) return overflow.tables(lengths);
      try {
        if (pages > current) memory.grow(pages - current);
      } catch {
        return overflow.tables(lengths); // the browser would not give more memory
      }
      return lengths.map((length, k) => new Float64Array(memory.buffer, 8 * starts[k], length));
    },
    step(counts, low, high, shift) {
      if (counts.buffer === memory.buffer) step(counts.byteOffset, low, high, shift);
      else javascriptStep(counts, low, high, shift);
    },
  };
}

/** Bytes from hexadecimal text, by plain JavaScript (runtimes without the web's atob included). */
function bytesOfHex(text: string): Uint8Array<ArrayBuffer> {
  return Uint8Array.from({ length: text.length / 2 }, (_, i) => parseInt(text.slice(2 * i, 2 * i + 2), 16));
}

let shared: SubsetSumEngine | undefined;

/** The engine every exact signed-rank calculation uses: WebAssembly where it runs, JavaScript otherwise. */
export function subsetSumEngine(): SubsetSumEngine {
  shared ??= webAssemblyEngine() ?? javascriptEngine();
  return shared;
}
