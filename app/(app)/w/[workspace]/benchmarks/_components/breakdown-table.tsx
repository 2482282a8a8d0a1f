import type { BreakdownRow } from '@/lib/benchmark/types';
import { header, signed, stat } from '@/lib/format';
import { ScrollRegion } from '@/components/ui/scroll-region';

/**
 * Groups (material classes, frequency bands, species, branches, techniques) × methods: MAE
 * on top, N · mean signed error · RMSE under it, so that a method's column stays narrow
 * and three methods fit beside the group column of a half-width panel.
 */
export function BreakdownTable({ rows, methods, groupTitle, caption, unit }: { rows: BreakdownRow[]; methods: Array<{ methodId: string; label: string }>; groupTitle: string; caption: string; unit: string }) {
  const groups = [...new Set(rows.map((r) => r.group))];
  const cell = new Map(rows.map((r) => [`${r.group}|${r.methodId}`, r]));
  if (groups.length === 0) return <p className="text-sm text-ink-muted">No included pairs.</p>;
  return (
    <ScrollRegion label={caption}>
      <table className="w-full border-collapse text-[13px]" data-testid="breakdown">
        <caption className="sr-only">
          {caption}{unit ? `, errors in ${unit}` : ''}
        </caption>
        <thead className="border-b border-rule">
          <tr>
            <th scope="col" className="sticky left-0 z-10 bg-panel px-1.5 py-1.5 text-left align-bottom font-medium text-ink-muted">
              {groupTitle}
            </th>
            {methods.map((m) => (
              <th key={m.methodId} scope="col" className="px-1.5 py-1.5 text-left align-bottom font-medium leading-tight text-ink-muted">
                {m.label}
                <span className="block text-[11px] font-normal">{header('MAE', unit)}</span>
                <span className="block text-[11px] font-normal">N · MSE · RMSE</span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {groups.map((g) => (
            <tr key={g} className="border-b border-rule/70">
              <th scope="row" className="sticky left-0 z-10 bg-panel px-1.5 py-1.5 text-left align-top font-medium">
                {g}
              </th>
              {methods.map((m) => {
                const r = cell.get(`${g}|${m.methodId}`);
                return (
                  <td key={m.methodId} className="num px-1.5 py-1.5 align-top">
                    {!r ? (
                      <span className="text-ink-faint">—</span>
                    ) : r.statistics ? (
                      <>
                        <strong data-stat="mae">{stat('error', r.statistics.meanAbsoluteError)}</strong>
                        <span className="block whitespace-nowrap text-xs text-ink-muted">
                          {r.n} · {signed(r.statistics.meanSignedError)} · {stat('error', r.statistics.rootMeanSquareError)}
                        </span>
                      </>
                    ) : (
                      <span className="text-xs text-ink-muted">N = {r.n} (too few)</span>
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
