/**
 * Webhook signatures: HMAC-SHA256 (RFC 2104, FIPS 180-4) keyed with the watch's
 * signing secret over `<timestamp>.<body>`, where the timestamp is the Unix time
 * in whole seconds sent in Ledger-Webhook-Timestamp and the body is the exact
 * bytes sent. The signature travels as `Ledger-Webhook-Signature: sha256=<hex>`.
 * Pure; the same functions serve the sender and the test receiver, and the
 * README shows the receiver's side in plain Node.
 */
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';

export const WEBHOOK_HEADERS = {
  id: 'Ledger-Webhook-Id',
  timestamp: 'Ledger-Webhook-Timestamp',
  signature: 'Ledger-Webhook-Signature',
  attempt: 'Ledger-Webhook-Attempt',
} as const;

/** How far a receiver should accept a timestamp from its own clock, either way (the README's advice). */
export const DEFAULT_TOLERANCE_SECONDS = 300;

/** A new signing secret: 32 random bytes, base64url, with a prefix that says what it is. */
export function generateWebhookSecret(): string {
  return `whsec_${randomBytes(32).toString('base64url')}`;
}

/** Lower-case hex HMAC-SHA256 of a message; a string key is used as its UTF-8 bytes. */
export function hmacSha256Hex(key: string | Buffer, ...message: Array<string | Buffer>): string {
  const mac = createHmac('sha256', key);
  for (const part of message) mac.update(part);
  return mac.digest('hex');
}

/** HMAC-SHA256 of `${timestamp}.${body}`. The secret's text (prefix included) is the key, as UTF-8. */
export function webhookSignature(secret: string, timestamp: number | string, body: string | Buffer): string {
  return hmacSha256Hex(secret, `${timestamp}.`, body);
}

/** The headers of one delivery (Content-Type aside). */
export function signedHeaders(input: { id: string; secret: string; body: string; now: Date; attempt: number }): Record<string, string> {
  const timestamp = Math.floor(input.now.getTime() / 1000);
  return {
    [WEBHOOK_HEADERS.id]: input.id,
    [WEBHOOK_HEADERS.timestamp]: String(timestamp),
    [WEBHOOK_HEADERS.signature]: `sha256=${webhookSignature(input.secret, timestamp, input.body)}`,
    [WEBHOOK_HEADERS.attempt]: String(input.attempt),
  };
}

export type VerifyResult = { ok: true; id: string; timestamp: number } | { ok: false; reason: 'missing-header' | 'malformed' | 'stale' | 'bad-signature' };

type HeaderBag = Record<string, string | string[] | undefined> | Headers;

function header(headers: HeaderBag, name: string): string | undefined {
  if (headers instanceof Headers) return headers.get(name) ?? undefined;
  const found = Object.entries(headers).find(([k]) => k.toLowerCase() === name.toLowerCase())?.[1];
  return Array.isArray(found) ? found[0] : found;
}

/**
 * A receiver's check: the signature matches the raw body and the timestamp is
 * within `toleranceSeconds` of `now`. Compared in constant time.
 */
export function verifyWebhook(input: { secret: string; headers: HeaderBag; body: string | Buffer; now?: Date; toleranceSeconds?: number }): VerifyResult {
  const id = header(input.headers, WEBHOOK_HEADERS.id);
  const ts = header(input.headers, WEBHOOK_HEADERS.timestamp);
  const sig = header(input.headers, WEBHOOK_HEADERS.signature);
  if (!id || !ts || !sig) return { ok: false, reason: 'missing-header' };
  if (!/^\d{1,12}$/.test(ts)) return { ok: false, reason: 'malformed' };
  const m = /^sha256=([0-9a-f]{64})$/.exec(sig.trim());
  if (!m) return { ok: false, reason: 'malformed' };
  const timestamp = Number(ts);
  const now = Math.floor((input.now ?? new Date()).getTime() / 1000);
  if (Math.abs(now - timestamp) > (input.toleranceSeconds ?? DEFAULT_TOLERANCE_SECONDS)) return { ok: false, reason: 'stale' };
  const expected = Buffer.from(webhookSignature(input.secret, ts, input.body), 'hex');
  const given = Buffer.from(m[1], 'hex');
  if (!timingSafeEqual(expected, given)) return { ok: false, reason: 'bad-signature' };
  return { ok: true, id, timestamp };
}
