/**
 * Shared set-up of the browser tests: Debian's Chromium driven by
 * playwright-core (never a downloaded browser), a fresh profile per run, and
 * the built dist/ served on a free loopback port by the development server's
 * own static handler (scripts/staticFiles.ts).
 *
 * Without /usr/bin/chromium the suite is skipped on a developer's machine and
 * fails in CI (CI=true), where .ci/run installs it.
 *
 * With EVENSPLIT_COVERAGE=1 (`npm run coverage:all` sets it) every page also
 * records Chromium's JS coverage of the served bundles, written to
 * BROWSER_COVERAGE when the page closes; scripts/coverageAll.ts maps it back
 * to src/ through the build's source maps. Without it nothing is recorded.
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { staticHandler } from "../../scripts/staticFiles";

export const CHROMIUM = "/usr/bin/chromium";
const PROJECT = fileURLToPath(new URL("../..", import.meta.url));
/** The built pages; EVENSPLIT_DIST points elsewhere for a private build. */
export const DIST = process.env.EVENSPLIT_DIST ?? join(PROJECT, "dist");
export const SCREENSHOTS = join(PROJECT, "test-output", "screenshots");
/** Where the pages' raw V8 coverage goes when EVENSPLIT_COVERAGE=1: one JSON file per page. */
export const BROWSER_COVERAGE = join(PROJECT, "test-output", "coverage-all", "browser-raw");
/** True when the pages record coverage (EVENSPLIT_COVERAGE=1). */
export const COVERAGE = process.env.EVENSPLIT_COVERAGE === "1";

/** True when the suite should run; throws in CI when Chromium is missing, so the run fails instead of skipping. */
export function browserAvailable(): boolean {
  if (existsSync(CHROMIUM)) return true;
  if (process.env.CI === "true") throw new Error(`${CHROMIUM} is missing: CI must install Debian's chromium package (.ci/run does).`);
  return false;
}

export interface Session {
  readonly origin: string;
  readonly context: BrowserContext;
  /** Every URL the pages asked for, to check that nothing leaves the loopback server. */
  readonly requests: string[];
  /** Console errors and page errors (content-security-policy reports among them). */
  readonly problems: string[];
  close(): Promise<void>;
}

/** Starts the static server and Chromium. */
export async function startSession(): Promise<Session> {
  if (!existsSync(join(DIST, "demo.html")) || !existsSync(join(DIST, "functions.js"))) {
    throw new Error(`${DIST} has no demo.html or functions.js: run \`npm run build\` before the browser tests (npm test does).`);
  }
  mkdirSync(SCREENSHOTS, { recursive: true });
  const server: Server = createServer(staticHandler(DIST, "demo.html"));
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const profile = mkdtempSync(join(tmpdir(), "evensplit-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
    viewport: { width: 1440, height: 1600 },
  });
  const requests: string[] = [];
  const problems: string[] = [];
  context.on("request", (request) => requests.push(request.url()));
  context.on("response", (response) => {
    if (response.status() >= 400) problems.push(`${response.status()} for ${response.url()}`);
  });
  context.on("page", (page) => watch(page, problems));
  for (const page of context.pages()) watch(page, problems);
  if (COVERAGE) recordCoverage(context, origin);
  return {
    origin,
    context,
    requests,
    problems,
    async close() {
      if (COVERAGE) await Promise.all(context.pages().map((page) => page.close()));
      await context.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

function watch(page: Page, problems: string[]): void {
  page.on("console", (message) => {
    if (message.type() === "error") problems.push(message.text());
  });
  page.on("pageerror", (error) => problems.push(error.message));
}

/** One script's coverage as recorded: the bundle file it was served from and V8's function ranges. */
export interface RawCoverage {
  readonly file: string;
  readonly url: string;
  readonly functions: unknown[];
}

/**
 * Makes every new page of the context record JS coverage from its first script on, and
 * write what it recorded for the bundles served from `origin` when it is closed. Coverage
 * can only be read while the page is open, so the page's own close is wrapped.
 */
function recordCoverage(context: BrowserContext, origin: string): void {
  mkdirSync(BROWSER_COVERAGE, { recursive: true });
  const newPage = context.newPage.bind(context);
  context.newPage = async () => {
    const page = await newPage();
    await page.coverage.startJSCoverage({ resetOnNavigation: false });
    const close = page.close.bind(page);
    page.close = async (options) => {
      const entries = await page.coverage.stopJSCoverage();
      const scripts: RawCoverage[] = entries
        .filter((entry) => entry.url.startsWith(`${origin}/`) && entry.url.endsWith(".js"))
        .map((entry) => ({ file: join(DIST, new URL(entry.url).pathname), url: entry.url, functions: entry.functions }));
      const name = `${process.pid}-${Date.now()}-${Math.random().toString(36).slice(2)}.json`;
      writeFileSync(join(BROWSER_COVERAGE, name), JSON.stringify(scripts));
      await close(options);
    };
    return page;
  };
}

/** Opens the demo page and waits until the sheet and the pane are there. */
export async function openDemo(session: Session, viewport?: { width: number; height: number }): Promise<Page> {
  const page = await session.context.newPage();
  if (viewport) await page.setViewportSize(viewport);
  await page.goto(`${session.origin}/demo.html`);
  await page.locator("#demo-cell-1-1").waitFor();
  await page.getByRole("heading", { name: "1. Data" }).waitFor();
  return page;
}

/** Saves a screenshot under test-output/screenshots/. */
export async function snap(page: Page, name: string, fullPage = false): Promise<void> {
  await page.screenshot({ path: join(SCREENSHOTS, `${name}.png`), fullPage });
}

/** Selects cells in the demo sheet through its name box, as a person typing an address would. */
export async function selectCells(page: Page, address: string): Promise<void> {
  const nameBox = page.getByLabel("Selected cells (type an address and press Enter)");
  await nameBox.fill(address);
  await nameBox.press("Enter");
}

/** Types an entry into a cell of the demo sheet: select it, type, Enter. */
export async function typeIntoCell(page: Page, address: string, text: string): Promise<void> {
  await selectCells(page, address);
  await page.keyboard.type(text);
  await page.keyboard.press("Enter");
}

/** The text a cell of the demo sheet shows (0-based row and column). */
export function cellText(page: Page, row: number, column: number): Promise<string> {
  return page.locator(`#demo-cell-${row}-${column}`).innerText();
}

/** The row (0-based) in column `column` whose cell shows `label`, searching the first 60 rows. */
export async function rowOfLabel(page: Page, column: number, label: string | RegExp): Promise<number> {
  for (let r = 0; r < 60; r++) {
    const text = await page
      .locator(`#demo-cell-${r}-${column}`)
      .innerText()
      .catch(() => "");
    if (typeof label === "string" ? text === label : label.test(text)) return r;
  }
  throw new Error(`no row labelled ${String(label)}`);
}

/** Where the platform's real Office.js lives in the package @microsoft/office-js. */
export const OFFICE_JS = join(PROJECT, "node_modules", "@microsoft", "office-js", "dist");
const OFFICE_CDN = "https://appsforoffice.microsoft.com/lib/1/hosted/";

/**
 * Answers the pages' requests for Office.js at its CDN address with the
 * package's own files, and any other https request (the frames Office.js
 * opens) with an empty page, so nothing reaches the network. Returns the
 * https addresses asked for.
 */
export async function serveOfficeJs(context: BrowserContext): Promise<string[]> {
  const asked: string[] = [];
  await context.route(/^https:\/\//, async (route) => {
    const url = route.request().url();
    asked.push(url);
    if (!url.startsWith(OFFICE_CDN)) {
      await route.fulfill({ status: 200, contentType: "text/html", body: "<!doctype html><title>stand-in frame</title>" });
      return;
    }
    const file = join(OFFICE_JS, new URL(url).pathname.slice(new URL(OFFICE_CDN).pathname.length));
    if (!file.startsWith(OFFICE_JS) || !existsSync(file)) {
      await route.fulfill({ status: 404, body: "" });
      return;
    }
    await route.fulfill({ status: 200, contentType: "text/javascript", body: readFileSync(file) });
  });
  return asked;
}

/** A content-security-policy violation as the page's securitypolicyviolation event reports it. */
export interface Violation {
  readonly directive: string;
  readonly blocked: string;
  readonly source: string;
}

/** Records every content-security-policy violation of the pages of a context in `window.cspViolations`. */
export async function recordViolations(context: BrowserContext): Promise<void> {
  await context.addInitScript(() => {
    const found: Violation[] = [];
    (window as unknown as { cspViolations: Violation[] }).cspViolations = found;
    document.addEventListener("securitypolicyviolation", (e) =>
      found.push({ directive: e.effectiveDirective, blocked: e.blockedURI, source: e.sourceFile }),
    );
  });
}
