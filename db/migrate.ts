import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/libsql/migrator';
import { drizzle } from 'drizzle-orm/libsql';
import type { Client } from '@libsql/client';
import { dbEnv } from '../lib/db-env';
import { connect } from './connection';
import { backfillStructuredSources } from './source-backfill';
import { backfillRevisionRowSets } from './revision-backfill';

const migrationsFolder = fileURLToPath(new URL('../drizzle', import.meta.url));

/** Applies every migration in drizzle/ to the given client (used by the script and by tests), then the one-time data steps SQL cannot do. */
export async function migrateClient(client: Client): Promise<void> {
  await migrate(drizzle(client), { migrationsFolder });
  await backfillStructuredSources(client);
  await backfillRevisionRowSets(client);
}

async function main() {
  const { DATABASE_URL: url, DATABASE_AUTH_TOKEN: authToken } = dbEnv();
  const client = connect({ url, authToken });
  await migrateClient(client);
  client.close();
  console.log(`Migrations applied to ${url.startsWith('file:') ? url : url.replace(/\/\/.*@/, '//…@')}`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  main().catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
