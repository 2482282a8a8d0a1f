import { listBenchmarks } from '@/db/queries/benchmarks';
import { listRoute } from '@/lib/api/resources';
import { benchmarkSummarySchema } from '@/lib/api/schemas';

/** GET /api/v1/benchmarks — the workspace's live benchmarks with the headline of their latest revision. */
export const GET = listRoute('benchmarks:read', benchmarkSummarySchema, async (workspaceId, page) => {
  const all = await listBenchmarks(workspaceId);
  const start = (page.page - 1) * page.size;
  return { rows: all.slice(start, start + page.size), total: all.length };
});
