'use client';
import { useState } from 'react';
import { count } from '@/lib/format';

const step = 'rounded px-2 py-0.5 font-medium text-accent hover:bg-accent-soft disabled:cursor-default disabled:text-ink-faint disabled:hover:bg-transparent';

/** Where the reader is in a long list: the rows shown, how many per page, and a page to go to. */
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
  const [typed, setTyped] = useState<string | null>(null);
  const go = () => {
    const n = Number(typed);
    setTyped(null);
    if (Number.isInteger(n) && n >= 1 && n <= pageCount && n !== page) onPage(n);
  };
  return (
    <nav aria-label="Pages of the list" className="flex flex-wrap items-center justify-between gap-x-6 gap-y-2 border-t border-rule pt-2 text-xs text-ink-muted">
      <p className="num" data-testid="rows-shown">
        {rowCount === 0 ? 'No rows' : <>Rows {count(first)} to {count(last)} of {count(rowCount)}</>}
      </p>
      <div className="flex flex-wrap items-center gap-x-5 gap-y-2">
        <div className="flex items-center gap-1" role="group" aria-label="Rows per page">
          <span>Show</span>
          {pageSizes.map((s) => (
            <button key={s} type="button" aria-pressed={s === size} onClick={() => s !== size && onSize(s)} className={`num rounded px-1.5 py-0.5 ${s === size ? 'bg-ink text-white' : 'text-accent hover:bg-accent-soft'}`}>
              {count(s)}
            </button>
          ))}
          <span>at a time</span>
        </div>
        {pageCount > 1 && (
          <div className="flex items-center gap-1.5">
            <button type="button" className={step} onClick={() => onPage(page - 1)} disabled={page <= 1}>
              ← Earlier
            </button>
            <label className="num flex items-center gap-1">
              page
              <input
                className="w-12 rounded border border-rule-strong bg-panel px-1 py-0.5 text-center text-xs text-ink"
                inputMode="numeric"
                aria-label={`Page number, 1 to ${pageCount}`}
                value={typed ?? String(page)}
                onChange={(e) => setTyped(e.target.value)}
                onBlur={go}
                onKeyDown={(e) => e.key === 'Enter' && go()}
              />
              of {count(pageCount)}
            </label>
            <button type="button" className={step} onClick={() => onPage(page + 1)} disabled={page >= pageCount}>
              Later →
            </button>
          </div>
        )}
      </div>
    </nav>
  );
}
