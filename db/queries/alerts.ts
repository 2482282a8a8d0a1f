import 'server-only';
import { and, asc, desc, eq, gt, gte, inArray, isNull, like, lt, lte, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { CauseLookups } from '@/lib/alerts/causes';
import { db } from '@/db/client';
import { snapshotOfRow } from '@/db/snapshot-bytes';
import { auditLog, decision, importBatch, mailOutbox, method, pairPin, revision, user, watch, type NewMail } from '@/db/schema';
import type { BenchmarkSnapshot, MethodResult } from '@/lib/benchmark/types';
import type { RevisionCause } from '@/lib/benchmark/revision-record';
import { enqueueMail, enqueueWebhook, type NewWebhookDelivery } from './mail';

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
    .select({ id: revision.id, number: revision.number, createdAt: revision.createdAt, statistics: revision.statistics, snapshot: revision.snapshot })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, id), eq(revision.status, 'ready')))
    .limit(1);
  if (!rows[0]) return null;
  const { snapshot, ...head } = rows[0];
  const found = { ...head, statistics: snapshotOfRow(head.statistics, snapshot) };
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
 * `toRevisionId` and write the mail (and the webhook delivery, when the watch
 * has a URL) to the outbox. If the baseline moved meanwhile (another pass
 * announced it, or the watch stopped) nothing is written.
 */
export async function recordAlert(
  mail: NewMail,
  input: { workspaceId: string; watchId: string; fromRevisionId: string | null; toRevisionId: string },
  webhook?: NewWebhookDelivery,
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
    await enqueueMail(mail, input.workspaceId, tx);
    if (webhook) await enqueueWebhook(webhook, input.workspaceId, tx);
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
/** The webhook delivery beside a mail: `webhook:` + the mail's dedupe key. */
export function webhookDedupeKey(mailDedupeKey: string): string {
  return `webhook:${mailDedupeKey}`;
}

/** What was sent for one watch, and when (from the outbox), newest first. */
export async function listAlertLog(workspaceId: string, watchId: string, limit = 50) {
  const escaped = watchId.replace(/[\\%_]/g, (c) => `\\${c}`);
  return db
    .select({
      id: mailOutbox.id,
      kind: mailOutbox.kind,
      channel: mailOutbox.channel,
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
          like(mailOutbox.dedupeKey, sql`${`webhook:alert:${escaped}:%`} escape '\\'`),
          like(mailOutbox.dedupeKey, sql`${`webhook:digest:${escaped}:%`} escape '\\'`),
        ),
      ),
    )
    .orderBy(desc(mailOutbox.createdAt))
    .limit(limit);
}

const LOOKUP_CHUNK = 500;

async function inChunks<T>(ids: readonly string[], read: (chunk: string[]) => Promise<T[]>): Promise<T[]> {
  const out: T[] = [];
  const unique = [...new Set(ids)];
  for (let i = 0; i < unique.length; i += LOOKUP_CHUNK) out.push(...(await read(unique.slice(i, i + LOOKUP_CHUNK))));
  return out;
}

/**
 * Names for the causes of an alert (this workspace only): imports, decisions, pins and
 * users by id, and the edits of the benchmark's alert thresholds between two instants.
 */
export async function causeLookups(
  workspaceId: string,
  benchmarkId: string,
  ids: { imports: string[]; decisions: string[]; pins: string[]; users: string[] },
  between: { from: Date | null; to: Date },
): Promise<CauseLookups> {
  const reverter = alias(user, 'reverter');
  const [imports, decisions, pins, users, edits] = await Promise.all([
    inChunks(ids.imports, (chunk) =>
      db
        .select({ id: importBatch.id, fileName: importBatch.fileName, by: user.name })
        .from(importBatch)
        .leftJoin(user, eq(importBatch.createdBy, user.id))
        .where(and(eq(importBatch.workspaceId, workspaceId), inArray(importBatch.id, chunk))),
    ),
    inChunks(ids.decisions, (chunk) =>
      db
        .select({ id: decision.id, kind: decision.kind, reason: decision.reason, by: user.name, method: method.label, revertedBy: reverter.name, revertReason: decision.revertReason })
        .from(decision)
        .leftJoin(user, eq(decision.createdBy, user.id))
        .leftJoin(reverter, eq(decision.revertedBy, reverter.id))
        .leftJoin(method, eq(decision.methodId, method.id))
        .where(and(eq(decision.workspaceId, workspaceId), inArray(decision.id, chunk))),
    ),
    inChunks(ids.pins, (chunk) =>
      db
        .select({ id: pairPin.id, reason: pairPin.reason, by: user.name, method: method.label, calculationId: pairPin.calculationId })
        .from(pairPin)
        .leftJoin(user, eq(pairPin.createdBy, user.id))
        .leftJoin(method, eq(pairPin.methodId, method.id))
        .where(and(eq(pairPin.workspaceId, workspaceId), inArray(pairPin.id, chunk))),
    ),
    inChunks(ids.users, (chunk) => db.select({ id: user.id, name: user.name }).from(user).where(inArray(user.id, chunk))),
    db
      .select({ at: auditLog.createdAt, before: auditLog.before, after: auditLog.after, by: user.name })
      .from(auditLog)
      .leftJoin(user, eq(auditLog.actorUserId, user.id))
      .where(
        and(
          eq(auditLog.workspaceId, workspaceId),
          eq(auditLog.entityType, 'benchmark'),
          eq(auditLog.entityId, benchmarkId),
          eq(auditLog.action, 'update'),
          between.from ? gte(auditLog.createdAt, between.from) : undefined,
          lte(auditLog.createdAt, between.to),
        ),
      ),
  ]);
  const thresholds = (v: unknown) => JSON.stringify((v as { alertThresholds?: unknown } | null)?.alertThresholds ?? null);
  return {
    imports: new Map(imports.map((i) => [i.id, { fileName: i.fileName, by: i.by }])),
    decisions: new Map(decisions.map((d) => [d.id, { kind: d.kind, reason: d.reason, by: d.by, method: d.method, revertedBy: d.revertedBy, revertReason: d.revertReason }])),
    pins: new Map(pins.map((p) => [p.id, { reason: p.reason, by: p.by, method: p.method, noCounterpart: p.calculationId === null }])),
    users: new Map(users.map((u) => [u.id, u.name])),
    thresholdEdits: edits.filter((e) => thresholds(e.before) !== thresholds(e.after)).map((e) => ({ by: e.by, at: e.at })),
  };
}
