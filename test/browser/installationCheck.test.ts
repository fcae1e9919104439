/**
 * "Check this installation" on the demo page: the pane adds the sheet "Evensplit check", whose rows the
 * demo sheet calculates with the very bundle Excel loads (dist/functions.js), and every case shows pass; with
 * a bundle in which one function answers one part in a million off (PVALUE, perturbed as the page loads it),
 * exactly that function's cases show fail and the outcome line says so. Layout: src/taskpane/checkSheet.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { REFERENCE_CASES } from "../../src/report/installationCheck";
import { EVENSPLIT_VERSION } from "../../src/report/version";
import { checkSheetContent } from "../../src/taskpane/checkSheet";
import { browserAvailable, cellText, closeSession, eventually, snap, startSession, type Session } from "./browser";

const LAYOUT = checkSheetContent(REFERENCE_CASES, {
  evensplitVersion: EVENSPLIT_VERSION,
  excelVersion: null,
  platform: null,
  exactStep: "webassembly",
  checkedAt: new Date(),
}).layout;

/**
 * Runs before the bundle's own code: wraps CustomFunctions.associate so that the function registered as
 * `id` answers every number times (1 + 1e-6), as a broken build of it would.
 */
function perturbing(id: string): string {
  return `(function () {
  var runtime = window.CustomFunctions, associate = runtime.associate;
  var nudge = function (v) { return typeof v === "number" ? v * (1 + 1e-6) : Array.isArray(v) ? v.map(nudge) : v; };
  var wrap = function (key, fn) {
    return String(key).toUpperCase() !== ${JSON.stringify(id)} ? fn : function () { return nudge(fn.apply(this, arguments)); };
  };
  runtime.associate = function (idOrMap, fn) {
    if (typeof idOrMap === "string") return associate.call(runtime, idOrMap, wrap(idOrMap, fn));
    var map = {};
    Object.keys(idOrMap).forEach(function (key) { map[key] = wrap(key, idOrMap[key]); });
    return associate.call(runtime, map);
  };
})();
`;
}

async function openDemoWith(session: Session, broken: string | null): Promise<Page> {
  const page = await session.context.newPage();
  if (broken) {
    await page.route("**/functions.js", async (route) => {
      const response = await route.fetch();
      await route.fulfill({ response, body: perturbing(broken) + (await response.text()) });
    });
  }
  await page.goto(`${session.origin}/demo.html`);
  await page.locator("#demo-cell-1-1").waitFor();
  await page.getByRole("heading", { name: "1. Data" }).waitFor();
  return page;
}

async function pressCheck(page: Page): Promise<void> {
  await page.getByRole("button", { name: "Check this installation" }).click();
  await eventually(() => page.locator(".es-status").innerText()).toContain("The installation check was written to the new sheet");
}

function resultColumn(page: Page): Promise<string[]> {
  return Promise.all(REFERENCE_CASES.map((_, i) => cellText(page, LAYOUT.firstCaseRow + i, LAYOUT.resultColumn)));
}

describe.skipIf(!browserAvailable())("Check this installation, on the demo page", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  it("adds the sheet Evensplit check, where every case shows pass, and states what it ran on", async () => {
    const page = await openDemoWith(session, null);
    await pressCheck(page);
    expect(await page.getByRole("button", { name: "Evensplit check", exact: true }).getAttribute("aria-pressed")).toBe("true");
    await eventually(() => resultColumn(page)).toEqual(REFERENCE_CASES.map(() => "pass"));
    expect(await cellText(page, LAYOUT.outcomeRow, 1)).toBe("Every case passes");
    expect(await cellText(page, LAYOUT.passedRow, LAYOUT.resultColumn)).toBe(String(REFERENCE_CASES.length));
    expect(await cellText(page, 1, 1)).toBe(EVENSPLIT_VERSION);
    // The demo's stand-in for Office.context.diagnostics says that no Excel ran the check.
    expect(await cellText(page, 3, 1)).toContain("no Excel");
    // The page's policy lets our WebAssembly step compile ('wasm-unsafe-eval'), so the fast path runs.
    expect(await cellText(page, 4, 1)).toBe("WebAssembly");
    expect(await cellText(page, 5, 1)).toMatch(/^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d UTC$/);
    // Wide enough to show every column up to the sources.
    await page.setViewportSize({ width: 2400, height: 1300 });
    await snap(page, "installation-check");

    await pressCheck(page);
    expect(await page.getByRole("button", { name: "Evensplit check (2)" }).getAttribute("aria-pressed")).toBe("true");
    await page.close();
  });

  it("shows fail on exactly the cases of a function perturbed by one part in a million", async () => {
    const page = await openDemoWith(session, "PVALUE");
    await pressCheck(page);
    const expected = REFERENCE_CASES.map((c) => (c.fn === "PVALUE" ? "fail" : "pass"));
    expect(expected).toContain("fail");
    await eventually(() => resultColumn(page)).toEqual(expected);
    expect(await cellText(page, LAYOUT.outcomeRow, 1)).toMatch(/^Not every case passes/);
    expect(await cellText(page, LAYOUT.passedRow, LAYOUT.resultColumn)).toBe(String(expected.filter((r) => r === "pass").length));
    await page.setViewportSize({ width: 2400, height: 1300 });
    await snap(page, "installation-check-broken");
    await page.close();
  });
});
