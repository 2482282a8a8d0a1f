'use client';
import { useMemo, useRef } from 'react';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useTable, type ColumnDef, type PaginationState, type SortingState, type Updater } from '@tanstack/react-table';
import { dataTableFeatures, type DataTableFeatures } from './features';
import { DataTablePagination } from './data-table-pagination';
import { useListUrl } from './use-list-url';
import { useHiddenContent } from '@/components/ui/scroll-region';

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
  const moreToTheRight = useHiddenContent(scrollRef).right;

  return (
    <div className="relative space-y-2" aria-busy={pending}>
      {moreToTheRight && (
        <div aria-hidden className="pointer-events-none absolute top-0 right-0 z-20 flex h-9 items-center rounded-tr-md bg-gradient-to-l from-panel via-panel/90 to-transparent pr-2 pl-8 text-[11px] font-medium text-accent" data-testid="scroll-cue">
          more columns →
        </div>
      )}
      <div ref={scrollRef} role="region" aria-label={caption ?? 'Table'} tabIndex={0} className={`overflow-auto rounded-md border border-rule-strong bg-panel ${virtual ? 'max-h-[70vh]' : ''} ${pending ? 'opacity-70' : ''}`}>
        <table className="w-full border-collapse text-sm">
          {caption && <caption className="sr-only">{caption}</caption>}
          <thead className="sticky top-0 z-10 bg-panel text-left text-[11px] uppercase tracking-wider text-ink-muted shadow-[inset_0_-2px_0_var(--color-ink)]">
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
                      className={`whitespace-nowrap px-3 py-2 font-semibold ${meta?.numeric ? 'text-right' : ''} ${sorted ? 'text-ink' : ''}`}
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          title={sorted === 'asc' ? 'Sorted, smallest first; click for largest first' : sorted === 'desc' ? 'Sorted, largest first; click for smallest first' : 'Click to sort by this column'}
                          className={`inline-flex items-baseline gap-1 uppercase tracking-wider underline decoration-dotted decoration-ink-faint underline-offset-4 hover:text-ink ${meta?.numeric ? 'flex-row-reverse' : ''}`}
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden className={`num normal-case ${sorted ? 'text-accent' : 'invisible'}`}>
                            {sorted === 'desc' ? '↓' : '↑'}
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
          <tbody className="divide-y divide-rule/70">
            {rows.length === 0 && (
              <tr>
                <td colSpan={columnCount} className="px-3 py-8 text-center text-ink-muted">
                  {emptyMessage ?? 'No row meets these conditions.'}
                </td>
              </tr>
            )}
            {padTop > 0 && (
              <tr aria-hidden>
                <td colSpan={columnCount} style={{ height: padTop, padding: 0 }} />
              </tr>
            )}
            {visible.map((row) => (
              <tr key={row.id} className={`even:bg-paper/70 hover:bg-accent-soft/50 ${rowClassName?.(row.original) ?? ''}`} style={virtual ? { height: ROW_HEIGHT } : undefined}>
                {row.getAllCells().map((cell) => {
                  const meta = cell.column.columnDef.meta;
                  const sortedColumn = cell.column.getIsSorted() !== false;
                  return (
                    <td key={cell.id} className={`whitespace-nowrap px-3 py-1.5 ${meta?.numeric ? 'num text-right' : ''} ${sortedColumn ? 'bg-accent-soft/25' : ''} ${meta?.className ?? ''}`}>
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
