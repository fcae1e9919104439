/**
 * The closing summary of `npm test` (scripts/test-summary.mjs) tells a lost worker from a
 * green run. The report shapes are vitest 4.1's own: a fork killed with SIGKILL in the
 * middle of a file leaves that file "passed" with its remaining tests "pending" and counts
 * them nowhere (seen by running such a file with --reporter=json), while describe.skip
 * marks tests "skipped". The diagnostic report is Node's (Node.js documentation,
 * "Diagnostic report": --report-on-fatalerror, header.event, javascriptHeap.usedMemory).
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { fatalReportsIn, summarise } from "../../scripts/test-summary.mjs";

const counts = { numPassedTests: 0, numFailedTests: 0, numPendingTests: 0, numTodoTests: 0, numTotalTests: 0 };

describe("the test summary", () => {
  it("is green and plain for a clean run with skips", () => {
    const report = {
      ...counts,
      numPassedTests: 2,
      numPendingTests: 1,
      numTotalTests: 3,
      testResults: [
        { name: "/p/a.test.ts", status: "passed", assertionResults: [{ status: "passed" }, { status: "passed" }, { status: "skipped" }] },
      ],
    };
    expect(summarise(report, [])).toEqual({ lines: ["Tests: 2 passed, 0 failed, 1 skipped"], green: true });
  });

  it("names the tests a dead worker never ran, and is red although nothing failed", () => {
    const report = {
      ...counts,
      numPassedTests: 2,
      numTotalTests: 5,
      testResults: [
        {
          name: "/p/died.test.ts",
          status: "passed",
          assertionResults: [{ status: "pending" }, { status: "pending" }, { status: "pending" }],
        },
        { name: "/p/ok.test.ts", status: "passed", assertionResults: [{ status: "passed" }, { status: "passed" }] },
      ],
    };
    const { lines, green } = summarise(report, []);
    expect(green).toBe(false);
    expect(lines).toEqual([
      "Tests: 2 passed, 0 failed, 0 skipped, 3 never ran",
      "3 tests of /p/died.test.ts never ran: its worker stopped before them.",
    ]);
  });

  it("reads the report Node writes when a worker runs out of heap, with its cause", () => {
    const folder = mkdtempSync(join(tmpdir(), "evensplit-fatal-"));
    try {
      const before = Date.now();
      const args = [
        "--max-old-space-size=16",
        "--report-on-fatalerror",
        `--report-directory=${folder}`,
        "-e",
        "const a = []; for (;;) a.push(new Array(1e5).fill(1));",
      ];
      expect(() => execFileSync(process.execPath, args, { stdio: "ignore" })).toThrow();
      const found = fatalReportsIn(folder, before);
      expect(found).toHaveLength(1);
      expect(found[0].trigger).toMatch(/heap out of memory/);
      expect(found[0].heapUsedMB).toBeGreaterThan(0);
      expect(fatalReportsIn(folder, Date.now() + 60_000)).toEqual([]);
      const { lines, green } = summarise({ ...counts, numPassedTests: 1, numTotalTests: 1, testResults: [] }, found);
      expect(green).toBe(false);
      expect(lines[1]).toMatch(
        /^A test worker died \(Allocation failed - JavaScript heap out of memory\) with \d+ MB of heap in use: see /,
      );
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
});
