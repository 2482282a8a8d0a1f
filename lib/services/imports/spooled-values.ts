import 'server-only';
import { createReadStream } from 'node:fs';
import type { ImportActor, ImportOutcome } from '@/db/queries/imports';
import type { ImportableKind } from '@/lib/import/columns';
import type { ColumnMapping } from '@/lib/import/header';
import { openCsvTable } from '@/lib/import/table';
import type { DefaultUnits } from '@/lib/import/units';
import type { MethodTableLine } from '@/lib/import/method-table';
import { commitImport } from './commit-values';

/** Bytes read from a spooled file at a time. */
export const READ_CHUNK_BYTES = 1 << 20;

/** A values file already spooled to disk and hashed, and what to do with it: plain data, so it can cross to the worker process. */
export interface SpooledValueImport {
  workspaceId: string;
  actor: ImportActor;
  kind: ImportableKind;
  fileName: string | null;
  via: 'wizard' | 'api';
  path: string;
  sha256: string;
  byteCount: number;
  mapping?: ColumnMapping;
  units?: DefaultUnits;
  createMissing?: boolean;
  methodTable?: MethodTableLine[];
}

/** Reads, validates and commits a spooled values file (commitImport): the heavy part of an import, run off the request event loop (lib/services/off-loop.ts). */
export async function commitSpooledValues(job: SpooledValueImport): Promise<ImportOutcome> {
  const stream = createReadStream(/*turbopackIgnore: true*/ job.path, { highWaterMark: READ_CHUNK_BYTES }) as AsyncIterable<Buffer>;
  const table = await openCsvTable(stream, job.kind, job.mapping);
  return commitImport({
    createMissing: job.createMissing,
    methodTable: job.methodTable,
    workspaceId: job.workspaceId,
    actor: job.actor,
    file: { kind: job.kind, fileName: job.fileName, sha256: job.sha256, byteCount: job.byteCount, via: job.via },
    table,
    units: job.units,
  });
}
