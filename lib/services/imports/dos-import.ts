import 'server-only';
import type { DosImportOutcome } from '@/db/queries/dos-import';
import type { SpooledDos } from './dos-commit';
import { importRefusal } from '@/lib/import/errors';
import { spool } from '@/lib/import/spool';
import { offLoop } from '@/lib/services/off-loop';

export type DosImportInput = Omit<SpooledDos, 'path' | 'sha256' | 'byteCount'> & {
  /** The file's bytes as they arrive (already limited to IMPORT_MAX_BYTES by the caller). */
  body: AsyncIterable<Uint8Array>;
};

/**
 * The one server path of a DOS file (wizard and API): spool and hash the bytes,
 * then parse, compute and commit in one transaction (dos-commit.ts), in the
 * worker process when one runs, and recompute the workspace's benchmarks in the
 * background.
 */
export async function importDosFile(input: DosImportInput): Promise<DosImportOutcome> {
  const { body, ...job } = input;
  const spooled = await spool(body);
  try {
    if (spooled.byteCount === 0) throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
    return await offLoop('import-dos', { ...job, path: spooled.path, sha256: spooled.sha256, byteCount: spooled.byteCount });
  } finally {
    await spooled.cleanup();
  }
}
