import { requireBenchmark } from '@/db/queries/benchmarks';
import { requireRevision } from '@/db/queries/revisions';
import { apiRoute } from '@/lib/api/handler';
import { revisionSchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { methodRow, NO_STORE, revisionNumberParams } from '../../../_lib/reads';

/** GET /api/v1/benchmarks/{id}/revisions/{number} — one revision's statistics per method and its ranking (pairs: /pairs?revision=N). */
export const GET = apiRoute('benchmarks:read', revisionNumberParams, async (_request, ctx, params) => {
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const r = await requireRevision(ctx.workspaceId, bm.id, params.number);
  const s = r.statistics;
  const body = toApi(revisionSchema, {
    benchmarkId: bm.id,
    number: r.number,
    fingerprint: r.fingerprint,
    createdAt: r.createdAt,
    isLatest: r.isLatest,
    cause: r.cause,
    unit: s.unit,
    quantity: s.quantity,
    methods: s.methods.map(methodRow),
    ranking: s.ranking ?? null,
    counts: s.counts,
    pairCount: s.pairs.length,
    qualityCount: s.quality.length,
    empty: s.empty,
  });
  return Response.json(body, { headers: NO_STORE });
});
