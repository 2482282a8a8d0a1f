'use client';
import { useMemo } from 'react';
import Link from 'next/link';
import { DataTable, type DataTableState } from '@/components/data-table/data-table';
import { DataTableToolbar, type ToolbarFilter } from '@/components/data-table/data-table-toolbar';
import { createDataColumnHelper } from '@/components/data-table/features';

export interface MaterialRow {
  id: string;
  name: string;
  displayName: string | null;
  reducedFormula: string;
  atomsPerFormulaUnit: number;
  spaceGroup: number | null;
  crystalSystem: string | null;
  atomsInCell: number | null;
  tags: string[];
  measurementCount: number;
  calculationCount: number;
  retracted: boolean;
}

const helper = createDataColumnHelper<MaterialRow>();

function columnsFor(slug: string) {
  return helper.columns([
    helper.accessor('name', {
      header: 'Name',
      cell: (c) => (
        <Link href={`/w/${slug}/materials/${c.row.original.id}`} className="font-medium">
          {c.getValue()}
        </Link>
      ),
    }),
    helper.accessor('displayName', { header: 'Display name', enableSorting: false, cell: (c) => c.getValue() ?? '' }),
    helper.accessor('reducedFormula', { header: 'Formula' }),
    helper.accessor('atomsPerFormulaUnit', { header: 'Atoms/f.u.', enableSorting: false, meta: { numeric: true } }),
    helper.accessor('spaceGroup', { header: 'Space group', meta: { numeric: true }, cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('crystalSystem', { header: 'Crystal system', cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('atomsInCell', { header: 'Atoms in cell', meta: { numeric: true }, cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('tags', {
      header: 'Classes',
      enableSorting: false,
      cell: (c) => (
        <span className="flex gap-1">
          {c.getValue().map((t) => (
            <span key={t} className="rounded bg-accent-soft px-1.5 text-xs text-accent-strong">
              {t}
            </span>
          ))}
        </span>
      ),
    }),
    helper.accessor('measurementCount', { header: 'Measured', enableSorting: false, meta: { numeric: true } }),
    helper.accessor('calculationCount', { header: 'Computed', enableSorting: false, meta: { numeric: true } }),
  ]);
}

export function MaterialsTable({ slug, rows, rowCount, state, tags, systems }: { slug: string; rows: MaterialRow[]; rowCount: number; state: DataTableState; tags: string[]; systems: readonly string[] }) {
  const columns = useMemo(() => columnsFor(slug), [slug]);
  const filters: ToolbarFilter[] = [
    { param: 'tag', label: 'Class', options: tags.map((t) => ({ value: t, label: t })) },
    { param: 'system', label: 'Crystal system', options: systems.map((s) => ({ value: s, label: s })) },
  ];
  return (
    <div className="space-y-3">
      <DataTableToolbar search="Name, formula or external id" filters={filters} />
      <DataTable
        caption="Materials"
        columns={columns}
        data={rows}
        rowCount={rowCount}
        state={state}
        rowClassName={(r) => (r.retracted ? 'text-ink-faint line-through decoration-ink-faint/40' : '')}
        emptyMessage="No material meets these conditions. Reset them, or add a material."
      />
    </div>
  );
}
