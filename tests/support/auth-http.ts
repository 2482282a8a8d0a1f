import { toNextJsHandler } from 'better-auth/next-js';
import { getAuth } from '@/lib/auth';

/** Calls better-auth through its HTTP handler, as a browser would (rate limits and origin checks apply). */
export async function authRequest(path: string, init: { method?: 'GET' | 'POST'; body?: unknown; cookie?: string; ip?: string } = {}) {
  const base = process.env.BETTER_AUTH_URL!;
  const headers = new Headers({ origin: base, 'x-forwarded-for': init.ip ?? '203.0.113.7' });
  if (init.body !== undefined) headers.set('content-type', 'application/json');
  if (init.cookie) headers.set('cookie', init.cookie);
  const request = new Request(`${base}/api/auth${path}`, {
    method: init.method ?? 'POST',
    headers,
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    redirect: 'manual',
  });
  const handler = toNextJsHandler(getAuth());
  return request.method === 'GET' ? handler.GET(request) : handler.POST(request);
}

export function cookieHeader(response: Response): string {
  return response.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
