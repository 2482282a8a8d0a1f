import 'server-only';
/**
 * In-process background queue of benchmark recomputations.
 *
 * scheduleRecompute returns at once (it never blocks an import or an action);
 * each benchmark waits RECOMPUTE_DEBOUNCE_MS after its last request, so a burst
 * of imports produces one recomputation, and runs one job at a time. Causes
 * reported while it waits are handed to the job and stored with the revision.
 *
 * State is kept in memory (on globalThis, shared by every route of this process),
 * not as a 'computing' revision row: a crash then leaves no stale row behind, and
 * the next change or an explicit "recompute" brings the benchmark up to date.
 * `recomputeState` tells the page that a newer revision is being computed.
 */
import { listBenchmarkIds } from '@/db/queries/benchmarks';
import { envValue } from '@/lib/env';
import type { RecomputeCause } from '@/lib/benchmark/revision-record';
import { recomputeBenchmark } from './recompute';

export type RecomputeState = 'idle' | 'queued' | 'running';

interface Job {
  workspaceId: string;
  benchmarkId: string;
  timer: ReturnType<typeof setTimeout> | null;
  running: Promise<void> | null;
  causes: RecomputeCause[];
  lastError: string | null;
  /** When this job was first queued (ms since the epoch): the health check reports the oldest. */
  since: number;
}

const store = globalThis as unknown as {
  ledgerRecomputeJobs?: Map<string, Job>;
  ledgerRecomputeListings?: Map<string, number>;
  ledgerRecomputeFailures?: Map<string, { message: string; at: number }>;
};
const jobs = (store.ledgerRecomputeJobs ??= new Map<string, Job>());
/** Workspaces whose benchmark list is being read before their jobs are queued. */
const listings = (store.ledgerRecomputeListings ??= new Map<string, number>());
/** The last recomputation of a benchmark failed (until one succeeds): what the API status reports. */
const failures = (store.ledgerRecomputeFailures ??= new Map<string, { message: string; at: number }>());

function debounceMs(): number {
  return envValue('RECOMPUTE_DEBOUNCE_MS');
}

function key(workspaceId: string, benchmarkId: string): string {
  return `${workspaceId}|${benchmarkId}`;
}

function start(job: Job): void {
  job.timer = null;
  if (job.running) return;
  const causes = job.causes.splice(0);
  job.since = Date.now();
  job.running = recomputeBenchmark(job.workspaceId, job.benchmarkId, causes.length ? causes : [{ trigger: 'data-change' }])
    .then(() => {
      job.lastError = null;
      failures.delete(key(job.workspaceId, job.benchmarkId));
    })
    .catch((error: unknown) => {
      job.lastError = error instanceof Error ? error.message : String(error);
      failures.set(key(job.workspaceId, job.benchmarkId), { message: job.lastError, at: Date.now() });
      console.error(`benchmark ${job.benchmarkId}: recomputation failed`, error);
    })
    .finally(() => {
      job.running = null;
      if (job.causes.length > 0) arm(job);
      else if (!job.timer) jobs.delete(key(job.workspaceId, job.benchmarkId));
    });
}

function arm(job: Job, delayMs = debounceMs()): void {
  if (job.timer) clearTimeout(job.timer);
  job.timer = setTimeout(() => start(job), delayMs);
  job.timer.unref?.();
}

/**
 * Queues a recomputation of these benchmarks (all of the workspace when omitted);
 * returns immediately. A curator's decision passes delayMs 0: there is no burst to wait for.
 */
export function scheduleRecompute(
  workspaceId: string,
  benchmarkIds?: string[],
  cause: RecomputeCause = { trigger: 'data-change' },
  delayMs?: number,
): void {
  if (!benchmarkIds) {
    listings.set(workspaceId, (listings.get(workspaceId) ?? 0) + 1);
    listBenchmarkIds(workspaceId)
      .then((ids) => scheduleRecompute(workspaceId, ids, cause, delayMs))
      .catch((error: unknown) => console.error('could not list benchmarks to recompute', error))
      .finally(() => {
        const left = (listings.get(workspaceId) ?? 1) - 1;
        if (left > 0) listings.set(workspaceId, left);
        else listings.delete(workspaceId);
      });
    return;
  }
  for (const benchmarkId of benchmarkIds) {
    const k = key(workspaceId, benchmarkId);
    let job = jobs.get(k);
    if (!job) jobs.set(k, (job = { workspaceId, benchmarkId, timer: null, running: null, causes: [], lastError: null, since: Date.now() }));
    job.causes.push(cause);
    arm(job, delayMs);
  }
}

export function recomputeState(workspaceId: string, benchmarkId: string): RecomputeState {
  const job = jobs.get(key(workspaceId, benchmarkId));
  if (!job) return 'idle';
  return job.running ? 'running' : 'queued';
}

/**
 * The state a workflow waits on: like recomputeState, but 'queued' also while the workspace's benchmark list is
 * being read to queue them (the moment right after an import), and 'failed' when the last run of an idle
 * benchmark failed. Idle means every change committed before this call has been computed.
 */
export function recomputeStatus(workspaceId: string, benchmarkId: string): { state: RecomputeState | 'failed'; error: string | null } {
  const state = recomputeState(workspaceId, benchmarkId);
  if (state !== 'idle') return { state, error: null };
  if (listings.has(workspaceId)) return { state: 'queued', error: null };
  const failure = failures.get(key(workspaceId, benchmarkId));
  return failure ? { state: 'failed', error: failure.message } : { state: 'idle', error: null };
}

/** The queue at a glance, for GET /api/health. */
export function recomputeQueueStatus(now = Date.now()): { queued: number; running: number; oldestMs: number } {
  let queued = 0;
  let running = 0;
  let oldest = now;
  for (const job of jobs.values()) {
    if (job.running) running++;
    else queued++;
    oldest = Math.min(oldest, job.since);
  }
  return { queued, running, oldestMs: now - oldest };
}

/** Resolves when no job of this benchmark (or of any, when omitted) is queued or running: for tests and scripts. */
export async function whenRecomputeIdle(workspaceId?: string, benchmarkId?: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const pending = [...jobs.values()].filter(
      (j) => (!workspaceId || j.workspaceId === workspaceId) && (!benchmarkId || j.benchmarkId === benchmarkId),
    );
    const listing = workspaceId ? listings.has(workspaceId) : listings.size > 0;
    if (pending.length === 0 && !listing) return;
    if (Date.now() > deadline) throw new Error('recomputation did not finish in time');
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
