import type { MethodResult, PairRecord, RankingRecord } from '@/lib/benchmark/types';
import { MIN_PAIRS_FOR_STATISTICS } from '@/lib/benchmark/compute';
import { fmt, signed } from './format';
import { ScrollRegion } from '@/components/ui/scroll-region';

const th = 'px-2 py-1.5 text-left align-bottom font-medium text-ink-muted';
const td = 'px-2 py-1.5 num whitespace-nowrap';
const sticky = 'sticky left-0 z-10 bg-panel';

const percent = (v: number | null | undefined, digits = 0) => (v === null || v === undefined ? '—' : `${(100 * v).toFixed(digits)} %`);

/** What the bracketed interval means, in words. */
export function intervalNote(methods: MethodResult[]): string {
  const boot = methods.find((m) => m.statistics?.bootstrap)?.statistics?.bootstrap;
  if (!boot) return 'No bootstrap interval was computed for this revision.';
  const level = Math.round(100 * boot.confidence);
  if (boot.resampled === 'clusters') {
    return `MAE [${level} % interval]: a bootstrap that resamples whole materials (all modes of a material together), since the modes of one crystal share its errors. It shows how much the MAE would move with another set of materials like these, not the uncertainty of single modes.`;
  }
  return `MAE [${level} % interval]: a bootstrap over single pairs (a revision computed before intervals were resampled by material; it is too narrow when modes of one material share their errors).`;
}

/**
 * Per-method statistics. Ranked methods come first, by their MAE on the pairs every
 * ranked method shares (ranking.ts); each method's own statistics on all its pairs
 * stand beside. Methods below the ranking rule are listed without a rank, with the reason.
 */
export function Leaderboard({
  methods,
  unit,
  pairByKey,
  materialName,
  ranking,
}: {
  methods: MethodResult[];
  unit: string;
  pairByKey: Map<string, PairRecord>;
  materialName: (id: string) => string;
  ranking?: RankingRecord;
}) {
  const unranked = methods.filter((m) => m.rank === null && m.unranked);
  return (
    <div className="space-y-2">
      {ranking ? (
        <p className="text-sm" data-testid="ranking-basis">
          {ranking.rankedMethods > 0 ? (
            <>
              Ranked on the <strong className="num">{ranking.commonN}</strong> pairs that all {ranking.rankedMethods} ranked methods share (common N), by their MAE on those pairs.
            </>
          ) : (
            <>{ranking.note}</>
          )}{' '}
          <span className="text-ink-muted">
            Rule of this benchmark: a method is ranked from N ≥ {ranking.minN} and coverage ≥ {percent(ranking.minCoverage)} (paired / measured in scope).
          </span>
        </p>
      ) : null}
      <ScrollRegion label="Leaderboard table (scrolls sideways)" className="overflow-x-auto rounded-md border border-rule">
        <table className="min-w-full border-collapse text-[13px]" data-testid="leaderboard">
          <caption className="sr-only">Leaderboard: error statistics per method, errors in {unit}</caption>
          <thead className="border-b border-rule">
            <tr>
              <th className={`${th} ${sticky}`}>Method</th>
              <th className={th}>Rank</th>
              <th className={th} title="MAE on the pairs every ranked method shares: the number the rank rests on">
                MAE on common pairs
              </th>
              <th className={th}>N</th>
              <th className={th} title="Measured values in scope this method paired / all measured values in scope">
                Coverage
              </th>
              <th className={th} title="calculated − measured">
                Mean signed error
              </th>
              <th className={th}>Own MAE [interval]</th>
              <th className={th}>RMSE</th>
              <th className={th} title="Mean of |error| / measured">
                Mean |rel. error|
              </th>
              <th className={th}>Max |error| (pair)</th>
              <th className={th} title="Least-squares scale factor λ (Scott–Radom); RMSE after scaling in sample, and with λ fitted without the material (leave one material out)">
                λ · RMSE scaled · out of sample
              </th>
              <th className={th} title="Σ (error / combined σ)² / ν over the pairs with an uncertainty">
                Reduced χ² (ν)
              </th>
              <th className={th} title="Lin's concordance correlation coefficient">
                Lin&apos;s CCC
              </th>
              <th className={th}>Outliers</th>
              <th className={th}>Quality flags</th>
              <th className={th}>Excluded</th>
            </tr>
          </thead>
          <tbody>
            {methods.map((m) => {
              const s = m.statistics;
              const worst = s ? pairByKey.get(s.maxAbsoluteErrorPair) : undefined;
              return (
                <tr key={m.methodId} className="border-b border-rule/70" data-method={m.label} data-ranked={m.rank !== null ? 'yes' : 'no'}>
                  <th scope="row" className={`${sticky} px-2 py-1.5 text-left font-medium`}>
                    {m.label}
                  </th>
                  <td className={td} data-stat="rank">
                    {m.rank ?? <span className="text-ink-muted">not ranked</span>}
                  </td>
                  <td className={td} data-stat="common-mae">
                    {m.common ? (
                      <>
                        <strong>{fmt(m.common.meanAbsoluteError)}</strong> <span className="text-ink-muted">(N {m.common.n})</span>
                      </>
                    ) : (
                      '—'
                    )}
                  </td>
                  <td className={td} data-stat="n">
                    {m.n}
                  </td>
                  <td className={td} data-stat="coverage">
                    {percent(m.coverage)}
                    {m.paired !== undefined ? <span className="block text-xs text-ink-muted">{m.paired} paired · {m.unpairedMeasurements} unpaired</span> : null}
                  </td>
                  {s ? (
                    <>
                      <td className={td} data-stat="mse">
                        {signed(s.meanSignedError)}
                      </td>
                      <td className={td} data-stat="mae">
                        <strong>{fmt(s.meanAbsoluteError)}</strong>{' '}
                        {s.bootstrap ? (
                          <span className="text-ink-muted">
                            [{fmt(s.bootstrap.meanAbsoluteError[0])}, {fmt(s.bootstrap.meanAbsoluteError[1])}]
                          </span>
                        ) : null}
                      </td>
                      <td className={td} data-stat="rmse">
                        {fmt(s.rootMeanSquareError)}
                      </td>
                      <td className={td} data-stat="mare">
                        {s.meanAbsoluteRelativeError !== undefined ? percent(s.meanAbsoluteRelativeError, 2) : `${fmt(s.meanAbsolutePercentageError)} %`}
                      </td>
                      <td className={td}>
                        {fmt(s.maxAbsoluteError)}{' '}
                        {worst ? (
                          <span className="block text-xs text-ink-muted">
                            {materialName(worst.materialId)} {worst.label ?? ''}
                          </span>
                        ) : null}
                      </td>
                      <td className={td} data-stat="scaled">
                        {fmt(s.scaleFactor, 4)} · {fmt(s.rmseAfterScaling)} · {fmt(s.rmseAfterScalingOutOfSample)}
                      </td>
                      <td className={td} data-stat="chi2">
                        {s.reducedChiSquare !== undefined ? (
                          <>
                            {fmt(s.reducedChiSquare)} <span className="text-ink-muted">({s.chiSquarePairs})</span>
                          </>
                        ) : (
                          <span className="text-ink-faint">no σ</span>
                        )}
                      </td>
                      <td className={td}>{fmt(s.concordance, 4)}</td>
                    </>
                  ) : (
                    <td colSpan={8} className="px-2 py-1.5 text-ink-muted">
                      Too few pairs for statistics (N &lt; {MIN_PAIRS_FOR_STATISTICS}); only N is shown.
                    </td>
                  )}
                  <td className={td}>{m.outliers}</td>
                  <td className={td}>{m.qualityFlags}</td>
                  <td className={td} data-stat="excluded">
                    {m.excluded}
                    {m.excludedReasons.length ? (
                      <span className="block max-w-56 truncate text-xs text-ink-muted" title={m.excludedReasons.map((r) => `${r.count} × ${r.reason}`).join('; ')}>
                        {m.excludedReasons.map((r) => `${r.count} × ${r.reason}`).join('; ')}
                      </span>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </ScrollRegion>
      {unranked.length ? (
        <ul className="text-xs text-ink-muted" data-testid="unranked">
          {unranked.map((m) => (
            <li key={m.methodId}>
              Listed, not ranked: <span className="font-medium text-ink">{m.label}</span> — {m.unranked}.
            </li>
          ))}
        </ul>
      ) : null}
      <p className="text-xs text-ink-faint">
        Errors are calculated − measured, in {unit}. {intervalNote(methods)}
      </p>
    </div>
  );
}
