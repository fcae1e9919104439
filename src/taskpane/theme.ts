/**
 * Light or dark: the pane follows the Office theme (its body background
 * colour), or the system preference where there is no Office theme.
 *
 * Method: the relative luminance of the background colour as defined in
 * WCAG 2.1 (W3C, "Web Content Accessibility Guidelines 2.1", definition of
 * relative luminance); a background darker than mid-grey means a dark theme.
 *
 * Cost: O(1).
 */

export type Theme = "light" | "dark";

/**
 * WCAG 2.1 relative luminance of a "#rrggbb" (or "#rgb") colour; null when it cannot be read.
 *
 * @example
 * relativeLuminance("#ffffff"); // 1
 * relativeLuminance("#000000"); // 0
 */
export function relativeLuminance(color: string): number | null {
  let hex = color.trim().replace(/^#/, "");
  if (/^[0-9a-f]{3}$/i.test(hex))
    hex = hex
      .split("")
      .map((d) => d + d)
      .join("");
  if (!/^[0-9a-f]{6}$/i.test(hex)) return null;
  const channel = (i: number): number => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
  };
  return 0.2126 * channel(0) + 0.7152 * channel(2) + 0.0722 * channel(4);
}

/**
 * WCAG 2.1 contrast ratio of two colours, from 1 to 21.
 *
 * @example
 * contrastRatio("#000000", "#ffffff"); // 21
 */
export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  if (la === null || lb === null) throw new TypeError(`not a colour: ${la === null ? a : b}`);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}

/**
 * The pane's theme for an Office theme's body background, or null when there is none to go by.
 *
 * @example
 * themeFor({ bodyBackgroundColor: "#262626" }); // "dark"
 */
export function themeFor(officeTheme: { readonly bodyBackgroundColor?: string } | undefined | null): Theme | null {
  const background = officeTheme?.bodyBackgroundColor;
  if (!background) return null;
  const luminance = relativeLuminance(background);
  if (luminance === null) return null;
  return luminance < 0.18 ? "dark" : "light";
}

/**
 * Sets the theme on the page's root element, where the stylesheet's palettes look for it.
 *
 * @example
 * applyTheme(document.documentElement, "dark");
 */
export function applyTheme(root: HTMLElement, theme: Theme): void {
  root.setAttribute("data-theme", theme);
}
