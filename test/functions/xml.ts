/**
 * A small XML reader for checking manifest.xml in tests: elements,
 * attributes, text, comments, the XML declaration and the five predefined
 * entities (W3C, 2008, "Extensible Markup Language (XML) 1.0, Fifth
 * Edition", sections 2.4–2.6, 3.1 and 4.6). No DTDs, CDATA or processing
 * instructions other than the declaration: a manifest has none, and meeting
 * one is an error rather than a silent misreading.
 *
 * Cost: O(length of the text).
 */

export interface XmlElement {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  readonly children: XmlElement[];
  /** Text directly inside the element, trimmed. */
  text: string;
}

const ENTITIES: Readonly<Record<string, string>> = { amp: "&", lt: "<", gt: ">", quot: '"', apos: "'" };

function unescape(raw: string): string {
  return raw.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|[a-z]+);/g, (whole, name: string) => {
    if (name.startsWith("#x")) return String.fromCodePoint(parseInt(name.slice(2), 16));
    if (name.startsWith("#")) return String.fromCodePoint(parseInt(name.slice(1), 10));
    const value = ENTITIES[name];
    if (value === undefined) throw new SyntaxError(`unknown entity ${whole}`);
    return value;
  });
}

const NAME = /^[A-Za-z_][\w.:-]*/;
const ATTRIBUTE = /^\s+([A-Za-z_][\w.:-]*)\s*=\s*("([^"]*)"|'([^']*)')/;

/**
 * Parses a document and returns its root element.
 *
 * @example
 * parseXml('<a x="1"><b>hi</b></a>').children[0].text; // "hi"
 */
export function parseXml(source: string): XmlElement {
  let at = 0;
  const stack: XmlElement[] = [];
  let root: XmlElement | null = null;
  const fail = (what: string): never => {
    throw new SyntaxError(`${what} at offset ${at}`);
  };
  while (at < source.length) {
    if (source.startsWith("<?xml", at)) {
      const end = source.indexOf("?>", at);
      if (end < 0 || at !== source.search(/\S/)) fail("misplaced XML declaration");
      at = end + 2;
    } else if (source.startsWith("<!--", at)) {
      const end = source.indexOf("-->", at);
      if (end < 0) fail("unclosed comment");
      at = end + 3;
    } else if (source.startsWith("<!", at) || source.startsWith("<?", at)) {
      fail("unsupported markup");
    } else if (source.startsWith("</", at)) {
      const name = NAME.exec(source.slice(at + 2))?.[0] ?? fail("bad closing tag");
      const open = stack.pop();
      if (open === undefined || open.name !== name) fail(`closing </${name}> does not match`);
      at = source.indexOf(">", at) + 1;
      if (at === 0) fail("unclosed tag");
    } else if (source[at] === "<") {
      const name = NAME.exec(source.slice(at + 1))?.[0] ?? fail("bad tag name");
      at += 1 + name.length;
      const attributes: Record<string, string> = {};
      for (;;) {
        const m = ATTRIBUTE.exec(source.slice(at));
        if (m === null) break;
        if (m[1] in attributes) fail(`repeated attribute ${m[1]}`);
        attributes[m[1]] = unescape(m[3] ?? m[4]);
        at += m[0].length;
      }
      const close = /^\s*(\/?)>/.exec(source.slice(at)) ?? fail(`bad tag <${name}>`);
      at += close[0].length;
      const element: XmlElement = { name, attributes, children: [], text: "" };
      const parent = stack[stack.length - 1];
      if (parent) parent.children.push(element);
      else if (root === null) root = element;
      else fail("second root element");
      if (close[1] !== "/") stack.push(element);
    } else {
      const end = source.indexOf("<", at);
      const raw = source.slice(at, end < 0 ? source.length : end);
      const parent = stack[stack.length - 1];
      if (parent) parent.text = (parent.text + unescape(raw)).trim();
      else if (raw.trim() !== "") fail("text outside the root element");
      at = end < 0 ? source.length : end;
    }
  }
  if (stack.length > 0) fail(`unclosed <${stack[stack.length - 1].name}>`);
  return root ?? fail("no root element");
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
