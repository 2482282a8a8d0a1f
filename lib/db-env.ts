import { z } from 'zod';
import { issuesText } from './errors';

/**
 * The database settings alone, for the scripts and modules that need nothing
 * else (migrations, drizzle-kit, the db client). lib/env.ts extends this schema.
 */
export const DEFAULT_DATABASE_URL = 'file:./.data/ledger.db';

export const dbEnvSchema = z.object({
  DATABASE_URL: z.string().min(1).default(DEFAULT_DATABASE_URL),
  DATABASE_AUTH_TOKEN: z.string().min(1).optional(),
  /** SQLite's wait for another process's write lock, per attempt (PRAGMA busy_timeout); it blocks the event loop, so keep it short. */
  DATABASE_BUSY_TIMEOUT_MS: z.coerce.number().int().min(0).max(60_000).default(100),
  /** In all, how long a write keeps retrying a lock held by another process before it fails. */
  DATABASE_BUSY_RETRY_MS: z.coerce.number().int().min(0).max(600_000).default(30_000),
});

export type DbEnv = z.infer<typeof dbEnvSchema>;

/** process.env with empty values treated as unset, as a shell's `VAR=` means "not given". */
export function givenEnv(source: NodeJS.ProcessEnv = process.env): Record<string, string> {
  return Object.fromEntries(Object.entries(source).filter((entry): entry is [string, string] => entry[1] !== undefined && entry[1] !== ''));
}

export function dbEnv(): DbEnv {
  const parsed = dbEnvSchema.safeParse(givenEnv());
  if (!parsed.success) throw new Error(`Invalid database settings: ${issuesText(parsed.error.issues, '; ')}. See .env.example.`);
  return parsed.data;
}
