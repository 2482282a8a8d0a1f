import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { organization, user } from './auth';
import { createdAt, id, timestamp } from './columns';
import { TOKEN_ROLES } from '@/lib/record-kinds';

export { TOKEN_ROLES };

/** Per-workspace thresholds for quality checks (defaults are those of lib/science). */
export const workspaceSettings = sqliteTable('workspace_settings', {
  workspaceId: text()
    .primaryKey()
    .references(() => organization.id, { onDelete: 'cascade' }),
  kPointsPerReciprocalAtom: real().notNull().default(1500),
  acousticCm1: real().notNull().default(10),
  imaginaryCm1: real().notNull().default(10),
  bornNeutrality: real().notNull().default(0.1),
  lstRelative: real().notNull().default(0.05),
  /** Webhooks may target private networks (RFC 1918, link-local, CGNAT, unique-local): an owner's choice. */
  allowPrivateWebhookTargets: integer({ mode: 'boolean' }).notNull().default(false),
  updatedAt: timestamp(),
  updatedBy: text().references(() => user.id),
});


/** API tokens for pipelines: only a SHA-256 of the secret is stored. */
export const apiToken = sqliteTable(
  'api_token',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    prefix: text().notNull(),
    tokenHash: text().notNull().unique(),
    role: text({ enum: TOKEN_ROLES }).notNull(),
    createdBy: text()
      .notNull()
      .references(() => user.id),
    createdAt: createdAt(),
    lastUsedAt: timestamp(),
    expiresAt: timestamp(),
    revokedAt: timestamp(),
    revokedBy: text().references(() => user.id),
  },
  (t) => [index('api_token_workspace_idx').on(t.workspaceId)],
);

/**
 * A POST's Idempotency-Key under /api/v1 (lib/services/idempotency.ts): one row per workspace × token × key,
 * claimed before the request runs (status null while it runs) and holding the response once it ran,
 * so a retry gets the same answer. Rows past expiresAt are deleted.
 */
export const idempotencyKey = sqliteTable(
  'idempotency_key',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    tokenId: text()
      .notNull()
      .references(() => apiToken.id, { onDelete: 'cascade' }),
    key: text().notNull(),
    method: text().notNull(),
    path: text().notNull(),
    /** SHA-256 (hex) of the query string and the body bytes. */
    requestHash: text().notNull(),
    /** Null while the first request runs. */
    status: integer(),
    responseBody: text(),
    responseHeaders: text({ mode: 'json' }).$type<Record<string, string>>(),
    createdAt: createdAt(),
    completedAt: timestamp(),
    expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [uniqueIndex('idempotency_key_uq').on(t.workspaceId, t.tokenId, t.key), index('idempotency_key_expires_idx').on(t.expiresAt)],
);

/** Every create, edit, retraction, import and decision, written in the same transaction as the change. */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    actorUserId: text().references(() => user.id),
    actorTokenId: text().references(() => apiToken.id),
    action: text().notNull(),
    entityType: text().notNull(),
    entityId: text().notNull(),
    before: text({ mode: 'json' }).$type<unknown>(),
    after: text({ mode: 'json' }).$type<unknown>(),
    reason: text(),
    createdAt: createdAt(),
    seq: integer(),
  },
  (t) => [
    index('audit_entity_idx').on(t.workspaceId, t.entityType, t.entityId),
    index('audit_time_idx').on(t.workspaceId, t.createdAt),
  ],
);

export type ApiToken = typeof apiToken.$inferSelect;
export type AuditEntry = typeof auditLog.$inferSelect;
