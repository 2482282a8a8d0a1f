/**
 * What a new Revision records besides its statistics: the cause it measured
 * against the previous revision (rows in and out, the imports they came from,
 * decisions and pins) and the flags it raises. Pure: the recomputation service
 * loads the inputs and stores the result.
 */
import type { BenchmarkSnapshot } from './types';
import type { RowSet } from './row-set';

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

/** The previous revision's inputs, as far as the next cause needs them. */
export interface RevisionBaseline {
  /** Sequence numbers of its rows; null for a revision stored without them. */
  rows: RowSet | null;
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
  /** Sequence numbers (seq) of exactly the rows used, sorted. */
  rows: RowSet;
  cause: RevisionCause;
  flags: RevisionFlag[];
}

/** What is in `now` and not in `before`, and the reverse, each in its list's order. */
export function setDiff<T>(now: readonly T[], before: readonly T[]): { added: T[]; removed: T[] } {
  const a = new Set(now);
  const b = new Set(before);
  return { added: now.filter((x) => !b.has(x)), removed: before.filter((x) => !a.has(x)) };
}

export function revisionRecord(input: {
  fingerprint: string;
  snapshot: BenchmarkSnapshot;
  /** Sequence numbers of exactly the rows used, sorted. */
  rows: RowSet;
  /** The imports of the rows that are in `rows` and not in the baseline's, with how many each. */
  imports: Array<{ id: string; rows: number }>;
  reported: RecomputeCause[];
  baseline: RevisionBaseline | null;
}): RevisionRecord {
  const { snapshot, baseline, rows } = input;
  const m = setDiff(rows.measurements, baseline?.rows?.measurements ?? []);
  const c = setDiff(rows.calculations, baseline?.rows?.calculations ?? []);
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
    imports: [...input.imports].sort((a, b) => b.rows - a.rows || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)),
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
        // Against a reference method the pair's reference side is a calculation, not a measurement (the subject key still names it).
        measurementId: snapshot.reference ? null : pair.measurementIds[0],
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
  return { fingerprint: input.fingerprint, snapshot, rows, cause, flags };
}
