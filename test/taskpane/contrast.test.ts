/**
 * Colour contrast of the pane's and the demo page's palettes, light and
 * dark, by the WCAG 2.1 definitions (W3C, "Web Content Accessibility
 * Guidelines 2.1": relative luminance and contrast ratio; success criteria
 * 1.4.3, 4.5:1 for text, and 1.4.11, 3:1 for borders, focus rings and plot
 * marks). The colours are read from the stylesheets themselves.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { CHART_COLOURS } from "../../src/taskpane/chartPlan";
import { contrastRatio, relativeLuminance, themeFor } from "../../src/taskpane/theme";

function palette(css: string, selector: string): Record<string, string> {
  const start = css.indexOf(`${selector} {`);
  if (start < 0) throw new Error(`no ${selector} block`);
  const block = css.slice(start, css.indexOf("}", start));
  const colours: Record<string, string> = {};
  for (const m of block.matchAll(/(--[\w-]+):\s*(#[0-9a-fA-F]{3,6})\s*;/g)) colours[m[1]] = m[2];
  return colours;
}

const pane = readFileSync(new URL("../../src/taskpane/taskpane.css", import.meta.url), "utf8");
const demo = readFileSync(new URL("../../src/demo/demo.css", import.meta.url), "utf8");

const TEXT_PAIRS: [string, string][] = [
  ["--es-text", "--es-bg"],
  ["--es-text", "--es-surface"],
  ["--es-muted", "--es-bg"],
  ["--es-muted", "--es-surface"],
  ["--es-problem", "--es-bg"],
  ["--es-caution", "--es-bg"],
  ["--es-center", "--es-bg"],
  ["--es-on-accent", "--es-accent"],
  ["--es-text", "--demo-select"],
  ["--es-text", "--demo-table-band"],
  ["--es-muted", "--demo-heading"],
  ["--es-problem", "--demo-select"],
];

const GRAPHIC_PAIRS: [string, string][] = [
  ["--es-border", "--es-bg"],
  ["--es-focus", "--es-bg"],
  ["--es-focus", "--es-surface"],
  ["--es-accent", "--es-bg"],
  ["--es-dot", "--es-bg"],
];

describe("WCAG 2.1 arithmetic", () => {
  it("gives the definition's end points", () => {
    expect(relativeLuminance("#fff")).toBe(1);
    expect(relativeLuminance("#000000")).toBe(0);
    expect(contrastRatio("#000", "#fff")).toBe(21);
    // #767676 on white is the well-known lightest grey passing 4.5:1 (common practice).
    expect(contrastRatio("#767676", "#ffffff")).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio("#777777", "#ffffff")).toBeLessThan(4.5);
  });

  it("reads the Office theme's background as light or dark", () => {
    expect(themeFor({ bodyBackgroundColor: "#ffffff" })).toBe("light");
    expect(themeFor({ bodyBackgroundColor: "#262626" })).toBe("dark");
    expect(themeFor({})).toBeNull();
  });
});

for (const theme of ["light", "dark"] as const) {
  describe(`the ${theme} palette`, () => {
    const selector = theme === "light" ? ":root" : ':root[data-theme="dark"]';
    const colours = { ...palette(pane, selector), ...palette(demo, selector) };

    it.each(TEXT_PAIRS)("text %s on %s reaches 4.5:1", (fg, bg) => {
      expect(contrastRatio(colours[fg], colours[bg])).toBeGreaterThanOrEqual(4.5);
    });

    it.each(GRAPHIC_PAIRS)("graphic %s on %s reaches 3:1", (fg, bg) => {
      expect(contrastRatio(colours[fg], colours[bg])).toBeGreaterThanOrEqual(3);
    });
  });
}

describe("the chart's colours, on the white chart area Excel gives a new chart (and the demo's drawing keeps in both themes)", () => {
  it.each(Object.entries(CHART_COLOURS))("%s (%s) reaches 3:1 as a plot mark, and differs from the others", (_, colour) => {
    expect(contrastRatio(colour, "#ffffff")).toBeGreaterThanOrEqual(3);
    expect(Object.values(CHART_COLOURS).filter((c) => c === colour)).toHaveLength(1);
  });

  it("draws the drawing's labels at 4.5:1 and its axis at 3:1", () => {
    const rule = (selector: string, property: string): string =>
      new RegExp(`${selector.replace(/[.]/g, "\\.")}[^{]*\\{[^}]*${property}:\\s*(#[0-9a-fA-F]{6})`).exec(demo)?.[1] ?? "";
    expect(contrastRatio(rule(".demo-chart-tick", "fill"), rule(".demo-chart-area", "fill"))).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(rule(".demo-chart-axis", "stroke"), rule(".demo-chart-area", "fill"))).toBeGreaterThanOrEqual(3);
  });
});
