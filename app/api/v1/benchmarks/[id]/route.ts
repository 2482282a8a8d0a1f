import { requireBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { apiRoute } from '@/lib/api/handler';
import { benchmarkSchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { benchmarkIdParams, methodRow, NO_STORE } from '../_lib/reads';

/** GET /api/v1/benchmarks/{id} — the definition (scope, rules) and a summary of the latest revision. */
export const GET = apiRoute('benchmarks:read', benchmarkIdParams, async (_request, ctx, params) => {
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const latest = await getRevision(ctx.workspaceId, bm.id);
  const body = toApi(benchmarkSchema, {
    id: bm.id,
    name: bm.name,
    purpose: bm.purpose ?? null,
    quantity: bm.quantity,
    scope: bm.scope,
    rules: bm.rules,
    createdAt: bm.createdAt,
    latestRevision: latest
      ? {
          number: latest.number,
          fingerprint: latest.fingerprint,
          createdAt: latest.createdAt.toISOString(),
          unit: latest.statistics.unit,
          ranking: latest.statistics.ranking ?? null,
          methods: latest.statistics.methods.map(methodRow),
        }
      : null,
  });
  return Response.json(body, { headers: NO_STORE });
});
