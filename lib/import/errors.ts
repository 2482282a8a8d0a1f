import { AppError } from '@/lib/errors';

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

/** An import refused as a whole: an unprocessable AppError that carries the row errors and their total count. */
export type ImportRefusalError = AppError & { errors: RowError[]; errorCount: number };

/** A file refused as a whole (encoding, header, empty) or after validation found row errors. */
export function importRefusal(message: string, errors: RowError[], errorCount = errors.length): ImportRefusalError {
  return new AppError('unprocessable', message, undefined, { errors, errorCount }) as ImportRefusalError;
}

export function isImportRefusal(e: unknown): e is ImportRefusalError {
  return e instanceof AppError && e.code === 'unprocessable' && Array.isArray(e.errors);
}

/** Upper bound on errors kept in one response; the count still covers them all. */
export const MAX_REPORTED_ERRORS = 10_000;

