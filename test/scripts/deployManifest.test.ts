/**
 * The deployment manifest: the development server's addresses moved to an
 * https folder. Excel loads add-in resources over https only (Microsoft,
 * "Office Add-ins XML manifest"); the manifest is parsed with
 * fast-xml-parser (test/functions/xml.ts) to see that every address moved and the document is still whole.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { DEVELOPMENT_ORIGIN, deploymentBase, manifestForDeployment, metadataForDeployment } from "../../scripts/deployManifest";
import { descendants, parseXml } from "../functions/xml";

const manifest = readFileSync(new URL("../../manifest.xml", import.meta.url), "utf8");

function addresses(xml: string): string[] {
  return descendants(parseXml(xml))
    .map((e) => e.attributes.DefaultValue)
    .filter((value): value is string => value !== undefined && /^https?:\/\//.test(value));
}

describe("the manifest for a deployment", () => {
  it("moves every development address to the deployment folder and keeps the rest of the file", () => {
    const before = addresses(manifest);
    expect(before.length).toBeGreaterThanOrEqual(8);
    expect(before.every((url) => url.startsWith(DEVELOPMENT_ORIGIN))).toBe(true);
    const moved = manifestForDeployment(manifest, "https://addins.example.org/evensplit/");
    const after = addresses(moved);
    expect(after).toEqual(before.map((url) => url.replace(DEVELOPMENT_ORIGIN, "https://addins.example.org/evensplit/")));
    expect(moved).not.toMatch(/localhost/i);
    expect(moved.length - manifest.length).toBe(
      before.length * ("https://addins.example.org/evensplit/".length - DEVELOPMENT_ORIGIN.length),
    );
  });

  it("takes an https folder, with or without its last slash, and refuses anything Excel could not load", () => {
    expect(deploymentBase("https://addins.example.org/evensplit")).toEqual({ base: "https://addins.example.org/evensplit/" });
    expect(deploymentBase(" https://addins.example.org/ ")).toEqual({ base: "https://addins.example.org/" });
    for (const bad of [
      "http://addins.example.org/",
      "addins.example.org/evensplit",
      "https://addins.example.org/?v=2",
      "https://user:pw@addins.example.org/",
      "",
    ]) {
      expect(deploymentBase(bad), bad).toHaveProperty("problem");
    }
  });

  it("refuses a manifest that would still name localhost", () => {
    expect(() => manifestForDeployment('<a b="https://localhost:3001/x.html"/>', "https://example.org/")).toThrow(/localhost/);
  });

  it("moves every function's help page address with the files, and keeps the rest of functions.json", () => {
    const metadata = {
      allowCustomDataForDataTypeAny: true,
      functions: [
        { id: "PVALUE", name: "PVALUE", helpUrl: `${DEVELOPMENT_ORIGIN}help/pvalue.html`, parameters: [{ name: "data" }] },
        { id: "COUNTS", name: "COUNTS", helpUrl: `${DEVELOPMENT_ORIGIN}help/counts.html`, parameters: [] },
      ],
    };
    const moved = JSON.parse(metadataForDeployment(JSON.stringify(metadata), "https://addins.example.org/evensplit/"));
    expect(moved).toEqual({
      ...metadata,
      functions: [
        { ...metadata.functions[0], helpUrl: "https://addins.example.org/evensplit/help/pvalue.html" },
        { ...metadata.functions[1], helpUrl: "https://addins.example.org/evensplit/help/counts.html" },
      ],
    });
    const elsewhere = { functions: [{ id: "X", helpUrl: "https://localhost:3001/help/x.html" }] };
    expect(() => metadataForDeployment(JSON.stringify(elsewhere), "https://example.org/")).toThrow(/cannot be moved/);
  });
});
