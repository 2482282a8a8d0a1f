import { z } from 'zod';

/**
 * Typed environment. Parsed once, lazily, so that scripts which only need the
 * database do not have to provide mail or auth settings.
 */
const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.string().min(1).default('file:./.data/ledger.db'),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  BETTER_AUTH_SECRET: z.string().min(32, 'BETTER_AUTH_SECRET must be at least 32 characters'),
  BETTER_AUTH_URL: z.url().default('http://localhost:3000'),
  MAIL_FROM: z.string().min(3).default('Lattice Ledger <ledger@localhost>'),
  RESEND_API_KEY: z.string().min(1).default('re_local_fake'),
  RESEND_BASE_URL: z.url().optional(),
  MAIL_SEND_TIMEOUT_MS: z.coerce.number().int().positive().default(10_000),
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().positive().default(8),
  MAIL_WORKER_INTERVAL_MS: z.coerce.number().int().min(0).default(2_000),
  MAILBOX_ENABLED: z
    .enum(['true', 'false'])
    .optional()
    .transform((v) => (v === undefined ? undefined : v === 'true')),
  AUTH_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(60),
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(10),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

export function env(): Env {
  if (!cached) {
    const parsed = schema.safeParse(process.env);
    if (!parsed.success) {
      const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
      throw new Error(`Invalid environment:\n${lines}\nSee .env.example.`);
    }
    cached = parsed.data;
  }
  return cached;
}

/** The development mailbox page is on in development and when explicitly enabled (demo, tests). */
export function mailboxEnabled(): boolean {
  const e = env();
  return e.MAILBOX_ENABLED ?? e.NODE_ENV !== 'production';
}
