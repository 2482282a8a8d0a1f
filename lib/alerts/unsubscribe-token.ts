/**
 * Signed one-click unsubscribe tokens: `<watchId>.<expiry, unix seconds>.<HMAC-SHA256>`.
 * The signature covers the watch id and the expiry, so neither can be changed,
 * and it is compared in constant time.
 */
import { createHmac, timingSafeEqual } from 'node:crypto';

export const UNSUBSCRIBE_TOKEN_DAYS = 180;

export type UnsubscribeTokenCheck = { ok: true; watchId: string; expiresAt: Date } | { ok: false; reason: 'malformed' | 'forged' | 'expired' };

function signature(secret: string, watchId: string, expires: number): Buffer {
  return createHmac('sha256', secret).update(`unsubscribe|${watchId}|${expires}`).digest();
}

export function signUnsubscribeToken(watchId: string, secret: string, now: Date = new Date(), days = UNSUBSCRIBE_TOKEN_DAYS): string {
  if (!/^[\w-]{1,100}$/.test(watchId)) throw new Error('A watch id is letters, digits, "-" and "_" only.');
  const expires = Math.floor(now.getTime() / 1000) + Math.round(days * 86_400);
  return `${watchId}.${expires}.${signature(secret, watchId, expires).toString('base64url')}`;
}

export function verifyUnsubscribeToken(token: string | null | undefined, secret: string, now: Date = new Date()): UnsubscribeTokenCheck {
  const match = typeof token === 'string' ? /^([\w-]{1,100})\.(\d{1,12})\.([\w-]{43})$/.exec(token) : null;
  if (!match) return { ok: false, reason: 'malformed' };
  const [, watchId, expiresText, sig] = match;
  const expires = Number(expiresText);
  const given = Buffer.from(sig, 'base64url');
  const wanted = signature(secret, watchId, expires);
  if (given.length !== wanted.length || !timingSafeEqual(given, wanted)) return { ok: false, reason: 'forged' };
  if (expires * 1000 <= now.getTime()) return { ok: false, reason: 'expired' };
  return { ok: true, watchId, expiresAt: new Date(expires * 1000) };
}

/** What the page and the route say about a refused token. */
export const TOKEN_REFUSALS: Record<'malformed' | 'forged' | 'expired', string> = {
  malformed: 'This unsubscribe link is incomplete or damaged. Nothing was changed. Open the link from the e-mail again, or change your watches in the app.',
  forged: 'This unsubscribe link is not valid. Nothing was changed. Open the link from the e-mail again, or change your watches in the app.',
  expired: 'This unsubscribe link has expired. Nothing was changed. Sign in and stop the watch on the “Watches” page instead.',
};
