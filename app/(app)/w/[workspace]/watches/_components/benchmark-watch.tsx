import { getMyWatch } from '@/db/queries/watches';
import { readWatchThresholds } from '@/lib/alerts/thresholds';
import type { BenchmarkRecord } from '@/db/queries/benchmarks';
import { unitOf } from '@/lib/benchmark/compute';
import { WatchButton } from './watch-button';

/** The Watch control of a benchmark page, for the signed-in member (any role). */
export async function BenchmarkWatch({
  workspace,
  userId,
  bm,
  unit,
}: {
  workspace: { id: string; slug: string };
  userId: string;
  bm: Pick<BenchmarkRecord, 'id' | 'name' | 'alertThresholds' | 'scope'>;
  unit?: string;
}) {
  const mine = await getMyWatch(workspace.id, bm.id, userId);
  const active = mine && !mine.unsubscribedAt ? { id: mine.id, mode: mine.mode, thresholds: readWatchThresholds(mine.thresholds) } : null;
  return (
    <div className="flex justify-end" data-testid="watch-control">
      <WatchButton
        workspaceId={workspace.id}
        workspaceSlug={workspace.slug}
        benchmarkId={bm.id}
        benchmarkName={bm.name}
        watch={active}
        defaults={bm.alertThresholds}
        unit={unit ?? unitOf(bm.scope.quantity)}
      />
    </div>
  );
}
