import { describe, expect, it } from 'vitest';
import { createRandom, erfc, errorStatistics, flagOutliers, modifiedZScores, normalCdf } from '@/lib/science';
import { jStat } from '../../reference/jstat';

const pairs = [
  { measured: 144, calculated: 139.2, measuredUncertainty: 1 },
  { measured: 533, calculated: 529.0, measuredUncertainty: 2, calculatedUncertainty: 2 },
  { measured: 561, calculated: 556.4 },
  { measured: 569, calculated: 566.1, measuredUncertainty: 1 },
  { measured: 735, calculated: 725.3, calculatedUncertainty: 3 },
  { measured: 743, calculated: 731.8, measuredUncertainty: 0, calculatedUncertainty: 0 },
];

describe('errorStatistics', () => {
  it('finds the largest error and its index', () => {
    const stats = errorStatistics(pairs, { bootstrapSamples: 0 });
    expect(stats.maxAbsoluteErrorIndex).toBe(5);
    expect(stats.maxAbsoluteError).toBeCloseTo(11.2, 12);
    expect(stats.bootstrap).toBeUndefined();
  });

  it('counts pairs within 1σ and 2σ of the combined uncertainty, only where one exists', () => {
    // σ: √1 = 1 (|e| 4.8), √8 ≈ 2.83 (|e| 4.0), 1 (|e| 2.9), 3 (|e| 9.7); the 0/0 pair has none
    const stats = errorStatistics(pairs, { bootstrapSamples: 0 });
    expect(stats.withinOneSigma).toBeCloseTo(0 / 4, 12);
    expect(stats.withinTwoSigma).toBeCloseTo(1 / 4, 12);
    const none = errorStatistics(pairs.map(({ measured, calculated }) => ({ measured, calculated })), { bootstrapSamples: 0 });
    expect(none.withinOneSigma).toBeUndefined();
  });

  it('gives deterministic bootstrap intervals that depend on the seed and bracket the estimate', () => {
    const a = errorStatistics(pairs, { seed: 7 });
    const b = errorStatistics(pairs, { seed: 7 });
    const c = errorStatistics(pairs, { seed: 8 });
    expect(a.bootstrap).toEqual(b.bootstrap);
    expect(a.bootstrap).not.toEqual(c.bootstrap);
    expect(a.bootstrap?.confidence).toBe(0.95);
    const [lo, hi] = a.bootstrap?.meanAbsoluteError ?? [0, 0];
    expect(lo).toBeLessThanOrEqual(a.meanAbsoluteError);
    expect(hi).toBeGreaterThanOrEqual(a.meanAbsoluteError);
    const narrow = errorStatistics(pairs, { seed: 7, confidence: 0.5 });
    expect(narrow.bootstrap?.meanSignedError[1]).toBeLessThanOrEqual(a.bootstrap?.meanSignedError[1] ?? 0);
  });

  it('bootstrap intervals of a large sample approach mean ± 1.96 SE', () => {
    // central limit theorem (textbook): the percentile interval of the mean ≈ x̄ ± 1.96 s/√n
    const random = createRandom(3);
    const big = Array.from({ length: 2000 }, () => {
      const measured = 100 + 900 * random();
      return { measured, calculated: measured + 10 * (random() - 0.4) };
    });
    const stats = errorStatistics(big, { bootstrapSamples: 2000, seed: 11 });
    const se = stats.standardDeviation / Math.sqrt(big.length);
    const [lo, hi] = stats.bootstrap?.meanSignedError ?? [0, 0];
    expect((hi - lo) / (2 * 1.96 * se)).toBeGreaterThan(0.9);
    expect((hi - lo) / (2 * 1.96 * se)).toBeLessThan(1.1);
  });
});

describe('createRandom', () => {
  it('is reproducible and roughly uniform', () => {
    const a = createRandom(42);
    const b = createRandom(42);
    const values = Array.from({ length: 20000 }, () => a());
    expect(values.slice(0, 5)).toEqual(Array.from({ length: 5 }, () => b()));
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...values)).toBeLessThan(1);
    const mean = values.reduce((s, v) => s + v, 0) / values.length;
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.01);
  });
});

describe('normal distribution', () => {
  it('matches jStat across the range', () => {
    for (let z = -8; z <= 8; z += 0.25) expect(normalCdf(z)).toBeCloseTo(jStat.normal.cdf(z, 0, 1), 12);
    expect(erfc(0)).toBe(1);
    expect(normalCdf(1.959963984540054)).toBeCloseTo(0.975, 14); // Φ⁻¹(0.975), common practice
  });
});

describe('outlier rules', () => {
  it('modified z-scores fall back to the mean absolute deviation when MAD = 0', () => {
    // median 5, MAD 0; MeanAD = (0·5 + 5)/6; M = (10 − 5)/(√(π/2) MeanAD)
    const values = [5, 5, 5, 5, 5, 10];
    const scores = modifiedZScores(values);
    expect(scores.slice(0, 5)).toEqual([0, 0, 0, 0, 0]);
    expect(scores[5]).toBeCloseTo(5 / (Math.sqrt(Math.PI / 2) * (5 / 6)), 12);
    expect(modifiedZScores([3, 3, 3])).toEqual([0, 0, 0]);
  });

  it('relative and sigma rules', () => {
    const data = [
      { measured: 100, calculated: 104 },
      { measured: 100, calculated: 112, measuredUncertainty: 2 },
      { measured: 200, calculated: 203, measuredUncertainty: 1 },
    ];
    expect(flagOutliers(data, { kind: 'relative', threshold: 0.05 })).toEqual([false, true, false]);
    expect(flagOutliers(data, { kind: 'sigma', threshold: 2 })).toEqual([false, true, true]);
    expect(flagOutliers([], { kind: 'modified-z', threshold: 3.5 })).toEqual([]);
  });
});
