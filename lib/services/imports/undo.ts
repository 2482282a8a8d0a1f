import 'server-only';
/**
 * Undoing an import: in one transaction its value rows are retracted, the materials,
 * methods and sources it created are retracted (refused, naming them, while other data
 * refer to them), and the records it updated are restored from their audit rows
 * (refused when one was changed again since). Then the benchmarks recompute.
 */
import type { ImportBatch } from '@/db/schema';
import * as imports from '@/db/queries/imports';
import { undoCatalogChanges } from '@/db/queries/catalog-import';
import { dataChanged } from '../data-changed';

export async function undoImport(
  workspaceId: string,
  importId: string,
  actorUserId: string,
  reason: string,
  refusal?: (batch: ImportBatch) => string | null,
): Promise<{ retracted: number; retractedRecords?: number; restoredRecords?: number }> {
  const result = await imports.undoImport(workspaceId, importId, actorUserId, reason, refusal, (tx) => undoCatalogChanges(tx, workspaceId, importId, actorUserId, reason));
  if (result.retracted > 0 || (result.retractedRecords ?? 0) > 0 || (result.restoredRecords ?? 0) > 0) await dataChanged(workspaceId, { cause: { trigger: 'import-undone', importId, userId: actorUserId } });
  return result;
}
