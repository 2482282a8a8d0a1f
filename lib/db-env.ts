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
