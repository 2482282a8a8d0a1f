import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { requireRevision, sourcesOfRevision } from '@/db/queries/revisions';
import { sourcesToBibtex } from '@/lib/benchmark/bibtex';
import { benchmarkRouteParams, revisionParam } from '@/lib/benchmark/route-params';

/** BibTeX of every source behind the pairs of a revision. */
export const GET = workspaceRoute('benchmarks:read', benchmarkRouteParams, async (request, ctx, params) => {
  const wanted = revisionParam(request);
  if (!wanted.ok) throw new AppError('bad-request', wanted.message);
  const bm = await requireBenchmark(ctx.workspace.id, params.benchmarkId);
  const revision = await requireRevision(ctx.workspace.id, bm.id, wanted.value);
  const bibtex = sourcesToBibtex(await sourcesOfRevision(ctx.workspace.id, revision.statistics));
  return new Response(bibtex || '% No sources: this revision has no pairs.\n', {
    headers: {
      'content-type': 'application/x-bibtex; charset=utf-8',
      'content-disposition': `attachment; filename="benchmark-r${revision.number}-sources.bib"`,
      'cache-control': 'private, no-store',
    },
  });
});
