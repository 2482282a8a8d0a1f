import 'server-only';
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { ImportActor, ImportOutcome } from '@/db/queries/imports';
import { commitImport } from './commit-values';
import { dataChanged } from '@/lib/services/data-changed';
import type { ImportableKind } from '@/lib/import/columns';
import { decodeUtf8Strict } from '@/lib/import/decode';
import { excerpt, MAX_REPORTED_ERRORS, type RowError, importRefusal } from '@/lib/import/errors';
import type { ColumnMapping } from '@/lib/import/header';
import { spool } from '@/lib/import/spool';
import { jsonTable, openCsvTable } from '@/lib/import/table';
import type { DefaultUnits } from '@/lib/import/units';
import { importRequestSchema } from '@/lib/api/schemas';

const READ_CHUNK_BYTES = 1 << 20;

export interface CsvImportInput {
  workspaceId: string;
  actor: ImportActor;
  via: 'wizard' | 'api';
  kind: ImportableKind;
  fileName: string | null;
  /** The file's bytes as they arrive (already limited to IMPORT_MAX_BYTES by the caller). */
  body: AsyncIterable<Uint8Array>;
  mapping?: ColumnMapping;
  units?: DefaultUnits;
}

/**
 * The one server path for a CSV file, from the wizard and from the API alike:
 * spool and hash the bytes, then validate and commit atomically.
 */
export async function importCsvFile(input: CsvImportInput): Promise<ImportOutcome> {
  const spooled = await spool(input.body);
  try {
    if (spooled.byteCount === 0) throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
    const stream = createReadStream(/*turbopackIgnore: true*/ spooled.path, { highWaterMark: READ_CHUNK_BYTES }) as AsyncIterable<Buffer>;
    const table = await openCsvTable(stream, input.kind, input.mapping);
    const outcome = await commitImport({
      workspaceId: input.workspaceId,
      actor: input.actor,
      file: { kind: input.kind, fileName: input.fileName, sha256: spooled.sha256, byteCount: spooled.byteCount, via: input.via },
      table,
      units: input.units,
    });
    return recomputeAfter(input.workspaceId, input.actor, outcome);
  } finally {
    await spooled.cleanup();
  }
}

/**
 * A JSON import body `{ kind, fileName?, units?, rows }`: its bytes are hashed
 * like a file (the same body twice is refused), the rows validated like CSV rows.
 */
export async function importJsonBody(input: { workspaceId: string; actor: ImportActor; bytes: Uint8Array }): Promise<ImportOutcome> {
  const text = decodeUtf8Strict(input.bytes, { csv: false });
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw importRefusal('The body is not valid JSON.', [{ row: 0, column: null, reason: `The body is not valid JSON: ${(e as Error).message}` }]);
  }
  const parsed = importRequestSchema.safeParse(json);
  if (!parsed.success) {
    // Keys and messages can carry the client's text: list a bounded number, each cut short.
    const errors: RowError[] = parsed.error.issues.slice(0, MAX_REPORTED_ERRORS).map((issue) => {
      const [top, index, key] = issue.path;
      const reason = excerpt(issue.message, 200);
      if (top === 'rows' && typeof index === 'number') {
        const column = typeof key === 'string' ? key : issue.code === 'unrecognized_keys' ? issue.keys.slice(0, 5).map((k) => excerpt(k)).join(', ') : null;
        return { row: index + 1, column: column === null ? null : excerpt(column, 200), reason };
      }
      return { row: 0, column: excerpt(issue.path.join('.'), 200) || null, reason };
    });
    throw importRefusal('The request body does not match the import schema.', errors, parsed.error.issues.length);
  }
  const body = parsed.data;
  const sha256 = createHash('sha256').update(input.bytes).digest('hex');
  const outcome = await commitImport({
    workspaceId: input.workspaceId,
    actor: input.actor,
    file: { kind: body.kind, fileName: body.fileName ?? null, sha256, byteCount: input.bytes.byteLength, via: 'api' },
    table: jsonTable(body.kind, body.rows),
    units: body.units as DefaultUnits | undefined,
  });
  return recomputeAfter(input.workspaceId, input.actor, outcome);
}

/** New rows may move every benchmark of the workspace: recompute them in the background, never blocking the import. */
function recomputeAfter(workspaceId: string, actor: ImportActor, outcome: ImportOutcome): ImportOutcome {
  if (outcome.insertedCount > 0) dataChanged(workspaceId, { cause: { trigger: 'import', importId: outcome.importId, userId: actor.userId } });
  return outcome;
}
