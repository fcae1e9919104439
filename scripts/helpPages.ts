/**
 * The help pages the function picker links to: one page per cell function
 * (help/<id>.html), an index (help/index.html) and their style sheet
 * (help/help.css), made at build time from the same JSDoc of
 * src/functions/functions.ts that gives the picker its help:
 *
 * - from the metadata custom-functions-metadata generates (functions.json):
 *   the description and each argument with its help text;
 * - from the JSDoc tags the metadata drops: @returns (what the cell shows),
 *   @example (a formula in the invented paint-line scenario) and @see (the
 *   published method);
 * - from src/functions/vocabulary.ts: every word an argument accepts, with
 *   its meaning (the same words and meanings functions.json gets as custom
 *   enums for the picker, scripts/wordEnums.ts).
 *
 * Each function's `helpUrl` in functions.json points at its page on the
 * development server; a @helpurl tag in the JSDoc sets it, and where there is
 * none the build adds the same address (Microsoft, "Autogenerate JSON metadata
 * for custom functions": @helpurl; "Manually create JSON metadata": helpUrl).
 * The pages carry the content security policy of the other pages without
 * scripts or inline styles, link the pane's style sheet, and follow the
 * system's dark preference with the pane's dark palette (help.css copies it
 * from taskpane.css under prefers-color-scheme, so the palette has one source).
 *
 * Cost: one parse of functions.ts and one pass over the metadata.
 */
import ts from "typescript";
import type { Vocabulary } from "../src/functions/vocabulary";
import { DEVELOPMENT_ORIGIN } from "./deployManifest";
import { vocabularyFor, withWordEnums } from "./wordEnums";

export { vocabularyFor };

/** The part of a function's metadata the pages use (Microsoft, custom functions JSON metadata reference). */
export interface FunctionMetadata {
  readonly id: string;
  readonly name: string;
  readonly description?: string;
  readonly helpUrl?: string;
  readonly parameters: readonly { readonly name: string; readonly description?: string; readonly optional?: boolean }[];
}

/** What the JSDoc holds beyond the metadata. */
export interface JsDocExtras {
  readonly returns?: string;
  readonly examples: readonly string[];
  readonly references: readonly string[];
}

/** The namespace of manifest.xml, as the formulas are typed. */
const NAMESPACE = "EVENSPLIT";

/** The address of a function's help page on the development server. */
export function helpUrlFor(id: string): string {
  return `${DEVELOPMENT_ORIGIN}help/${id.toLowerCase()}.html`;
}

/** A tag's text as written (TypeScript reads a @see's first words as a name, so the raw text is used). */
function tagText(tag: ts.JSDocTag): string {
  return tag
    .getText()
    .replace(/^@\w+\s*/, "")
    .replace(/\s*\n\s*\*\s*/g, " ")
    .replace(/\s*\*?\s*$/, "")
    .trim();
}

/**
 * The @returns, @example and @see texts of every @customfunction in a source
 * file, by function id.
 *
 * @example
 * jsDocExtras("/** Adds.\n * @customfunction ADD\n * @returns The sum.\n *\/\nexport function add() {}").get("ADD");
 * // { returns: "The sum.", examples: [], references: [] }
 */
export function jsDocExtras(source: string): Map<string, JsDocExtras> {
  const file = ts.createSourceFile("functions.ts", source, ts.ScriptTarget.Latest, true);
  const found = new Map<string, JsDocExtras>();
  for (const statement of file.statements) {
    if (!ts.isFunctionDeclaration(statement) || statement.name === undefined) continue;
    const tags = ts.getJSDocTags(statement);
    const marker = tags.find((t) => t.tagName.text === "customfunction");
    if (marker === undefined) continue;
    const id = (tagText(marker) || statement.name.text).toUpperCase();
    const texts = (name: string) => tags.filter((t) => t.tagName.text === name).map(tagText);
    found.set(id, { returns: texts("returns")[0], examples: texts("example"), references: texts("see") });
  }
  return found;
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Every accepted word of a vocabulary with its meaning, the default marked, synonyms after the word each choice is typed as. */
function wordsHtml(vocabulary: Vocabulary<string>): string {
  const items = vocabulary.choices.map((choice) => {
    const main = `<code>${escapeHtml(choice.words[0])}</code>${choice.value === vocabulary.fallback ? " (the default)" : ""}`;
    const also = choice.words.slice(1).map((w) => `<code>${escapeHtml(w)}</code>`);
    return `<li>${main}: ${escapeHtml(choice.meaning)}${also.length > 0 ? ` Also typed as ${also.join(", ")}.` : ""}</li>`;
  });
  return `<p>Accepted words (not case-sensitive):</p><ul>${items.join("")}</ul>`;
}

const CSP = "default-src 'none'; style-src 'self'; img-src 'self'; base-uri 'none'; form-action 'none'; object-src 'none'";

function page(title: string, body: string): string {
  return [
    "<!doctype html>",
    '<html lang="en">',
    "<head>",
    '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<meta http-equiv="Content-Security-Policy" content="${CSP}">`,
    '<meta name="color-scheme" content="light dark">',
    `<title>${escapeHtml(title)}</title>`,
    '<link rel="stylesheet" href="../taskpane.css">',
    '<link rel="stylesheet" href="help.css">',
    "</head>",
    '<body class="es-pane es-help">',
    "<main>",
    body,
    "</main>",
    "</body>",
    "</html>",
    "",
  ].join("\n");
}

/** The usual caution where a result may drive a clinical, safety or regulatory decision (common practice). */
const CAUTION =
  "A p-value or a bound is one input to a decision, not the decision. Where the result could drive a clinical, safety or regulatory decision, follow the protocol that governs it and have the analysis checked by someone qualified to do so.";

/**
 * The help page of one function.
 *
 * @example
 * helpPage({ id: "PVALUE", name: "PVALUE", description: "Sign-test p-value.", parameters: [] }, { examples: [], references: [] });
 * // "<!doctype html>\n<html lang=\"en\">…<h1>EVENSPLIT.PVALUE</h1>…"
 */
export function helpPage(fn: FunctionMetadata, extras: JsDocExtras): string {
  const full = `${NAMESPACE}.${fn.name}`;
  const syntax = `=${full}(${fn.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ")})`;
  const argumentsHtml = fn.parameters.map((p) => {
    const vocabulary = vocabularyFor(p);
    return [
      `<dt><code>${escapeHtml(p.name)}</code> ${p.optional ? "(optional: left out or blank means the default)" : "(required)"}</dt>`,
      `<dd><p>${escapeHtml(p.description ?? "")}</p>${vocabulary ? wordsHtml(vocabulary) : ""}</dd>`,
    ].join("");
  });
  const sections = [
    `<h1>${escapeHtml(full)}</h1>`,
    `<p>${escapeHtml(fn.description ?? "")}</p>`,
    `<h2>Syntax</h2><p><code>${escapeHtml(syntax)}</code></p>`,
    fn.parameters.length > 0 ? `<h2>Arguments</h2><dl>${argumentsHtml.join("")}</dl>` : "",
    extras.returns ? `<h2>Result</h2><p>${escapeHtml(extras.returns)}</p>` : "",
    extras.examples.length > 0
      ? `<h2>Example</h2><p class="es-help-note">Invented data: coating thickness of painted panels in µm, target median 50, in an Excel table Panels (column Thickness); the same panels before and after a nozzle change in a table Nozzle (columns Before and After).</p>${extras.examples.map((e) => `<p>${escapeHtml(e)}</p>`).join("")}`
      : "",
    extras.references.length > 0 ? `<h2>Method</h2><ul>${extras.references.map((r) => `<li>${escapeHtml(r)}</li>`).join("")}</ul>` : "",
    `<h2>Caution</h2><p>${escapeHtml(CAUTION)}</p>`,
    '<p><a href="index.html">All Evensplit functions</a></p>',
  ];
  return page(`${full}: Evensplit help`, sections.filter((s) => s !== "").join("\n"));
}

/** The index of all help pages, in the metadata's order. */
export function helpIndex(functions: readonly FunctionMetadata[]): string {
  const items = functions.map(
    (fn) =>
      `<li><a href="${fn.id.toLowerCase()}.html"><code>${NAMESPACE}.${escapeHtml(fn.name)}</code></a>: ${escapeHtml(fn.description ?? "")}</li>`,
  );
  return page("Evensplit functions: help", `<h1>Evensplit functions</h1>\n<ul class="es-help-index">${items.join("")}</ul>`);
}

/**
 * The help pages' style sheet: their layout, and the pane's dark palette
 * (the `:root[data-theme="dark"]` block of taskpane.css) applied when the
 * system prefers dark, since a help page runs no script to set the theme.
 */
export function helpStyleSheet(paneCss: string): string {
  const dark = /:root\[data-theme="dark"\]\s*\{([^}]*)\}/.exec(paneCss);
  if (dark === null) throw new Error('taskpane.css has no :root[data-theme="dark"] palette for the help pages to follow.');
  return [
    "/* Evensplit help pages (written by the build, scripts/helpPages.ts): layout, and the pane's dark palette under the system's preference. */",
    `@media (prefers-color-scheme: dark) {\n  :root {${dark[1].replace(/\n/g, "\n  ")}}\n}`,
    "html { background: var(--es-bg); }",
    ".es-help { max-width: 46rem; margin: 0 auto; }",
    ".es-help h1 { font-size: 1.4rem; }",
    ".es-help h2 { font-size: 1.1rem; margin-top: 1.4rem; }",
    ".es-help dt { font-weight: 600; margin-top: 0.8rem; }",
    ".es-help dd { margin-left: 1rem; }",
    '.es-help code { font-family: Consolas, "Courier New", monospace; background: var(--es-surface); padding: 0 0.2em; }',
    ".es-help a { color: var(--es-accent); }",
    ".es-help-note { color: var(--es-muted); }",
    "",
  ].join("\n");
}

/**
 * What the build emits for help: functions.json with every function's
 * helpUrl (kept where a @helpurl tag set it, added where none did) and the
 * word arguments' custom enums (scripts/wordEnums.ts), and the
 * pages, index and style sheet by their path under dist/.
 *
 * @example
 * const { metadataJson, files } = helpFiles(metadataJson, readFileSync("src/functions/functions.ts", "utf8"), css);
 * files.get("help/pvalue.html"); // the PVALUE page
 */
export function helpFiles(
  metadataJson: string,
  functionsSource: string,
  paneCss: string,
): { metadataJson: string; files: Map<string, string> } {
  // custom-functions-metadata 2.2.3 always writes allowCustomDataForDataTypeAny: true, a property of
  // CustomFunctionsRuntime 1.4 (Microsoft, "Custom functions requirement sets") that lets data types reach
  // `any` parameters as objects. Evensplit takes plain cell values and asks for an older set, so it is left out.
  const metadata = JSON.parse(metadataJson) as { functions: FunctionMetadata[]; allowCustomDataForDataTypeAny?: boolean };
  delete metadata.allowCustomDataForDataTypeAny;
  const extras = jsDocExtras(functionsSource);
  const files = new Map<string, string>();
  const { functions, enums } = withWordEnums(metadata.functions.map((fn) => ({ ...fn, helpUrl: fn.helpUrl ?? helpUrlFor(fn.id) })));
  for (const fn of functions) {
    files.set(`help/${fn.id.toLowerCase()}.html`, helpPage(fn, extras.get(fn.id) ?? { examples: [], references: [] }));
  }
  files.set("help/index.html", helpIndex(functions));
  files.set("help/help.css", helpStyleSheet(paneCss));
  return { metadataJson: JSON.stringify({ ...metadata, functions, enums }, null, 4), files };
}
