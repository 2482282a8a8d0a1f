import { index, integer, real, sqliteTable, text } from 'drizzle-orm/sqlite-core';
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
