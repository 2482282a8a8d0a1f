import { requirePageMember } from '@/lib/session';
import { benchmarkFormOptions } from '@/db/queries/benchmarks';
import { benchmarkDefinitionSchema } from '@/lib/benchmark/schemas';
import { BenchmarkForm } from '../_components/benchmark-form';

export const metadata = { title: 'New benchmark' };

export default async function NewBenchmarkPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'benchmarks:create');
  const options = await benchmarkFormOptions(ctx.workspace.id);
  return (
    <div className="space-y-4">
      <h1>New benchmark</h1>
      <BenchmarkForm workspaceId={ctx.workspace.id} initial={benchmarkDefinitionSchema.parse({ name: 'Untitled benchmark' })} options={options} />
    </div>
  );
}
