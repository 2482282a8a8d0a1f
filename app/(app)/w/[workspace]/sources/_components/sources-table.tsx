'use client';
import { useMemo } from 'react';
import Link from 'next/link';
import { DataTable, type DataTableState } from '@/components/data-table/data-table';
import { DataTableToolbar } from '@/components/data-table/data-table-toolbar';
import { createDataColumnHelper } from '@/components/data-table/features';
import { IncompleteMark } from '@/components/citations/incomplete-mark';

export interface SourceRow {
  id: string;
  citeKey: string;
  kind: string;
  kindLabel: string;
  doi: string | null;
  doiHref: string | null;
  title: string | null;
  /** The one display format, at most three names. */
  authors: string;
  allAuthors: string;
  year: number | null;
  /** Journal and volume, e.g. "Phys. Rev. 155". */
  journal: string | null;
  gaps: string[];
  notebookRef: string | null;
  valueCount: number;
  retracted: boolean;
}

const helper = createDataColumnHelper<SourceRow>();

function columnsFor(slug: string) {
  return helper.columns([
    helper.accessor('citeKey', {
      header: 'Cite key',
      cell: (c) => (
        <>
          <Link href={`/w/${slug}/sources/${c.row.original.id}`} className="font-medium">
            {c.getValue()}
          </Link>
          <IncompleteMark gaps={c.row.original.gaps} />
        </>
      ),
    }),
    helper.accessor('kind', { header: 'Kind', cell: (c) => c.row.original.kindLabel }),
    helper.accessor('year', { header: 'Year', meta: { numeric: true }, cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('title', {
      header: 'Title',
      meta: { className: 'max-w-md truncate' },
      cell: (c) => <span title={c.getValue() ?? undefined}>{c.getValue() ?? c.row.original.notebookRef ?? ''}</span>,
    }),
    helper.accessor('authors', { header: 'Authors', meta: { className: 'max-w-xs truncate' }, cell: (c) => <span title={c.row.original.allAuthors || undefined}>{c.getValue()}</span> }),
    helper.accessor('journal', { id: 'venue', header: 'Journal', cell: (c) => c.getValue() ?? '' }),
    helper.accessor('doi', {
      header: 'DOI',
      enableSorting: false,
      cell: (c) =>
        c.row.original.doiHref ? (
          <a href={c.row.original.doiHref} target="_blank" rel="noreferrer noopener">
            {c.getValue()}
          </a>
        ) : (
          ''
        ),
    }),
    helper.accessor('valueCount', { header: 'Values', enableSorting: false, meta: { numeric: true } }),
  ]);
}

export function SourcesTable({ slug, rows, rowCount, state }: { slug: string; rows: SourceRow[]; rowCount: number; state: DataTableState }) {
  const columns = useMemo(() => columnsFor(slug), [slug]);
  return (
    <div className="space-y-3">
      <DataTableToolbar search="Cite key, title, author, DOI or notebook" />
      <DataTable
        caption="Sources"
        columns={columns}
        data={rows}
        rowCount={rowCount}
        state={state}
        rowClassName={(r) => (r.retracted ? 'text-ink-faint line-through decoration-ink-faint/40' : '')}
        emptyMessage="No source meets these conditions. Reset them, add a source, or import a .bib file."
      />
    </div>
  );
}
