import 'server-only';
import { and, asc, eq, inArray, lte, or, sql, desc } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { mailOutbox, type MailOutboxRow, type NewMail } from '@/db/schema/mail';


/** Writes one e-mail to the outbox; a repeated dedupeKey is ignored (the first one stands). */
export async function enqueueMail(mail: NewMail, workspaceId: string | null = null, executor: Executor = db): Promise<void> {
  await executor
    .insert(mailOutbox)
    .values({ ...mail, workspaceId: workspaceId ?? null })
    .onConflictDoNothing({ target: mailOutbox.dedupeKey });
}

/**
 * Claims up to `limit` due messages for one delivery pass: pending ones whose
 * time has come, and "sending" ones whose lease ran out (the worker died mid-send).
 */
export async function claimDueMail(now: Date, leaseMs: number, limit: number, executor: Executor = db): Promise<MailOutboxRow[]> {
  const due = await executor
    .select({ id: mailOutbox.id })
    .from(mailOutbox)
    .where(
      or(
        and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, now)),
        and(eq(mailOutbox.status, 'sending'), lte(mailOutbox.lockedUntil, now)),
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
    .where(eq(mailOutbox.workspaceId, workspaceId))
    .orderBy(desc(mailOutbox.createdAt))
    .limit(limit);
}
