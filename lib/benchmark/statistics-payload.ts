/** The JSON of the statistics endpoint: a revision's snapshot without its pairs, plus the recomputation state. */
import type { BenchmarkSnapshot } from './types';

export interface StatisticsPayload {
  benchmark: { id: string; name: string };
  revision: { number: number; fingerprint: string; createdAt: string; isLatest: boolean } | null;
  computing: boolean;
  statistics: Omit<BenchmarkSnapshot, 'pairs'> | null;
}

export function statisticsPayload(
  benchmark: { id: string; name: string },
  revision: { number: number; fingerprint: string; createdAt: Date; isLatest: boolean; statistics: BenchmarkSnapshot } | null,
  computing: boolean,
): StatisticsPayload {
  if (!revision) return { benchmark, revision: null, computing, statistics: null };
  const { pairs: _pairs, ...statistics } = revision.statistics;
  return {
    benchmark,
    revision: { number: revision.number, fingerprint: revision.fingerprint, createdAt: revision.createdAt.toISOString(), isLatest: revision.isLatest },
    computing,
    statistics,
  };
}
