/**
 * Error statistics of one method over its pairs (error e = calculated − measured).
 * RMSE divides by n, the standard deviation by n − 1; median and 95th percentile
 * of |e| are Hyndman–Fan type-7 quantiles; Lin's concordance uses 1/N moments;
 * Bland–Altman limits are bias ± 1.96 SD. All sums are two-pass and compensated.
 *
 * Mean absolute relative error: mean(|e| / |measured|), a fraction (the percentage
 * form is meanAbsolutePercentageError = 100 × it).
 *
 * Uncertainty-weighted view, over the pairs with a combined σ = √(u_m² + u_c²) > 0:
 * reduced χ² = Σ (e/σ)² / ν with ν = the number of such pairs (nothing is fitted to
 * the errors, so no degree of freedom is lost). ≈ 1: the errors are as large as the
 * stated uncertainties; ≫ 1: the method's error is larger than the uncertainties.
 *
 * Clusters (`options.clusters`, one id per pair, e.g. the material): the bootstrap
 * resamples whole clusters (bootstrap.ts), and the out-of-sample RMSE after scaling
 * leaves one cluster out at a time: for each cluster c, λ₋c = Σ_{i∉c} ω ν / Σ_{i∉c} ω²
 * from the other clusters, residuals λ₋c ω − ν on c, RMSE over every pair. Without
 * clusters every pair is its own cluster (leave-one-out). The in-sample RMSE after
 * scaling fits λ to the very pairs it is judged on and flatters it; for a fit through
 * the origin the left-out residuals are never smaller in norm, so the out-of-sample
 * value is ≥ the in-sample one. It needs at least two clusters; with one cluster, or
 * when the others' Σω² is 0, it is absent. A cluster bootstrap of fewer than two
 * clusters would be a single value, so it is absent too. When every calculated value
 * is 0 (Σω² = 0), no λ fits: λ and every RMSE after scaling are absent and
 * `scaleFactorUndefined` says why; the other statistics are still returned.
 *
 * Correlations: Pearson r is absent when the measured or the calculated values are
 * all equal (r = s_xy / √(s_xx s_yy) is 0/0), and Lin's concordance when both are the
 * same constant; `correlationUndefined` says which. A group of pairs that all share one
 * measured value (one mode matched by several calculations) is real data, so the
 * other statistics are still returned rather than the whole computation failing.
 */
import { bootstrapErrorIntervals, clusterBootstrapIntervals, clusterSums, type BootstrapIntervals } from './bootstrap';
import { centredMoments, concordanceFromMoments, pearsonFromMoments, quantileOfSorted } from './descriptive';
import { ScienceInputError, requireFinite, requireNonNegative } from './errors';
import { compensatedSum } from './summation';

/** One measured/calculated value pair with optional standard uncertainties (same unit). */
export interface PairValue {
  measured: number;
  calculated: number;
  measuredUncertainty?: number;
  calculatedUncertainty?: number;
}

/** The statistics errorStatistics returns; all errors in the unit of the inputs. */
export interface ErrorStatistics {
  n: number;
  meanSignedError: number;
  meanAbsoluteError: number;
  rootMeanSquareError: number;
  /** Of the errors, n − 1 divisor. */
  standardDeviation: number;
  medianAbsoluteError: number;
  p95AbsoluteError: number;
  maxAbsoluteError: number;
  /** Index into the input array of the first pair with the largest |e|. */
  maxAbsoluteErrorIndex: number;
  /** 100 × mean(|e| / |measured|). */
  meanAbsolutePercentageError: number;
  /** mean(|e| / |measured|), a fraction. */
  meanAbsoluteRelativeError: number;
  /** λ = Σ ων / Σ ω²; absent when every calculated value is 0 (`scaleFactorUndefined` says so). */
  scaleFactor?: number;
  rmseAfterScaling?: number;
  /** Why there is no scale factor, in words. */
  scaleFactorUndefined?: string;
  /** RMSE after scaling with λ fitted without the pair's own cluster (module header); absent below two clusters. */
  rmseAfterScalingOutOfSample?: number;
  /** Standard error of λ, robust to errors shared within a cluster (scaleFactorStandardError); absent below two clusters. */
  scaleFactorStandardError?: number;
  /** Σ (e/σ)² / ν over the pairs with a combined uncertainty; absent when none has one. */
  reducedChiSquare?: number;
  /** ν: pairs with a combined uncertainty. */
  chiSquarePairs?: number;
  /** Number of distinct clusters (when clusters were given). */
  clusterCount?: number;
  /** Absent when the measured or the calculated values are constant (module header). */
  pearsonR?: number;
  /** Lin's concordance correlation coefficient, 1/N moments; absent when measured and calculated are the same constant. */
  concordance?: number;
  /** Why a correlation is absent, in words. */
  correlationUndefined?: string;
  /** bias ± 1.96 SD. */
  blandAltman: { bias: number; lower: number; upper: number };
  bootstrap?: BootstrapIntervals;
  /** Fraction of the pairs with an uncertainty whose |e| ≤ combined σ; absent when no pair has one. */
  withinOneSigma?: number;
  withinTwoSigma?: number;
}

/** Options of errorStatistics. */
export interface ErrorStatisticsOptions {
  /** Bootstrap resamples; default 1000, 0 switches the bootstrap off. */
  bootstrapSamples?: number;
  /** Seed of the bootstrap generator; default 1. */
  seed?: number;
  /** Confidence level of the bootstrap intervals, 0 < c < 1; default 0.95. */
  confidence?: number;
  /** One cluster id per pair (e.g. the material): the bootstrap resamples whole clusters. */
  clusters?: readonly (string | number)[];
}

/** Default number of bootstrap resamples. */
export const DEFAULT_BOOTSTRAP_SAMPLES = 1000;
/** Default bootstrap seed. */
export const DEFAULT_BOOTSTRAP_SEED = 1;
/** Bland–Altman multiplier of the SD for the 95 % limits of agreement. */
export const BLAND_ALTMAN_Z = 1.96;

/** Checks pairs for finite values, a non-zero measured value and non-negative uncertainties. */
export function validatePairs(pairs: readonly PairValue[], minLength: number): void {
  if (!Array.isArray(pairs)) throw new ScienceInputError('pairs', 'must be an array');
  if (pairs.length < minLength) {
    throw new ScienceInputError('pairs', `needs at least ${minLength} pair${minLength === 1 ? '' : 's'}, got ${pairs.length}`);
  }
  for (let i = 0; i < pairs.length; i++) {
    const p = pairs[i];
    requireFinite(`pairs[${i}].measured`, p.measured);
    requireFinite(`pairs[${i}].calculated`, p.calculated);
    if (p.measured === 0) throw new ScienceInputError(`pairs[${i}].measured`, 'must not be 0 (relative errors divide by it)');
    if (p.measuredUncertainty !== undefined) requireNonNegative(`pairs[${i}].measuredUncertainty`, p.measuredUncertainty);
    if (p.calculatedUncertainty !== undefined) requireNonNegative(`pairs[${i}].calculatedUncertainty`, p.calculatedUncertainty);
  }
}

/** Combined standard uncertainty √(u_m² + u_c²) of a pair, or undefined when neither side has one or it is 0. */
export function combinedUncertainty(pair: PairValue): number | undefined {
  if (pair.measuredUncertainty === undefined && pair.calculatedUncertainty === undefined) return undefined;
  const sigma = Math.hypot(pair.measuredUncertainty ?? 0, pair.calculatedUncertainty ?? 0);
  return sigma > 0 ? sigma : undefined;
}

function readClusters(clusters: ErrorStatisticsOptions['clusters'], n: number): readonly (string | number)[] | undefined {
  if (clusters === undefined) return undefined;
  if (!Array.isArray(clusters)) throw new ScienceInputError('options.clusters', 'must be an array of cluster ids, one per pair');
  if (clusters.length !== n) throw new ScienceInputError('options.clusters', `has ${clusters.length} ids for ${n} pairs; give one cluster id per pair`);
  clusters.forEach((c, i) => {
    if (!(typeof c === 'string' || (typeof c === 'number' && Number.isFinite(c)))) {
      throw new ScienceInputError(`options.clusters[${i}]`, `must be a string or a finite number, got ${String(c)}`);
    }
  });
  return clusters;
}

/**
 * Standard error of the least-squares scale factor λ = Σ ωᵢνᵢ / Σ ωᵢ² (ω calculated, ν
 * measured), robust to correlated residuals inside a cluster (the modes of one material):
 *   u(λ)² = G/(G − 1) · Σ_g (Σ_{i∈g} ωᵢ rᵢ)² / (Σ ωᵢ²)²,   rᵢ = νᵢ − λ ωᵢ,
 * the cluster-robust ("sandwich") variance of a one-parameter least-squares fit with the
 * usual G/(G − 1) small-sample factor (Cameron & Miller, J. Human Resources 50, 317 (2015),
 * §II.C). With one pair per cluster it is the heteroscedasticity-robust form, which makes
 * no assumption that the residuals are random noise of one size: they are not, they are the
 * method's systematic error (Irikura, Johnson & Kacker, J. Phys. Chem. A 109, 8430 (2005),
 * argue the same for scale factors). Undefined below two clusters, where
 * Σ_g ωr is zero by the normal equation.
 */
export function scaleFactorStandardError(calculated: ArrayLike<number>, measured: ArrayLike<number>, clusterOf: readonly (string | number)[]): number | undefined {
  const n = calculated.length;
  if (measured.length !== n || clusterOf.length !== n) throw new ScienceInputError('clusterOf', `needs one cluster per pair (${n}), got ${clusterOf.length}`);
  const products = new Float64Array(n);
  const squares = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    requireFinite(`calculated[${i}]`, calculated[i]);
    requireFinite(`measured[${i}]`, measured[i]);
    products[i] = calculated[i] * measured[i];
    squares[i] = calculated[i] * calculated[i];
  }
  const denominator = compensatedSum(squares);
  if (denominator === 0) throw new ScienceInputError('calculated', 'all values are 0; the scale factor is undefined');
  const lambda = compensatedSum(products) / denominator;
  const scores = new Map<string, number[]>();
  for (let i = 0; i < n; i++) {
    const key = String(clusterOf[i]);
    const term = calculated[i] * (measured[i] - lambda * calculated[i]);
    (scores.get(key) ?? scores.set(key, []).get(key)!).push(term);
  }
  const g = scores.size;
  if (g < 2) return undefined;
  const squaredScores = new Float64Array(g);
  let j = 0;
  for (const terms of scores.values()) squaredScores[j++] = compensatedSum(Float64Array.from(terms)) ** 2;
  return Math.sqrt((g / (g - 1)) * compensatedSum(squaredScores)) / denominator;
}

/** Out-of-sample RMSE after scaling (module header), or undefined below two clusters. */
function outOfSampleRmseAfterScaling(measured: Float64Array, calculated: Float64Array, clusterOf: readonly string[]): number | undefined {
  const n = measured.length;
  const members = new Map<string, number[]>();
  for (let i = 0; i < n; i++) (members.get(clusterOf[i]) ?? members.set(clusterOf[i], []).get(clusterOf[i])!).push(i);
  if (members.size < 2) return undefined;
  const products = new Float64Array(n);
  const squares = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    products[i] = calculated[i] * measured[i];
    squares[i] = calculated[i] * calculated[i];
  }
  const totalProducts = compensatedSum(products);
  const totalSquares = compensatedSum(squares);
  const residuals = new Float64Array(n);
  for (const indices of members.values()) {
    let inProducts = 0;
    let inSquares = 0;
    for (const i of indices) {
      inProducts += products[i];
      inSquares += squares[i];
    }
    const rest = totalSquares - inSquares;
    if (!(rest > 0)) return undefined;
    const lambda = (totalProducts - inProducts) / rest;
    for (const i of indices) {
      const r = lambda * calculated[i] - measured[i];
      residuals[i] = r * r;
    }
  }
  return Math.sqrt(compensatedSum(residuals) / n);
}

function readOptions(options: ErrorStatisticsOptions): { samples: number; seed: number; confidence: number } {
  const samples = options.bootstrapSamples ?? DEFAULT_BOOTSTRAP_SAMPLES;
  const seed = options.seed ?? DEFAULT_BOOTSTRAP_SEED;
  const confidence = options.confidence ?? 0.95;
  if (!Number.isInteger(samples) || samples < 0) {
    throw new ScienceInputError('options.bootstrapSamples', `must be a non-negative integer, got ${String(samples)}`);
  }
  if (!Number.isSafeInteger(seed)) throw new ScienceInputError('options.seed', `must be a safe integer, got ${String(seed)}`);
  if (typeof confidence !== 'number' || !(confidence > 0 && confidence < 1)) {
    throw new ScienceInputError('options.confidence', `must be between 0 and 1 (exclusive), got ${String(confidence)}`);
  }
  return { samples, seed, confidence };
}

/**
 * Computes the error statistics of a method over its pairs (at least 2, since the
 * SD, Pearson r and concordance need them). Deterministic: the bootstrap is seeded.
 */
export function errorStatistics(pairs: PairValue[], options: ErrorStatisticsOptions = {}): ErrorStatistics {
  validatePairs(pairs, 2);
  const { samples, seed, confidence } = readOptions(options);
  const n = pairs.length;
  const clusters = readClusters(options.clusters, n);
  const clusterOf = clusters ? clusters.map(String) : pairs.map((_, i) => String(i));
  const measured = new Float64Array(n);
  const calculated = new Float64Array(n);
  const errors = new Float64Array(n);
  const absolute = new Float64Array(n);
  const relative = new Float64Array(n);
  let maxAbsoluteError = -1;
  let maxAbsoluteErrorIndex = 0;
  for (let i = 0; i < n; i++) {
    const p = pairs[i];
    measured[i] = p.measured;
    calculated[i] = p.calculated;
    const e = p.calculated - p.measured;
    errors[i] = e;
    absolute[i] = Math.abs(e);
    relative[i] = Math.abs(e) / Math.abs(p.measured);
    if (absolute[i] > maxAbsoluteError) {
      maxAbsoluteError = absolute[i];
      maxAbsoluteErrorIndex = i;
    }
  }

  const meanSignedError = compensatedSum(errors) / n;
  const meanAbsoluteError = compensatedSum(absolute) / n;
  const squares = new Float64Array(n);
  const deviations = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    squares[i] = errors[i] * errors[i];
    const d = errors[i] - meanSignedError;
    deviations[i] = d * d;
  }
  const rootMeanSquareError = Math.sqrt(compensatedSum(squares) / n);
  const standardDeviation = Math.sqrt(compensatedSum(deviations) / (n - 1));

  const sortedAbsolute = Float64Array.from(absolute).sort();
  const moments = centredMoments(measured, calculated);

  const products = new Float64Array(n);
  const calculatedSquares = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    products[i] = calculated[i] * measured[i];
    calculatedSquares[i] = calculated[i] * calculated[i];
  }
  const calculatedSquareSum = compensatedSum(calculatedSquares);
  // Σω² = 0 (every calculated value is 0): no λ fits, but every other statistic is still defined.
  const scaling: Pick<ErrorStatistics, 'scaleFactor' | 'rmseAfterScaling'> = {};
  if (calculatedSquareSum > 0) {
    const lambda = compensatedSum(products) / calculatedSquareSum;
    for (let i = 0; i < n; i++) {
      const r = lambda * calculated[i] - measured[i];
      squares[i] = r * r;
    }
    scaling.scaleFactor = lambda;
    scaling.rmseAfterScaling = Math.sqrt(compensatedSum(squares) / n);
  }

  const statistics: ErrorStatistics = {
    n,
    meanSignedError,
    meanAbsoluteError,
    rootMeanSquareError,
    standardDeviation,
    medianAbsoluteError: quantileOfSorted(sortedAbsolute, 0.5),
    p95AbsoluteError: quantileOfSorted(sortedAbsolute, 0.95),
    maxAbsoluteError,
    maxAbsoluteErrorIndex,
    meanAbsolutePercentageError: (100 * compensatedSum(relative)) / n,
    meanAbsoluteRelativeError: compensatedSum(relative) / n,
    ...scaling,
    blandAltman: {
      bias: meanSignedError,
      lower: meanSignedError - BLAND_ALTMAN_Z * standardDeviation,
      upper: meanSignedError + BLAND_ALTMAN_Z * standardDeviation,
    },
  };
  const constant = [moments.sxx === 0 ? 'measured' : null, moments.syy === 0 ? 'calculated' : null].filter((v) => v !== null);
  if (constant.length === 0) statistics.pearsonR = pearsonFromMoments(moments);
  else statistics.correlationUndefined = `the ${constant.join(' and the ')} values are all equal, so Pearson r is undefined`;
  const shift = moments.meanX - moments.meanY;
  if (moments.sxx / n + moments.syy / n + shift * shift > 0) statistics.concordance = concordanceFromMoments(moments, n);
  else statistics.correlationUndefined = 'measured and calculated are the same constant, so neither Pearson r nor the concordance is defined';
  if (scaling.scaleFactor === undefined) {
    statistics.scaleFactorUndefined = 'every calculated value is 0, so no scale factor fits';
  } else {
    const outOfSample = outOfSampleRmseAfterScaling(measured, calculated, clusterOf);
    if (outOfSample !== undefined) statistics.rmseAfterScalingOutOfSample = outOfSample;
    const lambdaError = scaleFactorStandardError(calculated, measured, clusterOf);
    if (lambdaError !== undefined) statistics.scaleFactorStandardError = lambdaError;
  }
  if (clusters) {
    const sums = clusterSums(errors, clusterOf);
    statistics.clusterCount = sums.length;
    if (samples > 0 && sums.length >= 2) statistics.bootstrap = clusterBootstrapIntervals(sums, samples, seed, confidence);
  } else if (samples > 0) {
    // Resampling the sorted errors makes the intervals independent of the order of the pairs.
    statistics.bootstrap = bootstrapErrorIntervals(Float64Array.from(errors).sort(), samples, seed, confidence);
  }

  let withUncertainty = 0;
  let withinOne = 0;
  let withinTwo = 0;
  const chiTerms: number[] = [];
  for (let i = 0; i < n; i++) {
    const sigma = combinedUncertainty(pairs[i]);
    if (sigma === undefined) continue;
    withUncertainty++;
    if (absolute[i] <= sigma) withinOne++;
    if (absolute[i] <= 2 * sigma) withinTwo++;
    chiTerms.push((errors[i] / sigma) ** 2);
  }
  if (withUncertainty > 0) {
    statistics.withinOneSigma = withinOne / withUncertainty;
    statistics.withinTwoSigma = withinTwo / withUncertainty;
    statistics.reducedChiSquare = compensatedSum(chiTerms) / withUncertainty;
    statistics.chiSquarePairs = withUncertainty;
  }
  return statistics;
}
