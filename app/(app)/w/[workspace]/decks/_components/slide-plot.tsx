'use client';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { TopLevelSpec } from 'vega-lite';
import { VegaFigure } from '@/components/charts/benchmark/vega-figure';
import { blandAltmanText, comparisonText, histogramText, parityText, residualText } from '@/components/charts/benchmark/figure-text';
import { blandAltmanSpec, densityNote, errorHistogramSpec, pairedScatterSpec, parityPlotSpec, rendererFor, residualSpec, type PairedPoint } from '@/components/charts/benchmark/specs';
import type { PlotPoint } from '@/lib/benchmark/pairs-export';
import type { ViewFilters } from '@/lib/decks/view-kinds';

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

/** Room a figure needs besides its plot area: legend on the right, figcaption and buttons above. */
const LEGEND_PX = 190;
const CAPTION_PX = 44;
const PRINT_PARITY_PX = 370;

/** The size of an element, kept up to date (null until first measured). */
function useElementSize() {
  const ref = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState<{ width: number; height: number } | null>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => {
      const width = Math.floor(entry.contentRect.width);
      const height = Math.floor(entry.contentRect.height);
      setSize((old) => (old && Math.abs(old.width - width) < 8 && Math.abs(old.height - height) < 8 ? old : { width, height }));
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  return { ref, size };
}

/** A spec sized to fill a slide: square plots stay square, the others take the whole box. */
function fitted(spec: TopLevelSpec, kind: SlidePlotKind, box: { width: number; height: number }, facets: number): TopLevelSpec {
  const height = Math.max(240, box.height - CAPTION_PX);
  const width = Math.max(320, box.width);
  const autosize = { type: 'fit' as const, contains: 'padding' as const };
  if (kind === 'histogram') {
    const inner = (spec as { spec?: Record<string, unknown> }).spec;
    if (!inner) return spec;
    const each = Math.max(160, Math.floor((width - 80) / Math.max(1, facets)) - 40);
    return { ...spec, spec: { ...inner, width: each, height: Math.max(160, height - 90) } } as TopLevelSpec;
  }
  if (kind === 'parity' || kind === 'comparison') {
    const side = Math.min(width - LEGEND_PX, height);
    return { ...spec, width: side + LEGEND_PX, height: side, autosize } as TopLevelSpec;
  }
  return { ...spec, width, height, autosize } as TopLevelSpec;
}

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
  // On an A4 landscape page the square plot leaves room for its legend, a summary of several lines and the page number.
  const side = forPrint ? PRINT_PARITY_PX : 420;
  const spec = useMemo(() => {
    const hidden = new Set(filters.hiddenMethods ?? []);
    const visible = points.filter((p) => !hidden.has(p.methodId) && (filters.showExcluded !== false || !p.excluded));
    switch (kind) {
      case 'parity':
        return { spec: parityPlotSpec(visible, { unit, methods: labels, bandPercent: filters.bandPercent ?? 5, width: side, height: side }), text: parityText(visible, unit), n: visible.length, note: densityNote(visible) };
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
  }, [kind, points, methods, labels, unit, filters, side]);

  const { ref, size } = useElementSize();
  if (spec.n === 0) {
    return (
      <p className="text-ink-muted" data-plot-empty>
        No pairs to plot with these filters.
      </p>
    );
  }
  // The legend goes beside the plot, where a landscape page or a projector (1280×720) has room, not under it.
  const sideLegend = { ...spec.spec, config: { ...spec.spec.config, legend: { ...spec.spec.config?.legend, orient: 'right' as const, direction: 'vertical' as const } } } as TopLevelSpec;
  if (forPrint) return <VegaFigure spec={kind === 'histogram' ? spec.spec : sideLegend} renderer="svg" text={spec.text} note={'note' in spec ? spec.note : null} fileName={fileName} title={TITLES[kind]} />;
  // On a projector the plot fills the slide.
  const facets = new Set(points.map((p) => p.methodId)).size;
  return (
    <div ref={ref} className="h-full w-full" data-testid="slide-plot">
      {size ? <VegaFigure spec={fitted(sideLegend, kind, size, facets)} renderer={rendererFor(spec.n)} text={spec.text} note={'note' in spec ? spec.note : null} fileName={fileName} title={TITLES[kind]} /> : null}
    </div>
  );
}
