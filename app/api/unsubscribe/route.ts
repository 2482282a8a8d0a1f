import { env } from '@/lib/env';
import { AppError, isAppError, toProblem, type AppErrorCode } from '@/lib/errors';
import { limitedBody } from '@/lib/stream-limit';
import { TOKEN_REFUSALS, verifyUnsubscribeToken } from '@/lib/alerts/unsubscribe-token';
import { unsubscribeWatchById } from '@/db/queries/watches';

/** A one-click body is a few dozen bytes; anything larger is not one. */
const MAX_BODY_BYTES = 4096;

const NO_STORE = { 'cache-control': 'no-store' };

function refuse(code: AppErrorCode, detail: string): Response {
  return toProblem(new AppError(code, detail), { headers: NO_STORE });
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
    if (isAppError(e) && e.code === 'too-large') return refuse('too-large', 'The body of a one-click unsubscribe is List-Unsubscribe=One-Click, nothing more.');
    throw e;
  }
  if (!form || form.get('List-Unsubscribe') !== 'One-Click') {
    return refuse('bad-request', 'Send the form body List-Unsubscribe=One-Click (application/x-www-form-urlencoded), as RFC 8058 describes. Nothing was changed.');
  }
  const e = env();
  const check = verifyUnsubscribeToken(url.searchParams.get('token'), e.BETTER_AUTH_SECRET);
  if (!check.ok) return refuse(check.reason === 'expired' ? 'gone' : check.reason === 'forged' ? 'forbidden' : 'bad-request', TOKEN_REFUSALS[check.reason]);
  const result = await unsubscribeWatchById(check.watchId);
  if (!result.found) return refuse('not-found', 'This watch no longer exists. Nothing was changed.');
  if (form.get('return') === 'page') {
    const back = new URL('/unsubscribe', e.BETTER_AUTH_URL);
    back.searchParams.set('token', url.searchParams.get('token')!);
    back.searchParams.set('done', '1');
    return Response.redirect(back, 303);
  }
  return Response.json({ status: 200, detail: result.changed ? 'Unsubscribed: no more alerts for this watch.' : 'Already unsubscribed: nothing changed.' }, { headers: NO_STORE });
}
