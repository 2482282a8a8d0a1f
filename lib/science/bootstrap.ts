/**
 * Seeded percentile bootstrap for the mean absolute and mean signed error.
 * Works on typed arrays and allocates nothing per resample.
 *
 * Pair bootstrap: the n errors are resampled with replacement. Cluster bootstrap:
 * whole clusters (e.g. every pair of one material) are resampled with replacement,
 * K draws from K clusters, and each resample's statistic is the ratio
 * Σ over drawn clusters of Σ e (or Σ |e|) / Σ over drawn clusters of their sizes.
 * Errors inside one cluster are correlated (modes of one crystal share its
 * pseudopotential, volume and functional error), so only the cluster bootstrap
 * keeps its nominal coverage on such data; the pair bootstrap is too narrow.
 * Clusters are ordered by (lowest error, size, id), so the result does not depend
 * on the order of the pairs, and with one pair per cluster the cluster bootstrap
 * draws exactly what the pair bootstrap draws.
 */
import { quantileOfSorted } from './descriptive';
import { Xoshiro128 } from './random';

/** Percentile-bootstrap intervals for MAE and mean signed error. */
export interface BootstrapIntervals {
  confidence: number;
  meanAbsoluteError: [number, number];
  meanSignedError: [number, number];
  /** What was resampled: single pairs, or whole clusters (absent on older results: pairs). */
  resampled?: 'pairs' | 'clusters';
  /** Number of clusters resampled (cluster bootstrap only). */
  clusterCount?: number;
}

function intervals(maes: Float64Array, means: Float64Array, confidence: number) {
  maes.sort();
  means.sort();
  const lowerP = (1 - confidence) / 2;
  const upperP = 1 - lowerP;
  return {
    confidence,
    meanAbsoluteError: [quantileOfSorted(maes, lowerP), quantileOfSorted(maes, upperP)] as [number, number],
    meanSignedError: [quantileOfSorted(means, lowerP), quantileOfSorted(means, upperP)] as [number, number],
  };
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
  return { ...intervals(maes, means, confidence), resampled: 'pairs' };
}

/** Sums of one cluster, as the cluster bootstrap draws them. */
export interface ClusterSums {
  id: string;
  size: number;
  sumSigned: number;
  sumAbsolute: number;
  lowestError: number;
}

/** Per-cluster sums of the errors, in the canonical order of the module header. */
export function clusterSums(errors: ArrayLike<number>, clusters: readonly (string | number)[]): ClusterSums[] {
  const byId = new Map<string, ClusterSums>();
  for (let i = 0; i < errors.length; i++) {
    const id = String(clusters[i]);
    let c = byId.get(id);
    if (!c) byId.set(id, (c = { id, size: 0, sumSigned: 0, sumAbsolute: 0, lowestError: Infinity }));
    c.size++;
    c.sumSigned += errors[i];
    c.sumAbsolute += Math.abs(errors[i]);
    if (errors[i] < c.lowestError) c.lowestError = errors[i];
  }
  return [...byId.values()].sort((a, b) => a.lowestError - b.lowestError || a.size - b.size || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

/** The cluster bootstrap of the module header over per-cluster sums. Arguments are validated by the caller. */
export function clusterBootstrapIntervals(sums: readonly ClusterSums[], samples: number, seed: number, confidence: number): BootstrapIntervals {
  const k = sums.length;
  const size = Float64Array.from(sums, (c) => c.size);
  const signed = Float64Array.from(sums, (c) => c.sumSigned);
  const absolute = Float64Array.from(sums, (c) => c.sumAbsolute);
  const maes = new Float64Array(samples);
  const means = new Float64Array(samples);
  const generator = new Xoshiro128(seed);
  const indices = new Int32Array(k);
  for (let s = 0; s < samples; s++) {
    generator.fillIndices(indices, k);
    let count = 0;
    let sumSigned = 0;
    let sumAbsolute = 0;
    for (let i = 0; i < k; i++) {
      const j = indices[i];
      count += size[j];
      sumSigned += signed[j];
      sumAbsolute += absolute[j];
    }
    means[s] = sumSigned / count;
    maes[s] = sumAbsolute / count;
  }
  return { ...intervals(maes, means, confidence), resampled: 'clusters', clusterCount: k };
}
