import type { RowError } from '@/lib/import/errors';
import { count } from '@/lib/format';

/** Every row error with row, column and reason (the header is row 1); an error of the method table names its line. */
export function RowErrorTable({ errors, errorCount }: { errors: RowError[]; errorCount: number }) {
  return (
    <div className="space-y-2">
      <p className="text-sm font-medium text-bad" role="alert">
        {count(errorCount)} {errorCount === 1 ? 'error' : 'errors'} — nothing can be imported until they are fixed.
        {errorCount > errors.length && ` The first ${count(errors.length)} are listed.`}
      </p>
      <div role="region" aria-label="Row errors" tabIndex={0} className="max-h-80 overflow-auto rounded-md border border-rule">
        <table className="w-full text-sm" data-testid="row-errors">
          <thead className="sticky top-0 bg-panel text-left text-xs text-ink-muted">
            <tr>
              <th className="px-2 py-1.5 font-medium">Row</th>
              <th className="px-2 py-1.5 font-medium">Column</th>
              <th className="px-2 py-1.5 font-medium">Reason</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {errors.map((e, i) => (
              <tr key={i}>
                <td className="num px-2 py-1 align-top">{e.methodLine !== undefined ? `method line ${e.methodLine}` : e.row === 0 ? 'file' : e.row}</td>
                <td className="px-2 py-1 align-top font-mono text-xs">{e.column ?? '—'}</td>
                <td className="px-2 py-1">{e.reason}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-faint">Row numbers count the header as row 1, as a spreadsheet shows them.</p>
    </div>
  );
}
