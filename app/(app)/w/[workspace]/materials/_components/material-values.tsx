import Link from 'next/link';
import { IncompleteMark } from '@/components/citations/incomplete-mark';
import type { ComputedModeRow, MaterialValues, MeasuredPeakRow } from '@/db/queries/material-values';
import type { BornChargeSet } from '@/lib/benchmark/material-quality';
import { StickSpectrum } from '@/components/charts/stick-spectrum';
import { EmptyState, Panel } from '@/components/ui/panel';
import { asEntered, count, header, plain } from '@/lib/format';

/** A stored value as typed when it was typed in the canonical unit, else with the typed significant figures. */
const shown = (value: number | null, text: string | null, unit: string, canonical: string) => (value === null ? '–' : asEntered(value, text ?? String(value), unit === canonical));

/** The last cell of every value table: the row's source, marked when the source is incomplete. */
function SourceCell({ slug, row }: { slug: string; row: { sourceId: string; citeKey: string; sourceGaps: Parameters<typeof IncompleteMark>[0]['gaps'] } }) {
  return (
    <td className="py-1">
      <Link href={`/w/${slug}/sources/${row.sourceId}`}>{row.citeKey}</Link>
      <IncompleteMark gaps={row.sourceGaps} />
    </td>
  );
}
const th = 'py-1 pr-2 font-medium';
const thNum = `${th} text-right`;

function PeaksTable({ slug, peaks }: { slug: string; peaks: MeasuredPeakRow[] }) {
  if (peaks.length === 0) return <p className="text-sm text-ink-muted">No measured peaks.</p>;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Measured peaks, by frequency</caption>
      <thead className="text-left text-xs text-ink-muted">
        <tr>
          <th className={thNum}>{header('Frequency', 'cm⁻¹')}</th>
          <th className={thNum}>{header('±', 'cm⁻¹')}</th>
          <th className={th}>Irrep</th>
          <th className={th}>Branch</th>
          <th className={th}>Technique</th>
          <th className={thNum}>{header('T', 'K')}</th>
          <th className="py-1 font-medium">Source</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-rule">
        {peaks.map((p) => (
          <tr key={p.id}>
            <td className="num py-1 pr-2 text-right" title={`${p.valueText} ${p.unit} as entered`}>
              {shown(p.value, p.valueText, p.unit, 'cm-1')}
            </td>
            <td className="num py-1 pr-2 text-right">{shown(p.uncertainty, p.uncertaintyText, p.unit, 'cm-1')}</td>
            <td className="py-1 pr-2">{p.irrep ?? '–'}</td>
            <td className="py-1 pr-2">{p.branch ?? '–'}</td>
            <td className="py-1 pr-2">{p.technique ?? '–'}</td>
            <td className="num py-1 pr-2 text-right">{p.temperatureK === null ? '–' : plain(p.temperatureK)}</td>
            <SourceCell slug={slug} row={p} />
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Computed modes by frequency (the mode number of the computed list kept beside), with their degeneracy. */
function ModesTable({ modes }: { modes: ComputedModeRow[] }) {
  if (modes.length === 0) return <p className="text-sm text-ink-muted">No computed modes for this method.</p>;
  const byFrequency = [...modes].sort((a, b) => a.value - b.value || (a.modeIndex ?? 0) - (b.modeIndex ?? 0));
  const modeCount = modes.reduce((n, m) => n + (m.degeneracy ?? 1), 0);
  return (
    <table className="w-full text-sm" data-testid="computed-modes">
      <caption className="sr-only">Computed modes, by frequency</caption>
      <thead className="text-left text-xs text-ink-muted">
        <tr>
          <th className={thNum}>{header('Frequency', 'cm⁻¹')}</th>
          <th className={th}>Irrep</th>
          <th className={th}>Branch</th>
          <th className={thNum}>Degeneracy</th>
          <th className={th}>Activity</th>
          <th className="py-1 text-right font-medium">Mode no.</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-rule">
        {byFrequency.map((m) => (
          <tr key={m.id}>
            <td className={`num py-1 pr-2 text-right ${m.value < 0 ? 'text-bad' : ''}`} title={`${m.valueText} ${m.unit} as entered`}>
              {shown(m.value, m.valueText, m.unit, 'cm-1')}
            </td>
            <td className="py-1 pr-2">{m.irrep ?? '–'}</td>
            <td className="py-1 pr-2">{m.branch ?? '–'}</td>
            <td className="num py-1 pr-2 text-right">{m.degeneracy ?? '–'}</td>
            <td className="py-1 pr-2">{m.activity ?? '–'}</td>
            <td className="num py-1 text-right text-ink-muted">{m.modeIndex ?? '–'}</td>
          </tr>
        ))}
      </tbody>
      <tfoot className="text-xs text-ink-muted">
        <tr>
          <td colSpan={6} className="pt-1.5" data-testid="mode-total">
            {count(modes.length)} {modes.length === 1 ? 'line' : 'lines'}, {count(modeCount)} {modeCount === 1 ? 'mode' : 'modes'} counting degeneracy{modes.some((m) => m.degeneracy === null) ? ' (a line without a degeneracy counts once)' : ''}.
          </td>
        </tr>
      </tfoot>
    </table>
  );
}

const principal = (components: number[] | null) => (components ? components.map((c) => plain(c)).join(' / ') : '–');

/** A Born-charge tensor as three rows of three components. */
function TensorCell({ components }: { components: number[] | null }) {
  if (!components) return <span className="text-ink-muted">scalar only (read as Z·I)</span>;
  return (
    <span className="inline-grid grid-cols-3 gap-x-2 font-mono text-xs" aria-label={`tensor ${components.join(' ')}`}>
      {components.map((c, i) => (
        <span key={i} className="text-right">
          {plain(c)}
        </span>
      ))}
    </span>
  );
}

/** Born effective charges per series (measured source or method), each with the sum that neutrality needs to be zero. */
function BornChargeTable({ sets }: { sets: BornChargeSet[] }) {
  if (sets.length === 0) return null;
  const tone = { neutral: 'text-ink-muted', residue: 'text-warn', far: 'text-bad', unchecked: 'text-ink-muted' } as const;
  return (
    <Panel title="Born effective charges">
      <div className="grid gap-4 xl:grid-cols-2">
        {sets.map((set) => (
          <table key={set.series} className="w-full text-sm" data-testid="born-charges">
            <caption className="mb-1 text-left text-xs font-semibold text-ink-muted">{set.series}</caption>
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className={th}>Site</th>
                <th className={thNum}>{header('Mean of diagonal', 'e')}</th>
                <th className={th}>Tensor (xx xy xz / yx yy yz / zx zy zz)</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {set.rows.map((r) => (
                <tr key={r.id}>
                  <td className="py-1 pr-2">{r.site ?? '–'}</td>
                  <td className="num py-1 pr-2 text-right">{plain(r.value)}</td>
                  <td className="py-1 pr-2">
                    <TensorCell components={r.components} />
                  </td>
                </tr>
              ))}
            </tbody>
            <tfoot>
              <tr>
                <td colSpan={3} className={`pt-1.5 text-xs ${tone[set.neutrality.status]}`} data-testid="born-neutrality">
                  {set.neutrality.text}
                </td>
              </tr>
            </tfoot>
          </table>
        ))}
      </div>
    </Panel>
  );
}

/** Measured and computed ε∞ and ε₀ of the material (dimensionless; the orientational average for a non-cubic crystal). */
function DielectricTable({ slug, values }: { slug: string; values: MaterialValues }) {
  const name = (q: string) => (q === 'eps-inf' ? 'ε∞' : 'ε₀');
  const rows = [
    ...values.dielectric.map((e) => ({ id: e.id, series: 'Measured', q: name(e.quantity), v: shown(e.value, e.valueText, e.unit, '1'), u: shown(e.uncertainty, e.uncertaintyText, e.unit, '1'), p: principal(e.components), t: e.temperatureK, sourceId: e.sourceId, citeKey: e.citeKey, sourceGaps: e.sourceGaps })),
    ...values.methods.flatMap((m) =>
      m.dielectric.map((e) => ({ id: e.id, series: m.methodLabel, q: name(e.quantity), v: shown(e.value, e.valueText, e.unit, '1'), u: '–', p: principal(e.components), t: e.temperatureK, sourceId: e.sourceId, citeKey: e.citeKey, sourceGaps: e.sourceGaps })),
    ),
  ].sort((a, b) => a.q.localeCompare(b.q) || (a.series === 'Measured' ? -1 : b.series === 'Measured' ? 1 : a.series.localeCompare(b.series)));
  if (rows.length === 0) return null;
  return (
    <Panel title="Dielectric constants">
      <table className="w-full max-w-2xl text-sm">
        <thead className="text-left text-xs text-ink-muted">
          <tr>
            <th className={th}>Measured / method</th>
            <th className={th}>Constant</th>
            <th className={thNum}>Value</th>
            <th className={thNum}>±</th>
            <th className={thNum}>Principal values</th>
            <th className={thNum}>{header('T', 'K')}</th>
            <th className="py-1 font-medium">Source</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((r) => (
            <tr key={r.id}>
              <td className="py-1 pr-2">{r.series}</td>
              <td className="py-1 pr-2">{r.q}</td>
              <td className="num py-1 pr-2 text-right">{r.v}</td>
              <td className="num py-1 pr-2 text-right">{r.u}</td>
              <td className="num py-1 pr-2 text-right">{r.p}</td>
              <td className="num py-1 pr-2 text-right">{r.t === null ? '–' : plain(r.t)}</td>
              <SourceCell slug={slug} row={r} />
            </tr>
          ))}
        </tbody>
      </table>
    </Panel>
  );
}

const THERMAL = {
  entropy: { title: 'Vibrational entropy (per formula unit)', symbol: 'S', measured: 'Measured' },
  'heat-capacity': { title: 'Heat capacity (per formula unit): measured Cp, computed Cv', symbol: 'C', measured: 'Measured (Cp)' },
} as const;

/** Measured and computed entropies, or heat capacities, of the material by temperature. */
function ThermalTable({ slug, values, quantity }: { slug: string; values: MaterialValues; quantity: keyof typeof THERMAL }) {
  const text = THERMAL[quantity];
  const measured = quantity === 'entropy' ? values.entropies : values.heatCapacities;
  const rows = [
    ...measured.map((e) => ({ id: e.id, series: text.measured, t: e.temperatureK, s: shown(e.value, e.valueText, e.unit, 'J/mol/K'), u: shown(e.uncertainty, e.uncertaintyText, e.unit, 'J/mol/K'), sourceId: e.sourceId, citeKey: e.citeKey, sourceGaps: e.sourceGaps })),
    ...values.methods.flatMap((m) =>
      (quantity === 'entropy' ? m.entropies : m.heatCapacities).map((e) => ({
        id: e.id,
        series: quantity === 'entropy' ? m.methodLabel : `${m.methodLabel} (Cv)`,
        t: e.temperatureK,
        s: shown(e.value, e.valueText, e.unit, 'J/mol/K'),
        u: '–',
        sourceId: e.sourceId,
        citeKey: e.citeKey,
        sourceGaps: e.sourceGaps,
      })),
    ),
  ].sort((a, b) => (a.t ?? 0) - (b.t ?? 0) || a.series.localeCompare(b.series));
  if (rows.length === 0) return null;
  return (
    <Panel title={text.title}>
      {quantity === 'heat-capacity' ? (
        <p className="mb-2 max-w-2xl text-xs text-ink-muted">Calorimetry gives Cp; a harmonic calculation gives Cv, which is smaller by α² B V_m T (about 1.4 % for MgO, 5.5 % for NaCl at 298 K). The values are shown as stored, uncorrected.</p>
      ) : null}
      <table className="w-full max-w-2xl text-sm">
        <thead className="text-left text-xs text-ink-muted">
          <tr>
            <th className={th}>Measured / method</th>
            <th className={thNum}>{header('T', 'K')}</th>
            <th className={thNum}>{header(text.symbol, 'J mol⁻¹ K⁻¹')}</th>
            <th className={thNum}>{header('±', 'J mol⁻¹ K⁻¹')}</th>
            <th className="py-1 font-medium">Source</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((r) => (
            <tr key={r.id}>
              <td className="py-1 pr-2">{r.series}</td>
              <td className="num py-1 pr-2 text-right">{r.t === null ? '–' : plain(r.t)}</td>
              <td className="num py-1 pr-2 text-right">{r.s}</td>
              <td className="num py-1 pr-2 text-right">{r.u}</td>
              <SourceCell slug={slug} row={r} />
            </tr>
          ))}
        </tbody>
      </table>
    </Panel>
  );
}

/** Measured peaks beside the selected method's computed modes, the stick spectrum of both, and entropies. */
export function MaterialValuesSection({
  slug,
  materialId,
  materialName,
  values,
  born = [],
  selectedMethodId,
}: {
  slug: string;
  materialId: string;
  materialName: string;
  values: MaterialValues;
  born?: BornChargeSet[];
  selectedMethodId?: string;
}) {
  const hasAny = values.peaks.length + values.entropies.length + values.heatCapacities.length + values.dielectric.length + values.born.length + values.methods.length > 0;
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
          <div className="grid gap-6 xl:grid-cols-2">
            <div className="min-w-0 overflow-x-auto">
              <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-muted">Measured ({values.peaks.length})</h3>
              <PeaksTable slug={slug} peaks={values.peaks} />
            </div>
            <div className="min-w-0 overflow-x-auto">
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
      <ThermalTable slug={slug} values={values} quantity="entropy" />
      <ThermalTable slug={slug} values={values} quantity="heat-capacity" />
      <DielectricTable slug={slug} values={values} />
      <BornChargeTable sets={born} />
    </div>
  );
}
