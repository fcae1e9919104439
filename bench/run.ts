/** Runs every `bench/*.bench.ts` in turn (`npm run bench`), or only those whose names contain the arguments. */
import { readdirSync } from "node:fs";
import { join } from "node:path";
import { pathToFileURL } from "node:url";

async function main(): Promise<void> {
  const here = __dirname;
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
}

void main();
