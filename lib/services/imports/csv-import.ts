import 'server-only';
import { createReadStream } from 'node:fs';
import { readFile } from 'node:fs/promises';
import type { ImportActor, ImportOutcome } from '@/db/queries/imports';
import { offLoop } from '@/lib/services/off-loop';
import { READ_CHUNK_BYTES } from './spooled-values';
import type { ImportableKind, TableKind } from '@/lib/import/columns';
import { isCatalogKind } from '@/lib/import/catalog-columns';
import type { WorkspaceRole } from '@/lib/permissions';
import { importCatalogTable, importReferenceText, type CatalogImportOutcome, type OnChange } from './catalog-import';
import { recomputeAfter } from './after-import';
import type { Prefer } from '@/lib/import/structure-column';
import { assertCreateMissingPermissions } from './create-missing';
import { decodeUtf8Strict } from '@/lib/import/decode';
import { importRefusal } from '@/lib/import/errors';
import type { ColumnMapping } from '@/lib/import/header';
import { spool } from '@/lib/import/spool';
import { openCsvTable } from '@/lib/import/table';
import type { DefaultUnits } from '@/lib/import/units';
import type { MethodTableLine } from '@/lib/import/method-table';

export interface CsvImportInput {
  workspaceId: string;
  actor: ImportActor;
  /** The member's or token's role: catalogue kinds, onChange=update and createMissing need more than imports:create. */
  role?: WorkspaceRole;
  via: 'wizard' | 'api';
  kind: TableKind;
  fileName: string | null;
  /** Catalogue kinds: what to do with a row whose stored record has other values (default refuse). */
  onChange?: OnChange;
  /** Materials with a structure column: typed or structure values where they disagree. */
  prefer?: Prefer;
  /** Calculations: create materials and methods the rows name but the workspace lacks, from the rows' catalogue columns. */
  createMissing?: boolean;
  /** With createMissing (the wizard): the method table's lines, which define the new methods they name. */
  methodTable?: MethodTableLine[];
  /** The file's bytes as they arrive (already limited to IMPORT_MAX_BYTES by the caller). */
  body: AsyncIterable<Uint8Array>;
  mapping?: ColumnMapping;
  units?: DefaultUnits;
}

/** A file of any kind that is read as rows: catalogue kinds (lib/services/imports/catalog-import.ts) or values (importCsvFile). */
export async function importFile(input: CsvImportInput & { kind: TableKind }): Promise<ImportOutcome | CatalogImportOutcome> {
  const kind = input.kind;
  if (!isCatalogKind(kind)) return importCsvFile({ ...input, kind });
  const role = input.role ?? 'contributor';
  const spooled = await spool(input.body);
  try {
    if (spooled.byteCount === 0) throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
    const catalogInput = { workspaceId: input.workspaceId, actor: input.actor, role, via: input.via, kind, fileName: input.fileName, sha256: spooled.sha256, byteCount: spooled.byteCount, onChange: input.onChange, prefer: input.prefer };
    if (kind === 'sources') {
      const text = decodeUtf8Strict(new Uint8Array(await readFile(/*turbopackIgnore: true*/ spooled.path)), { csv: true });
      const references = await importReferenceText(catalogInput, text);
      if (references) return references;
    }
    const stream = createReadStream(/*turbopackIgnore: true*/ spooled.path, { highWaterMark: READ_CHUNK_BYTES }) as AsyncIterable<Buffer>;
    return await importCatalogTable(catalogInput, await openCsvTable(stream, kind, input.mapping));
  } finally {
    await spooled.cleanup();
  }
}

/**
 * The one server path for a CSV file of values, from the wizard and from the API alike:
 * spool and hash the bytes, then validate and commit atomically (in the worker process when one runs).
 */
export async function importCsvFile(input: CsvImportInput & { kind: ImportableKind }): Promise<ImportOutcome> {
  // Callers that pass no role (benches, older tests) get the least role that may import.
  const role = input.role ?? 'contributor';
  if (input.createMissing) assertCreateMissingPermissions(role);
  const spooled = await spool(input.body);
  try {
    if (spooled.byteCount === 0) throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
    // Validating and storing run in the worker process when there is one (off-loop.ts); the spool stays ours to clean up.
    const outcome = await offLoop('import-values', {
      workspaceId: input.workspaceId,
      actor: input.actor,
      kind: input.kind,
      fileName: input.fileName,
      via: input.via,
      path: spooled.path,
      sha256: spooled.sha256,
      byteCount: spooled.byteCount,
      mapping: input.mapping,
      units: input.units,
      createMissing: input.createMissing,
      methodTable: input.methodTable,
    });
    return recomputeAfter(input.workspaceId, input.actor, outcome);
  } finally {
    await spooled.cleanup();
  }
}

/**
 * A JSON import body `{ kind, fileName?, units?, rows }`: its bytes are hashed
 * like a file (the same body twice is refused), the rows validated like CSV rows
 * (json-body.ts), in the worker process when one runs: the body is spooled to a
 * file so only its path crosses.
 */
export async function importJsonBody(input: { workspaceId: string; actor: ImportActor; role: WorkspaceRole; bytes: Uint8Array }): Promise<ImportOutcome | CatalogImportOutcome> {
  const spooled = await spool(
    (async function* () {
      yield input.bytes;
    })(),
  );
  try {
    return await offLoop('import-json', { workspaceId: input.workspaceId, actor: input.actor, role: input.role, path: spooled.path, sha256: spooled.sha256, byteCount: spooled.byteCount });
  } finally {
    await spooled.cleanup();
  }
}
