'use client';
import { useMemo, useRef } from 'react';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useTable, type ColumnDef, type PaginationState, type SortingState, type Updater } from '@tanstack/react-table';
import { dataTableFeatures, type DataTableFeatures } from './features';
import { DataTablePagination } from './data-table-pagination';
import { useListUrl } from './use-list-url';

export interface DataTableState {
  page: number;
  size: number;
  sort: string;
  dir: 'asc' | 'desc';
}

export interface DataTableProps<TData extends { id: string }> {
  columns: ColumnDef<DataTableFeatures, TData>[];
  data: TData[];
  /** Rows matching the filter across all pages. */
  rowCount: number;
  state: DataTableState;
  pageSizes?: readonly number[];
  emptyMessage?: React.ReactNode;
  /** Classes for a whole row (e.g. muted for retracted records). */
  rowClassName?: (row: TData) => string;
  caption?: string;
}

/** Above this many rows on a page only the visible ones are rendered. */
const VIRTUALISE_FROM = 100;
const ROW_HEIGHT = 33;

function resolve<T>(updater: Updater<T>, current: T): T {
  return typeof updater === 'function' ? (updater as (old: T) => T)(current) : updater;
}

/**
 * A server-driven table: the page, sort and filter live in the URL, the server
 * returns one page, and this component renders it (virtualised for large pages).
 */
export function DataTable<TData extends { id: string }>({ columns, data, rowCount, state, pageSizes = [50, 200, 1000], emptyMessage, rowClassName, caption }: DataTableProps<TData>) {
  const { update, pending } = useListUrl();
  const sorting = useMemo<SortingState>(() => [{ id: state.sort, desc: state.dir === 'desc' }], [state.sort, state.dir]);
  const pagination = useMemo<PaginationState>(() => ({ pageIndex: state.page - 1, pageSize: state.size }), [state.page, state.size]);

  const table = useTable({
    features: dataTableFeatures,
    columns,
    data,
    getRowId: (row) => row.id,
    state: { sorting, pagination },
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    rowCount,
    onSortingChange: (updater) => {
      const next = resolve(updater, sorting)[0];
      if (next) update({ sort: next.id, dir: next.desc ? 'desc' : 'asc' });
    },
    onPaginationChange: (updater) => {
      const next = resolve(updater, pagination);
      if (next.pageSize !== pagination.pageSize) update({ size: String(next.pageSize) });
      else update({ page: String(next.pageIndex + 1) });
    },
  });

  const rows = table.getRowModel().rows;
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtual = rows.length > VIRTUALISE_FROM;
  // eslint-disable-next-line react-hooks/incompatible-library -- the virtualizer is read during this render only
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 12,
    enabled: virtual,
  });
  const items = virtual ? virtualizer.getVirtualItems() : null;
  const padTop = items?.length ? items[0].start : 0;
  const padBottom = items?.length ? virtualizer.getTotalSize() - items[items.length - 1].end : 0;
  const visible = items ? items.map((i) => rows[i.index]) : rows;
  const columnCount = table.getAllLeafColumns().length;

  return (
    <div className="space-y-2" aria-busy={pending}>
      <div ref={scrollRef} role="region" aria-label={caption ?? 'Table'} tabIndex={0} className={`overflow-auto rounded-lg border border-rule bg-panel ${virtual ? 'max-h-[70vh]' : ''} ${pending ? 'opacity-70' : ''}`}>
        <table className="w-full border-collapse text-sm">
          {caption && <caption className="sr-only">{caption}</caption>}
          <thead className="sticky top-0 z-10 bg-panel text-left text-xs text-ink-muted shadow-[inset_0_-1px_0_var(--color-rule)]">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const meta = header.column.columnDef.meta;
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={`whitespace-nowrap px-3 py-2 font-medium ${meta?.numeric ? 'text-right' : ''}`}
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-ink">
                          <table.FlexRender header={header} />
                          <span aria-hidden className="text-[10px]">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-rule">
            {rows.length === 0 && (
              <tr>
                <td colSpan={columnCount} className="px-3 py-8 text-center text-ink-muted">
                  {emptyMessage ?? 'Nothing matches.'}
                </td>
              </tr>
            )}
            {padTop > 0 && (
              <tr aria-hidden>
                <td colSpan={columnCount} style={{ height: padTop, padding: 0 }} />
              </tr>
            )}
            {visible.map((row) => (
              <tr key={row.id} className={`hover:bg-paper ${rowClassName?.(row.original) ?? ''}`} style={virtual ? { height: ROW_HEIGHT } : undefined}>
                {row.getAllCells().map((cell) => {
                  const meta = cell.column.columnDef.meta;
                  return (
                    <td key={cell.id} className={`whitespace-nowrap px-3 py-1.5 ${meta?.numeric ? 'num text-right' : ''} ${meta?.className ?? ''}`}>
                      <table.FlexRender cell={cell} />
                    </td>
                  );
                })}
              </tr>
            ))}
            {padBottom > 0 && (
              <tr aria-hidden>
                <td colSpan={columnCount} style={{ height: padBottom, padding: 0 }} />
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <DataTablePagination
        page={state.page}
        pageCount={Math.max(1, table.getPageCount())}
        rowCount={rowCount}
        size={state.size}
        pageSizes={pageSizes}
        onPage={(p) => table.setPageIndex(p - 1)}
        onSize={(s) => table.setPageSize(s)}
      />
    </div>
  );
}
