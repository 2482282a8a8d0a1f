import 'server-only';
import { clientAddress, addressKey, PEER_HEADER } from '@/lib/client-address';
import { authRules, consume } from '@/lib/services/rate-limit';

/** The header better-auth reads the client address from; always written here, never taken from the client. */
export const CLIENT_ADDRESS_HEADER = 'x-ledger-client-address';

/** Endpoints limited per client and, where the body names an account, per account (e-mail). */
export const LIMITED_AUTH_PATHS: Record<string, { account: boolean }> = {
  '/sign-in/email': { account: true },
  '/sign-up/email': { account: true },
  '/request-password-reset': { account: true },
  '/reset-password': { account: false },
};

const FORWARDING_HEADERS = ['x-forwarded-for', 'x-real-ip', 'forwarded', 'cf-connecting-ip', 'true-client-ip', PEER_HEADER, CLIENT_ADDRESS_HEADER];

function tooMany(retryAfterSeconds: number, what: string): Response {
  return new Response(JSON.stringify({ code: 'TOO_MANY_REQUESTS', message: `Too many attempts ${what}. Try again in ${retryAfterSeconds} s.` }), {
    status: 429,
    headers: { 'content-type': 'application/json', 'retry-after': String(retryAfterSeconds), 'x-retry-after': String(retryAfterSeconds) },
  });
}

function emailOf(body: string, contentType: string): string | null {
  try {
    const value = contentType.includes('application/x-www-form-urlencoded')
      ? new URLSearchParams(body).get('email')
      : (JSON.parse(body) as { email?: unknown }).email;
    return typeof value === 'string' && value.trim() !== '' ? value.trim().toLowerCase() : null;
  } catch {
    return null;
  }
}

/**
 * Runs before better-auth's handler: the client address comes from the socket (or a trusted proxy), never from a
 * header the client wrote; sign-in, sign-up and reset are limited per client and per account. Returns the request
 * to hand on, or the refusal.
 */
export async function guardAuthRequest(request: Request): Promise<Request | Response> {
  const address = clientAddress(request.headers);
  const headers = new Headers(request.headers);
  for (const h of FORWARDING_HEADERS) headers.delete(h);
  if (address) headers.set(CLIENT_ADDRESS_HEADER, address);
  if (request.method !== 'POST') return new Request(request.url, { method: request.method, headers });

  const body = await request.text();
  const path = new URL(request.url).pathname.replace(/^\/api\/auth/, '');
  const limited = LIMITED_AUTH_PATHS[path];
  if (limited) {
    const rules = authRules();
    const byClient = await consume(`client:${addressKey(address)}|${path}`, rules.client);
    if (!byClient.allowed) return tooMany(byClient.retryAfterSeconds, 'from this address');
    const email = limited.account ? emailOf(body, headers.get('content-type') ?? '') : null;
    if (email) {
      const byAccount = await consume(`account:${email}|${path}`, rules.account);
      if (!byAccount.allowed) return tooMany(byAccount.retryAfterSeconds, 'for this account');
    }
  }
  return new Request(request.url, { method: 'POST', headers, body });
}
