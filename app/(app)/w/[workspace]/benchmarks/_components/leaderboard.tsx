import type { MethodResult, PairRecord, RankingRecord } from '@/lib/benchmark/types';
import { LeaderboardTable } from './leaderboard-table';
import { percentOf as percent } from '@/lib/format';

/** What the bracketed interval means, in words. */
export function intervalNote(methods: MethodResult[]): string {
  const boot = methods.find((m) => m.statistics?.bootstrap)?.statistics?.bootstrap;
  if (!boot) return 'No bootstrap interval was computed for this revision.';
  const level = Math.round(100 * boot.confidence);
  if (boot.resampled === 'clusters') {
    return `MAE [${level} % interval]: a bootstrap that resamples whole materials (all pairs of a material together), since the pairs of one crystal share its errors. It shows how much the MAE would move with another set of materials like these, not the uncertainty of single values.`;
  }
  return `MAE [${level} % interval]: a bootstrap over single pairs (a revision computed before intervals were resampled by material; it is too narrow when modes of one material share their errors).`;
}

/**
 * Per-method statistics. Ranked methods come first, by their MAE on the pairs every
 * ranked method shares (ranking.ts); each method's own statistics on all its pairs
 * stand beside. Methods below the ranking rule are listed without a rank, with the reason.
 * Scaling has its own panel (scaling-panel.tsx).
 */
export function Leaderboard({
  methods,
  unit,
  pairByKey,
  materialName,
  ranking,
  details = 'toggle',
  reference,
}: {
  methods: MethodResult[];
  unit: string;
  pairByKey: Map<string, PairRecord>;
  materialName: (id: string) => string;
  ranking?: RankingRecord;
  /** 'none': the ten columns only (slides). */
  details?: 'toggle' | 'none';
  /** Against a reference method: its label (the errors are candidate − reference). */
  reference?: string;
}) {
  const unranked = methods.filter((m) => m.rank === null && m.unranked);
  const worstPair: Record<string, string> = {};
  for (const m of methods) {
    const worst = m.statistics ? pairByKey.get(m.statistics.maxAbsoluteErrorPair) : undefined;
    if (worst) worstPair[m.methodId] = [materialName(worst.materialId), worst.label].filter(Boolean).join(' ');
  }
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
      <LeaderboardTable methods={methods} unit={unit} worstPair={worstPair} details={details} />
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
        Errors are {reference ? `candidate − reference (${reference})` : 'calculated − measured'}
        {unit ? `, in ${unit}` : ' (dimensionless)'}. {intervalNote(methods)}
      </p>
    </div>
  );
}
