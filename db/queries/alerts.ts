import 'server-only';
import { and, asc, desc, eq, gt, isNull, like, lt, lte, or, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { mailOutbox, revision, watch, type NewMail } from '@/db/schema';
import type { BenchmarkSnapshot, MethodResult } from '@/lib/benchmark/types';
import type { RevisionCause } from './revisions';
import { enqueueMail } from './mail';

export interface AlertRevision {
  id: string;
  number: number;
  createdAt: Date;
  statistics: BenchmarkSnapshot;
}

/** Revisions are immutable: parsed snapshots are cached by id (a few, they can be large). */
const cache = new Map<string, AlertRevision>();

async function loadSnapshot(workspaceId: string, id: string): Promise<AlertRevision | null> {
  const hit = cache.get(id);
  if (hit) return hit;
  const rows = await db
    .select({ id: revision.id, number: revision.number, createdAt: revision.createdAt, statistics: revision.statistics })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, id), eq(revision.status, 'ready')))
    .limit(1);
  if (!rows[0]) return null;
  const found = { ...rows[0], statistics: rows[0].statistics as BenchmarkSnapshot };
  cache.set(id, found);
  if (cache.size > 6) cache.delete(cache.keys().next().value!);
  return found;
}

export function revisionSnapshot(workspaceId: string, revisionId: string): Promise<AlertRevision | null> {
  return loadSnapshot(workspaceId, revisionId);
}

/** The latest ready revision of a benchmark (created before `before` when given), with its snapshot. */
export async function latestRevisionSnapshot(workspaceId: string, benchmarkId: string, before?: Date): Promise<AlertRevision | null> {
  const rows = await db
    .select({ id: revision.id })
    .from(revision)
    .where(
      and(
        eq(revision.workspaceId, workspaceId),
        eq(revision.benchmarkId, benchmarkId),
        eq(revision.status, 'ready'),
        before ? lt(revision.createdAt, before) : undefined,
      ),
    )
    .orderBy(desc(revision.number))
    .limit(1);
  return rows[0] ? loadSnapshot(workspaceId, rows[0].id) : null;
}

export interface RevisionStep {
  number: number;
  createdAt: Date;
  cause: RevisionCause | null;
  methods: MethodResult[];
}

/** The revisions after `afterNumber` up to `upToNumber`, oldest first, with causes and per-method headlines (no pairs). */
export async function revisionSteps(workspaceId: string, benchmarkId: string, afterNumber: number, upToNumber: number): Promise<RevisionStep[]> {
  const rows = await db
    .select({
      number: revision.number,
      createdAt: revision.createdAt,
      cause: revision.cause,
      methods: sql<string | null>`json_extract(${revision.statistics}, '$.methods')`,
    })
    .from(revision)
    .where(
      and(
        eq(revision.workspaceId, workspaceId),
        eq(revision.benchmarkId, benchmarkId),
        eq(revision.status, 'ready'),
        gt(revision.number, afterNumber),
        lte(revision.number, upToNumber),
      ),
    )
    .orderBy(asc(revision.number));
  return rows.map((r) => ({
    number: r.number,
    createdAt: r.createdAt,
    cause: (r.cause as RevisionCause | null) ?? null,
    methods: JSON.parse(r.methods ?? '[]') as MethodResult[],
  }));
}

/**
 * In one transaction: move the watch's baseline from `fromRevisionId` to
 * `toRevisionId` and write the mail to the outbox. If the baseline moved
 * meanwhile (another pass announced it, or the watch stopped) nothing is written.
 */
export async function recordAlert(
  mail: NewMail,
  input: { workspaceId: string; watchId: string; fromRevisionId: string | null; toRevisionId: string },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const moved = await tx
      .update(watch)
      .set({ lastAnnouncedRevisionId: input.toRevisionId })
      .where(
        and(
          eq(watch.id, input.watchId),
          eq(watch.workspaceId, input.workspaceId),
          isNull(watch.unsubscribedAt),
          input.fromRevisionId === null ? isNull(watch.lastAnnouncedRevisionId) : eq(watch.lastAnnouncedRevisionId, input.fromRevisionId),
        ),
      )
      .returning({ id: watch.id });
    if (moved.length === 0) return false;
    await enqueueMail(tx, mail, input.workspaceId);
    return true;
  });
}

/** Dedupe keys of the mails of one watch: `alert:<watchId>:<revisionId>` and `digest:<watchId>:<day>`. */
export function alertDedupeKey(watchId: string, revisionId: string): string {
  return `alert:${watchId}:${revisionId}`;
}
export function digestDedupeKey(watchId: string, day: string): string {
  return `digest:${watchId}:${day}`;
}

/** What was sent for one watch, and when (from the outbox), newest first. */
export async function listAlertLog(workspaceId: string, watchId: string, limit = 50) {
  const escaped = watchId.replace(/[\\%_]/g, (c) => `\\${c}`);
  return db
    .select({
      id: mailOutbox.id,
      kind: mailOutbox.kind,
      subject: mailOutbox.subject,
      status: mailOutbox.status,
      attempts: mailOutbox.attempts,
      createdAt: mailOutbox.createdAt,
      sentAt: mailOutbox.sentAt,
    })
    .from(mailOutbox)
    .where(
      and(
        eq(mailOutbox.workspaceId, workspaceId),
        or(
          like(mailOutbox.dedupeKey, sql`${`alert:${escaped}:%`} escape '\\'`),
          like(mailOutbox.dedupeKey, sql`${`digest:${escaped}:%`} escape '\\'`),
        ),
      ),
    )
    .orderBy(desc(mailOutbox.createdAt))
    .limit(limit);
}
