'use client';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useSearchParams } from 'next/navigation';
import { VegaFigure } from '@/components/charts/benchmark/vega-figure';
import { blandAltmanSpec, densityNote, errorHistogramSpec, parityPlotSpec, rendererFor, residualSpec, type AgreementLimits } from '@/components/charts/benchmark/specs';
import { blandAltmanText, histogramText, parityText, residualText } from '@/components/charts/benchmark/figure-text';
import { inputClass } from '@/components/ui/field';
import type { PlotPoint } from '@/lib/benchmark/pairs-export';
import { usePairs } from './use-benchmark-data';
import { AddToDeck } from '@/app/(app)/w/[workspace]/decks/_components/add-to-deck';
import { PLOT_KINDS } from '@/lib/decks/view-kinds';

export interface PlotMethod {
  methodId: string;
  label: string;
  limits: { bias: number; lower: number; upper: number } | null;
}

/** Parity, histogram, residual and Bland–Altman plots of one revision, fed by the pairs endpoint. */
export function BenchmarkPlots({
  workspaceId,
  benchmarkId,
  revision,
  methods,
  fileStem,
}: {
  workspaceId: string;
  benchmarkId: string;
  revision: number;
  methods: PlotMethod[];
  fileStem: string;
}) {
  const { data, error, isPending } = usePairs(workspaceId, benchmarkId, revision);
  const initial = usePlotSettings(methods);
  const [hidden, setHidden] = useState<Set<string>>(initial.hidden);
  const [bandPercent, setBandPercent] = useState(initial.bandPercent);
  const [showExcluded, setShowExcluded] = useState(initial.showExcluded);
  const [baMethod, setBaMethod] = useState(initial.baMethod);
  const [picked, setPicked] = useState<PlotPoint | null>(null);
  const pickedPanel = useRef<HTMLDivElement>(null);
  const pickedFrom = useRef<HTMLElement | null>(null);

  // the settings live in the address, so a shared or reloaded link shows the same plots
  useEffect(() => {
    const url = new URL(window.location.href);
    const set = (name: string, value: string | null) => (value === null ? url.searchParams.delete(name) : url.searchParams.set(name, value));
    set('hide', hidden.size ? [...hidden].join(',') : null);
    set('band', bandPercent === DEFAULT_BAND ? null : String(bandPercent));
    set('excluded', showExcluded ? null : 'hide');
    set('ba', baMethod && baMethod !== defaultBaMethod(methods) ? baMethod : null);
    if (url.href !== window.location.href) window.history.replaceState(window.history.state, '', url);
  }, [hidden, bandPercent, showExcluded, baMethod, methods]);

  useEffect(() => {
    if (picked) pickedPanel.current?.focus();
  }, [picked]);

  const labels = useMemo(() => methods.map((m) => m.label), [methods]);
  const visible = useMemo(
    () => (data?.points ?? []).filter((p) => !hidden.has(p.methodId) && (showExcluded || !p.excluded)),
    [data, hidden, showExcluded],
  );
  const byKey = useMemo(() => new Map((data?.points ?? []).map((p) => [p.key, p])), [data]);
  const unit = data?.unit ?? '';
  const renderer = rendererFor(visible.length);

  const parity = useMemo(() => parityPlotSpec(visible, { unit, methods: labels, bandPercent }), [visible, unit, labels, bandPercent]);
  const parityNote = useMemo(() => densityNote(visible), [visible]);
  const histogram = useMemo(() => errorHistogramSpec(visible, { unit, methods: labels }), [visible, unit, labels]);
  const residual = useMemo(() => residualSpec(visible, { unit, methods: labels }), [visible, unit, labels]);
  const ba = useMemo(() => {
    const m = methods.find((x) => x.methodId === baMethod);
    const limits: AgreementLimits[] = m?.limits ? [{ method: m.label, ...m.limits }] : [];
    const shown = visible.filter((p) => p.methodId === baMethod);
    return { spec: blandAltmanSpec(shown, limits, { unit, methods: labels }), text: blandAltmanText(shown, limits, unit) };
  }, [visible, baMethod, methods, unit, labels]);
  const texts = useMemo(
    () => ({ parity: parityText(visible, unit), residual: residualText(visible, unit), histogram: histogramText(visible, unit, labels) }),
    [visible, unit, labels],
  );

  if (isPending) return <p className="text-sm text-ink-muted">Loading the pairs…</p>;
  if (error) return <p className="text-sm text-bad">Could not load the pairs: {error.message}</p>;
  if (!data || data.points.length === 0) return <p className="text-sm text-ink-muted">No pairs to plot.</p>;

  const pick = (key: string) => {
    pickedFrom.current = document.activeElement as HTMLElement | null;
    setPicked(byKey.get(key) ?? null);
  };
  const closePicked = () => {
    setPicked(null);
    pickedFrom.current?.focus();
  };

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-4 text-sm">
        <fieldset className="flex flex-wrap gap-3">
          <legend className="sr-only">Methods shown</legend>
          {methods.map((m) => (
            <label key={m.methodId} className="inline-flex items-center gap-1.5">
              <input
                type="checkbox"
                checked={!hidden.has(m.methodId)}
                onChange={(e) => {
                  const next = new Set(hidden);
                  if (e.target.checked) next.delete(m.methodId);
                  else next.add(m.methodId);
                  setHidden(next);
                }}
              />
              {m.label}
            </label>
          ))}
        </fieldset>
        <label className="inline-flex items-center gap-1.5">
          <input type="checkbox" checked={showExcluded} onChange={(e) => setShowExcluded(e.target.checked)} />
          Show excluded pairs (grey)
        </label>
        <label className="inline-flex items-center gap-1.5">
          Band ±
          <input
            type="number"
            min={0.5}
            max={50}
            step={0.5}
            value={bandPercent}
            onChange={(e) => setBandPercent(Math.min(50, Math.max(0.5, Number(e.target.value) || 5)))}
            className={`${inputClass} w-20`}
            aria-label="Band around y = x, percent"
          />
          %
        </label>
        <span className="text-xs text-ink-faint num">
          {visible.length.toLocaleString('en')} points · {renderer === 'canvas' ? 'canvas' : 'SVG'} renderer · click a point, or focus a plot and use the arrow keys and Enter, to open its pair
        </span>
        <AddToDeck workspaceId={workspaceId} kinds={PLOT_KINDS} benchmarkId={benchmarkId} revisionNumber={revision} filters={{ hiddenMethods: [...hidden], bandPercent, showExcluded, methodId: baMethod || undefined }} />
      </div>

      {picked ? (
        <div ref={pickedPanel} tabIndex={-1} className="rounded-md border border-rule bg-paper px-3 py-2 text-sm" role="region" aria-label="Selected pair" data-testid="picked-pair">
          <div className="flex justify-between gap-2">
            <strong>
              {picked.material} · {picked.label} · {picked.method}
            </strong>
            <button type="button" className="text-xs text-ink-muted underline underline-offset-2 hover:text-ink" onClick={closePicked}>
              Close
            </button>
          </div>
          <p className="num">
            measured {picked.measured.toFixed(2)}
            {picked.uMeasured ? ` ± ${picked.uMeasured.toFixed(2)}` : ''} · calculated {picked.calculated.toFixed(2)} · error {picked.error >= 0 ? '+' : ''}
            {picked.error.toFixed(2)} {unit}
            {picked.excluded ? ' · excluded' : ''}
            {picked.outlier ? ' · flagged as outlier' : ''}
          </p>
          <p className="text-ink-muted">Source: {picked.citation}</p>
          {picked.outlier || picked.excluded ? (
            <a href={`#pair-${encodeURIComponent(picked.key)}`} className="text-xs">
              Go to this pair in the outlier table
            </a>
          ) : null}
        </div>
      ) : null}

      <div className="grid grid-cols-[minmax(0,1fr)] gap-6 xl:grid-cols-2">
        <VegaFigure spec={parity} text={texts.parity} renderer={renderer} fileName={`${fileStem}-parity`} title="Parity plot (y = x, dashed; shaded ± band)" note={parityNote} onPick={pick} />
        <VegaFigure spec={residual} text={texts.residual} renderer={renderer} fileName={`${fileStem}-residuals`} title="Residual vs measured" onPick={pick} />
        <div className="space-y-2">
          <label className="flex items-center gap-2 text-sm">
            Bland–Altman for
            <select className={`${inputClass} w-auto`} value={baMethod} onChange={(e) => setBaMethod(e.target.value)}>
              {methods.map((m) => (
                <option key={m.methodId} value={m.methodId}>
                  {m.label}
                </option>
              ))}
            </select>
          </label>
          <VegaFigure spec={ba.spec} text={ba.text} renderer={renderer} fileName={`${fileStem}-bland-altman`} title="Bland–Altman: bias and 95 % limits of agreement" onPick={pick} />
        </div>
        <div className="xl:col-span-2">
          <VegaFigure spec={histogram} text={texts.histogram} renderer="svg" fileName={`${fileStem}-error-histogram`} title="Error histogram per method (included pairs)" />
        </div>
      </div>
    </div>
  );
}

const DEFAULT_BAND = 5;

function defaultBaMethod(methods: readonly PlotMethod[]): string {
  return methods.find((m) => m.limits)?.methodId ?? methods[0]?.methodId ?? '';
}

/** The plot settings in the address: hide=<method ids>, band=<percent>, excluded=hide, ba=<method id>. */
function usePlotSettings(methods: readonly PlotMethod[]) {
  const params = useSearchParams();
  const known = new Set(methods.map((m) => m.methodId));
  const band = Number(params.get('band'));
  const ba = params.get('ba');
  return {
    hidden: new Set((params.get('hide') ?? '').split(',').filter((id) => known.has(id))),
    bandPercent: Number.isFinite(band) && band >= 0.5 && band <= 50 ? band : DEFAULT_BAND,
    showExcluded: params.get('excluded') !== 'hide',
    baMethod: ba && known.has(ba) ? ba : defaultBaMethod(methods),
  };
}
