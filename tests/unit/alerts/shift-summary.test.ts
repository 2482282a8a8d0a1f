import { describe, expect, it } from 'vitest';
import { methodSummaries, summarizeShift } from '@/lib/alerts/shift-summary';
import { method, pair, snapshot } from './fixtures';

const limits = { maeCm1: 0.5, maeRelative: 0.05, nRelative: 0.1 };

describe('shift summary between two revisions', () => {
  it('builds detectShift input from the methods with statistics; outliers are flagged pairs', () => {
    const s = snapshot([method('a', 'A', 10, 4), method('b', 'B', 2, null)], [pair('a', 'k1', 3), pair('a', 'k2', 30, 'modified z 5.1 > 3.5')]);
    expect(methodSummaries(s)).toEqual([{ methodId: 'a', n: 10, meanAbsoluteError: 4, outlierIds: ['k2'] }]);
  });

  it('reports an MAE shift with before → after, the change in cm⁻¹ and %, N and rank changes', () => {
    const before = snapshot([method('a', 'PBEsol', 10, 4), method('b', 'r2SCAN', 10, 5)]);
    const after = snapshot([method('a', 'PBEsol', 12, 6), method('b', 'r2SCAN', 10, 5)]);
    const s = summarizeShift(before, after, limits);
    expect(s.shifted).toBe(true);
    const a = s.methods.find((m) => m.methodId === 'a')!;
    expect(a).toMatchObject({ maeBefore: 4, maeAfter: 6, maeChange: 2, maeChangePercent: 50, nBefore: 10, nAfter: 12, rankBefore: 1, rankAfter: 2 });
    expect(a.kinds.sort()).toEqual(['mae', 'n', 'rank']);
    const b = s.methods.find((m) => m.methodId === 'b')!;
    expect(b).toMatchObject({ rankBefore: 2, rankAfter: 1, kinds: ['rank'] });
    // sorted by the new rank
    expect(s.methods.map((m) => m.label)).toEqual(['r2SCAN', 'PBEsol']);
  });

  it('stays quiet below the thresholds, and a watcher override can make the same change count', () => {
    const before = snapshot([method('a', 'A', 10, 4)]);
    const after = snapshot([method('a', 'A', 10.0, 4.3)]);
    expect(summarizeShift(before, after, limits).shifted).toBe(false);
    expect(summarizeShift(before, after, { ...limits, maeCm1: 0.2 }).shifted).toBe(true);
  });

  it('lists only new outliers, with their pair', () => {
    const before = snapshot([method('a', 'A', 10, 4)], [pair('a', 'old', 20, 'tukey')]);
    const after = snapshot([method('a', 'A', 10, 4)], [pair('a', 'old', 20, 'tukey'), pair('a', 'new', -25, 'tukey fences')]);
    const s = summarizeShift(before, after, limits);
    expect(s.shifted).toBe(true);
    expect(s.newOutliers).toEqual([expect.objectContaining({ pairKey: 'new', methodLabel: 'A', error: -25, reason: 'tukey fences' })]);
  });

  it('against no baseline, every method is new', () => {
    const s = summarizeShift(null, snapshot([method('a', 'A', 10, 4)]), limits);
    expect(s.reasons).toEqual([{ methodId: 'a', kind: 'new-method', after: 4 }]);
    expect(s.methods[0]).toMatchObject({ maeBefore: null, maeAfter: 4, maeChange: null });
  });
});
