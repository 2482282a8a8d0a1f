import 'server-only';
/**
 * One recomputation of a benchmark: read the scope's context and today's row set
 * (runs, no rows) → fingerprint → compare with the latest revision → when it
 * changed, pair the materials whose inputs changed (material-stages.ts), compute the
 * statistics over every pair, store a new revision → tell the alert scheduler.
 */
import { importsOfRuns, loadBenchmarkContext, requireBenchmark, scopeRowRuns } from '@/db/queries/benchmarks';
import { insertRevision, latestRevisionHead, revisionBaseline, type RevisionHead } from '@/db/queries/revisions';
import { finishBenchmark } from '@/lib/benchmark/compute';
import { rowSetFingerprint } from '@/lib/benchmark/fingerprint';
import { revisionRecord, type RecomputeCause } from '@/lib/benchmark/revision-record';
import { expandRuns, runsOf, subtractRuns } from '@/lib/benchmark/row-set';
import { revisionStored } from '@/lib/services/alerts/scheduler';
import { materialStages } from './material-stages';

export interface RecomputeResult {
  created: boolean;
  revision: RevisionHead | null;
  /** Materials paired in this run, of those in scope (0 when nothing changed). */
  repaired?: { materials: number; of: number };
}

export async function recomputeBenchmark(
  workspaceId: string,
  benchmarkId: string,
  reported: RecomputeCause[] = [{ trigger: 'manual' }],
  /** full: pair every material, ignoring what this process kept (the benchmark's floor run, tests). */
  options: { full?: boolean } = {},
): Promise<RecomputeResult> {
  const bm = await requireBenchmark(workspaceId, benchmarkId);
  const [context, today, latest] = await Promise.all([loadBenchmarkContext(workspaceId, bm), scopeRowRuns(workspaceId, bm), latestRevisionHead(workspaceId, benchmarkId)]);
  const todaysRows = { measurements: expandRuns(today.measurements), calculations: expandRuns(today.calculations) };
  if (latest && latest.fingerprint === rowSetFingerprint(context, bm.scope, todaysRows)) return { created: false, revision: latest };

  const { stages, rows, repaired, materials } = await materialStages(workspaceId, bm, context, today, options);
  // The rows actually used: equal to today's unless an import or undo landed between the two reads.
  const fingerprint = rowSetFingerprint(context, bm.scope, rows);
  if (latest && latest.fingerprint === fingerprint) return { created: false, revision: latest };

  const snapshot = finishBenchmark(context, stages);
  const baseline = latest ? await revisionBaseline(workspaceId, latest.id) : null;
  const added = {
    measurements: subtractRuns(runsOf(rows.measurements), runsOf(baseline?.rows?.measurements ?? [])),
    calculations: subtractRuns(runsOf(rows.calculations), runsOf(baseline?.rows?.calculations ?? [])),
  };
  const imports = await importsOfRuns(workspaceId, added);
  const record = revisionRecord({ fingerprint, snapshot, rows, imports, reported, baseline });
  const head = await insertRevision(workspaceId, benchmarkId, record);
  if (!head.created) return { created: false, revision: head };
  await revisionStored(workspaceId, benchmarkId, head.id);
  return { created: true, revision: head, repaired: { materials: repaired, of: materials } };
}
