/**
 * The manifest asks for the Excel JavaScript API version that the pane's
 * workbook access really needs, no more and no less.
 *
 * Every member of the structural types in src/taskpane/host.ts (the only
 * module that touches the workbook) is looked up in the platform's own type
 * definitions, node_modules/@types/office-js/index.d.ts, whose doc comments
 * carry each member's requirement set ("[Api set: ExcelApi 1.9]"), as
 * Microsoft's Excel JavaScript API reference does. The highest of them must be
 * the ExcelApi version manifest.xml declares (Microsoft, "Specify Office
 * applications and API requirements": a Set in the manifest's Requirements
 * keeps the add-in off hosts without it).
 */
import { readFileSync } from "node:fs";
import ts from "typescript";
import { describe, expect, it } from "vitest";

const HOST = new URL("../../src/taskpane/host.ts", import.meta.url);
const OFFICE_TYPES = new URL("../../node_modules/@types/office-js/index.d.ts", import.meta.url);
const MANIFEST = new URL("../../manifest.xml", import.meta.url);

/** Which Excel class each structural type of host.ts (and each nested member) stands for. */
const EXCEL_CLASS: Record<string, string> = {
  HostFont: "RangeFont",
  HostRange: "Range",
  "HostRange.format": "RangeFormat",
  HostTableColumn: "TableColumn",
  HostTable: "Table",
  "HostTable.columns": "TableColumnCollection",
  HostChart: "Chart",
  "HostChart.title": "ChartTitle",
  "HostChart.series": "ChartSeriesCollection",
  "HostChart.axes": "ChartAxes",
  "HostChart.legend": "ChartLegend",
  HostChartSeries: "ChartSeries",
  "HostChartSeries.format": "ChartSeriesFormat",
  "HostChartSeries.format.line": "ChartLineFormat",
  HostChartAxis: "ChartAxis",
  "HostChartAxis.title": "ChartAxisTitle",
  HostNamedItem: "NamedItem",
  HostWorksheet: "Worksheet",
  "HostWorksheet.tables": "TableCollection",
  "HostWorksheet.charts": "ChartCollection",
  HostContext: "RequestContext",
  "HostContext.workbook": "Workbook",
  "HostContext.workbook.worksheets": "WorksheetCollection",
  "HostContext.workbook.names": "NamedItemCollection",
  "HostContext.workbook.tables": "TableCollection",
};

/** Members every Office.js client object inherits (OfficeExtension), not declared in the Excel classes themselves. */
const INHERITED = new Set(["load", "isNullObject", "sync"]);

/** The entry point of the API, whose comment in the definitions names no set: ExcelApi 1.1 brought Excel.run and its context's workbook. */
const ENTRY_POINTS: Record<string, string> = { "RequestContext.workbook": "1.1" };

/** The interfaces of host.ts that describe the workbook (not the pane's own `Host` operations). */
function hostMembers(): { owner: string; member: string }[] {
  const source = ts.createSourceFile("host.ts", readFileSync(HOST, "utf8"), ts.ScriptTarget.ES2020, true);
  const found: { owner: string; member: string }[] = [];
  const walk = (owner: string, members: ts.NodeArray<ts.TypeElement>): void => {
    for (const m of members) {
      if (!m.name || !ts.isIdentifier(m.name)) continue;
      found.push({ owner, member: m.name.text });
      if (ts.isPropertySignature(m) && m.type && ts.isTypeLiteralNode(m.type)) walk(`${owner}.${m.name.text}`, m.type.members);
    }
  };
  source.forEachChild((node) => {
    if (ts.isInterfaceDeclaration(node) && node.name.text.startsWith("Host") && node.name.text !== "Host")
      walk(node.name.text, node.members);
  });
  return found;
}

/**
 * Requirement set per "Class.member" of namespace Excel in the platform's type
 * definitions; a member whose comment names none (a collection's `items`)
 * has its class's set. Parsed once: the file is large.
 */
let parsedSets: Map<string, string> | undefined;
function excelRequirementSets(): Map<string, string> {
  if (parsedSets) return parsedSets;
  const source = ts.createSourceFile("index.d.ts", readFileSync(OFFICE_TYPES, "utf8"), ts.ScriptTarget.ES2020, true);
  const setIn = (node: ts.Node): string | undefined => {
    const docs = ts
      .getJSDocCommentsAndTags(node)
      .map((d) => d.getText(source))
      .join("\n");
    return /Api set: ExcelApi (\d+\.\d+)/.exec(docs)?.[1];
  };
  const sets = new Map<string, string>();
  source.forEachChild((node) => {
    if (!ts.isModuleDeclaration(node) || node.name.getText(source) !== "Excel" || !node.body || !ts.isModuleBlock(node.body)) return;
    for (const statement of node.body.statements) {
      if (!ts.isClassDeclaration(statement) || !statement.name) continue;
      const classSet = setIn(statement);
      for (const member of statement.members) {
        if (!member.name || !ts.isIdentifier(member.name)) continue;
        const set = setIn(member) ?? classSet;
        if (set === undefined) continue;
        const key = `${statement.name.text}.${member.name.text}`;
        // Overloads repeat a member; keep the lowest set any of them names.
        const known = sets.get(key);
        if (known === undefined || version(set) < version(known)) sets.set(key, set);
      }
    }
  });
  parsedSets = sets;
  return sets;
}

function version(set: string): number {
  const [major, minor] = set.split(".").map(Number);
  return major * 1000 + minor;
}

function declaredExcelApi(): string | undefined {
  return /<Set\s+Name="ExcelApi"\s+MinVersion="(\d+\.\d+)"\s*\/>/.exec(readFileSync(MANIFEST, "utf8"))?.[1];
}

describe("the Excel API requirement set", () => {
  it("declared in the manifest is the highest set among the members the pane uses", () => {
    const sets = excelRequirementSets();
    const needed: { use: string; set: string }[] = [];
    for (const { owner, member } of hostMembers()) {
      const excelClass = EXCEL_CLASS[owner];
      expect(excelClass, `map ${owner} to the Excel class it stands for`).toBeDefined();
      const set = sets.get(`${excelClass}.${member}`) ?? ENTRY_POINTS[`${excelClass}.${member}`];
      if (set === undefined && INHERITED.has(member)) continue;
      expect(set, `Excel.${excelClass}.${member} (used as ${owner}.${member}) has a requirement set in @types/office-js`).toBeDefined();
      needed.push({ use: `Excel.${excelClass}.${member}`, set: set as string });
    }
    const highest = needed.reduce((a, b) => (version(b.set) > version(a.set) ? b : a));
    console.log(
      `ExcelApi ${highest.set} needed, by ${needed
        .filter((n) => n.set === highest.set)
        .map((n) => n.use)
        .join(", ")}`,
    );
    expect(declaredExcelApi()).toBe(highest.set);
  });

  it("reads the platform's definitions right (Range.setCellProperties is ExcelApi 1.9, Range.values 1.1: Microsoft's Excel.Range reference; the sheet members below)", () => {
    const sets = excelRequirementSets();
    expect(sets.get("Range.setCellProperties")).toBe("1.9");
    expect(sets.get("Range.values")).toBe("1.1");
    expect(sets.get("Worksheet.getUsedRangeOrNullObject")).toBe("1.4");
    // The installation check's sheet: Microsoft's Excel.WorksheetCollection, Excel.Worksheet and Excel.RangeFormat references.
    expect(sets.get("WorksheetCollection.add")).toBe("1.1");
    expect(sets.get("WorksheetCollection.getItemOrNullObject")).toBe("1.4");
    expect(sets.get("Worksheet.activate")).toBe("1.1");
    expect(sets.get("Worksheet.delete")).toBe("1.1");
    expect(sets.get("RangeFormat.columnWidth")).toBe("1.2");
    // The chart's series: Microsoft's Excel.ChartSeriesCollection and Excel.ChartSeries references.
    expect(sets.get("ChartSeriesCollection.add")).toBe("1.7");
    expect(sets.get("ChartSeries.setValues")).toBe("1.7");
    expect(sets.get("ChartSeries.setXAxisValues")).toBe("1.7");
    expect(sets.get("ChartSeries.markerStyle")).toBe("1.7");
    expect(sets.get("ChartAxis.minimum")).toBe("1.1");
  });
});
