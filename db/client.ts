import 'server-only';
import { drizzle } from 'drizzle-orm/libsql';
import type { Client } from '@libsql/client';
import { dbEnv } from '@/lib/db-env';
import { connect, type ConnectOptions } from './connection';
import * as schema from './schema';

export type Db = ReturnType<typeof createDb>;
/** The database or an open transaction: query functions accept either, so callers choose the transaction. */
export type Executor = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export function createDb(client: Client) {
  return drizzle(client, { schema, casing: 'snake_case' });
}

const globalForDb = globalThis as unknown as { ledgerClient?: Client; ledgerDb?: Db };

function databaseUrl(): ConnectOptions {
  // The db-only schema, so scripts that only touch the database need no auth settings.
  const { DATABASE_URL, DATABASE_AUTH_TOKEN, DATABASE_BUSY_TIMEOUT_MS, DATABASE_BUSY_RETRY_MS } = dbEnv();
  return { url: DATABASE_URL, authToken: DATABASE_AUTH_TOKEN, busyTimeoutMs: DATABASE_BUSY_TIMEOUT_MS, busyRetryMs: DATABASE_BUSY_RETRY_MS };
}

/** The process-wide client (kept on globalThis so dev reloads do not open a second one). */
export function getClient(): Client {
  globalForDb.ledgerClient ??= connect(databaseUrl());
  return globalForDb.ledgerClient;
}

export function getDb(): Db {
  globalForDb.ledgerDb ??= createDb(getClient());
  return globalForDb.ledgerDb;
}

/** Drizzle instance; resolved on first use so importing this module opens nothing. */
export const db: Db = new Proxy({} as Db, {
  get(_target, prop) {
    const real = getDb() as unknown as Record<string | symbol, unknown>;
    const value = real[prop];
    return typeof value === 'function' ? (value as (...a: unknown[]) => unknown).bind(real) : value;
  },
});

/** Closes the shared client (tests and scripts). */
export function closeDb(): void {
  globalForDb.ledgerClient?.close();
  globalForDb.ledgerClient = undefined;
  globalForDb.ledgerDb = undefined;
}
