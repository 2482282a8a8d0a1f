import { workspaceRoute } from '@/lib/route';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { latestRevisionHead } from '@/db/queries/revisions';
import { recomputeStatus } from '@/lib/services/benchmarks/recompute-queue';
import { benchmarkRouteParams } from '@/lib/benchmark/route-params';
import type { RecomputeStatus } from '@/lib/benchmark/recompute-status';

/**
 * Whether a newer revision of the benchmark is being computed, and the latest stored one:
 * a few bytes that the benchmark page polls after an import (the statistics route carries the whole snapshot).
 */
export const GET = workspaceRoute('benchmarks:read', benchmarkRouteParams, async (_request, ctx, params) => {
  const bm = await requireBenchmark(ctx.workspace.id, params.benchmarkId);
  const status = await recomputeStatus(ctx.workspace.id, bm.id);
  const head = await latestRevisionHead(ctx.workspace.id, bm.id);
  const body: RecomputeStatus = {
    state: status.state,
    computing: status.state === 'queued' || status.state === 'running',
    error: status.error,
    attempts: status.attempts,
    retryAt: status.retryAt?.toISOString() ?? null,
    latestRevision: head ? { number: head.number, createdAt: head.createdAt.toISOString() } : null,
  };
  return Response.json(body, { headers: { 'cache-control': 'private, no-store' } });
});
