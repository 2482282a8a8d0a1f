import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { recomputeState } from '@/lib/services/benchmarks/recompute-queue';
import { benchmarkRouteParams, revisionParam } from '@/lib/benchmark/route-params';
import { statisticsPayload } from '@/lib/benchmark/statistics-payload';

/** Statistics of the latest (or ?revision=N) revision, without the pairs, and whether a newer one is being computed. */
export const GET = workspaceRoute('benchmarks:read', benchmarkRouteParams, async (request, ctx, params) => {
  const wanted = revisionParam(request);
  if (!wanted.ok) throw new AppError('bad-request', wanted.message);
  const bm = await requireBenchmark(ctx.workspace.id, params.benchmarkId);
  const revision = await getRevision(ctx.workspace.id, bm.id, wanted.value);
  if (!revision && wanted.value !== undefined) throw new AppError('not-found', `No revision ${wanted.value} of this benchmark.`);
  const computing = (await recomputeState(ctx.workspace.id, bm.id)) !== 'idle';
  return Response.json(statisticsPayload({ id: bm.id, name: bm.name }, revision, computing), { headers: { 'cache-control': 'private, no-store' } });
});
