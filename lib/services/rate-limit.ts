import 'server-only';
import { consumeRateLimit, type RateDecision } from '@/db/queries/rate-limit';
import { env } from '@/lib/env';

export interface RateRule {
  windowSeconds: number;
  max: number;
}

/** The rules kept in the rate_limit table, from the environment. */
export function authRules(): { client: RateRule; account: RateRule; general: RateRule } {
  const e = env();
  return {
    client: { windowSeconds: e.AUTH_RATE_LIMIT_WINDOW_SECONDS, max: e.AUTH_RATE_LIMIT_MAX },
    account: { windowSeconds: e.AUTH_ACCOUNT_RATE_LIMIT_WINDOW_SECONDS, max: e.AUTH_ACCOUNT_RATE_LIMIT_MAX },
    general: { windowSeconds: e.AUTH_RATE_LIMIT_WINDOW_SECONDS, max: e.AUTH_RATE_LIMIT_MAX * 10 },
  };
}

/**
 * One step of the counter for `key` in the rate_limit table, which stays at most RATE_LIMIT_TABLE_MAX_ROWS rows.
 * Rows are kept for the longest window in use, so pruning for a short rule never resets a long one.
 */
export function consume(key: string, rule: RateRule): Promise<RateDecision> {
  const rules = authRules();
  const keepSeconds = Math.max(rules.client.windowSeconds, rules.account.windowSeconds, 60 * 60);
  return consumeRateLimit(key, rule, { maxRows: env().RATE_LIMIT_TABLE_MAX_ROWS, keepSeconds });
}

/** better-auth's limits (the endpoints we do not limit ourselves) stored through the same bounded table. */
export const betterAuthRateStorage = {
  consume: async (key: string, rule: { window: number; max: number }) => {
    const d = await consume(`auth:${key}`, { windowSeconds: rule.window, max: rule.max });
    return { allowed: d.allowed, retryAfter: d.allowed ? null : d.retryAfterSeconds };
  },
};
