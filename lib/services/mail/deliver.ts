import 'server-only';
import { Resend } from 'resend';
import type { MailOutboxRow } from '@/db/schema/mail';
import { claimDue, claimDueMail, markMailFailed, markMailRetry, markMailSent } from '@/db/queries/mail';
import { webhookSendContext } from '@/db/queries/watches';
import { openSecret } from '@/lib/webhooks/secret-box';
import { sendWebhook, type Resolver, type SendOutcome } from './webhook-send';

export type { SendOutcome };

export interface DeliveryConfig {
  apiKey: string;
  /** The provider's API base (RESEND_BASE_URL, e.g. the local fake); absent: Resend's own. */
  baseUrl?: string;
  from: string;
  timeoutMs: number;
  maxAttempts: number;
  /** How long a claimed message stays claimed; after that another pass may retry it. */
  leaseMs?: number;
  batchSize?: number;
  now?: () => Date;
}

const RETRYABLE = new Set([408, 409, 425, 429]);

/** Back-off before attempt n+1: 2 s, 4 s, 8 s … capped at 10 minutes. */
export function backoffMs(attempts: number): number {
  return Math.min(2_000 * 2 ** Math.max(0, attempts - 1), 600_000);
}

/** One request to the provider. The outbox row id is the idempotency key, so a resend after a crash is not a second mail. */
export async function sendOne(row: MailOutboxRow, config: DeliveryConfig): Promise<SendOutcome> {
  const resend = new Resend(config.apiKey, config.baseUrl ? { baseUrl: config.baseUrl } : undefined);
  const signal = AbortSignal.timeout(config.timeoutMs);
  const options = { idempotencyKey: row.id, signal } as { idempotencyKey: string };
  try {
    const { data, error } = await resend.emails.send(
      {
        from: config.from,
        to: [row.toAddress],
        subject: row.subject,
        text: row.textBody,
        html: row.htmlBody,
        headers: row.headers ?? undefined,
      },
      options,
    );
    if (data?.id) return { kind: 'sent', providerId: data.id };
    const status = error?.statusCode ?? null;
    const message = `${status ?? 'network'} ${error?.name ?? 'error'}: ${error?.message ?? 'no response'}`;
    if (status === null || status >= 500 || RETRYABLE.has(status)) return { kind: 'retry', error: message };
    return { kind: 'permanent', error: message };
  } catch (e) {
    return { kind: 'retry', error: e instanceof Error ? e.message : String(e) };
  }
}

export interface DeliveryReport {
  sent: number;
  retried: number;
  failed: number;
}

/** Records what one attempt came to: sent, another try after the back-off (or the receiver's Retry-After, if longer), or failed for good. */
async function settle(row: MailOutboxRow, outcome: SendOutcome, maxAttempts: number, now: () => Date, report: DeliveryReport): Promise<void> {
  if (outcome.kind === 'sent') {
    await markMailSent(row.id, outcome.providerId, now());
    report.sent++;
  } else if (outcome.kind === 'permanent' || row.attempts >= maxAttempts) {
    await markMailFailed(row.id, outcome.error);
    report.failed++;
  } else {
    const wait = Math.max(backoffMs(row.attempts), outcome.retryAfterMs ?? 0);
    await markMailRetry(row.id, outcome.error, new Date(now().getTime() + wait));
    report.retried++;
  }
}

/** One delivery pass over the due e-mails of the outbox. */
export async function deliverDueMail(config: DeliveryConfig): Promise<DeliveryReport> {
  const now = config.now ?? (() => new Date());
  const leaseMs = config.leaseMs ?? config.timeoutMs * 2 + 5_000;
  const report: DeliveryReport = { sent: 0, retried: 0, failed: 0 };
  const claimed = await claimDueMail(now(), leaseMs, config.batchSize ?? 20);
  for (const row of claimed) await settle(row, await sendOne(row, config), config.maxAttempts, now, report);
  return report;
}

export interface WebhookDeliveryConfig {
  timeoutMs: number;
  maxAttempts: number;
  /** Loopback (and plain http to it) allowed: development, tests, WEBHOOK_ALLOW_LOOPBACK=1. */
  allowLoopback: boolean;
  /** Opens the stored signing secrets (lib/webhooks/secret-box.ts). */
  secretKey: Buffer;
  /** Deliveries sent at once; a pass claims no more than this, so nothing claimed waits behind a slow receiver. */
  concurrency?: number;
  leaseMs?: number;
  maxResponseBytes?: number;
  resolve?: Resolver;
  /** The outbox's clock (claims, back-off). Signatures always carry the wall-clock time a receiver compares with. */
  now?: () => Date;
}

/** One attempt of one claimed webhook row: its watch's secret, its workspace's network setting, then the request. */
export async function sendOneWebhook(row: MailOutboxRow, config: WebhookDeliveryConfig): Promise<SendOutcome> {
  if (!row.workspaceId || !row.watchId) return { kind: 'permanent', error: 'not a webhook delivery of a watch' };
  const context = await webhookSendContext(row.workspaceId, row.watchId);
  if (!context?.sealedSecret) return { kind: 'permanent', error: 'the watch no longer has a webhook (it was removed)' };
  const secret = openSecret(context.sealedSecret, config.secretKey, context.watchId);
  if (secret === null) return { kind: 'permanent', error: 'the signing secret cannot be read with the current key (WEBHOOK_SECRET_KEY changed?): rotate it' };
  return sendWebhook(
    { id: row.id, url: row.toAddress, body: row.textBody, secret, attempt: row.attempts },
    { timeoutMs: config.timeoutMs, allowLoopback: config.allowLoopback, allowPrivate: context.allowPrivate, maxResponseBytes: config.maxResponseBytes, resolve: config.resolve },
  );
}

/** One delivery pass over the due webhook deliveries, `concurrency` at a time. */
export async function deliverDueWebhooks(config: WebhookDeliveryConfig): Promise<DeliveryReport> {
  const now = config.now ?? (() => new Date());
  const leaseMs = config.leaseMs ?? config.timeoutMs * 2 + 5_000;
  const report: DeliveryReport = { sent: 0, retried: 0, failed: 0 };
  const claimed = await claimDue('webhook', now(), leaseMs, config.concurrency ?? 4);
  await Promise.all(
    claimed.map(async (row) => {
      let outcome: SendOutcome;
      try {
        outcome = await sendOneWebhook(row, config);
      } catch (e) {
        outcome = { kind: 'retry', error: e instanceof Error ? e.message : String(e) };
      }
      await settle(row, outcome, config.maxAttempts, now, report);
    }),
  );
  return report;
}
