import 'server-only';
/**
 * The one event that makes benchmarks recompute. The import, undo, decision,
 * catalogue and settings services call it after their write has committed;
 * nothing else schedules a recomputation.
 *
 * Without `benchmarkIds` every benchmark of the workspace is recomputed (a
 * change to shared data: rows, materials, methods, sources, pins, thresholds).
 * `immediate` skips the debounce: a user who just edited one benchmark's
 * definition or decided an outlier is waiting for that revision.
 */
import type { Actor } from '@/db/queries/audit';
import type { RecomputeCause } from '@/lib/benchmark/revision-record';
import { scheduleRecompute } from './benchmarks/recompute-queue';

export interface DataChange {
  cause: RecomputeCause;
  benchmarkIds?: string[];
  immediate?: boolean;
}

/**
 * Writes the recomputation request (a durable job). A failure to queue is logged, not thrown: the write it
 * follows has committed, and the next change or a manual recompute catches the benchmark up.
 */
export async function dataChanged(workspaceId: string, change: DataChange): Promise<void> {
  try {
    await scheduleRecompute(workspaceId, change.benchmarkIds, change.cause, change.immediate ? 0 : undefined);
  } catch (error) {
    console.error(`could not queue the recomputation of workspace ${workspaceId}`, error);
  }
}

/** Wraps a workspace write so that, once it has committed, it reports a data change by its actor. */
export function reportingChange<A extends unknown[], R>(
  write: (workspaceId: string, actor: Actor, ...args: A) => Promise<R>,
): (workspaceId: string, actor: Actor, ...args: A) => Promise<R> {
  return async (workspaceId, actor, ...args) => {
    const result = await write(workspaceId, actor, ...args);
    await dataChanged(workspaceId, { cause: { trigger: 'data-change', userId: actor.userId } });
    return result;
  };
}
