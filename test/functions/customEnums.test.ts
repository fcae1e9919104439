/**
 * The word arguments' custom enums in the built dist/functions.json, checked
 * against the platform's documented metadata schema, and the words of every
 * enum checked through the built functions.js.
 *
 * Schema, as documented: Microsoft 365 app manifest reference, "enum object"
 * (id: 3 to 64 characters, a letter first, then letters, numbers, periods and
 * underscores; type "number" or "string"; values required) and "enum values"
 * (name required, at most 256 characters; tooltip at most 256; stringValue for a
 * string enum, numberValue for a number enum); "Manually create JSON metadata for
 * custom functions in Excel" (enums: each id unique, one type per enum; a
 * parameter's customEnumId names an enum's id, not case-sensitive; its example
 * gives the parameter the enum's type). "Create custom enums for your custom
 * functions": the list is offered in AutoComplete, and Excel versions without
 * enums treat the parameter as a standard one, so the function keeps checking
 * every word itself, synonyms included.
 */
import { describe, expect, it } from "vitest";
import { distText, loadFunctionsBundle, StandInError } from "./dist";

interface EnumValue {
  name?: unknown;
  stringValue?: unknown;
  numberValue?: unknown;
  tooltip?: unknown;
}
interface Parameter {
  name: string;
  description?: string;
  type?: string;
  customEnumId?: string;
  dimensionality?: string;
  optional?: boolean;
}
interface Metadata {
  functions: { id: string; parameters: Parameter[] }[];
  enums?: { id?: unknown; type?: unknown; values?: EnumValue[] }[];
}

const metadata = JSON.parse(distText("functions.json")) as Metadata;
const enums = metadata.enums ?? [];
const bundle = loadFunctionsBundle();

/** An ordinary value for each argument that is not a word, so that a call fails only for its word. */
const SAMPLE: Record<string, unknown> = {
  hypothesized_median: 50,
  value: 52,
  quantile: 0.5,
  confidence: 0.95,
  alpha: 0.05,
  beta: 0.2,
  power: 0.8,
  shift: 0,
  n: 30,
  p_above: 0.75,
  above: 18,
  below: 7,
};
const RANGE = [[51], [53], [49], [55], [52], [47], [56], [54]];
const LABELS = [["a"], ["a"], ["a"], ["a"], ["b"], ["b"], ["b"], ["b"]];

function sampleFor(p: Parameter): unknown {
  if (p.dimensionality === "matrix") return p.name === "labels" ? LABELS : p.name === "pvalues" ? [[0.01], [0.04], [0.3]] : RANGE;
  return p.name in SAMPLE ? SAMPLE[p.name] : null;
}

/** Every cell error a result holds (a scalar or a matrix). */
function errorsIn(result: unknown): StandInError[] {
  const cells = Array.isArray(result) ? (result as unknown[][]).flat() : [result];
  return cells.filter((c): c is StandInError => c instanceof StandInError);
}

function callWith(id: string, parameters: Parameter[], at: number, word: string): unknown {
  return bundle.call(id, ...parameters.map((p, i) => (i === at ? word : sampleFor(p))));
}

describe("dist/functions.json custom enums", () => {
  it("follow the documented schema of an enum and its values", () => {
    expect(enums.length).toBeGreaterThan(0);
    const ids = enums.map((e) => String(e.id).toLowerCase());
    expect(new Set(ids).size, "enum ids are unique").toBe(ids.length);
    for (const e of enums) {
      expect(e.id).toMatch(/^[A-Za-z][A-Za-z0-9._]{2,63}$/);
      expect(e.type).toBe("string");
      expect(Array.isArray(e.values) && e.values.length > 0, String(e.id)).toBe(true);
      expect(Object.keys(e).sort()).toEqual(["id", "type", "values"]);
      for (const v of e.values!) {
        expect(Object.keys(v).sort()).toEqual(["name", "stringValue", "tooltip"]);
        expect(typeof v.name === "string" && v.name.length > 0 && v.name.length <= 256, `${String(e.id)} name`).toBe(true);
        expect(typeof v.tooltip === "string" && v.tooltip.length > 0 && v.tooltip.length <= 256, `${String(e.id)} tooltip`).toBe(true);
        expect(typeof v.stringValue, `${String(e.id)} stringValue`).toBe("string");
      }
    }
  });

  it("are each used, and every parameter with one names an existing enum and has its type", () => {
    const byId = new Map(enums.map((e) => [String(e.id).toLowerCase(), e]));
    const used = new Set<string>();
    for (const f of metadata.functions) {
      for (const p of f.parameters.filter((q) => q.customEnumId !== undefined)) {
        const e = byId.get(p.customEnumId!.toLowerCase());
        expect(e, `${f.id}(${p.name}) names enum ${p.customEnumId}`).toBeDefined();
        expect(p.type, `${f.id}(${p.name})`).toBe(e!.type);
        expect(p.dimensionality ?? "scalar").toBe("scalar");
        used.add(p.customEnumId!.toLowerCase());
      }
    }
    expect([...used].sort()).toEqual([...byId.keys()].sort());
  });

  it("list exactly the words each argument's help quotes, on every argument whose help quotes words", () => {
    const byId = new Map(enums.map((e) => [String(e.id).toLowerCase(), e]));
    for (const f of metadata.functions) {
      for (const p of f.parameters) {
        const quoted = [...(p.description ?? "").matchAll(/"([^"]+)"/g)].map((m) => m[1]);
        if (quoted.length === 0) {
          expect(p.customEnumId, `${f.id}(${p.name})`).toBeUndefined();
          continue;
        }
        const e = byId.get((p.customEnumId ?? "").toLowerCase());
        expect(e, `${f.id}(${p.name}) quotes words but has no enum`).toBeDefined();
        expect(e!.values!.map((v) => v.stringValue).sort(), `${f.id}(${p.name})`).toEqual([...quoted].sort());
        expect(e!.values!.every((v) => v.name === v.stringValue)).toBe(true);
      }
    }
  });

  it("hold only words the built functions accept, and the functions still refuse any other word", () => {
    const byId = new Map(enums.map((e) => [String(e.id).toLowerCase(), e]));
    let calls = 0;
    for (const f of metadata.functions) {
      f.parameters.forEach((p, at) => {
        if (p.customEnumId === undefined) return;
        for (const v of byId.get(p.customEnumId.toLowerCase())!.values!) {
          const refusals = errorsIn(callWith(f.id, f.parameters, at, String(v.stringValue))).filter((e) =>
            /is not accepted/.test(e.message ?? ""),
          );
          expect(refusals, `${f.id}(${p.name} = "${String(v.stringValue)}")`).toEqual([]);
          calls++;
        }
        const wrong = errorsIn(callWith(f.id, f.parameters, at, "sideways"));
        expect(wrong.length, `${f.id}(${p.name} = "sideways")`).toBeGreaterThan(0);
        expect(wrong[0].code).toBe("#VALUE!");
        expect(wrong[0].message).toMatch(new RegExp(`^For ${p.name}, "sideways" is not accepted`));
      });
    }
    expect(calls).toBeGreaterThan(40);
  });

  it("leave the synonyms accepted: a word outside the list gives the same result as its canonical word", () => {
    // Exact arithmetic: 6 of the 8 sample values lie above 50, so P(Bin(8, 1/2) >= 6) = (28 + 8 + 1)/256 = 37/256.
    const pvalue = (word: string) => bundle.call("PVALUE", RANGE, 50, word);
    expect(pvalue("greater")).toBeCloseTo(37 / 256, 14);
    for (const synonym of ["above", "right", ">", " Greater "]) expect(pvalue(synonym)).toBe(pvalue("greater"));
  });
});
