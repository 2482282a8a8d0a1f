/**
 * The one error path. Server code throws AppError with a kind; server actions
 * turn it into their form state, and every route handler — the workspace
 * routes, the REST API, the unsubscribe route — answers it with toProblem().
 */
export type AppErrorCode = 'bad-request' | 'unauthorized' | 'forbidden' | 'not-found' | 'conflict' | 'gone' | 'too-large' | 'unprocessable' | 'rate-limited';

const STATUS: Record<AppErrorCode, number> = {
  'bad-request': 400,
  unauthorized: 401,
  forbidden: 403,
  'not-found': 404,
  conflict: 409,
  gone: 410,
  'too-large': 413,
  unprocessable: 422,
  'rate-limited': 429,
};

/** Facts some kinds carry: a refused import's row errors (see lib/import/errors), a rate limit's wait. */
interface ErrorFacts {
  errors?: Array<{ row: number; column: string | null; reason: string; value?: string; methodLine?: number }>;
  errorCount?: number;
  retryAfterSeconds?: number;
}

export class AppError extends Error {
  readonly code: AppErrorCode;
  /** Field issues (an array, e.g. zod's) or named facts (an object) the problem document carries. */
  readonly details?: unknown;
  readonly errors?: ErrorFacts['errors'];
  readonly errorCount?: number;
  /** Seconds until the same request may succeed (rate-limited). */
  readonly retryAfterSeconds?: number;
  constructor(code: AppErrorCode, message: string, details?: unknown, facts: ErrorFacts = {}) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.details = details;
    if (facts.errors) {
      this.errors = facts.errors;
      this.errorCount = facts.errorCount ?? facts.errors.length;
    }
    if (facts.retryAfterSeconds !== undefined) this.retryAfterSeconds = Math.max(1, Math.ceil(facts.retryAfterSeconds));
  }
  get status(): number {
    return STATUS[this.code];
  }
}

/** 429 with the seconds after which the same request may succeed (sent as Retry-After). */
export function rateLimited(message: string, retryAfterSeconds: number): AppError {
  return new AppError('rate-limited', message, undefined, { retryAfterSeconds });
}

export function isAppError(e: unknown): e is AppError {
  return e instanceof AppError;
}

const PROBLEM = 'application/problem+json';

/** An RFC 9457 problem document with our `title` (the error kind) and any extra members. */
export function problemDocument(status: number, title: string, detail: string, extra: Record<string, unknown> = {}, headers: HeadersInit = {}): Response {
  return new Response(JSON.stringify({ type: 'about:blank', title, status, detail, ...extra }), {
    status,
    headers: { 'content-type': PROBLEM, ...headers },
  });
}

/**
 * Maps anything a route handler throws to a problem document. An AppError keeps
 * its status and message; a refused import lists its row errors and their total;
 * anything else is logged and answered as a bare 500, so no internals leak.
 * `bearer` adds the WWW-Authenticate challenge of the token API to a 401.
 */
export function toProblem(e: unknown, options: { bearer?: boolean; headers?: Record<string, string> } = {}): Response {
  if (!isAppError(e)) {
    console.error(e);
    return problemDocument(500, 'internal', 'The server could not process the request.');
  }
  const extra: Record<string, unknown> = {};
  if (e.errors) Object.assign(extra, { errorCount: e.errorCount, errors: e.errors });
  else if (Array.isArray(e.details)) extra.errors = e.details;
  else if (e.details && typeof e.details === 'object') Object.assign(extra, e.details);
  const headers: Record<string, string> = { ...options.headers };
  if (e.code === 'unauthorized' && options.bearer) headers['www-authenticate'] = 'Bearer realm="lattice-ledger"';
  if (e.retryAfterSeconds !== undefined) headers['retry-after'] = String(e.retryAfterSeconds);
  return problemDocument(e.status, e.code, e.message, extra, headers);
}

/** zod issues as one line each: "path: message" (the path left out when the issue is about the whole value). */
export function issuesText(issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }>, separator = ' '): string {
  return issues.map((i) => (i.path.length ? `${i.path.map(String).join('.')}: ${i.message}` : i.message)).join(separator);
}
