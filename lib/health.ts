import 'server-only';
import { getClient } from '@/db/client';
import { recomputeQueueStatus } from '@/lib/benchmark/recompute-queue';
import { mailWorkerStatus } from '@/lib/mail/worker';
import { runningImports } from '@/lib/api-limits';

/** A recomputation waiting or running longer than this means the queue is stuck. */
export const RECOMPUTE_STUCK_MS = 15 * 60 * 1000;
const DATABASE_TIMEOUT_MS = 3000;

export interface Health {
  status: 'ok' | 'failing';
  database: { status: 'ok' | 'failing'; latencyMs: number | null; detail?: string };
  mailWorker: { status: 'running' | 'stopped' | 'disabled' };
  recomputeQueue: { status: 'ok' | 'stuck'; queued: number; running: number; oldestSeconds: number };
  imports: { running: number };
}

async function checkDatabase(): Promise<Health['database']> {
  const started = performance.now();
  try {
    await Promise.race([
      getClient().execute('SELECT 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error(`no answer within ${DATABASE_TIMEOUT_MS} ms`)), DATABASE_TIMEOUT_MS).unref()),
    ]);
    return { status: 'ok', latencyMs: Math.round(performance.now() - started) };
  } catch (e) {
    return { status: 'failing', latencyMs: null, detail: e instanceof Error ? e.message : String(e) };
  }
}

/** The database answers, the mail worker runs, and no recomputation is stuck. */
export async function health(): Promise<Health> {
  const database = await checkDatabase();
  const mail = mailWorkerStatus();
  const queue = recomputeQueueStatus();
  const stuck = queue.queued + queue.running > 0 && queue.oldestMs > RECOMPUTE_STUCK_MS;
  const ok = database.status === 'ok' && mail !== 'stopped' && !stuck;
  return {
    status: ok ? 'ok' : 'failing',
    database,
    mailWorker: { status: mail },
    recomputeQueue: { status: stuck ? 'stuck' : 'ok', queued: queue.queued, running: queue.running, oldestSeconds: Math.round(queue.oldestMs / 1000) },
    imports: { running: runningImports() },
  };
}
