// npm run dev: migrate, seed, mail fake, and next dev with hot reload.
import { localEnv } from './local-env.mjs';
import { run, start } from './run.mjs';

const env = localEnv({ NODE_ENV: 'development' });
const tsx = ['node_modules/tsx/dist/cli.mjs', '--conditions=react-server'];
await run('node', [...tsx, 'db/migrate.ts'], env);
await run('node', [...tsx, 'db/seed.ts'], env);
start('node', [...tsx, 'lib/mail/fake-resend-server.ts'], env);
// Our server around next dev: 127.0.0.1 unless HOST says otherwise, and the socket address for rate limits.
start('node', ['scripts/server.mjs', '--dev'], env);
