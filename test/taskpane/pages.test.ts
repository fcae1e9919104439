/**
 * The page templates: a content security policy on each, no inline script or
 * style (the policy allows none), and no outside host except Office.js on the
 * task pane page, which Office add-ins load from Microsoft's CDN. Directive
 * meanings per W3C, "Content Security Policy Level 3" (common practice).
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

describe.each([
  ["src/taskpane/taskpane.html", ["'self'", "https://appsforoffice.microsoft.com"]],
  ["src/demo/demo.html", ["'self'"]],
])("%s", (path, scripts) => {
  const html = page(path);
  const csp = policy(html);

  it("allows only its own files, with no inline code and no outside connections", () => {
    expect(csp.get("default-src")).toEqual(["'none'"]);
    expect(csp.get("script-src")).toEqual(scripts);
    expect(csp.get("style-src")).toEqual(["'self'"]);
    expect(csp.get("connect-src")).toEqual(["'self'"]);
    expect(csp.get("object-src")).toEqual(["'none'"]);
    expect(csp.get("base-uri")).toEqual(["'none'"]);
  });

  it("holds no inline script, inline style or style attribute", () => {
    expect(html).not.toMatch(/<script(?![^>]*\bsrc=)[^>]*>/);
    expect(html).not.toMatch(/<style\b/);
    expect(html).not.toMatch(/\sstyle="/);
    expect(html).not.toMatch(/\son[a-z]+="/);
  });

  it("names no outside host but the Office.js CDN", () => {
    const hosts = [...html.matchAll(/https?:\/\/([^/"';\s]+)/g)].map((m) => m[1]);
    expect(new Set(hosts)).toEqual(new Set(path.includes("taskpane") ? ["appsforoffice.microsoft.com"] : []));
  });
});
