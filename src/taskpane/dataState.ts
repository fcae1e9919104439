/**
 * The Data step's part of the pane state: one range, or two for pairs, as
 * typed and as read; whether the first row is a name; how the block refers
 * to the cells. Pure updates, and what the step shows, derived from a state.
 *
 * Method: reading and describing ranges is workflow.ts's (dataInfo.ts,
 * references.ts); this module only keeps the choices and words them.
 *
 * Cost: O(cells of the data) for the summaries, O(1) for the updates.
 */
import { formatAddress, rectsOverlap, type CellRect } from "./a1";
import { headerName } from "./dataInfo";
import { groupCells, type GroupedCells } from "../stats/groupedCells";
import { databaseChoices, databaseProblem, databaseView, emptyDatabaseForm, type DatabaseView } from "./databaseState";
import { emptySlot, type PaneState, type RangeSlot } from "./paneState";
import { absoluteReference, openEnded } from "./references";
import {
  blockRefs,
  bodyOf,
  dataProblem,
  referenceOptions,
  tablesToCreate,
  type Analysis,
  type AnalyzedRange,
  type DataChoice,
  type ReferenceChoice,
  type ReferenceOptions,
} from "./workflow";

function sameRange(a: AnalyzedRange, b: AnalyzedRange | null): boolean {
  return b !== null && a.sheet === b.sheet && formatAddress(a.rect) === formatAddress(b.rect);
}

function withSlot(state: PaneState, index: number, slot: RangeSlot): PaneState {
  const slots: [RangeSlot, RangeSlot] = index === 0 ? [slot, state.slots[1]] : [state.slots[0], slot];
  // The same range read again leaves a pending listing alone: the write checks the cells it lists anyway.
  const before = state.slots[index].range;
  const same = slot.range !== null && before !== null && sameRange(slot.range, before);
  return settleData({ ...state, slots, confirm: same ? state.confirm : null });
}

/** The kinds of data the Data step offers. */
export type DataKind = "one" | "pairs" | "two-groups" | "groups" | "database";

/**
 * The kind of data a state holds.
 *
 * @example
 * dataKind(initialState()); // "one"
 */
export function dataKind(state: PaneState): DataKind {
  if (state.database !== null) return "database";
  if (state.paired) return "pairs";
  return state.groups === "two" ? "two-groups" : state.groups === "several" ? "groups" : "one";
}

/**
 * True when the data take both ranges: pairs, two groups, or values with their group column.
 *
 * @example
 * usesTwoRanges(setDataKind(initialState(), "groups")); // true
 */
export function usesTwoRanges(state: PaneState): boolean {
  return state.paired || state.groups !== "none";
}

/**
 * True when the second range is a group column beside the values: several groups, or two groups named in one.
 *
 * @example
 * readsGroupColumn(setDataKind(initialState(), "groups")); // true
 */
export function readsGroupColumn(state: PaneState): boolean {
  return state.groups === "several" || (state.groups === "two" && state.groupColumn);
}

/**
 * Two groups: each from its own range (false) or both from one column of values and a group column beside it
 * (true). The second range means something else in each form, so it is chosen again.
 *
 * @example
 * setGroupColumn(setDataKind(initialState(), "two-groups"), true).groupColumn; // true
 */
export function setGroupColumn(state: PaneState, groupColumn: boolean): PaneState {
  if (state.groups !== "two" || state.groupColumn === groupColumn) return state;
  return settleData({ ...state, groupColumn, swapGroups: false, slots: [state.slots[0], emptySlot()], confirm: null });
}

/**
 * Two groups from a group column: which label is the first group (the shift is second − first).
 *
 * @example
 * setSwapGroups(state, true).swapGroups; // true
 */
export function setSwapGroups(state: PaneState, swapGroups: boolean): PaneState {
  return { ...state, swapGroups, confirm: null };
}

/** The two groups a group column names: their labels, first and second. */
export interface PickedGroups {
  readonly first: string | number;
  readonly second: string | number;
}

/** Every label of the group column beside the values, in order of first appearance (none until both are read and line up). */
function foundGroups(state: PaneState): GroupedCells | null {
  const [values, labels] = state.slots;
  if (!values.range || !labels.range) return null;
  const v = bodyOf({ range: values.range, useHeader: values.useHeader });
  const l = bodyOf({ range: labels.range, useHeader: labels.useHeader });
  if (v.values.length !== l.values.length || v.values[0]?.length !== l.values[0]?.length) return null;
  return groupCells(v.values, l.values);
}

/**
 * Two groups from a group column: the two labels when the column holds exactly two (blank labels skipped),
 * each with numbers, first and second in order of first appearance unless swapped; null otherwise.
 *
 * @example
 * pickedGroups(stateWithNorthAndSouth); // { first: "North", second: "South" }
 */
export function pickedGroups(state: PaneState): PickedGroups | null {
  if (state.groups !== "two" || !state.groupColumn) return null;
  const found = foundGroups(state);
  if (!found || found.groups.length !== 2 || found.groups.some((g) => g.values.length === 0)) return null;
  const [a, b] = found.groups.map((g) => g.label);
  if (typeof a === "boolean" || typeof b === "boolean") return null;
  return state.swapGroups ? { first: b, second: a } : { first: a, second: b };
}

/** What a group column holds that keeps it from naming exactly two groups, or null. */
function twoLabelProblem(state: PaneState): string | null {
  const found = foundGroups(state);
  if (!found) return null;
  const shown = found.groups.map((g) => `“${String(g.label)}” (${g.values.length} ${g.values.length === 1 ? "number" : "numbers"})`);
  const list = shown.length > 0 ? `: ${shown.join(", ")}` : "";
  if (found.groups.length !== 2) {
    const more = found.groups.length > 2 ? " To compare them all, choose Several groups." : "";
    return `Two groups need a group column with exactly two labels; it holds ${found.groups.length}${list}.${more}`;
  }
  if (found.groups.some((g) => g.values.length === 0)) return `Each of the two groups needs numbers; the group column names${list}.`;
  if (found.groups.some((g) => typeof g.label === "boolean")) return "The group labels must be text or numbers, not TRUE or FALSE.";
  return null;
}

/**
 * One set of values, pairs, two groups or several groups. Pairs take no quantile
 * test; a change of kind resets the hypothesised value (a shift starts at 0, a
 * median is typed anew; the target median of several groups is optional, so it
 * starts empty) and the second range, which means something else in each kind.
 *
 * @example
 * setDataKind(setCenter(initialState(), "50"), "two-groups").question.center; // "0"
 */
export function setDataKind(state: PaneState, kind: DataKind): PaneState {
  const before = dataKind(state);
  if (kind === before) return state;
  const paired = kind === "pairs";
  const groups = kind === "two-groups" ? "two" : kind === "groups" ? "several" : "none";
  // The query's answer is pasted anew, read as exactly those cells (a table or an open end would take in other rows).
  if (kind === "database" || before === "database") {
    const database = kind === "database" ? emptyDatabaseForm() : null;
    const question = { ...state.question, center: "", test: "sign" as const };
    const reference = kind === "database" ? ({ reference: "exact", referenceChosen: true } as const) : { referenceChosen: false };
    return settleData({ ...state, paired, groups, database, ...reference, slots: [emptySlot(), emptySlot()], question, confirm: null });
  }
  // A median and a shift are different questions: the value typed for one means nothing for the other.
  const shift = kind === "pairs" || kind === "two-groups";
  let question = { ...state.question, center: shift ? "0" : "" };
  if (kind !== "one" && question.test === "quantile") question = { ...question, test: "sign" };
  // A second range read as the second of each pair is not a group column, nor a second group: it is chosen again.
  const keepSecond = before !== "one" && kind !== "one" && readsGroupColumn(state) === (kind === "groups");
  const slots: readonly [RangeSlot, RangeSlot] = keepSecond ? state.slots : [state.slots[0], emptySlot()];
  return settleData({ ...state, paired, groups, groupColumn: false, swapGroups: false, slots, question, confirm: null });
}

/**
 * One set of values or pairs.
 *
 * @example
 * setPaired(setCenter(initialState(), "50"), true).question.center; // "0"
 */
export function setPaired(state: PaneState, paired: boolean): PaneState {
  return setDataKind(state, paired ? "pairs" : "one");
}

/**
 * A range was cleared (typed as nothing).
 *
 * @example
 * slotCleared(state, 0).slots[0].range; // null
 */
export function slotCleared(state: PaneState, index: number): PaneState {
  return withSlot(state, index, { ...state.slots[index], text: "", range: null, problem: null });
}

/**
 * A range was read: kept with its address as the workbook gives it, or its problem in words.
 *
 * @example
 * slotRead(state, 0, "b1:b25", await analyzeRange(host, "b1:b25")).slots[0].text; // "'Paint line'!B1:B25"
 */
export function slotRead(state: PaneState, index: number, typed: string, analysis: Analysis): PaneState {
  if (!analysis.ok) return withSlot(state, index, { ...state.slots[index], text: typed, range: null, problem: analysis.message });
  const { range } = analysis;
  if (state.paired && index === 0) {
    const pair = pairColumns(range);
    if (pair) return withSlot(withSlot(state, 0, freshSlot(pair[0], state.slots[0])), 1, freshSlot(pair[1], state.slots[1]));
  }
  return withSlot(state, index, freshSlot(range, state.slots[index]));
}

/** A slot for a range just read; the same range read again (Enter, then leaving the field) keeps the person's name-row choice. */
function freshSlot(range: AnalyzedRange, before: RangeSlot): RangeSlot {
  const useHeader = sameRange(range, before.range) && range.header !== null ? before.useHeader : range.header !== null;
  return { text: formatAddress(range.rect, range.sheet), range, useHeader, problem: null };
}

function columnOf(range: AnalyzedRange, k: number): AnalyzedRange {
  const values = range.values.map((row) => [row[k]]);
  const rect = { ...range.rect, left: range.rect.left + k, right: range.rect.left + k };
  return { sheet: range.sheet, rect, values, header: headerName(values), place: { kind: "none" } };
}

/**
 * The two columns of a two-column range outside any table, as a first and a second range; null otherwise.
 *
 * @example
 * pairColumns(rangeOfB1C25)?.map((r) => formatAddress(r.rect)); // ["B1:B25", "C1:C25"]
 */
export function pairColumns(range: AnalyzedRange): [AnalyzedRange, AnalyzedRange] | null {
  if (range.rect.right - range.rect.left !== 1 || range.place.kind !== "none") return null;
  return [columnOf(range, 0), columnOf(range, 1)];
}

/**
 * A two-column range chosen as one set of values, taken as pairs instead: first and second column.
 *
 * @example
 * splitIntoPairs(stateWithB1C25).slots[1].text; // "'Paint line'!C1:C25"
 */
export function splitIntoPairs(state: PaneState): PaneState {
  const range = state.slots[0].range;
  if (!range || !pairColumns(range)) return state;
  return slotRead(setPaired(state, true), 0, state.slots[0].text, { ok: true, range });
}

/**
 * A range could not be read at all (the workbook did not answer).
 *
 * @example
 * slotFailed(state, 0, "B1:B25", "busy").slots[0].problem; // "The range could not be read: busy"
 */
export function slotFailed(state: PaneState, index: number, typed: string, reason: string): PaneState {
  return withSlot(state, index, { ...state.slots[index], text: typed, range: null, problem: `The range could not be read: ${reason}` });
}

/**
 * Whether the first row of a range is its name.
 *
 * @example
 * setUseHeader(state, 0, false).slots[0].useHeader; // false
 */
export function setUseHeader(state: PaneState, index: number, useHeader: boolean): PaneState {
  return settleData({
    ...state,
    slots: index === 0 ? [{ ...state.slots[0], useHeader }, state.slots[1]] : [state.slots[0], { ...state.slots[1], useHeader }],
  });
}

/**
 * How the block refers to the data, as the person picked it.
 *
 * @example
 * setReference(state, "exact").reference; // "exact"
 */
export function setReference(state: PaneState, reference: ReferenceChoice): PaneState {
  return settleData({ ...state, reference, referenceChosen: true, confirm: null });
}

/**
 * The ranges in use, each with its header choice (one, or two for pairs; fewer while not all are read).
 *
 * @example
 * choices(state).length; // 1
 */
export function choices(state: PaneState): DataChoice[] {
  if (state.database !== null) return databaseChoices(state);
  const used = usesTwoRanges(state) ? state.slots : [state.slots[0]];
  return used.flatMap((slot) => (slot.range ? [{ range: slot.range, useHeader: slot.useHeader }] : []));
}

/** True when every range the question needs is read. */
export function dataComplete(state: PaneState): boolean {
  return choices(state).length === (usesTwoRanges(state) ? 2 : 1);
}

/**
 * Whether the block's formulas will take in rows added later: each range is
 * read through a table column (one already there, or the table the pane
 * makes) or runs on to the end of the sheet; an exact range does not.
 *
 * @example
 * blockFollowsNewRows(setReference(stateWithB1B25, "open")); // true
 */
export function blockFollowsNewRows(state: PaneState): boolean {
  const c = choices(state);
  return c.length > 0 && c.every((choice) => choice.range.place.kind === "column" || state.reference !== "exact");
}

/**
 * True when the data are complete and usable.
 *
 * @example
 * dataReady(initialState()); // false
 */
export function dataReady(state: PaneState): boolean {
  return dataComplete(state) && problemOfData(state) === null;
}

/**
 * What is wrong with the data of a kind, or null. Pairs must line up; two groups
 * may differ in size; a group column must lie beside its values, row for row,
 * and name at least two groups that hold numbers.
 *
 * @example
 * problemOfData(stateWithValuesAndOneLabel); // "The group column names only one group (“Line A”): ..."
 */
export function problemOfData(state: PaneState): string | null {
  if (state.database !== null) return databaseProblem(state);
  const c = choices(state);
  if (state.groups === "none") return dataProblem(c);
  const [first, second] = c.map(bodyOf);
  const kind = dataKind(state);
  if (first.tally.numbers === 0)
    return kind === "groups" ? "The values hold no numbers: there is nothing to test." : "The first group holds no numbers.";
  if (kind === "two-groups" && !state.groupColumn && second.tally.numbers === 0) return "The second group holds no numbers.";
  if (first.sheet === second.sheet && rectsOverlap(first.rect, second.rect)) return "The two ranges overlap: pick two separate columns.";
  if (kind === "two-groups" && !state.groupColumn) return null;
  const shape = (rect: CellRect): string => `${rect.bottom - rect.top + 1} × ${rect.right - rect.left + 1}`;
  if (shape(first.rect) !== shape(second.rect) || first.rect.top !== second.rect.top) {
    return `The group column must lie beside the values, row for row: the values are ${formatAddress(first.rect, first.sheet)}, the group column ${formatAddress(second.rect, second.sheet)}.`;
  }
  if (kind === "two-groups") return twoLabelProblem(state);
  const grouped = groupCells(first.values, second.values).groups.filter((g) => g.values.length > 0);
  if (grouped.length < 2) {
    const only = grouped.length === 1 ? ` (“${String(grouped[0].label)}”)` : "";
    return `The group column names ${grouped.length === 1 ? "only one group" : "no group"} with numbers${only}: several groups need at least two.`;
  }
  return null;
}

/**
 * The state with a reference form that the data allow. Until the person
 * picks one, new rows should count: the range becomes a table when the block
 * is written, where a table can be made (the Write button then says so, and
 * pressing it is the consent). A table or an open end that is no longer
 * available falls back to exactly these cells.
 *
 * @example
 * settleData(stateWithB1B25).reference; // "table" until the person picks another form
 */
export function settleData(state: PaneState): PaneState {
  state = withLabelHeader(state);
  if (!dataComplete(state)) return state;
  const options = referenceOptions(choices(state));
  if (options.allTableColumns) return state;
  if (!state.referenceChosen) return { ...state, reference: options.table.available ? "table" : "exact" };
  if (state.reference === "exact") return state;
  const available = state.reference === "table" ? options.table.available : options.open.available;
  return available ? state : { ...state, reference: "exact" };
}

/**
 * A group column holds text all the way down, so its name row cannot be told from a label by
 * itself: when the values beside it start on the same row and take their first row as a name,
 * the group column's first row is its name too (and the person can still untick it).
 *
 * @example
 * withLabelHeader(stateWithThicknessAndLine).slots[1].range?.header; // "Line"
 */
export function withLabelHeader(state: PaneState): PaneState {
  const [values, labels] = state.slots;
  if (!readsGroupColumn(state) || !values.range || !labels.range || labels.range.header !== null) return state;
  if (labels.range.place.kind !== "none" || values.range.header === null || values.range.rect.top !== labels.range.rect.top) return state;
  const first = labels.range.values[0] ?? [];
  if (labels.range.values.length < 2 || !first.every((cell) => typeof cell === "string" && cell.trim() !== "")) return state;
  const header = (first as string[]).map((cell) => cell.trim()).join(" / ");
  return { ...state, slots: [values, { ...labels, range: { ...labels.range, header }, useHeader: values.useHeader }] };
}

/**
 * Why the Data step cannot be left, or null.
 *
 * @example
 * dataStepProblem(initialState()); // "Give the range with the values first."
 */
export function dataStepProblem(state: PaneState): string | null {
  if (state.database !== null) return databaseProblem(state);
  if (!dataComplete(state)) {
    const kind = dataKind(state);
    if (kind === "groups") return "Give the values and the group column first.";
    if (kind === "two-groups") return state.groupColumn ? "Give the values and the group column first." : "Give both groups first.";
    return kind === "pairs" ? "Give both ranges first." : "Give the range with the values first.";
  }
  return problemOfData(state);
}

/** What one range's part of the Data step shows. */
export interface SlotView {
  readonly label: string;
  readonly problem: string | null;
  readonly summary: string;
  readonly canToggleHeader: boolean;
  readonly useHeader: boolean;
  /** For one set of values read from several columns: that they are pooled, in words; else null. */
  readonly pooled: string | null;
  /** The pooled range can be taken as pairs instead (two columns outside a table). */
  readonly canPair: boolean;
}

/** What the Data step shows. */
export interface DataView {
  readonly kind: DataKind;
  /** The second range is asked for (pairs, two groups, the group column). */
  readonly twoRanges: boolean;
  readonly paired: boolean;
  readonly slots: readonly [SlotView, SlotView];
  /** Null while the reference choice is not offered. */
  readonly options: ReferenceOptions | null;
  readonly reference: ReferenceChoice;
  readonly note: string;
  readonly problem: string;
  /** Data in a database: the names, the queries and the pasted answer; null for data in the sheet. */
  readonly database: DatabaseView | null;
  /** Two groups: true when they are named in a group column (the form is offered only for two groups). */
  readonly groupColumn: boolean;
  /** Two groups from a group column: which is first and which second, in words, with the swap offered; null otherwise. */
  readonly picked: { readonly words: string; readonly swapped: boolean } | null;
}

/** How many labels a group column holds and how they are counted, beside the values they name. */
function labelSummary(labels: RangeSlot, values: RangeSlot): string {
  if (!labels.range) return "";
  const body = bodyOf({ range: labels.range, useHeader: labels.useHeader });
  const where = formatAddress(body.rect, body.sheet);
  const named = body.name === undefined ? "No name row." : `Name: “${body.name}”.`;
  const valueBody = values.range ? bodyOf({ range: values.range, useHeader: values.useHeader }) : null;
  if (!valueBody || valueBody.values.length !== body.values.length || valueBody.values[0]?.length !== body.values[0]?.length) {
    return `${where}: ${body.tally.cells} cells. ${named}`;
  }
  const grouped = groupCells(valueBody.values, body.values);
  const shown = grouped.groups.slice(0, 6).map((g) => `“${String(g.label)}” (${g.values.length})`);
  const more = grouped.groups.length > 6 ? `, and ${grouped.groups.length - 6} more` : "";
  const k = grouped.groups.length;
  const blank = grouped.blankLabels + grouped.labelErrors;
  const skipped =
    blank > 0 ? ` ${blank} ${blank === 1 ? "row has" : "rows have"} a blank or error label and ${blank === 1 ? "is" : "are"} skipped.` : "";
  return `${where}: ${k} ${k === 1 ? "group" : "groups"} with numbers counted — ${shown.join(", ")}${more}.${skipped} ${named}`;
}

function slotSummary(slot: RangeSlot): string {
  if (!slot.range) return "";
  const body = bodyOf({ range: slot.range, useHeader: slot.useHeader });
  const { blank, text, boolean, other } = body.tally.skipped;
  const parts = [`${body.tally.numbers} numbers`, `${blank} blank`, `${text} text`];
  if (boolean > 0) parts.push(`${boolean} TRUE/FALSE`);
  if (other > 0) parts.push(`${other} errors`);
  const where = formatAddress(body.rect, body.sheet);
  const named =
    body.name === undefined
      ? "No name row."
      : slot.range.place.kind === "column"
        ? `Table column “${body.name}”.`
        : `Name: “${body.name}”.`;
  return `${where}: ${body.tally.cells} cells — ${parts.join(", ")}. ${named}`;
}

function pooledWords(slot: RangeSlot, paired: boolean): string | null {
  if (paired || !slot.range) return null;
  // Several columns of one group are pooled too, but the offer of pairs belongs to one set of values.
  const columns = slot.range.rect.right - slot.range.rect.left + 1;
  if (columns < 2) return null;
  const numbers = bodyOf({ range: slot.range, useHeader: slot.useHeader }).tally.numbers;
  const pairs =
    columns === 2 && slot.range.place.kind === "none"
      ? " If each row holds a first and a second value of one item, use them as pairs."
      : " To compare two columns, choose Pairs of values and give each column on its own.";
  return `This range has ${columns} columns: their ${numbers} numbers are pooled into one set of values, as if they were one column.${pairs}`;
}

function slotView(slot: RangeSlot, label: string, oneSet: boolean, summary = slotSummary(slot)): SlotView {
  const canToggleHeader = slot.range !== null && slot.range.place.kind !== "column" && slot.range.header !== null;
  const pooled = oneSet ? pooledWords(slot, false) : null;
  const canPair = pooled !== null && slot.range !== null && pairColumns(slot.range) !== null;
  return { label, problem: slot.problem, summary, canToggleHeader, useHeader: slot.useHeader, pooled, canPair };
}

const SLOT_LABELS: Readonly<Record<DataKind, readonly [string, string]>> = {
  one: ["Values", "Second values"],
  pairs: ["First values (for example, before)", "Second values (for example, after)"],
  "two-groups": ["First group (for example, line A)", "Second group (for example, line B)"],
  groups: ["Values (all groups in one column)", "Group column (the group of each value, beside it)"],
  database: ["Cells holding the query's answer", "Second values"],
};

const LABELED_SLOT_LABELS = [
  "Values (both groups in one column)",
  "Group column (two labels: the group of each value, beside it)",
] as const;

/**
 * The sentence saying what the block's formulas will read, for the chosen reference form.
 *
 * @example
 * referenceSentence(state); // "The block will read exactly $B$2:$B$25; values added below are not counted until you write the block again."
 */
export function referenceSentence(state: PaneState): string {
  const c = choices(state);
  if (!dataComplete(state)) return "";
  const options = referenceOptions(c);
  const sheet = c[0].range.sheet;
  const refs = blockRefs(c, state.reference, [], sheet);
  const list = refs.second === undefined ? refs.data : `${refs.data} and ${refs.second}`;
  if (options.allTableColumns) return `The block will refer to ${list}, so rows added to the table count automatically.`;
  if (state.reference === "table") {
    const rects = tablesToCreate(c).map((t) => formatAddress(t.rect));
    const how = state.referenceChosen
      ? ""
      : " This is the default, so that new rows count; to leave the cells as they are, choose “Use exactly these cells”.";
    return `With your agreement, ${rects.join(" and ")} will become a table when the block is written, and the block will follow its columns, so rows added to the table count automatically.${how}`;
  }
  if (state.reference === "open") {
    const open = c.map((choice) => absoluteReference(openEnded(bodyOf(choice).rect), sheet, sheet)).join(" and ");
    return `The block will read ${open}, down to the last row of the sheet, so values typed below count; keep anything else out of those columns.`;
  }
  return `The block will read exactly ${list}; values added below are not counted until you write the block again.`;
}

/**
 * Everything the Data step shows, from the state.
 *
 * @example
 * dataView(initialState()).slots[0].label; // "Values"
 */
export function dataView(state: PaneState): DataView {
  const complete = dataComplete(state);
  const c = choices(state);
  const kind = dataKind(state);
  const labeled = kind === "two-groups" && state.groupColumn;
  const [first, second] = labeled ? LABELED_SLOT_LABELS : SLOT_LABELS[kind];
  const picked = pickedGroups(state);
  return {
    kind,
    twoRanges: usesTwoRanges(state),
    paired: state.paired,
    slots: [
      slotView(state.slots[0], first, kind === "one"),
      readsGroupColumn(state)
        ? slotView(state.slots[1], second, false, labelSummary(state.slots[1], state.slots[0]))
        : slotView(state.slots[1], second, false),
    ],
    options: complete ? referenceOptions(c) : null,
    reference: state.reference,
    note: referenceSentence(state),
    problem: complete ? (problemOfData(state) ?? "") : "",
    database: databaseView(state),
    groupColumn: labeled,
    picked: picked
      ? {
          words: `First group: “${String(picked.first)}”; second group: “${String(picked.second)}”. The shift is “${String(picked.second)}” − “${String(picked.first)}”.`,
          swapped: state.swapGroups,
        }
      : null,
  };
}
