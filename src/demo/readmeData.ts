/**
 * The second demo sheet: the tables the README's examples name, filled with
 * invented data (made up for this page, not measured anywhere), so that every
 * example formula of the README can be typed into the demo and answers.
 *
 * The scenario is the project's invented paint line: `Panels[Thickness]`
 * holds the first sheet's 24 thickness readings (µm; one blank, one note)
 * and 12 later panels, enough numbers (34) for the README's 95% bound on the
 * 0.9 quantile, which needs 29,
 * `Nozzle[Before]` and `Nozzle[After]` the same panels before and after a
 * nozzle change, `Lines[LineA]` and `Lines[LineB]` panels of two lines (of
 * different lengths), `Heads[Head]` and `Heads[Thickness]` panels by spray
 * head, F2:F6 the p-values of five lines (for ADJUST), and the defined names
 * `n`, `below`, `above` a database query's answers (for ORDERRANKS and
 * COUNTPVALUE).
 *
 * Cost: O(1).
 */
import { demoRows } from "./inventedData";

export const README_SHEET = "README examples";

/** Where a block of the sheet starts (0-based) and what it holds, header row first. */
export interface SheetBlock {
  readonly top: number;
  readonly left: number;
  readonly rows: readonly (readonly (number | string | null)[])[];
}

/** A README table: its name and its cells, header row first. */
export interface ReadmeTable extends SheetBlock {
  readonly name: string;
}

/** A defined name for one cell, with the value that cell holds. */
export interface ReadmeName {
  readonly name: string;
  readonly row: number;
  readonly column: number;
  readonly label: string;
  readonly value: number;
}

const TABLE_TOP = 9;

const panels = demoRows().slice(1);

/** Twelve later panels of the same line, so that the 0.9 quantile's 95% bound has enough values. */
const LATER_PANELS = [52.6, 49.9, 51.4, 53.0, 50.8, 48.5, 52.0, 54.4, 50.1, 51.7, 49.3, 53.8];

const LINE_A = [50.8, 51.6, 49.7, 52.1, 50.2, 51.0, 49.4, 50.9, 51.8, 50.5, 49.9, 52.4, 50.6, 51.3, 50.1];
const LINE_B = [52.3, 51.9, 53.4, 52.8, 50.9, 53.1, 52.0, 54.2, 51.7, 52.6, 53.8, 52.2];
const HEADS: readonly (readonly [string, number])[] = [
  ["H1", 50.4],
  ["H2", 52.7],
  ["H3", 49.8],
  ["H1", 51.1],
  ["H2", 53.0],
  ["H3", 50.2],
  ["H1", 49.6],
  ["H2", 52.1],
  ["H3", 51.0],
  ["H1", 50.9],
  ["H2", 53.6],
  ["H3", 49.5],
  ["H1", 51.4],
  ["H2", 52.4],
  ["H3", 50.7],
  ["H1", 50.0],
  ["H2", 51.8],
  ["H3", 50.3],
];

/**
 * The tables of the README sheet, each with its name and cells.
 *
 * @example
 * readmeTables()[0].name; // "Panels"
 */
export function readmeTables(): ReadmeTable[] {
  return [
    {
      name: "Panels",
      top: TABLE_TOP,
      left: 0,
      rows: [["Thickness"], ...panels.map(([, before]) => [before]), ...LATER_PANELS.map((x) => [x])],
    },
    { name: "Nozzle", top: TABLE_TOP, left: 2, rows: [["Before", "After"], ...panels.map(([, before, after]) => [before, after])] },
    {
      name: "Lines",
      top: TABLE_TOP,
      left: 5,
      rows: [["LineA", "LineB"], ...LINE_A.map((a, i) => [a, LINE_B[i] ?? null])],
    },
    { name: "Heads", top: TABLE_TOP, left: 8, rows: [["Head", "Thickness"], ...HEADS.map(([head, thickness]) => [head, thickness])] },
  ];
}

/**
 * The plain blocks of the README sheet: the note saying the data are invented,
 * and five lines' p-values in F2:F6 for `=EVENSPLIT.ADJUST(F2:F6, "holm")`.
 *
 * @example
 * readmeBlocks()[1].rows[1]; // ["Line 1", 0.012]
 */
export function readmeBlocks(): SheetBlock[] {
  return [
    {
      top: 0,
      left: 0,
      rows: [["Invented data for the README's examples:"], ["made up for this page,"], ["not measured anywhere."]],
    },
    {
      top: 0,
      left: 4,
      rows: [
        ["Paint line", "p-value"],
        ["Line 1", 0.012],
        ["Line 2", 0.31],
        ["Line 3", 0.004],
        ["Line 4", 0.047],
        ["Line 5", 0.62],
      ],
    },
  ];
}

/**
 * Cells holding a database query's invented answers, each under a defined
 * name, for `=EVENSPLIT.ORDERRANKS(n, 0.95)` and
 * `=EVENSPLIT.COUNTPVALUE(above, below, "greater")`.
 *
 * @example
 * readmeNames().map((x) => x.name); // ["n", "below", "above"]
 */
export function readmeNames(): ReadmeName[] {
  return [
    { name: "n", row: 1, column: 12, label: "Query: n", value: 1_000_000 },
    { name: "below", row: 2, column: 12, label: "Query: below", value: 498_812 },
    { name: "above", row: 3, column: 12, label: "Query: above", value: 501_003 },
  ];
}
