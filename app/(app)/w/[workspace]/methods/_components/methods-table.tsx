'use client';
import { useMemo } from 'react';
import Link from 'next/link';
import { DataTable, type DataTableState } from '@/components/data-table/data-table';
import { DataTableToolbar } from '@/components/data-table/data-table-toolbar';
import { createDataColumnHelper } from '@/components/data-table/features';

export interface MethodRow {
  id: string;
  label: string;
  functional: string;
  dispersion: string | null;
  pseudopotential: string | null;
  cutoffEv: number | null;
  kGrid: string;
  qGrid: string;
  approach: string;
  lotoCorrection: string;
  calculationCount: number;
  retracted: boolean;
}

const helper = createDataColumnHelper<MethodRow>();

function columnsFor(slug: string) {
  return helper.columns([
    helper.accessor('label', {
      header: 'Label',
      cell: (c) => (
        <Link href={`/w/${slug}/methods/${c.row.original.id}`} className="font-medium">
          {c.getValue()}
        </Link>
      ),
    }),
    helper.accessor('functional', { header: 'Functional' }),
    helper.accessor('dispersion', { header: 'Dispersion', enableSorting: false, cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('pseudopotential', { header: 'Pseudopotentials', cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('cutoffEv', { header: 'Cutoff (eV)', meta: { numeric: true }, cell: (c) => c.getValue() ?? '–' }),
    helper.accessor('kGrid', { header: 'k-grid', enableSorting: false, meta: { numeric: true } }),
    helper.accessor('qGrid', { header: 'q-grid', enableSorting: false, meta: { numeric: true } }),
    helper.accessor('approach', { header: 'Approach' }),
    helper.accessor('lotoCorrection', { header: 'LO–TO', enableSorting: false }),
    helper.accessor('calculationCount', { header: 'Calculations', enableSorting: false, meta: { numeric: true } }),
  ]);
}

export function MethodsTable({ slug, rows, rowCount, state }: { slug: string; rows: MethodRow[]; rowCount: number; state: DataTableState }) {
  const columns = useMemo(() => columnsFor(slug), [slug]);
  return (
    <div className="space-y-3">
      <DataTableToolbar search="Label, functional, pseudopotentials or notes" />
      <DataTable
        caption="Methods"
        columns={columns}
        data={rows}
        rowCount={rowCount}
        state={state}
        rowClassName={(r) => (r.retracted ? 'text-ink-faint line-through decoration-ink-faint/40' : '')}
        emptyMessage="No method meets these conditions. Reset them, or add the recipe your calculations used."
      />
    </div>
  );
}
