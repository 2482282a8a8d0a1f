import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  concordanceCorrelation,
  errorStatistics,
  lag1Autocorrelation,
  mean,
  median,
  modifiedZScores,
  pearsonCorrelation,
  ScienceInputError,
  quantile,
  sampleStandardDeviation,
  scaleFactor,
  scaleFactorStandardError,
  tukeyFences,
  flagOutliers,
} from '@/lib/science';
import { jStat } from './jstat';

function numAcc(centre: number): number[] {
  // NIST StRD NumAcc2–4 layout: the centre value, then 500 pairs of centre − 0.1, centre + 0.1
  const values = [centre + 0.2];
  for (let i = 0; i < 500; i++) values.push(centre + 0.1, centre + 0.3);
  return values;
}

function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

describe('NIST StRD univariate numerical-accuracy sets', () => {
  it('NumAcc1: mean 10000002, SD 1, lag-1 autocorrelation −0.5', () => {
    const values = [10000001, 10000003, 10000002]; // NIST StRD NumAcc1
    expect(mean(values)).toBe(10000002); // NIST StRD NumAcc1 certified mean
    expect(sampleStandardDeviation(values)).toBe(1); // NIST StRD NumAcc1 certified SD
    expect(lag1Autocorrelation(values)).toBe(-0.5); // NIST StRD NumAcc1 certified autocorrelation
  });

  it('NumAcc2: mean 1.2, SD 0.1', () => {
    const values = [1.2];
    for (let i = 0; i < 500; i++) values.push(1.1, 1.3); // NIST StRD NumAcc2
    expect(relativeError(mean(values), 1.2)).toBeLessThan(1e-15); // NIST StRD NumAcc2 certified mean
    expect(relativeError(sampleStandardDeviation(values), 0.1)).toBeLessThan(1e-13); // certified SD
  });

  // The decimal inputs of NumAcc3/4 are not representable in binary: 1000000.1 is stored with an
  // error up to 6e-11 and 10000000.1 up to 9e-10, which bounds the SD of the stored data to
  // about 1e-9 / 1e-8 relative of 0.1. Deviations x − x̄ are exact (Sterbenz), so the code adds
  // no error of its own; the tolerances below are those representation limits.
  it('NumAcc3: mean 1000000.2, SD 0.1', () => {
    const values = numAcc(1000000); // NIST StRD NumAcc3
    expect(relativeError(mean(values), 1000000.2)).toBeLessThan(1e-15); // certified mean
    expect(relativeError(sampleStandardDeviation(values), 0.1)).toBeLessThan(2e-9); // certified SD
  });

  it('NumAcc4: mean 10000000.2, SD 0.1', () => {
    const values = numAcc(10000000); // NIST StRD NumAcc4
    expect(relativeError(mean(values), 10000000.2)).toBeLessThan(1e-15); // certified mean
    expect(relativeError(sampleStandardDeviation(values), 0.1)).toBeLessThan(2e-8); // certified SD
  });

  it('errorStatistics reproduces NumAcc4 through the errors', () => {
    // errors e = 2x − x = x exactly, so the error statistics must match NIST StRD NumAcc4
    const values = numAcc(10000000);
    const stats = errorStatistics(
      values.map((x) => ({ measured: x, calculated: 2 * x })),
      { bootstrapSamples: 0 },
    );
    expect(relativeError(stats.meanSignedError, 10000000.2)).toBeLessThan(1e-15);
    expect(relativeError(stats.standardDeviation, 0.1)).toBeLessThan(2e-8);
  });
});

describe('Bland–Altman peak expiratory flow example', () => {
  // Bland & Altman, Lancet 327, 307 (1986), Table 1: Wright and mini Wright peak flow meters, 17 subjects
  const wright = [494, 395, 516, 434, 476, 557, 413, 442, 650, 433, 417, 656, 267, 478, 178, 423, 427];
  const mini = [512, 430, 520, 428, 500, 600, 364, 380, 658, 445, 432, 626, 260, 477, 259, 350, 451];

  it('mean difference (Wright − mini) −2.1, SD 38.8', () => {
    const stats = errorStatistics(
      wright.map((w, i) => ({ measured: mini[i], calculated: w })),
      { bootstrapSamples: 0 },
    );
    expect(stats.n).toBe(17);
    expect(stats.blandAltman.bias).toBeCloseTo(-2.1, 1); // Bland & Altman 1986: −2.1
    expect(stats.standardDeviation).toBeCloseTo(38.8, 1); // Bland & Altman 1986: 38.8
    // The paper's limits used ±2 SD: −79.7 to 75.5 (Bland & Altman 1986); ours are ±1.96 SD by contract.
    expect(stats.meanSignedError - 2 * stats.standardDeviation).toBeCloseTo(-79.7, 0);
    expect(stats.meanSignedError + 2 * stats.standardDeviation).toBeCloseTo(75.5, 0);
    expect(stats.blandAltman.lower).toBeCloseTo(stats.blandAltman.bias - 1.96 * stats.standardDeviation, 12);
  });
});

describe("Lin's concordance correlation coefficient", () => {
  it('matches its definition with 1/N moments, computed independently here', () => {
    // Lin, Biometrics 45, 255 (1989): ρc = 2 s_xy / (s_x² + s_y² + (x̄ − ȳ)²), 1/N moments
    const x = [144, 533, 561, 569, 735, 743]; // Azuhata et al. 1995, GaN (measured)
    const y = [139.2, 529.0, 556.4, 566.1, 725.3, 731.8]; // illustrative calculated values
    const n = x.length;
    let mx = 0;
    let my = 0;
    for (let i = 0; i < n; i++) {
      mx += x[i] / n;
      my += y[i] / n;
    }
    let sxx = 0;
    let syy = 0;
    let sxy = 0;
    for (let i = 0; i < n; i++) {
      sxx += (x[i] - mx) ** 2 / n;
      syy += (y[i] - my) ** 2 / n;
      sxy += ((x[i] - mx) * (y[i] - my)) / n;
    }
    const expected = (2 * sxy) / (sxx + syy + (mx - my) ** 2);
    expect(concordanceCorrelation(x, y)).toBeCloseTo(expected, 12);
    const stats = errorStatistics(
      x.map((m, i) => ({ measured: m, calculated: y[i] })),
      { bootstrapSamples: 0 },
    );
    expect(stats.concordance).toBeCloseTo(expected, 12);
    // and ρc = r × bias-correction factor (Lin 1989) is below Pearson r when the means differ
    expect(stats.concordance).toBeLessThan(stats.pearsonR!);
  });

  it('is 1 for identical data and below 1 for a pure offset', () => {
    // Lin 1989: ρc = 1 iff perfect agreement
    expect(concordanceCorrelation([1, 2, 3, 4], [1, 2, 3, 4])).toBeCloseTo(1, 15);
    expect(concordanceCorrelation([1, 2, 3, 4], [2, 3, 4, 5])).toBeLessThan(1);
  });

  it('a constant measured column: r is absent with the reason, ρc = 0, the error statistics are kept (worked case)', () => {
    // One mode measured once (500 cm⁻¹) and matched by three calculations, invented values.
    // s_xx = 0, so r = s_xy / √(s_xx s_yy) is 0/0; s_xy = 0 too, so ρc = 0 / (s_yy/N + (x̄ − ȳ)²) = 0.
    // e = −10, 5, 10: mean e = 5/3, MAE = 25/3 (worked by hand).
    const stats = errorStatistics(
      [490, 505, 510].map((c) => ({ measured: 500, calculated: c })),
      { bootstrapSamples: 0 },
    );
    expect(stats.pearsonR).toBeUndefined();
    expect(stats.correlationUndefined).toMatch(/measured values are all equal/);
    expect(stats.concordance).toBe(0);
    expect(stats.meanSignedError).toBeCloseTo(5 / 3, 12);
    expect(stats.meanAbsoluteError).toBeCloseTo(25 / 3, 12);
    expect(() => pearsonCorrelation([500, 500, 500], [490, 505, 510])).toThrow(ScienceInputError);
  });

  it('measured and calculated the same constant: neither correlation is defined; an offset constant gives ρc = 0', () => {
    const same = errorStatistics([0, 1, 2].map(() => ({ measured: 500, calculated: 500 })), { bootstrapSamples: 0 });
    expect(same.pearsonR).toBeUndefined();
    expect(same.concordance).toBeUndefined();
    expect(same.correlationUndefined).toMatch(/neither Pearson r nor the concordance/);
    expect(same.meanAbsoluteError).toBe(0);
    expect(same.scaleFactor).toBe(1);
    // ρc = 2·0 / (0 + 0 + 10²) = 0 (Lin 1989 definition, worked by hand)
    const offset = errorStatistics([0, 1, 2].map(() => ({ measured: 500, calculated: 510 })), { bootstrapSamples: 0 });
    expect(offset.concordance).toBe(0);
    expect(offset.correlationUndefined).toMatch(/measured and the calculated values are all equal/);
  });
});

describe('least-squares scale factor', () => {
  it('λ = Σ ω ν / Σ ω², the least-squares fit through the origin', () => {
    // Scott & Radom, J. Phys. Chem. 100, 16502 (1996) — citation from memory; the formula is
    // the least-squares slope through the origin, recomputed independently here.
    const calculated = [517.1, 1300.2, 295.0, 549.0];
    const measured = [520.45, 1332.7, 300.7, 561]; // Si, diamond, Ge, GaN E1(TO) — check-values.md sources
    const numerator = calculated.reduce((s, w, i) => s + w * measured[i], 0);
    const denominator = calculated.reduce((s, w) => s + w * w, 0);
    const lambda = numerator / denominator;
    expect(scaleFactor(calculated, measured)).toBeCloseTo(lambda, 13);
    // λ minimises Σ(λω − ν)²: nudging λ either way must not lower the residual
    const residual = (l: number) => calculated.reduce((s, w, i) => s + (l * w - measured[i]) ** 2, 0);
    expect(residual(lambda)).toBeLessThan(residual(lambda * 1.001));
    expect(residual(lambda)).toBeLessThan(residual(lambda * 0.999));
    const stats = errorStatistics(
      calculated.map((c, i) => ({ calculated: c, measured: measured[i] })),
      { bootstrapSamples: 0 },
    );
    expect(stats.scaleFactor).toBeCloseTo(lambda, 13);
    expect(stats.rmseAfterScaling).toBeCloseTo(Math.sqrt(residual(lambda) / 4), 12);
  });
});

describe('standard error of the scale factor', () => {
  // Worked by hand: ω = 1, 2, 3 and ν = 1, 2, 4 give λ = 17/14 and residuals ν − λω = −3/14, −6/14, 5/14,
  // so the scores ω r are −3/14, −12/14, 15/14 (they sum to 0: the normal equation).
  const calculated = [1, 2, 3];
  const measured = [1, 2, 4];

  it('one pair per cluster: u(λ)² = G/(G − 1) Σ (ω r)² / (Σ ω²)² (Cameron & Miller 2015, robust form)', () => {
    // 3/2 · (9 + 144 + 225)/196 / 14² → u = √567 / 196
    expect(scaleFactorStandardError(calculated, measured, ['a', 'b', 'c'])).toBeCloseTo(Math.sqrt(567) / 196, 14);
  });

  it('modes of one material share a cluster: their scores add before squaring', () => {
    // clusters {1, 2} and {3}: sums −15/14 and 15/14 → 2/1 · 450/196 / 196 → u = 30/196
    expect(scaleFactorStandardError(calculated, measured, ['x', 'x', 'y'])).toBeCloseTo(30 / 196, 14);
  });

  it('is undefined with one cluster, and errorStatistics carries it when clusters are given', () => {
    expect(scaleFactorStandardError(calculated, measured, ['x', 'x', 'x'])).toBeUndefined();
    const stats = errorStatistics(calculated.map((c, i) => ({ calculated: c, measured: measured[i] })), { bootstrapSamples: 0, clusters: ['x', 'x', 'y'] });
    expect(stats.scaleFactorStandardError).toBeCloseTo(30 / 196, 14);
  });
});

describe('outlier rules against a hand-worked example', () => {
  // values 2 3 3 4 5 6 30: median 4; |x − 4| = 2 1 1 0 1 2 26 → sorted 0 1 1 1 2 2 26, MAD = 1 (worked by hand)
  const values = [2, 3, 3, 4, 5, 6, 30];

  it('modified z-scores Mᵢ = 0.6745 (xᵢ − median) / MAD', () => {
    // Iglewicz & Hoaglin, How to Detect and Handle Outliers (ASQC 1993)
    const scores = modifiedZScores(values);
    const byHand = [-1.349, -0.6745, -0.6745, 0, 0.6745, 1.349, 17.537];
    scores.forEach((m, i) => expect(m).toBeCloseTo(byHand[i], 3));
    // only 30 exceeds the Iglewicz–Hoaglin threshold 3.5
    expect(scores.map((m) => Math.abs(m) > 3.5)).toEqual([false, false, false, false, false, false, true]);
    // cross-check the MAD against simple-statistics
    expect(ss.medianAbsoluteDeviation(values)).toBe(1);
  });

  it('Tukey fences [Q1 − 1.5 IQR, Q3 + 1.5 IQR] with type-7 quartiles', () => {
    // Tukey, Exploratory Data Analysis (1977); quartiles type 7 (Hyndman & Fan 1996):
    // Q1 at h = 1.5 → 3 + 0.5·(3 − 3) = 3; Q3 at h = 4.5 → 5 + 0.5·(6 − 5) = 5.5; IQR 2.5 (by hand)
    expect(tukeyFences(values)).toEqual({ lower: 3 - 1.5 * 2.5, upper: 5.5 + 1.5 * 2.5 });
    expect(tukeyFences(values, 3)).toEqual({ lower: 3 - 3 * 2.5, upper: 5.5 + 3 * 2.5 }); // "far out"
  });

  it('flags the same point through errors of pairs', () => {
    // errors = values when measured = 100 and calculated = 100 + value (exact in binary)
    const pairs = values.map((v) => ({ measured: 100, calculated: 100 + v }));
    expect(flagOutliers(pairs, { kind: 'modified-z', threshold: 3.5 })).toEqual([false, false, false, false, false, false, true]);
    expect(flagOutliers(pairs, { kind: 'tukey', threshold: 1.5 })).toEqual([false, false, false, false, false, false, true]);
  });
});

describe('sample quantiles, Hyndman–Fan type 7', () => {
  it('match R/NumPy type 7 by hand and jStat with alphap = betap = 1', () => {
    // Hyndman & Fan, Am. Stat. 50, 361 (1996): type 7 = R and NumPy default
    const x = [7, 1, 3, 9, 4, 10];
    // sorted 1 3 4 7 9 10; p = 0.3 → h = 1.5 → 3 + 0.5·(4 − 3) = 3.5 (by hand)
    expect(quantile(x, 0.3)).toBeCloseTo(3.5, 14);
    for (const p of [0, 0.05, 0.25, 0.5, 0.9, 0.95, 1]) {
      expect(quantile(x, p)).toBeCloseTo(jStat.quantiles(x, [p], 1, 1)[0], 12);
    }
  });
});

describe('cross-checks against simple-statistics and jStat', () => {
  // a fixed pseudo-random data set (linear congruential, reproducible)
  const xs: number[] = [];
  const ys: number[] = [];
  let state = 12345;
  const next = () => {
    state = (state * 1103515245 + 12345) % 2147483648;
    return state / 2147483648;
  };
  for (let i = 0; i < 200; i++) {
    const x = 100 + 900 * next();
    xs.push(x);
    ys.push(x * 0.97 + 20 * (next() - 0.5));
  }

  it('mean, SD, median', () => {
    expect(mean(xs)).toBeCloseTo(ss.mean(xs), 10);
    expect(mean(xs)).toBeCloseTo(jStat.mean(xs), 10);
    expect(sampleStandardDeviation(xs)).toBeCloseTo(ss.sampleStandardDeviation(xs), 10);
    expect(sampleStandardDeviation(xs)).toBeCloseTo(jStat.stdev(xs, true), 10);
    expect(median(xs)).toBeCloseTo(ss.median(xs), 12);
    expect(median(xs)).toBeCloseTo(jStat.median(xs), 12);
  });

  it('Pearson r', () => {
    expect(pearsonCorrelation(xs, ys)).toBeCloseTo(ss.sampleCorrelation(xs, ys), 12);
    expect(pearsonCorrelation(xs, ys)).toBeCloseTo(jStat.corrcoeff(xs, ys), 12);
  });

  it('errorStatistics vs the libraries', () => {
    const pairs = xs.map((m, i) => ({ measured: m, calculated: ys[i] }));
    const stats = errorStatistics(pairs, { bootstrapSamples: 0 });
    const errors = ys.map((y, i) => y - xs[i]);
    const absolute = errors.map(Math.abs);
    expect(stats.meanSignedError).toBeCloseTo(ss.mean(errors), 10);
    expect(stats.meanAbsoluteError).toBeCloseTo(jStat.mean(absolute), 10);
    expect(stats.rootMeanSquareError).toBeCloseTo(ss.rootMeanSquare(errors), 10);
    expect(stats.standardDeviation).toBeCloseTo(jStat.stdev(errors, true), 10);
    expect(stats.medianAbsoluteError).toBeCloseTo(ss.median(absolute), 12);
    expect(stats.p95AbsoluteError).toBeCloseTo(jStat.quantiles(absolute, [0.95], 1, 1)[0], 12);
    expect(stats.maxAbsoluteError).toBe(ss.max(absolute));
    expect(stats.pearsonR).toBeCloseTo(ss.sampleCorrelation(xs, ys), 12);
    expect(stats.meanAbsolutePercentageError).toBeCloseTo(100 * ss.mean(absolute.map((a, i) => a / xs[i])), 10);
  });
});
