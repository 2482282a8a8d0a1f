/**
 * Seeded percentile bootstrap for the mean absolute and mean signed error.
 * Works on typed arrays and allocates nothing per resample.
 */
import { quantileOfSorted } from './descriptive';
import { Xoshiro128 } from './random';

/** Percentile-bootstrap intervals for MAE and mean signed error. */
export interface BootstrapIntervals {
  confidence: number;
  meanAbsoluteError: [number, number];
  meanSignedError: [number, number];
}

/**
 * Resamples the errors `samples` times with replacement (seeded, deterministic)
 * and returns the central `confidence` percentile intervals (type-7 quantiles)
 * of the resampled MAE and mean signed error. Arguments are validated by the caller.
 */
export function bootstrapErrorIntervals(errors: Float64Array, samples: number, seed: number, confidence: number): BootstrapIntervals {
  const n = errors.length;
  const absolute = new Float64Array(n);
  for (let i = 0; i < n; i++) absolute[i] = Math.abs(errors[i]);
  const maes = new Float64Array(samples);
  const means = new Float64Array(samples);
  const generator = new Xoshiro128(seed);
  const indices = new Int32Array(n);
  for (let s = 0; s < samples; s++) {
    generator.fillIndices(indices, n);
    let sumSigned = 0;
    let sumAbsolute = 0;
    for (let i = 0; i < n; i++) {
      const j = indices[i];
      sumSigned += errors[j];
      sumAbsolute += absolute[j];
    }
    means[s] = sumSigned / n;
    maes[s] = sumAbsolute / n;
  }
  maes.sort();
  means.sort();
  const lowerP = (1 - confidence) / 2;
  const upperP = 1 - lowerP;
  return {
    confidence,
    meanAbsoluteError: [quantileOfSorted(maes, lowerP), quantileOfSorted(maes, upperP)],
    meanSignedError: [quantileOfSorted(means, lowerP), quantileOfSorted(means, upperP)],
  };
}
