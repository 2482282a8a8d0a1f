import { createHash } from 'node:crypto';
import { MAX_REPORTED_ERRORS, importRefusal, type RowError } from './errors';
import { MAX_REPORTED_WARNINGS, ModeSetTally, type ImportWarning } from './mode-set-warnings';
import { BornChargeTally, neutralityFacts } from './born-neutrality';
import type { TableRow } from './table';
import { modeSetFacts, validateRow, type ImportReferences, type RowContext, type ValidRow } from './validate-row';

/** A stored row's identity hash: the same for a typed-in row and a DOS-computed one with the same content. */
export const rowHash = (identity: string) => createHash('sha256').update(identity).digest('base64url');

/** A validated row ready to store, with its identity hash and the row number it came from. */
export interface PendingRow {
  row: number;
  hash: string;
  valid: ValidRow;
}

export interface DuplicateRow {
  row: number;
  reason: string;
}

/** Rows handed to the writer at a time: big enough for multi-row INSERTs, small enough to yield between. */
export const INSERT_CHUNK_ROWS = 500;

/**
 * Validates an import's rows as they stream in and hands out chunks of valid
 * rows to store. Once any row is bad no further chunk is handed out (nothing may
 * be stored), but validation goes on so that every error is counted and the
 * first MAX_REPORTED_ERRORS are listed. Rows repeated within a chunk are skipped
 * here; the writer skips rows identical to stored ones (and to earlier chunks).
 */
export class RowValidator {
  rowCount = 0;
  errorCount = 0;
  readonly errors: RowError[] = [];
  duplicateCount = 0;
  readonly duplicates: DuplicateRow[] = [];
  private pending: PendingRow[] = [];
  private readonly seenInChunk = new Set<string>();
  private readonly tally = new ModeSetTally();
  private readonly born: BornChargeTally;
  private bornWarnings: ImportWarning[] = [];

  constructor(
    private readonly ctx: RowContext,
    private readonly references: ImportReferences,
  ) {
    this.born = new BornChargeTally(ctx.columnName);
  }

  /** Validates one batch of table rows; returns the chunks that are full and may be stored. */
  accept(rows: readonly TableRow[]): PendingRow[][] {
    const full: PendingRow[][] = [];
    for (const r of rows) {
      this.rowCount++;
      if (r.error) {
        this.errorCount++;
        if (this.errors.length < MAX_REPORTED_ERRORS) this.errors.push(r.error);
        continue;
      }
      const before = this.errors.length;
      const valid = validateRow(r.row, r.read, this.ctx, this.errors);
      if (!valid) {
        this.errorCount += Math.max(1, this.errors.length - before);
        if (this.errors.length > MAX_REPORTED_ERRORS) this.errors.length = MAX_REPORTED_ERRORS;
        continue;
      }
      if (this.errorCount > 0) continue;
      this.tally.add(r.row, valid);
      this.born.add(r.row, valid);
      const hash = rowHash(valid.identity);
      if (this.seenInChunk.has(hash)) {
        this.skipDuplicate(r.row, 'Identical to an earlier row of this file; skipped.');
        continue;
      }
      this.seenInChunk.add(hash);
      this.pending.push({ row: r.row, hash, valid });
      if (this.pending.length >= INSERT_CHUNK_ROWS) full.push(this.takeChunk());
    }
    return this.errorCount > 0 ? [] : full;
  }

  /** After the last batch: the refusal when any row was bad, else the rows still waiting. */
  finish(format: 'csv' | 'json'): PendingRow[] {
    if (this.errorCount === 0) {
      // Set-wide checks need every row of the file: they run once all are in, before anything is stored.
      const { errors, warnings } = this.born.problems(neutralityFacts(this.references));
      this.errorCount += errors.length;
      this.errors.push(...errors.slice(0, Math.max(0, MAX_REPORTED_ERRORS - this.errors.length)));
      this.bornWarnings = warnings;
    }
    if (this.errorCount > 0) {
      const plural = this.errorCount === 1 ? 'error' : 'errors';
      throw importRefusal(`Nothing was imported: ${this.errorCount} ${plural} in ${format === 'csv' ? 'the file' : 'the rows'}.`, this.errors, this.errorCount);
    }
    return this.takeChunk();
  }

  skipDuplicate(row: number, reason: string): void {
    this.duplicateCount++;
    if (this.duplicates.length < MAX_REPORTED_ERRORS) this.duplicates.push({ row, reason });
  }

  warnings(): { warnings: ImportWarning[]; warningCount: number } {
    const modes = this.tally.warnings(modeSetFacts(this.references));
    const all = [...modes.warnings, ...this.bornWarnings].sort((a, b) => a.row - b.row);
    return { warnings: all.slice(0, MAX_REPORTED_WARNINGS), warningCount: modes.warningCount + this.bornWarnings.length };
  }

  private takeChunk(): PendingRow[] {
    const chunk = this.pending;
    this.pending = [];
    this.seenInChunk.clear();
    return chunk;
  }
}
