// Prints the closing count of the vitest run in the plain form CI logs are read by:
// "Tests: N passed, N failed, N skipped", from the JSON report `npm test` writes.
import { readFileSync } from "node:fs";

const report = JSON.parse(readFileSync("test-output/vitest.json", "utf8"));
const skipped = report.numPendingTests + report.numTodoTests;
console.log(`Tests: ${report.numPassedTests} passed, ${report.numFailedTests} failed, ${skipped} skipped`);
process.exitCode = report.numFailedTests === 0 && report.numTotalTests > 0 ? 0 : 1;
