/**
 * The pane's defects that only the page shows, each written before its fix
 * and seen to fail on the old build: the first click on the name-row box
 * after a typed range, Start over, stale messages, a preview that did not
 * follow the data, the focus and the confirmation after Write, the
 * null-distribution plot's label and caption, and two columns chosen at once.
 *
 * Expected p-values are exact binomial sums in BigInt (exact arithmetic),
 * counts by hand from the invented data (src/demo/inventedData.ts).
 */
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { NUMBER_FORMATS } from "../../src/report/resultBlock";
import { formatCell } from "../../src/taskpane/numberFormat";
import {
  browserAvailable,
  closeSession,
  eventually,
  openDemo,
  paneToResult,
  snap,
  startSession,
  typeIntoCell,
  typeRange,
  type Session,
} from "./browser";
import { fairCoinUpperCount } from "../exact";

/** Two-sided sign-test p-value for k of n on the larger side: 2 P(X >= k), X ~ Binomial(n, 1/2). */
function twoSided(k: number, n: number): string {
  return formatCell(Math.min(1, (2 * Number(fairCoinUpperCount(k, n))) / Number(2n ** BigInt(n))), NUMBER_FORMATS.pvalue);
}

const status = (page: Page): Promise<string> => page.locator(".es-status").innerText();

function previewValue(page: Page, label: string): Promise<string> {
  return page
    .locator(".es-preview tbody tr")
    .filter({ has: page.getByRole("rowheader", { name: label, exact: true }) })
    .locator("td")
    .innerText();
}

describe.skipIf(!browserAvailable())("the pane's defects, on the demo page", () => {
  let session: Session;

  beforeAll(async () => {
    session = await startSession();
  });

  afterAll(() => closeSession(session));

  it("takes the first click on the name-row box after a range was typed and Enter pressed", async () => {
    const page = await openDemo(session);
    await typeRange(page, "Values", "B1:B25");
    await eventually(() => page.locator(".es-summary").first().innerText()).toContain("24 cells");
    const box = page.getByLabel("The first row is a name: leave it out of the test").first();
    await box.click();
    await eventually(() => page.locator(".es-summary").first().innerText()).toContain("25 cells");
    expect(await box.isChecked()).toBe(false);
    await page.close();
  });

  it("clears everything on Start over, and resets the value when the kind of data changes", async () => {
    const page = await openDemo(session);
    await paneToResult(page);
    await page.getByRole("button", { name: "Start over" }).click();
    expect(await page.getByLabel("Values", { exact: true }).inputValue()).toBe("");
    expect(await page.locator(".es-summary").first().innerText()).toBe("");
    await page.getByLabel("Pairs of values").check();
    await page.getByLabel("Pairs of values").focus();
    await typeRange(page, "First values (for example, before)", "B1:B25");
    await typeRange(page, "Second values (for example, after)", "C1:C25");
    await eventually(() => page.locator(".es-summary").nth(1).innerText()).toContain("24 numbers");
    await page.getByRole("button", { name: "Next: the question" }).click();
    expect(await page.getByLabel("Hypothesised shift (often 0)").inputValue()).toBe("0");
    await page.close();
  });

  it("drops a message once what it said no longer holds", async () => {
    const page = await openDemo(session);
    await page.getByRole("button", { name: "Next: the question" }).click();
    await eventually(() => status(page)).toContain("Give the range");
    await typeRange(page, "Values", "B1:B25");
    await eventually(() => page.locator(".es-summary").first().innerText()).toContain("22 numbers");
    await eventually(() => status(page)).not.toContain("Give the range");
    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByLabel("A quantile other than the median").check();
    await page.getByLabel("Quantile (between 0 and 1)").fill("2");
    await page.getByLabel("Hypothesised value of the quantile").fill("50");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await eventually(() => status(page)).toContain("The quantile must lie strictly between 0 and 1");
    await page.getByLabel("Quantile (between 0 and 1)").fill("0.9");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await eventually(() => status(page)).not.toContain("The quantile must");
    await page.close();
  });

  it("follows a change of the data when the focus comes back to the pane", async () => {
    const page = await openDemo(session);
    await paneToResult(page);
    // By hand: 16 of 22 above 50, 5 below, one tie: n = 21.
    await eventually(() => previewValue(page, "p-value")).toBe(twoSided(16, 21));
    // P-102's 49.6 becomes 55: 17 above, 4 below.
    await typeIntoCell(page, "B3", "55");
    await page.getByRole("heading", { name: "4. Result" }).click();
    await eventually(() => previewValue(page, "p-value")).toBe(twoSided(17, 21));
    await page.close();
  });

  it("puts the focus on the confirmation after Write, in view", async () => {
    const page = await openDemo(session, { width: 360, height: 640 });
    await paneToResult(page);
    await page.getByRole("button", { name: "Write the block" }).click();
    await eventually(() => status(page)).toContain("The block was written");
    const focus = await page.evaluate(() => {
      const active = document.activeElement as HTMLElement;
      const box = active.getBoundingClientRect();
      return {
        tag: active.tagName.toLowerCase(),
        text: active.textContent ?? "",
        top: box.top,
        bottom: box.bottom,
        height: window.innerHeight,
      };
    });
    expect(focus.tag).not.toBe("body");
    expect(focus.text).toContain("The block was written");
    expect(focus.top).toBeGreaterThanOrEqual(0);
    expect(focus.bottom).toBeLessThanOrEqual(focus.height);
    await page.close();
  });

  it("draws the null distribution with its label inside the plot and a caption of its own", async () => {
    const page = await openDemo(session, { width: 360, height: 900 });
    await paneToResult(page);
    await page.getByLabel("Also show the count’s distribution if H0 holds").check();
    const plot = page.locator(".es-plot").nth(1);
    await plot.waitFor();
    const geometry = await plot.evaluate((svg) => {
      const label = svg.querySelector(".es-mark") as SVGTextElement;
      const axis = svg.querySelector(".es-axis") as SVGLineElement;
      const s = svg.getBoundingClientRect();
      const l = label.getBoundingClientRect();
      const a = axis.getBoundingClientRect();
      const figure = svg.closest("figure");
      return {
        left: l.left - s.left,
        right: s.right - l.right,
        labelBottom: l.bottom,
        axisTop: a.top,
        caption: figure?.querySelector("figcaption")?.textContent ?? "",
        plots: figure?.querySelectorAll(".es-plot").length ?? 0,
      };
    });
    expect(geometry.left).toBeGreaterThanOrEqual(0);
    expect(geometry.right).toBeGreaterThanOrEqual(0);
    // The label sits clear of the axis line.
    expect(geometry.labelBottom).toBeLessThanOrEqual(geometry.axisTop);
    expect(geometry.plots).toBe(1);
    expect(geometry.caption).toContain("if H0 holds");
    await page.close();
  });

  it("says that two columns chosen as one set are pooled, and splits two columns chosen for pairs", async () => {
    const page = await openDemo(session);
    await typeRange(page, "Values", "B1:C25");
    await eventually(() => page.locator(".es-pooled").first().innerText()).toContain("2 columns");
    await page.getByRole("button", { name: "Use them as pairs" }).click();
    expect(await page.getByLabel("Pairs of values").isChecked()).toBe(true);
    expect(await page.getByLabel("Second values (for example, after)").inputValue()).toBe("'Paint line'!C1:C25");

    const other = await openDemo(session);
    await other.getByLabel("Pairs of values").check();
    await typeRange(other, "First values (for example, before)", "B1:C25");
    await eventually(() => other.getByLabel("Second values (for example, after)").inputValue()).toBe("'Paint line'!C1:C25");
    expect(await other.getByLabel("First values (for example, before)").inputValue()).toBe("'Paint line'!B1:B25");
    await snap(other, "20-pairs-from-two-columns");
    await page.close();
    await other.close();
  });
});
