// The job worker: a process of its own that runs the durable jobs (benchmark recomputations, alert
// announcements, the digest pass; lib/services/jobs/runner.ts) and the validation and storing of value imports
// (lib/services/off-loop.ts), so that their heavy reads and computations never hold up the web server's event loop.
// scripts/server.mjs starts one beside the production server and restarts it if it dies; a job it was running when
// it died is taken over once its lease expires, and an import it was storing is rolled back.
import { env } from '@/lib/env';
import type { OffLoopRequest } from '@/lib/services/off-loop';

env();
await import('@/lib/services/benchmarks/recompute-queue');
const { startDigestTimer } = await import('@/lib/services/alerts/scheduler');
await startDigestTimer();
// Heavy request work the web server hands over (lib/services/off-loop.ts): value imports.
const { serveOffLoop } = await import('@/lib/services/off-loop');
process.on('message', (request: OffLoopRequest) => {
  void serveOffLoop(request).then((reply) => process.send?.(reply));
});
process.send?.({ type: 'ready' });
console.log('Job worker running (recomputations, alerts, digests, value imports).');
// The runner's timers do not keep a process alive on their own.
const keepAlive = setInterval(() => undefined, 1 << 30);
const { stopJobRunner } = await import('@/lib/services/jobs/runner');
// Started by scripts/server.mjs with an IPC channel: when the server goes, however it went, so does the worker.
if (process.send) process.on('disconnect', () => process.exit(0));
for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.once(signal, () => {
    stopJobRunner();
    clearInterval(keepAlive);
    process.exit(0);
  });
}
