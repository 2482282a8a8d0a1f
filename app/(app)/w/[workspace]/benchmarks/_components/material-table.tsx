'use client';
import Link from 'next/link';
import { useMemo, useState } from 'react';
import type { MaterialRow } from '@/lib/benchmark/types';
import { header, signed, stat } from '@/lib/format';
import { ScrollRegion } from '@/components/ui/scroll-region';

type SortKey = 'name' | 'n' | 'meanAbsoluteError' | 'meanSignedError' | 'maxAbsoluteError' | 'flags';

const columns = (unit: string): Array<{ key: SortKey; label: string; title?: string }> => [
  { key: 'name', label: 'Material' },
  { key: 'n', label: 'N' },
  { key: 'meanAbsoluteError', label: header('MAE', unit) },
  { key: 'meanSignedError', label: header('Mean signed error', unit), title: 'calculated − measured' },
  { key: 'maxAbsoluteError', label: header('Max |error|', unit) },
  { key: 'flags', label: 'Flags', title: 'outliers · ambiguous pairs · excluded pairs · quality flags' },
];

const flagsOf = (r: MaterialRow) => r.outliers + r.ambiguous + r.excluded + r.qualityFlags;

function value(r: MaterialRow, key: SortKey): number | string {
  if (key === 'name') return r.name;
  if (key === 'flags') return flagsOf(r);
  return r[key] ?? -Infinity;
}

/** The materials of one method, worst first by default; every column sorts. */
export function MaterialTable({ rows, methods, unit, slug }: { rows: MaterialRow[]; methods: Array<{ methodId: string; label: string }>; unit: string; slug: string }) {
  const withRows = methods.filter((m) => rows.some((r) => r.methodId === m.methodId));
  const [methodId, setMethodId] = useState(withRows[0]?.methodId ?? '');
  const [sort, setSort] = useState<{ key: SortKey; descending: boolean }>({ key: 'meanAbsoluteError', descending: true });
  const shown = useMemo(() => {
    const list = rows.filter((r) => r.methodId === methodId);
    return list.sort((a, b) => {
      const x = value(a, sort.key);
      const y = value(b, sort.key);
      const order = typeof x === 'string' ? x.localeCompare(String(y)) : x - (y as number);
      return (sort.descending ? -order : order) || a.name.localeCompare(b.name);
    });
  }, [rows, methodId, sort]);
  const COLUMNS = columns(unit);
  if (withRows.length === 0) return <p className="text-sm text-ink-muted">No pairs.</p>;
  return (
    <div className="space-y-2">
      <label className="flex items-center gap-2 text-sm">
        Method
        <select className="rounded-md border border-rule bg-paper px-2 py-1 text-sm" value={methodId} onChange={(e) => setMethodId(e.target.value)} data-testid="material-table-method">
          {withRows.map((m) => (
            <option key={m.methodId} value={m.methodId}>
              {m.label}
            </option>
          ))}
        </select>
      </label>
      <ScrollRegion className="max-h-[28rem] overflow-auto rounded-md border border-rule" label="Materials of the method">
        <table className="min-w-full border-collapse text-[13px]" data-testid="material-table">
          <caption className="sr-only">Per-material statistics of the chosen method, errors{unit ? ` in ${unit}` : ''}; sorted by {COLUMNS.find((c) => c.key === sort.key)?.label}</caption>
          <thead className="sticky top-0 z-20 border-b border-rule bg-panel">
            <tr>
              {COLUMNS.map((c, i) => (
                <th
                  key={c.key}
                  scope="col"
                  className={`px-2 py-1.5 text-left font-medium text-ink-muted ${i === 0 ? 'sticky left-0 z-30 bg-panel' : ''}`}
                  aria-sort={sort.key === c.key ? (sort.descending ? 'descending' : 'ascending') : 'none'}
                  title={c.title}
                >
                  <button
                    type="button"
                    className="font-medium hover:text-ink"
                    onClick={() => setSort((s) => ({ key: c.key, descending: s.key === c.key ? !s.descending : c.key !== 'name' }))}
                  >
                    {c.label}
                    {sort.key === c.key ? (sort.descending ? ' ↓' : ' ↑') : ''}
                  </button>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {shown.map((r) => (
              <tr key={r.materialId} className="border-b border-rule/70" data-material={r.name}>
                <th scope="row" className="sticky left-0 z-10 bg-panel px-2 py-1.5 text-left font-medium">
                  <Link href={`/w/${slug}/materials/${r.materialId}`}>{r.name}</Link> <span className="text-xs font-normal text-ink-faint">{r.formula}</span>
                </th>
                <td className="num px-2 py-1.5">{r.n}</td>
                <td className="num px-2 py-1.5" data-stat="mae">
                  <strong>{stat('error', r.meanAbsoluteError)}</strong>
                </td>
                <td className="num px-2 py-1.5">{signed(r.meanSignedError)}</td>
                <td className="num px-2 py-1.5">{stat('error', r.maxAbsoluteError)}</td>
                <td className="px-2 py-1.5 text-xs">
                  {flagsOf(r) === 0 ? (
                    <span className="text-ink-faint">—</span>
                  ) : (
                    [r.outliers && `${r.outliers} outlier${r.outliers === 1 ? '' : 's'}`, r.ambiguous && `${r.ambiguous} ambiguous`, r.excluded && `${r.excluded} excluded`, r.qualityFlags && `${r.qualityFlags} quality`]
                      .filter(Boolean)
                      .join(' · ')
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollRegion>
    </div>
  );
}
