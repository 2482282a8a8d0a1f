'use client';
import { Fragment, useState } from 'react';
import type { MethodResult } from '@/lib/benchmark/types';
import { MIN_PAIRS_FOR_STATISTICS } from '@/lib/benchmark/statistics-minimum';
import { counted, fixed, header, percentOf, signed, stat } from '@/lib/format';
import { ScrollRegion } from '@/components/ui/scroll-region';

const th = 'px-1.5 py-1.5 text-left align-bottom font-medium text-ink-muted leading-tight';
const td = 'px-1.5 py-1.5 num align-top';
const sticky = 'sticky left-0 z-10 bg-panel';


/**
 * The leaderboard's table. Ten columns carry what a rank rests on and what it hides
 * (N, coverage, the interval, outliers, quality flags, excluded pairs) and fit a 1024 px
 * screen; the other statistics of a method open in a details row under it (all of them
 * at once with "Show every statistic", and always in print).
 */
export function LeaderboardTable({ methods, unit, worstPair, details = 'toggle' }: { methods: MethodResult[]; unit: string; worstPair: Record<string, string>; details?: 'toggle' | 'none' }) {
  const [open, setOpen] = useState<ReadonlySet<string>>(new Set());
  const all = methods.length > 0 && methods.every((m) => open.has(m.methodId));
  const toggle = (id: string) =>
    setOpen((s) => {
      const next = new Set(s);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  const columns = 10;
  return (
    <div className="space-y-1">
      {details === 'toggle' ? (
        <div className="flex justify-end print:hidden">
          <button type="button" className="text-xs font-medium text-accent hover:underline" aria-pressed={all} onClick={() => setOpen(all ? new Set() : new Set(methods.map((m) => m.methodId)))} data-testid="leaderboard-all-details">
            {all ? 'Hide the other statistics' : 'Show every statistic'}
          </button>
        </div>
      ) : null}
      <ScrollRegion label="Leaderboard table" className="rounded-md border border-rule">
        <table className="w-full border-collapse text-[13px]" data-testid="leaderboard">
          <caption className="sr-only">Leaderboard: error statistics per method, errors{unit ? ` in ${unit}` : ''}</caption>
          <thead className="border-b border-rule">
            <tr>
              <th scope="col" className={`${th} ${sticky} min-w-28`}>
                Method
              </th>
              <th scope="col" className={th}>
                Rank
              </th>
              <th scope="col" className={th} title="MAE on the pairs every ranked method shares: the number the rank rests on">
                {header('MAE, common pairs', unit)}
              </th>
              <th scope="col" className={th} title="Included pairs of the method">
                N
              </th>
              <th scope="col" className={th} title="Measured values in scope this method paired / all measured values in scope">
                Coverage (%)
              </th>
              <th scope="col" className={th} title="The method's MAE on all its own pairs, with the bootstrap interval">
                {header('Own MAE [interval]', unit)}
              </th>
              <th scope="col" className={th}>
                {header('RMSE', unit)}
              </th>
              <th scope="col" className={th} title="Pairs the outlier rule flags (they stay in the statistics until a curator excludes them)">
                Outliers
              </th>
              <th scope="col" className={th} title="Quality flags of the method's calculations in scope">
                Quality flags
              </th>
              <th scope="col" className={th} title="Pairs excluded by a curator's decision">
                Excluded
              </th>
            </tr>
          </thead>
          <tbody>
            {methods.map((m) => {
              const s = m.statistics;
              const isOpen = details === 'toggle' && open.has(m.methodId);
              const detailsId = `leaderboard-details-${m.methodId}`;
              return (
                <Fragment key={m.methodId}>
                  <tr className={details === 'toggle' ? 'border-t border-rule/70' : 'border-b border-rule/70'} data-method={m.label} data-ranked={m.rank !== null ? 'yes' : 'no'}>
                    <th scope="row" className={`${sticky} px-1.5 py-1.5 text-left align-top font-medium`}>
                      {m.label}
                      {details === 'toggle' ? (
                        <button
                          type="button"
                          className="mt-0.5 block text-[11px] font-normal text-accent hover:underline print:hidden"
                          aria-expanded={isOpen}
                          aria-controls={detailsId}
                          onClick={() => toggle(m.methodId)}
                        >
                          {isOpen ? '▾ fewer' : '▸ more statistics'}
                          <span className="sr-only"> of {m.label}</span>
                        </button>
                      ) : null}
                    </th>
                    <td className={td} data-stat="rank">
                      {m.rank ?? <span className="text-ink-muted">not ranked</span>}
                    </td>
                    <td className={td} data-stat="common-mae">
                      {m.common ? (
                        <>
                          <strong>{stat('error', m.common.meanAbsoluteError)}</strong>
                          <span className="block text-xs text-ink-muted">N {m.common.n}</span>
                        </>
                      ) : (
                        '—'
                      )}
                    </td>
                    <td className={td} data-stat="n">
                      {m.n}
                    </td>
                    <td className={td} data-stat="coverage">
                      {percentOf(m.coverage)}
                      {m.paired !== undefined ? (
                        <span className="block text-xs text-ink-muted">
                          {m.paired} paired · {m.unpairedMeasurements} unpaired
                        </span>
                      ) : null}
                    </td>
                    {s ? (
                      <>
                        <td className={td} data-stat="mae">
                          <strong>{stat('error', s.meanAbsoluteError)}</strong>
                          {s.bootstrap ? (
                            <span className="block whitespace-nowrap text-xs text-ink-muted">
                              [{stat('error', s.bootstrap.meanAbsoluteError[0])}, {stat('error', s.bootstrap.meanAbsoluteError[1])}]
                            </span>
                          ) : null}
                        </td>
                        <td className={td} data-stat="rmse">
                          {stat('error', s.rootMeanSquareError)}
                        </td>
                      </>
                    ) : (
                      <td colSpan={2} className="px-1.5 py-1.5 align-top text-xs text-ink-muted">
                        N &lt; {MIN_PAIRS_FOR_STATISTICS}: too few pairs for statistics
                      </td>
                    )}
                    <td className={td} data-stat="outliers">
                      {m.outliers}
                    </td>
                    <td className={td} data-stat="quality">
                      {m.qualityFlags}
                    </td>
                    <td className={td} data-stat="excluded">
                      {m.excluded}
                    </td>
                  </tr>
                  {details === 'toggle' ? (
                    <tr id={detailsId} className={`${isOpen ? '' : 'hidden'} print:table-row`} data-details-of={m.label}>
                      <td colSpan={columns} className="bg-paper/60 px-1.5 pb-2">
                        <MethodDetails m={m} unit={unit} worst={worstPair[m.methodId]} />
                      </td>
                    </tr>
                  ) : null}
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </ScrollRegion>
    </div>
  );
}

/** The statistics of one method that the ten columns leave out, as a definition list that wraps. */
function MethodDetails({ m, unit, worst }: { m: MethodResult; unit: string; worst: string | undefined }) {
  const s = m.statistics;
  const items: Array<[string, React.ReactNode, string?]> = [];
  if (s) {
    items.push([header('Mean signed error', unit), signed(s.meanSignedError), 'calculated − measured']);
    if (s.bootstrap) items.push([header('Mean signed error [interval]', unit), `[${signed(s.bootstrap.meanSignedError[0])}, ${signed(s.bootstrap.meanSignedError[1])}]`]);
    items.push(['Mean |rel. error| (%)', s.meanAbsoluteRelativeError !== undefined ? fixed(100 * s.meanAbsoluteRelativeError, 2) : fixed(s.meanAbsolutePercentageError, 2), 'Mean of |error| / measured']);
    items.push([header('Median |error|', unit), stat('error', s.medianAbsoluteError)]);
    items.push([header('Max |error|', unit), worst ? `${stat('error', s.maxAbsoluteError)} (${worst})` : stat('error', s.maxAbsoluteError)]);
    items.push([
      'Reduced χ² (ν)',
      s.reducedChiSquare !== undefined ? `${fixed(s.reducedChiSquare, 2)} (${s.chiSquarePairs})` : 'no σ given',
      'Σ (error / combined σ)² / ν over the pairs with an uncertainty',
    ]);
    items.push([
      "Lin's CCC",
      s.concordance !== undefined ? stat('correlation', s.concordance) : 'undefined',
      s.correlationUndefined ? `Lin's concordance correlation coefficient; ${s.correlationUndefined}` : "Lin's concordance correlation coefficient",
    ]);
  }
  const reasons = m.excludedReasons.map((r) => `${r.count} × ${r.reason}`).join('; ');
  return (
    <div className="space-y-1 pt-1">
      {s ? (
        <dl className="grid grid-cols-[repeat(auto-fill,minmax(11rem,1fr))] gap-x-4 gap-y-1 text-xs">
          {items.map(([label, value, title]) => (
            <div key={label} title={title}>
              <dt className="text-ink-muted">{label}</dt>
              <dd className="num text-ink">{value}</dd>
            </div>
          ))}
        </dl>
      ) : null}
      {s?.correlationUndefined ? <p className="text-xs text-ink-muted">Correlation not reported: {s.correlationUndefined}.</p> : null}
      {s ? null : (
        <p className="text-xs text-ink-muted">Too few pairs for statistics (N &lt; {MIN_PAIRS_FOR_STATISTICS}); only N is shown.</p>
      )}
      {m.excluded > 0 ? (
        <p className="text-xs text-ink-muted">
          Excluded: {counted(m.excluded, 'pair')} — {reasons}
        </p>
      ) : null}
    </div>
  );
}
