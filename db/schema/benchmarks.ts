import { blob, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { organization, user } from './auth';
import { method } from './catalog';
import { calculation, measurement } from './values';
import { createdAt, id, retraction, timestamp } from './columns';
import { FLAG_KINDS, DECISION_KINDS } from '@/lib/record-kinds';

export { FLAG_KINDS, DECISION_KINDS };

/** A saved comparison: scope and rules are JSON validated by the benchmark schemas. */
export const benchmark = sqliteTable(
  'benchmark',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    purpose: text(),
    quantity: text().notNull(),
    scope: text({ mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    rules: text({ mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    alertThresholds: text({ mode: 'json' }).$type<Record<string, unknown>>(),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    updatedAt: timestamp(),
    ...retraction(),
  },
  (t) => [index('benchmark_workspace_idx').on(t.workspaceId)],
);

/** An immutable statistics snapshot with a fingerprint of exactly the rows used. */
export const revision = sqliteTable(
  'revision',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    benchmarkId: text()
      .notNull()
      .references(() => benchmark.id),
    number: integer().notNull(),
    fingerprint: text().notNull(),
    status: text({ enum: ['computing', 'ready', 'failed'] }).notNull().default('computing'),
    /** The whole snapshot (older revisions), or its head when `snapshot` holds the rest (db/snapshot-bytes.ts). */
    statistics: text({ mode: 'json' }).$type<unknown>(),
    /** The snapshot without its head, packed (lib/benchmark/snapshot-pack.ts) and deflated; null on older revisions. */
    snapshot: blob({ mode: 'buffer' }),
    /** Revisions stored before row sets: the row ids as JSON (db/revision-backfill.ts converts them). */
    rowIds: text({ mode: 'json' }).$type<{ measurements: string[]; calculations: string[] }>(),
    /** The rows used, as their sequence numbers: lib/benchmark/row-set.ts encoding, deflated (db/queries/revisions.ts). */
    rowSet: blob({ mode: 'buffer' }),
    cause: text({ mode: 'json' }).$type<unknown>(),
    createdAt: createdAt(),
    completedAt: timestamp(),
  },
  (t) => [uniqueIndex('revision_number_uq').on(t.benchmarkId, t.number)],
);

/** A curator's pin of a pairing (calculationId null = "no counterpart"); survives recomputation. */
export const pairPin = sqliteTable(
  'pair_pin',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    methodId: text()
      .notNull()
      .references(() => method.id),
    measurementId: text()
      .notNull()
      .references(() => measurement.id),
    calculationId: text().references(() => calculation.id),
    reason: text().notNull(),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    revokedAt: timestamp(),
    revokedBy: text().references(() => user.id),
  },
  (t) => [index('pair_pin_idx').on(t.workspaceId, t.methodId, t.measurementId)],
);


export const flag = sqliteTable(
  'flag',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    benchmarkId: text().references(() => benchmark.id),
    revisionId: text().references(() => revision.id),
    kind: text({ enum: FLAG_KINDS }).notNull(),
    code: text().notNull(),
    methodId: text().references(() => method.id),
    measurementId: text().references(() => measurement.id),
    subjectKey: text().notNull(),
    details: text({ mode: 'json' }).$type<unknown>(),
    createdAt: createdAt(),
  },
  (t) => [index('flag_revision_idx').on(t.revisionId), index('flag_workspace_idx').on(t.workspaceId, t.kind)],
);


/** A curator's keep/exclude, attributed, reversible, with a reason. */
export const decision = sqliteTable(
  'decision',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    benchmarkId: text().references(() => benchmark.id),
    kind: text({ enum: DECISION_KINDS }).notNull(),
    measurementId: text()
      .notNull()
      .references(() => measurement.id),
    methodId: text().references(() => method.id),
    reason: text().notNull(),
    threadId: text(),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    revertedAt: timestamp(),
    revertedBy: text().references(() => user.id),
    revertReason: text(),
  },
  (t) => [index('decision_idx').on(t.workspaceId, t.benchmarkId)],
);

export const watch = sqliteTable(
  'watch',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    benchmarkId: text()
      .notNull()
      .references(() => benchmark.id),
    userId: text()
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    mode: text({ enum: ['immediate', 'digest'] }).notNull().default('immediate'),
    thresholds: text({ mode: 'json' }).$type<Record<string, number>>(),
    lastAnnouncedRevisionId: text().references(() => revision.id),
    createdAt: createdAt(),
    unsubscribedAt: timestamp(),
    /** Also deliver each alert to this URL (checked by lib/webhooks/url-policy.ts), signed with the secret below. */
    webhookUrl: text(),
    /** The signing secret, encrypted (lib/webhooks/secret-box.ts); shown to the watcher once, when made. */
    webhookSecret: text(),
    webhookSecretCreatedAt: timestamp(),
  },
  (t) => [uniqueIndex('watch_uq').on(t.benchmarkId, t.userId)],
);

export type Benchmark = typeof benchmark.$inferSelect;
export type Revision = typeof revision.$inferSelect;
export type Decision = typeof decision.$inferSelect;
