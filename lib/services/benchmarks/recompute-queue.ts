import 'server-only';
/**
 * Benchmark recomputations as durable jobs (lib/services/jobs/runner.ts), one
 * row per benchmark, shared by every app process on the database.
 *
 * scheduleRecompute writes the request and returns (it never waits for the
 * recomputation); each benchmark waits RECOMPUTE_DEBOUNCE_MS after its last
 * request, so a burst of imports produces one recomputation. Causes reported
 * while it waits are folded into the row and stored with the revision. One
 * process at a time holds a benchmark's lease, and the revision insert refuses
 * a fingerprint equal to the latest, so each change makes one revision even
 * when two processes race after a lease ran out.
 */
import { listBenchmarkIds } from '@/db/queries/benchmarks';
import { findJob, jobQueueStats } from '@/db/queries/jobs';
import { envValue } from '@/lib/env';
import type { RecomputeCause } from '@/lib/benchmark/revision-record';
import { queueJob, registerJobHandler, whenJobsIdle } from '@/lib/services/jobs/runner';
import { recomputeBenchmark } from './recompute';

export type RecomputeState = 'idle' | 'queued' | 'running';

const KIND = 'recompute';

function key(workspaceId: string, benchmarkId: string): string {
  return `${workspaceId}|${benchmarkId}`;
}

registerJobHandler(KIND, async (job) => {
  const [workspaceId, benchmarkId] = job.key.split('|');
  const causes = job.payload as RecomputeCause[];
  await recomputeBenchmark(workspaceId, benchmarkId, causes.length ? causes : [{ trigger: 'data-change' }]);
});

/**
 * Queues a recomputation of these benchmarks (all of the workspace when omitted).
 * A curator's decision passes delayMs 0: there is no burst to wait for.
 */
export async function scheduleRecompute(
  workspaceId: string,
  benchmarkIds?: string[],
  cause: RecomputeCause = { trigger: 'data-change' },
  delayMs?: number,
): Promise<void> {
  const ids = benchmarkIds ?? (await listBenchmarkIds(workspaceId));
  const runAfter = new Date(Date.now() + (delayMs ?? envValue('RECOMPUTE_DEBOUNCE_MS')));
  for (const benchmarkId of ids) await queueJob({ kind: KIND, key: key(workspaceId, benchmarkId), workspaceId, item: cause, runAfter });
}

export interface RecomputeStatus {
  state: RecomputeState | 'failed';
  /** The last run's error: of a failed job, or of a job waiting to be retried. */
  error: string | null;
  attempts: number;
  /** When a job waiting after a failure runs again. */
  retryAt: Date | null;
}

/**
 * The state a page shows and a workflow waits on. Idle means every change
 * committed before this call has been computed; 'failed' means the last
 * attempts all failed and the job waits for a retry or a new change.
 */
export async function recomputeStatus(workspaceId: string, benchmarkId: string, now = new Date()): Promise<RecomputeStatus> {
  const row = await findJob(KIND, key(workspaceId, benchmarkId));
  if (!row) return { state: 'idle', error: null, attempts: 0, retryAt: null };
  if (row.status === 'failed') return { state: 'failed', error: row.lastError, attempts: row.attempts, retryAt: null };
  const running = row.leaseOwner !== null && row.leaseExpiresAt !== null && row.leaseExpiresAt > now;
  return {
    state: running ? 'running' : 'queued',
    error: row.lastError,
    attempts: row.attempts,
    retryAt: !running && row.lastError ? row.runAfter : null,
  };
}

export async function recomputeState(workspaceId: string, benchmarkId: string): Promise<RecomputeState> {
  const { state } = await recomputeStatus(workspaceId, benchmarkId);
  return state === 'failed' ? 'idle' : state;
}

/** The queue at a glance, for GET /api/health. */
export async function recomputeQueueStatus(now = new Date()): Promise<{ queued: number; running: number; failed: number; oldestMs: number }> {
  const stats = await jobQueueStats([KIND], now);
  return { queued: stats.queued, running: stats.running, failed: stats.failed, oldestMs: stats.oldest ? now.getTime() - stats.oldest.getTime() : 0 };
}

/** Resolves when no recomputation of this benchmark (or workspace, or any) waits or runs: for tests and scripts. */
export async function whenRecomputeIdle(workspaceId?: string, benchmarkId?: string, timeoutMs = 60_000): Promise<void> {
  await whenJobsIdle({ kinds: [KIND], workspaceId, key: workspaceId && benchmarkId ? key(workspaceId, benchmarkId) : undefined }, timeoutMs);
}
