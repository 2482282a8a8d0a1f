import 'server-only';
import { readFile } from 'node:fs/promises';
import type { ImportActor, ImportOutcome } from '@/db/queries/imports';
import { importRequestSchema } from '@/lib/api/schemas';
import { isCatalogKind } from '@/lib/import/catalog-columns';
import { decodeUtf8Strict } from '@/lib/import/decode';
import { excerpt, importRefusal, MAX_REPORTED_ERRORS, type RowError } from '@/lib/import/errors';
import type { Prefer } from '@/lib/import/structure-column';
import { jsonTable } from '@/lib/import/table';
import type { DefaultUnits } from '@/lib/import/units';
import type { WorkspaceRole } from '@/lib/permissions';
import { recomputeAfter } from './after-import';
import { importCatalogTable, type CatalogImportOutcome, type OnChange } from './catalog-import';
import { commitImport } from './commit-values';
import { assertCreateMissingPermissions } from './create-missing';

/** A JSON import body spooled to disk and hashed: plain data, so it can cross to the worker process. */
export interface SpooledJsonBody {
  workspaceId: string;
  actor: ImportActor;
  role: WorkspaceRole;
  path: string;
  sha256: string;
  byteCount: number;
}

/**
 * A JSON import body `{ kind, fileName?, units?, rows }`: its bytes are hashed
 * like a file (the same body twice is refused), the rows validated like CSV rows.
 * Runs where lib/services/off-loop.ts puts it (csv-import.ts importJsonBody spools the body).
 */
export async function commitJsonBody(input: SpooledJsonBody): Promise<ImportOutcome | CatalogImportOutcome> {
  const bytes = new Uint8Array(await readFile(/*turbopackIgnore: true*/ input.path));
  const text = decodeUtf8Strict(bytes, { csv: false });
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
  const sha256 = input.sha256;
  if (isCatalogKind(body.kind)) {
    const catalog = body as { kind: typeof body.kind & ('materials' | 'methods' | 'sources'); fileName?: string; onChange?: OnChange; prefer?: Prefer; rows: Array<Record<string, unknown>> };
    return importCatalogTable(
      { workspaceId: input.workspaceId, actor: input.actor, role: input.role, via: 'api', kind: catalog.kind, fileName: catalog.fileName ?? null, sha256, byteCount: input.byteCount, onChange: catalog.onChange, prefer: catalog.prefer },
      jsonTable(catalog.kind, catalog.rows),
    );
  }
  const values = body as { kind: 'measurements' | 'calculations'; fileName?: string; units?: unknown; createMissing?: boolean; rows: Array<Record<string, unknown>> };
  if (values.createMissing) assertCreateMissingPermissions(input.role);
  const outcome = await commitImport({
    createMissing: values.createMissing,
    workspaceId: input.workspaceId,
    actor: input.actor,
    file: { kind: values.kind, fileName: values.fileName ?? null, sha256, byteCount: input.byteCount, via: 'api' },
    table: jsonTable(values.kind, values.rows),
    units: values.units as DefaultUnits | undefined,
  });
  return recomputeAfter(input.workspaceId, input.actor, outcome);
}

