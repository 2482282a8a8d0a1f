import { requireBenchmark } from '@/db/queries/benchmarks';
import { getMethod } from '@/db/queries/methods';
import { requireRevision } from '@/db/queries/revisions';
import { AppError } from '@/lib/errors';
import { apiRoute } from '@/lib/api/handler';
import { verdictQuerySchema, verdictSchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { methodVerdict } from '@/lib/benchmark/verdict';
import { recomputeStatus } from '@/lib/services/benchmarks/recompute-queue';
import { benchmarkMethodParams, NO_STORE, parseQuery, revisionHead } from '../../../../_lib/reads';

/**
 * GET /api/v1/benchmarks/{id}/methods/{methodId}/verdict?maxMae=…&minCoverage=…[&revision=N] — pass when the
 * method's MAE on the common pairs of the ranking is at most maxMae (in the benchmark's unit) and its coverage is
 * at least minCoverage (0–1). The numbers are the stored revision's, as the benchmark page shows them.
 */
export const GET = apiRoute('benchmarks:read', benchmarkMethodParams, async (request, ctx, params) => {
  const q = parseQuery(request, verdictQuerySchema);
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  const method = await getMethod(ctx.workspaceId, params.methodId);
  if (!method) throw new AppError('not-found', 'No such method in this workspace.');
  const { state } = await recomputeStatus(ctx.workspaceId, bm.id);
  const r = await requireRevision(ctx.workspaceId, bm.id, q.revision);
  const result = methodVerdict({ snapshot: r.statistics, methodId: method.id, maxMae: q.maxMae, minCoverage: q.minCoverage });
  const pending = state === 'queued' || state === 'running';
  const warnings = [...result.warnings];
  if (pending) warnings.push(`This verdict is of revision ${r.number}; a newer revision is being computed (state ${state}). Poll /status and ask again.`);
  else if (!r.isLatest) warnings.push(`This verdict is of revision ${r.number}, not the latest.`);
  if (state === 'failed') warnings.push('The last recomputation of this benchmark failed; the verdict is of the latest stored revision.');
  const body = toApi(verdictSchema, {
    verdict: result.verdict,
    reasons: result.reasons,
    warnings,
    benchmark: { id: bm.id, name: bm.name, quantity: bm.quantity },
    method: { id: method.id, label: method.label },
    thresholds: { maxMae: q.maxMae, minCoverage: q.minCoverage, unit: r.statistics.unit },
    unit: r.statistics.unit,
    numbers: result.numbers,
    ground: result.ground,
    own: result.own,
    revision: revisionHead(r),
    recomputation: { state, pending },
  });
  return Response.json(body, { headers: NO_STORE });
});
