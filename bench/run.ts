/** Runs every `bench/*.bench.ts` in turn (`npm run bench`), or only those whose names contain the arguments. */
import { readdirSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { dirname, join } from "node:path";

const here = dirname(fileURLToPath(import.meta.url));
const filters = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith(".bench.ts"))
  .filter((f) => filters.length === 0 || filters.some((x) => f.includes(x)))
  .sort();

for (const file of files) {
  console.log(`\n# ${file}`);
  const mod = (await import(pathToFileURL(join(here, file)).href)) as { run: () => Promise<void> };
  await mod.run();
}
