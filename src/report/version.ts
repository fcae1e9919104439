/**
 * The Evensplit version the audit row of every result block names.
 *
 * Kept equal to package.json's "version" by test/report/auditRow.test.ts, so a block pasted into a report
 * names the release that wrote it; a constant rather than an import of package.json, which would put the
 * whole manifest of the package into the shipped bundle.
 *
 * Cost: none.
 */

/**
 * The version of this Evensplit build.
 *
 * @example
 * `Evensplit ${EVENSPLIT_VERSION}`; // "Evensplit 0.1.0"
 */
export const EVENSPLIT_VERSION = "0.1.0";
