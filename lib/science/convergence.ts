/**
 * Convergence of a recipe parameter against a reference calculation.
 *
 * Input: per material, one point per member of a method family: the member's parameter value
 * (k-points per reciprocal atom, q-points, cutoff, smearing) and the largest |Δ| of that
 * material's values from the reference. `direction` says which way the recipe converges:
 * 'increasing' (denser grid, higher cutoff) or 'decreasing' (smaller smearing).
 *
 * A material's convergence point is the least converged parameter value from which every more
 * converged member of the family stays within the tolerance: with points sorted from the most
 * converged down, walk while max |Δ| ≤ tolerance; the last value reached is the point. A
 * material whose most converged member is already outside the tolerance never converges within
 * the family (point null). A member that dips inside and leaves again does not count: the point
 * lies above the last excursion.
 *
 * A class's recommendation for a share s (0.95 by default, a benchmark rule) is the
 * ⌈s·N⌉-th convergence point of its N materials in converging order: at that value at least a
 * share s of the class has converged and stays so. Null when fewer than ⌈s·N⌉ materials converge.
 *
 * Distribution per family member: the median and the 95th percentile (Hyndman–Fan type 7, as
 * descriptive.ts) of the materials' max |Δ|, and the median of their mean |Δ|.
 */
import { ScienceInputError } from './errors';
import { quantile } from './descriptive';

export type ConvergenceDirection = 'increasing' | 'decreasing';

export interface ConvergencePoint {
  parameter: number;
  maxAbsolute: number;
}

function check(points: readonly ConvergencePoint[], tolerance: number): void {
  if (!(Number.isFinite(tolerance) && tolerance > 0)) throw new ScienceInputError('tolerance', `must be a positive number, got ${String(tolerance)}`);
  for (const [i, p] of points.entries()) {
    if (!Number.isFinite(p.parameter)) throw new ScienceInputError(`points[${i}].parameter`, `must be a finite number, got ${String(p.parameter)}`);
    if (!(Number.isFinite(p.maxAbsolute) && p.maxAbsolute >= 0)) throw new ScienceInputError(`points[${i}].maxAbsolute`, `must be a non-negative number, got ${String(p.maxAbsolute)}`);
  }
}

/** The material's convergence point (module header); null when it never converges within the family, or has no point. */
export function convergencePoint(points: readonly ConvergencePoint[], tolerance: number, direction: ConvergenceDirection = 'increasing'): number | null {
  check(points, tolerance);
  // Two members at one parameter value (the same grid under two labels): the worse deviation counts.
  const worst = new Map<number, number>();
  for (const p of points) worst.set(p.parameter, Math.max(worst.get(p.parameter) ?? 0, p.maxAbsolute));
  const ordered = [...worst].sort((a, b) => (direction === 'increasing' ? b[0] - a[0] : a[0] - b[0]));
  let reached: number | null = null;
  for (const [parameter, maxAbsolute] of ordered) {
    if (maxAbsolute > tolerance) break;
    reached = parameter;
  }
  return reached;
}

export interface Recommendation {
  /** The recommended parameter value; null when too few materials converge. */
  value: number | null;
  /** Materials of the class, and how many converge within the family. */
  n: number;
  converged: number;
  /** ⌈share·N⌉: how many must be within tolerance. */
  needed: number;
}

/** The class's recommendation for a share of its materials (module header). */
export function recommendedParameter(points: ReadonlyArray<number | null>, share: number, direction: ConvergenceDirection = 'increasing'): Recommendation {
  if (!(share > 0 && share <= 1)) throw new ScienceInputError('share', `must be in (0, 1], got ${String(share)}`);
  const finite = points.filter((p): p is number => p !== null);
  for (const [i, p] of finite.entries()) if (!Number.isFinite(p)) throw new ScienceInputError(`points[${i}]`, `must be a finite number or null, got ${String(p)}`);
  const n = points.length;
  // The small epsilon keeps 0.95 × 20 = 19 from becoming 19.000000000000004 → 20.
  const needed = Math.ceil(share * n - 1e-9);
  const sorted = [...finite].sort((a, b) => (direction === 'increasing' ? a - b : b - a));
  return { value: n > 0 && sorted.length >= needed ? sorted[needed - 1] : null, n, converged: finite.length, needed };
}

export interface DistributionRow {
  n: number;
  medianMax: number;
  p95Max: number;
  medianMean: number;
}

/** Median and 95th percentile of max |Δ| over materials, and the median of mean |Δ| (module header). */
export function deviationDistribution(rows: ReadonlyArray<{ maxAbsolute: number; meanAbsolute: number }>): DistributionRow | null {
  if (rows.length === 0) return null;
  const max = rows.map((r) => r.maxAbsolute);
  const mean = rows.map((r) => r.meanAbsolute);
  return { n: rows.length, medianMax: quantile(max, 0.5), p95Max: quantile(max, 0.95), medianMean: quantile(mean, 0.5) };
}
