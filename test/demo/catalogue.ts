/**
 * The catalogue's functions as the demo sheet receives them, without a build:
 * the argument shapes come from custom-functions-metadata run on
 * src/functions/functions.ts (the same generator the build uses for
 * dist/functions.json), the functions from functions.ts itself.
 */
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";
import { fileURLToPath } from "node:url";
import type { CustomFunction } from "../../src/demo/formula/evaluate";
import { shapesFrom, withShapes } from "../../src/demo/standIn";
import { callFunction, FUNCTION_IDS } from "../../src/functions/functions";

const SOURCE = fileURLToPath(new URL("../../src/functions/functions.ts", import.meta.url));

export async function catalogueFunctions(): Promise<Map<string, CustomFunction>> {
  const generated = await generateCustomFunctionsMetadata(SOURCE, false);
  const registered = new Map(FUNCTION_IDS.map((id) => [id, (...args: unknown[]) => callFunction(id, args)] as const));
  return withShapes(registered, shapesFrom(JSON.parse(generated.metadataJson)));
}
