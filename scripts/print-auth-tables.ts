import { getAuthTables } from '@better-auth/core/db';
import { organization } from 'better-auth/plugins';
import { ac, roles } from '../lib/permissions';

const tables = getAuthTables({
  emailAndPassword: { enabled: true },
  rateLimit: { enabled: true, storage: 'database' },
  plugins: [organization({ ac, roles })],
});
console.log(JSON.stringify(tables, (k, v) => (typeof v === 'function' ? '[fn]' : v), 2));
