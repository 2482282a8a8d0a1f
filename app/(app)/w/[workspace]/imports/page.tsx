import type { Metadata } from 'next';
import Link from 'next/link';
import { z } from 'zod';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { listImports } from '@/db/queries/imports';
import { buttonClass } from '@/components/ui/button';
import { EmptyState, Panel } from '@/components/ui/panel';
import { count } from '@/lib/format';

export const metadata: Metadata = { title: 'Imports' };

const PAGE_SIZE = 50;
const pageSchema = z.coerce.number().int().min(1).catch(1);
const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export default async function ImportsPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'imports:read');
  const page = pageSchema.parse((await searchParams).page);
  const { items, total } = await listImports(ctx.workspace.id, { page, size: PAGE_SIZE });
  const base = `/w/${ctx.workspace.slug}/imports`;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));

  return (
    <div className="space-y-5">
      <header className="flex items-end justify-between gap-4">
        <div>
          <h1>Imports</h1>
          <p className="text-sm text-ink-muted">Every batch of measurements and calculations, newest first. An import can be undone; its rows are retracted, not deleted.</p>
        </div>
        {roleCan(ctx.role, 'imports:create') && (
          <Link href={`${base}/new`} className={buttonClass('primary')}>
            New import
          </Link>
        )}
      </header>
      {total === 0 ? (
        <EmptyState title="No imports yet">Start with a template: Imports → New import. Pipelines can post to /api/v1/imports with an API token.</EmptyState>
      ) : (
        <Panel title={`${count(total)} imports`}>
          <table className="w-full text-sm" data-testid="import-history">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="pb-2 font-medium">When</th>
                <th className="pb-2 font-medium">Who</th>
                <th className="pb-2 font-medium">Kind</th>
                <th className="pb-2 font-medium">File</th>
                <th className="pb-2 text-right font-medium">Rows</th>
                <th className="pb-2 text-right font-medium">Inserted</th>
                <th className="pb-2 text-right font-medium">Identical</th>
                <th className="pb-2 pl-3 font-medium">Status</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {items.map((i) => (
                <tr key={i.id}>
                  <td className="num py-2 pr-3">
                    <Link href={`${base}/${i.id}`}>{when.format(i.createdAt)}</Link>
                  </td>
                  <td className="py-2 pr-3">
                    {i.creatorName ?? '—'}
                    {i.via === 'api' && <span className="text-xs text-ink-muted"> via API{i.tokenName ? ` (${i.tokenName})` : ''}</span>}
                    {i.via === 'form' && <span className="text-xs text-ink-muted"> single entry</span>}
                  </td>
                  <td className="py-2 pr-3">{i.kind}</td>
                  <td className="max-w-64 truncate py-2 pr-3 text-ink-muted" title={i.fileName ?? undefined}>
                    {i.fileName ?? '—'}
                  </td>
                  <td className="num py-2 pr-3 text-right">{count(i.rowCount)}</td>
                  <td className="num py-2 pr-3 text-right">{count(i.insertedCount)}</td>
                  <td className="num py-2 pr-3 text-right text-ink-muted">{count(i.duplicateCount)}</td>
                  <td className={`py-2 pl-3 ${i.status === 'undone' ? 'text-warn' : 'text-good'}`}>{i.status}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {pages > 1 && (
            <nav aria-label="Pages" className="mt-3 flex items-center gap-3 text-sm">
              {page > 1 && <Link href={`${base}?page=${page - 1}`}>← Newer</Link>}
              <span className="num text-ink-muted">
                Page {page} of {pages}
              </span>
              {page < pages && <Link href={`${base}?page=${page + 1}`}>Older →</Link>}
            </nav>
          )}
        </Panel>
      )}
    </div>
  );
}
