export type AppErrorCode = 'bad-request' | 'unauthorized' | 'forbidden' | 'not-found' | 'conflict' | 'too-large' | 'unprocessable' | 'rate-limited';

const STATUS: Record<AppErrorCode, number> = {
  'bad-request': 400,
  unauthorized: 401,
  forbidden: 403,
  'not-found': 404,
  conflict: 409,
  'too-large': 413,
  unprocessable: 422,
  'rate-limited': 429,
};

/** The one error type our server code throws on purpose; handlers map it to a status, actions to a message. */
export class AppError extends Error {
  readonly code: AppErrorCode;
  readonly details?: unknown;
  constructor(code: AppErrorCode, message: string, details?: unknown) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.details = details;
  }
  get status(): number {
    return STATUS[this.code];
  }
}

/** 429 with the seconds after which the same request may succeed (sent as Retry-After). */
export class RateLimitedError extends AppError {
  readonly retryAfterSeconds: number;
  constructor(message: string, retryAfterSeconds: number) {
    super('rate-limited', message);
    this.retryAfterSeconds = Math.max(1, Math.ceil(retryAfterSeconds));
  }
}

export function isAppError(e: unknown): e is AppError {
  return e instanceof AppError;
}

/** RFC 9457 problem document. */
export function problemResponse(error: AppError): Response {
  return new Response(
    JSON.stringify({ type: 'about:blank', title: error.code, status: error.status, detail: error.message, ...(error.details ? { errors: error.details } : {}) }),
    {
      status: error.status,
      headers: {
        'content-type': 'application/problem+json',
        ...(error instanceof RateLimitedError ? { 'retry-after': String(error.retryAfterSeconds) } : {}),
      },
    },
  );
}
