/**
 * manifest.xml as a tree of elements for the tests, read by fast-xml-parser
 * (a maintained parser; its XMLValidator refuses a malformed document before
 * the tree is built, so a broken manifest fails loudly instead of being
 * misread). The parser's order-preserving output is mapped to elements with
 * their attributes (as written, values unparsed), children and trimmed text;
 * comments and the XML declaration are dropped.
 *
 * Cost: O(length of the text).
 */
import { XMLParser, XMLValidator } from "fast-xml-parser";

export interface XmlElement {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  readonly children: XmlElement[];
  /** Text directly inside the element, trimmed. */
  readonly text: string;
}

/** One node of fast-xml-parser's preserveOrder output: `{ tag: children, ":@": attributes }` or `{ "#text": text }`. */
type OrderedNode = Record<string, unknown>;

const parser = new XMLParser({
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: "",
  ignoreDeclaration: true,
  parseTagValue: false,
  parseAttributeValue: false,
  trimValues: true,
});

function toElement(node: OrderedNode): XmlElement {
  const name = Object.keys(node).find((key) => key !== ":@");
  if (name === undefined) throw new SyntaxError("an element without a name");
  const content = node[name] as OrderedNode[];
  const children = content.filter((n) => !("#text" in n)).map(toElement);
  const text = content
    .filter((n) => "#text" in n)
    .map((n) => String(n["#text"]))
    .join("")
    .trim();
  return { name, attributes: (node[":@"] as Record<string, string> | undefined) ?? {}, children, text };
}

/**
 * Parses a document and returns its root element; throws a SyntaxError naming
 * the line for a malformed one.
 *
 * @example
 * parseXml('<a x="1"><b>hi</b></a>').children[0].text; // "hi"
 */
export function parseXml(source: string): XmlElement {
  const valid = XMLValidator.validate(source);
  if (valid !== true) throw new SyntaxError(`${valid.err.msg} (line ${valid.err.line}, column ${valid.err.col})`);
  const roots = (parser.parse(source) as OrderedNode[]).filter((n) => !("#text" in n));
  if (roots.length !== 1) throw new SyntaxError(`${roots.length} root elements`);
  return toElement(roots[0]);
}

/** Every element below (and including) `element`, depth first. */
export function descendants(element: XmlElement): XmlElement[] {
  return [element, ...element.children.flatMap(descendants)];
}

/** The only child with this name (throws when there is none or more than one). */
export function child(element: XmlElement, name: string): XmlElement {
  const found = element.children.filter((c) => c.name === name);
  if (found.length !== 1) throw new Error(`<${element.name}> has ${found.length} <${name}> children`);
  return found[0];
}

/** Follows a path of child names, e.g. path(root, "VersionOverrides", "Hosts", "Host"). */
export function path(element: XmlElement, ...names: string[]): XmlElement {
  return names.reduce(child, element);
}
