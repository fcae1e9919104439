/**
 * Local check of manifest.xml, standing in for the online validator (not
 * reachable here). Sources for the rules, each named at its check:
 * Microsoft, Office Add-ins documentation, "Configure your Office Add-in to use
 * a shared runtime" (Runtime resid, lifetime long, Page and FunctionFile on the
 * same resid), "Runtime element" (resid at most 32 characters), the manifest
 * reference for IconUrl (32×32), HighResolutionIconUrl (64×64) and bt:Image
 * (sizes 16, 32, 80 required), and "Requesting permissions for API use in
 * add-ins" (the levels Restricted < ReadDocument < ReadAllDocument <
 * WriteDocument < ReadWriteDocument; the pane reads the chosen range and writes
 * the block, and WriteDocument cannot read, so ReadWriteDocument is the least
 * that does both — asking for the least is common practice).
 */
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { DIST, distText, metadataIds } from "./dist";
import { descendants, parseXml, path, type XmlElement } from "./xml";

const source = readFileSync(new URL("../../manifest.xml", import.meta.url), "utf8");
const root = parseXml(source);
const all = descendants(root);
const host = path(root, "VersionOverrides", "Hosts", "Host");
const resources = path(root, "VersionOverrides", "Resources");

function resourcesIn(group: string): Map<string, string> {
  const entries = path(resources, group).children.map((e): [string, string] => [e.attributes.id, e.attributes.DefaultValue]);
  return new Map(entries);
}

const urls = resourcesIn("bt:Urls");
const images = resourcesIn("bt:Images");
const shortStrings = resourcesIn("bt:ShortStrings");
const longStrings = resourcesIn("bt:LongStrings");

function resid(element: XmlElement): string {
  const value = element.attributes.resid;
  if (value === undefined) throw new Error(`<${element.name}> has no resid`);
  return value;
}

/** The file in dist/ an https://localhost:3000/ URL names. */
function distFileFor(url: string): string {
  const prefix = "https://localhost:3000/";
  expect(url.startsWith(prefix), url).toBe(true);
  return join(DIST, url.slice(prefix.length));
}

/** Width and height from a PNG's IHDR chunk (W3C PNG specification, 2nd ed., section 11.2.2). */
function pngSize(file: string): { width: number; height: number } {
  const bytes = readFileSync(file);
  expect(bytes.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

describe("manifest.xml", () => {
  it("is a task pane add-in for workbooks with an id of our own", () => {
    expect(root.name).toBe("OfficeApp");
    expect(root.attributes["xsi:type"]).toBe("TaskPaneApp");
    expect(path(root, "Id").text).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(path(root, "Hosts", "Host").attributes.Name).toBe("Workbook");
    expect(host.attributes["xsi:type"]).toBe("Workbook");
    expect(path(root, "DisplayName").attributes.DefaultValue).toBe("Evensplit");
  });

  it("is well-formed XML: the parser refuses the same text with its root left open", () => {
    expect(() => parseXml(source.replace("</OfficeApp>", ""))).toThrow(SyntaxError);
  });

  it("asks for ReadWriteDocument, the least that lets the pane write cells", () => {
    expect(path(root, "Permissions").text).toBe("ReadWriteDocument");
  });

  it("requires the shared runtime and the custom-functions runtime with parameter addresses (1.3)", () => {
    // 1.3: REPORT's audit row names the addresses of its ranges (metadataRequirements.test.ts derives the set).
    const sets = new Map(path(root, "Requirements", "Sets").children.map((s) => [s.attributes.Name, s.attributes.MinVersion]));
    expect(sets.get("SharedRuntime")).toBe("1.1");
    expect(sets.get("CustomFunctionsRuntime")).toBe("1.3");
  });

  it("runs the pane and the functions in one long-lived runtime on the pane's page", () => {
    const runtime = path(host, "Runtimes", "Runtime");
    expect(runtime.attributes.lifetime).toBe("long");
    const page = resid(runtime);
    expect(urls.get(page)).toBe("https://localhost:3000/taskpane.html");
    const functions = path(host, "AllFormFactors", "ExtensionPoint");
    expect(functions.attributes["xsi:type"]).toBe("CustomFunctions");
    expect(resid(path(functions, "Page", "SourceLocation"))).toBe(page);
    expect(resid(path(host, "DesktopFormFactor", "FunctionFile"))).toBe(page);
    const show = all.find((e) => e.name === "Action" && e.attributes["xsi:type"] === "ShowTaskpane");
    expect(show).toBeDefined();
    expect(resid(path(show!, "SourceLocation"))).toBe(page);
    expect(urls.get(resid(path(functions, "Script", "SourceLocation")))).toBe("https://localhost:3000/functions.js");
    expect(urls.get(resid(path(functions, "Metadata", "SourceLocation")))).toBe("https://localhost:3000/functions.json");
  });

  it("registers the functions under the EVENSPLIT namespace", () => {
    const namespace = path(host, "AllFormFactors", "ExtensionPoint", "Namespace");
    expect(shortStrings.get(resid(namespace))).toBe("EVENSPLIT");
  });

  it("defines every resource id it uses, uses every one it defines, and keeps them short", () => {
    const defined = [...urls.keys(), ...images.keys(), ...shortStrings.keys(), ...longStrings.keys()];
    expect(new Set(defined).size).toBe(defined.length);
    const used = new Set(all.filter((e) => e.attributes.resid !== undefined).map(resid));
    expect([...used].filter((id) => !defined.includes(id))).toEqual([]);
    expect(defined.filter((id) => !used.has(id))).toEqual([]);
    for (const id of defined) expect(id.length, id).toBeLessThanOrEqual(32);
  });

  it("has icons at 16, 32 and 80 for the ribbon, 32 and 64 for the add-in list, each a PNG of that size", () => {
    const sizes = all.filter((e) => e.name === "bt:Image" && e.attributes.size !== undefined).map((e) => e.attributes.size);
    expect(new Set(sizes)).toEqual(new Set(["16", "32", "80"]));
    for (const e of all.filter((x) => x.name === "bt:Image" && x.attributes.size !== undefined)) {
      const size = Number(e.attributes.size);
      expect(pngSize(distFileFor(images.get(resid(e))!))).toEqual({ width: size, height: size });
    }
    expect(pngSize(distFileFor(path(root, "IconUrl").attributes.DefaultValue))).toEqual({ width: 32, height: 32 });
    expect(pngSize(distFileFor(path(root, "HighResolutionIconUrl").attributes.DefaultValue))).toEqual({ width: 64, height: 64 });
  });

  it("names only URLs on the development server, each a file the build emits", () => {
    // Namespace declarations (xmlns, xmlns:bt, ...) name schemas, not resources.
    const values = all.flatMap((e) =>
      Object.entries(e.attributes)
        .filter(([name]) => !/^xmlns(:|$)/.test(name))
        .map(([, v]) => v),
    );
    const named = [...values, ...all.map((e) => e.text)].filter((v) => /^[a-z]+:\/\//i.test(v));
    expect(named.length).toBeGreaterThan(5);
    for (const url of named) expect(existsSync(distFileFor(url)), url).toBe(true);
  });

  it("is copied into dist/ unchanged", () => {
    expect(distText("manifest.xml")).toBe(source);
  });

  it("matches the ids in functions.json to the catalogue", () => {
    expect(new Set(metadataIds())).toEqual(
      new Set([
        "COUNTS",
        "PVALUE",
        "STATISTIC",
        "PAIRED",
        "PAIREDCOUNTS",
        "BOUNDS",
        "QUANTILEPVALUE",
        "QUANTILEBOUNDS",
        "SIGNRANK",
        "PAIREDSIGNRANK",
        "HODGESLEHMANN",
        "PAIREDHODGESLEHMANN",
        "POWER",
        "SAMPLESIZE",
        "ADJUST",
        "REPORT",
        "PAIREDSTATISTIC",
        "PAIREDBOUNDS",
        "SIGNRANKSTATISTIC",
        "PAIREDSIGNRANKSTATISTIC",
        "WATCHPVALUE",
        "WATCHBOUNDS",
        "SPRT",
        "PAIREDWATCHPVALUE",
        "PAIREDWATCHBOUNDS",
        "PAIREDSPRT",
        "TWOGROUPS",
        "SHIFT",
        "GROUPS",
        "BYGROUP",
        "LABELEDTWOGROUPS",
        "LABELEDSHIFT",
        "TWOGROUPSSTATISTIC",
        "LABELEDTWOGROUPSSTATISTIC",
        "COUNTPVALUE",
        "ORDERRANKS",
      ]),
    );
  });
});

/** The src of every script tag, quoted or not (the build minifies the pages). */
function scriptSources(html: string): string[] {
  return [...html.matchAll(/<script\b[^>]*?\bsrc=(?:"([^"]*)"|'([^']*)'|([^\s>]+))/g)].map((m) => m[1] ?? m[2] ?? m[3]);
}

describe("the pages the manifest names", () => {
  it("taskpane.html checks the webview first, then loads Office.js from its CDN, then functions.js, then the pane", () => {
    const html = distText("taskpane.html");
    const scripts = scriptSources(html);
    expect(scripts[0]).toBe("legacy-check.js");
    expect(scripts[1]).toBe("https://appsforoffice.microsoft.com/lib/1/hosted/office.js");
    const functions = scripts.findIndex((s) => /(^|\/)functions\.js$/.test(s));
    const pane = scripts.findIndex((s) => /(^|\/)taskpane\.js$/.test(s));
    expect(functions).toBeGreaterThan(1);
    expect(pane).toBeGreaterThan(functions);
    // The pane reuses the functions' modules instead of bundling (and registering) them again.
    expect(distText("taskpane.js")).not.toContain(".associate(");
  });

  it("link only files the build emits, apart from Office.js", () => {
    for (const page of ["taskpane.html", "demo.html"]) {
      const html = distText(page);
      const links = [...html.matchAll(/\b(?:src|href)=(?:"([^"]*)"|'([^']*)'|([^\s>]+))/g)].map((m) => m[1] ?? m[2] ?? m[3]);
      for (const link of links.filter((l) => !l.startsWith("https://appsforoffice.microsoft.com/") && !l.startsWith("#"))) {
        expect(/^[a-z]+:/i.test(link), `${page} links ${link} elsewhere`).toBe(false);
        expect(existsSync(join(DIST, link.split(/[?#]/)[0])), `${page} links ${link}`).toBe(true);
      }
    }
  });

  it("demo.html runs without Office.js", () => {
    const html = distText("demo.html");
    expect(html).not.toMatch(/office\.js/i);
    expect(scriptSources(html).some((s) => /(^|\/)demo\.js$/.test(s))).toBe(true);
  });
});
