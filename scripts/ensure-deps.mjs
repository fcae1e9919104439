// Makes `npm start` and `npm test` work on a fresh clone: installs the locked
// npm dependencies when they are missing, and (for the browser tests) Debian's
// Chromium when it is missing and this user may install system packages.
import { execSync } from "node:child_process";
import { existsSync } from "node:fs";

const wantBrowser = process.argv.includes("--browser");

function run(command) {
  console.log(`> ${command}`);
  execSync(command, { stdio: "inherit" });
}

if (!existsSync("node_modules/.package-lock.json")) run("npm ci --no-audit --no-fund");

const chromium = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
if (wantBrowser && !existsSync(chromium)) {
  const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
  if (isRoot && existsSync("/usr/bin/apt-get")) {
    run("apt-get update -qq");
    run("DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium");
  } else {
    console.log(`Chromium was not found at ${chromium}; the browser tests will fail until it is installed (Debian: apt-get install -y chromium).`);
  }
}
