import 'server-only';
/** The convergence view of a benchmark's latest revision (lib/benchmark/convergence-view.ts). */
import { convergenceInputs, requireBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { convergenceView, type ConvergenceParameter } from '@/lib/benchmark/convergence-view';

export async function benchmarkConvergence(workspaceId: string, benchmarkId: string, parameter: ConvergenceParameter) {
  const bm = await requireBenchmark(workspaceId, benchmarkId);
  const rev = await getRevision(workspaceId, bm.id);
  if (!rev || !rev.statistics.reference) return { bm, rev, view: null };
  const snapshot = rev.statistics;
  const methodIds = snapshot.methods.map((m) => m.methodId);
  const materialIds = [...new Set((snapshot.materialRows ?? []).map((r) => r.materialId))];
  const { methods, materials } = await convergenceInputs(workspaceId, methodIds, materialIds);
  return { bm, rev, view: convergenceView(snapshot, parameter, methods, materials) };
}
