import 'server-only';
import { and, asc, desc, eq, isNull } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { benchmark, member, organization, revision, user, watch, workspaceSettings } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { WatchThresholds } from '@/lib/alerts/thresholds';
import { writeAudit } from './audit';

export type WatchMode = 'immediate' | 'digest';

async function latestRevisionId(executor: Executor, workspaceId: string, benchmarkId: string): Promise<string | null> {
  const rows = await executor
    .select({ id: revision.id })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, benchmarkId), eq(revision.status, 'ready')))
    .orderBy(desc(revision.number))
    .limit(1);
  return rows[0]?.id ?? null;
}

/** This user's watch of a benchmark (active or not), or null. */
export async function getMyWatch(workspaceId: string, benchmarkId: string, userId: string) {
  const rows = await db
    .select({ id: watch.id, mode: watch.mode, thresholds: watch.thresholds, unsubscribedAt: watch.unsubscribedAt })
    .from(watch)
    .where(and(eq(watch.workspaceId, workspaceId), eq(watch.benchmarkId, benchmarkId), eq(watch.userId, userId)))
    .limit(1);
  return rows[0] ?? null;
}

/**
 * Starts (or restarts) a watch. The baseline is the latest revision at this
 * moment: the first alert reports what changes from now on.
 */
export async function watchBenchmark(workspaceId: string, benchmarkId: string, userId: string, mode: WatchMode): Promise<{ id: string }> {
  return db.transaction(async (tx) => {
    const live = await tx
      .select({ id: benchmark.id })
      .from(benchmark)
      .where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.id, benchmarkId), isNull(benchmark.retractedAt)))
      .limit(1);
    if (!live[0]) throw new AppError('not-found', 'No such benchmark in this workspace.');
    const baseline = await latestRevisionId(tx, workspaceId, benchmarkId);
    const existing = await tx
      .select({ id: watch.id, unsubscribedAt: watch.unsubscribedAt, mode: watch.mode })
      .from(watch)
      .where(and(eq(watch.benchmarkId, benchmarkId), eq(watch.userId, userId)))
      .limit(1);
    let id: string;
    if (existing[0]) {
      id = existing[0].id;
      if (existing[0].unsubscribedAt === null && existing[0].mode === mode) return { id };
      await tx
        .update(watch)
        .set(existing[0].unsubscribedAt === null ? { mode } : { mode, unsubscribedAt: null, lastAnnouncedRevisionId: baseline })
        .where(eq(watch.id, id));
    } else {
      [{ id }] = await tx.insert(watch).values({ workspaceId, benchmarkId, userId, mode, lastAnnouncedRevisionId: baseline }).returning({ id: watch.id });
    }
    await writeAudit({ workspaceId, actor: { userId }, action: 'watch', entityType: 'watch', entityId: id, after: { benchmarkId, mode } }, tx);
    return { id };
  });
}

async function requireOwnWatch(executor: Executor, workspaceId: string, watchId: string, userId: string) {
  const rows = await executor
    .select()
    .from(watch)
    .where(and(eq(watch.workspaceId, workspaceId), eq(watch.id, watchId), eq(watch.userId, userId)))
    .limit(1);
  // Someone else's watch is as invisible as one of another workspace.
  if (!rows[0]) throw new AppError('not-found', 'No such watch of yours in this workspace.');
  return rows[0];
}

/** Stops a watch (the row stays, with the time it stopped). */
export async function unwatch(workspaceId: string, watchId: string, userId: string): Promise<void> {
  await db.transaction(async (tx) => {
    const w = await requireOwnWatch(tx, workspaceId, watchId, userId);
    if (w.unsubscribedAt) return;
    await tx.update(watch).set({ unsubscribedAt: new Date() }).where(eq(watch.id, watchId));
    await writeAudit({ workspaceId, actor: { userId }, action: 'unwatch', entityType: 'watch', entityId: watchId, before: { mode: w.mode } }, tx);
  });
}

/** Mode and personal thresholds of one's own watch; the benchmark's thresholds are never touched here. */
export async function updateWatchSettings(workspaceId: string, watchId: string, userId: string, settings: { mode: WatchMode; thresholds: WatchThresholds }): Promise<void> {
  await db.transaction(async (tx) => {
    const w = await requireOwnWatch(tx, workspaceId, watchId, userId);
    const thresholds = Object.keys(settings.thresholds).length ? settings.thresholds : null;
    await tx.update(watch).set({ mode: settings.mode, thresholds: thresholds as Record<string, number> | null }).where(eq(watch.id, watchId));
    await writeAudit({
      workspaceId,
      actor: { userId },
      action: 'update',
      entityType: 'watch',
      entityId: watchId,
      before: { mode: w.mode, thresholds: w.thresholds },
      after: { mode: settings.mode, thresholds },
    }, tx);
  });
}

/** One's own watch, for the webhook form: the URL and when the secret was made (never the secret). */
export async function getMyWatchWebhook(workspaceId: string, watchId: string, userId: string) {
  const w = await requireOwnWatch(db, workspaceId, watchId, userId);
  return { id: w.id, webhookUrl: w.webhookUrl, hasSecret: w.webhookSecret !== null, webhookSecretCreatedAt: w.webhookSecretCreatedAt, unsubscribedAt: w.unsubscribedAt };
}

/**
 * Sets, changes or removes (url null) the webhook of one's own watch. A new
 * sealed secret replaces the stored one when given (first URL, or a rotation);
 * removing the URL drops the secret too. The audit row never holds the secret.
 */
export async function updateWatchWebhook(
  workspaceId: string,
  watchId: string,
  userId: string,
  change: { url: string | null; sealedSecret?: string },
): Promise<void> {
  await db.transaction(async (tx) => {
    const w = await requireOwnWatch(tx, workspaceId, watchId, userId);
    const now = new Date();
    const set =
      change.url === null
        ? { webhookUrl: null, webhookSecret: null, webhookSecretCreatedAt: null }
        : change.sealedSecret
          ? { webhookUrl: change.url, webhookSecret: change.sealedSecret, webhookSecretCreatedAt: now }
          : { webhookUrl: change.url };
    await tx.update(watch).set(set).where(eq(watch.id, watchId));
    await writeAudit(
      {
        workspaceId,
        actor: { userId },
        action: change.url === null ? 'remove-webhook' : change.sealedSecret && w.webhookSecret ? 'rotate-webhook-secret' : 'update-webhook',
        entityType: 'watch',
        entityId: watchId,
        before: { webhookUrl: w.webhookUrl, secretCreatedAt: w.webhookSecretCreatedAt },
        after: { webhookUrl: set.webhookUrl, secretCreatedAt: 'webhookSecretCreatedAt' in set ? set.webhookSecretCreatedAt : w.webhookSecretCreatedAt },
      },
      tx,
    );
  });
}

/**
 * What the outbox worker needs to sign and send one webhook delivery: the
 * watch's sealed secret and whether its workspace allows private targets.
 * Null when the watch is gone or belongs to another workspace.
 */
export async function webhookSendContext(workspaceId: string, watchId: string) {
  const rows = await db
    .select({ id: watch.id, webhookSecret: watch.webhookSecret, allowPrivate: workspaceSettings.allowPrivateWebhookTargets })
    .from(watch)
    .leftJoin(workspaceSettings, eq(workspaceSettings.workspaceId, watch.workspaceId))
    .where(and(eq(watch.workspaceId, workspaceId), eq(watch.id, watchId)))
    .limit(1);
  const row = rows[0];
  return row ? { watchId: row.id, sealedSecret: row.webhookSecret, allowPrivate: row.allowPrivate ?? false } : null;
}

/** The watches of one user in one workspace, active first, with the benchmark's name and defaults. */
export async function listMyWatches(workspaceId: string, userId: string) {
  return db
    .select({
      id: watch.id,
      benchmarkId: watch.benchmarkId,
      benchmarkName: benchmark.name,
      benchmarkQuantity: benchmark.quantity,
      benchmarkThresholds: benchmark.alertThresholds,
      benchmarkRetractedAt: benchmark.retractedAt,
      mode: watch.mode,
      thresholds: watch.thresholds,
      createdAt: watch.createdAt,
      unsubscribedAt: watch.unsubscribedAt,
      baselineNumber: revision.number,
      webhookUrl: watch.webhookUrl,
      webhookSecretCreatedAt: watch.webhookSecretCreatedAt,
    })
    .from(watch)
    .innerJoin(benchmark, eq(benchmark.id, watch.benchmarkId))
    .leftJoin(revision, eq(revision.id, watch.lastAnnouncedRevisionId))
    .where(and(eq(watch.workspaceId, workspaceId), eq(watch.userId, userId)))
    .orderBy(asc(watch.unsubscribedAt), asc(benchmark.name));
}

export interface ActiveWatch {
  id: string;
  workspaceId: string;
  workspaceName: string;
  workspaceSlug: string;
  benchmarkId: string;
  benchmarkName: string;
  benchmarkThresholds: unknown;
  userId: string;
  email: string;
  name: string;
  mode: WatchMode;
  thresholds: unknown;
  lastAnnouncedRevisionId: string | null;
  webhookUrl: string | null;
}

const activeColumns = {
  id: watch.id,
  workspaceId: watch.workspaceId,
  workspaceName: organization.name,
  workspaceSlug: organization.slug,
  benchmarkId: watch.benchmarkId,
  benchmarkName: benchmark.name,
  benchmarkThresholds: benchmark.alertThresholds,
  userId: watch.userId,
  email: user.email,
  name: user.name,
  mode: watch.mode,
  thresholds: watch.thresholds,
  lastAnnouncedRevisionId: watch.lastAnnouncedRevisionId,
  webhookUrl: watch.webhookUrl,
};

/** Watches that still receive mail: not unsubscribed, the watcher still a member, the benchmark live. */
function activeWatchQuery() {
  return db
    .select(activeColumns)
    .from(watch)
    .innerJoin(member, and(eq(member.organizationId, watch.workspaceId), eq(member.userId, watch.userId)))
    .innerJoin(user, eq(user.id, watch.userId))
    .innerJoin(organization, eq(organization.id, watch.workspaceId))
    .innerJoin(benchmark, and(eq(benchmark.id, watch.benchmarkId), eq(benchmark.workspaceId, watch.workspaceId), isNull(benchmark.retractedAt)));
}

export async function activeWatchesOf(workspaceId: string, benchmarkId: string, mode: WatchMode): Promise<ActiveWatch[]> {
  return activeWatchQuery().where(
    and(eq(watch.workspaceId, workspaceId), eq(watch.benchmarkId, benchmarkId), eq(watch.mode, mode), isNull(watch.unsubscribedAt)),
  );
}

export async function activeDigestWatches(): Promise<ActiveWatch[]> {
  return activeWatchQuery().where(and(eq(watch.mode, 'digest'), isNull(watch.unsubscribedAt)));
}

/**
 * For the public unsubscribe page: the watch a signed token names. No session
 * and no workspace here: the verified signature is the authority.
 */
export async function findWatchForUnsubscribe(watchId: string) {
  const rows = await db
    .select({ id: watch.id, unsubscribedAt: watch.unsubscribedAt, benchmarkName: benchmark.name, workspaceName: organization.name })
    .from(watch)
    .innerJoin(benchmark, eq(benchmark.id, watch.benchmarkId))
    .innerJoin(organization, eq(organization.id, watch.workspaceId))
    .where(eq(watch.id, watchId))
    .limit(1);
  return rows[0] ?? null;
}

/** One-click unsubscribe by a verified token; false when the watch does not exist. Repeating it changes nothing. */
export async function unsubscribeWatchById(watchId: string): Promise<{ found: boolean; changed: boolean }> {
  return db.transaction(async (tx) => {
    const rows = await tx.select().from(watch).where(eq(watch.id, watchId)).limit(1);
    const w = rows[0];
    if (!w) return { found: false, changed: false };
    if (w.unsubscribedAt) return { found: true, changed: false };
    await tx.update(watch).set({ unsubscribedAt: new Date() }).where(and(eq(watch.id, watchId), isNull(watch.unsubscribedAt)));
    await writeAudit({
      workspaceId: w.workspaceId,
      actor: { userId: w.userId },
      action: 'unsubscribe',
      entityType: 'watch',
      entityId: watchId,
      before: { mode: w.mode },
      reason: 'one-click unsubscribe link from an alert e-mail',
    }, tx);
    return { found: true, changed: true };
  });
}
