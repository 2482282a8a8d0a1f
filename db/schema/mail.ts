import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { organization } from './auth';
import type { OutgoingMail } from '@/lib/mail/outgoing';
import { MAIL_STATUSES, OUTBOX_CHANNELS } from '@/lib/record-kinds';

export { MAIL_STATUSES, OUTBOX_CHANNELS };


/**
 * Every e-mail is written here, in the same transaction as the change that
 * causes it, and delivered by the outbox worker. The row id is the provider's
 * idempotency key, so a retry after a crash cannot deliver twice.
 *
 * Webhook deliveries share the table (channel 'webhook'): toAddress is the
 * target URL, textBody the exact JSON body, subject a one-line summary for the
 * deliveries list, htmlBody empty; the row id goes out as Ledger-Webhook-Id and
 * watchId names the watch whose secret signs it.
 */
export const mailOutbox = sqliteTable(
  'mail_outbox',
  {
    id: text().primaryKey().$defaultFn(() => crypto.randomUUID()),
    workspaceId: text().references(() => organization.id, { onDelete: 'set null' }),
    channel: text({ enum: OUTBOX_CHANNELS }).notNull().default('email'),
    kind: text().notNull(),
    toAddress: text().notNull(),
    subject: text().notNull(),
    textBody: text().notNull(),
    htmlBody: text().notNull(),
    headers: text({ mode: 'json' }).$type<Record<string, string>>(),
    /** Dedupes logically identical mails (e.g. one alert per watcher × revision). */
    dedupeKey: text().unique(),
    status: text({ enum: MAIL_STATUSES }).notNull().default('pending'),
    attempts: integer().notNull().default(0),
    nextAttemptAt: integer({ mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch('subsec') * 1000)`),
    lockedUntil: integer({ mode: 'timestamp_ms' }),
    lastError: text(),
    providerMessageId: text(),
    createdAt: integer({ mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch('subsec') * 1000)`),
    sentAt: integer({ mode: 'timestamp_ms' }),
    /** The watch whose signing secret signs a webhook delivery (null for e-mail). */
    watchId: text(),
  },
  (t) => [index('mail_outbox_due_idx').on(t.channel, t.status, t.nextAttemptAt)],
);

export type MailOutboxRow = typeof mailOutbox.$inferSelect;
export type NewMail = OutgoingMail;
// The composed mail must stay insertable as it is.
const _insertable = (m: OutgoingMail): Pick<typeof mailOutbox.$inferInsert, keyof OutgoingMail> => m;
void _insertable;
