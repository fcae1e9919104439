/**
 * The demo sheet's data — invented for this page, not measured anywhere:
 * coating thickness in micrometres of 24 painted panels from a paint line
 * whose target median is 50 µm, and the same panels' thickness after a
 * nozzle change (for the paired case). One panel has no first reading
 * (blank), one a text note instead of a number, and one reads exactly 50,
 * so the page shows how blanks, text and ties are counted.
 *
 * Cost: O(1).
 */

export const DEMO_SHEET = "Paint line";

/** The target the scenario asks about, in µm. */
export const TARGET_MEDIAN = 50;

const PANELS: readonly (readonly [string, number | string | null, number])[] = [
  ["P-101", 51.8, 50.2],
  ["P-102", 49.6, 49.1],
  ["P-103", 52.4, 50.9],
  ["P-104", 50, 49.3],
  ["P-105", 53.1, 51.0],
  ["P-106", 48.7, 48.9],
  ["P-107", 51.2, 49.8],
  ["P-108", null, 50.4],
  ["P-109", 52.9, 51.3],
  ["P-110", 50.6, 49.0],
  ["P-111", 47.9, 48.4],
  ["P-112", 51.5, 50.1],
  ["P-113", "re-sprayed, not measured", 49.7],
  ["P-114", 54.0, 51.8],
  ["P-115", 49.2, 48.6],
  ["P-116", 52.2, 50.5],
  ["P-117", 50.9, 50.9],
  ["P-118", 53.6, 51.4],
  ["P-119", 51.1, 49.5],
  ["P-120", 48.8, 49.2],
  ["P-121", 52.7, 50.3],
  ["P-122", 51.9, 50.8],
  ["P-123", 50.3, 49.4],
  ["P-124", 53.3, 51.6],
];

/**
 * The sheet's cells from A1: a header row, then one row per panel.
 *
 * @example
 * demoRows()[1]; // ["P-101", 51.8, 50.2]
 */
export function demoRows(): (number | string | null)[][] {
  return [["Panel", "Thickness (µm)", "After nozzle change (µm)"], ...PANELS.map(([panel, before, after]) => [panel, before, after])];
}

/**
 * A further invented panel for the "add a row" button: the next id and two plausible readings.
 *
 * @example
 * extraPanel(0); // ["P-125", 52.6, 50.7]
 */
export function extraPanel(index: number): [string, number, number] {
  // A fixed little cycle keeps the demo repeatable: no random numbers.
  const before = [52.6, 49.9, 51.4, 53.0, 50.8][index % 5];
  const after = [50.7, 49.2, 50.0, 51.1, 49.6][index % 5];
  return [`P-${125 + index}`, before, after];
}

/** The second demo sheet: panels from several paint lines, and two suppliers' paint compared. */
export const GROUPS_SHEET = "Lines and suppliers";

/** Panels from three lines (invented): panel, line, thickness; one panel's line was not written down (blank label). */
const LINE_PANELS: readonly (readonly [string, string | null, number])[] = [
  ["Q-201", "North", 50.8],
  ["Q-202", "South", 52.1],
  ["Q-203", "East", 49.4],
  ["Q-204", "North", 51.3],
  ["Q-205", "South", 53.0],
  ["Q-206", "East", 48.9],
  ["Q-207", "North", 49.9],
  ["Q-208", "South", 51.7],
  ["Q-209", "East", 50.2],
  ["Q-210", null, 52.4],
  ["Q-211", "North", 50.5],
  ["Q-212", "South", 52.8],
  ["Q-213", "East", 49.1],
  ["Q-214", "North", 51.0],
  ["Q-215", "South", 51.9],
  ["Q-216", "East", 49.7],
  ["Q-217", "North", 50.1],
  ["Q-218", "South", 52.5],
  ["Q-219", "East", 48.6],
];

/** Thickness with the old supplier's paint and with the new one's (invented; different panels, so two independent groups). */
const OLD_SUPPLIER: readonly number[] = [50.4, 49.8, 51.2, 50.9, 49.5, 50.1, 51.6, 50.7, 49.9];
const NEW_SUPPLIER: readonly number[] = [51.3, 52.0, 50.8, 51.9, 52.6, 51.1, 50.5, 52.3, 51.7, 51.4, 52.9];

/**
 * The cells of the groups sheet from A1: panel, line and thickness in A:C, then the two suppliers in E and F
 * (a header row each; the new supplier has two more panels).
 *
 * @example
 * groupRows()[1]; // ["Q-201", "North", 50.8, null, 50.4, 51.3]
 */
export function groupRows(): (number | string | null)[][] {
  const height = Math.max(LINE_PANELS.length, NEW_SUPPLIER.length) + 1;
  const rows: (number | string | null)[][] = [["Panel", "Line", "Thickness (µm)", null, "Old supplier (µm)", "New supplier (µm)"]];
  for (let r = 1; r < height; r++) {
    const panel = LINE_PANELS[r - 1];
    rows.push([panel?.[0] ?? null, panel?.[1] ?? null, panel?.[2] ?? null, null, OLD_SUPPLIER[r - 1] ?? null, NEW_SUPPLIER[r - 1] ?? null]);
  }
  return rows;
}
