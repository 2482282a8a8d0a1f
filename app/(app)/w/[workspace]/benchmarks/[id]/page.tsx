import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { getBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { recomputeState } from '@/lib/services/benchmarks/recompute-queue';
import { BenchmarkView } from '../_components/benchmark-view';
import { BenchmarkWatch } from '@/app/(app)/w/[workspace]/watches/_components/benchmark-watch';

export default async function BenchmarkPage({ params, searchParams }: { params: Promise<{ workspace: string; id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { workspace, id } = await params;
  const search = await searchParams;
  const ctx = await requirePageMember(workspace, 'benchmarks:read');
  const bm = await getBenchmark(ctx.workspace.id, id);
  if (!bm) notFound();
  const rev = await getRevision(ctx.workspace.id, bm.id);
  const computing = (await recomputeState(ctx.workspace.id, bm.id)) !== 'idle';
  return (
    <>
      <BenchmarkWatch workspace={ctx.workspace} userId={ctx.user.id} bm={bm} unit={rev?.statistics.unit} />
      <BenchmarkView bm={bm} rev={rev} workspace={ctx.workspace} role={ctx.role} computing={computing} search={search} />
    </>
  );
}
