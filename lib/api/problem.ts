import { isAppError, problemResponse } from '@/lib/errors';
import { ImportRefusal } from '@/lib/import/errors';

const PROBLEM = 'application/problem+json';

/** An RFC 9457 problem document. */
export function problem(status: number, title: string, detail: string, extra: Record<string, unknown> = {}, headers: HeadersInit = {}): Response {
  return new Response(JSON.stringify({ type: 'about:blank', title, status, detail, ...extra }), {
    status,
    headers: { 'content-type': PROBLEM, ...headers },
  });
}

/** Maps anything a handler throws to a problem document (422 for a refused import, with every row error). */
export function problemFromError(e: unknown): Response {
  if (e instanceof ImportRefusal) {
    return problem(422, 'unprocessable', e.message, { errorCount: e.errorCount, errors: e.errors });
  }
  if (isAppError(e)) {
    if (e.code === 'unauthorized') {
      const res = problemResponse(e);
      res.headers.set('www-authenticate', 'Bearer realm="lattice-ledger"');
      return res;
    }
    if (e.code === 'conflict' && e.details && typeof e.details === 'object' && 'firstImportId' in e.details) {
      return problem(409, 'conflict', e.message, { firstImportId: (e.details as { firstImportId: string }).firstImportId });
    }
    return problemResponse(e);
  }
  console.error(e);
  return problem(500, 'internal', 'The server could not process the request.');
}
