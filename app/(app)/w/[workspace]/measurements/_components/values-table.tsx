'use client';
import { useMemo } from 'react';
import Link from 'next/link';
import { IncompleteMark } from '@/components/citations/incomplete-mark';
import { DataTable, type DataTableState } from '@/components/data-table/data-table';
import { DataTableToolbar, type ToolbarFilter } from '@/components/data-table/data-table-toolbar';
import { createDataColumnHelper } from '@/components/data-table/features';
import type { ValueRow } from './value-row';
import { asEntered, CANONICAL_UNIT_SYMBOL, unitSymbol } from '@/lib/format';

/** Canonical unit codes: a value typed in them is shown exactly as typed. */
const CANONICAL_CODE: Record<string, string> = { frequency: 'cm-1', entropy: 'J/mol/K', 'heat-capacity': 'J/mol/K', 'eps-inf': '1', 'eps-static': '1', 'born-charge': 'e' };

const helper = createDataColumnHelper<ValueRow>();
const dash = (v: string | number | null | undefined) => (v === null || v === undefined || v === '' ? '–' : v);

function columnsFor(slug: string, kind: 'measurements' | 'calculations') {
  const base = `/w/${slug}`;
  const entity = kind === 'measurements' ? 'measurement' : 'calculation';
  const kindColumns =
    kind === 'measurements'
      ? helper.columns([
          helper.accessor('technique', { id: 'technique', header: 'Technique', enableSorting: false, cell: (c) => dash(c.getValue()) }),
          helper.accessor('sampleForm', { id: 'sampleForm', header: 'Sample', enableSorting: false, cell: (c) => dash(c.getValue()) }),
        ])
      : helper.columns([
          helper.accessor('methodLabel', {
            id: 'method',
            header: 'Method',
            cell: (c) => <Link href={`${base}/methods/${c.row.original.methodId}`}>{c.getValue()}</Link>,
          }),
          helper.accessor('modeIndex', { id: 'modeIndex', header: 'Mode', enableSorting: false, meta: { numeric: true }, cell: (c) => dash(c.getValue()) }),
        ]);
  const head = helper.columns([
    helper.accessor('materialName', {
      id: 'material',
      header: 'Material',
      cell: (c) => (
        <Link href={`${base}/materials/${c.row.original.materialId}`} className="font-medium">
          {c.getValue()}
        </Link>
      ),
    }),
    helper.accessor('quantity', { id: 'quantity', header: 'Quantity', enableSorting: false }),
    helper.accessor('valueText', {
      id: 'entered',
      header: 'As entered',
      enableSorting: false,
      meta: { numeric: true },
      cell: (c) => (
        <span title={`${c.getValue()} ${c.row.original.unit} as entered`}>
          {c.getValue()} <span className="text-ink-muted">{unitSymbol(c.row.original.unit)}</span>
        </span>
      ),
    }),
    helper.accessor('value', {
      id: 'value',
      header: 'Stored (canonical unit)',
      meta: { numeric: true },
      cell: (c) => {
        const r = c.row.original;
        return (
          <span className={c.getValue() < 0 ? 'text-bad' : ''}>
            {asEntered(c.getValue(), r.valueText, CANONICAL_CODE[r.quantity] === r.unit)} <span className="text-ink-muted">{CANONICAL_UNIT_SYMBOL[r.quantity] ?? ''}</span>
          </span>
        );
      },
    }),
    helper.accessor('uncertaintyText', {
      id: 'uncertainty',
      header: '± (as entered)',
      enableSorting: false,
      meta: { numeric: true },
      cell: (c) => dash(c.getValue() ?? c.row.original.uncertainty),
    }),
    helper.accessor('temperatureK', { id: 'temperature', header: 'T (K)', meta: { numeric: true }, cell: (c) => dash(c.getValue()) }),
    helper.accessor('irrep', { id: 'irrep', header: 'Irrep', enableSorting: false, cell: (c) => dash(c.getValue()) }),
    helper.accessor('branch', { id: 'branch', header: 'Branch', enableSorting: false, cell: (c) => dash(c.getValue()) }),
    helper.accessor('activity', { id: 'activity', header: 'Activity', enableSorting: false, cell: (c) => dash(c.getValue()) }),
  ]);
  const tail = helper.columns([
    helper.accessor('citeKey', {
      id: 'source',
      header: 'Source',
      enableSorting: false,
      cell: (c) => (
        <>
          <Link href={`${base}/sources/${c.row.original.sourceId}`}>{c.getValue()}</Link>
          <IncompleteMark gaps={c.row.original.sourceGaps} />
        </>
      ),
    }),
    helper.accessor('importId', {
      id: 'import',
      header: 'Import',
      enableSorting: false,
      cell: (c) => {
        const id = c.getValue();
        return id ? (
          <Link href={`${base}/imports/${id}`} className="font-mono text-xs" title={id}>
            {id.slice(0, 8)}
          </Link>
        ) : (
          <span className="text-ink-faint">manual</span>
        );
      },
    }),
    helper.accessor('contributorName', { id: 'contributor', header: 'Contributor', enableSorting: false, cell: (c) => dash(c.getValue()) }),
    helper.accessor('created', { id: 'created', header: 'Created', meta: { className: 'text-ink-muted' } }),
    helper.display({
      id: 'history',
      header: () => <span className="sr-only">History</span>,
      cell: (c) => <Link href={`${base}/history/${entity}/${c.row.original.id}`}>History</Link>,
    }),
  ]);
  return [...head, ...kindColumns, ...tail];
}

export interface ValuesTableProps {
  slug: string;
  kind: 'measurements' | 'calculations';
  rows: ValueRow[];
  rowCount: number;
  state: DataTableState;
  /** Select filters: quantity, and technique (measurements) or method (calculations). */
  filters: ToolbarFilter[];
}

/** The server-paged table of measurements or calculations with its filters. */
export function ValuesTable({ slug, kind, rows, rowCount, state, filters }: ValuesTableProps) {
  const columns = useMemo(() => columnsFor(slug, kind), [slug, kind]);
  return (
    <div className="space-y-3">
      <DataTableToolbar
        search="Material name"
        filters={filters}
        texts={[
          { param: 'source', label: 'source cite key contains', placeholder: 'e.g. azuhata' },
          { param: 'import', label: 'import id is', placeholder: 'exact id' },
        ]}
      />
      <DataTable
        caption={kind === 'measurements' ? 'Measurements' : 'Calculations'}
        columns={columns}
        data={rows}
        rowCount={rowCount}
        state={state}
        rowClassName={(r) => (r.retracted ? 'text-ink-faint line-through decoration-ink-faint/40' : '')}
        emptyMessage={`No ${kind === 'measurements' ? 'measurement' : 'calculation'} meets these conditions. Reset them, add one, or import a file on the Imports page.`}
      />
    </div>
  );
}
