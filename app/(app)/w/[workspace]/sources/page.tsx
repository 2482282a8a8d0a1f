import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { parseListParams } from '@/lib/catalog/list-params';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { doiUrl } from '@/lib/catalog/doi';
import { listSources } from '@/db/queries/sources';
import { buttonClass } from '@/components/ui/button';
import { Panel } from '@/components/ui/panel';
import { SourcesTable } from './_components/sources-table';
import { BibtexImportForm } from './_components/bibtex-import-form';

export const metadata: Metadata = { title: 'Sources' };

export default async function SourcesPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'sources:read');
  const list = parseListParams(await searchParams);
  const { rows, total, sort } = await listSources(ctx.workspace.id, list);
  const slug = ctx.workspace.slug;
  const canCreate = roleCan(ctx.role, 'sources:create');
  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h1>Sources</h1>
          <p className="text-sm text-ink-muted">Every measured and computed value cites one: a paper, a data set, a thesis or an in-house notebook.</p>
        </div>
        <div className="flex gap-2">
          <a href={`/api/workspaces/${ctx.workspace.id}/sources/bibtex`} className={buttonClass('secondary', 'no-underline')} download>
            Export BibTeX
          </a>
          {canCreate && (
            <Link href={`/w/${slug}/sources/new`} className={buttonClass('primary', 'no-underline')}>
              New source
            </Link>
          )}
        </div>
      </header>
      <SourcesTable
        slug={slug}
        rows={rows.map(({ retractedAt, ...r }) => ({ ...r, kindLabel: SOURCE_KIND_LABELS[r.kind], doiHref: r.doi ? doiUrl(r.doi) : null, retracted: Boolean(retractedAt) }))}
        rowCount={total}
        state={{ page: list.page, size: list.size, sort, dir: list.dir }}
      />
      {canCreate && (
        <Panel title="Import BibTeX" className="max-w-3xl">
          <BibtexImportForm workspaceId={ctx.workspace.id} />
        </Panel>
      )}
    </div>
  );
}
