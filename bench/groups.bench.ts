/**
 * Speed of the two-group and many-group cell functions through the whole layer, each against a bare
 * loop that reads every cell of the same ranges once, measured in the same run (fastest of alternating
 * runs, timing.ts):
 *
 * - TWOGROUPS (rank-sum, normal method at this size) on two groups of 100,000: at most 30x the loop over both;
 * - SHIFT (estimate and 95% bounds) on two groups of 100,000: at most 30x, with repeated values (two
 *   decimals) and without (the same values jittered in the fourth decimal, so every value is distinct and
 *   the matrix of differences has 10^10 distinct cells);
 * - BYGROUP on 1,000,000 rows in 100 groups: at most 10x the loop over values and labels.
 *
 * For information, the slowest exact rank-sum cases at the sizes where `auto` stops being exact
 * (EXACT_AUTO_SIZE without ties, EXACT_AUTO_TIED_SIZE with ties): these chose the constants in rankSum.ts.
 *
 * Data: invented coating thicknesses (µm, two decimals, so with ties) of two paint lines and of 100
 * spray heads, from a fixed-seed generator (no real data).
 */
import { bygroup, shift, twogroups } from "../src/functions/functions";
import { EXACT_AUTO_SIZE, EXACT_AUTO_TIED_SIZE, rankSumTest } from "../src/stats/rankSum";
import { xorshift32 as uniforms } from "../src/stats/xorshift";
import { fastestAlternating, report } from "./timing";

/** Reads every cell of the ranges once and keeps something, so the loop cannot be optimised away. */
function bareLoop(...ranges: (readonly (readonly unknown[])[])[]): number {
  let sum = 0;
  for (const cells of ranges) {
    for (let r = 0; r < cells.length; r++) {
      const row = cells[r];
      for (let c = 0; c < row.length; c++) {
        const v = row[c];
        if (typeof v === "number") sum += v;
        else if (typeof v === "string") sum += v.length;
      }
    }
  }
  return sum;
}

/** `rows` thicknesses around `centre`, two decimals, as a one-column range. */
function thicknesses(rows: number, centre: number, next: () => number): number[][] {
  return Array.from({ length: rows }, () => [Math.round((centre - 6 + 12 * next()) * 100) / 100]);
}

function check(name: string, answer: unknown): void {
  const first = Array.isArray(answer) ? (answer as unknown[][])[answer.length > 1 ? 1 : 0][1] : answer;
  if (typeof first !== "number") throw new Error(`${name} did not give a number: ${JSON.stringify(answer).slice(0, 300)}`);
}

export async function run(): Promise<void> {
  const next = uniforms(2026);
  const lineA = thicknesses(100_000, 50, next);
  const lineB = thicknesses(100_000, 50.3, next);
  let sink = 0;
  const bareTwo = () => (sink += bareLoop(lineA, lineB));

  check("TWOGROUPS", twogroups(lineA, lineB));
  const two = fastestAlternating(bareTwo, () => (sink += twogroups(lineA, lineB) as number), 5, 3, 5);
  report("TWOGROUPS (rank-sum, normal), 2 x 100,000", two.ms, two.baseMs, 30);

  check("SHIFT", shift(lineA, lineB));
  const moved = fastestAlternating(bareTwo, () => (sink += shift(lineA, lineB)[0][0] as number), 5, 3, 5);
  report("SHIFT (estimate + 95% bounds), 2 x 100,000", moved.ms, moved.baseMs, 30);
  // Without repeats (full double precision): the thinned matrix brackets each rank, one walk per rank gathers it.
  const fineA = lineA.map(([v]) => [v + next() * 1e-3]);
  const fineB = lineB.map(([v]) => [v + next() * 1e-3]);
  const fine = fastestAlternating(
    () => (sink += bareLoop(fineA, fineB)),
    () => (sink += shift(fineA, fineB)[0][0] as number),
    3,
    3,
    3,
  );
  report("SHIFT, 2 x 100,000 without repeated values", fine.ms, fine.baseMs, 30);

  const heads = Array.from({ length: 100 }, (_, h) => `Head ${h + 1}`);
  const values = thicknesses(1_000_000, 50, next);
  const labels = values.map(() => [heads[Math.floor(next() * heads.length)]]);
  check("BYGROUP", bygroup(values, labels, 50));
  const many = fastestAlternating(
    () => (sink += bareLoop(values, labels)),
    () => (sink += bygroup(values, labels, 50).length),
    3,
    3,
    3,
  );
  report("BYGROUP, 1,000,000 rows in 100 groups", many.ms, many.baseMs, 10);

  // The exact distribution at the auto limits, p near 1 (the largest tail to sum): for information.
  const half = EXACT_AUTO_SIZE / 2;
  const untiedFirst = Array.from({ length: half }, (_, i) => 2 * i);
  const untiedSecond = Array.from({ length: half }, (_, i) => 2 * i + 1);
  const tiedHalf = EXACT_AUTO_TIED_SIZE / 2;
  const tiedFirst = Array.from({ length: tiedHalf }, (_, i) => Math.floor(i / 2));
  const tiedSecond = Array.from({ length: tiedHalf }, (_, i) => Math.floor(i / 2) + (i % 3 === 0 ? 0.5 : 0));
  const bareSmall = () => (sink += bareLoop(lineA, lineB));
  const untied = fastestAlternating(
    bareSmall,
    () => (sink += (rankSumTest(untiedFirst, untiedSecond) as { pValue: number }).pValue),
    3,
    3,
    2,
  );
  report(`rank-sum exact, ${half} + ${half} without ties, p near 1`, untied.ms, untied.baseMs);
  const tied = fastestAlternating(bareSmall, () => (sink += (rankSumTest(tiedFirst, tiedSecond) as { pValue: number }).pValue), 3, 3, 2);
  report(`rank-sum exact, ${tiedHalf} + ${tiedHalf} with ties, p near 1`, tied.ms, tied.baseMs);
  if (sink === -1) console.log("unreachable");
}
