import 'server-only';
import { randomUUID } from 'node:crypto';
import { getClient } from '@/db/client';

export interface RateDecision {
  allowed: boolean;
  /** Seconds until the key's window ends (when refused). */
  retryAfterSeconds: number;
}

/**
 * One step of a fixed-window counter in the rate_limit table (better-auth's table, shared with its own limits):
 * a single upsert, so concurrent requests cannot all pass a stale read. `last_request` holds the window's start.
 */
export async function consumeRateLimit(
  key: string,
  rule: { windowSeconds: number; max: number },
  table: { maxRows: number; keepSeconds: number },
  now = Date.now(),
): Promise<RateDecision> {
  const windowMs = rule.windowSeconds * 1000;
  const { rows } = await getClient().execute({
    sql: `INSERT INTO rate_limit (id, key, count, last_request) VALUES (?, ?, 1, ?)
          ON CONFLICT(key) DO UPDATE SET
            count = CASE WHEN excluded.last_request - rate_limit.last_request >= ? THEN 1 ELSE rate_limit.count + 1 END,
            last_request = CASE WHEN excluded.last_request - rate_limit.last_request >= ? THEN excluded.last_request ELSE rate_limit.last_request END
          RETURNING count, last_request`,
    args: [randomUUID(), key, now, windowMs, windowMs],
  });
  const count = Number(rows[0].count);
  const windowStart = Number(rows[0].last_request);
  // A new window (a new key, or an old one reset) is the only time the table can grow: bound it then.
  if (count === 1) await pruneRateLimits(table.maxRows, now - Math.max(windowMs, table.keepSeconds * 1000));
  return { allowed: count <= rule.max, retryAfterSeconds: Math.max(1, Math.ceil((windowStart + windowMs - now) / 1000)) };
}

/**
 * Keeps the table at most `maxRows` rows: first the rows whose window ended before `expiredBefore`, then, if a
 * flood of distinct keys still overfills it, the rows with the oldest windows.
 */
export async function pruneRateLimits(maxRows: number, expiredBefore: number): Promise<void> {
  const client = getClient();
  const { rows } = await client.execute('SELECT count(*) AS n FROM rate_limit');
  if (Number(rows[0].n) <= maxRows) return;
  await client.execute({ sql: 'DELETE FROM rate_limit WHERE last_request < ?', args: [expiredBefore] });
  await client.execute({
    sql: 'DELETE FROM rate_limit WHERE id IN (SELECT id FROM rate_limit ORDER BY last_request DESC LIMIT -1 OFFSET ?)',
    args: [maxRows],
  });
}

export async function countRateLimitRows(): Promise<number> {
  const { rows } = await getClient().execute('SELECT count(*) AS n FROM rate_limit');
  return Number(rows[0].n);
}
