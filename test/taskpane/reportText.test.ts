/**
 * "Copy as text": one report sentence (test, n with ties left out,
 * statistic, p, decision, bounds with coverage) followed by the block's
 * rows, as plain text and as an HTML table. Values are the preview's as the
 * sheet shows them, on the invented paint-line data (counts by hand from
 * src/demo/inventedData.ts: 16 above 50, 5 below, one tie).
 */
import { describe, expect, it } from "vitest";
import { demoRows } from "../../src/demo/inventedData";
import { callFunction } from "../../src/functions/functions";
import type { BlockRequest } from "../../src/report/resultBlock";
import { blockPreview } from "../../src/taskpane/preview";
import { escapeHtml, reportCopy, reportSentence } from "../../src/taskpane/reportText";

const data = demoRows()
  .slice(1)
  .map((r) => [r[1]]);
const second = demoRows()
  .slice(1)
  .map((r) => [r[2]]);
const SIGN: BlockRequest = {
  test: "sign",
  paired: false,
  center: 50,
  alternative: "two-sided",
  alpha: 0.05,
  confidence: 0.95,
  ties: "drop",
  method: "exact",
  dataName: "Thickness (µm)",
};
const signRows = blockPreview(SIGN, { data }, { data: "$B$2:$B$25" }, callFunction);

describe("the report sentence", () => {
  it("names the test, n with the ties left out, the statistic, the exact p, the decision and the bounds with coverage", () => {
    const shown = (key: string): string => signRows.find((r) => r.key === key)?.shown ?? "";
    const sentence = reportSentence(SIGN, signRows);
    expect(sentence.startsWith("Sign test, one sample")).toBe(true);
    expect(sentence).toContain("n = 21 of 22 numbers (1 equal to 50 left out)");
    expect(sentence).toContain("sign statistic (larger of the two counts) 16");
    expect(sentence).toContain(`exact p = ${shown("pvalue")}`);
    expect(sentence).toContain(shown("decision"));
    expect(sentence).toContain(`95% bounds for the median: ${shown("lower")} to ${shown("upper")}, exact coverage ${shown("coverage")}`);
  });

  it("gives a one-sided bound alone, and the estimate of the signed-rank test", () => {
    const request: BlockRequest = {
      test: "signed-rank",
      paired: true,
      center: 0,
      alternative: "greater",
      alpha: 0.05,
      confidence: 0.95,
      method: "auto",
      zeros: "drop",
      dataName: "A",
      secondName: "B",
    };
    const rows = blockPreview(request, { data, second }, { data: "$B$2:$B$25", second: "$C$2:$C$25" }, callFunction);
    const sentence = reportSentence(request, rows);
    // By hand: 22 complete pairs, one difference of 0 left out.
    expect(sentence).toContain("n = 21 of 22 complete pairs (1 equal to 0 left out)");
    expect(sentence).toContain("Hodges–Lehmann estimate");
    expect(sentence).toMatch(/95% lower bound for the centre of the differences \(one-sided\): -?[0-9.]+, exact coverage/);
    expect(sentence).not.toContain(" to ,");
  });
});

describe("the copied text", () => {
  it("puts the sentence first, then every row, as text and as an HTML table", () => {
    const copy = reportCopy(SIGN, signRows);
    const lines = copy.text.split("\n");
    expect(lines[0]).toBe(reportSentence(SIGN, signRows));
    expect(lines).toContain(`p-value\t${signRows.find((r) => r.key === "pvalue")?.shown}`);
    expect(lines.filter((l) => l.includes("\t"))).toHaveLength(signRows.length);
    expect(copy.html).toContain("<table>");
    expect(copy.html.match(/<tr>/g)).toHaveLength(signRows.length);
    expect(copy.html).toContain("<th>Assumptions</th>");
  });

  it("escapes workbook text in the HTML", () => {
    expect(escapeHtml(`<b>"A" & 'B'</b>`)).toBe("&lt;b&gt;&quot;A&quot; &amp; &#39;B&#39;&lt;/b&gt;");
  });
});
