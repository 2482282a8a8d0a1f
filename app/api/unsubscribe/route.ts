import { env } from '@/lib/env';
import { isAppError } from '@/lib/errors';
import { limitedBody } from '@/lib/stream-limit';
import { TOKEN_REFUSALS, verifyUnsubscribeToken } from '@/lib/alerts/unsubscribe-token';
import { unsubscribeWatchById } from '@/db/queries/watches';

/** A one-click body is a few dozen bytes; anything larger is not one. */
const MAX_BODY_BYTES = 4096;

function answer(status: number, detail: string): Response {
  return new Response(JSON.stringify({ type: 'about:blank', title: status < 300 ? 'ok' : 'unsubscribe refused', status, detail }), {
    status,
    headers: { 'content-type': status < 300 ? 'application/json' : 'application/problem+json', 'cache-control': 'no-store' },
  });
}

async function readForm(request: Request): Promise<URLSearchParams | null> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^application\/x-www-form-urlencoded\b/i.test(type)) return null;
  const chunks: Uint8Array[] = [];
  for await (const chunk of limitedBody(request, MAX_BODY_BYTES)) chunks.push(chunk);
  return new URLSearchParams(Buffer.concat(chunks).toString('utf8'));
}

/**
 * One-click unsubscribe (RFC 8058): the mail client POSTs
 * `List-Unsubscribe=One-Click` to the URL of the List-Unsubscribe header. There
 * is no session: the signed token in the URL is the authority, and without a
 * valid one nothing is read or changed.
 */
export async function POST(request: Request): Promise<Response> {
  const url = new URL(request.url);
  let form: URLSearchParams | null;
  try {
    form = await readForm(request);
  } catch (e) {
    if (isAppError(e) && e.code === 'too-large') return answer(413, 'The body of a one-click unsubscribe is List-Unsubscribe=One-Click, nothing more.');
    throw e;
  }
  if (!form || form.get('List-Unsubscribe') !== 'One-Click') {
    return answer(400, 'Send the form body List-Unsubscribe=One-Click (application/x-www-form-urlencoded), as RFC 8058 describes. Nothing was changed.');
  }
  const e = env();
  const check = verifyUnsubscribeToken(url.searchParams.get('token'), e.BETTER_AUTH_SECRET);
  if (!check.ok) return answer(check.reason === 'expired' ? 410 : check.reason === 'forged' ? 403 : 400, TOKEN_REFUSALS[check.reason]);
  const result = await unsubscribeWatchById(check.watchId);
  if (!result.found) return answer(404, 'This watch no longer exists. Nothing was changed.');
  if (form.get('return') === 'page') {
    const back = new URL('/unsubscribe', e.BETTER_AUTH_URL);
    back.searchParams.set('token', url.searchParams.get('token')!);
    back.searchParams.set('done', '1');
    return Response.redirect(back, 303);
  }
  return answer(200, result.changed ? 'Unsubscribed: no more alerts for this watch.' : 'Already unsubscribed: nothing changed.');
}
