import { z } from 'zod';
import { dbEnvSchema, givenEnv } from './db-env';
import { issuesText } from './errors';

/**
 * Typed environment: every variable the app reads is declared here (and in
 * .env.example; a test compares the two). Validated at build (scripts/check-env.ts)
 * and at start-up (instrumentation.ts). Parsed once, lazily, so that scripts
 * which only need the database do not have to provide mail or auth settings;
 * the few settings tests change while a process runs are read with envValue().
 */
const schema = dbEnvSchema.extend({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  BETTER_AUTH_SECRET: z.string().min(32, 'BETTER_AUTH_SECRET must be at least 32 characters'),
  BETTER_AUTH_URL: z.url().default('http://localhost:3000'),
  MAIL_FROM: z.string().min(3).default('Lattice Ledger <ledger@localhost>'),
  RESEND_API_KEY: z.string().min(1).default('re_local_fake'),
  RESEND_BASE_URL: z.url().optional(),
  FAKE_RESEND_PORT: z.coerce.number().int().min(1).max(65535).default(3025),
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
  IMPORT_MAX_BYTES: z.coerce.number({ message: 'IMPORT_MAX_BYTES must be a number of bytes.' }).int().positive('IMPORT_MAX_BYTES must be a positive whole number of bytes.').default(200 * 1024 * 1024),
  ALERT_DEBOUNCE_MS: z.coerce.number({ message: 'ALERT_DEBOUNCE_MS must be a number of milliseconds.' }).int().min(0, 'ALERT_DEBOUNCE_MS must not be negative.').default(180_000),
  /** Read by next.config.mjs when the app is built (headers are fixed at build); declared here so the build check validates it. */
  HSTS_MAX_AGE: z.coerce.number({ message: 'HSTS_MAX_AGE must be a number of seconds.' }).int().min(0, 'HSTS_MAX_AGE must not be negative.').default(63_072_000),
  RECOMPUTE_DEBOUNCE_MS: z.coerce.number({ message: 'RECOMPUTE_DEBOUNCE_MS must be a number of milliseconds.' }).int().min(0, 'RECOMPUTE_DEBOUNCE_MS must not be negative.').default(1_500),
  /** Background jobs (lib/services/jobs): read live (envValue), since tests shorten them. */
  JOB_LEASE_MS: z.coerce.number({ message: 'JOB_LEASE_MS must be a number of milliseconds.' }).int().min(500, 'JOB_LEASE_MS must be at least 500.').default(60_000),
  JOB_POLL_MS: z.coerce.number({ message: 'JOB_POLL_MS must be a number of milliseconds.' }).int().min(50, 'JOB_POLL_MS must be at least 50.').default(1_000),
  JOB_MAX_ATTEMPTS: z.coerce.number({ message: 'JOB_MAX_ATTEMPTS must be a whole number.' }).int().min(1, 'JOB_MAX_ATTEMPTS must be at least 1.').default(5),
  JOB_RETRY_BASE_MS: z.coerce.number({ message: 'JOB_RETRY_BASE_MS must be a number of milliseconds.' }).int().min(0, 'JOB_RETRY_BASE_MS must not be negative.').default(5_000),
  AUTH_ACCOUNT_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(900),
  AUTH_ACCOUNT_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(20),
  RATE_LIMIT_TABLE_MAX_ROWS: z.coerce.number().int().min(100).default(10_000),
  /** Read by scripts/server.mjs, which starts Next; declared here so the env check validates them. */
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  /** Set by scripts/server.mjs per process; read live (envValue), since tests set it after start-up. */
  LEDGER_PEER_KEY: z.string().min(1).optional(),
  /** Read by scripts/server.mjs: 'process' runs the jobs in a worker process (default in production), 'inline' in the server (default under --dev). */
  JOB_WORKER: z.enum(['', 'process', 'inline']).default(''),
  /** Set by scripts/server.mjs in the web process when a job worker runs the jobs: the web process then claims none. */
  LEDGER_JOBS_ELSEWHERE: z.enum(['', '1']).default(''),
  TRUSTED_PROXIES: z.string().default(''),
  API_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(60),
  API_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(600),
  IMPORT_CONCURRENCY_PER_WORKSPACE: z.coerce.number().int().positive().default(2),
  /** How long a POST's Idempotency-Key and its stored response are kept and replayed (lib/services/idempotency.ts). */
  IDEMPOTENCY_WINDOW_HOURS: z.coerce
    .number({ message: 'IDEMPOTENCY_WINDOW_HOURS must be a number of hours.' })
    .positive('IDEMPOTENCY_WINDOW_HOURS must be more than 0.')
    .max(24 * 30, 'IDEMPOTENCY_WINDOW_HOURS must be at most 720 (30 days).')
    .default(24),
  /** Key for the webhook signing secrets at rest; unset: derived from BETTER_AUTH_SECRET (lib/webhooks/secret-box.ts). */
  WEBHOOK_SECRET_KEY: z.string().min(32, 'WEBHOOK_SECRET_KEY must be at least 32 characters').optional(),
  WEBHOOK_TIMEOUT_MS: z.coerce.number({ message: 'WEBHOOK_TIMEOUT_MS must be a number of milliseconds.' }).int().positive().max(120_000).default(10_000),
  WEBHOOK_MAX_ATTEMPTS: z.coerce.number().int().positive().default(8),
  /** Read live (envValue): http:// and loopback webhook targets outside development and tests (e.g. a production-mode test server). */
  WEBHOOK_ALLOW_LOOPBACK: z.enum(['', '0', '1']).default(''),
});

export const ENV_SCHEMA = schema;
export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

function describe(error: z.ZodError): string {
  return `Invalid environment:\n  ${issuesText(error.issues, '\n  ')}\nSee .env.example.`;
}

export function env(): Env {
  if (!cached) {
    const parsed = schema.safeParse(givenEnv());
    if (!parsed.success) throw new Error(describe(parsed.error));
    cached = parsed.data;
  }
  return cached;
}

/**
 * One setting read now, with the same validation: tests and the e2e server change
 * the debounces and the import limit while a process runs, and scripts that need
 * one setting need not provide the others.
 */
export function envValue<K extends keyof Env>(name: K): Env[K] {
  const field = schema.shape[name];
  const raw = givenEnv()[name];
  const parsed = field.safeParse(raw);
  if (!parsed.success) throw new Error(`${parsed.error.issues[0]?.message ?? `${name} is invalid.`} Got "${raw}". See .env.example.`);
  return parsed.data as Env[K];
}

/** Loopback webhook targets (and plain http to them): in development and tests, or with WEBHOOK_ALLOW_LOOPBACK=1. */
export function webhookLoopbackAllowed(): boolean {
  return envValue('NODE_ENV') !== 'production' || envValue('WEBHOOK_ALLOW_LOOPBACK') === '1';
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
export function startupWarnings(e: MailboxSettings & Partial<Pick<Env, 'WEBHOOK_ALLOW_LOOPBACK'>> = env()): string[] {
  const warnings: string[] = [];
  if (e.NODE_ENV === 'production' && e.WEBHOOK_ALLOW_LOOPBACK === '1') {
    warnings.push('WEBHOOK_ALLOW_LOOPBACK=1: webhooks may be sent over plain http to this machine (127.0.0.0/8, ::1, localhost). Use it for a local test server only.');
  }
  if (e.NODE_ENV === 'production' && mailboxEnabled(e)) {
    warnings.push(
      'UNSAFE_MAILBOX_IN_PRODUCTION=1: /dev/mailbox shows every e-mail, password-reset links included, to loopback clients. ' +
        'Use it for a local demo only; unset it on a server.',
    );
  }
  return warnings;
}
