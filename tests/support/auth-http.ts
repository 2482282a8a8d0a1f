import { POST, GET } from '@/app/api/auth/[...all]/route';
import { PEER_HEADER, peerStamp } from '@/lib/client-address';

/**
 * Calls better-auth through the app's route handler, as a browser would (rate limits and origin checks apply).
 * `ip` is the TCP peer, stamped as scripts/server.mjs stamps it; `headers` are what the client itself sends.
 */
export async function authRequest(
  path: string,
  init: { method?: 'GET' | 'POST'; body?: unknown; cookie?: string; ip?: string; headers?: Record<string, string> } = {},
) {
  const base = process.env.BETTER_AUTH_URL!;
  const headers = new Headers({ origin: base, ...init.headers });
  headers.set(PEER_HEADER, peerStamp(init.ip ?? '203.0.113.7', 'x-forwarded-for' in (init.headers ?? {})));
  if (init.body !== undefined) headers.set('content-type', 'application/json');
  if (init.cookie) headers.set('cookie', init.cookie);
  const request = new Request(`${base}/api/auth${path}`, {
    method: init.method ?? 'POST',
    headers,
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    redirect: 'manual',
  });
  return request.method === 'GET' ? GET(request) : POST(request);
}

export function cookieHeader(response: Response): string {
  return response.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
