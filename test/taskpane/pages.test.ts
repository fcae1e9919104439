/**
 * The page templates: a content security policy on each, no inline script or
 * style (the policy allows none), and no outside host except Office.js on the
 * task pane page, which Office add-ins load from Microsoft's CDN, and the two
 * frames Office.js itself opens there (measured with the real office.js in
 * test/browser/officeJs.test.ts). Directive meanings per W3C, "Content
 * Security Policy Level 3" (common practice).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";

function page(path: string): string {
  return readFileSync(new URL(`../../${path}`, import.meta.url), "utf8");
}

function policy(html: string): Map<string, string[]> {
  const meta = /<meta\s+http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html);
  if (!meta) throw new Error("no content security policy");
  return new Map(
    meta[1]
      .split(";")
      .map((d) => d.trim().split(/\s+/))
      .filter((d) => d[0] !== "")
      .map(([name, ...values]) => [name, values]),
  );
}

const OFFICE_CDN = "https://appsforoffice.microsoft.com";
/** Compiling our own WebAssembly (src/stats/subsetSumStep.ts), not eval of JavaScript (CSP Level 3, "wasm-unsafe-eval"). */
const OWN_WEBASSEMBLY = "'wasm-unsafe-eval'";
/** The logging frame office.js opens (o15apptofilemappingtable.js in @microsoft/office-js). */
const OFFICE_LOGGING = "https://telemetryservice.firstpartyapps.oaspapps.com";

describe.each([
  [
    "src/taskpane/taskpane.html",
    { scripts: ["'self'", OWN_WEBASSEMBLY, OFFICE_CDN], frames: [OFFICE_CDN, OFFICE_LOGGING], styleAttributes: ["'unsafe-inline'"] },
  ],
  ["src/demo/demo.html", { scripts: ["'self'", OWN_WEBASSEMBLY], frames: undefined, styleAttributes: undefined }],
])("%s", (path, allowed) => {
  const html = page(path);
  const csp = policy(html);

  it("allows only its own files, with no inline code and no outside connections", () => {
    expect(csp.get("default-src")).toEqual(["'none'"]);
    expect(csp.get("script-src")).toEqual(allowed.scripts);
    expect(csp.get("script-src")).not.toContain("'unsafe-eval'");
    expect(csp.get("style-src")).toEqual(["'self'"]);
    expect(csp.get("connect-src")).toEqual(["'self'"]);
    expect(csp.get("object-src")).toEqual(["'none'"]);
    expect(csp.get("base-uri")).toEqual(["'none'"]);
  });

  it("allows Office.js exactly its frames and style attributes, and nothing of the kind elsewhere", () => {
    expect(csp.get("frame-src")).toEqual(allowed.frames);
    expect(csp.get("style-src-attr")).toEqual(allowed.styleAttributes);
    expect(csp.get("style-src-elem") ?? ["'self'"]).toEqual(["'self'"]);
  });

  it("holds no inline script, inline style or style attribute", () => {
    expect(html).not.toMatch(/<script(?![^>]*\bsrc=)[^>]*>/);
    expect(html).not.toMatch(/<style\b/);
    expect(html).not.toMatch(/\sstyle="/);
    expect(html).not.toMatch(/\son[a-z]+="/);
  });

  it("names no outside host but the Office.js CDN", () => {
    const hosts = [...html.matchAll(/https?:\/\/([^/"';\s]+)/g)].map((m) => m[1]);
    const expected = [...allowed.scripts, ...(allowed.frames ?? [])].filter((s) => s.startsWith("https://")).map((s) => new URL(s).host);
    expect(new Set(hosts)).toEqual(new Set(expected));
  });
});
