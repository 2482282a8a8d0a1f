import 'server-only';
/**
 * When alerts go out. After a revision is stored, each benchmark waits
 * ALERT_DEBOUNCE_MS after its latest revision before announcing, so a burst of
 * imports produces one alert with the first-to-last change. State is in memory
 * (globalThis): after a crash the next revision announces everything since each
 * watcher's baseline, so nothing is lost, and the outbox's dedupe key per
 * watcher × revision means nothing is sent twice.
 */
import { envValue } from '@/lib/env';
import { announceBenchmark, sendDueDigests } from './announce';

interface Pending {
  timer: ReturnType<typeof setTimeout> | null;
  running: Promise<void> | null;
  /** A revision arrived while announcing: announce again afterwards. */
  again: boolean;
}

const store = globalThis as unknown as {
  ledgerAlertJobs?: Map<string, Pending>;
  ledgerDigestTimer?: ReturnType<typeof setInterval>;
};
const jobs = (store.ledgerAlertJobs ??= new Map<string, Pending>());

function run(key: string, job: Pending, workspaceId: string, benchmarkId: string): void {
  job.timer = null;
  if (job.running) {
    job.again = true;
    return;
  }
  job.running = announceBenchmark(workspaceId, benchmarkId)
    .then(() => undefined)
    .catch((error: unknown) => console.error(`[alerts] benchmark ${benchmarkId}: announcing failed`, error))
    .finally(() => {
      job.running = null;
      if (job.again) {
        job.again = false;
        arm(key, job, workspaceId, benchmarkId);
      } else if (!job.timer) jobs.delete(key);
    });
}

function arm(key: string, job: Pending, workspaceId: string, benchmarkId: string): void {
  if (job.timer) clearTimeout(job.timer);
  job.timer = setTimeout(() => run(key, job, workspaceId, benchmarkId), envValue('ALERT_DEBOUNCE_MS'));
  job.timer.unref?.();
}

/**
 * Called after a new revision row is stored. Returns at once; the alert for this
 * benchmark goes out once no newer revision has arrived for the debounce window.
 */
export function revisionStored(workspaceId: string, benchmarkId: string, _revisionId: string): void {
  try {
    const key = `${workspaceId}|${benchmarkId}`;
    let job = jobs.get(key);
    if (!job) jobs.set(key, (job = { timer: null, running: null, again: false }));
    arm(key, job, workspaceId, benchmarkId);
  } catch (error) {
    // Alerts must never make storing a revision fail.
    console.error('[alerts] could not schedule an announcement', error);
  }
}

/** Resolves when no announcement is waiting or running: for tests and scripts. */
export async function whenAlertsIdle(timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (jobs.size > 0) {
    if (Date.now() > deadline) throw new Error('alert announcements did not finish in time');
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}

const DIGEST_CHECK_MS = 15 * 60_000;

/** Checks for due daily digests every 15 minutes (and once shortly after start-up). */
export function startDigestTimer(): void {
  if (store.ledgerDigestTimer) return;
  const tick = () =>
    void sendDueDigests(new Date())
      .catch((error: unknown) => console.error('[alerts] digest pass failed', error));
  store.ledgerDigestTimer = setInterval(tick, DIGEST_CHECK_MS);
  store.ledgerDigestTimer.unref?.();
  setTimeout(tick, 30_000).unref?.();
}
