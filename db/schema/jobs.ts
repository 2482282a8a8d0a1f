import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { JOB_STATUSES } from '@/lib/record-kinds';

export { JOB_STATUSES };

/**
 * Background work shared by every app process on the database: benchmark
 * recomputations, alert announcements and the digest pass (lib/services/jobs).
 *
 * One row per (kind, key). A later request for the same key folds into the row:
 * it appends to the payload, moves runAfter (the debounce) and bumps generation,
 * so a run that started before it does not delete the row when it ends. A run
 * holds a lease (owner + expiry) renewed while it works; an expired lease is
 * taken over by any process. attempts counts claims since the last success;
 * after the configured maximum the row stays as 'failed' with its last error
 * until a new request or a retry queues it again.
 */
export const job = sqliteTable(
  'job',
  {
    id: text().primaryKey().$defaultFn(() => crypto.randomUUID()),
    kind: text().notNull(),
    key: text().notNull(),
    workspaceId: text(),
    /** JSON array of the requests folded into this row (e.g. the causes of a recomputation). */
    payload: text({ mode: 'json' }).$type<unknown[]>().notNull(),
    status: text({ enum: JOB_STATUSES }).notNull().default('queued'),
    runAfter: integer({ mode: 'timestamp_ms' }).notNull(),
    generation: integer().notNull().default(1),
    attempts: integer().notNull().default(0),
    leaseOwner: text(),
    leaseExpiresAt: integer({ mode: 'timestamp_ms' }),
    lastError: text(),
    lastErrorAt: integer({ mode: 'timestamp_ms' }),
    createdAt: integer({ mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch('subsec') * 1000)`),
  },
  (t) => [uniqueIndex('job_kind_key_uq').on(t.kind, t.key), index('job_due_idx').on(t.status, t.runAfter)],
);

export type JobRow = typeof job.$inferSelect;
