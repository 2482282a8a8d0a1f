import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import {
  blandAltmanSpec,
  errorHistogramSpec,
  pairedScatterSpec,
  parityPlotSpec,
  rendererFor,
  residualSpec,
  sharedDomain,
  type ParityPoint,
} from '@/components/charts/benchmark/specs';

const point = (key: string, method: string, measured: number, calculated: number, uMeasured: number | null = null): ParityPoint => ({
  key,
  method,
  material: 'GaN',
  label: 'E2(high)',
  measured,
  calculated,
  error: calculated - measured,
  mean: (measured + calculated) / 2,
  uMeasured,
  excluded: false,
  outlier: false,
  citation: 'invented',
});

const points = [point('a', 'PBE', 500, 480, 2), point('b', 'PBE', 700, 690), point('c', 'LDA', 520, 530, 1), point('d', 'LDA', 730, 745)];

type Layer = { data: { values: Array<Record<string, number>> }; mark: { type: string }; encoding: Record<string, { scale?: { domain?: number[]; zero?: boolean } }> };

describe('parity plot spec', () => {
  const spec = parityPlotSpec(points, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'], bandPercent: 5 }) as unknown as { layer: Layer[] };

  it('draws y = x across the shared domain, without forcing zero', () => {
    const identity = spec.layer.find((l) => l.mark.type === 'line')!;
    const [start, end] = identity.data.values;
    expect(start.x).toBe(start.y);
    expect(end.x).toBe(end.y);
    const domain = identity.encoding.x.scale!.domain!;
    expect([start.x, end.x]).toEqual(domain);
    expect(domain[0]).toBeGreaterThan(400);
    for (const layer of spec.layer) {
      for (const channel of ['x', 'y'] as const) {
        expect(layer.encoding[channel].scale).toMatchObject({ domain, zero: false });
      }
    }
  });

  it('bounds the band at ±5 % of y = x and covers every point', () => {
    const area = spec.layer.find((l) => l.mark.type === 'area')!;
    for (const v of area.data.values) {
      expect(v.lower).toBeCloseTo(v.x * 0.95, 12);
      expect(v.upper).toBeCloseTo(v.x * 1.05, 12);
    }
    const domain = area.encoding.x.scale!.domain!;
    for (const p of points) expect(p.measured >= domain[0] && p.calculated <= domain[1]).toBe(true);
  });

  it('draws error bars only for pairs with an uncertainty', () => {
    const bars = spec.layer.find((l) => l.mark.type === 'rule')!;
    expect(bars.data.values.map((v) => [v.lo, v.hi])).toEqual([
      [498, 502],
      [519, 521],
    ]);
  });

  it('compiles to Vega, as do the other plots', () => {
    expect(() => compile(parityPlotSpec(points, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] }))).not.toThrow();
    expect(() => compile(errorHistogramSpec(points, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] }))).not.toThrow();
    expect(() => compile(residualSpec(points, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] }))).not.toThrow();
    expect(() =>
      compile(blandAltmanSpec(points, [{ method: 'PBE', bias: -15, lower: -20, upper: -10 }], { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] })),
    ).not.toThrow();
    expect(() => compile(pairedScatterSpec([{ key: 'a', material: 'GaN', label: 'A1', a: 1, b: 2 }], { unit: 'cm⁻¹', a: 'LDA', b: 'PBE' }))).not.toThrow();
  });
});

describe('paired scatter spec', () => {
  it('shares one domain between both axes and y = x', () => {
    const spec = pairedScatterSpec(
      [
        { key: 'a', material: 'm', label: 'A', a: 3, b: 8 },
        { key: 'b', material: 'm', label: 'B', a: 5, b: 1 },
      ],
      { unit: 'cm⁻¹', a: 'LDA', b: 'PBE' },
    ) as unknown as { layer: Layer[] };
    const domain = spec.layer[0].encoding.x.scale!.domain!;
    expect(domain).toEqual(sharedDomain([3, 8, 5, 1]));
    expect(spec.layer[1].encoding.y.scale).toMatchObject({ domain, zero: false });
  });
});

describe('renderer choice', () => {
  it('switches to canvas above 5,000 points', () => {
    expect(rendererFor(5000)).toBe('svg');
    expect(rendererFor(5001)).toBe('canvas');
  });
});
