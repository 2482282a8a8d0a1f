import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { job } from '@/db/schema';
import { claimJob, completeJob, enqueueJob, findJob } from '@/db/queries/jobs';
import { queueJob, registerJobHandler, retryDelayMs, whenJobsIdle } from '@/lib/services/jobs/runner';
import type { ClaimedJob } from '@/db/queries/jobs';

// The rules of a job row (db/schema/jobs.ts) and of the runner (lib/services/jobs/runner.ts), in one process.
const runs: Record<string, unknown[][]> = {};
const gates: Record<string, Promise<void>> = {};

beforeAll(() => {
  process.env.JOB_POLL_MS = '50';
  process.env.JOB_RETRY_BASE_MS = '20';
  process.env.JOB_MAX_ATTEMPTS = '3';
  vi.spyOn(console, 'error').mockImplementation(() => undefined);
  registerJobHandler('test-record', async (claimed) => {
    (runs[claimed.key] ??= []).push(claimed.payload);
    await gates[claimed.key];
  });
  registerJobHandler('test-poison', async () => {
    throw new Error('always fails (test)');
  });
});

afterEach(() => Object.keys(gates).forEach((k) => delete gates[k]));

const soon = (ms = 0) => new Date(Date.now() + ms);

describe('durable jobs', () => {
  it('folds a burst of requests for one key into one run with every item', async () => {
    for (const n of [1, 2, 3]) await queueJob({ kind: 'test-record', key: 'burst', item: n, runAfter: soon(150) });
    await whenJobsIdle({ kinds: ['test-record'], key: 'burst' });
    expect(runs.burst).toEqual([[1, 2, 3]]);
    expect(await findJob('test-record', 'burst')).toBeNull();
  });

  it('a request that arrives during a run gets a run of its own, with only its item', async () => {
    let release!: () => void;
    gates.during = new Promise<void>((r) => (release = r));
    await queueJob({ kind: 'test-record', key: 'during', item: 'first', runAfter: soon() });
    await vi.waitFor(() => expect(runs.during).toHaveLength(1));
    await queueJob({ kind: 'test-record', key: 'during', item: 'second', runAfter: soon() });
    delete gates.during;
    release();
    await whenJobsIdle({ kinds: ['test-record'], key: 'during' });
    expect(runs.during).toEqual([['first'], ['second']]);
  });

  it('one claim per key: a second claimant gets nothing while the lease holds, and takes the job once it has expired', async () => {
    await enqueueJob({ kind: 'test-lease', key: 'k', item: 'x', runAfter: soon() });
    const now = new Date();
    const first = await claimJob('process-a', ['test-lease'], now, 1000);
    expect(first).toMatchObject({ key: 'k', attempts: 1, leaseOwner: 'process-a' });
    expect(await claimJob('process-b', ['test-lease'], new Date(now.getTime() + 999), 1000)).toBeNull();
    const second = await claimJob('process-b', ['test-lease'], new Date(now.getTime() + 1001), 1000);
    expect(second).toMatchObject({ key: 'k', attempts: 2, leaseOwner: 'process-b' });
    // The first holder finishing late changes nothing: the row is the second holder's.
    expect(await completeJob(first as ClaimedJob)).toBe('lost');
    expect(await completeJob(second as ClaimedJob)).toBe('done');
    expect(await findJob('test-lease', 'k')).toBeNull();
  });

  it('claims atomically: ten concurrent claimants of one due job, one wins', async () => {
    await enqueueJob({ kind: 'test-race', key: 'k', item: 1, runAfter: soon() });
    const claims = await Promise.all(Array.from({ length: 10 }, (_, i) => claimJob(`p${i}`, ['test-race'], new Date(), 60_000)));
    expect(claims.filter(Boolean)).toHaveLength(1);
  });

  it('a poisoned job stops after its attempts with its error kept, and the rest of the queue keeps running', async () => {
    await queueJob({ kind: 'test-poison', key: 'bad', item: 1, runAfter: soon() });
    await queueJob({ kind: 'test-record', key: 'after-poison', item: 'ok', runAfter: soon(10) });
    await whenJobsIdle({ kinds: ['test-poison', 'test-record'] });
    const failed = await findJob('test-poison', 'bad');
    expect(failed).toMatchObject({ status: 'failed', attempts: 3, lastError: 'always fails (test)', leaseOwner: null });
    expect(runs['after-poison']).toEqual([['ok']]);
    // A new request queues it again with fresh attempts.
    await enqueueJob({ kind: 'test-poison', key: 'bad', item: 2, runAfter: soon(60_000) });
    expect(await findJob('test-poison', 'bad')).toMatchObject({ status: 'queued', attempts: 0 });
    await db.delete(job).where(and(eq(job.kind, 'test-poison'), eq(job.key, 'bad')));
  });

  it('a web process whose jobs run in the job worker (LEDGER_JOBS_ELSEWHERE=1) claims none', async () => {
    process.env.LEDGER_JOBS_ELSEWHERE = '1';
    try {
      await queueJob({ kind: 'test-record', key: 'elsewhere', item: 'x', runAfter: soon() });
      await new Promise((r) => setTimeout(r, 300));
      expect(runs.elsewhere).toBeUndefined();
      expect(await findJob('test-record', 'elsewhere')).toMatchObject({ status: 'queued', leaseOwner: null });
    } finally {
      process.env.LEDGER_JOBS_ELSEWHERE = '';
    }
    await whenJobsIdle({ kinds: ['test-record'], key: 'elsewhere' });
    expect(runs.elsewhere).toEqual([['x']]);
  });

  it('backs off exponentially from JOB_RETRY_BASE_MS, capped at 10 minutes', () => {
    expect([1, 2, 3, 4].map((a) => retryDelayMs(a, 5000))).toEqual([5000, 10_000, 20_000, 40_000]);
    expect(retryDelayMs(30, 5000)).toBe(600_000);
  });
});
