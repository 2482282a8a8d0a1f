import 'server-only';
import { env } from '@/lib/env';
import { rateLimited } from '@/lib/errors';

/**
 * Limits for the REST API and the workspace route handlers, kept in this process's memory: they are checked on
 * every request, and a database write per API call would queue behind imports. One server process holds the
 * database (SQLite), so one process's count is the count.
 */

/** Fixed-window counters with a bounded number of keys (the oldest windows go first). */
export class WindowCounter {
  private readonly windows = new Map<string, { start: number; count: number }>();
  constructor(private readonly maxKeys = 50_000) {}

  consume(key: string, windowSeconds: number, max: number, now = Date.now()): { allowed: boolean; retryAfterSeconds: number } {
    const windowMs = windowSeconds * 1000;
    let w = this.windows.get(key);
    if (!w || now - w.start >= windowMs) {
      this.windows.delete(key);
      w = { start: now, count: 0 };
      if (this.windows.size >= this.maxKeys) this.evict(now, windowMs);
      this.windows.set(key, w);
    }
    w.count++;
    return { allowed: w.count <= max, retryAfterSeconds: Math.max(1, Math.ceil((w.start + windowMs - now) / 1000)) };
  }

  get size(): number {
    return this.windows.size;
  }

  private evict(now: number, windowMs: number) {
    for (const [k, w] of this.windows) if (now - w.start >= windowMs) this.windows.delete(k);
    // Map iteration follows insertion, and a key is re-inserted when its window starts: oldest windows first.
    for (const k of this.windows.keys()) {
      if (this.windows.size < this.maxKeys) break;
      this.windows.delete(k);
    }
  }
}

const globalLimits = globalThis as unknown as { ledgerApiCounter?: WindowCounter; ledgerImportSlots?: Map<string, number> };
const counter = () => (globalLimits.ledgerApiCounter ??= new WindowCounter());
const importSlots = () => (globalLimits.ledgerImportSlots ??= new Map());

/** Counts one request for a caller (an API token, or a signed-in user on the workspace routes). */
export function limitCaller(key: string): void {
  const e = env();
  const d = counter().consume(key, e.API_RATE_LIMIT_WINDOW_SECONDS, e.API_RATE_LIMIT_MAX);
  if (!d.allowed) {
    throw rateLimited(`Too many requests: at most ${e.API_RATE_LIMIT_MAX} per ${e.API_RATE_LIMIT_WINDOW_SECONDS} s. Try again in ${d.retryAfterSeconds} s.`, d.retryAfterSeconds);
  }
}

/** Seconds a refused import is told to wait: imports of ordinary size finish well within it. */
export const IMPORT_RETRY_AFTER_SECONDS = 10;

/** Runs an import while holding one of its workspace's IMPORT_CONCURRENCY_PER_WORKSPACE slots; 429 when none is free. */
export async function withImportSlot<T>(workspaceId: string, run: () => Promise<T>): Promise<T> {
  const max = env().IMPORT_CONCURRENCY_PER_WORKSPACE;
  const slots = importSlots();
  const held = slots.get(workspaceId) ?? 0;
  if (held >= max) {
    throw rateLimited(
      `This workspace already has ${held} import${held === 1 ? '' : 's'} running (at most ${max} at once). Try again in ${IMPORT_RETRY_AFTER_SECONDS} s.`,
      IMPORT_RETRY_AFTER_SECONDS,
    );
  }
  slots.set(workspaceId, held + 1);
  try {
    return await run();
  } finally {
    const left = (slots.get(workspaceId) ?? 1) - 1;
    if (left <= 0) slots.delete(workspaceId);
    else slots.set(workspaceId, left);
  }
}

/** Imports running now, per workspace (the health endpoint reports the total). */
export function runningImports(): number {
  let n = 0;
  for (const v of importSlots().values()) n += v;
  return n;
}
