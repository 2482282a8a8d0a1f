'use client';
import { Button } from '@/components/ui/button';

const count = new Intl.NumberFormat('en-GB');

export function DataTablePagination({
  page,
  pageCount,
  rowCount,
  size,
  pageSizes,
  onPage,
  onSize,
}: {
  page: number;
  pageCount: number;
  rowCount: number;
  size: number;
  pageSizes: readonly number[];
  onPage: (page: number) => void;
  onSize: (size: number) => void;
}) {
  const first = rowCount === 0 ? 0 : (page - 1) * size + 1;
  const last = Math.min(page * size, rowCount);
  return (
    <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-3 text-xs text-ink-muted">
      <p className="num">
        {count.format(first)}–{count.format(last)} of {count.format(rowCount)}
      </p>
      <div className="flex items-center gap-2">
        <label className="flex items-center gap-1">
          Rows per page
          <select className="rounded border border-rule-strong bg-panel px-1.5 py-0.5 text-xs" value={size} onChange={(e) => onSize(Number(e.target.value))}>
            {pageSizes.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </label>
        <Button variant="ghost" type="button" onClick={() => onPage(1)} disabled={page <= 1} aria-label="First page">
          «
        </Button>
        <Button variant="ghost" type="button" onClick={() => onPage(page - 1)} disabled={page <= 1} aria-label="Previous page">
          ‹
        </Button>
        <span className="num">
          Page {count.format(page)} of {count.format(pageCount)}
        </span>
        <Button variant="ghost" type="button" onClick={() => onPage(page + 1)} disabled={page >= pageCount} aria-label="Next page">
          ›
        </Button>
        <Button variant="ghost" type="button" onClick={() => onPage(pageCount)} disabled={page >= pageCount} aria-label="Last page">
          »
        </Button>
      </div>
    </nav>
  );
}
