import 'server-only';
import { and, desc, eq } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { auditLog, user } from '@/db/schema';

/** Who did it: a signed-in user, or a pipeline through an API token (created by a user). */
export interface Actor {
  userId: string | null;
  tokenId?: string | null;
}

export interface AuditInput {
  workspaceId: string;
  actor: Actor;
  action: 'create' | 'update' | 'retract' | 'restore' | 'import' | 'undo-import' | 'decide' | 'revert' | string;
  entityType: string;
  entityId: string;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
}

/** Writes one audit row; call it inside the transaction that makes the change. */
export async function writeAudit(input: AuditInput, executor: Executor = db): Promise<void> {
  await executor.insert(auditLog).values({
    workspaceId: input.workspaceId,
    actorUserId: input.actor.userId,
    actorTokenId: input.actor.tokenId ?? null,
    action: input.action,
    entityType: input.entityType,
    entityId: input.entityId,
    before: input.before ?? null,
    after: input.after ?? null,
    reason: input.reason ?? null,
  });
}

/** The history of one record, newest first, with the actor's name. */
export async function listAudit(workspaceId: string, entityType: string, entityId: string, executor: Executor = db) {
  return executor
    .select({
      id: auditLog.id,
      action: auditLog.action,
      before: auditLog.before,
      after: auditLog.after,
      reason: auditLog.reason,
      createdAt: auditLog.createdAt,
      actorName: user.name,
      actorTokenId: auditLog.actorTokenId,
    })
    .from(auditLog)
    .leftJoin(user, eq(auditLog.actorUserId, user.id))
    .where(and(eq(auditLog.workspaceId, workspaceId), eq(auditLog.entityType, entityType), eq(auditLog.entityId, entityId)))
    .orderBy(desc(auditLog.createdAt));
}

/** The history of one record of a workspace, newest first (for the history page). */
export async function listRecordHistory(workspaceId: string, entityType: string, entityId: string) {
  return listAudit(workspaceId, entityType, entityId, db);
}
