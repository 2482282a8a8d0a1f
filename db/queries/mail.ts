import 'server-only';
import { and, asc, eq, inArray, lte, or, sql, desc } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { mailOutbox, type MailOutboxRow, type NewMail, type OUTBOX_CHANNELS } from '@/db/schema/mail';

export type OutboxChannel = (typeof OUTBOX_CHANNELS)[number];

/** A webhook delivery as the alert service composes it; the outbox gives it its id (the Ledger-Webhook-Id). */
export interface NewWebhookDelivery {
  /** Chosen before the body is written, so the body can carry it too. */
  id: string;
  kind: string;
  url: string;
  watchId: string;
  /** One line for the deliveries list. */
  summary: string;
  /** The exact JSON body that is signed and sent. */
  body: string;
  dedupeKey: string;
}


/** Writes one e-mail to the outbox; a repeated dedupeKey is ignored (the first one stands). */
export async function enqueueMail(mail: NewMail, workspaceId: string | null = null, executor: Executor = db): Promise<void> {
  await executor
    .insert(mailOutbox)
    .values({ ...mail, workspaceId: workspaceId ?? null })
    .onConflictDoNothing({ target: mailOutbox.dedupeKey });
}

/** Writes one webhook delivery to the outbox (in the caller's transaction); a repeated dedupeKey is ignored. */
export async function enqueueWebhook(delivery: NewWebhookDelivery, workspaceId: string, executor: Executor = db): Promise<void> {
  await executor
    .insert(mailOutbox)
    .values({
      id: delivery.id,
      workspaceId,
      channel: 'webhook',
      kind: delivery.kind,
      toAddress: delivery.url,
      subject: delivery.summary,
      textBody: delivery.body,
      htmlBody: '',
      watchId: delivery.watchId,
      dedupeKey: delivery.dedupeKey,
    })
    .onConflictDoNothing({ target: mailOutbox.dedupeKey });
}

/**
 * Claims up to `limit` due e-mails for one delivery pass: pending ones whose
 * time has come, and "sending" ones whose lease ran out (the worker died mid-send).
 */
export async function claimDueMail(now: Date, leaseMs: number, limit: number, executor: Executor = db): Promise<MailOutboxRow[]> {
  return claimDue('email', now, leaseMs, limit, executor);
}

/** claimDueMail for one channel: each channel has its own pass, so a slow webhook receiver never holds up e-mail. */
export async function claimDue(channel: OutboxChannel, now: Date, leaseMs: number, limit: number, executor: Executor = db): Promise<MailOutboxRow[]> {
  const due = await executor
    .select({ id: mailOutbox.id })
    .from(mailOutbox)
    .where(
      and(
        eq(mailOutbox.channel, channel),
        or(
          and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, now)),
          and(eq(mailOutbox.status, 'sending'), lte(mailOutbox.lockedUntil, now)),
        ),
      ),
    )
    .orderBy(asc(mailOutbox.nextAttemptAt))
    .limit(limit);
  if (due.length === 0) return [];
  const ids = due.map((d) => d.id);
  return executor
    .update(mailOutbox)
    .set({ status: 'sending', lockedUntil: new Date(now.getTime() + leaseMs), attempts: sql`${mailOutbox.attempts} + 1` })
    .where(
      and(
        inArray(mailOutbox.id, ids),
        or(eq(mailOutbox.status, 'pending'), and(eq(mailOutbox.status, 'sending'), lte(mailOutbox.lockedUntil, now))),
      ),
    )
    .returning();
}

export async function markMailSent(id: string, providerMessageId: string, now: Date, executor: Executor = db): Promise<void> {
  await executor
    .update(mailOutbox)
    .set({ status: 'sent', providerMessageId, sentAt: now, lockedUntil: null, lastError: null })
    .where(eq(mailOutbox.id, id));
}

export async function markMailRetry(id: string, error: string, nextAttemptAt: Date, executor: Executor = db): Promise<void> {
  await executor
    .update(mailOutbox)
    .set({ status: 'pending', lastError: error, nextAttemptAt, lockedUntil: null })
    .where(eq(mailOutbox.id, id));
}

export async function markMailFailed(id: string, error: string, executor: Executor = db): Promise<void> {
  await executor.update(mailOutbox).set({ status: 'failed', lastError: error, lockedUntil: null }).where(eq(mailOutbox.id, id));
}

export async function listOutbox(workspaceId: string, limit = 50, executor: Executor = db) {
  return executor
    .select({
      id: mailOutbox.id,
      kind: mailOutbox.kind,
      toAddress: mailOutbox.toAddress,
      subject: mailOutbox.subject,
      status: mailOutbox.status,
      attempts: mailOutbox.attempts,
      lastError: mailOutbox.lastError,
      createdAt: mailOutbox.createdAt,
      sentAt: mailOutbox.sentAt,
    })
    .from(mailOutbox)
    .where(and(eq(mailOutbox.workspaceId, workspaceId), eq(mailOutbox.channel, 'email')))
    .orderBy(desc(mailOutbox.createdAt))
    .limit(limit);
}

/** The webhook deliveries of a workspace, newest first, for Settings → Webhooks (the body is not read). */
export async function listWebhookDeliveries(workspaceId: string, limit = 50, executor: Executor = db) {
  return executor
    .select({
      id: mailOutbox.id,
      kind: mailOutbox.kind,
      url: mailOutbox.toAddress,
      summary: mailOutbox.subject,
      watchId: mailOutbox.watchId,
      status: mailOutbox.status,
      attempts: mailOutbox.attempts,
      lastError: mailOutbox.lastError,
      response: mailOutbox.providerMessageId,
      nextAttemptAt: mailOutbox.nextAttemptAt,
      createdAt: mailOutbox.createdAt,
      sentAt: mailOutbox.sentAt,
    })
    .from(mailOutbox)
    .where(and(eq(mailOutbox.workspaceId, workspaceId), eq(mailOutbox.channel, 'webhook')))
    .orderBy(desc(mailOutbox.createdAt))
    .limit(limit);
}
