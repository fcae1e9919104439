/**
 * Where Ctrl+arrow goes in the demo sheet: to the edge of the current data
 * region (Microsoft, "Keyboard shortcuts in Excel": Ctrl+Arrow key moves to
 * the edge of the current data region). From a filled cell whose neighbour
 * is filled too, to the last filled cell of that run; otherwise to the next
 * filled cell, or to the sheet's edge when there is none (the details from
 * memory of Excel's behaviour).
 *
 * Cost: O(cells passed), and O(1) past the last used row or column, where
 * everything is blank.
 */

/** How far the filled cells reach along the line being walked; beyond it every cell is blank. */
export interface Line {
  /** The last index (row or column) that can hold anything on this line. */
  readonly lastUsed: number;
  /** The sheet's last index (row 1,048,576 or column XFD, 0-based). */
  readonly last: number;
  /** True when the cell at this index holds something. */
  filled(index: number): boolean;
}

/**
 * The index Ctrl+arrow reaches from `from`, walking by `step` (+1 or −1).
 *
 * @example
 * const line = { lastUsed: 4, last: 1_048_575, filled: (i: number) => i >= 1 && i <= 3 };
 * dataEdge(1, 1, line); // 3: the end of the run 1..3
 * dataEdge(3, 1, line); // 1_048_575: nothing filled below, so the sheet's edge
 */
export function dataEdge(from: number, step: 1 | -1, line: Line): number {
  const inside = (i: number): boolean => i >= 0 && i <= line.last;
  const filled = (i: number): boolean => i <= line.lastUsed && line.filled(i);
  if (!inside(from + step)) return from;
  if (filled(from) && filled(from + step)) {
    let i = from + step;
    while (inside(i + step) && filled(i + step)) i += step;
    return i;
  }
  let i = from + step;
  if (step > 0 && i > line.lastUsed) return line.last;
  while (inside(i + step) && !filled(i)) {
    if (step > 0 && i > line.lastUsed) return line.last;
    i += step;
  }
  return i;
}
