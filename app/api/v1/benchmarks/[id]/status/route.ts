import { requireBenchmark } from '@/db/queries/benchmarks';
import { importRowsInRevision, latestRevisionHead } from '@/db/queries/revisions';
import { AppError } from '@/lib/errors';
import { apiRoute } from '@/lib/api/handler';
import { benchmarkStatusSchema, statusQuerySchema } from '@/lib/api/schemas';
import { toApi } from '@/lib/api/serialize';
import { recomputeStatus } from '@/lib/services/benchmarks/recompute-queue';
import { benchmarkIdParams, NO_STORE, parseQuery } from '../../_lib/reads';

/**
 * GET /api/v1/benchmarks/{id}/status[?import=<importId>] — the recomputation state (idle, queued, running,
 * failed) and the latest revision. With ?import=, whether that revision includes the import: an import's
 * recomputation is queued before its 201 is sent, so once the state is idle the latest revision reflects it
 * (`settled`), and `rowsInRevision` says how many of its rows the revision was computed from.
 */
export const GET = apiRoute('benchmarks:read', benchmarkIdParams, async (request, ctx, params) => {
  const query = parseQuery(request, statusQuerySchema);
  const bm = await requireBenchmark(ctx.workspaceId, params.id);
  // The state is read before the revision, so "idle" can never pair with a revision older than the import.
  const { state, error } = await recomputeStatus(ctx.workspaceId, bm.id);
  const head = await latestRevisionHead(ctx.workspaceId, bm.id);
  let imported: Record<string, unknown> | undefined;
  if (query.import) {
    const found = await importRowsInRevision(ctx.workspaceId, query.import, head?.id ?? null);
    if (!found) throw new AppError('not-found', 'No such import in this workspace.');
    const settled = state === 'idle';
    imported = {
      id: found.id,
      status: found.status,
      settled,
      revision: settled ? (head?.number ?? null) : null,
      rowsInRevision: found.inRevision,
      importedRows: found.insertedCount,
    };
  }
  const body = toApi(benchmarkStatusSchema, {
    benchmarkId: bm.id,
    state,
    computing: state === 'queued' || state === 'running',
    error,
    latestRevision: head ? { number: head.number, fingerprint: head.fingerprint, createdAt: head.createdAt.toISOString() } : null,
    import: imported,
  });
  return Response.json(body, { headers: NO_STORE });
});
