import { mkdirSync } from "node:fs";
import { defineConfig } from "vitest/config";

/**
 * The suite in three projects, so each script runs what its name says:
 * - unit     (`npm run test:unit`): the sources alone, no build, no browser;
 * - dist     the tests that read the built add-in in dist/ (or EVENSPLIT_DIST);
 * - browser  (`npm run test:browser`): Debian's Chromium driving the built pages.
 * `npm test` builds and runs all three. A new test that reads dist/ goes in DIST_TESTS.
 *
 * Under load (CI on two busy cores) the browser files are what strain a run: each starts a
 * Chromium of several processes and a few hundred MB beside the worker that drives it. So
 * they run after the other projects, one file at a time, and their hooks get the same
 * minute as the tests: with the default 10 s a slow start fails the hook while the launch
 * goes on, leaving a Chromium nobody closes. Workers are forks, each file in a process of
 * its own, so one file's crash or leak cannot take another file's results with it. A worker
 * that dies of a fatal error (V8 out of memory among them) leaves a Node diagnostic report in
 * WORKER_REPORTS, which scripts/test-summary.mjs names with the tests that never ran.
 */
const WORKER_REPORTS = "test-output/worker-reports";
mkdirSync(WORKER_REPORTS, { recursive: true });

const DIST_TESTS = [
  "test/functions/accuracy.test.ts",
  "test/functions/bundle.test.ts",
  "test/functions/customEnums.test.ts",
  "test/functions/helpPagesDist.test.ts",
  "test/functions/manifest.test.ts",
  "test/functions/metadataRequirements.test.ts",
];

export default defineConfig({
  test: {
    setupFiles: ["test/setup.ts"],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: "forks",
    // `npm run coverage`: line and branch coverage of src/ by the unit tests (V8's own counters).
    coverage: {
      provider: "v8",
      include: ["src/**/*.ts"],
      reporter: ["text", "text-summary", "json-summary", "html"],
      reportsDirectory: "test-output/coverage",
      // A red test elsewhere should not hide the figure.
      reportOnFailure: true,
    },
    execArgv: ["--report-on-fatalerror", `--report-directory=${WORKER_REPORTS}`],
    projects: [
      { extends: true, test: { name: "unit", include: ["test/**/*.test.ts"], exclude: [...DIST_TESTS, "test/browser/**"] } },
      { extends: true, test: { name: "dist", include: DIST_TESTS } },
      {
        extends: true,
        test: { name: "browser", include: ["test/browser/**/*.test.ts"], fileParallelism: false, sequence: { groupOrder: 1 } },
      },
    ],
  },
});
