'use client';
import { useEffect, useState } from 'react';
import { inputClass } from '@/components/ui/field';
import { useListUrl } from '@/components/data-table/use-list-url';

/** A debounced text filter kept in one URL parameter (beside the toolbar's own filters). */
export function UrlTextFilter({ param, label, placeholder }: { param: string; label: string; placeholder?: string }) {
  const { searchParams, update } = useListUrl();
  const urlValue = searchParams.get(param) ?? '';
  const [value, setValue] = useState(urlValue);
  const [lastUrlValue, setLastUrlValue] = useState(urlValue);
  if (urlValue !== lastUrlValue) {
    setLastUrlValue(urlValue);
    setValue(urlValue);
  }

  useEffect(() => {
    if (value.trim() === urlValue) return;
    const t = setTimeout(() => update({ [param]: value.trim() }), 300);
    return () => clearTimeout(t);
  }, [value, urlValue, param, update]);

  return (
    <label className="text-xs text-ink-muted">
      <span className="mb-1 block">{label}</span>
      <input type="search" className={`${inputClass} w-40`} placeholder={placeholder} value={value} onChange={(e) => setValue(e.target.value)} />
    </label>
  );
}
