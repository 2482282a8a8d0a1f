/**
 * The Content-Security-Policy of every page, with a fresh nonce per request
 * (proxy.ts). Next.js reads the nonce from this header on the request and puts it
 * on its own scripts; 'strict-dynamic' lets those load the app's chunks. No
 * 'unsafe-eval': Vega runs with its expression interpreter (components/charts/
 * vega-options.ts) and zod without its JIT (instrumentation-client.ts). Styles
 * allow inline attributes (React, Vega's tooltip); scripts never run inline
 * without the nonce. In development React's refresh needs eval, so it is allowed there only.
 */
export function pageContentSecurityPolicy(nonce: string, options: { development?: boolean } = {}): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${options.development ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}

/** A nonce: 16 random bytes, base64. */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}
