import 'server-only';
import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { benchmarkRouteParams, revisionParam } from '@/lib/benchmark/route-params';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { requireRevision } from '@/db/queries/revisions';
import { listSourcesForExport } from '@/db/queries/sources';
import { exportFormatParam, referenceFileResponse } from '@/lib/citations/export-response';
import type { ExportFormat } from '@/lib/citations/export';

const workspaceParams = z.object({ workspaceId: z.string().min(1) });
const MAX_IDS = 1000;

/** GET …/sources/export?format=bibtex|ris|csl-json[&ids=a,b]: the workspace's unretracted sources, or the listed ones. */
export function workspaceSourcesRoute(fixed?: ExportFormat) {
  return workspaceRoute('sources:read', workspaceParams, async (request, ctx) => {
    const format = fixed ?? exportFormatParam(request);
    const raw = new URL(request.url).searchParams.getAll('ids').flatMap((v) => v.split(','));
    const ids = raw.map((s) => s.trim()).filter(Boolean);
    if (ids.length > MAX_IDS) throw new AppError('bad-request', `At most ${MAX_IDS} ids per export.`);
    const sources = await listSourcesForExport(ctx.workspace.id, ids.length ? ids : undefined);
    if (ids.length && sources.length !== new Set(ids).size) throw new AppError('not-found', 'Some of the requested sources are not in this workspace.');
    return referenceFileResponse(sources, format, `${ctx.workspace.slug}-sources`);
  });
}

/** GET …/benchmarks/:id/sources?format=…[&revision=N]: every source behind the pairs of a revision (absent: the latest). */
export function benchmarkSourcesRoute(fixed?: ExportFormat) {
  return workspaceRoute('benchmarks:read', benchmarkRouteParams, async (request, ctx, params) => {
    const format = fixed ?? exportFormatParam(request);
    const wanted = revisionParam(request);
    if (!wanted.ok) throw new AppError('bad-request', wanted.message);
    const bm = await requireBenchmark(ctx.workspace.id, params.benchmarkId);
    const revision = await requireRevision(ctx.workspace.id, bm.id, wanted.value);
    const ids = revision.statistics.pairs.flatMap((p) => p.sourceIds);
    const sources = ids.length ? await listSourcesForExport(ctx.workspace.id, ids) : [];
    return referenceFileResponse(sources, format, `benchmark-r${revision.number}-sources`, 'No sources: this revision has no pairs.');
  });
}
