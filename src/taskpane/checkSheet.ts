/**
 * The installation check as a sheet of its own: what the pane's "Check this
 * installation" writes, so that a lab can keep it with the workbook as a
 * record. Each reference case (src/report/installationCheck.ts) becomes a row
 * whose answer is a live EVENSPLIT formula, calculated by the functions
 * installed in this Excel, beside its expected value, the difference and a
 * pass/fail formula with the case's tolerance, and its source. Above them:
 * the Evensplit version, Excel's version and platform as
 * Office.context.diagnostics reports them (Microsoft, "Office.ContextInformation
 * interface": host, platform, version), whether this page runs the exact
 * signed-rank step in WebAssembly or falls back to JavaScript (a webview that
 * refuses WebAssembly gives the same results more slowly), and the moment of checking, written as
 * fixed text rather than a volatile NOW(), so the record keeps it. Below: the
 * count of cases that pass and the cautions.
 *
 * Method: the layout is plain data (`checkSheetContent`); the host adds the
 * sheet and writes it in one batch (host.ts, addSheet).
 *
 * Cost: O(number of cases).
 */
import { caseFormula, type ReferenceCase } from "../report/installationCheck";
import { auditTime } from "../report/resultBlock";
import type { SubsetSumEngine } from "../stats/subsetSumStep";
import type { Host, SheetContent, SheetReport } from "./host";

/** The new sheet's name, made unique with " (2)", " (3)", … when the workbook has it already. */
export const CHECK_SHEET_NAME = "Evensplit check";

/** Words the record shows for something the host did not report. */
export const NOT_REPORTED = "not reported";

/** What Office.context.diagnostics offers, as far as the check reads it; anything may be missing. */
export interface DiagnosticsLike {
  readonly version?: unknown;
  readonly platform?: unknown;
}

/** What the record states about where it was made. */
export interface CheckFacts {
  readonly evensplitVersion: string;
  /** Excel's version as the host reports it, or null. */
  readonly excelVersion: string | null;
  /** The platform as the host reports it, or null. */
  readonly platform: string | null;
  /** Where the exact signed-rank distribution's inner loop runs in this page (src/stats/subsetSumStep.ts). */
  readonly exactStep: SubsetSumEngine["name"];
  readonly checkedAt: Date;
}

/** The exact step's engine in words: the JavaScript one is the slow fallback, so the record says why it matters. */
export const EXACT_STEP_WORDS: Record<SubsetSumEngine["name"], string> = {
  webassembly: "WebAssembly",
  javascript: "JavaScript: WebAssembly is not available in this Excel, so exact signed-rank p-values take longer (same results)",
};

/** Office.PlatformType values in words (Microsoft, "Office.PlatformType enum"). */
const PLATFORM_WORDS: Record<string, string> = {
  PC: "Excel on Windows",
  OfficeOnline: "Excel on the web",
  Mac: "Excel on a Mac",
  iOS: "Excel on iPad or iPhone",
  Android: "Excel on Android",
  Universal: "Excel as a Windows universal app",
};

function reported(value: unknown): string | null {
  return typeof value === "string" && value.trim() !== "" ? value.trim() : null;
}

/**
 * Excel's version and platform from Office.context.diagnostics; null for what it does not report.
 *
 * @example
 * environmentFrom({ version: "16.0.17928.20114", platform: "PC" }); // { excelVersion: "16.0.17928.20114", platform: "PC (Excel on Windows)" }
 * environmentFrom(undefined); // { excelVersion: null, platform: null }
 */
export function environmentFrom(diagnostics: DiagnosticsLike | null | undefined): { excelVersion: string | null; platform: string | null } {
  const platform = reported(diagnostics?.platform);
  const words = platform === null ? undefined : PLATFORM_WORDS[platform];
  return { excelVersion: reported(diagnostics?.version), platform: words ? `${platform} (${words})` : platform };
}

/**
 * A sheet name not yet in the workbook: `base`, else `base (2)`, `base (3)`, … compared without regard to
 * case, as Excel compares sheet names; the base is shortened when the suffix would pass Excel's 31 characters.
 *
 * @example
 * uniqueSheetName("Evensplit check", ["Sheet1", "evensplit check"]); // "Evensplit check (2)"
 */
export function uniqueSheetName(base: string, taken: readonly string[]): string {
  const used = new Set(taken.map((name) => name.toLowerCase()));
  for (let n = 1; ; n++) {
    const suffix = n === 1 ? "" : ` (${n})`;
    const name = `${base.slice(0, 31 - suffix.length).trimEnd()}${suffix}`;
    if (!used.has(name.toLowerCase())) return name;
  }
}

/** Columns of the case table, in order. */
export const CHECK_COLUMNS = [
  "Case",
  "What is computed",
  "Answer on this installation",
  "Expected",
  "Difference",
  "Tolerance",
  "Result",
  "Source of the expected value",
] as const;

/** Column widths in points (about 5.3 points a character of the default font; common practice). */
const COLUMN_WIDTHS = [130, 330, 150, 110, 70, 60, 45, 700];

/** Rows above the case table: title, five facts, the outcome, a blank row. */
const FIRST_TABLE_ROW = 8;

/** The cautions that close the sheet. */
export const CHECK_CAUTIONS = [
  "This check supports, but does not replace, the laboratory's own qualification of the software under its quality system and local rules: have it reviewed and approved as those require.",
  "Each answer is calculated live by the Evensplit functions installed in this Excel, so the sheet checks the installation it is opened in; check again after Excel or Evensplit is updated, and before relying on results.",
  "Expected values come from exact arithmetic written out beside them or from the published tables named there; a table value marked 'from memory' was recalled, not re-read.",
  "Save the workbook to keep this sheet as a record; the facts above (version, platform, time) are fixed text and do not change.",
];

function column(index: number): string {
  return String.fromCharCode(65 + index);
}

/** Where the parts of the sheet are, 0-based rows; for the tests and the pane's message. */
export interface CheckLayout {
  readonly outcomeRow: number;
  readonly headerRow: number;
  readonly firstCaseRow: number;
  readonly lastCaseRow: number;
  readonly passedRow: number;
  readonly checkedRow: number;
  /** 0-based column of the pass/fail formulas. */
  readonly resultColumn: number;
}

/**
 * The check sheet's cells from A1: formulas and values row by row, number formats, bold and italic rows,
 * column widths, and where each part lies.
 *
 * @example
 * const facts = { evensplitVersion: "0.1.0", excelVersion: null, platform: null, exactStep: "webassembly", checkedAt: new Date() } as const;
 * checkSheetContent(REFERENCE_CASES, facts).formulas[9][2];
 * // '=EVENSPLIT.PVALUE({51;52;53},50,"greater")'
 */
export function checkSheetContent(cases: readonly ReferenceCase[], facts: CheckFacts): SheetContent & { readonly layout: CheckLayout } {
  const width = CHECK_COLUMNS.length;
  const headerRow = FIRST_TABLE_ROW;
  const firstCaseRow = headerRow + 1;
  const lastCaseRow = firstCaseRow + cases.length - 1;
  const passedRow = lastCaseRow + 1;
  const checkedRow = passedRow + 1;
  const resultColumn = CHECK_COLUMNS.indexOf("Result");
  const results = `${column(resultColumn)}${firstCaseRow + 1}:${column(resultColumn)}${lastCaseRow + 1}`;
  const passedCell = `${column(resultColumn)}${passedRow + 1}`;
  const checkedCell = `${column(resultColumn)}${checkedRow + 1}`;

  const rows: (string | number)[][] = [];
  const formats: string[][] = [];
  const add = (cells: (string | number)[], cellFormats: string[] = []): void => {
    rows.push([...cells, ...Array<string>(width - cells.length).fill("")]);
    formats.push(Array.from({ length: width }, (_, c) => cellFormats[c] ?? "General"));
  };
  // Facts as text ("@"), so a version such as 16.0 stays as reported instead of becoming a number.
  const fact = (label: string, value: string): void => add([label, value], ["General", "@"]);

  add(["Evensplit installation check"]);
  fact("Evensplit version", facts.evensplitVersion);
  fact("Excel version", facts.excelVersion ?? NOT_REPORTED);
  fact("Platform", facts.platform ?? NOT_REPORTED);
  fact("Exact signed-rank step", EXACT_STEP_WORDS[facts.exactStep]);
  fact("Checked at", auditTime(facts.checkedAt));
  const outcomeRow = rows.length;
  add([
    "Outcome",
    `=IF(${passedCell}=${checkedCell},"Every case passes","Not every case passes: see the rows marked fail, and do not rely on this installation until they are understood")`,
  ]);
  add([]);
  add([...CHECK_COLUMNS]);
  cases.forEach((reference, i) => {
    const row = firstCaseRow + i + 1;
    add(
      [
        reference.id,
        reference.what,
        caseFormula(reference),
        reference.expected,
        `=C${row}-D${row}`,
        reference.tolerance,
        `=IFERROR(IF(ABS(E${row})<=F${row},"pass","fail"),"fail")`,
        reference.source,
      ],
      ["General", "General", "General", "General", "0.00E+00", "0.0E+00", "General", "General"],
    );
  });
  add(["Cases that pass", "", "", "", "", "", `=COUNTIF(${results},"pass")`]);
  add(["Cases checked", "", "", "", "", "", `=ROWS(${results})`]);
  add([]);
  const firstCaution = rows.length;
  for (const caution of CHECK_CAUTIONS) add([caution]);

  return {
    formulas: rows,
    numberFormats: formats,
    boldRows: [0, outcomeRow, headerRow, passedRow],
    italicRows: CHECK_CAUTIONS.map((_, i) => firstCaution + i),
    columnWidths: COLUMN_WIDTHS,
    layout: { outcomeRow, headerRow, firstCaseRow, lastCaseRow, passedRow, checkedRow, resultColumn },
  };
}

/**
 * Adds the check sheet to the workbook in one batch and says what happened, in words for the pane.
 *
 * @example
 * const said = await writeCheckSheet(host, REFERENCE_CASES, facts); // { written: true, message: "The installation check was written to …" }
 */
export async function writeCheckSheet(
  host: Host,
  cases: readonly ReferenceCase[],
  facts: CheckFacts,
): Promise<{ readonly report: SheetReport; readonly message: string }> {
  const content = checkSheetContent(cases, facts);
  const report = await host.addSheet((taken) => uniqueSheetName(CHECK_SHEET_NAME, taken), content);
  if (report.kind === "written") {
    return {
      report,
      message: `The installation check was written to the new sheet “${report.sheet}”: its ${cases.length} cases are calculated there by the installed functions, and its Outcome line says whether every one passes. Save the workbook to keep the sheet as a record.`,
    };
  }
  const left = report.left ? ` ${report.left}` : "";
  return { report, message: `No check sheet was written: ${report.reason}.${left}` };
}
