'use client';
import type { ColumnDef } from '@/lib/import/columns';
import type { ColumnMapping } from '@/lib/import/header';
import { inputClass } from '@/components/ui/field';

/** One select per column of the template: which file column holds it (or none). */
export function ColumnMappingForm({
  columns,
  headers,
  mapping,
  onChange,
  disabled,
}: {
  columns: readonly ColumnDef[];
  headers: string[];
  mapping: ColumnMapping;
  onChange: (next: ColumnMapping) => void;
  disabled?: boolean;
}) {
  return (
    <div className="grid gap-x-4 gap-y-2 sm:grid-cols-2 lg:grid-cols-3">
      {columns.map((c) => {
        const id = `map-${c.key}`;
        const value = mapping[c.key] ?? '';
        return (
          <div key={c.key} className="space-y-0.5">
            <label htmlFor={id} className="block text-xs font-medium text-ink" title={c.description}>
              <span className="font-mono">{c.key}</span>
              {c.required && <span className="text-bad"> *</span>}
            </label>
            <select
              id={id}
              className={inputClass}
              value={value}
              disabled={disabled}
              aria-invalid={c.required && !value ? true : undefined}
              onChange={(e) => onChange({ ...mapping, [c.key]: e.target.value === '' ? null : e.target.value })}
            >
              <option value="">— not in the file —</option>
              {headers.map((h, i) => (
                <option key={`${h}-${i}`} value={h}>
                  {h}
                </option>
              ))}
            </select>
          </div>
        );
      })}
    </div>
  );
}
