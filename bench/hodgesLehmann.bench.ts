/**
 * Hodges–Lehmann speed against a bare loop reading every cell of a 1,000,000-cell column, measured in
 * the same run: estimate and 95% bounds on 10^5 values, target <= 100x; also 10^6 values and the
 * exact-rank case at EXACT_AUTO_LIMIT values, for information.
 *
 * Data: invented, from a fixed-seed generator.
 */
import { hodgesLehmann } from "../src/stats/hodgesLehmann";
import { EXACT_AUTO_LIMIT } from "../src/stats/signedRank";
import { alternate, bareLoop, columnOf } from "./cells.bench";
import { report, timeMedian } from "./timing";
import { xorshift32 as uniforms } from "../src/stats/xorshift";

export async function run(): Promise<void> {
  const next = uniforms(99);
  const cellValues = Float64Array.from({ length: 1_000_000 }, () => Math.round(next() * 1e5) / 100);
  const column = columnOf(cellValues);
  let sink = 0;
  const bare = () => (sink += bareLoop(column));
  const sample = (n: number) => Float64Array.from({ length: n }, () => Math.round((-Math.log(next()) * 10 - 3) * 1e4) / 1e4);

  const x5 = sample(100_000);
  const main = alternate(
    bare,
    () => {
      const r = hodgesLehmann(x5);
      if (r.available) sink += r.estimate;
    },
    3,
    4,
  );
  report("hodgesLehmann, 10^5 values (estimate + 95% bounds)", main.ms, main.baseMs, 100);

  const baseMs = timeMedian(bare, 7);
  const x6 = sample(1_000_000);
  const big = timeMedian(() => {
    const r = hodgesLehmann(x6);
    if (r.available) sink += r.estimate;
  }, 3);
  report("hodgesLehmann, 10^6 values", big, baseMs);
  const small = sample(EXACT_AUTO_LIMIT);
  const exact = timeMedian(() => {
    const r = hodgesLehmann(small);
    if (r.available) sink += r.estimate;
  }, 7);
  report(`hodgesLehmann, ${EXACT_AUTO_LIMIT} values (exact rank)`, exact, baseMs);
  if (sink === -1) console.log("unreachable");
}
