import 'server-only';
import { Resend } from 'resend';
import type { MailOutboxRow } from '@/db/schema/mail';
import { claimDueMail, markMailFailed, markMailRetry, markMailSent } from '@/db/queries/mail';

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

export type SendOutcome = { kind: 'sent'; providerId: string } | { kind: 'retry'; error: string } | { kind: 'permanent'; error: string };

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

/** One delivery pass over the due messages of the outbox. */
export async function deliverDueMail(config: DeliveryConfig): Promise<DeliveryReport> {
  const now = config.now ?? (() => new Date());
  const leaseMs = config.leaseMs ?? config.timeoutMs * 2 + 5_000;
  const report: DeliveryReport = { sent: 0, retried: 0, failed: 0 };
  const claimed = await claimDueMail(now(), leaseMs, config.batchSize ?? 20);
  for (const row of claimed) {
    const outcome = await sendOne(row, config);
    if (outcome.kind === 'sent') {
      await markMailSent(row.id, outcome.providerId, now());
      report.sent++;
    } else if (outcome.kind === 'permanent' || row.attempts >= config.maxAttempts) {
      await markMailFailed(row.id, outcome.error);
      report.failed++;
    } else {
      await markMailRetry(row.id, outcome.error, new Date(now().getTime() + backoffMs(row.attempts)));
      report.retried++;
    }
  }
  return report;
}
