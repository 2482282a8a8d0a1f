import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { parseListParams } from '@/lib/catalog/list-params';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { doiUrl } from '@/lib/catalog/doi';
import { formatAuthors } from '@/lib/citations/authors';
import { EXPORT_FORMAT_NAMES, EXPORT_FORMATS } from '@/lib/citations/formats';
import { findDoiDuplicates, listSources } from '@/db/queries/sources';
import { buttonClass } from '@/components/ui/button';
import { Panel } from '@/components/ui/panel';
import { SourcesTable } from './_components/sources-table';
import { ReferencesImportForm } from './_components/references-import-form';
import { MergeSourcesForm } from './_components/merge-sources-form';

export const metadata: Metadata = { title: 'Sources' };

export default async function SourcesPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'sources:read');
  const list = parseListParams(await searchParams);
  const { rows, total, sort } = await listSources(ctx.workspace.id, list);
  const slug = ctx.workspace.slug;
  const canCreate = roleCan(ctx.role, 'sources:create');
  const canMerge = roleCan(ctx.role, 'sources:retract');
  const duplicates = await findDoiDuplicates(ctx.workspace.id);
  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h1>Sources</h1>
          <p className="text-sm text-ink-muted">Every measured and computed value cites one: a paper, a data set, a thesis or an in-house notebook.</p>
        </div>
        <div className="flex gap-2">
          {EXPORT_FORMAT_NAMES.map((f) => (
            <a key={f} href={`/api/workspaces/${ctx.workspace.id}/sources/export?format=${f}`} className={buttonClass('secondary', 'no-underline')} download>
              Export {EXPORT_FORMATS[f].label}
            </a>
          ))}
          {canCreate && (
            <Link href={`/w/${slug}/sources/new`} className={buttonClass('primary', 'no-underline')}>
              New source
            </Link>
          )}
        </div>
      </header>
      <SourcesTable
        slug={slug}
        rows={rows.map(({ retractedAt, authorList, ...r }) => ({
          ...r,
          authors: formatAuthors(authorList, 3),
          allAuthors: formatAuthors(authorList),
          journal: [r.venue, r.volume].filter(Boolean).join(' ') || null,
          kindLabel: SOURCE_KIND_LABELS[r.kind],
          doiHref: r.doi ? doiUrl(r.doi) : null,
          retracted: Boolean(retractedAt),
        }))}
        rowCount={total}
        state={{ page: list.page, size: list.size, sort, dir: list.dir }}
      />
      {duplicates.length > 0 && (
        <Panel title={`Sources sharing a DOI (${duplicates.length})`} className="max-w-3xl">
          {canMerge ? (
            <div className="space-y-3">
              {duplicates.map((d) => (
                <MergeSourcesForm key={d.doi} workspaceId={ctx.workspace.id} doi={d.doi} candidates={d.sources} />
              ))}
            </div>
          ) : (
            <ul className="list-disc pl-5 text-sm" data-testid="doi-duplicate">
              {duplicates.map((d) => (
                <li key={d.doi}>
                  <span className="font-mono">{d.doi}</span>: {d.sources.map((s) => s.citeKey).join(', ')} — a curator or owner can merge them.
                </li>
              ))}
            </ul>
          )}
        </Panel>
      )}
      {canCreate && (
        <Panel title="Import references" className="max-w-3xl">
          <ReferencesImportForm workspaceId={ctx.workspace.id} />
        </Panel>
      )}
    </div>
  );
}
