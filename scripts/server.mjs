// The app's HTTP server: Next.js behind a plain node:http server that we own, for two reasons.
// 1. It listens on 127.0.0.1 unless HOST says otherwise, so a demo or dev server is not on the network by accident.
// 2. It alone sees the TCP peer. It writes that address into a header on every request, overwriting whatever the
//    client sent, together with a per-process key the client cannot know (lib/client-address.ts checks it), so
//    rate limits and the loopback-only mailbox rest on the socket, not on headers a client can forge.
// Usage: node scripts/server.mjs [--dev]   (PORT, HOST from the environment)
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:http';
import { fileURLToPath } from 'node:url';
import { createWorkerChannel, OFF_LOOP_CHANNEL } from './worker-channel.mjs';

export const PEER_HEADER = 'x-ledger-peer';

/** The interface to listen on: loopback unless HOST names another. */
export function listenHost(env = process.env) {
  return env.HOST && env.HOST.trim() !== '' ? env.HOST.trim() : '127.0.0.1';
}

/**
 * Overwrites the peer header with "<key> <socket address> <direct|forwarded>": forwarded when the client sent
 * any forwarding header (read before Next adds its own X-Forwarded-For).
 */
export function stampPeer(req, key) {
  const h = req.headers;
  const forwarded = h['x-forwarded-for'] !== undefined || h['forwarded'] !== undefined || h['x-real-ip'] !== undefined;
  h[PEER_HEADER] = `${key} ${req.socket.remoteAddress ?? '-'} ${forwarded ? 'forwarded' : 'direct'}`;
}

/** Where the durable jobs run: a worker process beside the production server, in the server itself under --dev (hot reload). */
export function jobWorkerMode(dev, env = process.env) {
  const asked = (env.JOB_WORKER ?? '').trim();
  if (asked === 'process' || asked === 'inline') return asked;
  return dev ? 'inline' : 'process';
}

/**
 * Starts scripts/job-worker.ts and restarts it (after 1 s) when it dies; stopped with the server.
 * The server process then claims no jobs itself (LEDGER_JOBS_ELSEWHERE, read by lib/services/jobs/runner.ts), and
 * hands the heavy part of value imports to the worker over IPC (lib/services/off-loop.ts) once it says it is ready.
 */
function startJobWorker() {
  let stopping = false;
  let child;
  const channel = createWorkerChannel();
  const launch = () => {
    child = spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'scripts/job-worker.ts'], { stdio: ['inherit', 'inherit', 'inherit', 'ipc'], env: { ...process.env, LEDGER_JOBS_ELSEWHERE: '' } });
    channel.attach(child);
    child.on('exit', (code, signal) => {
      if (stopping) return;
      console.error(`The job worker stopped (${signal ?? `exit ${code}`}); starting another in 1 s.`);
      setTimeout(launch, 1000).unref();
    });
  };
  launch();
  globalThis[OFF_LOOP_CHANNEL] = channel;
  const stop = () => {
    stopping = true;
    child?.kill('SIGTERM');
  };
  process.once('exit', stop);
  for (const signal of ['SIGTERM', 'SIGINT']) process.once(signal, () => (stop(), process.exit(0)));
}

export async function startServer({ dev = false, port = Number(process.env.PORT || 3000), host = listenHost() } = {}) {
  // Set before Next loads, so the route handlers (same process) read the same key.
  process.env.LEDGER_PEER_KEY ||= randomBytes(24).toString('hex');
  if (jobWorkerMode(dev) === 'process') {
    process.env.LEDGER_JOBS_ELSEWHERE = '1';
    startJobWorker();
  }
  const key = process.env.LEDGER_PEER_KEY;
  const { default: next } = await import('next');
  // Turbopack in development, as `next dev` uses by default.
  const app = next({ dev, hostname: host, port, ...(dev ? { turbopack: true } : {}) });
  await app.prepare();
  const handle = app.getRequestHandler();
  const server = createServer((req, res) => {
    stampPeer(req, key);
    handle(req, res);
  });
  if (dev) {
    const upgrade = app.getUpgradeHandler();
    server.on('upgrade', (req, socket, head) => {
      stampPeer(req, key);
      upgrade(req, socket, head);
    });
  }
  await new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, resolve);
  });
  const shown = host.includes(':') ? `[${host}]` : host;
  console.log(`Lattice Ledger ${dev ? '(development) ' : ''}listening on http://${shown}:${port}`);
  if (host !== '127.0.0.1' && host !== '::1' && host !== 'localhost') {
    console.warn(`HOST=${host}: the app is reachable from other machines on that interface.`);
  }
  return server;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  startServer({ dev: process.argv.includes('--dev') }).catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
