import 'server-only';
/**
 * Committing a measurements or calculations import: every row is validated
 * first (lib/import/row-validator), with the valid ones staged on disk, and only
 * then are they stored in chunks inside ONE write transaction with the import row
 * and its audit row (db/queries/imports). So a file with errors never takes the
 * write lock, and a good one holds it only while its rows are written. Any row
 * error, a duplicate file or any failure rolls everything back; validation goes
 * on after the first error so that every error is counted. Rows identical to
 * live rows of the workspace (or to earlier rows of the same file) are skipped
 * and reported.
 */
import { duplicateFile, findImportBySha, loadImportReferences, openValueImport, type ImportActor, type ImportFileFacts, type ImportOutcome } from '@/db/queries/imports';
import { insertMaterialRows, insertMethodRows, listRetractedMethodLabels } from '@/db/queries/catalog-import';
import { MissingCatalog } from '@/lib/import/create-missing';
import { isImportRefusal } from '@/lib/import/errors';
import { checkMethodTable, tableRefusal, unusedLineErrors, type MethodTableLine } from '@/lib/import/method-table';
import { RowValidator, type PendingRow } from '@/lib/import/row-validator';
import { StagedChunks } from './staged-rows';
import type { ImportTable } from '@/lib/import/table';
import type { DefaultUnits } from '@/lib/import/units';

export async function commitImport(args: {
  workspaceId: string;
  actor: ImportActor;
  file: ImportFileFacts & { kind: 'measurements' | 'calculations' };
  table: ImportTable;
  units?: DefaultUnits;
  /** Calculations: create missing materials and methods from the rows' catalogue columns (permissions checked by the caller). */
  createMissing?: boolean;
  /** With createMissing: the wizard's method table, whose lines define the new methods they name (lib/import/method-table.ts). */
  methodTable?: MethodTableLine[];
}): Promise<ImportOutcome> {
  const { workspaceId, actor, file, table } = args;
  const first = await findImportBySha(workspaceId, file.sha256);
  if (first) throw duplicateFile(first);
  const references = await loadImportReferences(workspaceId);
  const columnName = (key: string) => table.columnName(key);
  const createMissing = args.createMissing && file.kind === 'calculations';
  const reserved = createMissing ? await listRetractedMethodLabels(workspaceId) : new Set<string>();
  // Checked against the stored labels before any row adds its own.
  const lines = createMissing && args.methodTable ? checkMethodTable(args.methodTable, { stored: (label) => references.methods.has(label), reserved }) : null;
  const missing = createMissing ? new MissingCatalog(references, columnName, reserved, undefined, lines?.methods) : undefined;
  const validator = new RowValidator({ kind: file.kind, references, units: args.units, columnName, missing }, references);
  // The table's errors refuse the import with the rows' own (tableRefusal); meanwhile no chunk is staged.
  const lineErrors = lines ? [...lines.errors] : [];
  // Every row is validated before the write lock is taken: a file with errors never takes it, and a good one holds
  // it only while its rows are stored. The valid chunks wait on disk (staged-rows.ts), with the catalogue records
  // a createMissing import must write before them.
  type Staged = { rows: PendingRow[]; fresh: ReturnType<MissingCatalog['takeNew']> | null };
  const staged = await StagedChunks.open<Staged>();
  try {
    const stage = async (rows: PendingRow[]) => {
      if (lineErrors.length) return;
      const fresh = missing ? missing.takeNew() : null;
      if (rows.length || (fresh && (fresh.materials.length || fresh.methods.length))) await staged.push({ rows, fresh });
    };
    for await (const rows of table.batches()) {
      for (const chunk of validator.accept(rows)) await stage(chunk);
    }
    if (lines && missing) lineErrors.push(...unusedLineErrors(missing.unusedTableLines()));
    let last: PendingRow[];
    try {
      last = validator.finish(table.format);
    } catch (e) {
      throw lineErrors.length && isImportRefusal(e) ? tableRefusal(lineErrors, e) : e;
    }
    if (lineErrors.length) throw tableRefusal(lineErrors, null);
    await stage(last);

    const writer = await openValueImport(workspaceId, actor, file);
    let insertedCount = 0;
    try {
      for await (const { rows, fresh } of staged.chunks()) {
        if (fresh && (fresh.materials.length || fresh.methods.length)) {
          await writer.within(async (raw, tx) => {
            await insertMaterialRows(raw, workspaceId, writer.importId, actor.userId, fresh.materials);
            await insertMethodRows(tx, workspaceId, writer.importId, actor.userId, fresh.methods);
          });
        }
        const { inserted, identical } = await writer.insertValueRows(rows);
        insertedCount += inserted;
        for (const d of identical) validator.skipDuplicate(d.row, d.sameFile ? 'Identical to an earlier row of this file; skipped.' : 'Identical to a row already in the workspace; skipped.');
      }
      await writer.commit(
        { rowCount: validator.rowCount, insertedCount, duplicateCount: validator.duplicateCount },
        missing ? { createMissing: true, createdMaterials: missing.createdMaterialCount, createdMethods: missing.createdMethodCount } : undefined,
      );
    } catch (e) {
      await writer.abort();
      throw e;
    }
    const { warnings, warningCount } = validator.warnings();
    const created = missing ? { createdMaterials: missing.createdMaterialCount, createdMethods: missing.createdMethodCount } : {};
    return { importId: writer.importId, rowCount: validator.rowCount, insertedCount, duplicateCount: validator.duplicateCount, duplicates: validator.duplicates, warnings, warningCount, ...created };
  } finally {
    await staged.dispose();
  }
}
