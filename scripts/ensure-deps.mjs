// Makes `npm start` and `npm test` work on a fresh clone: installs the locked
// npm dependencies when node_modules is missing or lacks a package the lock
// file names (after a pull that changed it) and, with --browser, Debian's
// Chromium when it is missing and this user may install system packages
// (root with apt-get). It first prints what it will install and why; when
// everything is present it prints nothing and touches nothing.
//
// Plain JavaScript on purpose: it runs before node_modules (and so tsx) exists.
// Cost: two file checks; the installs only when something is missing.
import { execSync } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";

/**
 * What to install on a machine in the given state, and why; an empty list
 * when everything is present.
 *
 * @param {{ hasPackages: boolean, lacking?: string[], wantBrowser: boolean, hasChromium: boolean, chromium: string, canInstallSystemPackages: boolean }} machine
 * @returns {{ steps: { what: string, why: string, commands: string[] }[], notes: string[] }}
 * @example
 * planInstall({ hasPackages: false, wantBrowser: false, hasChromium: true, chromium: "/usr/bin/chromium", canInstallSystemPackages: false });
 * // { steps: [{ what: "the npm packages locked in package-lock.json", why: "node_modules is missing ...", commands: ["npm ci --no-audit --no-fund"] }], notes: [] }
 */
export function planInstall(machine) {
  const steps = [];
  const notes = [];
  if (!machine.hasPackages) {
    steps.push({
      what: "the npm packages locked in package-lock.json",
      why: "node_modules is missing (a fresh clone): the build and the tests need them",
      commands: ["npm ci --no-audit --no-fund"],
    });
  } else if (machine.lacking && machine.lacking.length > 0) {
    const named = machine.lacking.slice(0, 3).join(", ") + (machine.lacking.length > 3 ? ` and ${machine.lacking.length - 3} more` : "");
    steps.push({
      what: "the npm packages locked in package-lock.json",
      why: `node_modules lacks ${named} at the locked version: package-lock.json changed since the last install`,
      commands: ["npm ci --no-audit --no-fund"],
    });
  }
  if (machine.wantBrowser && !machine.hasChromium) {
    if (machine.canInstallSystemPackages) {
      steps.push({
        what: "Debian's chromium package (apt-get, as root)",
        why: `${machine.chromium} is missing: the browser tests drive Debian's Chromium, never a downloaded browser`,
        commands: ["apt-get update -qq", "DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium"],
      });
    } else {
      notes.push(
        `Chromium was not found at ${machine.chromium}; the browser tests will fail until it is installed (Debian: apt-get install -y chromium).`,
      );
    }
  }
  return { steps, notes };
}

/**
 * The packages package-lock.json names that node_modules does not hold at
 * that version, from npm's record of what it installed
 * (node_modules/.package-lock.json). Optional packages (other platforms'
 * binaries) are not expected.
 *
 * @param {string} lockText package-lock.json
 * @param {string} installedText node_modules/.package-lock.json
 * @returns {string[]}
 * @example
 * lackingPackages('{"packages":{"node_modules/a":{"version":"1.0.0"}}}', '{"packages":{}}'); // ["a@1.0.0"]
 */
export function lackingPackages(lockText, installedText) {
  const locked = JSON.parse(lockText).packages ?? {};
  const installed = JSON.parse(installedText).packages ?? {};
  return Object.entries(locked)
    .filter(([where, entry]) => where !== "" && !entry.optional && !entry.link && installed[where]?.version !== entry.version)
    .map(([where, entry]) => `${where.replace(/^.*node_modules\//, "")}@${entry.version}`);
}

/** Prints the plan, then carries it out. */
function main() {
  const chromium = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
  const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
  const hasPackages = existsSync("node_modules/.package-lock.json");
  const { steps, notes } = planInstall({
    hasPackages,
    lacking:
      hasPackages && existsSync("package-lock.json")
        ? lackingPackages(readFileSync("package-lock.json", "utf8"), readFileSync("node_modules/.package-lock.json", "utf8"))
        : [],
    wantBrowser: process.argv.includes("--browser"),
    hasChromium: existsSync(chromium),
    chromium,
    canInstallSystemPackages: isRoot && existsSync("/usr/bin/apt-get"),
  });
  if (steps.length > 0) {
    console.log("This machine lacks what the next command needs; installing:");
    for (const step of steps) console.log(`  - ${step.what}, because ${step.why}.`);
  }
  for (const step of steps) {
    for (const command of step.commands) {
      console.log(`> ${command}`);
      execSync(command, { stdio: "inherit" });
    }
  }
  for (const note of notes) console.log(note);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) main();
