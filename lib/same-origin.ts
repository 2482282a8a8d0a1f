import { AppError } from '@/lib/errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Whether a state-changing request was sent by the app's own pages. Browsers send Origin on every cross-origin
 * request and on same-origin POSTs; where it is missing, Sec-Fetch-Site tells. A request with neither is refused:
 * a cookie alone proves nothing about who wrote the request.
 */
export function isSameOriginRequest(request: Request, appOrigin: string): boolean {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return true;
  const origin = request.headers.get('origin');
  if (origin !== null) return origin === appOrigin;
  return request.headers.get('sec-fetch-site') === 'same-origin';
}

/** Throws a 403 for a cross-site state-changing request to a cookie-authenticated handler. */
export function assertSameOrigin(request: Request, appURL: string): void {
  const appOrigin = new URL(appURL).origin;
  if (!isSameOriginRequest(request, appOrigin)) {
    throw new AppError('forbidden', `Cross-site request refused: a change must come from ${appOrigin} itself (Origin or Sec-Fetch-Site).`);
  }
}
