import { spawn } from 'node:child_process';

/** Runs a command to completion, inheriting stdio; rejects on a non-zero exit. */
export function run(command, args, env = process.env) {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: 'inherit', env });
    child.on('exit', (code, signal) =>
      code === 0 ? resolve() : reject(new Error(`${command} ${args.join(' ')} exited with ${code ?? signal}`)),
    );
  });
}

/** Starts a long-running child; it dies with us. */
export function start(command, args, env = process.env) {
  const child = spawn(command, args, { stdio: 'inherit', env });
  const stop = () => child.kill('SIGTERM');
  process.on('exit', stop);
  process.on('SIGINT', () => process.exit(130));
  process.on('SIGTERM', () => process.exit(143));
  return child;
}

export async function waitForHttp(url, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      const res = await fetch(url, { redirect: 'manual' });
      if (res.status < 500) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer within ${timeoutMs} ms`);
}
