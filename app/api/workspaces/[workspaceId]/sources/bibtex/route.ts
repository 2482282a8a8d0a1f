import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { sourcesToBibtex } from '@/lib/bibtex';
import { listSourcesForExport } from '@/db/queries/sources';

const params = z.object({ workspaceId: z.string().min(1) });
const MAX_IDS = 1000;

/** GET …/sources/bibtex[?ids=a,b]: the workspace's sources (or the listed ones) as a .bib file. */
export const GET = workspaceRoute('sources:read', params, async (request, ctx) => {
  const raw = new URL(request.url).searchParams.getAll('ids').flatMap((v) => v.split(','));
  const ids = raw.map((s) => s.trim()).filter(Boolean);
  if (ids.length > MAX_IDS) throw new AppError('bad-request', `At most ${MAX_IDS} ids per export.`);
  const sources = await listSourcesForExport(ctx.workspace.id, ids.length ? ids : undefined);
  if (ids.length && sources.length !== new Set(ids).size) throw new AppError('not-found', 'Some of the requested sources are not in this workspace.');
  const body = sourcesToBibtex(sources);
  return new Response(body, {
    headers: {
      'content-type': 'text/x-bibtex; charset=utf-8',
      'content-disposition': `attachment; filename="${ctx.workspace.slug}-sources.bib"`,
      'cache-control': 'no-store',
    },
  });
});
