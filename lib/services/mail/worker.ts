import 'server-only';
import { env } from '@/lib/env';
import { deliverDueMail, type DeliveryConfig } from './deliver';

const state = globalThis as unknown as { ledgerMailWorker?: { timer?: NodeJS.Timeout; running: boolean; again: boolean } };

export function deliveryConfig(): DeliveryConfig {
  const e = env();
  return { apiKey: e.RESEND_API_KEY, baseUrl: e.RESEND_BASE_URL, from: e.MAIL_FROM, timeoutMs: e.MAIL_SEND_TIMEOUT_MS, maxAttempts: e.MAIL_MAX_ATTEMPTS };
}

/** Runs delivery passes until nothing is due; concurrent calls fold into one. */
export async function runMailWorkerOnce(): Promise<void> {
  state.ledgerMailWorker ??= { running: false, again: false };
  const s = state.ledgerMailWorker;
  if (s.running) {
    s.again = true;
    return;
  }
  s.running = true;
  try {
    do {
      s.again = false;
      const report = await deliverDueMail(deliveryConfig());
      // a full batch may have left more due messages behind
      if (report.sent > 0) s.again = true;
    } while (s.again);
  } catch (e) {
    console.error('[mail] delivery pass failed', e);
  } finally {
    s.running = false;
  }
}

/** Whether this process delivers mail: 'running' once the timer is set, 'disabled' with MAIL_WORKER_INTERVAL_MS=0. */
export function mailWorkerStatus(): 'running' | 'stopped' | 'disabled' {
  if (env().MAIL_WORKER_INTERVAL_MS === 0) return 'disabled';
  return state.ledgerMailWorker?.timer ? 'running' : 'stopped';
}

/** Starts the periodic delivery timer once per server process. */
export function startMailWorker(): void {
  state.ledgerMailWorker ??= { running: false, again: false };
  const s = state.ledgerMailWorker;
  const interval = env().MAIL_WORKER_INTERVAL_MS;
  if (s.timer || interval === 0) return;
  s.timer = setInterval(() => void runMailWorkerOnce(), interval);
  s.timer.unref();
}
