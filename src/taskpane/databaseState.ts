/**
 * The Data step for data in a database: the table, column and optional group
 * column the person names, the two queries to copy, and the cells where the
 * answers were pasted back. Pure updates and what the step shows; the block
 * then reads one pasted row (resultBlock.ts, `database`).
 *
 * Method: the queries come from databaseQuery.ts (the README's text with the
 * person's names in front). The first run carries no ranks and tells each n;
 * the second carries the ranks of the two-sided exact bounds for that n at the
 * confidence asked (boundRanks, as ORDERRANKS gives them), so its bounds are
 * the order statistics the block needs. The hypothesised median is the
 * Question step's value and the confidence the Settings step's, shown here
 * too because the query needs them. The pasted cells are read as a
 * database tool pastes a result: an optional row of column names, then one
 * row (one per group) of n, below, tied, above, lower and upper bound, the
 * group label first when there are groups. The add-in runs nothing itself.
 *
 * Cost: O(pasted cells) to read the answer; O(groups × log n) for the ranks.
 */
import type { DatabaseSource } from "../report/resultBlock";
import { boundRanks } from "../stats/quantileBounds";
import { databaseQuery, readNames, RESULT_COLUMNS, type DatabaseQuestion, type GroupRanks, type OrderRanks } from "./databaseQuery";
import type { DatabaseForm, PaneState } from "./paneState";
import { buildRequest, readFraction, readNumber } from "./request";
import { sha256Hex } from "./sha256";
import type { AnalyzedRange, DataChoice } from "./workflow";

/** An empty database form. */
export function emptyDatabaseForm(): DatabaseForm {
  return { table: "", column: "", group: "", row: 0, answeredBy: null };
}

/**
 * One of the names typed for the query.
 *
 * @example
 * setDatabaseField(state, "table", "plant.panels").database?.table; // "plant.panels"
 */
export function setDatabaseField(state: PaneState, field: "table" | "column" | "group", text: string): PaneState {
  if (state.database === null) return state;
  return { ...state, database: { ...state.database, [field]: text, row: field === "group" ? 0 : state.database.row }, confirm: null };
}

/**
 * Which pasted group row the block reads.
 *
 * @example
 * setDatabaseRow(state, 2).database?.row; // 2
 */
export function setDatabaseRow(state: PaneState, row: number): PaneState {
  if (state.database === null) return state;
  return { ...state, database: { ...state.database, row }, confirm: null };
}

/** One pasted answer row. */
export interface PastedRow {
  /** The group label (text, a number, or null for a NULL label); absent without groups. */
  readonly label?: string | number | null;
  readonly n: number;
  readonly below: number;
  readonly tied: number;
  readonly above: number;
  /** Null while the bound is blank (the first run, or too few values for the confidence). */
  readonly lower: number | null;
  readonly upper: number | null;
  /** Where the row is (the block refers to it). */
  readonly index: number;
}

export type PastedRead =
  | { readonly ok: true; readonly rows: readonly PastedRow[]; readonly headerRows: number }
  | { readonly ok: false; readonly message: string };

function isBlank(cell: unknown): boolean {
  return cell === null || cell === undefined || (typeof cell === "string" && cell.trim() === "");
}

function isCount(cell: unknown): cell is number {
  return typeof cell === "number" && Number.isInteger(cell) && cell >= 0;
}

/** True for grouped questions: the group column field is filled. */
export function grouped(form: DatabaseForm): boolean {
  return form.group.trim() !== "";
}

/**
 * The answer rows in the pasted cells: an optional first row of names (no number in it), then rows of
 * counts and bounds in the query's column order.
 *
 * @example
 * readPasted([["n", "below", "tied", "above", "lower_bound", "upper_bound"], [151, 70, 10, 71, 49.5, 50.8]], false);
 * // { ok: true, headerRows: 1, rows: [{ n: 151, below: 70, tied: 10, above: 71, lower: 49.5, upper: 50.8, index: 1 }] }
 */
export function readPasted(values: readonly (readonly unknown[])[], withGroups: boolean): PastedRead {
  const width = RESULT_COLUMNS.length + (withGroups ? 1 : 0);
  const names = withGroups ? ["group_label", ...RESULT_COLUMNS] : [...RESULT_COLUMNS];
  const columns = values[0]?.length ?? 0;
  if (columns !== width) {
    return {
      ok: false,
      message: `The query's answer has ${width} columns (${names.join(", ")}); these cells have ${columns}. Give the cells of the whole answer.`,
    };
  }
  const headerRows = values.length > 0 && !values[0].some((cell) => typeof cell === "number") ? 1 : 0;
  const body = values.slice(headerRows);
  if (body.length === 0) return { ok: false, message: "These cells hold only column names: give the cells with the answer's numbers." };
  if (!withGroups && body.length > 1)
    return {
      ok: false,
      message: `One column gives one answer row; these cells hold ${body.length}. Give the one row (with its names if you like).`,
    };
  const rows: PastedRow[] = [];
  for (let r = 0; r < body.length; r++) {
    const cells = withGroups ? body[r].slice(1) : body[r];
    const [n, below, tied, above, lower, upper] = cells;
    const where = body.length > 1 ? ` in answer row ${r + 1}` : "";
    if (![n, below, tied, above].every(isCount))
      return {
        ok: false,
        message: `The counts${where} (n, below, tied, above) must be whole numbers of 0 or more, as the query gives them.`,
      };
    if ((n as number) !== (below as number) + (tied as number) + (above as number))
      return { ok: false, message: `n${where} is not below + tied + above: paste the query's answer again, its columns in order.` };
    const bound = (cell: unknown): number | null | undefined =>
      isBlank(cell) ? null : typeof cell === "number" && Number.isFinite(cell) ? cell : undefined;
    const lo = bound(lower);
    const hi = bound(upper);
    if (lo === undefined || hi === undefined) return { ok: false, message: `The bounds${where} must be numbers, or blank.` };
    const label = withGroups ? (isBlank(body[r][0]) ? null : (body[r][0] as string | number)) : undefined;
    rows.push({
      ...(withGroups ? { label } : {}),
      n: n as number,
      below: below as number,
      tied: tied as number,
      above: above as number,
      lower: lo,
      upper: hi,
      index: r + headerRows,
    });
  }
  return { ok: true, rows, headerRows };
}

/** The question for the query: the names and the hypothesised median (the Question step's value), or why not. */
export function databaseQuestion(state: PaneState): { ok: true; question: DatabaseQuestion } | { ok: false; message: string } {
  const form = state.database;
  if (form === null) return { ok: false, message: "The data are not in a database." };
  const names = readNames({ table: form.table, column: form.column, group: form.group, center: 0 });
  if (!names.ok) return names;
  const center = readNumber(state.question.center, "The hypothesised median");
  if (!center.ok) return center;
  const group = grouped(form) ? { group: form.group.trim() } : {};
  return { ok: true, question: { table: form.table.trim(), column: form.column.trim(), ...group, center: center.value } };
}

/** The ranks of the two-sided exact bounds for n at a confidence; null ends where n is too small. */
function ranksFor(n: number, confidence: number): OrderRanks {
  const ranks = boundRanks(n, 0.5, confidence, "two-sided");
  return ranks.available ? { lower: ranks.lowerRank ?? null, upper: ranks.upperRank ?? null } : { lower: null, upper: null };
}

/** The pasted answer as read, when there are cells. */
export function pastedAnswer(state: PaneState): PastedRead | null {
  const range = state.slots[0].range;
  if (state.database === null || range === null) return null;
  return readPasted(range.values, grouped(state.database));
}

/**
 * The second run's query: the first run's n (per group) turned into ranks. Null until the first answer is
 * pasted and the names, median and confidence can be used.
 *
 * @example
 * secondQuery(stateWithFirstAnswer); // "-- Evensplit, second run: ...\nWITH measurements AS (...)"
 */
export function secondQuery(state: PaneState): string | null {
  const question = databaseQuestion(state);
  const confidence = readFraction(state.settings.confidence, "The confidence level");
  const pasted = pastedAnswer(state);
  if (!question.ok || !confidence.ok || pasted === null || !pasted.ok) return null;
  if (question.question.group === undefined) return databaseQuery(question.question, ranksFor(pasted.rows[0].n, confidence.value));
  const ranks: GroupRanks[] = pasted.rows.map((row) => ({ label: row.label ?? null, ...ranksFor(row.n, confidence.value) }));
  return databaseQuery(question.question, ranks);
}

/**
 * The first run's query, or null while a name or the median cannot be used.
 *
 * @example
 * firstQuery(stateWithNames); // "-- Evensplit, first run: ...\nWITH measurements AS (...)"
 */
export function firstQuery(state: PaneState): string | null {
  const question = databaseQuestion(state);
  return question.ok ? databaseQuery(question.question, null) : null;
}

/** The pasted row the block reads: the only one, or the chosen group's. */
export function chosenRow(state: PaneState): PastedRow | null {
  const pasted = pastedAnswer(state);
  if (pasted === null || !pasted.ok || state.database === null) return null;
  return pasted.rows[Math.min(state.database.row, pasted.rows.length - 1)];
}

/**
 * The data choice the block reads: the chosen pasted row alone, as a range of its own.
 *
 * @example
 * databaseChoices(stateWithAnswerAtA1F2)[0].range.rect; // { top: 1, bottom: 1, left: 0, right: 5 }
 */
export function databaseChoices(state: PaneState): DataChoice[] {
  const range = state.slots[0].range;
  const row = chosenRow(state);
  if (range === null || row === null) return [];
  const rect = { ...range.rect, top: range.rect.top + row.index, bottom: range.rect.top + row.index };
  const only: AnalyzedRange = { sheet: range.sheet, rect, values: [range.values[row.index]], header: null, place: { kind: "none" } };
  return [{ range: only, useHeader: false }];
}

/**
 * The state after the pasted cells were read (again): an answer that differs from the one read before and
 * holds bounds is taken to come from the second query as it stands now, and that query is kept with it; the
 * same answer read again (the pane rereads its cells when the focus comes back) keeps what it had.
 *
 * @example
 * databaseAnswerRead(before, slotRead(before, 0, "E1:J2", analysis)).database?.answeredBy; // the second query's text
 */
export function databaseAnswerRead(before: PaneState, after: PaneState): PaneState {
  if (after.database === null) return after;
  const rows = (state: PaneState): string => JSON.stringify(pastedAnswer(state));
  if (before.database !== null && rows(before) === rows(after))
    return { ...after, database: { ...after.database, answeredBy: before.database.answeredBy } };
  const pasted = pastedAnswer(after);
  const bounded = pasted !== null && pasted.ok && pasted.rows.some((row) => row.lower !== null || row.upper !== null);
  return { ...after, database: { ...after.database, answeredBy: bounded ? secondQuery(after) : null } };
}

/**
 * Why the database data cannot be used yet, in the order the person works: names, median, the first
 * answer, the second answer; null when the block can be written.
 *
 * @example
 * databaseProblem(stateWithNamesOnly); // "Run the first query, paste its answer into the sheet, and give its cells."
 */
export function databaseProblem(state: PaneState): string | null {
  const question = databaseQuestion(state);
  if (!question.ok) return question.message;
  if (state.slots[0].problem) return state.slots[0].problem;
  const pasted = pastedAnswer(state);
  if (pasted === null) return "Run the first query, paste its answer into the sheet, and give its cells.";
  if (!pasted.ok) return pasted.message;
  const row = chosenRow(state);
  if (row !== null && row.lower === null && row.upper === null) {
    const confidence = readFraction(state.settings.confidence, "The confidence level");
    if (!confidence.ok) return confidence.message;
    const ranks = ranksFor(row.n, confidence.value);
    if (ranks.lower === null && ranks.upper === null)
      return `${row.n} values cannot give bounds at this confidence; choose a lower confidence or count more values.`;
    return "Run the second query (it carries the ranks for this n) and paste its answer over the first.";
  }
  const answeredBy = state.database?.answeredBy ?? null;
  if (answeredBy !== null && answeredBy !== secondQuery(state))
    return "The names, the median or the confidence changed after this answer was pasted: run the second query again (it has changed) and paste its answer over this one.";
  return null;
}

/**
 * What the block's audit line says about the query: the names and the SHA-256 of the second query's text.
 *
 * @example
 * databaseSource(readyState); // { table: "panels", column: "thickness", queryHash: "3f1c…" }
 */
export function databaseSource(state: PaneState): DatabaseSource | null {
  const question = databaseQuestion(state);
  // The query the pasted answer came from, when the pane saw it arrive; otherwise the one it shows now.
  const query = state.database?.answeredBy ?? secondQuery(state);
  const row = chosenRow(state);
  if (!question.ok || query === null || row === null) return null;
  const { table, column, group } = question.question;
  const label = group === undefined ? {} : { group: { column: group, label: row.label === null ? "NULL" : String(row.label) } };
  return { table, column, ...label, queryHash: sha256Hex(query) };
}

/** What the database part of the Data step shows. */
export interface DatabaseView {
  readonly table: string;
  readonly column: string;
  readonly group: string;
  readonly center: string;
  readonly confidence: string;
  /** The first problem with the names or the median, shown beside the fields. */
  readonly namesProblem: string | null;
  readonly firstQuery: string;
  readonly secondQuery: string;
  /** What was read from the pasted cells, in words. */
  readonly pastedSummary: string;
  /** The group labels to choose the block's row from (empty without groups). */
  readonly groupLabels: readonly string[];
  readonly row: number;
  /** What is left to do, or that the block can be written. */
  readonly next: string;
}

function numberWords(x: number | null): string {
  return x === null ? "blank" : String(x);
}

function summaryOf(read: PastedRead | null): string {
  if (read === null || !read.ok) return "";
  const described = read.rows.map((row) => {
    const who = row.label === undefined ? "" : `${row.label === null ? "NULL" : String(row.label)}: `;
    return `${who}n ${row.n} (${row.below} below, ${row.tied} tied, ${row.above} above), bounds ${numberWords(row.lower)} and ${numberWords(row.upper)}`;
  });
  return `Read ${read.rows.length === 1 ? "one answer row" : `${read.rows.length} answer rows`}${read.headerRows > 0 ? " under a row of names" : ""}: ${described.join("; ")}.`;
}

/**
 * Everything the database part of the Data step shows, from the state.
 *
 * @example
 * databaseView(stateWithNames).firstQuery.startsWith("-- Evensplit, first run"); // true
 */
export function databaseView(state: PaneState): DatabaseView | null {
  const form = state.database;
  if (form === null) return null;
  const question = databaseQuestion(state);
  const typed = form.table.trim() !== "" || form.column.trim() !== "" || state.question.center.trim() !== "";
  const pasted = pastedAnswer(state);
  const problem = databaseProblem(state);
  return {
    table: form.table,
    column: form.column,
    group: form.group,
    center: state.question.center,
    confidence: state.settings.confidence,
    namesProblem: !question.ok && typed ? question.message : null,
    firstQuery: firstQuery(state) ?? "",
    secondQuery: secondQuery(state) ?? "",
    pastedSummary: summaryOf(pasted),
    groupLabels: pasted !== null && pasted.ok && grouped(form) ? pasted.rows.map((r) => (r.label === null ? "NULL" : String(r.label))) : [],
    row: form.row,
    next: problem ?? "The answer is complete: go on to the question.",
  };
}

/**
 * The block request for data in a database: a one-sample sign test on the column's name, ties left out (the
 * query counts them apart), with the query's source once the answer is complete.
 *
 * @example
 * databaseRequest(readyState); // { ok: true, request: { test: "sign", ..., dataName: "thickness", database: { table: "panels", ... } } }
 */
export function databaseRequest(state: PaneState): ReturnType<typeof buildRequest> {
  const column = state.database?.column.trim() ?? "";
  const built = buildRequest(
    false,
    { ...state.question, test: "sign" },
    { ...state.settings, ties: "drop" },
    column === "" ? {} : { data: column },
  );
  const source = databaseSource(state);
  if (!built.ok || source === null) return built;
  return { ok: true, request: { ...built.request, database: source } };
}
