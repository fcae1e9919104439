import { defineConfig } from "vitest/config";

/**
 * The suite in three projects, so each script runs what its name says:
 * - unit     (`npm run test:unit`): the sources alone, no build, no browser;
 * - dist     the tests that read the built add-in in dist/ (or EVENSPLIT_DIST);
 * - browser  (`npm run test:browser`): Debian's Chromium driving the built pages.
 * `npm test` builds and runs all three. A new test that reads dist/ goes in DIST_TESTS.
 */
const DIST_TESTS = ["test/functions/accuracy.test.ts", "test/functions/bundle.test.ts", "test/functions/manifest.test.ts"];

export default defineConfig({
  test: {
    setupFiles: ["test/setup.ts"],
    testTimeout: 60_000,
    projects: [
      { extends: true, test: { name: "unit", include: ["test/**/*.test.ts"], exclude: [...DIST_TESTS, "test/browser/**"] } },
      { extends: true, test: { name: "dist", include: DIST_TESTS } },
      { extends: true, test: { name: "browser", include: ["test/browser/**/*.test.ts"] } },
    ],
  },
});
