'use client';
import { useMemo, useState } from 'react';
import { VegaFigure } from '@/components/charts/benchmark/vega-figure';
import { comparisonText } from '@/components/charts/benchmark/figure-text';
import { pairedScatterSpec, rendererFor, type PairedPoint } from '@/components/charts/benchmark/specs';
import { inputClass } from '@/components/ui/field';
import type { ComparisonRecord } from '@/lib/benchmark/types';
import { usePairs } from './use-benchmark-data';
import { AddToDeck } from '@/app/(app)/w/[workspace]/decks/_components/add-to-deck';
import { comparisonPairSchema, type ComparisonPair } from '../schemas';
import { pValue, signed, withUnit } from '@/lib/format';

/** Writes the chosen pair into the address without a navigation, so a reload or a shared link shows the same comparison. */
function keepInAddress(pair: ComparisonPair) {
  const url = new URL(window.location.href);
  url.searchParams.set('methodA', pair.methodA);
  url.searchParams.set('methodB', pair.methodB);
  window.history.replaceState(window.history.state, '', url);
}

function measurementKey(key: string): string {
  return key.slice(key.indexOf('|') + 1);
}

/** Two methods side by side on their common pairs. */
export function MethodComparison({
  workspaceId,
  benchmarkId,
  revision,
  methods,
  comparisons,
  unit,
  fileStem,
  initial,
  initialError,
}: {
  workspaceId: string;
  benchmarkId: string;
  revision: number;
  methods: Array<{ methodId: string; label: string }>;
  comparisons: ComparisonRecord[];
  unit: string;
  fileStem: string;
  /** The pair from the address (comparisonFromSearch), or null for the first two methods. */
  initial: ComparisonPair | null;
  initialError: string | null;
}) {
  const [a, setA] = useState(initial?.methodA ?? methods[0]?.methodId ?? '');
  const [b, setB] = useState(initial?.methodB ?? methods[1]?.methodId ?? '');
  const [error, setError] = useState<string | null>(initialError);
  const choose = (next: { methodA: string; methodB: string }) => {
    setA(next.methodA);
    setB(next.methodB);
    const parsed = comparisonPairSchema.safeParse(next);
    setError(parsed.success ? null : parsed.error.issues[0].message);
    if (parsed.success) keepInAddress(parsed.data);
  };
  const { data } = usePairs(workspaceId, benchmarkId, revision);
  const label = (id: string) => methods.find((m) => m.methodId === id)?.label ?? id;

  const record = comparisons.find((c) => (c.a === a && c.b === b) || (c.a === b && c.b === a));
  const flipped = record ? record.a !== a : false;

  const points = useMemo((): PairedPoint[] => {
    if (!data || a === b) return [];
    const ofB = new Map(data.points.filter((p) => p.methodId === b && !p.excluded).map((p) => [measurementKey(p.key), p]));
    return data.points
      .filter((p) => p.methodId === a && !p.excluded)
      .flatMap((p) => {
        const q = ofB.get(measurementKey(p.key));
        return q ? [{ key: p.key, material: p.material, label: p.label, a: Math.abs(p.error), b: Math.abs(q.error) }] : [];
      });
  }, [data, a, b]);
  const spec = useMemo(() => pairedScatterSpec(points, { unit, a: label(a), b: label(b) }), [points, unit, a, b]); // eslint-disable-line react-hooks/exhaustive-deps
  const text = useMemo(() => comparisonText(points, unit, label(a), label(b)), [points, unit, a, b]); // eslint-disable-line react-hooks/exhaustive-deps

  if (methods.length < 2) return <p className="text-sm text-ink-muted">Comparing needs at least two methods in scope.</p>;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <div className="space-y-3">
        <div className="flex flex-wrap gap-3 text-sm">
          <label className="flex items-center gap-2">
            Method A
            <select className={`${inputClass} w-auto`} value={a} onChange={(e) => choose({ methodA: e.target.value, methodB: b })} aria-invalid={error !== null && a === b}>
              {methods.map((m) => (
                <option key={m.methodId} value={m.methodId}>
                  {m.label}
                </option>
              ))}
            </select>
          </label>
          <label className="flex items-center gap-2">
            Method B
            <select className={`${inputClass} w-auto`} value={b} onChange={(e) => choose({ methodA: a, methodB: e.target.value })} aria-invalid={error !== null && a === b} aria-describedby={error ? 'comparison-error' : undefined}>
              {methods.map((m) => (
                <option key={m.methodId} value={m.methodId}>
                  {m.label}
                </option>
              ))}
            </select>
          </label>
        </div>
        {error ? (
          <p id="comparison-error" role="alert" className="text-sm text-bad" data-testid="comparison-error">
            {error}
          </p>
        ) : null}
        {a === b ? null : !record ? (
          <p className="text-sm text-ink-muted">These two methods have no pair in common (no measurement paired under both).</p>
        ) : (
          <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm" data-testid="comparison">
            <dt className="text-ink-muted">Common pairs</dt>
            <dd className="num">{record.n}</dd>
            <dt className="text-ink-muted">Mean difference of |error| (A − B)</dt>
            <dd className="num">
              {withUnit(signed(flipped ? -record.meanDifference : record.meanDifference, 3), unit)}
            </dd>
            <dt className="text-ink-muted">Wilcoxon signed-rank p</dt>
            <dd className="num">
              {pValue(record.wilcoxon.pValue)} ({record.wilcoxon.method === 'exact' ? 'exact' : 'normal approximation'})
            </dd>
            <dt className="text-ink-muted">A closer / B closer / ties</dt>
            <dd className="num">
              {flipped ? record.losses : record.wins} / {flipped ? record.wins : record.losses} / {record.ties}
            </dd>
          </dl>
        )}
        <p className="text-xs text-ink-faint">Points below the dashed line are pairs where {label(b)} is closer to experiment.</p>
        {a === b ? null : <AddToDeck workspaceId={workspaceId} kinds={['comparison']} benchmarkId={benchmarkId} revisionNumber={revision} filters={{ methodA: a, methodB: b }} defaultTitle={`${label(a)} vs ${label(b)}`} />}
      </div>
      {a !== b && points.length > 0 ? (
        <VegaFigure spec={spec} text={text} renderer={rendererFor(points.length)} fileName={`${fileStem}-${label(a)}-vs-${label(b)}`} title={`|error| per common pair: ${label(a)} vs ${label(b)}`} />
      ) : null}
    </div>
  );
}
