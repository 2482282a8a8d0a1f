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
  /** Set when the problem is in a line of the wizard's method table (1-based), not in the file; `row` is then 0. */
  methodLine?: number;
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

/**
 * Upper bound on errors listed in one response; `errorCount` still covers them all.
 * With MAX_CELL_CHARS and ECHO_CHARS it keeps a refusal under 1 MB for any upload
 * (bench/error-bodies.ts measures it).
 */
export const MAX_REPORTED_ERRORS = 1_000;

/** The longest cell an import accepts (characters, header cells included); longer cells are refused with row and column. */
export const MAX_CELL_CHARS = 10_000;

/** How much of a cell an error message repeats. */
export const ECHO_CHARS = 40;

/** The start of a cell for an error message: at most ECHO_CHARS characters, "…" when cut. */
export function excerpt(text: string, limit = ECHO_CHARS): string {
  if (text.length <= limit) return text;
  let end = limit;
  // Do not cut a surrogate pair in half.
  const last = text.charCodeAt(end - 1);
  if (last >= 0xd800 && last <= 0xdbff) end--;
  return `${text.slice(0, end)}…`;
}

/** The error for a cell over MAX_CELL_CHARS. */
export function cellTooLong(row: number, column: string | null, length: number): RowError {
  return {
    row,
    column: column === null ? null : excerpt(column),
    reason: `This cell has ${length.toLocaleString('en')} characters; a cell may have at most ${MAX_CELL_CHARS.toLocaleString('en')}.`,
  };
}

/** The error for the first cell of a record over MAX_CELL_CHARS, or null when every cell fits. */
export function longCellIn(row: number, fields: readonly string[], columnOf: (index: number) => string): RowError | null {
  for (let i = 0; i < fields.length; i++) if (fields[i].length > MAX_CELL_CHARS) return cellTooLong(row, columnOf(i), fields[i].length);
  return null;
}
