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
  UNSAFE_MAILBOX_IN_PRODUCTION: z.enum(['', '0', '1']).default(''),
  AUTH_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(60),
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(10),
  AUTH_ACCOUNT_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(900),
  AUTH_ACCOUNT_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(20),
  RATE_LIMIT_TABLE_MAX_ROWS: z.coerce.number().int().min(100).default(10_000),
  TRUSTED_PROXIES: z.string().default(''),
  API_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(60),
  API_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(600),
  IMPORT_CONCURRENCY_PER_WORKSPACE: z.coerce.number().int().positive().default(2),
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

type MailboxSettings = Pick<Env, 'NODE_ENV' | 'MAILBOX_ENABLED' | 'UNSAFE_MAILBOX_IN_PRODUCTION'>;

/**
 * Whether the development mailbox page (/dev/mailbox) exists. It shows password-reset links, so in production
 * it is off unless UNSAFE_MAILBOX_IN_PRODUCTION=1 (the local demo sets it); MAILBOX_ENABLED does not count there.
 * Outside production it is on unless MAILBOX_ENABLED=false. It answers loopback clients only either way.
 */
export function mailboxEnabled(e: MailboxSettings = env()): boolean {
  if (e.NODE_ENV === 'production') return e.UNSAFE_MAILBOX_IN_PRODUCTION === '1';
  return e.MAILBOX_ENABLED ?? true;
}

/** Warnings printed at start-up about settings that are unsafe on a server others can reach. */
export function startupWarnings(e: MailboxSettings = env()): string[] {
  const warnings: string[] = [];
  if (e.NODE_ENV === 'production' && mailboxEnabled(e)) {
    warnings.push(
      'UNSAFE_MAILBOX_IN_PRODUCTION=1: /dev/mailbox shows every e-mail, password-reset links included, to loopback clients. ' +
        'Use it for a local demo only; unset it on a server.',
    );
  }
  return warnings;
}
