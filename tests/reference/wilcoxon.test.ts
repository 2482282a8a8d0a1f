import { describe, expect, it } from 'vitest';
import { compareMethods } from '@/lib/science';
import { jStat } from './jstat';

/** Two-sided exact p by brute-force enumeration of all 2ⁿ sign patterns (independent of the DP in the code). */
function enumeratedPValue(ranks: number[], statistic: number): number {
  const n = ranks.length;
  const total = ranks.reduce((s, r) => s + r, 0);
  let extreme = 0;
  for (let mask = 0; mask < 1 << n; mask++) {
    let wPlus = 0;
    for (let i = 0; i < n; i++) if (mask & (1 << i)) wPlus += ranks[i];
    if (Math.min(wPlus, total - wPlus) <= statistic + 1e-9) extreme++;
  }
  return extreme / 2 ** n;
}

describe('Wilcoxon signed-rank test', () => {
  it('exact p equals full enumeration for small n without ties', () => {
    // Wilcoxon (1945) signed-rank statistic; p by exhaustive enumeration of the permutation distribution
    const cases: Array<Array<{ a: number; b: number }>> = [
      [1.1, 2.3, 0.4, 5.0, 3.2, 0.9, 2.2, 4.1].map((a, i) => ({ a, b: [2.0, 1.1, 1.9, 0.2, 6.0, 3.3, 2.05, 0.25][i] })),
      [0.5, 0.8, 1.2, 3.1, 0.15, 2.2, 1.6, 0.7, 0.9, 4.4, 2.9, 1.05].map((a, i) => ({ a, b: a + [0.11, -0.3, 0.52, 0.74, -0.05, 1.2, 0.93, -0.62, 1.41, 2.05, -1.73, 0.27][i] })),
      [{ a: 1, b: 3 }, { a: 2, b: 5 }, { a: 4, b: 1.5 }],
    ];
    for (const paired of cases) {
      const result = compareMethods(paired);
      expect(result.wilcoxon.method).toBe('exact');
      const d = paired.map(({ a, b }) => a - b).filter((x) => x !== 0);
      const sorted = [...d].sort((x, y) => Math.abs(x) - Math.abs(y));
      const ranks = d.map((x) => sorted.indexOf(x) + 1);
      const wPlus = d.reduce((s, x, i) => s + (x > 0 ? ranks[i] : 0), 0);
      const wMinus = d.reduce((s, x, i) => s + (x < 0 ? ranks[i] : 0), 0);
      expect(result.wilcoxon.statistic).toBe(Math.min(wPlus, wMinus));
      expect(result.wilcoxon.pValue).toBeCloseTo(enumeratedPValue(ranks, Math.min(wPlus, wMinus)), 12);
    }
  });

  it('all differences one way with n = 6 gives the smallest exact p = 2/64', () => {
    // exact distribution: P(W⁺ = 0) = 1/2⁶ for n = 6, two-sided 2/64 (Wilcoxon 1945 tables)
    const paired = [1, 2, 3, 4, 5, 6].map((k) => ({ a: 0, b: k * 1.5 }));
    const result = compareMethods(paired);
    expect(result.wins).toBe(6);
    expect(result.wilcoxon.statistic).toBe(0);
    expect(result.wilcoxon.pValue).toBeCloseTo(2 / 64, 15);
  });

  it('uses the normal approximation with tie and continuity corrections for larger n / ties', () => {
    // Normal approximation: μ = n(n+1)/4, σ² = n(n+1)(2n+1)/24 − Σ(t³ − t)/48, z = (|W − μ| − 0.5)/σ
    // (Lehmann, Nonparametrics, 1975 — from memory as a citation; the formula is standard), Φ from jStat.
    const paired: Array<{ a: number; b: number }> = [];
    for (let i = 0; i < 40; i++) {
      const a = 1 + ((i * 37) % 17) / 4;
      const b = a + ((i % 5) - 1.6) * 0.5 + (i % 7 === 0 ? 0 : 0.25 * ((i % 3) - 1));
      paired.push({ a, b: Math.max(0, b) });
    }
    const result = compareMethods(paired);
    expect(result.wilcoxon.method).toBe('normal');

    const d = paired.map(({ a, b }) => a - b).filter((x) => Math.abs(x) > 1e-12);
    const n = d.length;
    const order = d.map((x, i) => ({ abs: Math.abs(x), i })).sort((p, q) => p.abs - q.abs);
    const ranks = new Array<number>(n);
    let tie = 0;
    for (let s = 0; s < n; ) {
      let e = s;
      while (e + 1 < n && Math.abs(order[e + 1].abs - order[s].abs) < 1e-9) e++;
      const t = e - s + 1;
      for (let k = s; k <= e; k++) ranks[order[k].i] = (s + 1 + e + 1) / 2;
      tie += t ** 3 - t;
      s = e + 1;
    }
    const wPlus = d.reduce((acc, x, i) => acc + (x > 0 ? ranks[i] : 0), 0);
    const wMinus = d.reduce((acc, x, i) => acc + (x < 0 ? ranks[i] : 0), 0);
    const w = Math.min(wPlus, wMinus);
    const mu = (n * (n + 1)) / 4;
    const sigma = Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24 - tie / 48);
    const z = Math.max(0, Math.abs(w - mu) - 0.5) / sigma;
    const p = 2 * (1 - jStat.normal.cdf(z, 0, 1));
    expect(tie).toBeGreaterThan(0);
    expect(result.wilcoxon.statistic).toBeCloseTo(w, 12);
    expect(result.wilcoxon.pValue).toBeCloseTo(p, 10);
  });

  it('counts wins, losses and ties and the mean difference', () => {
    // definitions of the contract (issue 3): wins a < b, losses a > b, ties a = b, mean(a − b)
    const result = compareMethods([
      { a: 1, b: 2 },
      { a: 3, b: 1 },
      { a: 2, b: 2 },
      { a: 0.5, b: 4 },
    ]);
    expect(result).toMatchObject({ n: 4, wins: 2, losses: 1, ties: 1 });
    expect(result.meanDifference).toBeCloseTo((-1 + 2 + 0 - 3.5) / 4, 15);
  });
});
