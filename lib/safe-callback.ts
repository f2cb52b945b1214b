/**
 * Where to send someone after signing in: the path they asked for when it resolves, against the
 * site's own origin (WHATWG URL parsing, as the browser does), to this same origin; else
 * `fallback`. So `/\evil.example`, `/%09/evil.example`, `//evil.example` and absolute URLs of
 * other sites all land on `fallback` instead of another site.
 */
export function sameOriginPath(callbackUrl: string | null | undefined, origin: string, fallback = '/railways'): string {
  if (typeof callbackUrl !== 'string' || !callbackUrl || callbackUrl.length > 2048) return fallback;
  let base: URL;
  let target: URL;
  try {
    base = new URL(origin);
    target = new URL(callbackUrl, base);
  } catch {
    return fallback;
  }
  if (target.origin !== base.origin) return fallback;
  const path = `${target.pathname}${target.search}${target.hash}`;
  // A same-origin URL whose path starts "//" would be read as another host once written as a path.
  return path.startsWith('/') && !path.startsWith('//') ? path : fallback;
}
