/**
 * Clustered errors: the cluster bootstrap, the out-of-sample RMSE after scaling, the
 * reduced χ², the mean absolute relative error, and outlier scale / minimum N.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ScienceInputError, createRandom, errorStatistics, flagOutliers, type PairValue } from '@/lib/science';

function gaussian(random: () => number): number {
  // Box–Muller (textbook).
  const u = Math.max(random(), 1e-300);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

describe('cluster bootstrap', () => {
  it('a length mismatch is a ScienceInputError', () => {
    const pairs = [
      { measured: 100, calculated: 101 },
      { measured: 200, calculated: 199 },
    ];
    expect(() => errorStatistics(pairs, { clusters: ['a'] })).toThrow(ScienceInputError);
    expect(() => errorStatistics(pairs, { clusters: ['a'] })).toThrow(/1 ids for 2 pairs/);
  });

  it('with one pair per cluster equals the pair bootstrap (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ measured: fc.double({ min: 10, max: 2000, noNaN: true }), error: fc.double({ min: -50, max: 50, noNaN: true }) }), { minLength: 2, maxLength: 30 }),
        fc.integer({ min: 1, max: 1000 }),
        (rows, seed) => {
          const pairs = rows.map((r) => ({ measured: r.measured, calculated: r.measured + r.error }));
          const plain = errorStatistics(pairs, { bootstrapSamples: 200, seed }).bootstrap!;
          const clustered = errorStatistics(pairs, { bootstrapSamples: 200, seed, clusters: pairs.map((_, i) => `m${i}`) }).bootstrap!;
          expect(clustered.meanAbsoluteError).toEqual(plain.meanAbsoluteError);
          expect(clustered.meanSignedError).toEqual(plain.meanSignedError);
          expect(clustered.resampled).toBe('clusters');
        },
      ),
      { numRuns: 60 },
    );
  });

  it('does not depend on the order of the pairs', () => {
    const pairs = [100, 200, 300, 400, 500, 600].map((m, i) => ({ measured: m, calculated: m * 0.97 + i }));
    const clusters = ['a', 'a', 'b', 'b', 'c', 'c'];
    const forward = errorStatistics(pairs, { clusters }).bootstrap;
    const backward = errorStatistics([...pairs].reverse(), { clusters: [...clusters].reverse() }).bootstrap;
    expect(backward).toEqual(forward);
  });

  it('on clustered data (10 materials × 4 modes) is wider than the pair interval and covers near 95 % where the pair one does not', () => {
    // Seeded simulation: e = μ + b_material + ε, b ~ N(0, 4²), ε ~ N(0, 2²) (intraclass correlation 0.8).
    // Target: the mean signed error μ. The design effect 1 + 3·0.8 = 3.4 makes the pair interval
    // √3.4 ≈ 1.8 times too narrow (coverage ≈ 70 %); the percentile cluster bootstrap of 10 clusters
    // covers close to nominal (slightly below: it ignores the t correction of 9 degrees of freedom).
    const random = createRandom(20261202);
    const repetitions = 300;
    const mu = -5;
    let pairCovers = 0;
    let clusterCovers = 0;
    let widthRatio = 0;
    for (let r = 0; r < repetitions; r++) {
      const pairs: PairValue[] = [];
      const clusters: string[] = [];
      for (let m = 0; m < 10; m++) {
        const b = 4 * gaussian(random);
        for (let k = 0; k < 4; k++) {
          const measured = 200 + 100 * k;
          pairs.push({ measured, calculated: measured + mu + b + 2 * gaussian(random) });
          clusters.push(`material-${m}`);
        }
      }
      const plain = errorStatistics(pairs, { bootstrapSamples: 300, seed: r + 1 }).bootstrap!.meanSignedError;
      const clustered = errorStatistics(pairs, { bootstrapSamples: 300, seed: r + 1, clusters }).bootstrap!.meanSignedError;
      if (plain[0] <= mu && mu <= plain[1]) pairCovers++;
      if (clustered[0] <= mu && mu <= clustered[1]) clusterCovers++;
      widthRatio += (clustered[1] - clustered[0]) / (plain[1] - plain[0]) / repetitions;
    }
    expect(widthRatio).toBeGreaterThan(1.5);
    expect(pairCovers / repetitions).toBeLessThan(0.8);
    expect(clusterCovers / repetitions).toBeGreaterThan(0.86);
    expect(clusterCovers / repetitions).toBeLessThanOrEqual(0.98);
  });

  it('fewer than two clusters give no interval rather than a zero-width one', () => {
    const pairs = [100, 200, 300].map((m) => ({ measured: m, calculated: m + 1 }));
    const s = errorStatistics(pairs, { clusters: ['a', 'a', 'a'] });
    expect(s.bootstrap).toBeUndefined();
    expect(s.clusterCount).toBe(1);
    expect(s.rmseAfterScalingOutOfSample).toBeUndefined();
  });
});

describe('out-of-sample RMSE after scaling', () => {
  it('worked case: two materials, λ fitted on the other one', () => {
    // A: ω = 100 → ν = 110; B: ω = 200 → ν = 200. λ₋A = 200·200/200² = 1, λ₋B = 100·110/100² = 1.1.
    // Residuals: A 1·100 − 110 = −10; B 1.1·200 − 200 = 20 → RMSE = √((100 + 400)/2).
    const s = errorStatistics(
      [
        { measured: 110, calculated: 100 },
        { measured: 200, calculated: 200 },
      ],
      { clusters: ['A', 'B'] },
    );
    expect(s.rmseAfterScalingOutOfSample).toBeCloseTo(Math.sqrt(250), 12);
    expect(s.rmseAfterScaling).toBeLessThan(s.rmseAfterScalingOutOfSample!);
  });

  it('is never below the in-sample value (property: left-out residuals of a linear fit are not smaller)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ measured: fc.double({ min: 50, max: 1500, noNaN: true }), factor: fc.double({ min: 0.8, max: 1.2, noNaN: true }), cluster: fc.integer({ min: 0, max: 4 }) }), { minLength: 3, maxLength: 25 }),
        (rows) => {
          const pairs = rows.map((r) => ({ measured: r.measured, calculated: r.measured * r.factor }));
          const s = errorStatistics(pairs, { bootstrapSamples: 0, clusters: rows.map((r) => r.cluster) });
          if (s.rmseAfterScalingOutOfSample === undefined) return;
          // An exact fit (every factor equal) leaves both RMSEs at rounding noise, ~1e-13 of values near 1e3: allow
          // that noise on the scale of the data as well as a relative slack, else the property fails on noise.
          const noise = 1e-12 * Math.max(...pairs.map((p) => Math.abs(p.calculated)));
          expect(s.rmseAfterScalingOutOfSample).toBeGreaterThanOrEqual(s.rmseAfterScaling! * (1 - 1e-9) - noise);
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe('relative error and reduced χ²', () => {
  it('worked case', () => {
    const s = errorStatistics([
      { measured: 100, calculated: 102, measuredUncertainty: 2 },
      { measured: 200, calculated: 196, measuredUncertainty: 2 },
      { measured: 400, calculated: 400 },
    ]);
    // |e|/ν = 0.02, 0.02, 0 → 0.04/3.
    expect(s.meanAbsoluteRelativeError).toBeCloseTo(0.04 / 3, 14);
    expect(s.meanAbsolutePercentageError).toBeCloseTo(400 / 300, 12);
    // (2/2)² + (4/2)² = 5 over ν = 2 pairs with a σ.
    expect(s.reducedChiSquare).toBeCloseTo(2.5, 14);
    expect(s.chiSquarePairs).toBe(2);
  });

  it('is absent without uncertainties', () => {
    expect(errorStatistics([{ measured: 1, calculated: 2 }, { measured: 2, calculated: 2.5 }]).reducedChiSquare).toBeUndefined();
  });
});

describe('outlier scale and minimum N', () => {
  it('at N = 3 the modified z flags nothing once minN is 10 (a −2.55 cm⁻¹ error was flagged)', () => {
    const pairs = [
      { measured: 520.45, calculated: 520.15 },
      { measured: 300.7, calculated: 300.45 },
      { measured: 1332.7, calculated: 1330.15 },
    ];
    expect(flagOutliers(pairs, { kind: 'modified-z', threshold: 3.5 })).toEqual([false, false, true]);
    expect(flagOutliers(pairs, { kind: 'modified-z', threshold: 3.5, minN: 10 })).toEqual([false, false, false]);
    // The per-pair rules estimate nothing from the sample and apply at any N.
    expect(flagOutliers(pairs, { kind: 'relative', threshold: 0.001, minN: 10 })).toEqual([false, false, true]);
  });

  it('under a uniform −3.5 % bias the relative scale flags nothing where the absolute scale flags the highest lines', () => {
    // Measured lines (cm⁻¹): Si 520.45 (Itoh & Shirono 2020), Ge 300.7 (Parker et al. 1967), diamond 1332.7 (PRB 2000),
    // GaN 533, 561, 569 (Azuhata et al. 1995), GaAs 273.3, 297.3 (Hass & Henvis 1962), CaF2 322 (Ananthanarayanan),
    // sapphire 418.3, 577.7 (J. Raman Spectrosc. 2016); ZnO E2(high) 438, A1(TO) 380, rutile Eg 447, A1g 612 and
    // c-BN LO 1306 (from memory). Most lines lie at 270–610 cm⁻¹, as in a typical benchmark.
    const measured = [520.45, 300.7, 1332.7, 533, 561, 569, 273.3, 297.3, 322, 418.3, 577.7, 438, 380, 447, 612, 1306];
    const pairs = measured.map((m, i) => ({ measured: m, calculated: m * (1 - 0.035 + 0.002 * Math.sin(i)) }));
    const absolute = flagOutliers(pairs, { kind: 'modified-z', threshold: 3.5, scale: 'absolute' });
    const flagged = measured.filter((_, i) => absolute[i]);
    expect(flagged).toContain(1332.7);
    expect(flagged).toContain(1306);
    expect(flagOutliers(pairs, { kind: 'modified-z', threshold: 3.5, scale: 'relative' })).toEqual(measured.map(() => false));
    expect(flagOutliers(pairs, { kind: 'tukey', threshold: 1.5, scale: 'relative' })).toEqual(measured.map(() => false));
  });

  it('refuses an unknown scale and a bad minN', () => {
    const pairs = [{ measured: 1, calculated: 2 }];
    expect(() => flagOutliers(pairs, { kind: 'tukey', threshold: 1.5, scale: 'log' as never })).toThrow(ScienceInputError);
    expect(() => flagOutliers(pairs, { kind: 'tukey', threshold: 1.5, minN: 0 })).toThrow(ScienceInputError);
  });
});
