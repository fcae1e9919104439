/**
 * "Copy as text": the result as a person would paste it into a report — one
 * sentence with the test, n (and what was left out), the statistic, the p,
 * the decision and the bounds with their coverage — followed by every row of
 * the block, as plain text (label, tab, value) and as an HTML table.
 *
 * Method: the values are the preview's, as the sheet's number formats show
 * them (preview.ts), so the copy says exactly what the block says. Workbook
 * text (header names) reaches the HTML escaped.
 *
 * Cost: O(rows of the block).
 */
import type { BlockRequest } from "../report/resultBlock";
import type { PreviewRow } from "./preview";

/**
 * Text made safe to place inside HTML.
 *
 * @example
 * escapeHtml("<Before & after>"); // "&lt;Before &amp; after&gt;"
 */
export function escapeHtml(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

function lowerFirst(text: string): string {
  return text.length > 0 ? `${text[0].toLowerCase()}${text.slice(1)}` : text;
}

function methodWord(method: string): string {
  if (/watching p-value/i.test(method)) return "watching";
  if (/normal/i.test(method)) return "normal-approximation";
  if (/mid-p/i.test(method)) return "mid-p";
  return "exact";
}

function boundsWords(rows: (key: string) => PreviewRow | undefined): string {
  const lower = rows("lower");
  const upper = rows("upper");
  const coverage = rows("coverage")?.shown ?? "";
  const has = (row: PreviewRow | undefined): row is PreviewRow => row !== undefined && row.shown !== "" && typeof row.value === "number";
  const covered = coverage === "" ? "" : `, exact coverage ${coverage}`;
  if (has(lower) && has(upper)) return `${lower.label.replace(/: lower$/, "")}: ${lower.shown} to ${upper.shown}${covered}`;
  const one = has(lower) ? lower : has(upper) ? upper : null;
  if (one) return `${one.label}: ${one.shown}${covered}`;
  return "no bounds at this confidence level for these data";
}

/**
 * The report sentence for a previewed block.
 *
 * @example
 * reportSentence(request, rows);
 * // "Sign test, one sample, H1: the median of Thickness (µm) ≠ 50: n = 21 of 22 numbers (1 equal to 50 left out);
 * //  sign statistic (larger of the two counts) 16; exact p = 0.026603699; Reject H0: ... at alpha = 0.05.
 * //  95% bounds for the median: 50 to 52.7, exact coverage 98.31%."
 */
export function reportSentence(request: BlockRequest, previewRows: readonly PreviewRow[]): string {
  if (request.test === "two-groups" || request.test === "groups") return groupSentence(request, previewRows);
  const row = (key: string): PreviewRow | undefined => previewRows.find((r) => r.key === key);
  const shown = (key: string): string => row(key)?.shown ?? "";
  const total = Number(row(request.paired ? "pairs" : "numbers")?.value);
  const used = Number(row("used")?.value);
  const tied = Number(row("tied")?.value);
  const what = request.paired ? "complete pairs" : "numbers";
  const center = String(request.center);
  const ties = tied > 0 ? ` (${tied} equal to ${center} ${used === total - tied ? "left out" : "kept by the tie rule"})` : "";
  const statistic = row("statistic");
  const estimate = row("estimate");
  const parts = [
    `n = ${shown("used")} of ${shown(request.paired ? "pairs" : "numbers")} ${what}${ties}`,
    ...(statistic ? [`${lowerFirst(statistic.label)} ${statistic.shown}`] : []),
    `${methodWord(shown("method"))} p = ${shown("pvalue")}`,
    `${shown("decision")} at alpha = ${request.alpha}`,
  ];
  const estimateWords = estimate && estimate.shown !== "" ? ` ${estimate.label} ${estimate.shown};` : "";
  return `${shown("title")}, H1: ${shown("h1")}: ${parts.join("; ")}.${estimateWords} ${boundsWords(row)}.`;
}

/**
 * The report sentence for groups. Two groups: both counts and medians, the p-value and decision, the shift
 * with its bounds (read as a shift only for groups of the same shape). Several groups: the count, the
 * p-value and decision, then each group's count and median from the table by group.
 *
 * @example
 * groupSentence(twoGroupRequest, rows);
 * // "Two groups, Wilcoxon–Mann–Whitney rank-sum test, H1: ...: n = 9 and 11; medians 50.4 and 51.7; p = 0.0012; Reject H0: ... at alpha = 0.05.
 * //  Shift estimate ... 1.2, 95% bounds 0.6 to 1.9 (exact coverage 95.12%; a shift for groups of the same shape)."
 */
export function groupSentence(request: BlockRequest, previewRows: readonly PreviewRow[]): string {
  const shown = (key: string): string => previewRows.find((r) => r.key === key)?.shown ?? "";
  const start = `${shown("title")}, H1: ${shown("h1")}`;
  const decision = `p = ${shown("pvalue")}; ${shown("decision")} at alpha = ${request.alpha}`;
  if (request.test === "two-groups") {
    const estimate = previewRows.find((r) => r.key === "estimate");
    const bounds =
      shown("lower") !== "" && shown("upper") !== ""
        ? `, ${percent(request.confidence)} bounds ${shown("lower")} to ${shown("upper")} (exact coverage ${shown("coverage")}; a shift for groups of the same shape)`
        : ", no bounds at this confidence level for these data";
    const shift = estimate && estimate.shown !== "" ? ` ${estimate.label} ${estimate.shown}${bounds}.` : "";
    return `${start}: n = ${shown("firstNumbers")} and ${shown("secondNumbers")}; medians ${shown("firstMedian")} and ${shown("secondMedian")}; ${decision}.${shift}`;
  }
  const table = previewRows.find((r) => r.table !== undefined)?.table?.shown ?? [];
  const groups = table
    .slice(1)
    .filter((cells) => cells[2] !== "")
    .map((cells) => `${cells[0]} n = ${cells[1]}, median ${cells[2]}`);
  const byGroup = groups.length > 0 ? ` By group: ${groups.join("; ")}.` : "";
  return `${start}: n = ${shown("numbers")}; ${decision}.${byGroup}`;
}

function percent(fraction: number): string {
  return `${Number((fraction * 100).toPrecision(12))}%`;
}

/** The rows of a spilled table as text: one line per row, cells separated by tabs. */
function tableText(shown: readonly (readonly string[])[]): string[] {
  return shown.map((cells) => cells.join("\t"));
}

/**
 * The clipboard's two forms of the result: the sentence, then each row.
 *
 * @example
 * reportCopy(request, rows).text.split("\n")[2]; // "Question\tIs the median of Thickness (µm) different from 50?"
 */
export function reportCopy(request: BlockRequest, previewRows: readonly PreviewRow[]): { text: string; html: string } {
  const sentence = reportSentence(request, previewRows);
  const value = (row: PreviewRow): string => (row.message ? `${row.shown} (${row.message})` : row.shown);
  const text = [
    sentence,
    "",
    ...previewRows.flatMap((row) => (row.table ? tableText(row.table.shown) : [`${row.label}\t${value(row)}`])),
  ].join("\n");
  const cells = previewRows
    .map((row) =>
      row.table
        ? `<tr><td colspan="2"><table>${row.table.shown.map((r) => `<tr>${r.map((cell) => `<td>${escapeHtml(cell)}</td>`).join("")}</tr>`).join("")}</table></td></tr>`
        : `<tr><th>${escapeHtml(row.label)}</th><td>${escapeHtml(value(row))}</td></tr>`,
    )
    .join("");
  const html = `<p>${escapeHtml(sentence)}</p><table>${cells}</table>`;
  return { text, html };
}
