import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { envValue } from '@/lib/env';
import { AppError, issuesText, toProblem } from '@/lib/errors';
import { importFile } from '@/lib/services/imports/csv-import';
import { withImportSlot } from '@/lib/api-limits';
import type { MemberContext } from '@/lib/session';
import { parseDosQuery } from '@/lib/import/dos-format';
import { importDosFile } from '@/lib/services/imports/dos-import';
import { parseWizardQuery } from '@/lib/import/wizard-options';
import type { DefaultUnits } from '@/lib/import/units';
import { limitedBody } from '@/lib/stream-limit';

/**
 * The wizard's commit: the original file bytes as the body (not a server action,
 * whose body limit is 1 MB), with the corrected mapping and units in the query.
 * The server decodes, parses and validates everything again; it is the authority.
 * A calculations import with createMissing may carry the method table (`methodTable`, JSON lines
 * checked by zod here and line by line in commitImport), which defines the new methods it lists.
 */
export const POST = workspaceRoute('imports:create', z.object({ workspaceId: z.string().min(1) }), async (request, ctx) => {
  try {
    return await withImportSlot(ctx.workspace.id, () => postImport(request, ctx));
  } catch (e) {
    return toProblem(e);
  }
});

async function postImport(request: Request, ctx: MemberContext): Promise<Response> {
  const params = new URL(request.url).searchParams;
  if (params.get('kind') === 'dos') return postDos(request, params, ctx.workspace.id, ctx.user.id);
  const options = parseWizardQuery(params);
  if (!options.success) throw new AppError('bad-request', issuesText(options.error.issues));
  try {
    const outcome = await importFile({
      workspaceId: ctx.workspace.id,
      actor: { userId: ctx.user.id, tokenId: null },
      role: ctx.role,
      via: 'wizard',
      kind: options.data.kind,
      onChange: options.data.onChange,
      prefer: options.data.prefer,
      createMissing: options.data.createMissing,
      methodTable: options.data.methodTable,
      fileName: options.data.fileName ?? null,
      body: limitedBody(request, envValue('IMPORT_MAX_BYTES')),
      mapping: options.data.mapping,
      units: options.data.units as DefaultUnits | undefined,
    });
    return Response.json(outcome, { status: outcome.importId === null ? 200 : 201 });
  } catch (e) {
    // Refused imports (422, 409, 413) answer with the same problem documents as the API.
    return toProblem(e);
  }
}

/** A phonon DOS file (?kind=dos&temperatures=…): entropies and heat capacities computed and stored as calculations. */
async function postDos(request: Request, params: URLSearchParams, workspaceId: string, userId: string): Promise<Response> {
  const options = parseDosQuery(params);
  if (!options.success) throw new AppError('bad-request', issuesText(options.error.issues));
  try {
    const outcome = await importDosFile({
      workspaceId,
      actor: { userId, tokenId: null },
      via: 'wizard',
      fileName: options.data.fileName ?? null,
      temperatures: options.data.temperatures,
      body: limitedBody(request, envValue('IMPORT_MAX_BYTES')),
    });
    return Response.json(outcome, { status: 201 });
  } catch (e) {
    return toProblem(e);
  }
}
