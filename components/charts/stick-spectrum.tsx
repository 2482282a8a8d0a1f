'use client';
import type { TopLevelSpec } from 'vega-lite';
import { VegaChart } from './vega-chart';

export interface SpectrumLine {
  frequencyCm1: number;
  /** Irreducible representation or mode label, if any. */
  label: string | null;
  /** Source cite key (measured) or "mode N" (computed). */
  detail: string | null;
}

const MEASURED = 'Measured';

/**
 * Measured lines point up, the method's computed lines point down, on one
 * frequency axis, so a shifted or missing mode shows at a glance.
 */
export function stickSpectrumSpec(measured: SpectrumLine[], computed: SpectrumLine[], computedName: string): TopLevelSpec {
  const rows = [
    ...measured.map((l) => ({ ...l, series: MEASURED, base: 0, height: 1 })),
    ...computed.map((l) => ({ ...l, series: computedName, base: 0, height: -1 })),
  ];
  const all = rows.map((r) => r.frequencyCm1);
  const hi = all.length ? Math.max(...all) : 100;
  const lo = all.length ? Math.min(0, ...all) : 0;
  const domain: [number, number] = [lo, Math.ceil((hi * 1.05) / 50) * 50];
  const x = { field: 'frequencyCm1', type: 'quantitative' as const, title: 'Frequency (cm⁻¹)', scale: { domain, nice: false } };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 'container',
    height: 180,
    data: { values: rows },
    config: { view: { stroke: null }, axis: { labelFont: 'sans-serif', titleFont: 'sans-serif', grid: false, domainColor: '#c3cbd2' }, legend: { orient: 'top', labelFont: 'sans-serif', titleFont: 'sans-serif' } },
    layer: [
      { data: { values: [{ base: 0 }] }, mark: { type: 'rule', color: '#c3cbd2' }, encoding: { y: { field: 'base', type: 'quantitative', axis: null } } },
      {
        mark: { type: 'rule', strokeWidth: 2 },
        encoding: {
          x,
          y: { field: 'base', type: 'quantitative', scale: { domain: [-1.35, 1.35] }, axis: null },
          y2: { field: 'height' },
          color: { field: 'series', type: 'nominal', title: null, scale: { domain: [MEASURED, computedName], range: ['#1d5a6e', '#a3242c'] } },
          tooltip: [
            { field: 'series', type: 'nominal', title: 'Series' },
            { field: 'frequencyCm1', type: 'quantitative', title: 'cm⁻¹', format: '.1f' },
            { field: 'label', type: 'nominal', title: 'Label' },
            { field: 'detail', type: 'nominal', title: 'Source / mode' },
          ],
        },
      },
      {
        // acoustic and unlabelled lines carry no text (a null label would print "null")
        transform: [{ filter: 'isValid(datum.label) && datum.label !== ""' }],
        mark: { type: 'text', fontSize: 10, dy: { expr: 'datum.height > 0 ? -6 : 8' }, baseline: 'middle' },
        encoding: {
          x,
          y: { field: 'height', type: 'quantitative', axis: null },
          text: { field: 'label' },
          color: { field: 'series', type: 'nominal', legend: null },
        },
      },
    ],
  };
}

export function StickSpectrum({ measured, computed, computedName, downloadName }: { measured: SpectrumLine[]; computed: SpectrumLine[]; computedName: string; downloadName?: string }) {
  return (
    <VegaChart
      spec={stickSpectrumSpec(measured, computed, computedName)}
      downloadName={downloadName}
      ariaLabel={`Stick spectrum: ${measured.length} measured lines above the axis, ${computed.length} lines computed with ${computedName} below.`}
    />
  );
}
