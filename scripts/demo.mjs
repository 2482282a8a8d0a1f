// npm run demo: migrate, seed the invented demo group, build, start the mail fake and the app.
import { readFileSync } from 'node:fs';
import { localEnv } from './local-env.mjs';
import { run, start, waitForHttp } from './run.mjs';

// The demo is a production build on this machine: the mailbox (which shows password-reset links) is switched on
// explicitly, and the server listens on 127.0.0.1 only (scripts/server.mjs), unless HOST says otherwise.
const env = localEnv({ NODE_ENV: 'production', UNSAFE_MAILBOX_IN_PRODUCTION: process.env.UNSAFE_MAILBOX_IN_PRODUCTION ?? '1' });
const tsx = ['node_modules/tsx/dist/cli.mjs', '--conditions=react-server'];

await run('node', [...tsx, 'db/migrate.ts'], env);
await run('node', [...tsx, 'db/seed.ts'], env);
if (!process.argv.includes('--no-build')) await run('node', ['node_modules/next/dist/bin/next', 'build'], env);
start('node', [...tsx, 'lib/mail/fake-resend-server.ts'], env);
start('node', ['scripts/server.mjs'], env);
await waitForHttp(`http://127.0.0.1:${env.PORT}/sign-in`);

const group = JSON.parse(readFileSync('data/demo/group.json', 'utf8'));
console.log(`
Lattice Ledger is running: ${env.BETTER_AUTH_URL}
  Demo sign-in (invented demo group): ${group.members[0].email} / ${group.password}
  Other demo members: ${group.members.slice(1).map((m) => `${m.email} (${m.role})`).join(', ')}
  Mailbox (what the local mail fake received): ${env.BETTER_AUTH_URL}/dev/mailbox
    The demo sets UNSAFE_MAILBOX_IN_PRODUCTION=1 so that the mailbox works in this production build. It answers
    only requests from this machine; never set that variable on a server.
  Listening on ${env.HOST || '127.0.0.1'} only${env.HOST ? '' : ' (set HOST=0.0.0.0 to open it to the network)'}.
Press Ctrl+C to stop.`);
