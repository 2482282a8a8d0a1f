import 'server-only';
/**
 * One recomputation of a benchmark: load its scope → compute → compare with the
 * latest revision → store a new revision when the fingerprint of the rows, rules,
 * decisions and pins changed → tell the alert scheduler.
 */
import { loadBenchmarkInput, requireBenchmark } from '@/db/queries/benchmarks';
import { insertRevision, latestRevisionHead, revisionBaseline, type RevisionHead } from '@/db/queries/revisions';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { benchmarkFingerprint } from '@/lib/benchmark/fingerprint';
import { revisionRecord, type RecomputeCause } from '@/lib/benchmark/revision-record';
import { revisionStored } from '@/lib/services/alerts/scheduler';

export async function recomputeBenchmark(
  workspaceId: string,
  benchmarkId: string,
  reported: RecomputeCause[] = [{ trigger: 'manual' }],
): Promise<{ created: boolean; revision: RevisionHead | null }> {
  const bm = await requireBenchmark(workspaceId, benchmarkId);
  const input = await loadBenchmarkInput(workspaceId, bm);
  const fingerprint = benchmarkFingerprint(input, bm.scope);
  const latest = await latestRevisionHead(workspaceId, benchmarkId);
  if (latest && latest.fingerprint === fingerprint) return { created: false, revision: latest };

  const snapshot = computeBenchmark(input);
  const baseline = latest ? await revisionBaseline(workspaceId, latest.id) : null;
  const record = revisionRecord({ fingerprint, snapshot, measurements: input.measurements, calculations: input.calculations, reported, baseline });
  const head = await insertRevision(workspaceId, benchmarkId, record);
  if (!head.created) return { created: false, revision: head };
  await revisionStored(workspaceId, benchmarkId, head.id);
  return { created: true, revision: head };
}
