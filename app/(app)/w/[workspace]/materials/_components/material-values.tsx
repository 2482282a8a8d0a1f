import Link from 'next/link';
import type { ComputedModeRow, MaterialValues, MeasuredPeakRow } from '@/db/queries/material-values';
import { StickSpectrum } from '@/components/charts/stick-spectrum';
import { EmptyState, Panel } from '@/components/ui/panel';

const fmt = (v: number | null | undefined, digits = 1) => (v == null ? '–' : v.toFixed(digits));

function PeaksTable({ slug, peaks }: { slug: string; peaks: MeasuredPeakRow[] }) {
  if (peaks.length === 0) return <p className="text-sm text-ink-muted">No measured peaks.</p>;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Measured peaks</caption>
      <thead className="text-left text-xs text-ink-muted">
        <tr>
          <th className="py-1 pr-2 text-right font-medium">cm⁻¹</th>
          <th className="py-1 pr-2 text-right font-medium">±</th>
          <th className="py-1 pr-2 font-medium">Irrep</th>
          <th className="py-1 pr-2 font-medium">Branch</th>
          <th className="py-1 pr-2 font-medium">Technique</th>
          <th className="py-1 pr-2 text-right font-medium">T (K)</th>
          <th className="py-1 font-medium">Source</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-rule">
        {peaks.map((p) => (
          <tr key={p.id}>
            <td className="num py-1 pr-2 text-right" title={`${p.valueText} ${p.unit} as entered`}>
              {fmt(p.value)}
            </td>
            <td className="num py-1 pr-2 text-right">{fmt(p.uncertainty)}</td>
            <td className="py-1 pr-2">{p.irrep ?? '–'}</td>
            <td className="py-1 pr-2">{p.branch ?? '–'}</td>
            <td className="py-1 pr-2">{p.technique ?? '–'}</td>
            <td className="num py-1 pr-2 text-right">{fmt(p.temperatureK, 0)}</td>
            <td className="py-1">
              <Link href={`/w/${slug}/sources/${p.sourceId}`}>{p.citeKey}</Link>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function ModesTable({ modes }: { modes: ComputedModeRow[] }) {
  if (modes.length === 0) return <p className="text-sm text-ink-muted">No computed modes for this method.</p>;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Computed modes</caption>
      <thead className="text-left text-xs text-ink-muted">
        <tr>
          <th className="py-1 pr-2 text-right font-medium">Mode</th>
          <th className="py-1 pr-2 text-right font-medium">cm⁻¹</th>
          <th className="py-1 pr-2 font-medium">Irrep</th>
          <th className="py-1 pr-2 font-medium">Branch</th>
          <th className="py-1 font-medium">Activity</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-rule">
        {modes.map((m) => (
          <tr key={m.id}>
            <td className="num py-1 pr-2 text-right">{m.modeIndex ?? '–'}</td>
            <td className={`num py-1 pr-2 text-right ${m.value < 0 ? 'text-bad' : ''}`} title={`${m.valueText} ${m.unit} as entered`}>
              {fmt(m.value)}
            </td>
            <td className="py-1 pr-2">{m.irrep ?? '–'}</td>
            <td className="py-1 pr-2">{m.branch ?? '–'}</td>
            <td className="py-1">{m.activity ?? '–'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function EntropyTable({ slug, values }: { slug: string; values: MaterialValues }) {
  const rows = [
    ...values.entropies.map((e) => ({ id: e.id, series: 'Measured', t: e.temperatureK, s: e.value, u: e.uncertainty, sourceId: e.sourceId, citeKey: e.citeKey })),
    ...values.methods.flatMap((m) => m.entropies.map((e) => ({ id: e.id, series: m.methodLabel, t: e.temperatureK, s: e.value, u: null as number | null, sourceId: e.sourceId, citeKey: e.citeKey }))),
  ].sort((a, b) => (a.t ?? 0) - (b.t ?? 0) || a.series.localeCompare(b.series));
  if (rows.length === 0) return null;
  return (
    <Panel title="Vibrational entropy (J mol⁻¹ K⁻¹ per formula unit)">
      <table className="w-full max-w-2xl text-sm">
        <thead className="text-left text-xs text-ink-muted">
          <tr>
            <th className="py-1 pr-2 font-medium">Measured / method</th>
            <th className="py-1 pr-2 text-right font-medium">T (K)</th>
            <th className="py-1 pr-2 text-right font-medium">S</th>
            <th className="py-1 pr-2 text-right font-medium">±</th>
            <th className="py-1 font-medium">Source</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((r) => (
            <tr key={r.id}>
              <td className="py-1 pr-2">{r.series}</td>
              <td className="num py-1 pr-2 text-right">{fmt(r.t, 2)}</td>
              <td className="num py-1 pr-2 text-right">{fmt(r.s, 2)}</td>
              <td className="num py-1 pr-2 text-right">{fmt(r.u, 2)}</td>
              <td className="py-1">
                <Link href={`/w/${slug}/sources/${r.sourceId}`}>{r.citeKey}</Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </Panel>
  );
}

/** Measured peaks beside the selected method's computed modes, the stick spectrum of both, and entropies. */
export function MaterialValuesSection({ slug, materialId, materialName, values, selectedMethodId }: { slug: string; materialId: string; materialName: string; values: MaterialValues; selectedMethodId?: string }) {
  const hasAny = values.peaks.length + values.entropies.length + values.methods.length > 0;
  if (!hasAny) {
    return (
      <EmptyState title="No measurements or calculations yet">
        Add measured peaks and entropies, or a method&apos;s computed modes, on the <Link href={`/w/${slug}/imports`}>Imports</Link> page: download the CSV template, fill in rows that name
        this material as <code className="font-mono">{materialName}</code>, and upload it. Pipelines can post the same rows to the API.
      </EmptyState>
    );
  }
  const selected = values.methods.find((m) => m.methodId === selectedMethodId) ?? values.methods[0];
  const base = `/w/${slug}/materials/${materialId}`;
  return (
    <div className="space-y-4">
      {values.methods.length > 0 && (
        <nav aria-label="Methods" className="flex flex-wrap gap-1 text-sm">
          {values.methods.map((m) => (
            <Link
              key={m.methodId}
              href={`${base}?method=${m.methodId}`}
              aria-current={m.methodId === selected?.methodId ? 'page' : undefined}
              className={`rounded-md border px-2.5 py-1 no-underline ${m.methodId === selected?.methodId ? 'border-accent bg-accent-soft text-accent-strong' : 'border-rule text-ink-muted hover:text-ink'}`}
            >
              {m.methodLabel} <span className="num text-xs">({m.modes.length})</span>
            </Link>
          ))}
        </nav>
      )}
      {(values.peaks.length > 0 || selected) && (
        <Panel title={selected ? `Measured peaks and ${selected.methodLabel} modes` : 'Measured peaks'}>
          <div className="grid gap-6 lg:grid-cols-2">
            <div>
              <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-muted">Measured ({values.peaks.length})</h3>
              <PeaksTable slug={slug} peaks={values.peaks} />
            </div>
            <div>
              <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-muted">
                {selected ? (
                  <>
                    Computed with <Link href={`/w/${slug}/methods/${selected.methodId}`}>{selected.methodLabel}</Link> ({selected.modes.length})
                  </>
                ) : (
                  'Computed'
                )}
              </h3>
              {selected ? <ModesTable modes={selected.modes} /> : <p className="text-sm text-ink-muted">No calculations for this material yet.</p>}
            </div>
          </div>
          <div className="mt-4">
            <StickSpectrum
              measured={values.peaks.map((p) => ({ frequencyCm1: p.value, label: p.irrep, detail: p.citeKey }))}
              computed={(selected?.modes ?? []).map((m) => ({ frequencyCm1: m.value, label: m.irrep, detail: m.modeIndex != null ? `mode ${m.modeIndex}` : null }))}
              computedName={selected?.methodLabel ?? 'Computed'}
              downloadName={`${materialName}-${selected?.methodLabel ?? 'measured'}-spectrum`.replace(/[^A-Za-z0-9._-]+/g, '_')}
            />
            <p className="text-xs text-ink-faint">Measured lines point up, computed lines down; labels that would collide are staggered or left out. Hover a line for its label and source.</p>
          </div>
        </Panel>
      )}
      <EntropyTable slug={slug} values={values} />
    </div>
  );
}
