import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { requireRevision } from '@/db/queries/revisions';
import { leaderboardCsv, leaderboardLatex } from '@/lib/benchmark/leaderboard-export';
import { benchmarkRouteParams, revisionParam } from '@/lib/benchmark/route-params';

const formatParam = z.enum(['csv', 'latex'], 'Query parameter "format" must be csv or latex.');

function fileSlug(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'benchmark';
}

/** The leaderboard of the latest (or ?revision=N) revision as ?format=csv or ?format=latex (a booktabs table). */
export const GET = workspaceRoute('benchmarks:read', benchmarkRouteParams, async (request, ctx, params) => {
  const wanted = revisionParam(request);
  if (!wanted.ok) throw new AppError('bad-request', wanted.message);
  const format = formatParam.safeParse(new URL(request.url).searchParams.get('format') ?? undefined);
  if (!format.success) throw new AppError('bad-request', format.error.issues[0].message);
  const bm = await requireBenchmark(ctx.workspace.id, params.benchmarkId);
  const revision = await requireRevision(ctx.workspace.id, bm.id, wanted.value);
  const name = `${fileSlug(bm.name)}-r${revision.number}-leaderboard`;
  const headers = { 'cache-control': 'private, no-store' };
  if (format.data === 'csv') {
    return new Response(leaderboardCsv(revision.statistics), {
      headers: { ...headers, 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${name}.csv"` },
    });
  }
  const tex = leaderboardLatex(revision.statistics, { benchmarkName: bm.name, revisionNumber: revision.number, fingerprint: revision.fingerprint });
  return new Response(tex, { headers: { ...headers, 'content-type': 'application/x-tex; charset=utf-8', 'content-disposition': `attachment; filename="${name}.tex"` } });
});
