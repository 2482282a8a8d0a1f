'use client';
import { useQuery } from '@tanstack/react-query';
import { decodePlotColumns, type PlotColumns } from '@/lib/benchmark/plot-columns';
import type { RecomputeStatus } from '@/lib/benchmark/recompute-status';

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

/** Plot points of one revision (immutable, so cached for good), sent in columns and rebuilt as rows here. */
export function usePairs(workspaceId: string, benchmarkId: string, revision: number) {
  return useQuery({
    queryKey: ['benchmark-pairs', workspaceId, benchmarkId, revision],
    queryFn: async () => {
      const payload = await getJson<PlotColumns>(`${benchmarkApi(workspaceId, benchmarkId)}/pairs?revision=${revision}`);
      return { revision: payload.revision, unit: payload.unit, points: decodePlotColumns(payload) };
    },
    staleTime: Infinity,
  });
}

/** While a recomputation is queued or running, poll quickly; otherwise often enough to catch the queue's debounce after an import elsewhere. */
export const STATUS_POLL_BUSY_MS = 1000;
export const STATUS_POLL_IDLE_MS = 1500;

/**
 * The benchmark's recomputation state and latest revision (a few bytes), polled
 * in a background tab too: a user who imports in another tab comes back to the
 * new revision, not to a stale page.
 */
export function useRecomputeStatus(workspaceId: string, benchmarkId: string, computing: boolean) {
  return useQuery({
    queryKey: ['benchmark-status', workspaceId, benchmarkId],
    queryFn: () => getJson<RecomputeStatus>(`${benchmarkApi(workspaceId, benchmarkId)}/status`),
    staleTime: 0,
    refetchInterval: (query) => ((query.state.data ? query.state.data.computing : computing) ? STATUS_POLL_BUSY_MS : STATUS_POLL_IDLE_MS),
    refetchIntervalInBackground: true,
  });
}
