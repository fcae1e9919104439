/**
 * The help pages (scripts/helpPages.ts), made from the real functions.ts and the
 * metadata custom-functions-metadata generates from it, as the build does, then
 * served by the development server's own handler (scripts/staticFiles.ts).
 * helpUrl and its place in the metadata: Microsoft, "Manually create JSON metadata
 * for custom functions" (helpUrl, a URL the function picker links to). The pages'
 * policy matches the other pages: no script, no inline style (test/taskpane/pages.test.ts).
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";
import {
  helpFiles,
  helpPage,
  helpStyleSheet,
  helpUrlFor,
  jsDocExtras,
  vocabularyFor,
  type FunctionMetadata,
} from "../../scripts/helpPages";
import { staticHandler } from "../../scripts/staticFiles";
import { ALTERNATIVE, SIGNED_RANK_METHOD, SIGN_METHOD, TIES } from "../../src/functions/vocabulary";

const functionsFile = new URL("../../src/functions/functions.ts", import.meta.url);
const paneCss = readFileSync(new URL("../../src/taskpane/taskpane.css", import.meta.url), "utf8");
const folder = mkdtempSync(join(tmpdir(), "evensplit-help-"));
let functions: FunctionMetadata[] = [];
let server: Server;
let origin = "";

beforeAll(async () => {
  const generated = await generateCustomFunctionsMetadata([functionsFile.pathname], true);
  expect(generated.errors).toEqual([]);
  const help = helpFiles(generated.metadataJson, readFileSync(functionsFile, "utf8"), paneCss);
  functions = (JSON.parse(help.metadataJson) as { functions: FunctionMetadata[] }).functions;
  for (const [name, text] of help.files) {
    mkdirSync(dirname(join(folder, name)), { recursive: true });
    writeFileSync(join(folder, name), text);
  }
  writeFileSync(join(folder, "taskpane.css"), paneCss);
  server = createServer(staticHandler(folder, "help/index.html"));
  await new Promise<void>((done) => server.listen(0, "127.0.0.1", done));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise((done) => server.close(done));
  rmSync(folder, { recursive: true, force: true });
});

/** GET over the loopback server a development URL names. */
async function served(url: string): Promise<{ status: number; type: string | null; body: string }> {
  const response = await fetch(`${origin}/${url.slice("https://localhost:3000/".length)}`);
  return { status: response.status, type: response.headers.get("content-type"), body: await response.text() };
}

describe("the help pages", () => {
  it("give every function a helpUrl on the development server, one page each", () => {
    expect(functions.length).toBeGreaterThanOrEqual(20);
    for (const fn of functions) expect(fn.helpUrl, fn.id).toBe(`https://localhost:3000/help/${fn.id.toLowerCase()}.html`);
    expect(new Set(functions.map((f) => f.helpUrl)).size).toBe(functions.length);
  });

  it("are served by the development server for every helpUrl, naming the function and each argument", async () => {
    for (const fn of functions) {
      const page = await served(fn.helpUrl!);
      expect(page.status, fn.id).toBe(200);
      expect(page.type).toBe("text/html; charset=utf-8");
      expect(page.body).toContain(`<h1>EVENSPLIT.${fn.name}</h1>`);
      for (const p of fn.parameters) expect(page.body, `${fn.id} ${p.name}`).toContain(`<code>${p.name}</code>`);
    }
    expect((await served(helpUrlFor("NOSUCH"))).status).toBe(404);
  });

  it("carry the content security policy without any script or inline style, and link only served style sheets", async () => {
    for (const fn of functions) {
      const { body } = await served(fn.helpUrl!);
      expect(body).toContain(`http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'self';`);
      expect(body).not.toMatch(/<script\b|<style\b|\sstyle=|\son[a-z]+=/i);
      for (const [, href] of body.matchAll(/href="([^"]+)"/g)) {
        const target = new URL(href, `https://localhost:3000/help/${fn.id.toLowerCase()}.html`).href;
        expect((await served(target)).status, `${fn.id} links ${href}`).toBe(200);
      }
    }
  });

  it("list every word an argument accepts, the default marked", async () => {
    const { body } = await served(helpUrlFor("PVALUE"));
    for (const vocabulary of [ALTERNATIVE, TIES, SIGN_METHOD]) {
      for (const choice of vocabulary.choices)
        for (const word of choice.words)
          expect(body, word).toContain(`<code>${word.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;")}</code>`);
    }
    expect(body).toContain("<code>two-sided</code> (the default)");
    // Each word's meaning, the same text the function picker shows as the word's tooltip.
    for (const vocabulary of [ALTERNATIVE, TIES, SIGN_METHOD])
      for (const choice of vocabulary.choices) expect(body, choice.words[0]).toContain(choice.meaning.replace(/'/g, "&#39;"));
  });

  it("find a vocabulary in vocabulary.ts for every argument whose help quotes words", () => {
    for (const fn of functions) {
      for (const p of fn.parameters.filter((q) => /"[^"]+"/.test(q.description ?? ""))) {
        expect(vocabularyFor(p), `${fn.id} ${p.name}: ${p.description}`).toBeDefined();
      }
    }
    expect(vocabularyFor({ name: "method", description: '"auto" (default), "exact" or "normal".' })).toBe(SIGNED_RANK_METHOD);
    expect(vocabularyFor({ name: "data", description: "Range with the measurements." })).toBeUndefined();
  });

  it("follow the system's dark preference with the pane's own dark palette", () => {
    const css = helpStyleSheet(paneCss);
    const dark = /:root\[data-theme="dark"\]\s*\{([^}]*)\}/.exec(paneCss)![1];
    const declarations = dark
      .split(";")
      .map((d) => d.trim())
      .filter((d) => d !== "");
    expect(declarations.length).toBeGreaterThan(5);
    const media = /@media \(prefers-color-scheme: dark\) \{\s*:root \{([^}]*)\}/.exec(css);
    expect(media).not.toBeNull();
    for (const d of declarations) expect(media![1]).toContain(d);
    expect(() => helpStyleSheet(":root { --es-bg: #fff; }")).toThrow(/dark/);
  });

  it("have, for every function, a @helpurl, an @example of it and a @see in its JSDoc (DEVELOPERS.md, adding a function)", () => {
    const source = readFileSync(functionsFile, "utf8");
    const extras = jsDocExtras(source);
    for (const fn of functions) {
      const found = extras.get(fn.id);
      expect(found, fn.id).toBeDefined();
      expect(
        found!.examples.some((e) => e.includes(`=EVENSPLIT.${fn.name}(`)),
        `${fn.id}: add an @example using =EVENSPLIT.${fn.name}(...)`,
      ).toBe(true);
      expect(found!.references.length, `${fn.id}: add a @see with the method's reference`).toBeGreaterThan(0);
      expect(source, `${fn.id}: add @helpurl ${helpUrlFor(fn.id)}`).toContain(`@helpurl ${helpUrlFor(fn.id)}`);
    }
  });

  it("take the result, examples and references from the JSDoc tags the metadata drops", () => {
    const source = [
      "/**",
      " * Adds.",
      " * @customfunction ADDUP",
      " * @returns The sum,",
      " *   on two lines.",
      " * @example =EVENSPLIT.ADDUP(Panels[Thickness]) adds the invented thicknesses.",
      " * @see W. J. Dixon and A. M. Mood (1946), The statistical sign test.",
      " */",
      "export function addup(x: number): number {",
      "  return x;",
      "}",
    ].join("\n");
    expect(jsDocExtras(source).get("ADDUP")).toEqual({
      returns: "The sum, on two lines.",
      examples: ["=EVENSPLIT.ADDUP(Panels[Thickness]) adds the invented thicknesses."],
      references: ["W. J. Dixon and A. M. Mood (1946), The statistical sign test."],
    });
    const page = helpPage({ id: "ADDUP", name: "ADDUP", description: "Adds.", parameters: [] }, jsDocExtras(source).get("ADDUP")!);
    expect(page).toContain("<h2>Result</h2><p>The sum, on two lines.</p>");
    expect(page).toMatch(/<h2>Example<\/h2><p class="es-help-note">Invented data: coating thickness of painted panels/);
    expect(page).toContain("<p>=EVENSPLIT.ADDUP(Panels[Thickness]) adds the invented thicknesses.</p>");
    expect(page).toContain("<h2>Method</h2><ul><li>W. J. Dixon and A. M. Mood (1946), The statistical sign test.</li></ul>");
    expect(helpPage({ id: "X", name: "X", description: "<b>", parameters: [] }, { examples: [], references: [] })).toContain(
      "<p>&lt;b&gt;</p>",
    );
  });
});
