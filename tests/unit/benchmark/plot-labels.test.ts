import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import * as vega from 'vega';
import { blandAltmanSpec, histogramBins, parityPlotSpec, type ParityPoint } from '@/components/charts/benchmark/specs';
import { blandAltmanText, histogramText, parityText } from '@/components/charts/benchmark/figure-text';
import { labelLevels } from '@/components/charts/stick-spectrum';

// invented points for the test
const point = (key: string, method: string, measured: number, error: number, flags: Partial<ParityPoint> = {}): ParityPoint => ({
  key,
  method,
  material: `M${key}`,
  label: 'A1g',
  measured,
  calculated: measured + error,
  error,
  mean: measured + error / 2,
  uMeasured: null,
  excluded: false,
  outlier: false,
  citation: 'invented',
  ...flags,
});
const points = [point('a', 'LDA', 100, -75), point('b', 'LDA', 300, 25), point('c', 'PBE', 500, -12, { outlier: true }), point('d', 'PBE', 700, 4, { excluded: true })];

async function svgOf(spec: Parameters<typeof compile>[0]): Promise<string> {
  const view = new vega.View(vega.parse(compile(spec).spec), { renderer: 'none' });
  const svg = await view.toSVG();
  view.finalize();
  return svg;
}

describe('histogram bins', () => {
  it('puts bin edges on multiples of the step and zero among the ticks (errors −75 … 25)', () => {
    const bins = histogramBins([-75, -55, -12, 4, 25]);
    expect(bins.extent[0] % bins.step).toBeCloseTo(0, 9);
    expect(bins.ticks).toContain(0);
    expect(bins.extent[0]).toBeLessThanOrEqual(-75);
    expect(bins.extent[1]).toBeGreaterThanOrEqual(25);
  });
});

describe('Bland–Altman spec', () => {
  it('lists only the plotted method in its legend and prints the bias and limits with their values', async () => {
    const svg = await svgOf(blandAltmanSpec(points.filter((p) => p.method === 'PBE'), [{ method: 'PBE', bias: -3.2, lower: -25.1, upper: 18.7 }], { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] }));
    expect(svg).toContain('bias −3.20 cm⁻¹');
    expect(svg).toContain('upper 95 % limit +18.70 cm⁻¹');
    expect(svg).toContain('lower 95 % limit −25.10 cm⁻¹');
    expect(svg).toMatch(/>PBE</);
    expect(svg).not.toMatch(/>LDA</);
    expect(svg).toContain('Flagged outlier');
  });
});

describe('parity spec', () => {
  it('draws no per-point ARIA labels and gives each method its own shape', async () => {
    const spec = parityPlotSpec(points, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] });
    const svg = await svgOf(spec);
    expect(svg).not.toContain('aria-label');
    expect(JSON.stringify(spec)).toContain('"shape":{"field":"method"');
  });
});

describe('figure text', () => {
  it('summarises what is plotted, N, the range and the worst points, and tables every point', () => {
    const text = parityText(points, 'cm⁻¹');
    expect(text.summary).toContain('4 pairs of 2 methods');
    expect(text.summary).toContain('1 flagged as outliers, 1 excluded');
    expect(text.summary).toMatch(/Largest errors: Ma A1g \(LDA\) −75\.0 cm⁻¹/);
    expect(text.table.rows).toHaveLength(4);
    expect(text.navigation.map((r) => r.key)).toEqual(['a', 'b', 'c', 'd']);
  });

  it('counts pairs outside the limits of agreement and bins as the histogram does', () => {
    expect(blandAltmanText(points, [{ method: 'LDA', bias: -25, lower: -60, upper: 10 }], 'cm⁻¹').summary).toContain('2 pairs outside them');
    const hist = histogramText(points, 'cm⁻¹', ['LDA', 'PBE']);
    expect(hist.table.rows.reduce((n, r) => n + Number(r.cells[2]), 0)).toBe(3);
  });
});

describe('stick spectrum labels', () => {
  it('staggers labels that would collide (ZnO TO lines) and thins past three rows', () => {
    const lines = [378, 410, 438].map((f, i) => ({ frequencyCm1: f, label: ['A1(TO)', 'E1(TO)', 'E2(high)'][i], detail: null }));
    // E1(TO) sits 32 cm⁻¹ from both neighbours: it moves up a row; E2(high) fits back on the first
    expect(labelLevels(lines, [0, 650])).toEqual([0, 1, 0]);
    const crowded = [400, 401, 402, 403].map((f) => ({ frequencyCm1: f, label: 'E2(high)', detail: null }));
    expect(labelLevels(crowded, [0, 650])).toEqual([0, 1, 2, null]);
    expect(labelLevels([{ frequencyCm1: 100, label: 'E2', detail: null }, { frequencyCm1: 500, label: 'A1', detail: null }], [0, 650])).toEqual([0, 0]);
  });
});
