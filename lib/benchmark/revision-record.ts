/**
 * What a new Revision records besides its statistics: the cause it measured
 * against the previous revision (rows in and out, the imports they came from,
 * decisions and pins) and the flags it raises. Pure: the recomputation service
 * loads the inputs and stores the result.
 */
import type { BenchmarkSnapshot } from './types';

/** What made a recomputation run (accumulated by the queue while it waits). */
export interface RecomputeCause {
  trigger: 'benchmark-created' | 'benchmark-updated' | 'import' | 'import-undone' | 'decision' | 'pin' | 'manual' | 'data-change';
  importId?: string;
  decisionId?: string;
  pinId?: string;
  userId?: string | null;
}

/** What a revision records about its origin: the reported causes and the change it measured. */
export interface RevisionCause {
  reported: RecomputeCause[];
  rows: { measurementsAdded: number; measurementsRemoved: number; calculationsAdded: number; calculationsRemoved: number };
  /** Imports whose rows entered the scope with this revision. */
  imports: Array<{ id: string; rows: number }>;
  decisions: { added: string[]; reverted: string[] };
  pins: { added: string[]; revoked: string[] };
}

export type RowIds = { measurements: string[]; calculations: string[] };

/** The previous revision's inputs, as far as the next cause needs them. */
export interface RevisionBaseline {
  rowIds: RowIds | null;
  decisionIds: string[];
  pinIds: string[];
}

export interface RevisionFlag {
  kind: 'outlier' | 'quality';
  code: string;
  methodId: string;
  measurementId: string | null;
  subjectKey: string;
  details: Record<string, unknown>;
}

export interface RevisionRecord {
  fingerprint: string;
  snapshot: BenchmarkSnapshot;
  rowIds: RowIds;
  cause: RevisionCause;
  flags: RevisionFlag[];
}

interface InputRow {
  id: string;
  importId: string | null;
}

function setDiff(now: readonly string[], before: readonly string[]): { added: string[]; removed: string[] } {
  const a = new Set(now);
  const b = new Set(before);
  return { added: now.filter((x) => !b.has(x)), removed: before.filter((x) => !a.has(x)) };
}

export function revisionRecord(input: {
  fingerprint: string;
  snapshot: BenchmarkSnapshot;
  measurements: readonly InputRow[];
  calculations: readonly InputRow[];
  reported: RecomputeCause[];
  baseline: RevisionBaseline | null;
}): RevisionRecord {
  const { snapshot, baseline } = input;
  const rowIds: RowIds = {
    measurements: input.measurements.map((m) => m.id).sort(),
    calculations: input.calculations.map((c) => c.id).sort(),
  };
  const m = setDiff(rowIds.measurements, baseline?.rowIds?.measurements ?? []);
  const c = setDiff(rowIds.calculations, baseline?.rowIds?.calculations ?? []);
  const addedIds = new Set([...m.added, ...c.added]);
  const importRows = new Map<string, number>();
  for (const row of [...input.measurements, ...input.calculations]) {
    if (row.importId && addedIds.has(row.id)) importRows.set(row.importId, (importRows.get(row.importId) ?? 0) + 1);
  }
  const d = setDiff(
    snapshot.decisions.map((x) => x.id),
    baseline?.decisionIds ?? [],
  );
  const p = setDiff(
    snapshot.pins.map((x) => x.id),
    baseline?.pinIds ?? [],
  );
  const cause: RevisionCause = {
    reported: input.reported,
    rows: { measurementsAdded: m.added.length, measurementsRemoved: m.removed.length, calculationsAdded: c.added.length, calculationsRemoved: c.removed.length },
    imports: [...importRows].map(([id, rows]) => ({ id, rows })).sort((a, b) => b.rows - a.rows),
    decisions: { added: d.added, reverted: d.removed },
    pins: { added: p.added, revoked: p.removed },
  };
  const flags: RevisionFlag[] = [
    ...snapshot.pairs
      .filter((pair) => pair.outlier !== null)
      .map((pair) => ({
        kind: 'outlier' as const,
        code: snapshot.rules.outlierRule.kind,
        methodId: pair.methodId,
        measurementId: pair.measurementIds[0],
        subjectKey: pair.key,
        details: { reason: pair.outlier, error: pair.error },
      })),
    ...snapshot.quality.map((q) => ({
      kind: 'quality' as const,
      code: q.code,
      methodId: q.methodId,
      measurementId: null,
      subjectKey: `${q.materialId}|${q.methodId}`,
      details: { severity: q.severity, message: q.message, materialId: q.materialId },
    })),
  ];
  return { fingerprint: input.fingerprint, snapshot, rowIds, cause, flags };
}
