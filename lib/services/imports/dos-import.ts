import 'server-only';
import { createHash } from 'node:crypto';
import { commitDosImport, type DosImportOutcome } from '@/db/queries/dos-import';
import type { ImportActor } from '@/db/queries/imports';
import { dataChanged } from '@/lib/services/data-changed';
import { StrictUtf8Decoder } from '@/lib/import/decode';
import { DosFileReader } from '@/lib/import/dos-parse';
import { importRefusal } from '@/lib/import/errors';

export interface DosImportInput {
  workspaceId: string;
  actor: ImportActor;
  via: 'wizard' | 'api';
  fileName: string | null;
  temperatures: number[];
  /** The file's bytes as they arrive (already limited to IMPORT_MAX_BYTES by the caller). */
  body: AsyncIterable<Uint8Array>;
}

/**
 * The one server path of a DOS file (wizard and API): hash and parse the bytes as
 * they arrive — the whole grid must be in memory to integrate it, so no spooling —
 * then compute and commit in one transaction, and recompute the workspace's
 * benchmarks in the background.
 */
export async function importDosFile(input: DosImportInput): Promise<DosImportOutcome> {
  const hash = createHash('sha256');
  const decoder = new StrictUtf8Decoder();
  const reader = new DosFileReader();
  let byteCount = 0;
  for await (const chunk of input.body) {
    hash.update(chunk);
    byteCount += chunk.byteLength;
    reader.push(decoder.decode(chunk));
  }
  if (byteCount === 0) throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
  reader.push(decoder.decode(new Uint8Array(0), true));
  const parsed = reader.end();
  const outcome = await commitDosImport({
    workspaceId: input.workspaceId,
    actor: input.actor,
    file: { fileName: input.fileName, sha256: hash.digest('hex'), byteCount, via: input.via },
    parsed,
    temperatures: input.temperatures,
  });
  if (outcome.insertedCount > 0) {
    dataChanged(input.workspaceId, { cause: { trigger: 'import', importId: outcome.importId, userId: input.actor.userId } });
  }
  return outcome;
}
