import 'server-only';
import type { ImportActor, ImportOutcome } from '@/db/queries/imports';
import { dataChanged } from '@/lib/services/data-changed';

/** New rows may move every benchmark of the workspace: queue their recomputation (a job), never waiting for it. */
export async function recomputeAfter(workspaceId: string, actor: ImportActor, outcome: ImportOutcome): Promise<ImportOutcome> {
  if (outcome.insertedCount > 0) await dataChanged(workspaceId, { cause: { trigger: 'import', importId: outcome.importId, userId: actor.userId } });
  return outcome;
}
