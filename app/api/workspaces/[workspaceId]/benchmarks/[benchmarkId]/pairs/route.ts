import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { pairLookups, requireRevision } from '@/db/queries/revisions';
import { pairsCsv, plotPoints } from '@/lib/benchmark/pairs-export';
import { benchmarkRouteParams, revisionParam } from '@/lib/benchmark/route-params';
import { encodePlotColumns } from '@/lib/benchmark/plot-columns';

function fileSlug(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'benchmark';
}

/**
 * Pairs of a revision: ?format=csv downloads them (formula-injection safe); JSON feeds the plots, in columns
 * with lookup tables (lib/benchmark/plot-columns.ts). Compression is Next's: its server gzips answers for
 * clients that accept it (compress is on by default, and scripts/server.mjs goes through Next's handler).
 */
export const GET = workspaceRoute('benchmarks:read', benchmarkRouteParams, async (request, ctx, params) => {
  const wanted = revisionParam(request);
  if (!wanted.ok) throw new AppError('bad-request', wanted.message);
  const format = new URL(request.url).searchParams.get('format') ?? 'json';
  if (format !== 'json' && format !== 'csv') throw new AppError('bad-request', `Query parameter "format" must be json or csv, got "${format}".`);
  const bm = await requireBenchmark(ctx.workspace.id, params.benchmarkId);
  const revision = await requireRevision(ctx.workspace.id, bm.id, wanted.value);
  const lookups = await pairLookups(ctx.workspace.id, revision.statistics);
  if (format === 'csv') {
    return new Response(pairsCsv(revision.statistics, lookups), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${fileSlug(bm.name)}-r${revision.number}-pairs.csv"`,
        'cache-control': 'private, no-store',
      },
    });
  }
  return Response.json(encodePlotColumns(plotPoints(revision.statistics, lookups), { revision: revision.number, unit: revision.statistics.unit }), {
    headers: { 'cache-control': 'private, no-store' },
  });
});
