'use client';
import { useEffect, useState } from 'react';
import { inputClass } from '@/components/ui/field';
import { useListUrl } from './use-list-url';

export interface ToolbarFilter {
  /** URL parameter, e.g. "tag". */
  param: string;
  label: string;
  options: Array<{ value: string; label: string }>;
}

/** Text filter (debounced), select filters and the "show retracted" toggle, all kept in the URL. */
export function DataTableToolbar({ placeholder = 'Filter…', filters = [], retractedToggle = true }: { placeholder?: string; filters?: ToolbarFilter[]; retractedToggle?: boolean }) {
  const { searchParams, update } = useListUrl();
  const urlQ = searchParams.get('q') ?? '';
  const [q, setQ] = useState(urlQ);
  const [lastUrlQ, setLastUrlQ] = useState(urlQ);
  if (urlQ !== lastUrlQ) {
    setLastUrlQ(urlQ);
    setQ(urlQ);
  }

  useEffect(() => {
    if (q === urlQ) return;
    const t = setTimeout(() => update({ q }), 300);
    return () => clearTimeout(t);
  }, [q, urlQ, update]);

  return (
    <div className="flex flex-wrap items-end gap-3" role="search">
      <label className="min-w-56 flex-1 text-xs text-ink-muted">
        <span className="sr-only">Filter</span>
        <input type="search" className={inputClass} placeholder={placeholder} value={q} onChange={(e) => setQ(e.target.value)} />
      </label>
      {filters.map((f) => (
        <label key={f.param} className="text-xs text-ink-muted">
          <span className="mb-1 block">{f.label}</span>
          <select className={inputClass} value={searchParams.get(f.param) ?? ''} onChange={(e) => update({ [f.param]: e.target.value })}>
            <option value="">All</option>
            {f.options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
        </label>
      ))}
      {retractedToggle && (
        <label className="flex items-center gap-1.5 pb-1.5 text-xs text-ink-muted">
          <input type="checkbox" checked={searchParams.get('retracted') === '1'} onChange={(e) => update({ retracted: e.target.checked ? '1' : null })} />
          Show retracted
        </label>
      )}
    </div>
  );
}
