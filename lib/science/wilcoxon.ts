/**
 * Wilcoxon signed-rank test and the pairwise comparison of two methods.
 *
 * Differences d = a − b with |d| ≤ 1e-12 · max(|a|, |b|) count as zero (floating-point
 * noise) and are dropped; |d| values within a relative 1e-9 of each other count as
 * tied and receive mid-ranks. The statistic is min(W⁺, W⁻). The two-sided p-value is
 * exact (full permutation distribution of W⁺ by dynamic programming) when at most 25
 * non-zero differences remain and none are tied; otherwise it is the normal
 * approximation with the tie correction Σ(t³ − t)/48 of the variance and a continuity
 * correction of 0.5.
 */
import { ScienceInputError, requireNonNegative } from './errors';
import { normalCdf } from './normal';
import { compensatedSum } from './summation';

/** Largest number of non-zero differences for which the exact distribution is used. */
export const WILCOXON_EXACT_MAX_N = 25;

/** Result of a Wilcoxon signed-rank test. */
export interface WilcoxonResult {
  statistic: number;
  pValue: number;
  method: 'exact' | 'normal';
}

/** Result of compareMethods. */
export interface MethodComparison {
  n: number;
  meanDifference: number;
  wins: number;
  losses: number;
  ties: number;
  wilcoxon: WilcoxonResult;
}

function isZeroDifference(d: number, a: number, b: number): boolean {
  return Math.abs(d) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
}

/** Counts of W⁺ = s for s = 0 … n(n+1)/2 over all 2ⁿ sign assignments of ranks 1 … n. */
function signedRankCounts(n: number): Float64Array {
  const max = (n * (n + 1)) / 2;
  const counts = new Float64Array(max + 1);
  counts[0] = 1;
  for (let rank = 1; rank <= n; rank++) {
    for (let s = max; s >= rank; s--) counts[s] += counts[s - rank];
  }
  return counts;
}

/** Wilcoxon signed-rank test on paired differences, two-sided (see the module header). */
export function wilcoxonSignedRank(a: readonly number[], b: readonly number[]): WilcoxonResult {
  const differences: number[] = [];
  for (let i = 0; i < a.length; i++) {
    const d = a[i] - b[i];
    if (!isZeroDifference(d, a[i], b[i])) differences.push(d);
  }
  const n = differences.length;
  if (n === 0) return { statistic: 0, pValue: 1, method: 'exact' };

  const order = differences.map((_, i) => i).sort((i, j) => Math.abs(differences[i]) - Math.abs(differences[j]));
  const ranks = new Float64Array(n);
  let tieCorrection = 0;
  let start = 0;
  while (start < n) {
    let end = start + 1;
    while (end < n) {
      const previous = Math.abs(differences[order[end - 1]]);
      const current = Math.abs(differences[order[end]]);
      if (current - previous > 1e-9 * current) break;
      end++;
    }
    const t = end - start;
    const midRank = (start + 1 + end) / 2;
    for (let k = start; k < end; k++) ranks[order[k]] = midRank;
    tieCorrection += t * t * t - t;
    start = end;
  }

  let wPlus = 0;
  let wMinus = 0;
  for (let i = 0; i < n; i++) {
    if (differences[i] > 0) wPlus += ranks[i];
    else wMinus += ranks[i];
  }
  const statistic = Math.min(wPlus, wMinus);

  if (n <= WILCOXON_EXACT_MAX_N && tieCorrection === 0) {
    const counts = signedRankCounts(n);
    let cumulative = 0;
    for (let s = 0; s <= statistic; s++) cumulative += counts[s];
    return { statistic, pValue: Math.min(1, (2 * cumulative) / 2 ** n), method: 'exact' };
  }

  const expected = (n * (n + 1)) / 4;
  const variance = (n * (n + 1) * (2 * n + 1)) / 24 - tieCorrection / 48;
  const z = Math.max(0, Math.abs(statistic - expected) - 0.5) / Math.sqrt(variance);
  return { statistic, pValue: Math.min(1, 2 * (1 - normalCdf(z))), method: 'normal' };
}

/**
 * Compares two methods on their common pairs. `a` and `b` are the absolute errors
 * of methods A and B on the same pair: wins count a < b (A closer), losses a > b,
 * ties a = b; meanDifference = mean(a − b) (negative: A better); Wilcoxon on a − b.
 */
export function compareMethods(paired: Array<{ a: number; b: number }>): MethodComparison {
  if (!Array.isArray(paired) || paired.length === 0) throw new ScienceInputError('paired', 'needs at least 1 pair of errors');
  const a = new Array<number>(paired.length);
  const b = new Array<number>(paired.length);
  const differences = new Float64Array(paired.length);
  let wins = 0;
  let losses = 0;
  let ties = 0;
  for (let i = 0; i < paired.length; i++) {
    requireNonNegative(`paired[${i}].a`, paired[i].a);
    requireNonNegative(`paired[${i}].b`, paired[i].b);
    a[i] = paired[i].a;
    b[i] = paired[i].b;
    differences[i] = a[i] - b[i];
    if (isZeroDifference(differences[i], a[i], b[i])) ties++;
    else if (a[i] < b[i]) wins++;
    else losses++;
  }
  return {
    n: paired.length,
    meanDifference: compensatedSum(differences) / paired.length,
    wins,
    losses,
    ties,
    wilcoxon: wilcoxonSignedRank(a, b),
  };
}
