/**
 * The pane's workbook steps, free of any page: reading and describing a data
 * range, choosing how the formulas refer to it, finding the default place for
 * the block, and writing it: planned and checked whole first, then the
 * overwrite check, then one batch holding the table conversion the person
 * agreed to, the formulas, formats and the optional chart. Everything goes
 * through the host module.
 *
 * Method: see dataInfo.ts (header and table detection), references.ts
 * (reference forms), placement.ts (default place, overwrite list),
 * preview.ts (rows, formulas, formats), writePlan.ts (Excel's limits, names).
 *
 * Cost: a few `run` batches per step; O(cells of the data) in the pane.
 */
import type { BlockInputs, BlockRequest, CatalogueCall } from "../report/resultBlock";
import { formatAddress, LAST_COLUMN, LAST_ROW, parseAddress, rectsOverlap, type CellRect } from "./a1";
import { headerName, tablePlace, tallyCells, type CellTally, type TablePlace } from "./dataInfo";
import type { CellsRead, Host, SheetRect, TableInfo } from "./host";
import { blockRect, cellContents, filledCells, firstFreeColumn, type FilledCell } from "./placement";
import { blockPreview, blockSize, blockWrite, type BlockRefs, type PreviewRow } from "./preview";
import { absoluteReference, openEnded, structuredReference } from "./references";
import { CHART_ROWS, CHART_SPAN, chartColumn, chartProblem, chartQuestionProblem, planChart, type ChartColumn } from "./chartPlan";
import {
  companionNames,
  freeBlockName,
  freeName,
  onSheet,
  tableHeaderProblem,
  wordingName,
  wordingRequest,
  writeProblem,
  type BlockMark,
  type PlannedChart,
  type PlannedWrite,
} from "./writePlan";

/** A range as read for the pane. */
export interface AnalyzedRange {
  readonly sheet: string;
  /** The range as given (header row included when there is one). */
  readonly rect: CellRect;
  readonly values: readonly (readonly unknown[])[];
  /** A header name guessed from the first row, or the table column's name. */
  readonly header: string | null;
  readonly place: TablePlace;
}

export type Analysis = { readonly ok: true; readonly range: AnalyzedRange } | { readonly ok: false; readonly message: string };

/**
 * Reads a range the person named (or selected) and describes it. Whole
 * columns ("B:B") are cut to the sheet's used rows, so the pane never reads a
 * million blank cells.
 *
 * @example
 * await analyzeRange(host, "B1:B25"); // { ok: true, range: { sheet: "Paint line", header: "Thickness (µm)", place: { kind: "none" }, ... } }
 */
export async function analyzeRange(host: Host, text: string): Promise<Analysis> {
  const parsed = parseAddress(text);
  if (!parsed)
    return {
      ok: false,
      message: `“${text.trim()}” is not a range address; type one such as B1:B25, or select the cells and use the selection.`,
    };
  let address = text.trim();
  if (parsed.bottom === LAST_ROW) {
    const probe = await host.read(formatAddress({ ...parsed, bottom: parsed.top }, parsed.sheet));
    if (!probe) return { ok: false, message: "That sheet or range could not be read." };
    const used = await host.usedRect(probe.sheet);
    const bottom = used ? Math.max(parsed.top, used.bottom) : parsed.top;
    address = formatAddress({ ...parsed, bottom }, probe.sheet);
  }
  let read;
  try {
    read = await host.read(address);
  } catch {
    return { ok: false, message: `The range ${address} could not be read: check the sheet name.` };
  }
  if (!read) return { ok: false, message: "That sheet or range could not be read." };
  const tables = await host.tables(read.sheet);
  const place = tablePlace(read.rect, tables);
  const header = place.kind === "column" ? place.match.column : headerName(read.values);
  return { ok: true, range: { sheet: read.sheet, rect: read.rect, values: read.values, header, place } };
}

/** A range and whether its first row is taken as the header. */
export interface DataChoice {
  readonly range: AnalyzedRange;
  readonly useHeader: boolean;
}

/** The cells the test reads: the range without its header row (or the table column's data rows). */
export interface DataBody {
  readonly sheet: string;
  readonly rect: CellRect;
  readonly values: readonly (readonly unknown[])[];
  readonly name?: string;
  readonly tally: CellTally;
}

/**
 * The data rows of a choice.
 *
 * @example
 * bodyOf({ range, useHeader: true }).rect; // the range less its first row
 */
export function bodyOf(choice: DataChoice): DataBody {
  const { range } = choice;
  if (range.place.kind === "column") {
    const { match } = range.place;
    const values = match.headerIncluded ? range.values.slice(1) : range.values;
    return { sheet: range.sheet, rect: match.body, values, name: match.column, tally: tallyCells(values) };
  }
  if (choice.useHeader && range.header !== null && range.rect.bottom > range.rect.top) {
    const values = range.values.slice(1);
    return { sheet: range.sheet, rect: { ...range.rect, top: range.rect.top + 1 }, values, name: range.header, tally: tallyCells(values) };
  }
  return { sheet: range.sheet, rect: range.rect, values: range.values, tally: tallyCells(range.values) };
}

/**
 * A problem with the data as chosen (nothing to test, or pairs that do not line up), or null.
 *
 * @example
 * dataProblem([{ range, useHeader: true }]); // null when the range holds at least one number
 */
export function dataProblem(choices: readonly DataChoice[]): string | null {
  const bodies = choices.map(bodyOf);
  if (bodies.some((b) => b.tally.numbers === 0)) return "A range holds no numbers: there is nothing to test.";
  if (bodies.length === 2) {
    const [a, b] = bodies.map((body) => ({ rows: body.rect.bottom - body.rect.top + 1, columns: body.rect.right - body.rect.left + 1 }));
    if (a.rows !== b.rows || a.columns !== b.columns) {
      return `The two ranges must have the same shape to make pairs: the first has ${a.rows} × ${a.columns} data cells, the second ${b.rows} × ${b.columns}.`;
    }
    if (bodies[0].sheet === bodies[1].sheet && rectsOverlap(bodies[0].rect, bodies[1].rect))
      return "The two ranges overlap: pick two separate columns.";
  }
  return null;
}

export type ReferenceChoice = "exact" | "table" | "open";

export interface Availability {
  readonly available: boolean;
  /** Why not, when not. */
  readonly reason?: string;
}

export interface ReferenceOptions {
  /** Every range is already a whole table column: the block refers to the columns, nothing to choose. */
  readonly allTableColumns: boolean;
  readonly table: Availability;
  readonly open: Availability;
}

function adjacent(a: CellRect, b: CellRect): boolean {
  return a.top === b.top && a.bottom === b.bottom && (a.right + 1 === b.left || b.right + 1 === a.left);
}

/**
 * Which reference forms can be offered for the chosen ranges.
 *
 * @example
 * referenceOptions([{ range, useHeader: true }]); // { allTableColumns: false, table: { available: true }, open: { available: true } }
 */
export function referenceOptions(choices: readonly DataChoice[]): ReferenceOptions {
  const loose = choices.filter((c) => c.range.place.kind !== "column");
  if (loose.length === 0) return { allTableColumns: true, table: { available: false }, open: { available: false } };
  let table: Availability = { available: true };
  if (loose.some((c) => c.range.place.kind === "part"))
    table = { available: false, reason: "Part of the range is already inside a table." };
  else if (loose.some((c) => !c.useHeader || c.range.header === null)) {
    table = { available: false, reason: "A table needs a first row with a name for each column." };
  }
  let open: Availability = { available: true };
  const bodies = choices.map(bodyOf);
  if (loose.some((c) => c.range.place.kind === "part"))
    open = { available: false, reason: "The range is inside a table; refer to the table instead." };
  else if (bodies.length === 2 && bodies[0].rect.top !== bodies[1].rect.top) {
    open = { available: false, reason: "Both ranges must start on the same row to run on to the end of the sheet together." };
  }
  return { allTableColumns: false, table, open };
}

/**
 * The rectangles to turn into tables (header row included): two adjacent ranges become one table.
 *
 * @example
 * tablesToCreate([{ range: b, useHeader: true }, { range: c, useHeader: true }]); // [{ sheet: "Paint line", rect: B1:C25 }]
 */
export function tablesToCreate(choices: readonly DataChoice[]): { sheet: string; rect: CellRect }[] {
  const loose = choices.filter((c) => c.range.place.kind === "none").map((c) => ({ sheet: c.range.sheet, rect: c.range.rect }));
  if (loose.length === 2 && loose[0].sheet === loose[1].sheet && adjacent(loose[0].rect, loose[1].rect)) {
    const [a, b] = loose;
    return [
      {
        sheet: a.sheet,
        rect: {
          top: a.rect.top,
          bottom: a.rect.bottom,
          left: Math.min(a.rect.left, b.rect.left),
          right: Math.max(a.rect.right, b.rect.right),
        },
      },
    ];
  }
  return loose;
}

function createdColumn(range: AnalyzedRange, created: readonly TableInfo[]): { table: TableInfo; column: string } | null {
  for (const table of created) {
    if (
      table.sheet === range.sheet &&
      table.rect.top === range.rect.top &&
      range.rect.left >= table.rect.left &&
      range.rect.right <= table.rect.right
    ) {
      return { table, column: table.columns[range.rect.left - table.rect.left] };
    }
  }
  return null;
}

/**
 * The text of the reference the block's formulas use for one range.
 *
 * @example
 * referenceFor({ range, useHeader: true }, "open", [], "Paint line"); // "$B$2:$B$1048576"
 */
export function referenceFor(choice: DataChoice, reference: ReferenceChoice, created: readonly TableInfo[], formulaSheet: string): string {
  const { range } = choice;
  if (range.place.kind === "column") return structuredReference(range.place.match.table.name, range.place.match.column);
  if (reference === "table") {
    const made = createdColumn(range, created);
    if (made) return structuredReference(made.table.name, made.column);
  }
  const body = bodyOf(choice);
  return absoluteReference(reference === "open" ? openEnded(body.rect) : body.rect, body.sheet, formulaSheet);
}

/**
 * The references for the block (data, and second when paired).
 *
 * @example
 * blockRefs([{ range, useHeader: true }], "exact", [], "Paint line"); // { data: "$B$2:$B$25" }
 */
export function blockRefs(
  choices: readonly DataChoice[],
  reference: ReferenceChoice,
  created: readonly TableInfo[],
  formulaSheet: string,
): BlockRefs {
  const data = referenceFor(choices[0], reference, created, formulaSheet);
  return choices.length === 2 ? { data, second: referenceFor(choices[1], reference, created, formulaSheet) } : { data };
}

/**
 * The cell values the preview evaluates: the data rows of each range.
 *
 * @example
 * blockInputs([{ range, useHeader: true }]).data.length; // 24
 */
export function blockInputs(choices: readonly DataChoice[]): BlockInputs {
  const bodies = choices.map(bodyOf);
  return bodies.length === 2 ? { data: bodies[0].values, second: bodies[1].values } : { data: bodies[0].values };
}

/**
 * The default place of a block `height` rows tall and `width` columns wide (two: label and value; more for a
 * spilled table): the first empty area to the right of the data with an empty column before it, level with
 * the data's first row.
 *
 * @example
 * await defaultPlace(host, [{ range, useHeader: true }], 23); // { sheet: "Paint line", rect: { top: 0, left: 4, bottom: 22, right: 5 } }
 */
export async function defaultPlace(
  host: Host,
  choices: readonly DataChoice[],
  height: number,
  width = 2,
): Promise<{ sheet: string; rect: CellRect }> {
  const sheet = choices[0].range.sheet;
  const onSheet = choices.filter((c) => c.range.sheet === sheet).map((c) => c.range.rect);
  const top = Math.min(...onSheet.map((r) => r.top));
  const start = Math.max(...onSheet.map((r) => r.right)) + 2;
  const used = await host.usedRect(sheet);
  const stripRight = Math.max(start + width - 1, (used?.right ?? start) + 1);
  const strip = await host.read(formatAddress({ top, bottom: top + height - 1, left: start - 1, right: stripRight }, sheet));
  const column = strip ? firstFreeColumn(strip, start, width) : start;
  return { sheet, rect: blockRect({ row: top, column }, height, width) };
}

/**
 * Reads a place from what the person typed: its top-left cell, on the data's
 * sheet unless the text names another.
 *
 * @example
 * placeFromText("E1", "Paint line", 23); // { sheet: "Paint line", rect: { top: 0, left: 4, bottom: 22, right: 5 } }
 */
export function placeFromText(text: string, defaultSheet: string, height: number, width = 2): { sheet: string; rect: CellRect } | null {
  const parsed = parseAddress(text);
  if (!parsed) return null;
  return { sheet: parsed.sheet ?? defaultSheet, rect: blockRect({ row: parsed.top, column: parsed.left }, height, width) };
}

/**
 * The columns the chart plots: the data rows of each range (one, or two for pairs).
 *
 * @example
 * chartColumnsOf([{ range, useHeader: true }]); // [{ sheet: "Paint line", rect: B2:B25, values: [...], name: "Thickness (µm)" }]
 */
export function chartColumnsOf(choices: readonly DataChoice[]): ChartColumn[] {
  return choices.map((c) => {
    const body = bodyOf(c);
    return {
      sheet: body.sheet,
      rect: body.rect,
      values: body.values,
      ...(body.name === undefined ? {} : { name: wordingName(body.name) }),
    };
  });
}

/**
 * The structured reference of a one-sample chart's column when the block refers to a table column, so the
 * chart counts the table's rows as they grow; null otherwise (fixed cells, an open-ended range, or pairs).
 *
 * @example
 * chartTableReference([{ range, useHeader: true }], "table", [table1]); // "Table1[Thickness]"
 */
export function chartTableReference(
  choices: readonly DataChoice[],
  reference: ReferenceChoice,
  created: readonly TableInfo[],
): string | null {
  if (choices.length !== 1) return null;
  const { range } = choices[0];
  if (range.place.kind === "column") return structuredReference(range.place.match.table.name, range.place.match.column);
  const made = reference === "table" ? createdColumn(range, created) : null;
  return made ? structuredReference(made.table.name, made.column) : null;
}

/** Earlier blocks a block at `target` replaces: those it overlaps on the same sheet. */
function replacedBy(earlier: readonly BlockMark[], target: SheetRect): BlockMark[] {
  return earlier.filter((b) => sameSheet(b.sheet, target.sheet) && rectsOverlap(b.rect, target.rect));
}

/** Everything a write clears before writing: the replaced blocks and their charts' helper cells. */
function clearedBy(replaces: readonly BlockMark[]): SheetRect[] {
  return replaces.flatMap((b) => [{ sheet: b.sheet, rect: b.rect }, ...(b.helper ? [{ sheet: b.helper.sheet, rect: b.helper.rect }] : [])]);
}

/** What the person was shown and agreed to replace: the cells of the place (and of the earlier block it replaces) as they were listed. */
export interface Consent {
  readonly region: readonly SheetRect[];
  /** The filled cells as listed for the person. */
  readonly filled: readonly FilledCell[];
  /** Every filled cell with its whole content, to see whether anything changed since the listing. */
  readonly contents: readonly string[];
}

export interface WritePlan {
  readonly choices: readonly DataChoice[];
  readonly reference: ReferenceChoice;
  readonly request: BlockRequest;
  readonly target: SheetRect;
  readonly chart: boolean;
  /** The listing the person agreed to overwrite, or null when nothing was listed yet. */
  readonly consent: Consent | null;
  readonly calculate: CatalogueCall;
}

export type WriteOutcome =
  /** Filled cells to show before writing; `changed` when they differ from a listing the person had agreed to. */
  | { readonly kind: "confirm"; readonly consent: Consent; readonly changed: boolean }
  /** Nothing was done: the write would not work as planned. */
  | { readonly kind: "refused"; readonly message: string }
  /** The workbook refused part-way; what the write changed was put back (`clean`) or `message` says what remains. */
  | { readonly kind: "undone"; readonly message: string; readonly clean: boolean }
  | {
      readonly kind: "written";
      readonly address: string;
      readonly refs: BlockRefs;
      readonly created: readonly TableInfo[];
      readonly rows: readonly PreviewRow[];
      readonly chartAt: string | null;
      /** The chart's helper cells, which its lines read. */
      readonly helperCells: string | null;
      /** Earlier blocks this one replaced, whose regions were cleared. */
      readonly replaced: readonly BlockMark[];
    };

function headerRow(choices: readonly DataChoice[], table: SheetRect): string[] {
  const columns: string[] = [];
  for (let c = table.rect.left; c <= table.rect.right; c++) {
    const owner = choices.find(
      (choice) =>
        choice.range.sheet === table.sheet &&
        choice.range.rect.top === table.rect.top &&
        c >= choice.range.rect.left &&
        c <= choice.range.rect.right,
    );
    const cell = owner?.range.values[0]?.[c - owner.range.rect.left];
    columns.push(cell === undefined || cell === null ? "" : String(cell));
  }
  return columns;
}

function sameSheet(a: string, b: string): boolean {
  return a.toLowerCase() === b.toLowerCase();
}

/**
 * Plans the whole write without touching the workbook: the tables to make
 * (named now, so the formulas can refer to them), the block's cells and
 * formats with the names shortened in the wording, the chart, the block's
 * own defined name and the earlier blocks it replaces; then checks all of it
 * against Excel's limits (writePlan.ts).
 *
 * @example
 * planWrite(plan, ["Table1"], []); // { ok: true, write: { tables: [], blockName: "Evensplit_block_1", ... } }
 * planWrite({ ...plan, target: { sheet, rect: { top: 0, left: 16383, bottom: 19, right: 16384 } } }, [], []); // { ok: false, message: "The block does not fit ..." }
 */
export function planWrite(
  plan: WritePlan,
  taken: readonly string[],
  earlier: readonly BlockMark[],
  chartLeft = plan.target.rect.right + 2,
): { ok: true; write: PlannedWrite } | { ok: false; message: string } {
  const { target } = plan;
  const names = [...taken];
  const tables: TableInfo[] = [];
  if (plan.reference === "table") {
    for (const t of tablesToCreate(plan.choices)) {
      const columns = headerRow(plan.choices, t);
      const problem = tableHeaderProblem(columns);
      if (problem) return { ok: false, message: `${formatAddress(t.rect)} cannot become a table as it stands: ${problem}.` };
      const name = freeName("Table", names);
      names.push(name);
      tables.push({ name, sheet: t.sheet, rect: t.rect, columns });
    }
  }
  const refs = blockRefs(plan.choices, plan.reference, tables, target.sheet);
  const rows = blockPreview(wordingRequest(plan.request), blockInputs(plan.choices), refs, plan.calculate);
  // The block takes the size its rows give (a table by group takes a row per group) from the target's top-left cell.
  const size = blockSize(rows);
  const block = blockWrite(rows, target.sheet, blockRect({ row: target.rect.top, column: target.rect.left }, size.rows, size.columns));
  const blockName = freeBlockName(names);
  names.push(blockName);
  let chart: PlannedChart | null = null;
  if (plan.chart) {
    const columns = chartColumnsOf(plan.choices);
    const problem = chartQuestionProblem(plan.request) ?? chartProblem(columns);
    if (problem) return { ok: false, message: `${problem} Leave the chart out.` };
    const companions = companionNames(blockName);
    chart = planChart({
      request: wordingRequest(plan.request),
      columns,
      tableReference: chartTableReference(plan.choices, plan.reference, tables),
      block: { sheet: target.sheet, rect: block.rect },
      rows,
      left: chartLeft,
      chartName: companions.chart,
      helperName: companions.helper,
    });
  }
  const replaces = replacedBy(earlier, target);
  const write: PlannedWrite = { tables, refs, rows, block, chart, blockName, replaces };
  const problem = writeProblem(write);
  return problem ? { ok: false, message: problem } : { ok: true, write };
}

/**
 * Where the chart's helper cells start: the first columns right of the block where they and the chart fit on
 * cells that are empty or about to be cleared, level with the block (chartPlan.ts).
 */
async function chartLeftOf(host: Host, plan: WritePlan, target: SheetRect, cleared: readonly SheetRect[]): Promise<number> {
  const start = target.rect.right + 2;
  const used = await host.usedRect(target.sheet);
  const pairs = plan.choices.length === 2 ? bodyOf(plan.choices[0]).rect : null;
  const height = Math.max(CHART_ROWS, pairs ? pairs.bottom - pairs.top + 4 : 0);
  const right = Math.min(LAST_COLUMN, Math.max(start + CHART_SPAN, (used?.right ?? start) + 1));
  const bottom = Math.min(LAST_ROW, target.rect.top + height - 1);
  const strip = await host.read(formatAddress({ top: target.rect.top, bottom, left: start - 1, right }, target.sheet));
  return strip ? chartColumn(strip, start, cleared) : start;
}

function consentFor(region: readonly SheetRect[], reads: readonly CellsRead[]): Consent {
  const seen = new Set<string>();
  const filled: FilledCell[] = [];
  const contents: string[] = [];
  for (const read of reads) {
    const full = cellContents(read);
    filledCells(read).forEach((cell, i) => {
      if (seen.has(cell.address)) return;
      seen.add(cell.address);
      filled.push(cell);
      contents.push(full[i]);
    });
  }
  return { region, filled, contents };
}

function sameContents(a: Consent, b: Consent): boolean {
  return a.contents.length === b.contents.length && a.contents.every((c, i) => c === b.contents[i]);
}

function sameRegion(a: Consent, b: Consent): boolean {
  return (
    a.region.length === b.region.length &&
    a.region.every((r, i) => sameSheet(r.sheet, b.region[i].sheet) && formatAddress(r.rect) === formatAddress(b.region[i].rect))
  );
}

/**
 * What the person reads after a refused write. A table turned back into plain
 * cells keeps its look in Excel (the colours become the cells' own formats;
 * common practice of Excel's Convert to Range), which the pane cannot undo,
 * so the message says where.
 */
function undoneMessage(reason: string, left: readonly string[], unmade: readonly TableInfo[]): string {
  const tables = unmade.map((t) => formatAddress(t.rect, t.sheet)).join(" and ");
  const look =
    unmade.length === 0
      ? ""
      : ` The table made from ${tables} was turned back into plain cells; Excel may leave the table's colours on them.`;
  if (left.length === 0) {
    const what = unmade.length === 0 ? "the sheet holds exactly what it held before" : "every cell holds exactly what it held before";
    return `Excel refused part of the write (${reason}). Everything this write had changed was put back: ${what}, with no new table, chart or name.${look}`;
  }
  return `Excel refused part of the write (${reason}), and not all of it could be put back. The sheet now holds: ${left.join("; ")}. Check these before writing again.${look}`;
}

/**
 * Writes the block: refuses a place that covers the data or does not fit;
 * plans and checks the whole write; lists the filled cells of the place (and
 * of an earlier block it replaces) and asks first; then hands the plan to the
 * host, which writes it in one batch only if those cells are still exactly as
 * listed, and undoes it when the workbook refuses part-way.
 *
 * @example
 * const outcome = await writeResult(host, plan); // { kind: "confirm", consent: { filled: [{ address: "E3", content: "note" }], ... }, changed: false }
 * if (outcome.kind === "confirm") await writeResult(host, { ...plan, consent: outcome.consent });
 */
export async function writeResult(host: Host, plan: WritePlan): Promise<WriteOutcome> {
  const { target } = plan;
  if (!onSheet(target.rect)) {
    return {
      kind: "refused",
      message:
        "The block does not fit on the sheet there (1,048,576 rows, columns A to XFD): pick a top-left cell further up or to the left.",
    };
  }
  const covered = plan.choices.some((c) => sameSheet(c.range.sheet, target.sheet) && rectsOverlap(c.range.rect, target.rect));
  if (covered) return { kind: "refused", message: "The block would cover the data. Pick a place beside it." };
  const place = await host.read(formatAddress(target.rect, target.sheet));
  if (!place) return { kind: "refused", message: "The place for the block could not be read: check the sheet name." };
  const sheets = [...new Set([place.sheet, ...plan.choices.map((c) => c.range.sheet)])];
  const at = { sheet: place.sheet, rect: place.rect };
  const earlier = await host.blocks();
  const cleared = clearedBy(replacedBy(earlier, at));
  const chartLeft = plan.chart ? await chartLeftOf(host, plan, at, cleared) : undefined;
  const planned = planWrite({ ...plan, target: at }, await host.takenNames(sheets), earlier, chartLeft);
  if (!planned.ok) return { kind: "refused", message: planned.message };
  const { write } = planned;
  // The place read and listed must be exactly the block's: otherwise cells outside the listing would be written.
  if (formatAddress(write.block.rect) !== formatAddress(place.rect)) {
    return { kind: "refused", message: "The block's size changed since the place was chosen (the data changed): press Write again." };
  }
  const helper = write.chart ? [{ sheet: write.chart.sheet, rect: write.chart.helper.rect }] : [];
  const region: SheetRect[] = [at, ...helper, ...cleared];
  const reads: CellsRead[] = [place];
  for (const part of region.slice(1)) {
    const read = await host.read(formatAddress(part.rect, part.sheet));
    if (read) reads.push(read);
  }
  const listing = consentFor(region, reads);
  const agreed = plan.consent !== null && sameRegion(plan.consent, listing) && sameContents(plan.consent, listing);
  if (listing.filled.length > 0 && !agreed) return { kind: "confirm", consent: listing, changed: plan.consent !== null };
  const report = await host.applyWrite(write, region, (current) => sameContents(consentFor(region, current), listing));
  if (report.kind === "changed") return { kind: "confirm", consent: consentFor(region, report.current), changed: true };
  if (report.kind === "undone")
    return { kind: "undone", message: undoneMessage(report.reason, report.left, report.unmade), clean: report.left.length === 0 };
  const chartAt = write.chart ? formatAddress({ ...write.chart.area, bottom: write.chart.area.top, right: write.chart.area.left }) : null;
  return {
    kind: "written",
    address: formatAddress(place.rect, place.sheet),
    refs: write.refs,
    created: write.tables,
    rows: write.rows,
    chartAt,
    helperCells: write.chart ? formatAddress(write.chart.helper.rect) : null,
    replaced: write.replaces,
  };
}
