/**
 * Merges two Istanbul records of one source file made from different builds: the unit tests'
 * (Vite's transform) and the browser's (webpack's ts-loader). Both converters find the same
 * statements, functions and branches at the same start, but the two source maps end some of
 * them at other columns (or at none), so istanbul-lib-coverage's own merge, which keys on the
 * whole location, would count such a branch twice. Here an item of the second record joins the
 * first record's item of the same kind that starts at the same line and column (for branches:
 * of the same type and number of paths) and adds its counts; an item with no such partner is
 * appended. Cost: linear in the items of both records.
 */
import type { BranchMapping, CoverageMapData, FileCoverageData, FunctionMapping, Range } from "istanbul-lib-coverage";

const startKey = (range: Range): string => `${range.start.line}:${range.start.column}`;

/** Appends the items of `extra` that `base` lacks and adds the counts of those it has, by start. */
function mergeItems<T>(
  baseMap: Record<string, T>,
  baseCounts: Record<string, number | number[]>,
  extraMap: Record<string, T>,
  extraCounts: Record<string, number | number[]>,
  key: (item: T) => string,
): { map: Record<string, T>; counts: Record<string, number | number[]> } {
  const map = { ...baseMap };
  const counts: Record<string, number | number[]> = {};
  for (const [id, count] of Object.entries(baseCounts)) counts[id] = Array.isArray(count) ? [...count] : count;
  const byKey = new Map(Object.entries(baseMap).map(([id, item]) => [key(item), id]));
  let next = Object.keys(baseMap).length;
  for (const [id, item] of Object.entries(extraMap)) {
    const count = extraCounts[id];
    const partner = byKey.get(key(item));
    if (partner === undefined) {
      const fresh = String(next++);
      map[fresh] = item;
      counts[fresh] = Array.isArray(count) ? [...count] : count;
      byKey.set(key(item), fresh);
    } else {
      const sum = counts[partner];
      counts[partner] =
        Array.isArray(sum) && Array.isArray(count) ? sum.map((n, i) => n + (count[i] ?? 0)) : (sum as number) + (count as number);
    }
  }
  return { map, counts };
}

/**
 * One record of the file with the counts of both.
 *
 * @example
 * mergeFile(unitRecord, browserRecord).s["0"]; // the unit count plus the browser count of the first statement
 */
export function mergeFile(base: FileCoverageData, extra: FileCoverageData): FileCoverageData {
  const statements = mergeItems(base.statementMap, base.s, extra.statementMap, extra.s, startKey);
  const functions = mergeItems<FunctionMapping>(base.fnMap, base.f, extra.fnMap, extra.f, (fn) => startKey(fn.decl));
  const branches = mergeItems<BranchMapping>(
    base.branchMap,
    base.b,
    extra.branchMap,
    extra.b,
    (branch) => `${branch.type}@${startKey(branch.loc)}/${branch.locations.length}`,
  );
  return {
    ...base,
    statementMap: statements.map,
    s: statements.counts as Record<string, number>,
    fnMap: functions.map,
    f: functions.counts as Record<string, number>,
    branchMap: branches.map,
    b: branches.counts as Record<string, number[]>,
  };
}

/**
 * Both sets of records in one, merging the records of a file that both have (mergeFile).
 *
 * @example
 * mergeData(unitData, browserData)["/p/src/demo/grid.ts"]; // grid.ts with the counts of both runs
 */
export function mergeData(base: CoverageMapData, extra: CoverageMapData): CoverageMapData {
  const merged: CoverageMapData = { ...base };
  for (const [path, file] of Object.entries(extra)) merged[path] = merged[path] ? mergeFile(merged[path], file) : file;
  return merged;
}
