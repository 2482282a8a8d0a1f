import 'server-only';
/**
 * Reproducing a stored revision from its row set: the rows it lists (retracted
 * since or not), with the rules, decisions and pins its snapshot recorded, are
 * computed again and fingerprinted. Its materials are those of its measurements (as
 * the scope had them); their fields, the scope, the methods and the quality thresholds are today's: when one of them changed since, the fingerprint
 * differs and `matches` says so.
 */
import { loadBenchmarkInput, requireBenchmark, rowsOfRowSet } from '@/db/queries/benchmarks';
import { requireRevision, revisionRowSet } from '@/db/queries/revisions';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { benchmarkFingerprint, contentFingerprint } from '@/lib/benchmark/fingerprint';
import { setDiff } from '@/lib/benchmark/revision-record';
import { AppError } from '@/lib/errors';

export async function reproduceRevision(workspaceId: string, benchmarkId: string, number: number) {
  const bm = await requireBenchmark(workspaceId, benchmarkId);
  const revision = await requireRevision(workspaceId, benchmarkId, number);
  const rows = await revisionRowSet(workspaceId, revision.id);
  if (!rows) throw new AppError('conflict', `Revision ${number} was stored without its row set and cannot be reproduced.`);
  const stored = await rowsOfRowSet(workspaceId, rows);
  // The revision's materials: those of its measurements, or against a reference method those of the reference's rows.
  const ref = bm.scope.referenceMethodId;
  const owners = ref === undefined ? stored.measurements : stored.calculations.filter((c) => c.methodId === ref);
  const today = await loadBenchmarkInput(workspaceId, bm, { materialIds: [...new Set(owners.map((m) => m.materialId))] });
  const input = {
    ...today,
    ...stored,
    rules: revision.statistics.rules,
    decisions: revision.statistics.decisions,
    pins: revision.statistics.pins,
  };
  // Revisions stored before fingerprints covered the row set carry the content fingerprint (fingerprint.ts).
  const fingerprint = benchmarkFingerprint(input, bm.scope);
  const matches = fingerprint === revision.fingerprint || contentFingerprint(input, bm.scope) === revision.fingerprint;
  return { revision, rows, fingerprint, matches, snapshot: computeBenchmark(input) };
}

/** The rows that entered and left between two revisions of a benchmark (by sequence number). */
export async function diffRevisionRows(workspaceId: string, benchmarkId: string, from: number, to: number) {
  const sets = await Promise.all(
    [from, to].map(async (n) => {
      const r = await requireRevision(workspaceId, benchmarkId, n);
      const set = await revisionRowSet(workspaceId, r.id);
      if (!set) throw new AppError('conflict', `Revision ${n} was stored without its row set.`);
      return set;
    }),
  );
  return { measurements: setDiff(sets[1].measurements, sets[0].measurements), calculations: setDiff(sets[1].calculations, sets[0].calculations) };
}
