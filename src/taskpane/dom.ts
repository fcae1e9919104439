/**
 * Building the pane's DOM without markup strings: every piece of workbook
 * text (sheet names, headers, cell contents) reaches the page as a text node,
 * never as HTML, so nothing in a workbook can inject markup or script.
 *
 * Method: thin wrappers over createElement / createElementNS / createTextNode.
 *
 * Cost: O(number of nodes).
 */

export type Child = Node | string | number | null | undefined | false;

export interface Props {
  readonly class?: string;
  readonly id?: string;
  /** Attributes set with setAttribute (aria-*, for, type, ...). */
  readonly attrs?: Readonly<Record<string, string>>;
  readonly hidden?: boolean;
}

function append(parent: Node, children: readonly Child[]): void {
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    parent.appendChild(typeof child === "string" || typeof child === "number" ? document.createTextNode(String(child)) : child);
  }
}

function apply(element: Element, props: Props | undefined): void {
  if (!props) return;
  if (props.class !== undefined) element.setAttribute("class", props.class);
  if (props.id !== undefined) element.id = props.id;
  for (const [name, value] of Object.entries(props.attrs ?? {})) element.setAttribute(name, value);
  if (props.hidden) element.setAttribute("hidden", "");
}

/**
 * An HTML element with text-node children.
 *
 * @example
 * el("p", { class: "hint" }, "Header: ", headerText); // <p class="hint">Header: …</p>, headerText as plain text
 */
export function el<K extends keyof HTMLElementTagNameMap>(tag: K, props?: Props, ...children: Child[]): HTMLElementTagNameMap[K] {
  const element = document.createElement(tag);
  apply(element, props);
  append(element, children);
  return element;
}

const SVG_NS = "http://www.w3.org/2000/svg";

/**
 * An SVG element; attributes are set one by one, never parsed from a string.
 *
 * @example
 * svg("circle", { attrs: { cx: "10", cy: "10", r: "3" } });
 */
export function svg(tag: string, props?: Props, ...children: Child[]): SVGElement {
  const element = document.createElementNS(SVG_NS, tag) as SVGElement;
  apply(element, props);
  append(element, children);
  return element;
}

/**
 * Replaces all children of a node (strings become text nodes).
 *
 * @example
 * replaceChildren(list, el("li", undefined, "E5: note"));
 */
export function replaceChildren(parent: Element, ...children: Child[]): void {
  while (parent.firstChild) parent.removeChild(parent.firstChild);
  append(parent, children);
}

/**
 * Shows or hides an element through the hidden attribute.
 *
 * @example
 * show(confirmBox, false);
 */
export function show(element: Element, visible: boolean): void {
  if (visible) element.removeAttribute("hidden");
  else element.setAttribute("hidden", "");
}
