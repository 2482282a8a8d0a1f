import { describe, expect, it } from 'vitest';
import { detectShift, type MethodSummary } from '@/lib/science';

const base: MethodSummary[] = [
  { methodId: 'pbe', n: 100, meanAbsoluteError: 12, outlierIds: ['x'] },
  { methodId: 'lda', n: 100, meanAbsoluteError: 8, outlierIds: [] },
];

describe('detectShift', () => {
  it('reports nothing when nothing moved beyond the thresholds', () => {
    const after = [{ ...base[0], meanAbsoluteError: 12.4, n: 105 }, base[1]];
    expect(detectShift(base, after)).toEqual({ shifted: false, reasons: [] });
  });

  it('needs both the absolute and the relative MAE threshold', () => {
    // 12 → 12.55: +0.55 > 0.5 but < 0.05 × 12 = 0.6 → no shift; 12 → 12.7 → shift
    expect(detectShift(base, [{ ...base[0], meanAbsoluteError: 12.55 }, base[1]]).shifted).toBe(false);
    const moved = detectShift(base, [{ ...base[0], meanAbsoluteError: 12.7 }, base[1]]);
    expect(moved.reasons).toEqual([{ methodId: 'pbe', kind: 'mae', before: 12, after: 12.7 }]);
    const small = [{ methodId: 'm', n: 10, meanAbsoluteError: 2, outlierIds: [] }];
    // 2 → 2.3: 15 % but only 0.3 cm⁻¹ → no shift
    expect(detectShift(small, [{ ...small[0], meanAbsoluteError: 2.3 }]).shifted).toBe(false);
  });

  it('reports rank changes, new outliers, N changes, added and removed methods', () => {
    const after: MethodSummary[] = [
      { methodId: 'pbe', n: 120, meanAbsoluteError: 7, outlierIds: ['x', 'y'] },
      { methodId: 'pbesol', n: 50, meanAbsoluteError: 5, outlierIds: [] },
    ];
    const { shifted, reasons } = detectShift(base, after);
    expect(shifted).toBe(true);
    // pbe stays second (behind lda before, behind pbesol after), so no rank reason
    expect(reasons).toEqual([
      { methodId: 'pbe', kind: 'mae', before: 12, after: 7 },
      { methodId: 'pbe', kind: 'new-outlier', before: 1, after: 2, outlierIds: ['y'] },
      { methodId: 'pbe', kind: 'n', before: 100, after: 120 },
      { methodId: 'pbesol', kind: 'new-method', after: 5 },
      { methodId: 'lda', kind: 'removed-method', before: 8 },
    ]);
  });

  it('a rank swap is a shift even when MAEs move little', () => {
    const before: MethodSummary[] = [
      { methodId: 'a', n: 10, meanAbsoluteError: 10.0, outlierIds: [] },
      { methodId: 'b', n: 10, meanAbsoluteError: 10.1, outlierIds: [] },
    ];
    const after: MethodSummary[] = [
      { methodId: 'a', n: 10, meanAbsoluteError: 10.2, outlierIds: [] },
      { methodId: 'b', n: 10, meanAbsoluteError: 10.1, outlierIds: [] },
    ];
    expect(detectShift(before, after).reasons).toEqual([
      { methodId: 'a', kind: 'rank', before: 1, after: 2 },
      { methodId: 'b', kind: 'rank', before: 2, after: 1 },
    ]);
  });

  it('validates its input', () => {
    expect(() => detectShift([{ ...base[0] }, { ...base[0] }], base)).toThrow(/duplicate method "pbe"/);
    expect(() => detectShift(base, [{ ...base[0], n: -1 }])).toThrow(/after\[0\]\.n/);
    expect(() => detectShift(base, base, { maeCm1: 0 })).toThrow(/thresholds\.maeCm1/);
  });
});
