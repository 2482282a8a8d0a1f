import type { BreakdownRow } from '@/lib/benchmark/types';
import { signed, stat } from '@/lib/format';
import { ScrollRegion } from '@/components/ui/scroll-region';

/** Groups (material classes, frequency bands, species, branches, techniques) × methods: N, mean signed error, MAE, RMSE. */
export function BreakdownTable({ rows, methods, groupTitle, caption }: { rows: BreakdownRow[]; methods: Array<{ methodId: string; label: string }>; groupTitle: string; caption: string }) {
  const groups = [...new Set(rows.map((r) => r.group))];
  const cell = new Map(rows.map((r) => [`${r.group}|${r.methodId}`, r]));
  if (groups.length === 0) return <p className="text-sm text-ink-muted">No included pairs.</p>;
  return (
    <ScrollRegion label={`${caption} (scrolls sideways)`}>
      <table className="min-w-full border-collapse text-[13px]">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-rule">
          <tr>
            <th className="sticky left-0 z-10 bg-panel px-2 py-1.5 text-left font-medium text-ink-muted">{groupTitle}</th>
            {methods.map((m) => (
              <th key={m.methodId} className="px-2 py-1.5 text-left font-medium text-ink-muted">
                {m.label}
                <span className="block text-[11px] font-normal">N · MSE · MAE · RMSE</span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {groups.map((g) => (
            <tr key={g} className="border-b border-rule/70">
              <th scope="row" className="sticky left-0 z-10 bg-panel px-2 py-1.5 text-left font-medium">
                {g}
              </th>
              {methods.map((m) => {
                const r = cell.get(`${g}|${m.methodId}`);
                return (
                  <td key={m.methodId} className="num px-2 py-1.5 whitespace-nowrap">
                    {!r ? (
                      <span className="text-ink-faint">—</span>
                    ) : r.statistics ? (
                      <>
                        {r.n} · {signed(r.statistics.meanSignedError)} · <strong>{stat('error', r.statistics.meanAbsoluteError)}</strong> · {stat('error', r.statistics.rootMeanSquareError)}
                      </>
                    ) : (
                      <span className="text-ink-muted">N = {r.n} (too few)</span>
                    )}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  );
}
