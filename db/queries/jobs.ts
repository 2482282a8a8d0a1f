import 'server-only';
import { and, count, eq, inArray, lte, min, or, isNull, sql } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { job, type JobRow } from '@/db/schema';

/** At most this many folded requests are kept in one row's payload; later ones still move runAfter. */
const MAX_PAYLOAD_ITEMS = 1000;

export interface JobRequest {
  kind: string;
  key: string;
  workspaceId?: string | null;
  item: unknown;
  runAfter: Date;
}

/**
 * Queues a request, or folds it into the row already waiting for the same key:
 * the item is appended, runAfter becomes this request's (the debounce is pushed
 * back), generation is bumped so a run in progress leaves the row for another
 * run, and a failed row is queued again with its attempts reset.
 */
export async function enqueueJob(request: JobRequest, executor: Executor = db): Promise<void> {
  const item = JSON.stringify(request.item);
  await executor
    .insert(job)
    .values({ kind: request.kind, key: request.key, workspaceId: request.workspaceId ?? null, payload: [request.item], runAfter: request.runAfter })
    .onConflictDoUpdate({
      target: [job.kind, job.key],
      set: {
        payload: sql`case when json_array_length(${job.payload}) >= ${MAX_PAYLOAD_ITEMS} then ${job.payload} else json_insert(${job.payload}, '$[#]', json(${item})) end`,
        runAfter: sql`excluded.run_after`,
        generation: sql`${job.generation} + 1`,
        attempts: sql`case when ${job.status} = 'failed' then 0 else ${job.attempts} end`,
        status: 'queued',
      },
    });
}

/**
 * Creates the row when none exists for the key (a standing job such as the digest pass). A waiting row is left as
 * it is; a failed one is queued again with its attempts reset (a restart retries a standing job).
 */
export async function ensureJob(request: Omit<JobRequest, 'item'>, executor: Executor = db): Promise<void> {
  await executor
    .insert(job)
    .values({ kind: request.kind, key: request.key, workspaceId: request.workspaceId ?? null, payload: [], runAfter: request.runAfter })
    .onConflictDoUpdate({ target: [job.kind, job.key], set: { status: 'queued', attempts: 0, runAfter: sql`excluded.run_after` }, setWhere: eq(job.status, 'failed') });
}

export type ClaimedJob = Pick<JobRow, 'id' | 'kind' | 'key' | 'workspaceId' | 'payload' | 'generation' | 'attempts' | 'leaseOwner'>;

/**
 * Takes the lease of one due job of these kinds: queued, its runAfter passed, and
 * nobody's lease or an expired one. One UPDATE statement, so two processes
 * cannot claim the same row. attempts counts the claim.
 */
export async function claimJob(owner: string, kinds: string[], now: Date, leaseMs: number): Promise<ClaimedJob | null> {
  if (kinds.length === 0) return null;
  const nowMs = now.getTime();
  const due = db
    .select({ id: job.id })
    .from(job)
    .where(
      and(
        eq(job.status, 'queued'),
        lte(job.runAfter, now),
        inArray(job.kind, kinds),
        or(isNull(job.leaseOwner), lte(job.leaseExpiresAt, now)),
      ),
    )
    .orderBy(job.runAfter)
    .limit(1);
  const [row] = await db
    .update(job)
    .set({ leaseOwner: owner, leaseExpiresAt: new Date(nowMs + leaseMs), attempts: sql`${job.attempts} + 1` })
    .where(eq(job.id, sql`(${due})`))
    .returning({ id: job.id, kind: job.kind, key: job.key, workspaceId: job.workspaceId, payload: job.payload, generation: job.generation, attempts: job.attempts, leaseOwner: job.leaseOwner });
  return row ?? null;
}

/** Extends a held lease; false when the lease is no longer this owner's (it expired and was taken over). */
export async function renewJobLease(claim: ClaimedJob, until: Date): Promise<boolean> {
  const rows = await db
    .update(job)
    .set({ leaseExpiresAt: until })
    .where(and(eq(job.id, claim.id), eq(job.leaseOwner, claim.leaseOwner!)))
    .returning({ id: job.id });
  return rows.length > 0;
}

/**
 * A run ended well. The row is deleted when no request arrived meanwhile;
 * otherwise the items this run handled are dropped from the payload and the
 * lease released, so the later requests get their own run. 'lost' when the
 * lease had passed to another process (which will run the job again).
 */
export async function completeJob(claim: ClaimedJob): Promise<'done' | 'requeued' | 'lost'> {
  return db.transaction(async (tx) => {
    const deleted = await tx
      .delete(job)
      .where(and(eq(job.id, claim.id), eq(job.leaseOwner, claim.leaseOwner!), eq(job.generation, claim.generation)))
      .returning({ id: job.id });
    if (deleted.length) return 'done';
    const [row] = await tx
      .select({ payload: job.payload })
      .from(job)
      .where(and(eq(job.id, claim.id), eq(job.leaseOwner, claim.leaseOwner!)));
    if (!row) return 'lost';
    await tx
      .update(job)
      .set({ payload: row.payload.slice(claim.payload.length), leaseOwner: null, leaseExpiresAt: null, attempts: 0, lastError: null, lastErrorAt: null, createdAt: new Date() })
      .where(eq(job.id, claim.id));
    return 'requeued';
  });
}

/** A run failed: the lease is released with the error, and the job waits until retryAt, or stays failed after its last attempt. */
export async function failJob(claim: ClaimedJob, error: string, now: Date, retryAt: Date | null): Promise<void> {
  await db
    .update(job)
    .set({
      leaseOwner: null,
      leaseExpiresAt: null,
      lastError: error.slice(0, 2000),
      lastErrorAt: now,
      status: retryAt ? 'queued' : 'failed',
      runAfter: retryAt ? sql`max(${job.runAfter}, ${retryAt.getTime()})` : sql`${job.runAfter}`,
    })
    .where(and(eq(job.id, claim.id), eq(job.leaseOwner, claim.leaseOwner!)));
}

export type JobView = Pick<JobRow, 'kind' | 'key' | 'status' | 'runAfter' | 'attempts' | 'leaseOwner' | 'leaseExpiresAt' | 'lastError' | 'lastErrorAt' | 'createdAt'>;

export async function findJob(kind: string, key: string): Promise<JobView | null> {
  const [row] = await db
    .select({
      kind: job.kind,
      key: job.key,
      status: job.status,
      runAfter: job.runAfter,
      attempts: job.attempts,
      leaseOwner: job.leaseOwner,
      leaseExpiresAt: job.leaseExpiresAt,
      lastError: job.lastError,
      lastErrorAt: job.lastErrorAt,
      createdAt: job.createdAt,
    })
    .from(job)
    .where(and(eq(job.kind, kind), eq(job.key, key)));
  return row ?? null;
}

/** How many jobs of these kinds wait or run (failed ones excluded), optionally of one workspace or key prefix. */
export async function countPendingJobs(filter: { kinds: string[]; workspaceId?: string; key?: string }): Promise<number> {
  const [row] = await db
    .select({ n: count() })
    .from(job)
    .where(
      and(
        eq(job.status, 'queued'),
        inArray(job.kind, filter.kinds),
        filter.workspaceId ? eq(job.workspaceId, filter.workspaceId) : undefined,
        filter.key ? eq(job.key, filter.key) : undefined,
      ),
    );
  return Number(row?.n ?? 0);
}

/** The queue at a glance for the health check: waiting, running (a live lease), failed, and the oldest pending row. */
export async function jobQueueStats(kinds: string[], now: Date): Promise<{ queued: number; running: number; failed: number; oldest: Date | null }> {
  const nowMs = now.getTime();
  const [row] = await db
    .select({
      running: sql<number>`coalesce(sum(case when ${job.status} = 'queued' and ${job.leaseOwner} is not null and ${job.leaseExpiresAt} > ${nowMs} then 1 else 0 end), 0)`,
      pending: sql<number>`coalesce(sum(case when ${job.status} = 'queued' then 1 else 0 end), 0)`,
      failed: sql<number>`coalesce(sum(case when ${job.status} = 'failed' then 1 else 0 end), 0)`,
      oldest: min(sql<number>`case when ${job.status} = 'queued' then ${job.createdAt} end`),
    })
    .from(job)
    .where(inArray(job.kind, kinds));
  const running = Number(row?.running ?? 0);
  return {
    queued: Number(row?.pending ?? 0) - running,
    running,
    failed: Number(row?.failed ?? 0),
    oldest: row?.oldest == null ? null : new Date(Number(row.oldest)),
  };
}
