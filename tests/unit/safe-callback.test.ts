import { describe, expect, it } from 'vitest';
import { sameOriginPath } from '@/lib/safe-callback';

const ORIGIN = 'https://fishplate.example';

describe('finding 7: open redirect after sign-in', () => {
  it('finding 7: a callback that resolves to another site falls back to /railways', () => {
    // WHATWG URL Standard, "special authority ignore slashes state": a backslash after the scheme
    // counts as a slash, and tab and newline are stripped before parsing (basic URL parser, step 3).
    for (const hostile of [
      '/\\evil.example/phish',
      '/\t/evil.example/phish',
      '/\n/evil.example',
      '//evil.example/phish',
      '\\\\evil.example',
      'https://evil.example/',
      'http://fishplate.example/', // same host, other scheme: another origin (RFC 6454 §4)
      'https://fishplate.example.evil.example/',
      'javascript:alert(1)',
      'data:text/html,hi',
      '/.//evil.example',
    ]) {
      const path = sameOriginPath(hostile, ORIGIN);
      expect(new URL(path, ORIGIN).origin, hostile).toBe(ORIGIN);
      expect(path.startsWith('//'), hostile).toBe(false);
    }
    expect(sameOriginPath('/\\evil.example/phish', ORIGIN)).toBe('/railways');
    expect(sameOriginPath(undefined, ORIGIN)).toBe('/railways');
  });

  it('keeps a same-origin path with its query and fragment', () => {
    expect(sameOriginPath('/my-runs', ORIGIN)).toBe('/my-runs');
    expect(sameOriginPath('/railways/r1/sessions/s1?tab=runs#findings', ORIGIN)).toBe('/railways/r1/sessions/s1?tab=runs#findings');
    expect(sameOriginPath('https://fishplate.example/my-runs', ORIGIN)).toBe('/my-runs');
  });
});

describe('sameOriginPath edges', () => {
  it('falls back for an empty callback and for one that is not a string (a repeated ?callbackUrl= arrives as a list)', () => {
    expect(sameOriginPath('', ORIGIN)).toBe('/railways');
    expect(sameOriginPath(null, ORIGIN, '/my-runs')).toBe('/my-runs');
    expect(sameOriginPath(['/my-runs', '/railways/r1'] as unknown as string, ORIGIN, '/fallback')).toBe('/fallback');
  });

  it('takes a callback of up to 2048 characters and no longer (common practice: URLs beyond ~2 kB are not kept by every browser and proxy)', () => {
    const path = (n: number) => `/my-runs?q=${'x'.repeat(n - '/my-runs?q='.length)}`;
    expect(path(2048)).toHaveLength(2048);
    expect(sameOriginPath(path(2048), ORIGIN)).toBe(path(2048));
    expect(sameOriginPath(path(2049), ORIGIN)).toBe('/railways');
  });

  it('falls back when the site origin itself does not parse', () => {
    expect(sameOriginPath('/my-runs', 'not a url')).toBe('/railways');
  });

  it('falls back for two opaque origins: both serialise as "null" (HTML Standard, serialization of an origin) yet name no path of this site', () => {
    expect(sameOriginPath('data:text/html,hi', 'data:text/plain,site')).toBe('/railways');
  });
});
