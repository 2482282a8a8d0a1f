import 'server-only';
/** Undoing an import: its rows are retracted in one transaction, then the benchmarks recompute without them. */
import type { ImportBatch } from '@/db/schema';
import * as imports from '@/db/queries/imports';
import { dataChanged } from '../data-changed';

export async function undoImport(
  workspaceId: string,
  importId: string,
  actorUserId: string,
  reason: string,
  refusal?: (batch: ImportBatch) => string | null,
): Promise<{ retracted: number }> {
  const result = await imports.undoImport(workspaceId, importId, actorUserId, reason, refusal);
  if (result.retracted > 0) dataChanged(workspaceId, { cause: { trigger: 'import-undone', importId, userId: actorUserId } });
  return result;
}
