'use client';
import { useEffect, useTransition } from 'react';
import { useRouter } from 'next/navigation';
import { useRecomputeStatus } from './use-benchmark-data';

/**
 * Says "Recomputing…" while a newer revision is being computed (after an import, a
 * decision or an edit, here or elsewhere), and brings the new revision onto the page
 * without a reload once it is stored (a server refresh of this route).
 */
export function RecomputeWatcher({ workspaceId, benchmarkId, shownRevision, computing }: { workspaceId: string; benchmarkId: string; shownRevision: number | null; computing: boolean }) {
  const router = useRouter();
  const [refreshing, startRefresh] = useTransition();
  const { data } = useRecomputeStatus(workspaceId, benchmarkId, computing);
  const latest = data?.latestRevision?.number ?? null;
  const busy = data ? data.computing : computing;
  const newer = latest !== null && latest !== shownRevision;

  useEffect(() => {
    if (newer) startRefresh(() => router.refresh());
  }, [newer, latest, router]);

  if (!busy && !newer && !refreshing) return null;
  return (
    <p role="status" className="flex items-center gap-2 rounded-md border border-accent/30 bg-accent-soft px-3 py-2 text-sm text-accent-strong" data-testid="recomputing">
      <span aria-hidden className="inline-block size-2 animate-pulse rounded-full bg-accent" />
      {newer ? (
        <span>Revision {latest} is stored; showing it…</span>
      ) : (
        <span>
          <strong>Recomputing…</strong> new data or a decision changed this benchmark; the new revision appears here when it is stored.
        </span>
      )}
    </p>
  );
}
