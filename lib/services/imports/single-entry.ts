import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import type { ImportActor, ImportOutcome } from '@/db/queries/imports';
import { commitImport } from './commit-values';
import { dataChanged } from '@/lib/services/data-changed';
import { entryName, entryRow, type SingleEntryInput } from '@/lib/import/single-entry';
import { jsonTable } from '@/lib/import/table';

/**
 * Commits one typed entry as a one-row import (validated by validateRow inside
 * commitImport, atomic, audited) and recomputes the workspace's benchmarks after it.
 * Each submission is its own import: the hash carries a nonce, so an entry that
 * was undone can be typed again; a row identical to a live one is skipped and reported.
 */
export async function commitSingleEntry(workspaceId: string, actor: ImportActor, input: SingleEntryInput): Promise<ImportOutcome> {
  const row = entryRow(input);
  const body = JSON.stringify({ kind: input.kind, row });
  const sha256 = createHash('sha256').update(`single-entry\u001f${randomUUID()}\u001f${body}`).digest('hex');
  const outcome = await commitImport({
    workspaceId,
    actor,
    file: { kind: input.kind, fileName: entryName(input), sha256, byteCount: Buffer.byteLength(body), via: 'form' },
    table: jsonTable(input.kind, [row]),
  });
  if (outcome.insertedCount > 0) await dataChanged(workspaceId, { cause: { trigger: 'import', importId: outcome.importId, userId: actor.userId } });
  return outcome;
}
