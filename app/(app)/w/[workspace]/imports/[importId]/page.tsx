import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { getImport, listImportHistory } from '@/db/queries/imports';
import { listCalculations, listMeasurements } from '@/db/queries/values';
import { listCreatedRecords } from '@/db/queries/catalog-import';
import { isCatalogKind } from '@/lib/import/catalog-columns';
import { Panel } from '@/components/ui/panel';
import { count, storedValue, unitSymbol } from '@/lib/format';
import { UNDO_RULE, undoVerdict } from '@/lib/import/undo-rule';
import { UndoImportForm } from '../_components/undo-import-form';
import { ScrollRegion } from '@/components/ui/scroll-region';

export const metadata: Metadata = { title: 'Import' };

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium' });
const SAMPLE_ROWS = 100;

const VIA: Record<'wizard' | 'api' | 'form', (token: string | null) => string> = {
  wizard: () => ' with the import wizard',
  form: () => ' with the single-entry form',
  api: (token) => ` via API${token ? ` (token “${token}”)` : ''}`,
};

export default async function ImportPage({ params }: { params: Promise<{ workspace: string; importId: string }> }) {
  const { workspace, importId } = await params;
  const ctx = await requirePageMember(workspace, 'imports:read');
  const batch = await getImport(ctx.workspace.id, importId);
  if (!batch) notFound();
  const filter = { page: 1, size: SAMPLE_ROWS, importId: batch.id, retracted: true };
  const catalog = isCatalogKind(batch.kind);
  const [values, history, created] = await Promise.all([
    catalog ? { rows: [], total: 0 } : batch.kind === 'measurements' ? listMeasurements(ctx.workspace.id, filter) : listCalculations(ctx.workspace.id, filter),
    listImportHistory(ctx.workspace.id, batch.id),
    listCreatedRecords(ctx.workspace.id, batch.id),
  ]);
  const createdRecords = [
    ...created.materials.map((r) => ({ ...r, what: 'material', href: `/w/${ctx.workspace.slug}/materials/${r.id}` })),
    ...created.methods.map((r) => ({ ...r, what: 'method', href: `/w/${ctx.workspace.slug}/methods/${r.id}` })),
    ...created.sources.map((r) => ({ ...r, what: 'source', href: `/w/${ctx.workspace.slug}/sources/${r.id}` })),
  ];
  const verdict = undoVerdict({ canUndoAny: roleCan(ctx.role, 'imports:undo'), canImport: roleCan(ctx.role, 'imports:create'), userId: ctx.user.id, batch });

  const facts: Array<[string, React.ReactNode]> = [
    ['Kind', batch.kind],
    ['File', batch.fileName ?? '—'],
    ['By', `${batch.creatorName ?? '—'}${VIA[batch.via](batch.tokenName)}`],
    ['When', when.format(batch.createdAt)],
    ['Bytes', count(batch.byteCount)],
    ['SHA-256', <code key="sha" className="break-all font-mono text-xs">{batch.sha256}</code>],
    ['Rows in the file', count(batch.rowCount)],
    [catalog ? 'Records created or updated' : 'Inserted', count(batch.insertedCount)],
    [catalog ? 'Identical to stored records (unchanged)' : 'Identical to existing rows (skipped)', count(batch.duplicateCount)],
    ['Status', batch.status === 'undone' ? `undone ${batch.undoneAt ? when.format(batch.undoneAt) : ''} by ${batch.undoneByName ?? '—'}: “${batch.undoReason}”` : 'committed'],
  ];

  return (
    <div className="space-y-5">
      <header className="space-y-1">
        <p className="text-xs text-ink-muted">
          <Link href={`/w/${ctx.workspace.slug}/imports`}>Imports</Link> /
        </p>
        <h1>Import of {batch.fileName ?? batch.kind}</h1>
      </header>
      <div className="grid gap-5 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <Panel title="Facts">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1.5 text-sm">
            {facts.map(([k, v]) => (
              <div key={k} className="contents">
                <dt className="text-ink-muted">{k}</dt>
                <dd className="num">{v}</dd>
              </div>
            ))}
          </dl>
        </Panel>
        <div className="space-y-5">
          {batch.status === 'committed' && (
            <Panel title="Undo">
              {verdict.allowed ? (
                <div className="space-y-2">
                  {verdict.as === 'importer' && (
                    <p className="text-sm" data-testid="undo-window">
                      You made this import, so you can undo it until {when.format(verdict.until)}. After that a curator or owner can.
                    </p>
                  )}
                  <UndoImportForm workspaceId={ctx.workspace.id} importId={batch.id} rowCount={batch.insertedCount} />
                </div>
              ) : (
                <p className="text-sm text-ink-muted" data-testid="undo-rule">
                  {verdict.reason === UNDO_RULE ? UNDO_RULE : <>{verdict.reason} {UNDO_RULE}</>}
                </p>
              )}
            </Panel>
          )}
          <Panel title="History">
            <ul className="space-y-1.5 text-sm">
              {history.map((h) => (
                <li key={h.id}>
                  <span className="num text-ink-muted">{when.format(h.createdAt)}</span> · {h.action} by {h.actorName ?? '—'}
                  {h.actorTokenId && <span className="text-ink-muted"> (API token)</span>}
                  {h.reason && <span className="text-ink-muted"> — “{h.reason}”</span>}
                </li>
              ))}
            </ul>
          </Panel>
        </div>
      </div>
      {createdRecords.length > 0 && (
        <Panel title={`Records this import created (${count(createdRecords.length)}${createdRecords.length >= 200 ? ', first 200 of each kind' : ''})`}>
          <ScrollRegion label="Records this import created">
            <table className="w-full text-sm" data-testid="import-created-records">
              <thead className="text-left text-xs text-ink-muted">
                <tr>
                  <th className="pb-2 font-medium">Kind</th>
                  <th className="pb-2 font-medium">Handle</th>
                  <th className="pb-2 font-medium">Detail</th>
                  <th className="pb-2 font-medium">Status</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-rule">
                {createdRecords.map((r) => (
                  <tr key={r.id} className={r.retractedAt ? 'text-ink-muted line-through decoration-ink-faint' : ''}>
                    <td className="py-1.5 pr-3">{r.what}</td>
                    <td className="py-1.5 pr-3">
                      <Link href={r.href}>{r.handle}</Link>
                    </td>
                    <td className="py-1.5 pr-3">{r.detail ?? '—'}</td>
                    <td className="py-1.5">{r.retractedAt ? 'retracted' : 'live'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollRegion>
        </Panel>
      )}
      {!catalog && <Panel title={`Rows (${count(values.total)}${values.total > SAMPLE_ROWS ? `, first ${SAMPLE_ROWS}` : ''})`}>
        <ScrollRegion label="Rows of this import">
          <table className="w-full text-sm" data-testid="import-rows">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="pb-2 font-medium">Quantity</th>
                <th className="pb-2 text-right font-medium">Value as entered</th>
                <th className="pb-2 pl-2 font-medium">Unit as entered</th>
                <th className="pb-2 text-right font-medium">Stored value (canonical unit)</th>
                <th className="pb-2 pl-3 font-medium">Label</th>
                <th className="pb-2 font-medium">Status</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {values.rows.map((r) => (
                <tr key={r.id} className={r.retractedAt ? 'text-ink-muted line-through decoration-ink-faint' : ''}>
                  <td className="py-1.5 pr-3">{r.quantity}</td>
                  <td className="num py-1.5 pr-3 text-right">{r.valueText}</td>
                  <td className="py-1.5 pl-2 pr-3">{unitSymbol(r.unit)}</td>
                  <td className="num py-1.5 pr-3 text-right">{storedValue(r)}</td>
                  <td className="py-1.5 pl-3 pr-3">{r.irrepNormalized ?? '—'}</td>
                  <td className="py-1.5">{r.retractedAt ? 'retracted' : 'live'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollRegion>
      </Panel>}
    </div>
  );
}
