// Types of scripts/test-summary.mjs for the TypeScript tests (the script itself stays plain JavaScript).
export interface VitestJsonReport {
  readonly numPassedTests: number;
  readonly numFailedTests: number;
  readonly numPendingTests: number;
  readonly numTodoTests: number;
  readonly numTotalTests: number;
  readonly testResults: { name: string; status: string; assertionResults: { status: string }[] }[];
}

export interface FatalReport {
  readonly file: string;
  readonly trigger: string;
  readonly heapUsedMB: number | null;
}

export function summarise(report: VitestJsonReport, fatalReports: FatalReport[]): { lines: string[]; green: boolean };
export function fatalReportsIn(folder: string, since: number): FatalReport[];
