/**
 * What `npm test` and `npm start` install before they run (scripts/ensure-deps.mjs):
 * nothing when everything is present, otherwise each install with its reason.
 * Debian installs packages with apt-get as root (Debian Administrator's Handbook,
 * chapter 6); the rest is the script's own contract.
 */
import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { lackingPackages, planInstall } from "../../scripts/ensure-deps.mjs";

const everything = {
  hasPackages: true,
  wantBrowser: true,
  hasChromium: true,
  chromium: "/usr/bin/chromium",
  canInstallSystemPackages: true,
};

describe("the install plan", () => {
  it("is empty when everything is present, even for root", () => {
    expect(planInstall(everything)).toEqual({ steps: [], notes: [] });
  });

  it("installs the locked packages with npm ci when node_modules is missing, saying why", () => {
    const { steps } = planInstall({ ...everything, hasPackages: false });
    expect(steps.map((s) => s.commands)).toEqual([["npm ci --no-audit --no-fund"]]);
    expect(steps[0].why).toMatch(/node_modules is missing/);
  });

  it("reinstalls when node_modules lacks a package the lock file names at its version, naming it", () => {
    const lock = JSON.stringify({
      packages: {
        "": {},
        "node_modules/a": { version: "1.0.0" },
        "node_modules/b/node_modules/c": { version: "2.0.0" },
        "node_modules/win-only": { version: "3.0.0", optional: true },
      },
    });
    const installed = JSON.stringify({ packages: { "node_modules/a": { version: "0.9.0" } } });
    expect(lackingPackages(lock, installed)).toEqual(["a@1.0.0", "c@2.0.0"]);
    expect(
      lackingPackages(
        lock,
        JSON.stringify({ packages: { "node_modules/a": { version: "1.0.0" }, "node_modules/b/node_modules/c": { version: "2.0.0" } } }),
      ),
    ).toEqual([]);
    const { steps } = planInstall({ ...everything, lacking: ["a@1.0.0", "c@2.0.0"] });
    expect(steps.map((s) => s.commands)).toEqual([["npm ci --no-audit --no-fund"]]);
    expect(steps[0].why).toMatch(/lacks a@1.0.0, c@2.0.0 at the locked version: package-lock.json changed/);
    expect(planInstall({ ...everything, lacking: [] })).toEqual({ steps: [], notes: [] });
  });

  it("installs Debian's chromium only for the browser tests, and only where apt-get may run", () => {
    expect(planInstall({ ...everything, hasChromium: false, wantBrowser: false })).toEqual({ steps: [], notes: [] });
    const root = planInstall({ ...everything, hasChromium: false });
    expect(root.steps.map((s) => s.commands.at(-1))).toEqual(["DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium"]);
    expect(root.steps[0].why).toContain("/usr/bin/chromium is missing");
    const user = planInstall({ ...everything, hasChromium: false, canInstallSystemPackages: false });
    expect(user.steps).toEqual([]);
    expect(user.notes.join(" ")).toMatch(/apt-get install -y chromium/);
  });

  it("prints nothing and runs nothing on this machine when it has what it needs", () => {
    // The suite runs from an installed tree; without --browser the script has nothing to do.
    const printed = execFileSync(process.execPath, ["scripts/ensure-deps.mjs"], { encoding: "utf8" });
    expect(printed).toBe("");
  });
});
