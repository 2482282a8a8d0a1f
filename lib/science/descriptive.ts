/**
 * Univariate and bivariate descriptive statistics, two-pass with compensated
 * sums so that the NIST StRD numerical-accuracy sets come out exact.
 */
import { ScienceInputError, requireFiniteArray } from './errors';
import { compensatedSum } from './summation';

/** Arithmetic mean (compensated sum). */
export function mean(values: readonly number[]): number {
  requireFiniteArray('values', values);
  return compensatedSum(values) / values.length;
}

function sumOfSquaredDeviations(values: ArrayLike<number>, centre: number): number {
  let sum = 0;
  let compensation = 0;
  for (let i = 0; i < values.length; i++) {
    const d = values[i] - centre;
    const v = d * d;
    const t = sum + v;
    compensation += sum >= v ? sum - t + v : v - t + sum;
    sum = t;
  }
  return sum + compensation;
}

/** Sample variance with the n − 1 divisor, two-pass about the compensated mean. */
export function sampleVariance(values: readonly number[]): number {
  requireFiniteArray('values', values, 2);
  const centre = compensatedSum(values) / values.length;
  return sumOfSquaredDeviations(values, centre) / (values.length - 1);
}

/** Sample standard deviation (n − 1 divisor). */
export function sampleStandardDeviation(values: readonly number[]): number {
  return Math.sqrt(sampleVariance(values));
}

/** Lag-1 autocorrelation r₁ = Σ(xᵢ − x̄)(xᵢ₊₁ − x̄) / Σ(xᵢ − x̄)², as NIST StRD certifies it. */
export function lag1Autocorrelation(values: readonly number[]): number {
  requireFiniteArray('values', values, 2);
  const centre = compensatedSum(values) / values.length;
  const products = new Float64Array(values.length - 1);
  for (let i = 0; i < products.length; i++) products[i] = (values[i] - centre) * (values[i + 1] - centre);
  const denominator = sumOfSquaredDeviations(values, centre);
  if (denominator === 0) throw new ScienceInputError('values', 'all values are equal; the autocorrelation is undefined');
  return compensatedSum(products) / denominator;
}

/** Type-7 quantile of data that is already sorted ascending (no validation; internal hot path). */
export function quantileOfSorted(sorted: ArrayLike<number>, p: number): number {
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Sample quantile, Hyndman–Fan type 7 (the default of R and NumPy):
 * h = (n − 1) p, Q = x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋+1₎ − x₍⌊h⌋₎) on the sorted data.
 */
export function quantile(values: readonly number[], p: number): number {
  requireFiniteArray('values', values);
  if (typeof p !== 'number' || !(p >= 0 && p <= 1)) throw new ScienceInputError('p', `must be between 0 and 1, got ${String(p)}`);
  return quantileOfSorted(Float64Array.from(values).sort(), p);
}

/** Median (type-7 quantile at p = 0.5). */
export function median(values: readonly number[]): number {
  return quantile(values, 0.5);
}

function requireSameLength(x: readonly number[], y: readonly number[], xName: string, yName: string, minLength: number): void {
  requireFiniteArray(xName, x, minLength);
  requireFiniteArray(yName, y, minLength);
  if (x.length !== y.length) {
    throw new ScienceInputError(yName, `must have the same length as ${xName} (${x.length}), got ${y.length}`);
  }
}

interface Moments {
  meanX: number;
  meanY: number;
  sxx: number;
  syy: number;
  sxy: number;
}

/** Sums of squares and cross-products about the means (two-pass, compensated). */
export function centredMoments(x: ArrayLike<number>, y: ArrayLike<number>): Moments {
  const n = x.length;
  const meanX = compensatedSum(x) / n;
  const meanY = compensatedSum(y) / n;
  const cross = new Float64Array(n);
  for (let i = 0; i < n; i++) cross[i] = (x[i] - meanX) * (y[i] - meanY);
  return { meanX, meanY, sxx: sumOfSquaredDeviations(x, meanX), syy: sumOfSquaredDeviations(y, meanY), sxy: compensatedSum(cross) };
}

/** Pearson product-moment correlation coefficient r. */
export function pearsonCorrelation(x: readonly number[], y: readonly number[]): number {
  requireSameLength(x, y, 'x', 'y', 2);
  return pearsonFromMoments(centredMoments(x, y));
}

/** Pearson r from centred moments; throws when either variable is constant. */
export function pearsonFromMoments({ sxx, syy, sxy }: Moments): number {
  if (sxx === 0 || syy === 0) throw new ScienceInputError('values', 'one variable is constant; the Pearson correlation is undefined');
  return Math.max(-1, Math.min(1, sxy / Math.sqrt(sxx * syy)));
}

/**
 * Lin's concordance correlation coefficient with 1/N moments (Lin 1989):
 * ρ_c = 2 s_xy / (s_x² + s_y² + (x̄ − ȳ)²).
 */
export function concordanceCorrelation(x: number[], y: number[]): number {
  requireSameLength(x, y, 'x', 'y', 2);
  return concordanceFromMoments(centredMoments(x, y), x.length);
}

/** Lin's concordance from centred moments of n pairs (1/N moments). */
export function concordanceFromMoments({ meanX, meanY, sxx, syy, sxy }: Moments, n: number): number {
  const shift = meanX - meanY;
  const denominator = sxx / n + syy / n + shift * shift;
  if (denominator === 0) throw new ScienceInputError('values', 'x and y are identical constants; the concordance is undefined');
  return (2 * sxy) / n / denominator;
}

/**
 * Least-squares scale factor through the origin (Scott & Radom 1996):
 * λ = Σ ωᵢ νᵢ / Σ ωᵢ², ω calculated, ν measured, so that λω best matches ν.
 */
export function scaleFactor(calculated: number[], measured: number[]): number {
  requireSameLength(calculated, measured, 'calculated', 'measured', 1);
  const products = new Float64Array(calculated.length);
  const squares = new Float64Array(calculated.length);
  for (let i = 0; i < calculated.length; i++) {
    products[i] = calculated[i] * measured[i];
    squares[i] = calculated[i] * calculated[i];
  }
  const denominator = compensatedSum(squares);
  if (denominator === 0) throw new ScienceInputError('calculated', 'all values are 0; the scale factor is undefined');
  return compensatedSum(products) / denominator;
}
