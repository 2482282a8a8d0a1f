import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { getBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { recomputeState } from '@/lib/services/benchmarks/recompute-queue';
import { BenchmarkView } from '../../../_components/benchmark-view';

/** Any revision, read-only unless it is the latest. */
export default async function RevisionPage({ params, searchParams }: { params: Promise<{ workspace: string; id: string; number: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { workspace, id, number } = await params;
  const search = await searchParams;
  const ctx = await requirePageMember(workspace, 'benchmarks:read');
  const n = Number(number);
  if (!Number.isInteger(n) || n < 1) notFound();
  const bm = await getBenchmark(ctx.workspace.id, id);
  if (!bm) notFound();
  const rev = await getRevision(ctx.workspace.id, bm.id, n);
  if (!rev) notFound();
  const computing = (await recomputeState(ctx.workspace.id, bm.id)) !== 'idle';
  return <BenchmarkView bm={bm} rev={rev} workspace={ctx.workspace} role={ctx.role} computing={computing} search={search} />;
}
