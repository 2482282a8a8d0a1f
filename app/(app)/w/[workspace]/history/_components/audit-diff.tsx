type Snapshot = Record<string, unknown> | null;

function asSnapshot(value: unknown): Snapshot {
  return value && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : null;
}

function show(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (Array.isArray(value)) return value.length ? value.map(show).join(', ') : '—';
  if (typeof value === 'object') return JSON.stringify(value);
  return String(value);
}

/** "spaceGroup" → "space group", "kGrid" → "k grid". */
function fieldLabel(key: string): string {
  return key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
}

/** The fields that changed between two audit snapshots (all fields of a creation). */
export function changedFields(before: unknown, after: unknown): Array<{ field: string; before: string; after: string }> {
  const b = asSnapshot(before);
  const a = asSnapshot(after);
  const keys = [...new Set([...Object.keys(b ?? {}), ...Object.keys(a ?? {})])];
  return keys
    .filter((k) => JSON.stringify(b?.[k] ?? null) !== JSON.stringify(a?.[k] ?? null))
    .map((k) => ({ field: fieldLabel(k), before: b ? show(b[k]) : '', after: a ? show(a[k]) : '' }));
}

export function AuditDiff({ before, after }: { before: unknown; after: unknown }) {
  const rows = changedFields(before, after);
  if (rows.length === 0) return <p className="text-xs text-ink-faint">No field changed.</p>;
  const creation = before == null;
  return (
    <table className="w-full text-xs">
      <thead className="text-left text-ink-muted">
        <tr>
          <th className="py-0.5 pr-3 font-medium">Field</th>
          {!creation && <th className="py-0.5 pr-3 font-medium">Before</th>}
          <th className="py-0.5 font-medium">{creation ? 'Value' : 'After'}</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-rule">
        {rows.map((r) => (
          <tr key={r.field}>
            <td className="py-0.5 pr-3 align-top text-ink-muted">{r.field}</td>
            {!creation && <td className="py-0.5 pr-3 align-top break-all text-bad/80 line-through decoration-bad/30">{r.before}</td>}
            <td className="py-0.5 align-top break-all">{r.after}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
