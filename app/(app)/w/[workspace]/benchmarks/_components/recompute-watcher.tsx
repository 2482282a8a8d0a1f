'use client';
import { useEffect, useTransition } from 'react';
import { useRouter } from 'next/navigation';
import { useRecomputeStatus } from './use-benchmark-data';
import { RecomputeButton } from './decision-forms';
import type { RecomputeStatus } from '@/lib/benchmark/recompute-status';

/**
 * Says "Recomputing…" while a newer revision is being computed (after an import, a
 * decision or an edit, here or elsewhere), and brings the new revision onto the page
 * without a reload once it is stored (a server refresh of this route). When the
 * recomputation failed, says so with the error, and offers a retry to those who may.
 */
export function RecomputeWatcher({
  workspaceId,
  benchmarkId,
  shownRevision,
  computing,
  canRetry,
}: {
  workspaceId: string;
  benchmarkId: string;
  shownRevision: number | null;
  computing: boolean;
  canRetry: boolean;
}) {
  const router = useRouter();
  const [refreshing, startRefresh] = useTransition();
  const { data } = useRecomputeStatus(workspaceId, benchmarkId, computing);
  const latest = data?.latestRevision?.number ?? null;
  const busy = data ? data.computing : computing;
  const newer = latest !== null && latest !== shownRevision;

  useEffect(() => {
    if (newer) startRefresh(() => router.refresh());
  }, [newer, latest, router]);

  if (data?.error && !newer) return <RecomputeFailure status={data} workspaceId={workspaceId} benchmarkId={benchmarkId} canRetry={canRetry} />;
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

function RecomputeFailure({ status, workspaceId, benchmarkId, canRetry }: { status: RecomputeStatus; workspaceId: string; benchmarkId: string; canRetry: boolean }) {
  const failed = status.state === 'failed';
  const retryAt = status.retryAt ? new Date(status.retryAt).toLocaleTimeString() : null;
  return (
    <div role="alert" className="space-y-2 rounded-md border border-bad/40 bg-bad-soft px-3 py-2 text-sm text-ink" data-testid="recompute-failed">
      <p>
        <strong>{failed ? 'The recomputation failed' : 'The recomputation failed and will be retried'}</strong>
        {failed
          ? ` after ${status.attempts} attempt${status.attempts === 1 ? '' : 's'}. The figures below are of the latest stored revision and do not include the changes since.`
          : `${retryAt ? ` at ${retryAt}` : ''} (attempt ${status.attempts} failed). The figures below are of the latest stored revision.`}
      </p>
      <p className="font-mono text-xs break-words text-ink-muted">{status.error}</p>
      {failed && canRetry ? <RecomputeButton workspaceId={workspaceId} benchmarkId={benchmarkId} label="Retry the recomputation" /> : null}
      {failed && !canRetry ? <p className="text-xs text-ink-muted">A curator or owner can retry it.</p> : null}
    </div>
  );
}
