/**
 * Compiles src/stats/subsetSumStep.wat (the WebAssembly subset-sum step) with wabt and writes the
 * binary, as hexadecimal text, to src/stats/subsetSumStepBytes.ts: `npx tsx scripts/subsetSumWasm.ts`.
 *
 * The bytes are committed so that neither the build nor the add-in needs wabt; the unit test
 * test/stats/subsetSumStep.test.ts compiles the .wat again and fails if the committed bytes differ.
 *
 * Cost: one compilation of a 50-line module.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import wabt from "wabt";

const project = resolve(dirname(fileURLToPath(import.meta.url)), "..");
export const WAT_PATH = resolve(project, "src/stats/subsetSumStep.wat");
export const BYTES_PATH = resolve(project, "src/stats/subsetSumStepBytes.ts");

/** The .wat compiled to a WebAssembly binary (SIMD enabled, no names section). */
export async function compileSubsetSumStep(): Promise<Uint8Array> {
  const tools = await wabt();
  const parsed = tools.parseWat("subsetSumStep.wat", readFileSync(WAT_PATH, "utf8"), { simd: true });
  try {
    parsed.validate();
    return parsed.toBinary({ canonicalize_lebs: true, write_debug_names: false }).buffer;
  } finally {
    parsed.destroy();
  }
}

/** The TypeScript module holding the binary, as this script writes it (and Prettier would format it). */
export function bytesModule(binary: Uint8Array): string {
  return `// Generated from subsetSumStep.wat by scripts/subsetSumWasm.ts (\`npx tsx scripts/subsetSumWasm.ts\`); do not edit.
// test/stats/subsetSumStep.test.ts fails when these bytes and the .wat disagree.

/** The subset-sum step module (subsetSumStep.wat), a WebAssembly binary as hexadecimal text. */
export const SUBSET_SUM_STEP_HEX =
  "${Buffer.from(binary).toString("hex")}";
`;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  void compileSubsetSumStep().then((binary) => {
    writeFileSync(BYTES_PATH, bytesModule(binary));
    console.log(`wrote ${BYTES_PATH}: ${binary.length} bytes of WebAssembly`);
  });
}
