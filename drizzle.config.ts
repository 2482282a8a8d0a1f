import { defineConfig } from 'drizzle-kit';
import { dbEnv } from './lib/db-env';

export default defineConfig({
  dialect: 'sqlite',
  schema: './db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
  dbCredentials: { url: dbEnv().DATABASE_URL },
});
