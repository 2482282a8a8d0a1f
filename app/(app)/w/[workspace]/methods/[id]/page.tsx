import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { formatGrid, kPointDensity } from '@/lib/catalog/k-point-density';
import { APPROACH_LABELS } from '@/lib/catalog/method-schema';
import { getMethod, listMaterialsOfMethod } from '@/db/queries/methods';
import { buttonClass } from '@/components/ui/button';
import { FieldList } from '@/components/ui/field-list';
import { Panel } from '@/components/ui/panel';
import { RetractionForm } from '../../history/_components/retraction-form';
import { restoreMethodAction, retractMethodAction } from '../actions';
import { RecordDates, RetractedNotice } from '../../_components/record-pages';

export const metadata: Metadata = { title: 'Method' };

const int = new Intl.NumberFormat('en-GB');

export default async function MethodPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'methods:read');
  const m = await getMethod(ctx.workspace.id, id);
  if (!m) notFound();
  const materials = await listMaterialsOfMethod(ctx.workspace.id, m.id);
  const slug = ctx.workspace.slug;
  const kPoints = m.kGrid ? m.kGrid[0] * m.kGrid[1] * m.kGrid[2] : null;
  const fields: Array<[string, React.ReactNode]> = [
    ['Functional', m.functional],
    ['Dispersion correction', m.dispersion ?? 'none given'],
    ['Pseudopotential family', m.pseudopotential ?? '–'],
    ['Plane-wave cutoff', m.cutoffEv != null ? <span key="c" className="num">{m.cutoffEv} eV</span> : '–'],
    ['k-point grid', m.kGrid ? <span key="k" className="num">{formatGrid(m.kGrid)} ({kPoints} k-points)</span> : '–'],
    ['q-point grid', m.qGrid ? <span key="q" className="num">{formatGrid(m.qGrid)}</span> : '–'],
    ['Smearing', m.smearing ?? '–'],
    ['Approach', m.approach ? APPROACH_LABELS[m.approach] : '–'],
    ['LO–TO (non-analytic) correction', m.nonAnalyticCorrection == null ? '–' : m.nonAnalyticCorrection ? 'yes' : 'no'],
  ];
  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link href={`/w/${slug}/methods`}>← Methods</Link>
      </p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1>{m.label}</h1>
          <RecordDates createdAt={m.createdAt} updatedAt={m.updatedAt} />
        </div>
        <div className="flex gap-2">
          {!m.retractedAt && roleCan(ctx.role, 'methods:update') && (
            <Link href={`/w/${slug}/methods/${m.id}/edit`} className={buttonClass('secondary', 'no-underline')}>
              Edit
            </Link>
          )}
          <Link href={`/w/${slug}/history/method/${m.id}`} className={buttonClass('ghost', 'no-underline')}>
            History
          </Link>
        </div>
      </header>
      <RetractedNotice at={m.retractedAt} reason={m.retractionReason} />
      <Panel title="Recipe">
        <FieldList fields={fields} columns="sm:grid-cols-2 lg:grid-cols-3" />
        {m.notes && <p className="mt-3 whitespace-pre-line border-t border-rule pt-3 text-sm text-ink-muted">{m.notes}</p>}
      </Panel>
      <Panel title="k-point density per material">
        <p className="mb-3 text-sm text-ink-muted">
          k-point density per reciprocal atom = k₁·k₂·k₃ × atoms in the primitive cell. High-throughput phonon work commonly aims for about 1000–1500; the workspace&apos;s target is set in
          Settings.
        </p>
        {!m.kGrid ? (
          <p className="text-sm text-ink-muted">This method has no k-point grid, so the density cannot be derived.</p>
        ) : materials.rows.length === 0 ? (
          <p className="text-sm text-ink-muted">No calculations with this method yet.</p>
        ) : (
          <table className="w-full max-w-2xl text-sm">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="py-1 pr-2 font-medium">Material</th>
                <th className="py-1 pr-2 font-medium">Formula</th>
                <th className="py-1 pr-2 text-right font-medium">Atoms in cell</th>
                <th className="py-1 pr-2 text-right font-medium">k-points × atoms</th>
                <th className="py-1 text-right font-medium">Calculations</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {materials.rows.map((row) => {
                const density = kPointDensity(m.kGrid, row.atomsInCell);
                return (
                  <tr key={row.id}>
                    <td className="py-1 pr-2">
                      <Link href={`/w/${slug}/materials/${row.id}?method=${m.id}`}>{row.name}</Link>
                    </td>
                    <td className="py-1 pr-2">{row.reducedFormula}</td>
                    <td className="num py-1 pr-2 text-right">{row.atomsInCell ?? '–'}</td>
                    <td className="num py-1 pr-2 text-right">{density != null ? int.format(density) : 'cell unknown'}</td>
                    <td className="num py-1 text-right">{row.calculationCount}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
        {materials.more && <p className="mt-2 text-xs text-ink-faint">Showing the first {materials.rows.length} materials by name.</p>}
      </Panel>
      {roleCan(ctx.role, 'methods:retract') && (
        <Panel title={m.retractedAt ? 'Restore' : 'Retract'} className="max-w-xl">
          <RetractionForm workspaceId={ctx.workspace.id} id={m.id} mode={m.retractedAt ? 'restore' : 'retract'} action={m.retractedAt ? restoreMethodAction : retractMethodAction} noun="method" />
        </Panel>
      )}
    </div>
  );
}
