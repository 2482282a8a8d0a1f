import { requireBenchmark } from '@/db/queries/benchmarks';
import { requireRevision } from '@/db/queries/revisions';
import { AppError } from '@/lib/errors';
import { apiRoute } from '@/lib/api/handler';
import { methodStatisticsResponseSchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { benchmarkMethodParams, methodRow, NO_STORE, revisionHead, revisionQueryOf } from '../../../../_lib/reads';

/**
 * GET /api/v1/benchmarks/{id}/methods/{methodId}/statistics[?revision=N] — one method's row of the benchmark
 * page: N, MAE, RMSE, bias (meanSignedError) and the rest on its own pairs, its coverage, rank and its errors on
 * the common pairs, exactly as the stored revision holds them.
 */
export const GET = apiRoute('benchmarks:read', benchmarkMethodParams, async (request, ctx, params) => {
  const wanted = revisionQueryOf(request);
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const r = await requireRevision(ctx.workspaceId, bm.id, wanted);
  const m = r.statistics.methods.find((x) => x.methodId === params.methodId);
  if (!m) throw new AppError('not-found', `The method is not in revision ${r.number} of this benchmark.`);
  const body = toApi(methodStatisticsResponseSchema, {
    benchmarkId: bm.id,
    revision: revisionHead(r),
    unit: r.statistics.unit,
    ranking: r.statistics.ranking ?? null,
    method: methodRow(m),
  });
  return Response.json(body, { headers: NO_STORE });
});
