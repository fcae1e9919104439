/**
 * The browser tests' helpers that assert (vitest's expect): waiting for a value,
 * ending a session, and the walks through the pane's steps. The set-up that
 * needs no test runner (Chromium, the served dist/, the demo page) is in
 * session.ts, which the demo benchmark imports too, and is re-exported here.
 */
import type { Page } from "playwright-core";
import { expect } from "vitest";
import { Session } from "./session";

export * from "./session";

/** Waits for a value on the page, giving a loaded CI machine ample time (vitest's default is one second). */
export function eventually<T>(read: () => Promise<T> | T) {
  return expect.poll(read, { timeout: 15_000, interval: 50 });
}

/**
 * Ends a file's session: no request left the loopback server and no page
 * reported an error (content-security-policy reports included).
 */
export async function closeSession(session: Session | undefined): Promise<void> {
  if (!session) return;
  const outside = session.requests.filter((url) => !url.startsWith(session.origin));
  const problems = [...session.problems];
  await session.close();
  expect(outside).toEqual([]);
  expect(problems).toEqual([]);
}

/** Types an address into one of the pane's range fields and presses Enter. */
export async function typeRange(page: Page, label: string, address: string): Promise<void> {
  const field = page.getByLabel(label, { exact: true });
  await field.fill(address);
  await field.press("Enter");
}

/** Walks the pane to its Settings step for the demo's thickness column (B1:B25, a header and 22 numbers) against 50. */
export async function paneToSettings(page: Page): Promise<void> {
  await typeRange(page, "Values", "B1:B25");
  await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
  await page.getByRole("button", { name: "Next: the question" }).click();
  await page.getByLabel("Hypothesised median").fill("50");
  await page.getByRole("button", { name: "Next: settings" }).click();
}

/**
 * Walks the pane to its Settings step for pairs: the demo's thickness before (B1:B25) and after the nozzle
 * change (C1:C25), shift 0.
 */
export async function paneToPairedSettings(page: Page): Promise<void> {
  await page.getByLabel("Pairs of values").check();
  await typeRange(page, "First values (for example, before)", "B1:B25");
  await typeRange(page, "Second values (for example, after)", "C1:C25");
  await eventually(() => page.locator(".es-summary").nth(1).innerText()).toContain("24 numbers");
  await page.getByRole("button", { name: "Next: the question" }).click();
  await eventually(() => page.getByLabel("Hypothesised shift (often 0)").inputValue()).toBe("0");
  await page.getByRole("button", { name: "Next: settings" }).click();
}

/** The same, on to the Result step. */
export async function paneToResult(page: Page): Promise<void> {
  await paneToSettings(page);
  await page.getByRole("button", { name: "Next: the result" }).click();
}
