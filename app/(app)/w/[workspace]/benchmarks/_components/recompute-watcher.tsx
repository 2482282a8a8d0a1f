'use client';
import { useEffect } from 'react';
import { useRouter } from 'next/navigation';
import { useLatestStatistics } from './use-benchmark-data';

/** Says that a newer revision is being computed and reloads the page once it is stored. */
export function RecomputeWatcher({ workspaceId, benchmarkId, shownRevision, computing }: { workspaceId: string; benchmarkId: string; shownRevision: number | null; computing: boolean }) {
  const router = useRouter();
  const { data } = useLatestStatistics(workspaceId, benchmarkId, computing);
  const latest = data?.revision?.number ?? null;
  const busy = data ? data.computing : computing;

  useEffect(() => {
    if (latest !== null && latest !== shownRevision) router.refresh();
  }, [latest, shownRevision, router]);

  if (!busy) return null;
  return (
    <p role="status" className="rounded-md border border-accent/30 bg-accent-soft px-3 py-2 text-sm text-accent-strong">
      A newer revision is being computed; this page updates when it is stored.
    </p>
  );
}
