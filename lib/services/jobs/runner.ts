import 'server-only';
/**
 * The job runner of this process (db/schema/jobs.ts holds the rules of a row).
 *
 * Modules register a handler per kind at load; a process claims only kinds it
 * has a handler for. The production server leaves them all to its job worker
 * (scripts/job-worker.ts, started by scripts/server.mjs; LEDGER_JOBS_ELSEWHERE=1
 * in the web process), so heavy runs never hold up a request. Work is found two ways: a local timer set when this
 * process queues a job (so one process reacts at once), and a poll every
 * JOB_POLL_MS that finds jobs queued by other processes and expired leases.
 * At most RUN_SLOTS jobs run at a time here. While a handler runs, its lease is
 * renewed every third of JOB_LEASE_MS; if the process dies, the lease runs out
 * and any other process takes the job over.
 *
 * A handler that throws is retried after JOB_RETRY_BASE_MS × 2^(attempts − 1)
 * (capped at 10 minutes) until JOB_MAX_ATTEMPTS, then the row stays failed with
 * its error. A not-found AppError (the benchmark was retracted) ends the job.
 */
import { hostname } from 'node:os';
import { claimJob, completeJob, countPendingJobs, enqueueJob, failJob, renewJobLease, type ClaimedJob, type JobRequest } from '@/db/queries/jobs';
import { envValue } from '@/lib/env';
import { AppError } from '@/lib/errors';
import type { Executor } from '@/db/client';

export type JobHandler = (job: ClaimedJob) => Promise<void>;

const RUN_SLOTS = 2;
const MAX_BACKOFF_MS = 10 * 60_000;

interface RunnerState {
  owner: string;
  handlers: Map<string, JobHandler>;
  active: number;
  poll: ReturnType<typeof setInterval> | null;
  pollEvery: number;
  wakeAt: Map<number, ReturnType<typeof setTimeout>>;
  stopped: boolean;
}

const store = globalThis as unknown as { ledgerJobRunner?: RunnerState };
const state = (store.ledgerJobRunner ??= {
  owner: `${hostname()}:${process.pid}:${crypto.randomUUID().slice(0, 8)}`,
  handlers: new Map(),
  active: 0,
  poll: null,
  pollEvery: 0,
  wakeAt: new Map(),
  stopped: false,
});

/** Who this process is in lease_owner. */
export function jobOwner(): string {
  return state.owner;
}

export function registerJobHandler(kind: string, handler: JobHandler): void {
  state.handlers.set(kind, handler);
}

export function retryDelayMs(attempts: number, baseMs = envValue('JOB_RETRY_BASE_MS')): number {
  return Math.min(MAX_BACKOFF_MS, baseMs * 2 ** Math.max(0, attempts - 1));
}

async function runClaimed(claimed: ClaimedJob): Promise<void> {
  const handler = state.handlers.get(claimed.kind)!;
  const leaseMs = envValue('JOB_LEASE_MS');
  const renew = setInterval(() => {
    renewJobLease(claimed, new Date(Date.now() + leaseMs))
      .then((held) => {
        if (!held) console.warn(`[jobs] ${claimed.kind} ${claimed.key}: lease lost to another process`);
      })
      .catch((error: unknown) => console.error('[jobs] could not renew a lease', error));
  }, Math.max(100, Math.floor(leaseMs / 3)));
  renew.unref?.();
  try {
    await handler(claimed);
    clearInterval(renew);
    await completeJob(claimed);
  } catch (error) {
    clearInterval(renew);
    if (error instanceof AppError && error.code === 'not-found') {
      await completeJob(claimed);
      return;
    }
    const message = error instanceof Error ? error.message : String(error);
    console.error(`[jobs] ${claimed.kind} ${claimed.key} failed (attempt ${claimed.attempts})`, error);
    const now = new Date();
    const retryAt = claimed.attempts >= envValue('JOB_MAX_ATTEMPTS') ? null : new Date(now.getTime() + retryDelayMs(claimed.attempts));
    await failJob(claimed, message, now, retryAt);
  }
}

/** scripts/server.mjs runs the jobs in a worker process of their own and tells the web server so. */
function jobsRunElsewhere(): boolean {
  return process.env.LEDGER_JOBS_ELSEWHERE === '1';
}

/** Claims and runs due jobs until none is left or every slot is busy; never throws. */
async function pump(): Promise<void> {
  if (state.stopped || jobsRunElsewhere() || state.active >= RUN_SLOTS) return;
  state.active++;
  try {
    for (;;) {
      const claimed = await claimJob(state.owner, [...state.handlers.keys()], new Date(), envValue('JOB_LEASE_MS'));
      if (!claimed) break;
      await runClaimed(claimed);
    }
  } catch (error) {
    console.error('[jobs] a pass failed', error);
  } finally {
    state.active--;
  }
}

function ensurePolling(): void {
  const every = envValue('JOB_POLL_MS');
  if (state.poll && state.pollEvery === every) return;
  if (state.poll) clearInterval(state.poll);
  state.pollEvery = every;
  state.poll = setInterval(() => void pump(), every);
  state.poll.unref?.();
}

/** Runs the pump when runAfter comes (one timer per due time, so a burst of requests sets few). */
function wakeAt(runAfter: Date): void {
  ensurePolling();
  const at = runAfter.getTime();
  if (state.wakeAt.has(at)) return;
  const timer = setTimeout(
    () => {
      state.wakeAt.delete(at);
      void pump();
    },
    Math.max(0, at - Date.now()) + 5,
  );
  timer.unref?.();
  state.wakeAt.set(at, timer);
}

/** Queues (or folds) a request in the database and wakes this process's runner when it is due. */
export async function queueJob(request: JobRequest, executor?: Executor): Promise<void> {
  await enqueueJob(request, executor);
  wakeAt(request.runAfter);
}

/** Wakes this process's runner at a time (after a caller queued rows itself, e.g. in its own transaction). */
export function wakeJobRunner(at = new Date()): void {
  wakeAt(at);
}

/** Starts polling for due jobs (server start-up); queueJob starts it too. */
export function startJobRunner(): void {
  state.stopped = false;
  ensurePolling();
  void pump();
}

/** Stops claiming new jobs in this process (tests that play a second process); the current run finishes. */
export function stopJobRunner(): void {
  state.stopped = true;
  if (state.poll) clearInterval(state.poll);
  state.poll = null;
  for (const timer of state.wakeAt.values()) clearTimeout(timer);
  state.wakeAt.clear();
}

/** Resolves when no job of these kinds (optionally of one workspace or key) waits or runs; failed ones do not count. For tests and scripts. */
export async function whenJobsIdle(filter: { kinds: string[]; workspaceId?: string; key?: string }, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if ((await countPendingJobs(filter)) === 0) return;
    if (Date.now() > deadline) throw new Error(`${filter.kinds.join('/')} jobs did not finish in time`);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
