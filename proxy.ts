import { NextResponse, type NextRequest } from 'next/server';

// Three things, none of them the security boundary (every page, action and route handler checks
// the session and role itself, lib/auth.ts):
// 1. a Content-Security-Policy with a fresh nonce per page request, so scripts need no 'unsafe-inline'
//    (Next reads the nonce from the request's policy and puts it on its own scripts);
// 2. a server action posted from another site is answered 403 here (Next's own check answers 500);
// 3. a convenience redirect to sign-in for people who are clearly signed out.

const SIGNED_IN_PATHS = ['/railways', '/my-runs', '/my-mail', '/me'];

function contentSecurityPolicy(nonce: string): string {
  const dev = process.env.NODE_ENV !== 'production';
  return [
    "default-src 'self'",
    // 'strict-dynamic': scripts the nonced ones load are trusted too (Next's chunks); CSP Level 3 §8.2.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ''}`,
    // Inline style attributes (React's style={…}, the calendar's sizing) cannot carry a nonce.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    // data: for the calendar's icon font, which its stylesheet embeds as a data: URL.
    "font-src 'self' data:",
    "connect-src 'self'",
    "frame-ancestors 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "object-src 'none'",
  ].join('; ');
}

/** Whether a browser says this request comes from another site (Origin, or Fetch Metadata's Sec-Fetch-Site). */
function fromAnotherSite(request: NextRequest): boolean {
  const site = request.headers.get('sec-fetch-site');
  if (site !== null && site !== 'same-origin' && site !== 'none') return true;
  const origin = request.headers.get('origin');
  if (origin === null) return false;
  // The host the browser addressed, as Next's own server-action check reads it.
  const host = request.headers.get('x-forwarded-host') ?? request.headers.get('host') ?? request.nextUrl.host;
  try {
    return new URL(origin).host !== host;
  } catch {
    return true; // "null" and anything unparseable
  }
}

export function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.randomUUID()).toString('base64');
  const policy = contentSecurityPolicy(nonce);
  if (request.method === 'POST' && request.headers.has('next-action') && fromAnotherSite(request)) {
    return new NextResponse('This form was sent from another site. Use it from Fishplate itself.', {
      status: 403,
      headers: { 'Content-Type': 'text/plain; charset=utf-8', 'Content-Security-Policy': policy },
    });
  }

  const path = request.nextUrl.pathname;
  const hasSession =
    request.cookies.has('next-auth.session-token') || request.cookies.has('__Secure-next-auth.session-token');
  if (!hasSession && SIGNED_IN_PATHS.some((p) => path === p || path.startsWith(`${p}/`))) {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = `?callbackUrl=${encodeURIComponent(request.nextUrl.pathname + request.nextUrl.search)}`;
    const redirect = NextResponse.redirect(url);
    redirect.headers.set('Content-Security-Policy', policy);
    return redirect;
  }

  const requestHeaders = new Headers(request.headers);
  requestHeaders.set('Content-Security-Policy', policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set('Content-Security-Policy', policy);
  return response;
}

// Every page (route handlers set their own policy in next.config.mjs or in the handler); not
// Next's static files, nor link prefetches (Next's documented nonce set-up).
export const config = {
  matcher: [
    {
      source: '/((?!api/|_next/static|_next/image|favicon.ico).*)',
      missing: [
        { type: 'header', key: 'next-router-prefetch' },
        { type: 'header', key: 'purpose', value: 'prefetch' },
      ],
    },
  ],
};
