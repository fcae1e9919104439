/**
 * `npm run build:deploy -- https://addins.example.org/evensplit/`: the
 * production build (webpack, production mode) into dist/, with dist/manifest.xml
 * and the help links of dist/functions.json pointing at the given https folder
 * instead of the development server, so
 * the folder's contents can be uploaded as they are and the manifest handed
 * to Excel (or to an administrator's central deployment).
 */
import { readFileSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { deploymentBase, manifestForDeployment, metadataForDeployment } from "./deployManifest";

const project = resolve(dirname(fileURLToPath(import.meta.url)), "..");
const require = createRequire(import.meta.url);

function build(): Promise<string> {
  const webpack = require("webpack") as typeof import("webpack");
  const config = require(join(project, "webpack.config.js")) as (env: unknown, argv: { mode: string }) => import("webpack").Configuration;
  const options = config({}, { mode: "production" });
  return new Promise((done, fail) => {
    webpack(options, (error, stats) => {
      if (error) return fail(error);
      if (stats?.hasErrors()) return fail(new Error(stats.toString({ all: false, errors: true })));
      done(options.output?.path ?? join(project, "dist"));
    });
  });
}

async function main(): Promise<void> {
  const given = process.argv[2];
  if (!given)
    throw new Error("Give the https folder the files will be served from: npm run build:deploy -- https://addins.example.org/evensplit/");
  const checked = deploymentBase(given);
  if ("problem" in checked) throw new Error(checked.problem);
  const out = await build();
  const manifest = join(out, "manifest.xml");
  writeFileSync(manifest, manifestForDeployment(readFileSync(manifest, "utf8"), checked.base));
  // The function picker's help links (helpUrl) move with the pages they name.
  const metadata = join(out, "functions.json");
  writeFileSync(metadata, metadataForDeployment(readFileSync(metadata, "utf8"), checked.base));
  console.log(`Built ${out} for ${checked.base}: upload its contents there and give Excel ${manifest}.`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
