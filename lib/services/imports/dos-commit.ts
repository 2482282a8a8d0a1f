import 'server-only';
import { createReadStream } from 'node:fs';
import { storeDosValues, type DosImportOutcome } from '@/db/queries/dos-import';
import { duplicateFile, findImportBySha, loadImportReferences } from '@/db/queries/imports';
import { computeAllDosValues, resolveDosBlocks } from '@/lib/import/dos-compute';
import type { DosParseResult } from '@/lib/import/dos-parse';
import { dataChanged } from '@/lib/services/data-changed';
import { StrictUtf8Decoder } from '@/lib/import/decode';
import { DosFileReader } from '@/lib/import/dos-parse';
import { importRefusal, MAX_REPORTED_ERRORS } from '@/lib/import/errors';
import type { ImportActor } from '@/db/queries/imports';

/** A DOS file spooled to disk and hashed, with its options: plain data, so it can cross to the worker process. */
export interface SpooledDos {
  workspaceId: string;
  actor: ImportActor;
  via: 'wizard' | 'api';
  fileName: string | null;
  temperatures: number[];
  path: string;
  sha256: string;
  byteCount: number;
}

/**
 * Resolves the file's handles and computes S(T) and Cv(T) of every DOS block
 * before anything is written: any row error, unknown handle, material without
 * atoms in the cell or a duplicate file refuses the whole file.
 */
async function commitDos(input: SpooledDos, file: { fileName: string | null; sha256: string; byteCount: number; via: 'wizard' | 'api' }, parsed: DosParseResult): Promise<DosImportOutcome> {
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

/** Parses, computes and commits a spooled DOS file (the whole grid is in memory to integrate it), then queues the recomputation. */
export async function commitSpooledDos(job: SpooledDos): Promise<DosImportOutcome> {
  const decoder = new StrictUtf8Decoder();
  const reader = new DosFileReader();
  for await (const chunk of createReadStream(/*turbopackIgnore: true*/ job.path) as AsyncIterable<Buffer>) reader.push(decoder.decode(chunk));
  reader.push(decoder.decode(new Uint8Array(0), true));
  const parsed = reader.end();
  const outcome = await commitDos(job, { fileName: job.fileName, sha256: job.sha256, byteCount: job.byteCount, via: job.via }, parsed);
  if (outcome.insertedCount > 0) {
    await dataChanged(job.workspaceId, { cause: { trigger: 'import', importId: outcome.importId, userId: job.actor.userId } });
  }
  return outcome;
}
