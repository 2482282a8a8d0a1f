// Starts the built app on a fresh SQLite file with the demo seed, and the local mail fake.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { startFakeResend, type FakeResend } from '../../../lib/mail/fake-resend-server';

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string;
    mailURL: string;
    databaseURL: string;
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

let server: ChildProcess | undefined;
let fake: FakeResend | undefined;

export default async function setup(project: TestProject) {
  const dir = mkdtempSync(join(tmpdir(), 'ledger-e2e-'));
  const port = await freePort();
  fake = await startFakeResend(0);
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'production',
    NEXT_TELEMETRY_DISABLED: '1',
    DATABASE_URL: `file:${join(dir, 'e2e.db')}`,
    BETTER_AUTH_SECRET: 'e2e-secret-0123456789abcdef0123456789abcdef',
    BETTER_AUTH_URL: `http://localhost:${port}`,
    RESEND_API_KEY: 're_e2e',
    RESEND_BASE_URL: fake.url,
    UNSAFE_MAILBOX_IN_PRODUCTION: '1',
    PORT: String(port),
    MAIL_WORKER_INTERVAL_MS: '300',
    // alerts wait this long after a benchmark's latest revision (default 3 minutes)
    ALERT_DEBOUNCE_MS: '1500',
    // benchmarks wait this long after a change before recomputing: longer than the page's status poll (1.5 s),
    // so the "Recomputing…" state is always seen by at least one poll
    RECOMPUTE_DEBOUNCE_MS: '3000',
    // the webhook test's receiver listens on loopback, which production mode refuses without this;
    // and a short time-out, so its 30 s-slow receiver is cut off quickly
    WEBHOOK_ALLOW_LOOPBACK: '1',
    WEBHOOK_TIMEOUT_MS: '3000',
    // the browser signs in and up many times within a minute
    AUTH_RATE_LIMIT_MAX: '1000',
    AUTH_ACCOUNT_RATE_LIMIT_MAX: '1000',
  };
  // The server's own default (127.0.0.1) is what the hardening test checks.
  delete env.HOST;
  for (const script of ['db/migrate.ts', 'db/seed.ts']) {
    const r = spawnSync('node', ['node_modules/tsx/dist/cli.mjs', '--conditions=react-server', script], { env, stdio: 'inherit' });
    if (r.status !== 0) throw new Error(`${script} failed`);
  }
  // The same server the scripts start (127.0.0.1, socket address stamped for rate limits and the mailbox).
  server = spawn('node', ['scripts/server.mjs'], { env, stdio: ['ignore', 'inherit', 'inherit'] });
  const base = `http://localhost:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      const res = await fetch(`${base}/sign-in`);
      if (res.ok) break;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error('the app did not start (was `npm run build` run first?)');
    await new Promise((r) => setTimeout(r, 300));
  }
  project.provide('baseURL', base);
  project.provide('mailURL', fake.url);
  project.provide('databaseURL', env.DATABASE_URL!);

  return async () => {
    server?.kill('SIGTERM');
    await fake?.close();
  };
}
