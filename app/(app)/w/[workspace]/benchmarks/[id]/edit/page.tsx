import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { benchmarkFormOptions, getBenchmark } from '@/db/queries/benchmarks';
import { BenchmarkForm } from '../../_components/benchmark-form';

export const metadata = { title: 'Edit benchmark' };

export default async function EditBenchmarkPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'benchmarks:update');
  const bm = await getBenchmark(ctx.workspace.id, id);
  if (!bm) notFound();
  const options = await benchmarkFormOptions(ctx.workspace.id);
  return (
    <div className="space-y-4">
      <h1>Edit {bm.name}</h1>
      <p className="text-sm text-ink-muted">Saving stores a new revision if the results change; earlier revisions stay as they were.</p>
      <BenchmarkForm
        workspaceId={ctx.workspace.id}
        benchmarkId={bm.id}
        initial={{ name: bm.name, purpose: bm.purpose, scope: bm.scope, rules: bm.rules, alertThresholds: bm.storedAlertThresholds }}
        options={options}
      />
    </div>
  );
}
