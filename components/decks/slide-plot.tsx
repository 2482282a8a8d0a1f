'use client';
import { useMemo } from 'react';
import { VegaFigure } from '@/components/charts/benchmark/vega-figure';
import { blandAltmanText, comparisonText, histogramText, parityText, residualText } from '@/components/charts/benchmark/figure-text';
import { blandAltmanSpec, errorHistogramSpec, pairedScatterSpec, parityPlotSpec, rendererFor, residualSpec, type PairedPoint } from '@/components/charts/benchmark/specs';
import type { PlotPoint } from '@/lib/benchmark/pairs-export';
import type { ViewFilters } from './view-kinds';

export type SlidePlotKind = 'parity' | 'histogram' | 'residuals' | 'bland-altman' | 'comparison';

export interface SlideMethod {
  methodId: string;
  label: string;
  limits: { bias: number; lower: number; upper: number } | null;
}

const TITLES: Record<SlidePlotKind, string> = {
  parity: 'Parity plot (y = x, dashed; shaded ± band)',
  histogram: 'Error histogram per method (included pairs)',
  residuals: 'Residual vs measured',
  'bland-altman': 'Bland–Altman: bias and 95 % limits of agreement',
  comparison: '|error| per common pair',
};

function measurementKey(key: string): string {
  return key.slice(key.indexOf('|') + 1);
}

/** One plot of a pinned revision, drawn from the points the server sent with the slide (no fetch). */
export function SlidePlot({
  kind,
  points,
  methods,
  unit,
  filters,
  fileName,
  forPrint = false,
}: {
  kind: SlidePlotKind;
  points: PlotPoint[];
  methods: SlideMethod[];
  unit: string;
  filters: ViewFilters;
  fileName: string;
  forPrint?: boolean;
}) {
  const labels = useMemo(() => methods.map((m) => m.label), [methods]);
  const spec = useMemo(() => {
    const hidden = new Set(filters.hiddenMethods ?? []);
    const visible = points.filter((p) => !hidden.has(p.methodId) && (filters.showExcluded !== false || !p.excluded));
    switch (kind) {
      case 'parity':
        return { spec: parityPlotSpec(visible, { unit, methods: labels, bandPercent: filters.bandPercent ?? 5, width: 500, height: forPrint ? 420 : 360 }), text: parityText(visible, unit), n: visible.length };
      case 'histogram':
        return { spec: errorHistogramSpec(visible, { unit, methods: labels }), text: histogramText(visible, unit, labels), n: visible.length };
      case 'residuals':
        return { spec: residualSpec(visible, { unit, methods: labels }), text: residualText(visible, unit), n: visible.length };
      case 'bland-altman': {
        const m = methods.find((x) => x.methodId === filters.methodId) ?? methods.find((x) => x.limits) ?? methods[0];
        const shown = visible.filter((p) => p.methodId === m?.methodId);
        const limits = m?.limits ? [{ method: m.label, ...m.limits }] : [];
        return { spec: blandAltmanSpec(shown, limits, { unit, methods: labels }), text: blandAltmanText(shown, limits, unit), n: shown.length };
      }
      case 'comparison': {
        const a = filters.methodA ?? methods[0]?.methodId;
        const b = filters.methodB ?? methods[1]?.methodId;
        const ofB = new Map(points.filter((p) => p.methodId === b && !p.excluded).map((p) => [measurementKey(p.key), p]));
        const paired: PairedPoint[] = points
          .filter((p) => p.methodId === a && !p.excluded)
          .flatMap((p) => {
            const q = ofB.get(measurementKey(p.key));
            return q ? [{ key: p.key, material: p.material, label: p.label, a: Math.abs(p.error), b: Math.abs(q.error) }] : [];
          });
        const label = (id: string | undefined) => methods.find((m) => m.methodId === id)?.label ?? '—';
        return { spec: pairedScatterSpec(paired, { unit, a: label(a), b: label(b) }), text: comparisonText(paired, unit, label(a), label(b)), n: paired.length };
      }
    }
  }, [kind, points, methods, labels, unit, filters, forPrint]);

  if (spec.n === 0) return <p className="text-ink-muted">No pairs to plot with these filters.</p>;
  // On a projector (1280×720) the legend goes beside the plot, where there is room, not under it.
  const shown = forPrint ? spec.spec : { ...spec.spec, config: { ...spec.spec.config, legend: { ...spec.spec.config?.legend, orient: 'right' as const, direction: 'vertical' as const } } };
  return <VegaFigure spec={shown} text={spec.text} renderer={forPrint ? 'svg' : rendererFor(spec.n)} fileName={fileName} title={TITLES[kind]} />;
}
