import type { MethodResult, PairRecord } from '@/lib/benchmark/types';
import { MIN_PAIRS_FOR_STATISTICS } from '@/lib/benchmark/compute';
import { fmt, signed } from './format';
import { ScrollRegion } from '@/components/ui/scroll-region';

const th = 'px-2 py-1.5 text-left font-medium text-ink-muted whitespace-nowrap';
const td = 'px-2 py-1.5 num whitespace-nowrap';

/** Per-method statistics, best MAE first; methods below the minimum N show N only. */
export function Leaderboard({ methods, unit, pairByKey, materialName }: { methods: MethodResult[]; unit: string; pairByKey: Map<string, PairRecord>; materialName: (id: string) => string }) {
  return (
    <ScrollRegion label="Leaderboard table">
      <table className="min-w-full border-collapse text-[13px]" data-testid="leaderboard">
        <caption className="sr-only">Leaderboard: error statistics per method, errors in {unit}</caption>
        <thead className="border-b border-rule">
          <tr>
            <th className={th}>#</th>
            <th className={th}>Method</th>
            <th className={th}>N</th>
            <th className={th} title="calculated − measured">Mean signed error</th>
            <th className={th}>MAE [95 % bootstrap]</th>
            <th className={th}>RMSE</th>
            <th className={th}>Max |error| (pair)</th>
            <th className={th} title="Least-squares scale factor (Scott–Radom) and the RMSE after scaling">Scale factor · RMSE scaled</th>
            <th className={th} title="Lin's concordance correlation coefficient">Lin&apos;s CCC</th>
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
              <tr key={m.methodId} className="border-b border-rule/70" data-method={m.label}>
                <td className={td}>{m.rank ?? '—'}</td>
                <td className="px-2 py-1.5 font-medium">{m.label}</td>
                <td className={td} data-stat="n">
                  {m.n}
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
                    <td className={td}>
                      {fmt(s.maxAbsoluteError)}{' '}
                      {worst ? (
                        <span className="text-ink-muted">
                          ({materialName(worst.materialId)} {worst.label ?? ''})
                        </span>
                      ) : null}
                    </td>
                    <td className={td}>
                      {fmt(s.scaleFactor, 4)} · {fmt(s.rmseAfterScaling)}
                    </td>
                    <td className={td}>{fmt(s.concordance, 4)}</td>
                  </>
                ) : (
                  <td colSpan={6} className="px-2 py-1.5 text-ink-muted">
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
      <p className="mt-1 text-xs text-ink-faint">
        Errors are calculated − measured, in {unit}. Unpaired measurements per method:{' '}
        {methods.map((m) => `${m.label} ${m.unpairedMeasurements}`).join(', ')}.
      </p>
    </ScrollRegion>
  );
}
