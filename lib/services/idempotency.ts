import 'server-only';
import { createHash } from 'node:crypto';
import {
  claimIdempotencyKey,
  completeIdempotencyKey,
  findIdempotencyKey,
  pruneIdempotencyKeys,
  releaseIdempotencyKey,
} from '@/db/queries/idempotency';
import { AppError } from '@/lib/errors';
import { envValue } from '@/lib/env';
import { readLimitedBody } from '@/lib/stream-limit';

/**
 * `Idempotency-Key` on POST /api/v1/* (called by lib/api/handler.ts for every POST): the first request with a key claims it (workspace × token × key) and
 * its response is stored; a retry within IDEMPOTENCY_WINDOW_HOURS gets that response again
 * (`Idempotency-Replayed: true`) and nothing runs twice. The same key with another method, path, query or
 * body → 422; while the first request still runs → 409. Server errors (5xx) and 429 are not stored: the key
 * is given back so the retry runs. Without the header a POST runs as before.
 */

export const IDEMPOTENCY_HEADER = 'idempotency-key';
const KEY_PATTERN = /^[\x21-\x7e]{1,255}$/;
/** A claim older than this with no response is taken as left behind by a crashed process. */
const STALE_CLAIM_MS = 30 * 60 * 1000;
/** Response headers a replay repeats. */
const KEPT_HEADERS = ['content-type', 'location', 'retry-after'];

export interface Scope {
  workspaceId: string;
  tokenId: string;
}

function requestHash(request: Request, body: Uint8Array): string {
  const url = new URL(request.url);
  const hash = createHash('sha256');
  hash.update(`${url.search}\n${(request.headers.get('content-type') ?? '').toLowerCase()}\n`);
  hash.update(body);
  return hash.digest('hex');
}

function replay(stored: { status: number; responseBody: string | null; responseHeaders: Record<string, string> | null }): Response {
  return new Response(stored.responseBody ?? '', {
    status: stored.status,
    headers: { ...(stored.responseHeaders ?? {}), 'idempotency-replayed': 'true' },
  });
}

/** Runs `act` at most once per key; requests without the header run as they are. */
export async function withIdempotency(request: Request, scope: Scope, act: (request: Request) => Promise<Response>): Promise<Response> {
  const key = request.headers.get(IDEMPOTENCY_HEADER);
  if (key === null) return act(request);
  if (!KEY_PATTERN.test(key)) throw new AppError('bad-request', 'Idempotency-Key must be 1–255 visible ASCII characters (a UUID is a good choice).');

  // The body is read once to hash it, then handed to the route as a fresh request.
  const body = await readLimitedBody(request, envValue('IMPORT_MAX_BYTES'));
  const hash = requestHash(request, body);
  const url = new URL(request.url);
  const now = new Date();
  const windowMs = envValue('IDEMPOTENCY_WINDOW_HOURS') * 3600 * 1000;
  await pruneIdempotencyKeys(now);

  const claim = { tokenId: scope.tokenId, key, method: request.method, path: url.pathname, requestHash: hash, expiresAt: new Date(now.getTime() + windowMs) };
  let id = await claimIdempotencyKey(scope.workspaceId, claim);
  if (!id) {
    const stored = await findIdempotencyKey(scope.workspaceId, scope.tokenId, key);
    if (stored && stored.status === null && now.getTime() - stored.createdAt.getTime() > STALE_CLAIM_MS) {
      await releaseIdempotencyKey(scope.workspaceId, stored.id);
      id = await claimIdempotencyKey(scope.workspaceId, claim);
    } else if (stored) {
      if (stored.method !== request.method || stored.path !== url.pathname || stored.requestHash !== hash) {
        throw new AppError(
          'unprocessable',
          `This Idempotency-Key was already used for a different request (${stored.method} ${stored.path} with another query or body). Use a new key for a new request.`,
          { idempotencyKey: key },
        );
      }
      if (stored.status === null) {
        throw new AppError('conflict', 'A request with this Idempotency-Key is still running. Retry after it has finished to get its response.', { idempotencyKey: key });
      }
      return replay({ status: stored.status, responseBody: stored.responseBody, responseHeaders: stored.responseHeaders });
    } else {
      id = await claimIdempotencyKey(scope.workspaceId, claim); // deleted between the insert and the read
    }
    if (!id) throw new AppError('conflict', 'A request with this Idempotency-Key is still running. Retry after it has finished.', { idempotencyKey: key });
  }

  let response: Response;
  try {
    response = await act(new Request(request.url, { method: request.method, headers: request.headers, body: body.byteLength ? (body as Uint8Array<ArrayBuffer>) : undefined }));
  } catch (error) {
    await releaseIdempotencyKey(scope.workspaceId, id);
    throw error;
  }
  return store(scope.workspaceId, id, response);
}

/** Stores a finished response under the claim (or gives the key back for 5xx / 429) and returns it. */
async function store(workspaceId: string, id: string, response: Response): Promise<Response> {
  if (response.status >= 500 || response.status === 429) {
    await releaseIdempotencyKey(workspaceId, id);
    return response;
  }
  const text = await response.text();
  const headers: Record<string, string> = {};
  for (const name of KEPT_HEADERS) {
    const value = response.headers.get(name);
    if (value !== null) headers[name] = value;
  }
  await completeIdempotencyKey(workspaceId, id, { status: response.status, body: text, headers });
  return new Response(text, { status: response.status, headers: response.headers });
}
