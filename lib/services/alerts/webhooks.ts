import 'server-only';
/**
 * Setting a watch's webhook: the URL is checked as written and, for a host
 * name, what it resolves to now (the worker checks again before every send,
 * since DNS can change). The signing secret is made here, sealed for storage,
 * and returned once to show the watcher; it is never read back for display.
 */
import { lookup } from 'node:dns/promises';
import { AppError } from '@/lib/errors';
import { webhookLoopbackAllowed } from '@/lib/env';
import { checkAddress, checkWebhookUrl, type UrlPolicyOptions } from '@/lib/webhooks/url-policy';
import { generateWebhookSecret } from '@/lib/webhooks/signature';
import { sealSecret } from '@/lib/webhooks/secret-box';
import { getMyWatchWebhook, updateWatchWebhook } from '@/db/queries/watches';
import { privateWebhookTargetsAllowed } from '@/db/queries/settings';
import { webhookSecretKey } from '@/lib/services/mail/worker';

const SAVE_TIME_DNS_MS = 3_000;

function refused(reason: string): AppError {
  return new AppError('bad-request', reason, { field: 'webhookUrl' });
}

/** What the host resolves to, each address checked; a name that does not resolve within 3 s is refused. */
async function checkResolved(host: string, policy: UrlPolicyOptions): Promise<void> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error('timeout')), SAVE_TIME_DNS_MS);
  });
  let addresses: Array<{ address: string }>;
  try {
    addresses = await Promise.race([lookup(host, { all: true, verbatim: true }), timeout]);
  } catch {
    throw refused(`${host} does not resolve to an address (checked now; the webhook is not saved).`);
  } finally {
    clearTimeout(timer);
  }
  for (const a of addresses) {
    const check = checkAddress(a.address, policy);
    if (!check.ok) throw refused(`${host} resolves to ${check.reason}`);
  }
}

/** The policy of this workspace now: loopback by environment, private targets by the owner's setting. */
export async function webhookPolicy(workspaceId: string): Promise<UrlPolicyOptions> {
  return { allowLoopback: webhookLoopbackAllowed(), allowPrivate: await privateWebhookTargetsAllowed(workspaceId) };
}

/** Checks a URL for this workspace as the save does (syntax, then DNS); returns the normalised URL. */
export async function checkWebhookTarget(workspaceId: string, raw: string): Promise<string> {
  const policy = await webhookPolicy(workspaceId);
  const checked = checkWebhookUrl(raw, policy);
  if (!checked.ok) throw refused(checked.reason);
  if (!checked.literal) await checkResolved(checked.host, policy);
  return checked.url.toString();
}

/**
 * Sets or removes (blank) the webhook of one's own watch. Returns the new
 * signing secret when one was made (the first URL of the watch), else null.
 */
export async function setWatchWebhook(workspaceId: string, watchId: string, userId: string, raw: string): Promise<{ secret: string | null; url: string | null }> {
  const current = await getMyWatchWebhook(workspaceId, watchId, userId);
  if (current.unsubscribedAt) throw new AppError('conflict', 'This watch is stopped: watch the benchmark again first.');
  if (raw.trim() === '') {
    await updateWatchWebhook(workspaceId, watchId, userId, { url: null });
    return { secret: null, url: null };
  }
  const url = await checkWebhookTarget(workspaceId, raw);
  if (current.hasSecret) {
    await updateWatchWebhook(workspaceId, watchId, userId, { url });
    return { secret: null, url };
  }
  const secret = generateWebhookSecret();
  await updateWatchWebhook(workspaceId, watchId, userId, { url, sealedSecret: sealSecret(secret, webhookSecretKey(), watchId) });
  return { secret, url };
}

/** A new signing secret for one's own watch (the old one stops working at once); returned once. */
export async function rotateWatchWebhookSecret(workspaceId: string, watchId: string, userId: string): Promise<{ secret: string }> {
  const current = await getMyWatchWebhook(workspaceId, watchId, userId);
  if (!current.webhookUrl) throw new AppError('conflict', 'This watch has no webhook: save a URL first.');
  const secret = generateWebhookSecret();
  await updateWatchWebhook(workspaceId, watchId, userId, { url: current.webhookUrl, sealedSecret: sealSecret(secret, webhookSecretKey(), watchId) });
  return { secret };
}
