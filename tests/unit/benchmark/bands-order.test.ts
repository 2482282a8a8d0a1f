import { describe, expect, it } from 'vitest';
import { bandLabels, bandOf } from '@/lib/benchmark/compute';

describe('frequency bands', () => {
  it('lists the bands lowest first, with the labels bandOf gives', () => {
    const edges = [200, 500, 1000];
    expect(bandLabels(edges)).toEqual(['< 200', '200–500', '500–1000', '≥ 1000']);
    expect([50, 250, 700, 1332.7].map((v) => bandOf(v, edges))).toEqual(bandLabels(edges));
  });
});
