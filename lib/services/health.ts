import 'server-only';
import { databaseAnswers } from '@/db/queries/health';
import { recomputeQueueStatus } from '@/lib/services/benchmarks/recompute-queue';
import { mailWorkerStatus } from '@/lib/services/mail/worker';
import { runningImports } from '@/lib/api-limits';

/** A recomputation waiting or running longer than this means the queue is stuck. */
export const RECOMPUTE_STUCK_MS = 15 * 60 * 1000;
const DATABASE_TIMEOUT_MS = 3000;

export interface Health {
  status: 'ok' | 'failing';
  database: { status: 'ok' | 'failing'; latencyMs: number | null; detail?: string };
  mailWorker: { status: 'running' | 'stopped' | 'disabled' };
  recomputeQueue: { status: 'ok' | 'stuck'; queued: number; running: number; failed: number; oldestSeconds: number };
  imports: { running: number };
}

async function checkDatabase(): Promise<Health['database']> {
  const answer = await databaseAnswers(DATABASE_TIMEOUT_MS);
  return answer.ok ? { status: 'ok', latencyMs: answer.latencyMs } : { status: 'failing', latencyMs: null, detail: answer.detail };
}

/** The database answers, the mail worker runs, and no recomputation is stuck. */
export async function health(): Promise<Health> {
  const database = await checkDatabase();
  const mail = mailWorkerStatus();
  const queue = await recomputeQueueStatus().catch(() => ({ queued: 0, running: 0, failed: 0, oldestMs: 0 }));
  const stuck = queue.queued + queue.running > 0 && queue.oldestMs > RECOMPUTE_STUCK_MS;
  const ok = database.status === 'ok' && mail !== 'stopped' && !stuck;
  return {
    status: ok ? 'ok' : 'failing',
    database,
    mailWorker: { status: mail },
    recomputeQueue: { status: stuck ? 'stuck' : 'ok', queued: queue.queued, running: queue.running, failed: queue.failed, oldestSeconds: Math.round(queue.oldestMs / 1000) },
    imports: { running: runningImports() },
  };
}
