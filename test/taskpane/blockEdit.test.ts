/**
 * Reading a written block back (blockEdit.ts): the arguments of its
 * formulas, the question and settings they hold, and the block holding a
 * selected cell. The formulas are the ones the block's one definition writes
 * (resultBlock.ts through preview.ts), so a change there that this reading
 * cannot follow fails here.
 */
import { describe, expect, it } from "vitest";
import { demoRows } from "../../src/demo/inventedData";
import { callFunction } from "../../src/functions/functions";
import type { BlockRequest } from "../../src/report/resultBlock";
import { blockAt, callArguments, readBlock } from "../../src/taskpane/blockEdit";
import { blockPreview, blockWrite } from "../../src/taskpane/preview";

const data = demoRows()
  .slice(1)
  .map((r) => [r[1]]);
const second = demoRows()
  .slice(1)
  .map((r) => [r[2]]);

function written(request: BlockRequest, refs: { data: string; second?: string }): string[][] {
  const rows = blockPreview(request, request.paired ? { data, second } : { data }, refs, callFunction);
  return blockWrite(rows, "Paint line", { top: 0, left: 4, bottom: rows.length - 1, right: 5 }).formulas;
}

describe("formula arguments", () => {
  it("splits at top-level commas, keeping quoted text, structured references and nested calls whole", () => {
    expect(callArguments('=IF(EVENSPLIT.PVALUE(Table1[[Thickness (µm)]],50,"say ""hi"", then","drop")<=0.05,"a","b")')).toEqual({
      name: "PVALUE",
      args: [
        { kind: "reference", text: "Table1[[Thickness (µm)]]" },
        { kind: "number", value: 50 },
        { kind: "text", value: 'say "hi", then' },
        { kind: "text", value: "drop" },
      ],
    });
    expect(callArguments("=COUNT($B$2:$B$25)")).toBeNull();
  });
});

describe("a block read back", () => {
  it("gives the sign test's question and settings", () => {
    const request: BlockRequest = {
      test: "sign",
      paired: false,
      center: 50.5,
      alternative: "greater",
      alpha: 0.01,
      confidence: 0.9,
      ties: "conservative",
      method: "midp",
      dataName: "Thickness (µm)",
    };
    expect(readBlock(written(request, { data: "Table1[[Thickness (µm)]]" }))).toMatchObject({
      test: "sign",
      paired: false,
      references: ["Table1[[Thickness (µm)]]"],
      center: 50.5,
      alternative: "greater",
      ties: "conservative",
      signMethod: "midp",
      alpha: 0.01,
    });
    expect(readBlock(written(request, { data: "$B$2:$B$25" }))?.confidences).toContain(0.9);
  });

  it("gives the paired signed-rank test's two references and its zero rule", () => {
    const request: BlockRequest = {
      test: "signed-rank",
      paired: true,
      center: -1,
      alternative: "less",
      alpha: 0.05,
      confidence: 0.95,
      method: "exact",
      zeros: "pratt",
      dataName: "A",
      secondName: "B",
    };
    expect(readBlock(written(request, { data: "$B$2:$B$25", second: "$C$2:$C$25" }))).toMatchObject({
      test: "signed-rank",
      paired: true,
      references: ["$B$2:$B$25", "$C$2:$C$25"],
      center: -1,
      alternative: "less",
      rankMethod: "exact",
      zeros: "pratt",
      ties: null,
    });
  });

  it("gives the quantile test's quantile, and refuses what is not a block", () => {
    const request: BlockRequest = {
      test: "quantile",
      paired: false,
      center: 53,
      quantile: 0.9,
      alternative: "less",
      alpha: 0.05,
      confidence: 0.95,
      dataName: "A",
    };
    expect(readBlock(written(request, { data: "$B$2:$B$1048576" }))).toMatchObject({
      test: "quantile",
      quantile: 0.9,
      center: 53,
      references: ["$B$2:$B$1048576"],
    });
    expect(
      readBlock([
        ["Panel", "Thickness"],
        ["P-101", 51.8],
      ]),
    ).toBeNull();
  });

  it("finds the block holding a selected cell, on its sheet only", () => {
    const blocks = [{ name: "Evensplit_block_1", sheet: "Paint line", rect: { top: 0, left: 4, bottom: 21, right: 5 } }];
    expect(blockAt(blocks, "paint line", { top: 4, left: 5, bottom: 4, right: 5 })?.name).toBe("Evensplit_block_1");
    expect(blockAt(blocks, "Paint line", { top: 22, left: 5, bottom: 22, right: 5 })).toBeNull();
    expect(blockAt(blocks, "Summary", { top: 4, left: 5, bottom: 4, right: 5 })).toBeNull();
  });
});
