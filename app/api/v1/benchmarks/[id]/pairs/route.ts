import { z } from 'zod';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { requireRevision } from '@/db/queries/revisions';
import { apiRoute } from '@/lib/api/handler';
import { pairSchema, pageQuerySchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { benchmarkIdParams, NO_STORE, parseQuery } from '../../_lib/reads';

const pairsQuery = pageQuerySchema.extend({
  revision: z.coerce.number().int().positive().optional(),
  method: z.string().min(1).max(100).optional(),
  material: z.string().min(1).max(100).optional(),
});

/** GET /api/v1/benchmarks/{id}/pairs[?revision=N&method=…&material=…&page=&size=] — the pairs of a revision, in stored order. */
export const GET = apiRoute('benchmarks:read', benchmarkIdParams, async (request, ctx, params) => {
  const q = parseQuery(request, pairsQuery);
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const r = await requireRevision(ctx.workspaceId, bm.id, q.revision);
  const all = r.statistics.pairs.filter((p) => (!q.method || p.methodId === q.method) && (!q.material || p.materialId === q.material));
  const start = (q.page - 1) * q.size;
  const items = all.slice(start, start + q.size).map((p) => toApi(pairSchema, p));
  return Response.json({ items, page: q.page, size: q.size, total: all.length, revision: r.number, unit: r.statistics.unit }, { headers: NO_STORE });
});
