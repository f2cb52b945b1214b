import { NextResponse, type NextRequest } from 'next/server';

// Only a convenience redirect for people who are clearly signed out. Every page, action and
// route handler still checks the session and role itself (lib/auth.ts).
export function proxy(request: NextRequest) {
  const hasSession =
    request.cookies.has('next-auth.session-token') || request.cookies.has('__Secure-next-auth.session-token');
  if (!hasSession) {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = `?callbackUrl=${encodeURIComponent(request.nextUrl.pathname + request.nextUrl.search)}`;
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = { matcher: ['/railways/:path*', '/my-runs/:path*', '/my-mail', '/me/:path*'] };
