/**
 * Outlier rules for the errors of one method. Outliers are flagged, never dropped.
 *
 * Modified z-score (Iglewicz & Hoaglin 1993): Mᵢ = 0.6745 (xᵢ − x̃) / MAD with
 * MAD = median |xᵢ − x̃|. When MAD = 0 (more than half the values equal the median)
 * the score falls back to Mᵢ = (xᵢ − x̃) / (√(π/2) · MeanAD), MeanAD = mean |xᵢ − x̃|,
 * √(π/2) ≈ 1.2533 being σ/MeanAD for a normal distribution (the scaling used by
 * IBM SPSS and others); when MeanAD is also 0 every value equals the median and
 * every score is 0. No score is ever infinite or NaN.
 *
 * Scale (`rule.scale`, default 'absolute'): the sample rules (modified z, Tukey) run on
 * e itself, or with 'relative' on e / |measured|. Frequency errors grow with the
 * frequency (a uniform −3.5 % bias gives the highest lines the largest |e|), so on the
 * absolute scale the highest lines look like outliers when they are not; on the
 * relative scale they do not. The per-pair rules ('relative', 'sigma') have their own
 * scale and ignore it.
 *
 * Minimum N (`rule.minN`, default 1): the sample rules estimate a centre and a spread
 * from the sample itself, meaningless on a handful of values (at N = 3 one error of
 * −2.55 cm⁻¹ is "beyond 3.5"), so below minN they flag nothing. The per-pair rules
 * compare each pair with a fixed threshold, estimate nothing, and apply at any N.
 */
import { quantileOfSorted } from './descriptive';
import { ScienceInputError, requireFiniteArray, requirePositive } from './errors';
import { combinedUncertainty, validatePairs, type PairValue } from './statistics';
import { compensatedSum } from './summation';

/** Iglewicz–Hoaglin constant, Φ⁻¹(0.75) rounded as they published it. */
export const MODIFIED_Z_CONSTANT = 0.6745;
/** Iglewicz–Hoaglin recommended threshold on |M|. */
export const MODIFIED_Z_THRESHOLD = 3.5;
/** Tukey's inner-fence multiplier of the IQR. */
export const TUKEY_K = 1.5;

/** An outlier rule: modified z-score of e, Tukey fences on e (threshold = k), |e|/|measured|, or |e|/σ. */
export interface OutlierRule {
  kind: 'modified-z' | 'tukey' | 'relative' | 'sigma';
  threshold: number;
  /** Scale of the sample rules: e ('absolute', default) or e / |measured| ('relative'). */
  scale?: 'absolute' | 'relative';
  /** Smallest sample on which the sample rules flag anything; default 1. */
  minN?: number;
}

/** True for the rules that estimate a centre and spread from the sample (modified z, Tukey). */
export function isSampleRule(kind: OutlierRule['kind']): boolean {
  return kind === 'modified-z' || kind === 'tukey';
}

/** The values a sample rule runs on: e, or e / |measured| on the relative scale. */
export function outlierScaleValues(pairs: readonly PairValue[], scale: OutlierRule['scale']): number[] {
  return pairs.map((p) => (scale === 'relative' ? (p.calculated - p.measured) / Math.abs(p.measured) : p.calculated - p.measured));
}

function sortedCopy(values: readonly number[]): Float64Array {
  return Float64Array.from(values).sort();
}

/** Modified z-scores of the values (Iglewicz–Hoaglin; MAD = 0 handled as in the module header). */
export function modifiedZScores(values: number[]): number[] {
  requireFiniteArray('values', values);
  const centre = quantileOfSorted(sortedCopy(values), 0.5);
  const deviations = values.map((v) => Math.abs(v - centre));
  const mad = quantileOfSorted(sortedCopy(deviations), 0.5);
  if (mad > 0) return values.map((v) => (MODIFIED_Z_CONSTANT * (v - centre)) / mad);
  const meanAbsoluteDeviation = compensatedSum(deviations) / values.length;
  if (meanAbsoluteDeviation === 0) return values.map(() => 0);
  const scale = Math.sqrt(Math.PI / 2) * meanAbsoluteDeviation;
  return values.map((v) => (v - centre) / scale);
}

/** Tukey fences [Q1 − k·IQR, Q3 + k·IQR] with type-7 quartiles; k = 1.5 (inner), 3 (far out). */
export function tukeyFences(values: number[], k: number = TUKEY_K): { lower: number; upper: number } {
  requireFiniteArray('values', values);
  requirePositive('k', k);
  const sorted = sortedCopy(values);
  const q1 = quantileOfSorted(sorted, 0.25);
  const q3 = quantileOfSorted(sorted, 0.75);
  const iqr = q3 - q1;
  return { lower: q1 - k * iqr, upper: q3 + k * iqr };
}

/**
 * Flags pairs under one rule, on e = calculated − measured:
 * 'modified-z' |M| > threshold; 'tukey' e outside the fences with k = threshold;
 * 'relative' |e|/|measured| > threshold; 'sigma' |e| > threshold × combined σ
 * (pairs without an uncertainty are never flagged by this rule). An empty list gives [].
 */
export function flagOutliers(pairs: PairValue[], rule: OutlierRule): boolean[] {
  if (!rule || typeof rule !== 'object') throw new ScienceInputError('rule', 'must be an outlier rule');
  requirePositive('rule.threshold', rule.threshold);
  if (rule.scale !== undefined && rule.scale !== 'absolute' && rule.scale !== 'relative') {
    throw new ScienceInputError('rule.scale', `must be "absolute" or "relative", got ${String(rule.scale)}`);
  }
  const minN = rule.minN ?? 1;
  if (!(Number.isInteger(minN) && minN >= 1)) throw new ScienceInputError('rule.minN', `must be a positive integer, got ${String(rule.minN)}`);
  validatePairs(pairs, 0);
  const errors = pairs.map((p) => p.calculated - p.measured);
  if (errors.length === 0) return [];
  if (isSampleRule(rule.kind) && pairs.length < minN) return pairs.map(() => false);
  const values = outlierScaleValues(pairs, rule.scale);
  switch (rule.kind) {
    case 'modified-z':
      return modifiedZScores(values).map((m) => Math.abs(m) > rule.threshold);
    case 'tukey': {
      const { lower, upper } = tukeyFences(values, rule.threshold);
      return values.map((e) => e < lower || e > upper);
    }
    case 'relative':
      return pairs.map((p, i) => Math.abs(errors[i]) / Math.abs(p.measured) > rule.threshold);
    case 'sigma':
      return pairs.map((p, i) => {
        const sigma = combinedUncertainty(p);
        return sigma !== undefined && Math.abs(errors[i]) > rule.threshold * sigma;
      });
    default:
      throw new ScienceInputError('rule.kind', `unknown outlier rule "${String((rule as { kind: unknown }).kind)}"`);
  }
}
