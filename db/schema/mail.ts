import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { organization } from './auth';
import type { OutgoingMail } from '@/lib/mail/outgoing';
import { MAIL_STATUSES } from '@/lib/record-kinds';

export { MAIL_STATUSES };


/**
 * Every e-mail is written here, in the same transaction as the change that
 * causes it, and delivered by the outbox worker. The row id is the provider's
 * idempotency key, so a retry after a crash cannot deliver twice.
 */
export const mailOutbox = sqliteTable(
  'mail_outbox',
  {
    id: text().primaryKey().$defaultFn(() => crypto.randomUUID()),
    workspaceId: text().references(() => organization.id, { onDelete: 'set null' }),
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
  },
  (t) => [index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt)],
);

export type MailOutboxRow = typeof mailOutbox.$inferSelect;
export type NewMail = OutgoingMail;
// The composed mail must stay insertable as it is.
const _insertable = (m: OutgoingMail): Pick<typeof mailOutbox.$inferInsert, keyof OutgoingMail> => m;
void _insertable;
