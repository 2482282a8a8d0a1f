// Runs before each integration test file: a fresh SQLite file with the real migrations,
// and a request context for server code that reads next/headers.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { vi } from 'vitest';
import { requestContext } from './request-context';

const dir = mkdtempSync(join(tmpdir(), 'ledger-it-'));
process.env.DATABASE_URL = `file:${join(dir, 'test.db')}`;
process.env.BETTER_AUTH_SECRET ??= 'integration-test-secret-0123456789abcdef';
process.env.BETTER_AUTH_URL = 'http://localhost:3999';
process.env.RESEND_API_KEY = 're_test_key';
process.env.MAIL_WORKER_INTERVAL_MS = '0';
process.env.MAIL_FROM = 'Lattice Ledger <ledger@example.org>';
// As scripts/server.mjs sets it: tests stamp the TCP peer with it (lib/client-address.ts).
process.env.LEDGER_PEER_KEY = 'integration-peer-key';

vi.mock('next/headers', () => ({
  headers: async () => requestContext.headers(),
  cookies: async () => requestContext.cookies(),
}));
vi.mock('next/cache', () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

const { migrateClient } = await import('@/db/migrate');
const { getClient } = await import('@/db/client');
await migrateClient(getClient());
