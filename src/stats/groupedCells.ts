/**
 * Values and group labels out of two spreadsheet ranges of the same shape, grouped.
 *
 * Method: one pass over the two ranges cell by cell, as cells.ts reads one range. A position
 * whose label is blank is skipped and counted; one whose value is not a finite number is
 * skipped and counted; a position where both are blank is no row at all (an open-ended range
 * such as B2:C1048576). Groups are numbered in order of first appearance. Text labels are
 * matched ignoring case, as the sheet's own comparisons do ("a" = "A": Microsoft,
 * "Calculation operators and precedence in Excel", from memory), and keep the spelling of
 * their first appearance; numbers and logical values are labels as they are, so the number
 * 1 and the text "1" are two groups. The values are then moved into one array, group after
 * group (a counting sort on the group number), so each group is a contiguous view.
 * Each text label is looked up first in a small direct-mapped cache indexed by its length and
 * last two characters (a hit is confirmed by comparing the text itself), then by the cell's own
 * value in a hash map; only a text not seen before is folded to lower case, so a million rows
 * cost a million cheap probes, not a million map lookups or new strings.
 *
 * Cost: O(cells) time, O(cells) memory (a group number per row, the values twice).
 */

/** One group: its label as first seen, and its values in reading order. */
export interface CellGroup {
  label: string | number | boolean;
  values: Float64Array;
}

export interface GroupedCells {
  /** Groups in order of first appearance. */
  groups: CellGroup[];
  /** Positions with a blank label but something in the value cell. */
  blankLabels: number;
  /** Positions with a label whose value cell is not a finite number (blank, text, logical, error). */
  valuesSkipped: number;
  /** Positions with a label that is an error value (left out, with their values). */
  labelErrors: number;
}

/** Slots of the direct-mapped cache of recent text labels (a power of two). */
const CACHE_SLOTS = 1024;

/** The cache slot of a non-empty text: from its length and last two characters. */
function slotOf(text: string): number {
  const n = text.length;
  return (n * 31 + text.charCodeAt(n - 1) * 7 + (n > 1 ? text.charCodeAt(n - 2) : 0) * 131) & (CACHE_SLOTS - 1);
}

function isBlank(v: unknown): boolean {
  return v === null || v === undefined || v === "";
}

/**
 * Groups the finite numbers of `values` by the labels at the same positions of `labels`. Throws a
 * RangeError when the shapes differ (the cell layer checks this first and says so to the user).
 *
 * @example
 * const g = groupCells([[51.2], [49.8], ["x"], [50.4], [52]], [["Line A"], ["line b"], ["Line A"], ["LINE B"], [null]]);
 * // g.groups: [{ label: "Line A", values: [51.2] }, { label: "line b", values: [49.8, 50.4] }]
 * // g.valuesSkipped: 1 ("x"), g.blankLabels: 1
 */
export function groupCells(values: readonly (readonly unknown[])[], labels: readonly (readonly unknown[])[]): GroupedCells {
  const rows = values.length;
  if (labels.length !== rows) throw new RangeError(`groupCells: ${rows} rows against ${labels.length}`);
  let cells = 0;
  for (let r = 0; r < rows; r++) cells += values[r].length;
  const groupOf = new Int32Array(cells);
  const kept = new Float64Array(cells);
  let count = 0;
  const byCell = new Map<unknown, number>();
  const byFoldedText = new Map<string, number>();
  const firstLabels: (string | number | boolean)[] = [];
  const sizes: number[] = [];
  let blankLabels = 0;
  let valuesSkipped = 0;
  let labelErrors = 0;
  const cachedText: (string | undefined)[] = new Array<string | undefined>(CACHE_SLOTS).fill(undefined);
  const cachedGroup = new Int32Array(CACHE_SLOTS);
  for (let r = 0; r < rows; r++) {
    const valueRow = values[r];
    const labelRow = labels[r];
    const width = valueRow.length;
    if (labelRow.length !== width) throw new RangeError(`groupCells: row ${r} has ${width} cells against ${labelRow.length}`);
    for (let c = 0; c < width; c++) {
      const label = labelRow[c];
      const v = valueRow[c];
      if (isBlank(label)) {
        if (!isBlank(v)) blankLabels++;
        continue;
      }
      let group: number;
      const slot = typeof label === "string" ? slotOf(label) : -1;
      if (slot >= 0 && cachedText[slot] === label) group = cachedGroup[slot];
      else {
        const known = byCell.get(label);
        if (known !== undefined) group = known;
        else if (typeof label === "string") {
          const folded = label.toLowerCase();
          const same = byFoldedText.get(folded);
          group = same ?? firstLabels.length;
          if (same === undefined) {
            byFoldedText.set(folded, group);
            firstLabels.push(label);
            sizes.push(0);
          }
          byCell.set(label, group);
        } else if (typeof label === "number" || typeof label === "boolean") {
          group = firstLabels.length;
          byCell.set(label, group);
          firstLabels.push(label);
          sizes.push(0);
        } else {
          labelErrors++;
          continue;
        }
        if (slot >= 0) {
          cachedText[slot] = label as string;
          cachedGroup[slot] = group;
        }
      }
      if (typeof v === "number" && v - v === 0) {
        groupOf[count] = group;
        kept[count++] = v;
        sizes[group]++;
      } else valuesSkipped++;
    }
  }
  // Counting sort by group number: each group's values contiguous, in reading order.
  const starts = new Int32Array(sizes.length + 1);
  for (let g = 0; g < sizes.length; g++) starts[g + 1] = starts[g] + sizes[g];
  const next = starts.slice(0, sizes.length);
  const ordered = new Float64Array(count);
  for (let i = 0; i < count; i++) ordered[next[groupOf[i]]++] = kept[i];
  const groups = firstLabels.map((label, g) => ({ label, values: ordered.subarray(starts[g], starts[g + 1]) }));
  return { groups, blankLabels, valuesSkipped, labelErrors };
}
