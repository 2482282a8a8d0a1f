/**
 * Convergence points, class recommendations and the deviation distribution (lib/science/convergence.ts),
 * on worked cases computed by hand. The deviations are invented for the tests; the quantile is
 * Hyndman & Fan (1996), definition 7.
 */
import { describe, expect, it } from 'vitest';
import { convergencePoint, deviationDistribution, recommendedParameter, ScienceInputError } from '@/lib/science';

const family = (pairs: Array<[number, number]>) => pairs.map(([parameter, maxAbsolute]) => ({ parameter, maxAbsolute }));

describe('convergencePoint', () => {
  it('is the least converged value from which every denser member stays within tolerance', () => {
    // Worked case: 250 → 5.0, 686 → 1.8, 1458 → 0.6, 2662 → 0.2, 4394 → 0.05 with tolerance 1: the walk from 4394 down stops at 686.
    expect(convergencePoint(family([[686, 1.8], [250, 5], [4394, 0.05], [1458, 0.6], [2662, 0.2]]), 1)).toBe(1458);
  });

  it('ignores a coarse member that dips inside by chance', () => {
    // 250 is within tolerance, 686 is not: the point lies above the excursion.
    expect(convergencePoint(family([[250, 0.5], [686, 1.2], [1458, 0.4], [2662, 0.1]]), 1)).toBe(1458);
  });

  it('counts a value on the tolerance as within it', () => {
    expect(convergencePoint(family([[100, 2], [200, 1]]), 1)).toBe(200);
  });

  it('is null when the most converged member is still outside the tolerance', () => {
    expect(convergencePoint(family([[250, 9], [4394, 1.5]]), 1)).toBeNull();
    expect(convergencePoint([], 1)).toBeNull();
  });

  it('takes the worse deviation when two members share a parameter value', () => {
    expect(convergencePoint(family([[1000, 0.2], [1000, 3], [2000, 0.1]]), 1)).toBe(2000);
  });

  it('walks downwards for a parameter that converges as it decreases (smearing)', () => {
    expect(convergencePoint(family([[0.2, 1.5], [0.1, 0.5], [0.05, 0.2]]), 1, 'decreasing')).toBe(0.1);
  });

  it('refuses a non-positive tolerance and non-finite points, naming them', () => {
    expect(() => convergencePoint(family([[1, 1]]), 0)).toThrow(ScienceInputError);
    expect(() => convergencePoint(family([[Number.NaN, 1]]), 1)).toThrow(/points\[0\]\.parameter/);
    expect(() => convergencePoint(family([[1, -1]]), 1)).toThrow(/points\[0\]\.maxAbsolute/);
  });
});

describe('recommendedParameter', () => {
  const points = [686, 1458, 1458, 2662, null];

  it('is the ⌈s·N⌉-th convergence point in converging order', () => {
    // N = 5: s = 0.6 needs 3 → 1458; s = 0.8 needs 4 → 2662.
    expect(recommendedParameter(points, 0.6)).toEqual({ value: 1458, n: 5, converged: 4, needed: 3 });
    expect(recommendedParameter(points, 0.8).value).toBe(2662);
  });

  it('is null when fewer materials converge than the share needs', () => {
    // s = 0.95 needs ⌈4.75⌉ = 5, and one material never converges.
    expect(recommendedParameter(points, 0.95)).toEqual({ value: null, n: 5, converged: 4, needed: 5 });
  });

  it('needs exactly 19 of 20 at 95 %, not 20 (0.95 × 20 in floating point is 19.000000000000004)', () => {
    const twenty = Array.from({ length: 20 }, (_, i) => i + 1);
    expect(recommendedParameter(twenty, 0.95)).toMatchObject({ value: 19, needed: 19 });
  });

  it('orders downwards for a decreasing parameter', () => {
    expect(recommendedParameter([0.1, 0.05, 0.2], 2 / 3, 'decreasing').value).toBe(0.1);
  });

  it('has no value for an empty class and refuses a share outside (0, 1]', () => {
    expect(recommendedParameter([], 0.95).value).toBeNull();
    expect(() => recommendedParameter(points, 0)).toThrow(/share/);
    expect(() => recommendedParameter(points, 1.5)).toThrow(/share/);
  });
});

describe('deviationDistribution', () => {
  it('gives the median and the type-7 95th percentile over materials', () => {
    const rows = Array.from({ length: 20 }, (_, i) => ({ maxAbsolute: i + 1, meanAbsolute: (i + 1) / 10 }));
    // Hyndman & Fan definition 7: h = (20 − 1)·0.95 = 18.05 → x₁₉ + 0.05 (x₂₀ − x₁₉) = 19.05; median 10.5.
    const d = deviationDistribution(rows)!;
    expect(d.n).toBe(20);
    expect(d.medianMax).toBeCloseTo(10.5, 12);
    expect(d.p95Max).toBeCloseTo(19.05, 12);
    expect(d.medianMean).toBeCloseTo(1.05, 12);
    expect(deviationDistribution([])).toBeNull();
  });
});
