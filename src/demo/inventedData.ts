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
