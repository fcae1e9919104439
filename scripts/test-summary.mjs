// Prints the closing count of the vitest run in the plain form CI logs are read by:
// "Tests: N passed, N failed, N skipped", from the JSON report `npm test` writes; then
// what a dead worker lost: the tests that never ran (vitest's JSON report leaves them
// "pending" and the file "passed") with their files, and the Node diagnostic reports
// that vitest.config.mts asks a worker to write when it dies of a fatal error (out of
// memory among them), so a lost worker names its file and its cause instead of only
// "Worker exited unexpectedly".
//
// `--run` first runs the whole suite (vitest run, JSON report included), so the count
// is printed whether or not the run failed; the exit status is the run's.
import { spawnSync } from "node:child_process";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

/**
 * The summary lines and whether the run counts as green.
 *
 * @param {{ numPassedTests: number, numFailedTests: number, numPendingTests: number, numTodoTests: number, numTotalTests: number, testResults: { name: string, status: string, assertionResults: { status: string }[] }[] }} report
 * @param {{ file: string, trigger: string, heapUsedMB: number | null }[]} fatalReports
 * @returns {{ lines: string[], green: boolean }}
 * @example
 * summarise({ numPassedTests: 3, numFailedTests: 0, numPendingTests: 0, numTodoTests: 0, numTotalTests: 3, testResults: [] }, []);
 * // { lines: ["Tests: 3 passed, 0 failed, 0 skipped"], green: true }
 */
export function summarise(report, fatalReports) {
  // Tests a worker never got to stay "pending" and are in no count; skipped ones are "skipped" or "todo".
  const neverRan = report.testResults
    .map((file) => ({ name: file.name, count: file.assertionResults.filter((test) => test.status === "pending").length }))
    .filter((file) => file.count > 0);
  const lost = neverRan.reduce((sum, file) => sum + file.count, 0);
  const skipped = report.numPendingTests + report.numTodoTests;
  const lines = [
    `Tests: ${report.numPassedTests} passed, ${report.numFailedTests} failed, ${skipped} skipped${lost > 0 ? `, ${lost} never ran` : ""}`,
  ];
  for (const file of neverRan) lines.push(`${file.count} tests of ${file.name} never ran: its worker stopped before them.`);
  for (const fatal of fatalReports) {
    const heap = fatal.heapUsedMB === null ? "" : ` with ${fatal.heapUsedMB} MB of heap in use`;
    lines.push(`A test worker died (${fatal.trigger})${heap}: see ${fatal.file}`);
  }
  const green = report.numFailedTests === 0 && report.numTotalTests > 0 && lost === 0 && fatalReports.length === 0;
  return { lines, green };
}

/**
 * The Node diagnostic reports in `folder` (written by --report-on-fatalerror) dated `since` (ms) or later.
 *
 * @param {string} folder
 * @param {number} since
 * @returns {{ file: string, trigger: string, heapUsedMB: number | null }[]}
 * @example
 * fatalReportsIn("test-output/worker-reports", Date.now() - 60_000); // [] after a run without a fatal error
 */
export function fatalReportsIn(folder, since) {
  if (!existsSync(folder)) return [];
  return readdirSync(folder)
    .filter((name) => name.endsWith(".json"))
    .map((name) => {
      const file = join(folder, name);
      const report = JSON.parse(readFileSync(file, "utf8"));
      const used = report.javascriptHeap?.usedMemory;
      const time = Number(report.header?.dumpEventTimeStamp);
      return {
        file,
        time,
        trigger: report.header?.event ?? "a fatal error",
        heapUsedMB: typeof used === "number" ? Math.round(used / 2 ** 20) : null,
      };
    })
    .filter((r) => !(r.time < since))
    .map(({ file, trigger, heapUsedMB }) => ({ file, trigger, heapUsedMB }));
}

function main() {
  let status = 0;
  if (process.argv.includes("--run")) {
    const vitest = fileURLToPath(new URL("../node_modules/vitest/vitest.mjs", import.meta.url));
    const args = [vitest, "run", "--reporter=default", "--reporter=json", "--outputFile.json=test-output/vitest.json"];
    status = spawnSync(process.execPath, args, { stdio: "inherit" }).status ?? 1;
  }
  const report = JSON.parse(readFileSync("test-output/vitest.json", "utf8"));
  const { lines, green } = summarise(report, fatalReportsIn("test-output/worker-reports", report.startTime));
  for (const line of lines) console.log(line);
  process.exitCode = green && status === 0 ? 0 : 1;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) main();
