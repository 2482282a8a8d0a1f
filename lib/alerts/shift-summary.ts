/**
 * What changed between the revision last announced to a watcher and the latest
 * one: detectShift's reasons plus the per-method rows and new outliers the alert shows.
 *
 * Only methods with statistics (n ≥ 3, so an MAE exists) take part: a method
 * with fewer pairs has no MAE to compare or rank, and "appears" once it has one.
 */
import { detectShift, type MethodSummary, type ShiftReason, type ShiftThresholds } from '@/lib/science';
import type { BenchmarkSnapshot } from '@/lib/benchmark/types';
import { stat } from '@/lib/format';

/** The parts of a revision snapshot the comparison reads. */
export type SnapshotForShift = Pick<BenchmarkSnapshot, 'methods' | 'pairs' | 'unit'>;

export interface MethodShiftRow {
  methodId: string;
  label: string;
  maeBefore: number | null;
  maeAfter: number | null;
  /** After − before, in the benchmark's unit. */
  maeChange: number | null;
  /** (after − before) / before × 100; null when there is no earlier MAE or it was 0. */
  maeChangePercent: number | null;
  nBefore: number | null;
  nAfter: number | null;
  rankBefore: number | null;
  rankAfter: number | null;
  /** The reasons that concern this method (empty: shown for context only). */
  kinds: Array<ShiftReason['kind']>;
}

export interface NewOutlier {
  methodId: string;
  methodLabel: string;
  pairKey: string;
  materialId: string;
  label: string | null;
  measured: number;
  calculated: number;
  error: number;
  reason: string;
}

export interface ShiftSummary {
  shifted: boolean;
  reasons: ShiftReason[];
  unit: string;
  methods: MethodShiftRow[];
  newOutliers: NewOutlier[];
}

const EMPTY: SnapshotForShift = { methods: [], pairs: [], unit: 'cm⁻¹' };

/** detectShift's input from a snapshot: outliers are the pairs the outlier rule flagged. */
export function methodSummaries(snapshot: SnapshotForShift): MethodSummary[] {
  const outliers = new Map<string, string[]>();
  for (const p of snapshot.pairs) if (p.outlier !== null) (outliers.get(p.methodId) ?? outliers.set(p.methodId, []).get(p.methodId)!).push(p.key);
  return snapshot.methods
    .filter((m) => m.statistics !== null)
    .map((m) => ({ methodId: m.methodId, n: m.n, meanAbsoluteError: m.statistics!.meanAbsoluteError, outlierIds: outliers.get(m.methodId) ?? [] }));
}

/** Competition ranks by MAE ascending over methods with n > 0, as detectShift ranks them. */
function ranks(summaries: MethodSummary[]): Map<string, number> {
  const ranked = summaries.filter((s) => s.n > 0);
  return new Map(ranked.map((s) => [s.methodId, 1 + ranked.filter((o) => o.meanAbsoluteError < s.meanAbsoluteError).length]));
}

export function summarizeShift(before: SnapshotForShift | null, after: SnapshotForShift, thresholds: ShiftThresholds): ShiftSummary {
  const was = methodSummaries(before ?? EMPTY);
  const now = methodSummaries(after);
  const { shifted, reasons } = detectShift(was, now, thresholds);
  const wasById = new Map(was.map((s) => [s.methodId, s]));
  const nowById = new Map(now.map((s) => [s.methodId, s]));
  const rankWas = ranks(was);
  const rankNow = ranks(now);
  const labels = new Map<string, string>();
  for (const m of [...(before?.methods ?? []), ...after.methods]) labels.set(m.methodId, m.label);

  const ids = [...new Set([...now.map((s) => s.methodId), ...was.map((s) => s.methodId)])];
  const methods: MethodShiftRow[] = ids.map((id) => {
    const b = wasById.get(id);
    const a = nowById.get(id);
    const maeBefore = b?.meanAbsoluteError ?? null;
    const maeAfter = a?.meanAbsoluteError ?? null;
    const maeChange = maeBefore !== null && maeAfter !== null ? maeAfter - maeBefore : null;
    return {
      methodId: id,
      label: labels.get(id) ?? id,
      maeBefore,
      maeAfter,
      maeChange,
      maeChangePercent: maeChange !== null && maeBefore ? (maeChange / maeBefore) * 100 : null,
      nBefore: b?.n ?? null,
      nAfter: a?.n ?? null,
      rankBefore: rankWas.get(id) ?? null,
      rankAfter: rankNow.get(id) ?? null,
      kinds: reasons.filter((r) => r.methodId === id).map((r) => r.kind),
    };
  });
  methods.sort((x, y) => (x.rankAfter ?? Infinity) - (y.rankAfter ?? Infinity) || x.label.localeCompare(y.label));

  const fresh = new Set(reasons.flatMap((r) => (r.kind === 'new-outlier' ? (r.outlierIds ?? []) : [])));
  const newOutliers: NewOutlier[] = after.pairs
    .filter((p) => p.outlier !== null && fresh.has(p.key))
    .map((p) => ({
      methodId: p.methodId,
      methodLabel: labels.get(p.methodId) ?? p.methodId,
      pairKey: p.key,
      materialId: p.materialId,
      label: p.label,
      measured: p.measured,
      calculated: p.calculated,
      error: p.error,
      reason: p.outlier!,
    }));
  return { shifted, reasons, unit: after.unit, methods, newOutliers };
}

/** One line per reason, in words (used by digests for each revision of the day). */
export function describeReason(reason: ShiftReason, label: string, unit: string): string {
  const f = (v: number | undefined) => stat('error', v);
  switch (reason.kind) {
    case 'mae':
      return `${label}: MAE ${f(reason.before)} → ${f(reason.after)} ${unit}`;
    case 'rank':
      return `${label}: rank ${reason.before ?? '—'} → ${reason.after ?? '—'}`;
    case 'new-outlier':
      return `${label}: ${reason.outlierIds?.length ?? 0} new outlier(s)`;
    case 'n':
      return `${label}: N ${reason.before} → ${reason.after}`;
    case 'new-method':
      return `${label}: entered the leaderboard (MAE ${f(reason.after)} ${unit})`;
    case 'removed-method':
      return `${label}: left the leaderboard (MAE was ${f(reason.before)} ${unit})`;
  }
}
