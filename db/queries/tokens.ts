import 'server-only';
import { and, desc, eq, isNull } from 'drizzle-orm';
import { db } from '@/db/client';
import { apiToken, member, user } from '@/db/schema';
import type { TOKEN_ROLES } from '@/db/schema/workspace';
import { writeAudit } from '@/db/queries/audit';
import { AppError } from '@/lib/errors';

export type TokenRole = (typeof TOKEN_ROLES)[number];

/** Stores a new token (only the hash of the secret) and audits it. */
export async function insertApiToken(input: {
  workspaceId: string;
  name: string;
  role: TokenRole;
  prefix: string;
  tokenHash: string;
  createdBy: string;
  expiresAt: Date | null;
}): Promise<{ id: string }> {
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(apiToken).values(input).returning({ id: apiToken.id });
    await writeAudit({
      workspaceId: input.workspaceId,
      actor: { userId: input.createdBy },
      action: 'create',
      entityType: 'api-token',
      entityId: row.id,
      after: { name: input.name, role: input.role, prefix: input.prefix, expiresAt: input.expiresAt?.toISOString() ?? null },
    }, tx);
    return row;
  });
}

export async function listApiTokens(workspaceId: string) {
  return db
    .select({
      id: apiToken.id,
      name: apiToken.name,
      prefix: apiToken.prefix,
      role: apiToken.role,
      createdAt: apiToken.createdAt,
      lastUsedAt: apiToken.lastUsedAt,
      expiresAt: apiToken.expiresAt,
      revokedAt: apiToken.revokedAt,
      createdBy: apiToken.createdBy,
      creatorName: user.name,
    })
    .from(apiToken)
    .innerJoin(user, eq(apiToken.createdBy, user.id))
    .where(eq(apiToken.workspaceId, workspaceId))
    .orderBy(desc(apiToken.createdAt));
}

/** Revokes a live token of this workspace; `onlyOwnBy` limits it to tokens that user created. */
export async function revokeApiToken(workspaceId: string, tokenId: string, actorUserId: string, onlyOwnBy: string | null): Promise<void> {
  await db.transaction(async (tx) => {
    const [token] = await tx
      .select()
      .from(apiToken)
      .where(and(eq(apiToken.workspaceId, workspaceId), eq(apiToken.id, tokenId)))
      .limit(1);
    if (!token) throw new AppError('not-found', 'No such API token in this workspace.');
    if (onlyOwnBy && token.createdBy !== onlyOwnBy) throw new AppError('forbidden', 'You can revoke only the tokens you created.');
    if (token.revokedAt) throw new AppError('conflict', 'This token is already revoked.');
    const now = new Date();
    await tx.update(apiToken).set({ revokedAt: now, revokedBy: actorUserId }).where(eq(apiToken.id, tokenId));
    await writeAudit({
      workspaceId,
      actor: { userId: actorUserId },
      action: 'retract',
      entityType: 'api-token',
      entityId: tokenId,
      before: { revokedAt: null },
      after: { revokedAt: now.toISOString() },
      reason: 'Token revoked',
    }, tx);
  });
}

/**
 * A live token by the hash of its secret, with the creator's current role in
 * the token's workspace (null when the creator is no longer a member).
 */
export async function findLiveTokenByHash(tokenHash: string) {
  const rows = await db
    .select({
      id: apiToken.id,
      workspaceId: apiToken.workspaceId,
      role: apiToken.role,
      createdBy: apiToken.createdBy,
      expiresAt: apiToken.expiresAt,
      lastUsedAt: apiToken.lastUsedAt,
      creatorRole: member.role,
    })
    .from(apiToken)
    .leftJoin(member, and(eq(member.organizationId, apiToken.workspaceId), eq(member.userId, apiToken.createdBy)))
    .where(and(eq(apiToken.tokenHash, tokenHash), isNull(apiToken.revokedAt)))
    .limit(1);
  return rows[0] ?? null;
}

export async function touchApiToken(tokenId: string, at: Date): Promise<void> {
  await db.update(apiToken).set({ lastUsedAt: at }).where(eq(apiToken.id, tokenId));
}
