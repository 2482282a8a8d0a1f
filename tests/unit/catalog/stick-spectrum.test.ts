import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import * as vega from 'vega';
import { stickSpectrumSpec } from '@/components/charts/stick-spectrum';

// GaN lines from Azuhata et al. (1995); the computed lines are invented for the test.
const measured = [
  { frequencyCm1: 533, label: 'A1(TO)', detail: 'azuhata1995' },
  { frequencyCm1: 569, label: 'E2(high)', detail: 'azuhata1995' },
];
const computed = [
  { frequencyCm1: 527.4, label: 'A1', detail: 'mode 10' },
  { frequencyCm1: 561.9, label: 'E2', detail: 'mode 11' },
  { frequencyCm1: 140.2, label: 'E2', detail: 'mode 4' },
];

describe('stickSpectrumSpec', () => {
  it('puts measured lines up and computed lines down, and renders to SVG with its labels', async () => {
    const spec = stickSpectrumSpec(measured, computed, 'PBE (invented)');
    const values = (spec.data as { values: Array<{ series: string; height: number }> }).values;
    expect(values.filter((v) => v.series === 'Measured').every((v) => v.height === 1)).toBe(true);
    expect(values.filter((v) => v.series === 'PBE (invented)').every((v) => v.height === -1)).toBe(true);
    const view = new vega.View(vega.parse(compile({ ...spec, width: 400 } as typeof spec).spec), { renderer: 'none' });
    const svg = await view.toSVG();
    expect(svg).toContain('A1(TO)');
    expect(svg).toContain('E2(high)');
    expect(svg).toContain('Frequency (cm⁻¹)');
    view.finalize();
  });

  it('draws an empty axis when there are no lines', async () => {
    const spec = stickSpectrumSpec([], [], 'PBE');
    const view = new vega.View(vega.parse(compile({ ...spec, width: 300 } as typeof spec).spec), { renderer: 'none' });
    expect(await view.toSVG()).toContain('<svg');
    view.finalize();
  });
});
