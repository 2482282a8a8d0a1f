// Local defaults for development, the demo and tests. Nothing here is a production secret:
// BETTER_AUTH_SECRET is generated once per checkout into .data/ (ignored by git).
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';

export function localSecret() {
  mkdirSync('.data', { recursive: true });
  const path = '.data/auth-secret';
  if (!existsSync(path)) writeFileSync(path, randomBytes(32).toString('hex'), { mode: 0o600 });
  return readFileSync(path, 'utf8').trim();
}

export function localEnv(overrides = {}) {
  if (existsSync('.env')) process.loadEnvFile('.env');
  const port = overrides.PORT ?? process.env.PORT ?? '3000';
  const mailPort = overrides.FAKE_RESEND_PORT ?? process.env.FAKE_RESEND_PORT ?? '3025';
  return {
    ...process.env,
    NEXT_TELEMETRY_DISABLED: '1',
    DATABASE_URL: process.env.DATABASE_URL || 'file:./.data/ledger.db',
    BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET || localSecret(),
    BETTER_AUTH_URL: process.env.BETTER_AUTH_URL || `http://localhost:${port}`,
    RESEND_API_KEY: process.env.RESEND_API_KEY || 're_local_fake',
    RESEND_BASE_URL: process.env.RESEND_BASE_URL || `http://127.0.0.1:${mailPort}`,
    FAKE_RESEND_PORT: mailPort,
    MAILBOX_ENABLED: process.env.MAILBOX_ENABLED || 'true',
    PORT: port,
    ...overrides,
  };
}
