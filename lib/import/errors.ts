/**
 * One problem in an import. `row` counts records the way a spreadsheet shows them:
 * in a CSV file the header is row 1 and the first data row is row 2; in a JSON body
 * row N is rows[N − 1]. `row` 0 means the file as a whole.
 */
export interface RowError {
  row: number;
  column: string | null;
  reason: string;
  /** The offending cell text, when there is one. */
  value?: string;
}

/** A file refused as a whole (encoding, header, empty) or after validation found row errors. */
export class ImportRefusal extends Error {
  readonly errors: RowError[];
  readonly errorCount: number;
  constructor(message: string, errors: RowError[], errorCount = errors.length) {
    super(message);
    this.name = 'ImportRefusal';
    this.errors = errors;
    this.errorCount = errorCount;
  }
}

/** Upper bound on errors kept in one response; the count still covers them all. */
export const MAX_REPORTED_ERRORS = 10_000;

