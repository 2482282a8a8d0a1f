import 'server-only';
import { and, eq, isNull, lt } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { idempotencyKey } from '@/db/schema';

export interface IdempotencyRecord {
  id: string;
  method: string;
  path: string;
  requestHash: string;
  status: number | null;
  responseBody: string | null;
  responseHeaders: Record<string, string> | null;
  createdAt: Date;
  expiresAt: Date;
}

const columns = {
  id: idempotencyKey.id,
  method: idempotencyKey.method,
  path: idempotencyKey.path,
  requestHash: idempotencyKey.requestHash,
  status: idempotencyKey.status,
  responseBody: idempotencyKey.responseBody,
  responseHeaders: idempotencyKey.responseHeaders,
  createdAt: idempotencyKey.createdAt,
  expiresAt: idempotencyKey.expiresAt,
};

/**
 * Claims a key for a request about to run: one INSERT that either creates the row (returns its id) or
 * finds the key taken (returns null), so two concurrent requests cannot both claim it.
 */
export async function claimIdempotencyKey(
  workspaceId: string,
  claim: { tokenId: string; key: string; method: string; path: string; requestHash: string; expiresAt: Date },
  executor: Executor = db,
): Promise<string | null> {
  const rows = await executor
    .insert(idempotencyKey)
    .values({ workspaceId, ...claim })
    .onConflictDoNothing({ target: [idempotencyKey.workspaceId, idempotencyKey.tokenId, idempotencyKey.key] })
    .returning({ id: idempotencyKey.id });
  return rows[0]?.id ?? null;
}

export async function findIdempotencyKey(workspaceId: string, tokenId: string, key: string, executor: Executor = db): Promise<IdempotencyRecord | null> {
  const rows = await executor
    .select(columns)
    .from(idempotencyKey)
    .where(and(eq(idempotencyKey.workspaceId, workspaceId), eq(idempotencyKey.tokenId, tokenId), eq(idempotencyKey.key, key)))
    .limit(1);
  return rows[0] ?? null;
}

/** Stores the response of the request that claimed the key. */
export async function completeIdempotencyKey(
  workspaceId: string,
  id: string,
  response: { status: number; body: string; headers: Record<string, string> },
  executor: Executor = db,
): Promise<void> {
  await executor
    .update(idempotencyKey)
    .set({ status: response.status, responseBody: response.body, responseHeaders: response.headers, completedAt: new Date() })
    .where(and(eq(idempotencyKey.workspaceId, workspaceId), eq(idempotencyKey.id, id), isNull(idempotencyKey.status)));
}

/** Gives a key back (the request failed in a way a retry may fix, or its claim was stale). */
export async function releaseIdempotencyKey(workspaceId: string, id: string, executor: Executor = db): Promise<void> {
  await executor.delete(idempotencyKey).where(and(eq(idempotencyKey.workspaceId, workspaceId), eq(idempotencyKey.id, id)));
}

/** Deletes every key whose window has ended (any workspace: expiry is not workspace data). Returns how many. */
export async function pruneIdempotencyKeys(now: Date, executor: Executor = db): Promise<number> {
  const rows = await executor.delete(idempotencyKey).where(lt(idempotencyKey.expiresAt, now)).returning({ id: idempotencyKey.id });
  return rows.length;
}
