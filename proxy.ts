import { NextResponse, type NextRequest } from 'next/server';
import { getSessionCookie } from 'better-auth/cookies';
import { newNonce, pageContentSecurityPolicy } from '@/lib/security-headers';

/** Pages that need a signed-in member: visitors without a session cookie go to sign-in first. */
const SIGNED_IN = /^\/(?:w|invitations)(?:\/|$)/;

/**
 * Every page gets a nonce-based Content-Security-Policy. On workspace pages the
 * check is optimistic only: without a session cookie, send them to sign-in.
 * Every page, action and handler still checks the session and the role itself.
 */
export function proxy(request: NextRequest) {
  const nonce = newNonce();
  const csp = pageContentSecurityPolicy(nonce, { development: process.env.NODE_ENV === 'development' });
  if (SIGNED_IN.test(request.nextUrl.pathname) && !getSessionCookie(request)) {
    const url = new URL('/sign-in', request.url);
    url.searchParams.set('next', request.nextUrl.pathname);
    const redirect = NextResponse.redirect(url);
    redirect.headers.set('content-security-policy', csp);
    return redirect;
  }
  // Next.js takes the nonce for its scripts from the request's policy header.
  const headers = new Headers(request.headers);
  headers.set('content-security-policy', csp);
  headers.set('x-nonce', nonce);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('content-security-policy', csp);
  return response;
}

export const config = {
  // Pages only. API routes (upload bodies: the proxy would cut large ones) and static files
  // stay out; their headers come from next.config.mjs.
  matcher: ['/((?!api/|_next/static/|_next/image|favicon\\.ico$|icon\\.svg$).*)'],
};
