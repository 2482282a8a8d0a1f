'use client';
import { useQuery } from '@tanstack/react-query';
import type { PlotPoint } from '@/lib/benchmark/pairs-export';
import type { StatisticsPayload } from '@/lib/benchmark/statistics-payload';

async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: 'application/json' } });
  if (!res.ok) {
    const problem = (await res.json().catch(() => null)) as { detail?: string } | null;
    throw new Error(problem?.detail ?? `Request failed (${res.status}).`);
  }
  return (await res.json()) as T;
}

export function benchmarkApi(workspaceId: string, benchmarkId: string): string {
  return `/api/workspaces/${encodeURIComponent(workspaceId)}/benchmarks/${encodeURIComponent(benchmarkId)}`;
}

/** Plot points of one revision (immutable, so cached for good). */
export function usePairs(workspaceId: string, benchmarkId: string, revision: number) {
  return useQuery({
    queryKey: ['benchmark-pairs', workspaceId, benchmarkId, revision],
    queryFn: () => getJson<{ revision: number; unit: string; points: PlotPoint[] }>(`${benchmarkApi(workspaceId, benchmarkId)}/pairs?revision=${revision}`),
    staleTime: Infinity,
  });
}

/** The latest revision head and whether a newer one is being computed; polls while it is (or, before the first answer, while the page said so). */
export function useLatestStatistics(workspaceId: string, benchmarkId: string, poll: boolean) {
  return useQuery({
    queryKey: ['benchmark-statistics', workspaceId, benchmarkId],
    queryFn: () => getJson<StatisticsPayload>(`${benchmarkApi(workspaceId, benchmarkId)}/statistics`),
    refetchInterval: (query) => ((query.state.data ? query.state.data.computing : poll) ? 1500 : false),
  });
}
