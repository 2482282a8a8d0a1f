import { z } from 'zod';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { listRevisionFlags, requireRevision } from '@/db/queries/revisions';
import { apiRoute } from '@/lib/api/handler';
import { flagSchema, pageQuerySchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { benchmarkIdParams, NO_STORE, parseQuery } from '../../_lib/reads';

const flagsQuery = pageQuerySchema.extend({
  revision: z.coerce.number().int().positive().optional(),
  method: z.string().min(1).max(100).optional(),
  kind: z.enum(['outlier', 'quality']).optional(),
});

/** GET /api/v1/benchmarks/{id}/flags[?revision=N&method=…&kind=outlier|quality] — the outlier and quality flags a revision raised. */
export const GET = apiRoute('benchmarks:read', benchmarkIdParams, async (request, ctx, params) => {
  const q = parseQuery(request, flagsQuery);
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const r = await requireRevision(ctx.workspaceId, bm.id, q.revision);
  const { rows, total } = await listRevisionFlags(ctx.workspaceId, r.id, { methodId: q.method, kind: q.kind }, q);
  return Response.json({ items: rows.map((f) => toApi(flagSchema, f)), page: q.page, size: q.size, total, revision: r.number }, { headers: NO_STORE });
});
