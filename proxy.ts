import { NextResponse, type NextRequest } from 'next/server';
import { getSessionCookie } from 'better-auth/cookies';

/**
 * Optimistic only: without a session cookie, send workspace pages to sign-in.
 * Every page, action and handler still checks the session and the role itself.
 */
export function proxy(request: NextRequest) {
  if (!getSessionCookie(request)) {
    const url = new URL('/sign-in', request.url);
    url.searchParams.set('next', request.nextUrl.pathname);
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = {
  // Upload and API routes stay out of the proxy (it would cut large bodies).
  matcher: ['/w/:path*', '/invitations/:path*'],
};
