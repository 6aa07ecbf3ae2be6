/** What an import tells its user: every rejected row with its place and reason, and what was written. */

export interface RowProblem {
  /** 1-based line of a CSV file, or 1-based feature number of a boundary file */
  line: number;
  /** the column (header name) or property at fault; '*' for the row as a whole */
  column: string;
  value?: string;
  reason: string;
}

export interface ImportCounts {
  rows: number;
  accepted: number;
  rejected: number;
  inserted: number;
  updated: number;
  unchanged: number;
}

export interface ImportReport {
  /** 'line' for CSV files, 'feature' for boundary files */
  unit: "line" | "feature";
  rejected: RowProblem[];
  /** not errors, but worth knowing: incomplete days left out, zero-depth intervals skipped… */
  warnings: string[];
  /** whether anything was written (false when all-or-nothing met a rejected row) */
  written: boolean;
  /** first and last date written, when the import is date-keyed */
  dateRange?: { from: string; to: string };
  qc?: { flagsOpened: number };
}

/** Rejected rows are listed up to this many; the count is always complete. */
export const MAX_LISTED_PROBLEMS = 1000;

export class ProblemList {
  readonly items: RowProblem[] = [];
  private readonly badLines = new Set<number>();
  total = 0;

  add(problem: RowProblem): void {
    this.total += 1;
    this.badLines.add(problem.line);
    if (this.items.length < MAX_LISTED_PROBLEMS) this.items.push(problem);
  }

  has(line: number): boolean {
    return this.badLines.has(line);
  }

  get rejectedLines(): number {
    return this.badLines.size;
  }
}
