import type { ReactNode } from 'react';

/** A record's fields as a labelled grid (detail pages). */
export function FieldList({ fields, columns = 'sm:grid-cols-2 lg:grid-cols-4' }: { fields: ReadonlyArray<readonly [string, ReactNode]>; columns?: string }) {
  return (
    <dl className={`grid gap-x-6 gap-y-2 text-sm ${columns}`}>
      {fields.map(([label, value]) => (
        <div key={label}>
          <dt className="text-xs text-ink-muted">{label}</dt>
          <dd className="break-words">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
