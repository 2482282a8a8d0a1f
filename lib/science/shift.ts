/**
 * Benchmark shift detection between the last announced revision and a new one.
 * A shift is: a MAE change beyond both maeAbsolute (0.5, in the benchmark's unit; maeCm1
 * is its older name, used when maeAbsolute is not given) and maeRelative (0.05) × the
 * earlier MAE; an N change beyond nRelative (0.1) × the earlier N (any change from 0);
 * any change of rank (competition ranking by MAE ascending over methods with n > 0);
 * any outlier id not flagged before; any method added or removed.
 */
import { ScienceInputError, requireNonNegative, requirePositive } from './errors';

/** What a revision records of one method. */
export interface MethodSummary {
  methodId: string;
  n: number;
  meanAbsoluteError: number;
  outlierIds: string[];
}

/** One reason for a shift; `outlierIds` lists the new outliers of a 'new-outlier' reason. */
export interface ShiftReason {
  methodId: string;
  kind: 'mae' | 'rank' | 'new-outlier' | 'n' | 'new-method' | 'removed-method';
  before?: number;
  after?: number;
  outlierIds?: string[];
}

/** Thresholds of detectShift. */
export interface ShiftThresholds {
  /** Absolute MAE change, in the benchmark's unit. */
  maeAbsolute?: number;
  /** Older name of maeAbsolute. */
  maeCm1?: number;
  maeRelative?: number;
  nRelative?: number;
}

/** Default shift thresholds. */
export const DEFAULT_SHIFT_THRESHOLDS = { maeAbsolute: 0.5, maeCm1: 0.5, maeRelative: 0.05, nRelative: 0.1 } as const;

function indexSummaries(argument: string, summaries: MethodSummary[]): Map<string, MethodSummary> {
  if (!Array.isArray(summaries)) throw new ScienceInputError(argument, 'must be an array of method summaries');
  const byId = new Map<string, MethodSummary>();
  summaries.forEach((s, i) => {
    if (typeof s.methodId !== 'string' || s.methodId === '') throw new ScienceInputError(`${argument}[${i}].methodId`, 'must be a non-empty string');
    if (byId.has(s.methodId)) throw new ScienceInputError(`${argument}[${i}].methodId`, `duplicate method "${s.methodId}"`);
    if (!Number.isInteger(s.n) || s.n < 0) throw new ScienceInputError(`${argument}[${i}].n`, `must be a non-negative integer, got ${String(s.n)}`);
    requireNonNegative(`${argument}[${i}].meanAbsoluteError`, s.meanAbsoluteError);
    if (!Array.isArray(s.outlierIds)) throw new ScienceInputError(`${argument}[${i}].outlierIds`, 'must be an array of ids');
    byId.set(s.methodId, s);
  });
  return byId;
}

/** Competition ranks ("1224") by MAE ascending, over methods with n > 0. */
function ranks(summaries: MethodSummary[]): Map<string, number> {
  const ranked = summaries.filter((s) => s.n > 0);
  const result = new Map<string, number>();
  for (const s of ranked) result.set(s.methodId, 1 + ranked.filter((o) => o.meanAbsoluteError < s.meanAbsoluteError).length);
  return result;
}

/** Compares two revisions' method summaries and lists every shift (see the module header). */
export function detectShift(
  before: MethodSummary[],
  after: MethodSummary[],
  thresholds: ShiftThresholds = {},
): { shifted: boolean; reasons: ShiftReason[] } {
  const limits = {
    maeAbsolute: thresholds.maeAbsolute ?? thresholds.maeCm1 ?? DEFAULT_SHIFT_THRESHOLDS.maeAbsolute,
    maeRelative: thresholds.maeRelative ?? DEFAULT_SHIFT_THRESHOLDS.maeRelative,
    nRelative: thresholds.nRelative ?? DEFAULT_SHIFT_THRESHOLDS.nRelative,
  };
  requirePositive(thresholds.maeAbsolute === undefined && thresholds.maeCm1 !== undefined ? 'thresholds.maeCm1' : 'thresholds.maeAbsolute', limits.maeAbsolute);
  requirePositive('thresholds.maeRelative', limits.maeRelative);
  requirePositive('thresholds.nRelative', limits.nRelative);
  const beforeById = indexSummaries('before', before);
  const afterById = indexSummaries('after', after);
  const rankBefore = ranks(before);
  const rankAfter = ranks(after);
  const reasons: ShiftReason[] = [];

  for (const now of after) {
    const id = now.methodId;
    const was = beforeById.get(id);
    if (!was) {
      reasons.push({ methodId: id, kind: 'new-method', after: now.meanAbsoluteError });
      continue;
    }
    const maeChange = Math.abs(now.meanAbsoluteError - was.meanAbsoluteError);
    if (maeChange > limits.maeAbsolute && maeChange > limits.maeRelative * was.meanAbsoluteError) {
      reasons.push({ methodId: id, kind: 'mae', before: was.meanAbsoluteError, after: now.meanAbsoluteError });
    }
    const rankWas = rankBefore.get(id);
    const rankNow = rankAfter.get(id);
    if (rankWas !== rankNow) reasons.push({ methodId: id, kind: 'rank', before: rankWas, after: rankNow });
    const earlierOutliers = new Set(was.outlierIds);
    const newOutliers = now.outlierIds.filter((o) => !earlierOutliers.has(o));
    if (newOutliers.length > 0) {
      reasons.push({ methodId: id, kind: 'new-outlier', before: was.outlierIds.length, after: now.outlierIds.length, outlierIds: newOutliers });
    }
    if (Math.abs(now.n - was.n) > limits.nRelative * was.n) reasons.push({ methodId: id, kind: 'n', before: was.n, after: now.n });
  }
  for (const was of before) {
    if (!afterById.has(was.methodId)) reasons.push({ methodId: was.methodId, kind: 'removed-method', before: was.meanAbsoluteError });
  }
  return { shifted: reasons.length > 0, reasons };
}
