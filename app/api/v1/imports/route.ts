import { z } from 'zod';
import { listImports } from '@/db/queries/imports';
import { AppError, issuesText } from '@/lib/errors';
import { withImportSlot } from '@/lib/api-limits';
import type { TokenContext } from '@/lib/api/auth';
import { apiRoute } from '@/lib/api/handler';
import { envValue } from '@/lib/env';
import { listRoute } from '@/lib/api/resources';
import { importJsonBody, importFile } from '@/lib/services/imports/csv-import';
import { parseDosQuery } from '@/lib/import/dos-format';
import { importDosFile } from '@/lib/services/imports/dos-import';
import { importKindQuerySchema, importSummarySchema } from '@/lib/api/schemas';
import { limitedBody, readLimitedBody } from '@/lib/stream-limit';

/**
 * POST /api/v1/imports — a JSON body `{ kind, fileName?, units?, onChange?, createMissing?, rows }`, or a
 * CSV file (`Content-Type: text/csv`, `?kind=…&fileName=…&onChange=…&createMissing=…`; kind=sources also
 * BibTeX, RIS or CSL-JSON; catalogue kinds in lib/services/imports/catalog-import.ts; a phonon DOS with
 * `?kind=dos&temperatures=298.15,300`). 201 with the counts,
 * 422 with every row error, 409 for a file already imported, 413 over IMPORT_MAX_BYTES,
 * 429 when the workspace already runs IMPORT_CONCURRENCY_PER_WORKSPACE imports.
 */
export const POST = apiRoute('imports:create', z.object({}), (request, ctx) => withImportSlot(ctx.workspaceId, () => runImport(request, ctx)));

async function runImport(request: Request, ctx: TokenContext): Promise<Response> {
  const maxBytes = envValue('IMPORT_MAX_BYTES');
  const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
  const actor = { userId: ctx.createdBy, tokenId: ctx.tokenId };
  let outcome;
  if (type === 'application/json') {
    outcome = await importJsonBody({ workspaceId: ctx.workspaceId, actor, role: ctx.role, bytes: await readLimitedBody(request, maxBytes) });
  } else if (type === 'text/csv' || type === 'application/x-bibtex' || type === 'text/plain') {
    const url = new URL(request.url);
    if (url.searchParams.get('kind') === 'dos') {
      const dos = parseDosQuery(url.searchParams);
      if (!dos.success) throw new AppError('bad-request', issuesText(dos.error.issues));
      outcome = await importDosFile({
        workspaceId: ctx.workspaceId,
        actor,
        via: 'api',
        fileName: dos.data.fileName ?? null,
        temperatures: dos.data.temperatures,
        body: limitedBody(request, maxBytes),
      });
      return Response.json(outcome, { status: 201, headers: { location: `/api/v1/imports/${outcome.importId}` } });
    }
    const param = (name: string) => url.searchParams.get(name) ?? undefined;
    const query = importKindQuerySchema.safeParse({ kind: param('kind'), fileName: param('fileName'), onChange: param('onChange'), prefer: param('prefer'), createMissing: param('createMissing') });
    if (!query.success) throw new AppError('bad-request', issuesText(query.error.issues));
    outcome = await importFile({
      workspaceId: ctx.workspaceId,
      actor,
      role: ctx.role,
      via: 'api',
      kind: query.data.kind,
      fileName: query.data.fileName ?? null,
      onChange: query.data.onChange,
      prefer: query.data.prefer,
      createMissing: query.data.createMissing === 'true',
      body: limitedBody(request, maxBytes),
    });
  } else {
    throw new AppError('bad-request', 'Send Content-Type: application/json (rows) or text/csv (a file, with ?kind=; application/x-bibtex for sources).');
  }
  // A catalogue import whose rows were all unchanged wrote nothing: 200 without an import.
  if (outcome.importId === null) return Response.json(outcome, { status: 200 });
  return Response.json(outcome, { status: 201, headers: { location: `/api/v1/imports/${outcome.importId}` } });
}

export const GET = listRoute('imports:read', importSummarySchema, async (workspaceId, page) => {
  const { items, total } = await listImports(workspaceId, page);
  return { rows: items, total };
});
