/**
 * The browser coverage of `npm run coverage:all` lands on the right lines of the right
 * TypeScript file: after one visit of the demo page, `mountGrid` of src/demo/grid.ts (which
 * the page's start-up calls, src/demo/index.ts) is counted as run, at the line where the
 * source declares it, and not every function of that file is counted (a mapping that
 * smeared the bundle over the file would count them all). Source of the expected line: the
 * file itself, read here. Runs only when the pages record coverage (EVENSPLIT_COVERAGE=1,
 * which coverage:all sets, on its development build with source maps); skipped otherwise.
 */
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mapScripts, type RecordedScript } from "../../scripts/browserCoverage.mjs";
import { browserAvailable, BROWSER_COVERAGE, COVERAGE, DIST, openDemo, startSession, type Session } from "./browser";

const PROJECT = fileURLToPath(new URL("../..", import.meta.url));
const GRID = join(PROJECT, "src", "demo", "grid.ts");
const run = browserAvailable() && COVERAGE;
let session: Session;

beforeAll(async () => {
  if (run) session = await startSession();
}, 60_000);
afterAll(async () => {
  if (run) await session.close();
});

describe.skipIf(!run)("browser coverage mapped to src/", () => {
  it("counts mountGrid of src/demo/grid.ts as run, at its declared line, after a visit of the demo page", async () => {
    expect(existsSync(join(DIST, "demo.js.map")), `${DIST} needs a development build with source maps`).toBe(true);
    const before = new Set(readdirSync(BROWSER_COVERAGE));
    const page = await openDemo(session);
    await page.close();
    const written = readdirSync(BROWSER_COVERAGE).filter((name) => !before.has(name));
    expect(written).toHaveLength(1);
    const scripts = JSON.parse(readFileSync(join(BROWSER_COVERAGE, written[0]), "utf8")) as RecordedScript[];

    const grid = (await mapScripts(scripts, PROJECT)).fileCoverageFor(GRID);
    const declared =
      readFileSync(GRID, "utf8").split("\n").indexOf("export function mountGrid(container: HTMLElement, workbook: Workbook): void {") + 1;
    expect(declared).toBeGreaterThan(0);
    const mount = Object.entries(grid.fnMap).find(([, fn]) => fn.name === "mountGrid");
    expect(mount?.[1].decl.start.line).toBe(declared);
    expect(grid.f[mount?.[0] ?? ""]).toBeGreaterThan(0);
    expect(Object.values(grid.f).some((count) => count === 0)).toBe(true);
  });
});
