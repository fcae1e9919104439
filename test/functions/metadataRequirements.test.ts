/**
 * The manifest's CustomFunctionsRuntime requirement is what the built add-in
 * needs, no more and no less: the highest set among the runtime members the
 * functions use and the metadata features dist/functions.json declares.
 *
 * A Set in the manifest's Requirements keeps the add-in off hosts without it
 * (Microsoft, "Specify Office applications and API requirements"), so asking
 * for more than is needed shuts out hosts for nothing, and asking for less lets
 * the add-in load where a feature it relies on is missing. Each runtime member's
 * set is read from the platform's type definitions,
 * node_modules/@types/custom-functions-runtime/index.d.ts, whose comments carry
 * "[Api set: CustomFunctionsRuntime x.y]" as Microsoft's custom-functions-runtime
 * reference does. Custom enums need no set: "Create custom enums for your custom
 * functions" (Backwards compatibility) says older Excel versions treat a parameter
 * with a custom enum as a standard parameter, and "Custom functions requirement
 * sets" names no version for them.
 */
import { readFileSync } from "node:fs";
import ts from "typescript";
import { describe, expect, it } from "vitest";
import { distText } from "./dist";

const RUNTIME_TYPES = new URL("../../node_modules/@types/custom-functions-runtime/index.d.ts", import.meta.url);
const MANIFEST = new URL("../../manifest.xml", import.meta.url);
const RUNTIME_MODULE = new URL("../../src/functions/runtime.ts", import.meta.url);

/** Requirement set per declaration of namespace CustomFunctions ("Error", "Invocation.parameterAddresses", ...). */
function runtimeSets(): Map<string, string> {
  const source = ts.createSourceFile("index.d.ts", readFileSync(RUNTIME_TYPES, "utf8"), ts.ScriptTarget.ES2020, true);
  const setIn = (node: ts.Node): string | undefined =>
    /Api set: CustomFunctionsRuntime (\d+\.\d+)/.exec(
      ts
        .getJSDocCommentsAndTags(node)
        .map((d) => d.getText(source))
        .join("\n"),
    )?.[1];
  const sets = new Map<string, string>();
  const visit = (node: ts.Node, owner: string): void => {
    const named = node as ts.Node & { name?: ts.Node };
    const name = named.name && ts.isIdentifier(named.name) ? named.name.text : undefined;
    const key = name === undefined ? owner : owner === "" ? name : `${owner}.${name}`;
    const set = setIn(node);
    if (set !== undefined && name !== undefined) sets.set(key, set);
    node.forEachChild((child) => visit(child, ts.isModuleDeclaration(node) ? "" : key));
  };
  source.forEachChild((node) => {
    if (ts.isModuleDeclaration(node) && node.name.getText(source) === "CustomFunctions") visit(node, "");
  });
  return sets;
}

function version(set: string): number {
  const [major, minor] = set.split(".").map(Number);
  return major * 1000 + minor;
}

/** Which runtime member each option of functions.json makes Excel fill in (the Invocation reference names the option at each). */
const OPTION_MEMBERS: Record<string, string> = {
  requiresAddress: "Invocation.address",
  requiresParameterAddresses: "Invocation.parameterAddresses",
};

interface Metadata {
  functions: { id: string; options?: Record<string, boolean> }[];
  enums?: unknown[];
}

/** What the built add-in relies on, each with the runtime member that carries its requirement set. */
function uses(): { use: string; member: string }[] {
  const found: { use: string; member: string }[] = [];
  // src/functions/runtime.ts answers errors with the host's Error class and its codes #VALUE! and #N/A. The
  // type definitions mark every ErrorCode member 1.3, but "Custom functions requirement sets" says 1.2 added the
  // Error object and 1.3 added new ErrorCode options; these two came with the Error object, so its set counts.
  const runtimeSource = readFileSync(RUNTIME_MODULE, "utf8");
  expect(new Set([...runtimeSource.matchAll(/ErrorCode\.(\w+)/g)].map((m) => m[1]))).toEqual(new Set(["invalidValue", "notAvailable"]));
  if (/runtime\.Error\b/.test(runtimeSource)) found.push({ use: "error values with messages (runtime.ts)", member: "Error" });
  const metadata = JSON.parse(distText("functions.json")) as Metadata;
  for (const f of metadata.functions) {
    for (const [option, on] of Object.entries(f.options ?? {})) {
      if (!on) continue;
      expect(OPTION_MEMBERS[option], `${f.id} declares option ${option}: name the runtime member it makes Excel fill in`).toBeDefined();
      found.push({ use: `${f.id} option ${option}`, member: OPTION_MEMBERS[option] });
    }
  }
  return found;
}

function declaredRuntime(): string | undefined {
  return /<Set\s+Name="CustomFunctionsRuntime"\s+MinVersion="(\d+\.\d+)"\s*\/>/.exec(readFileSync(MANIFEST, "utf8"))?.[1];
}

describe("the CustomFunctionsRuntime requirement set", () => {
  it("declared in the manifest is the highest set among what the built functions use", () => {
    const sets = runtimeSets();
    const needed = uses().map(({ use, member }) => {
      const set = sets.get(member);
      expect(set, `CustomFunctions.${member} (for ${use}) has a requirement set in @types/custom-functions-runtime`).toBeDefined();
      return { use, member, set: set as string };
    });
    const highest = needed.reduce((a, b) => (version(b.set) > version(a.set) ? b : a));
    console.log(
      `CustomFunctionsRuntime ${highest.set} needed, by ${needed
        .filter((n) => n.set === highest.set)
        .map((n) => n.use)
        .join(", ")}`,
    );
    expect(declaredRuntime()).toBe(highest.set);
  });

  it("is not raised by the word arguments' custom enums, which older Excel versions ignore", () => {
    const metadata = JSON.parse(distText("functions.json")) as Metadata;
    expect(metadata.enums?.length ?? 0).toBeGreaterThan(0);
    // Only functions' options are looked up; a feature of the metadata outside them would need its set named here.
    expect(Object.keys(metadata).sort()).toEqual(["enums", "functions"]);
  });

  it("reads the platform's definitions right (Error is CustomFunctionsRuntime 1.2, Invocation.address 1.1, parameterAddresses 1.3: Microsoft's custom-functions-runtime reference)", () => {
    const sets = runtimeSets();
    expect(sets.get("Error")).toBe("1.2");
    expect(sets.get("Invocation.address")).toBe("1.1");
    expect(sets.get("Invocation.parameterAddresses")).toBe("1.3");
  });
});
