import { requireBenchmark } from '@/db/queries/benchmarks';
import { listRevisionPage } from '@/db/queries/revisions';
import { apiRoute } from '@/lib/api/handler';
import { parsePageQuery } from '@/lib/api/resources';
import { revisionListItemSchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { benchmarkIdParams, NO_STORE } from '../../_lib/reads';

/** GET /api/v1/benchmarks/{id}/revisions — a page of the benchmark's revisions, newest first, with their causes. */
export const GET = apiRoute('benchmarks:read', benchmarkIdParams, async (request, ctx, params) => {
  const page = parsePageQuery(request);
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const { rows, total } = await listRevisionPage(ctx.workspaceId, bm.id, page);
  return Response.json({ items: rows.map((r) => toApi(revisionListItemSchema, r)), page: page.page, size: page.size, total }, { headers: NO_STORE });
});
