/**
 * The parity plot above DENSITY_THRESHOLD pairs: a binned density of the included,
 * unflagged pairs with the flagged outliers and excluded pairs on top as points,
 * run through Vega with the CSP-safe interpreter (no new Function) as the page does.
 * Invented points.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { parse, View } from 'vega';
import { expressionInterpreter } from 'vega-interpreter';
import { DENSITY_THRESHOLD, densityNote, drawsDensity, parityPlotSpec, type ParityPoint } from '@/components/charts/benchmark/specs';
import { parityText } from '@/components/charts/benchmark/figure-text';

function points(n: number): ParityPoint[] {
  return Array.from({ length: n }, (_, i) => {
    const measured = 100 + (i % 997) * 0.9;
    const calculated = measured * 1.01 + ((i * 37) % 11) - 5 + (i % 250 === 3 ? 200 : 0);
    return {
      key: `m|${i}`,
      method: i % 3 ? 'PBE' : 'LDA',
      material: `mat-${i % 50}`,
      label: 'A1g',
      measured,
      calculated,
      error: calculated - measured,
      mean: (measured + calculated) / 2,
      uMeasured: i % 4 ? 1.5 : null,
      excluded: i % 400 === 7,
      outlier: i % 250 === 3,
      citation: 'invented',
    };
  });
}

type Layer = { data?: { values: Array<Record<string, unknown>> }; mark: { type: string }; encoding?: Record<string, { bin?: unknown; aggregate?: string }> };

describe('parity plot as a density', () => {
  const many = points(DENSITY_THRESHOLD + 1000);
  const flagged = many.filter((p) => p.outlier && !p.excluded).length;
  const excluded = many.filter((p) => p.excluded).length;

  it('draws one mark per pair up to the threshold, a density above it', () => {
    expect(drawsDensity(DENSITY_THRESHOLD)).toBe(false);
    expect(drawsDensity(DENSITY_THRESHOLD + 1)).toBe(true);
    const few = parityPlotSpec(points(200), { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] }) as unknown as { layer: Layer[] };
    expect(few.layer.some((l) => l.mark.type === 'rect')).toBe(false);
    expect(densityNote(points(200))).toBeNull();
  });

  it('bins the included unflagged pairs and draws only outliers and excluded pairs as points', () => {
    const spec = parityPlotSpec(many, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] }) as unknown as { layer: Layer[] };
    const rect = spec.layer.find((l) => l.mark.type === 'rect')!;
    expect(rect.encoding!.x.bin).toBeTruthy();
    expect(rect.encoding!.y.bin).toBeTruthy();
    expect(rect.encoding!.fill.aggregate).toBe('count');
    expect(rect.data!.values).toHaveLength(many.length - flagged - excluded);
    // the point layers (filled, hollow, ring) hold the flagged and excluded pairs; the last, the keyboard ring, every pair
    const pointLayers = spec.layer.filter((l) => l.mark.type === 'point');
    expect(pointLayers[0].data!.values).toHaveLength(flagged);
    expect(pointLayers[1].data!.values).toHaveLength(excluded);
    expect(pointLayers.at(-1)!.data!.values).toHaveLength(many.length);
    expect(flagged).toBeGreaterThan(0);
  });

  it('says so beside the plot, and the text alternative still lists every pair', () => {
    const note = densityNote(many)!;
    expect(note).toContain(`${(many.length - flagged - excluded).toLocaleString('en')} pairs drawn as a density`);
    expect(note).toContain(`the ${flagged} flagged outliers`);
    expect(note).toContain(`the ${excluded} excluded pairs as points`);
    expect(parityText(many, 'cm⁻¹').table.rows).toHaveLength(many.length);
  });

  it('runs in Vega with the expression interpreter, every binned pair counted once', async () => {
    const spec = parityPlotSpec(many, { unit: 'cm⁻¹', methods: ['LDA', 'PBE'] });
    const view = new View(parse(compile(spec).spec, undefined, { ast: true }), { expr: expressionInterpreter, renderer: 'none' });
    await view.runAsync();
    const cells = (view.data('data_3') ?? []) as Array<Record<string, number>>;
    const countField = Object.keys(cells[0] ?? {}).find((k) => k.startsWith('__count'))!;
    expect(cells.length).toBeGreaterThan(10);
    expect(cells.reduce((s, c) => s + c[countField], 0)).toBe(many.length - flagged - excluded);
    view.finalize();
  });
});
