import 'server-only';
/**
 * When alerts go out, as durable jobs (lib/services/jobs/runner.ts) shared by
 * every app process. After a revision is stored, the benchmark's 'announce' job
 * is pushed back to ALERT_DEBOUNCE_MS from now, so a burst of imports produces
 * one alert with the first-to-last change. One process at a time holds the
 * job's lease, and the outbox's dedupe key per watcher × revision means a run
 * repeated after a lost lease sends nothing twice.
 *
 * The daily digests are one standing 'digest' job: each run sends what is due
 * and queues the next run DIGEST_CHECK_MS later.
 */
import { ensureJob } from '@/db/queries/jobs';
import { envValue } from '@/lib/env';
import { queueJob, registerJobHandler, startJobRunner, whenJobsIdle } from '@/lib/services/jobs/runner';
import { announceBenchmark, sendDueDigests } from './announce';

const ANNOUNCE = 'announce';
const DIGEST = 'digest';
const DIGEST_CHECK_MS = 15 * 60_000;

registerJobHandler(ANNOUNCE, async (job) => {
  const [workspaceId, benchmarkId] = job.key.split('|');
  await announceBenchmark(workspaceId, benchmarkId);
});

registerJobHandler(DIGEST, async () => {
  await sendDueDigests(new Date());
  await queueJob({ kind: DIGEST, key: 'daily', item: null, runAfter: new Date(Date.now() + DIGEST_CHECK_MS) });
});

/**
 * Called after a new revision row is stored. The alert for this benchmark goes
 * out once no newer revision has arrived for the debounce window.
 */
export async function revisionStored(workspaceId: string, benchmarkId: string, revisionId: string): Promise<void> {
  try {
    await queueJob({ kind: ANNOUNCE, key: `${workspaceId}|${benchmarkId}`, workspaceId, item: revisionId, runAfter: new Date(Date.now() + envValue('ALERT_DEBOUNCE_MS')) });
  } catch (error) {
    // Alerts must never make storing a revision fail; the next revision announces this one too.
    console.error('[alerts] could not schedule an announcement', error);
  }
}

/** Resolves when no announcement waits or runs: for tests and scripts. */
export async function whenAlertsIdle(timeoutMs = 60_000): Promise<void> {
  await whenJobsIdle({ kinds: [ANNOUNCE] }, timeoutMs);
}

/** Makes sure the digest job exists (its first run shortly after start-up) and starts this process's job runner. */
export async function startDigestTimer(): Promise<void> {
  await ensureJob({ kind: DIGEST, key: 'daily', runAfter: new Date(Date.now() + 30_000) });
  startJobRunner();
}
