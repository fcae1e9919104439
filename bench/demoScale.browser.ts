/**
 * The demo page at 1,000 and 100,000 rows, in Debian's Chromium (driven by
 * playwright-core, as the browser tests are): the time to fill a column by
 * pasting it, to analyse it in the pane (reading the range in step 1, the
 * preview in step 4), to write the block, and to change one cell afterwards
 * (the block recalculating). Prints each run and, per step, the fastest of
 * the runs (DEMO_REPEATS, default 3) at both sizes and their ratio;
 * the targets are at most 2 s at 100,000 rows and at most 15 times the
 * 1,000-row time. With DEMO_PROFILE=1 it also prints, per step, the functions
 * that took the most time (Chrome's sampling profiler; a development build
 * keeps their names); with DEMO_CHART=1 the block is written with its chart.
 *
 * Run: EVENSPLIT_DIST=/tmp/dist-NAME npx tsx bench/demoScale.browser.ts [rows ...]
 * (build first: EVENSPLIT_DIST=/tmp/dist-NAME npx webpack --mode production).
 */
import type { CDPSession, Page } from "playwright-core";
import { openDemo, selectCells, startSession, type Session } from "../test/browser/session";

const STEPS = ["fill", "analyse", "write", "edit"] as const;
type Step = (typeof STEPS)[number];
const PROFILE = process.env.DEMO_PROFILE === "1";
/** Runs per size (DEMO_REPEATS, 3 unless set). */
const REPEATS = Math.max(1, Number(process.env.DEMO_REPEATS ?? 3));

/** Invented readings around 50 µm, the same on every run. */
function column(rows: number): string {
  const lines = ["Reading (µm)"];
  for (let i = 0; i < rows; i++) lines.push((45 + ((i * 7919) % 1000) / 100).toFixed(2));
  return `${lines.join("\n")}\n`;
}

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}

/** The functions with the most self time in a CPU profile, as "name (file:line) ms". */
function topFunctions(
  profile: { nodes: ProfileNode[]; samples: number[]; timeDeltas: number[] },
  count = Number(process.env.DEMO_PROFILE_TOP ?? 8),
): string[] {
  const self = new Map<number, number>();
  profile.samples.forEach((id, i) => self.set(id, (self.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000));
  const byName = new Map<string, number>();
  for (const node of profile.nodes) {
    const { functionName, url, lineNumber } = node.callFrame;
    const name = `${functionName || "(anonymous)"} (${url.split("/").pop() ?? ""}:${lineNumber + 1})`;
    byName.set(name, (byName.get(name) ?? 0) + (self.get(node.id) ?? 0));
  }
  return [...byName]
    .sort((a, b) => b[1] - a[1])
    .slice(0, count)
    .map(([name, ms]) => `${ms.toFixed(0).padStart(7)} ms  ${name}`);
}

/** Runs `action` and waits for the page to have drawn a frame after it; returns the wall time in ms. */
async function timed(page: Page, cdp: CDPSession | null, step: Step, action: () => Promise<void>): Promise<number> {
  if (cdp) await cdp.send("Profiler.start");
  const start = performance.now();
  await action();
  await page.evaluate(() => new Promise((resolve) => requestAnimationFrame(() => resolve(null))));
  const ms = performance.now() - start;
  if (cdp) {
    const { profile } = (await cdp.send("Profiler.stop")) as { profile: { nodes: ProfileNode[]; samples: number[]; timeDeltas: number[] } };
    console.log(
      `  where the time of "${step}" went:\n${topFunctions(profile)
        .map((l) => `    ${l}`)
        .join("\n")}`,
    );
  }
  return ms;
}

async function measure(session: Session, rows: number): Promise<Record<Step, number>> {
  const page = await openDemo(session);
  page.setDefaultTimeout(15 * 60_000);
  const cdp = PROFILE ? await session.context.newCDPSession(page) : null;
  if (cdp) await cdp.send("Profiler.enable");
  await session.context.grantPermissions(["clipboard-read", "clipboard-write"], { origin: session.origin });
  await page.evaluate((text) => navigator.clipboard.writeText(text), column(rows));
  await selectCells(page, "H1");
  const recalculations = (): Promise<number> => page.evaluate(() => window.evensplitDemo?.workbook.recalculations ?? 0);

  const fill = await timed(page, cdp, "fill", async () => {
    await page.keyboard.press("Control+V");
    await page.locator("#demo-cell-1-7").getByText(/\d/).waitFor();
  });

  const address = `H1:H${rows + 1}`;
  const analyse = await timed(page, cdp, "analyse", async () => {
    await selectCells(page, address);
    await page.getByRole("button", { name: "Use the selection" }).first().click();
    await page.locator(".es-summary").first().getByText(`${rows} numbers`).waitFor();
    await page.getByRole("button", { name: "Next: the question" }).click();
    await page.getByLabel("Hypothesised median").fill("50");
    await page.getByRole("button", { name: "Next: settings" }).click();
    await page.getByRole("button", { name: "Next: the result" }).click();
    await page.locator(".es-preview").first().waitFor();
  });

  // DEMO_CHART=1 asks for the chart beside the block too, whose sketch the sheet then redraws on every change.
  if (process.env.DEMO_CHART === "1") await page.getByLabel("Also add a chart of the values against H0 and the bounds").check();
  const write = await timed(page, cdp, "write", async () => {
    // "Write the block", or "Make the table and write the block" when the range is to become a table.
    await page.getByRole("button", { name: /write the block/i }).click();
    await page.locator(".es-status").getByText("The block was written").waitFor();
  });

  const before = await recalculations();
  const edit = await timed(page, cdp, "edit", async () => {
    await selectCells(page, "H2");
    await page.keyboard.type("61");
    await page.keyboard.press("Enter");
    await page.waitForFunction((n) => (window.evensplitDemo?.workbook.recalculations ?? 0) > n, before);
  });
  await page.close();
  return { fill, analyse, write, edit };
}

/** Fresh pages measured REPEATS times; per step the fastest run, since other work on a shared machine only adds time. */
async function fastest(session: Session, rows: number): Promise<Record<Step, number>> {
  const best = { fill: Infinity, analyse: Infinity, write: Infinity, edit: Infinity };
  for (let i = 0; i < REPEATS; i++) {
    console.log(`# demo page: ${rows.toLocaleString("en-US")} rows, run ${i + 1} of ${REPEATS}`);
    const run = await measure(session, rows);
    for (const step of STEPS) best[step] = Math.min(best[step], run[step]);
    console.log(`  ${STEPS.map((step) => `${step} ${run[step].toFixed(0)} ms`).join(", ")}`);
  }
  return best;
}

async function main(): Promise<void> {
  const sizes = process.argv
    .slice(2)
    .map(Number)
    .filter((n) => n > 0);
  const [small, large] = sizes.length >= 2 ? sizes : [1_000, 100_000];
  const session = await startSession();
  try {
    const a = await fastest(session, small);
    const b = await fastest(session, large);
    console.log(
      `\n${"step".padEnd(10)}${`${small} rows`.padStart(14)}${`${large} rows`.padStart(16)}${"ratio".padStart(9)}  target: <= 2000 ms and <= 15x`,
    );
    for (const step of STEPS) {
      const ratio = b[step] / a[step];
      const ok = b[step] <= 2000 && ratio <= 15 ? "ok" : "OVER";
      console.log(
        `${step.padEnd(10)}${a[step].toFixed(0).padStart(11)} ms${b[step].toFixed(0).padStart(13)} ms${ratio.toFixed(1).padStart(8)}x  ${ok}`,
      );
    }
  } finally {
    await session.close();
  }
}

void main();
