/**
 * The shipped taskpane.html under the platform's real Office.js: the copy in
 * node_modules/@microsoft/office-js/dist, answered at its CDN address by route
 * interception (no network), in Debian's Chromium.
 *
 * What Office.js does here was read from the package itself: office.js
 * defines a `CustomFunctions` stub with `associate` (filing each id in upper
 * case in `_association.mappings`); opened outside Office it says so, answers
 * Office.onReady with no host, and after three seconds opens a hidden logging
 * frame (o15apptofilemappingtable.js: an iframe with a style attribute).
 * Given the host information Excel on the web passes in the address
 * (`_host_Info`), it loads excel-web-16.00.js itself, which adds
 * `CustomFunctions.Error` and `ErrorCode`; without an Excel window around the
 * page its handshake then fails, which the test expects and names.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { parse } from "acorn";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { signedRankTest } from "../../src/stats/signedRank";
import { browserAvailable, DIST, recordViolations, serveOfficeJs, startSession, type Session, type Violation } from "./browser";

const run = browserAvailable();

/** The host information Excel on the web gives an add-in's page: host, platform, version, locale. */
const AS_EXCEL_ON_THE_WEB = "?_host_Info=Excel$Web$16.00$en-US$$$$0";

/** The one page error expected when excel-web-16.00.js runs with no Excel window to talk to. */
const NO_EXCEL_WINDOW = /conversationId/;

const metadataIds = (): string[] =>
  (JSON.parse(readFileSync(join(DIST, "functions.json"), "utf8")) as { functions: { id: string }[] }).functions.map((f) => f.id);

function violations(page: Page): Promise<Violation[]> {
  return page.evaluate(() => (window as unknown as { cspViolations: Violation[] }).cspViolations);
}

function registeredIds(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    Object.keys((window as unknown as { CustomFunctions: { _association: { mappings: object } } }).CustomFunctions._association.mappings),
  );
}

describe.skipIf(!run)("taskpane.html under the real Office.js", () => {
  let session: Session;
  let asked: string[];

  beforeAll(async () => {
    session = await startSession();
    asked = await serveOfficeJs(session.context);
    await recordViolations(session.context);
  });

  afterAll(async () => {
    await session?.close();
  });

  it("registers every function of functions.json, violates no content-security rule, and says it runs inside Excel", async () => {
    const page = await session.context.newPage();
    await page.goto(`${session.origin}/taskpane.html`);
    await page.getByText("runs inside Excel").waitFor();
    const ids = metadataIds();
    expect(ids.length).toBeGreaterThanOrEqual(20);
    expect((await registeredIds(page)).sort()).toEqual(ids.map((id) => id.toUpperCase()).sort());
    // Office.js's logging frame comes three seconds after start; wait for it so its style attribute and frame are judged too.
    await expect.poll(() => asked.some((url) => url.includes("telemetryservice")), { timeout: 15_000 }).toBe(true);
    await page.waitForTimeout(200);
    expect(await violations(page)).toEqual([]);
    expect(session.problems.filter((p) => !/loaded outside of Office client/.test(p))).toEqual([]);
    await page.close();
  });

  it("answers with Excel's own error objects once Excel's host script is there", async () => {
    const page = await session.context.newPage();
    const pageErrors: string[] = [];
    page.on("pageerror", (e) => pageErrors.push(e.message));
    await page.goto(`${session.origin}/taskpane.html${AS_EXCEL_ON_THE_WEB}`);
    await page.waitForFunction(
      () => typeof (window as unknown as { CustomFunctions: { Error?: unknown } }).CustomFunctions.Error === "function",
      undefined,
      {
        timeout: 15_000,
      },
    );
    expect(asked.some((url) => url.endsWith("/excel-web-16.00.js"))).toBe(true);
    expect((await registeredIds(page)).sort()).toEqual(
      metadataIds()
        .map((id) => id.toUpperCase())
        .sort(),
    );
    const answers = await page.evaluate(() => {
      const runtime = (
        window as unknown as {
          CustomFunctions: { Error: new () => object; _association: { mappings: Record<string, (...a: unknown[]) => unknown> } };
        }
      ).CustomFunctions;
      const pvalue = runtime._association.mappings.PVALUE;
      const describe = (value: unknown) => ({
        isHostError: value instanceof runtime.Error,
        json: (value as { toJSON(): unknown }).toJSON(),
      });
      return {
        badArgument: describe(pvalue([[1], [2]], "fifty")),
        allTies: describe(pvalue([[50], [50]], 50)),
        number: pvalue([[51], [52], [53]], 50, "greater"),
      };
    });
    // The shape Excel's host script gives an error value (excel-web-16.00.debug.js, CustomFunctionError.toJSON).
    expect(answers.badArgument.isHostError).toBe(true);
    expect(answers.badArgument.json).toMatchObject({
      valueType: "CustomFunctionError",
      code: "#VALUE!",
      basicValue: "#VALUE!",
      errorType: "Value",
    });
    expect((answers.badArgument.json as { message: string }).message).toMatch(/hypothesized_median/);
    expect(answers.allTies.isHostError).toBe(true);
    expect(answers.allTies.json).toMatchObject({ valueType: "CustomFunctionError", code: "#N/A", errorType: "NotAvailable" });
    // Exact arithmetic: all three of three above 50, one-sided: 1/8.
    expect(answers.number).toBe(0.125);
    expect(await violations(page)).toEqual([]);
    expect(pageErrors.filter((message) => !NO_EXCEL_WINDOW.test(message))).toEqual([]);
    await page.close();
  });

  it("compiles its WebAssembly step under the page's policy and gives the exact signed-rank p-value Node gives", async () => {
    const page = await session.context.newPage();
    // Count the WebAssembly modules the page compiles (only successful compilations are counted).
    await page.addInitScript(() => {
      const compiled: number[] = [];
      (window as unknown as { compiledModules: number[] }).compiledModules = compiled;
      const Original = WebAssembly.Module;
      const Counting = function (bytes: BufferSource) {
        const module = new Original(bytes);
        compiled.push(bytes.byteLength);
        return module;
      } as unknown as typeof WebAssembly.Module;
      Counting.prototype = Original.prototype;
      WebAssembly.Module = Counting;
    });
    await page.goto(`${session.origin}/taskpane.html`);
    await page.getByText("runs inside Excel").waitFor();
    // 600 invented differences with distinct sizes: exact only when asked (above the automatic limit).
    const differences = Array.from({ length: 600 }, (_, i) => (i % 3 === 0 ? -1 : 1) * (i + 1 + ((i * 7) % 10) / 20));
    const inPage = await page.evaluate((values) => {
      const mappings = (
        window as unknown as { CustomFunctions: { _association: { mappings: Record<string, (...a: unknown[]) => unknown> } } }
      ).CustomFunctions._association.mappings;
      return mappings.SIGNRANK(
        values.map((v) => [v]),
        0,
        "two-sided",
        "exact",
      );
    }, differences);
    const inNode = signedRankTest(differences, { method: "exact" });
    expect(inNode.available && inNode.method === "exact").toBe(true);
    expect(inPage).toBe(inNode.available ? inNode.pValue : NaN);
    expect(await page.evaluate(() => (window as unknown as { compiledModules: number[] }).compiledModules)).toEqual([232]);
    expect(await violations(page)).toEqual([]);
    await page.close();
  });

  it("shows a plain message instead of a blank pane in an Internet Explorer 11 webview", async () => {
    const page = await session.context.newPage();
    // Internet Explorer 11's user agent as webviews report it (Microsoft's page on older webviews looks for "Trident").
    await page.addInitScript(() =>
      Object.defineProperty(navigator, "userAgent", {
        get: () => "Mozilla/5.0 (Windows NT 10.0; WOW64; Trident/7.0; .NET4.0C; .NET4.0E; rv:11.0) like Gecko",
      }),
    );
    // The bundle still runs in Chromium, so whenever Office.onReady answers it must leave the message in place.
    // Make it answer late, after the document has loaded (it once raced the message and sometimes won).
    await page.addInitScript(() => {
      type Late = { onReady: (callback: (info: unknown) => void) => Promise<unknown>; lateReady?: boolean };
      let office: Late | undefined;
      Object.defineProperty(window, "Office", {
        configurable: true,
        set: (value: Late) => (office = value),
        // office.js fills in Office.onReady after creating Office, so the answer is delayed when it is first asked for.
        get: () => {
          if (office && typeof office.onReady === "function" && !office.lateReady) {
            const onReady = office.onReady.bind(office);
            office.onReady = (callback) => onReady((info) => setTimeout(() => callback(info), 300));
            office.lateReady = true;
          }
          return office;
        },
      });
    });
    await page.goto(`${session.origin}/taskpane.html`);
    await page.getByRole("heading", { name: "Evensplit needs a newer Office" }).waitFor();
    await page.waitForTimeout(1000);
    expect(await page.getByRole("heading", { name: "Evensplit needs a newer Office" }).isVisible()).toBe(true);
    expect(await page.getByText("runs inside Excel").count()).toBe(0);
    await page.close();
  });

  it("keeps that check in ES5, so the old webviews can run it", () => {
    const source = readFileSync(join(DIST, "legacy-check.js"), "utf8");
    expect(() => parse(source, { ecmaVersion: 5 })).not.toThrow();
  });
});
