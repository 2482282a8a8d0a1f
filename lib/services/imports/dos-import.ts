import 'server-only';
import { createHash } from 'node:crypto';
import { storeDosValues, type DosImportOutcome } from '@/db/queries/dos-import';
import { duplicateFile, findImportBySha, loadImportReferences } from '@/db/queries/imports';
import { computeAllDosValues, resolveDosBlocks } from '@/lib/import/dos-compute';
import type { DosParseResult } from '@/lib/import/dos-parse';
import type { ImportActor } from '@/db/queries/imports';
import { dataChanged } from '@/lib/services/data-changed';
import { StrictUtf8Decoder } from '@/lib/import/decode';
import { DosFileReader } from '@/lib/import/dos-parse';
import { importRefusal, MAX_REPORTED_ERRORS } from '@/lib/import/errors';

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
/**
 * Resolves the file's handles and computes S(T) and Cv(T) of every DOS block
 * before anything is written: any row error, unknown handle, material without
 * atoms in the cell or a duplicate file refuses the whole file.
 */
async function commitDos(input: DosImportInput, file: { fileName: string | null; sha256: string; byteCount: number; via: 'wizard' | 'api' }, parsed: DosParseResult): Promise<DosImportOutcome> {
  const first = await findImportBySha(input.workspaceId, file.sha256);
  if (first) throw duplicateFile(first);
  const references = await loadImportReferences(input.workspaceId);
  const { resolved, errors, errorCount } = resolveDosBlocks(parsed.blocks, references, (key) => parsed.columnNames[key] ?? key);
  const totalErrors = parsed.errorCount + errorCount;
  if (totalErrors > 0) {
    const all = [...parsed.errors, ...errors].sort((a, b) => a.row - b.row).slice(0, MAX_REPORTED_ERRORS);
    throw importRefusal(`Nothing was imported: ${totalErrors} ${totalErrors === 1 ? 'error' : 'errors'} in the file.`, all, totalErrors);
  }
  const values = computeAllDosValues(resolved, input.temperatures);
  const stored = await storeDosValues({
    workspaceId: input.workspaceId,
    actor: input.actor,
    file,
    rowCount: parsed.rowCount,
    values,
    rowOfBlock: resolved.map((r) => r.block.firstRow),
    auditDetails: {
      temperatures: input.temperatures,
      dos: resolved.map((r) => ({ material: r.block.material, method: r.block.method, points: r.block.frequency.length, formulaUnitsPerCell: r.formulaUnitsPerCell })),
    },
  });
  return { ...stored, rowCount: parsed.rowCount, dosCount: resolved.length, temperatures: input.temperatures, computedCount: values.length };
}

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
  const outcome = await commitDos(input, { fileName: input.fileName, sha256: hash.digest('hex'), byteCount, via: input.via }, parsed);
  if (outcome.insertedCount > 0) {
    await dataChanged(input.workspaceId, { cause: { trigger: 'import', importId: outcome.importId, userId: input.actor.userId } });
  }
  return outcome;
}
