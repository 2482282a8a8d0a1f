import 'server-only';
import { env, webhookLoopbackAllowed } from '@/lib/env';
import { secretBoxKey } from '@/lib/webhooks/secret-box';
import { deliverDueMail, deliverDueWebhooks, type DeliveryConfig, type DeliveryReport, type WebhookDeliveryConfig } from './deliver';

interface PassState {
  running: boolean;
  again: boolean;
}

const state = globalThis as unknown as {
  ledgerMailWorker?: { timer?: NodeJS.Timeout; running: boolean; again: boolean };
  ledgerWebhookWorker?: PassState;
};

export function deliveryConfig(): DeliveryConfig {
  const e = env();
  return { apiKey: e.RESEND_API_KEY, baseUrl: e.RESEND_BASE_URL, from: e.MAIL_FROM, timeoutMs: e.MAIL_SEND_TIMEOUT_MS, maxAttempts: e.MAIL_MAX_ATTEMPTS };
}

/** The key that opens the stored signing secrets: WEBHOOK_SECRET_KEY, or one derived from BETTER_AUTH_SECRET. */
export function webhookSecretKey(): Buffer {
  const e = env();
  return secretBoxKey(e.WEBHOOK_SECRET_KEY ?? `better-auth-secret:${e.BETTER_AUTH_SECRET}`);
}

export function webhookDeliveryConfig(): WebhookDeliveryConfig {
  const e = env();
  return { timeoutMs: e.WEBHOOK_TIMEOUT_MS, maxAttempts: e.WEBHOOK_MAX_ATTEMPTS, allowLoopback: webhookLoopbackAllowed(), secretKey: webhookSecretKey() };
}

/** Runs passes until one sends nothing; concurrent calls fold into one. */
async function runPasses(s: PassState, pass: () => Promise<DeliveryReport>, label: string): Promise<void> {
  if (s.running) {
    s.again = true;
    return;
  }
  s.running = true;
  try {
    do {
      s.again = false;
      const report = await pass();
      // a full batch may have left more due messages behind
      if (report.sent > 0) s.again = true;
    } while (s.again);
  } catch (e) {
    console.error(`[${label}] delivery pass failed`, e);
  } finally {
    s.running = false;
  }
}

/** Runs e-mail delivery passes until nothing is due; concurrent calls fold into one. */
export async function runMailWorkerOnce(): Promise<void> {
  state.ledgerMailWorker ??= { running: false, again: false };
  await runPasses(state.ledgerMailWorker, () => deliverDueMail(deliveryConfig()), 'mail');
}

/** The same for webhook deliveries, on its own so that a slow receiver never holds up e-mail. */
export async function runWebhookWorkerOnce(): Promise<void> {
  state.ledgerWebhookWorker ??= { running: false, again: false };
  await runPasses(state.ledgerWebhookWorker, () => deliverDueWebhooks(webhookDeliveryConfig()), 'webhooks');
}

/** Whether this process delivers mail: 'running' once the timer is set, 'disabled' with MAIL_WORKER_INTERVAL_MS=0. */
export function mailWorkerStatus(): 'running' | 'stopped' | 'disabled' {
  if (env().MAIL_WORKER_INTERVAL_MS === 0) return 'disabled';
  return state.ledgerMailWorker?.timer ? 'running' : 'stopped';
}

/** Starts the periodic delivery timer (e-mail and webhooks) once per server process. */
export function startMailWorker(): void {
  state.ledgerMailWorker ??= { running: false, again: false };
  const s = state.ledgerMailWorker;
  const interval = env().MAIL_WORKER_INTERVAL_MS;
  if (s.timer || interval === 0) return;
  s.timer = setInterval(() => {
    void runMailWorkerOnce();
    void runWebhookWorkerOnce();
  }, interval);
  s.timer.unref();
}
