// lib/http.ts: the route-handler and server-action wrappers. Writes another site sends are refused
// (403) by Origin and Sec-Fetch-Site; an action's arguments are checked before it runs.
// The module is loaded again before each test (vi.resetModules, then import): its set of safe
// methods is built when the module is evaluated, and a module imported at the top of this file
// would be built before a mutation test run switches a change on.
import { redirect } from 'next/navigation';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

type Http = typeof import('@/lib/http');
type Errors = typeof import('@/lib/errors');
let H: Http;
let E: Errors;

const SITE = 'https://fishplate.example';

beforeEach(async () => {
  vi.stubEnv('NEXTAUTH_URL', SITE);
  vi.resetModules();
  H = await import('@/lib/http');
  E = await import('@/lib/errors');
});

afterEach(() => {
  vi.unstubAllEnvs();
  vi.restoreAllMocks();
});

const ok = () => new Response('done');

/** The status a wrapped handler answers a request with. */
async function statusOf(method: string, headers: Record<string, string>, url = `${SITE}/api/x`) {
  const res = await H.handler(ok)(new Request(url, { method, headers }), { params: Promise.resolve({}) });
  return res.status;
}

describe('assertSameOrigin, through handler()', () => {
  const FOREIGN = { origin: 'https://evil.example', 'sec-fetch-site': 'cross-site' };

  it('lets reads through whoever sends them: GET, HEAD and OPTIONS are safe methods (RFC 9110 §9.2.1)', async () => {
    for (const method of ['GET', 'HEAD', 'OPTIONS', 'get']) expect(await statusOf(method, FOREIGN), method).toBe(200);
  });

  it('refuses a write sent from another site with 403 and says what to do', async () => {
    for (const method of ['POST', 'PATCH', 'PUT', 'DELETE']) expect(await statusOf(method, FOREIGN), method).toBe(403);
    const res = await H.handler(ok)(new Request(`${SITE}/api/x`, { method: 'POST', headers: FOREIGN }), { params: Promise.resolve({}) });
    expect(await res.json()).toStrictEqual({ error: 'This change was sent from another site. Make it from Fishplate itself.', code: 'forbidden' });
  });

  it('reads Sec-Fetch-Site as the Fetch Metadata spec defines it: same-origin and none pass, same-site and cross-site do not', async () => {
    expect(await statusOf('POST', { 'sec-fetch-site': 'same-origin' })).toBe(200);
    expect(await statusOf('POST', { 'sec-fetch-site': 'none' })).toBe(200); // typed into the address bar
    expect(await statusOf('POST', { 'sec-fetch-site': 'same-site' })).toBe(403); // a sibling subdomain
    expect(await statusOf('POST', { 'sec-fetch-site': 'cross-site' })).toBe(403);
  });

  it('lets through a write with neither header (not from a browser: curl, a script with its own cookie)', async () => {
    expect(await statusOf('POST', {})).toBe(200);
  });

  it('takes an Origin of NEXTAUTH_URL, or of the host the request was sent to (RFC 6454 §7, Host: RFC 9110 §7.2)', async () => {
    // Behind a proxy the request URL names the inner address; the configured URL still counts as this site.
    expect(await statusOf('POST', { origin: SITE }, 'http://127.0.0.1:3000/api/x')).toBe(200);
    // Another name for the server (a LAN address) is this site when the browser sent its request there.
    expect(await statusOf('POST', { origin: 'http://fishplate.lan:3000', host: 'fishplate.lan:3000' }, 'http://127.0.0.1:3000/api/x')).toBe(200);
    expect(await statusOf('POST', { origin: 'http://127.0.0.1:3000', host: 'fishplate.lan:3000' }, 'http://127.0.0.1:3000/api/x')).toBe(403);
    // Without a Host header the request URL's host is the one it was sent to.
    expect(await statusOf('POST', { origin: 'http://192.0.2.10:3000' }, 'http://192.0.2.10:3000/api/x')).toBe(200);
    expect(await statusOf('POST', { origin: 'http://192.0.2.10:3001' }, 'http://192.0.2.10:3000/api/x')).toBe(403);
    // An opaque origin ("null", sandboxed frames and file:, RFC 6454 §7.3) is never this site.
    expect(await statusOf('POST', { origin: 'null' })).toBe(403);
  });

  it('answers a handler’s AppError as JSON and anything else as a logged 500', async () => {
    const notFound = H.handler(() => {
      throw E.notFound('The run');
    });
    const res = await notFound(new Request(`${SITE}/api/x`), { params: Promise.resolve({}) });
    expect(res.status).toBe(404);
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const broken = H.handler(async () => {
      throw new Error('boom');
    });
    expect((await broken(new Request(`${SITE}/api/x`), { params: Promise.resolve({}) })).status).toBe(500);
  });
});

describe('action(): an action’s arguments are checked before it runs', () => {
  const done = { ok: true as const };
  const byId = () => {
    const fn = vi.fn(async (_id: string, _state: unknown, _form: FormData) => done);
    return { fn, wrapped: H.action(['id', 'state', 'form'], fn) };
  };
  // Called as anyone can call a server action: with any values, however many.
  const call = (wrapped: unknown, ...args: unknown[]) => (wrapped as (...a: unknown[]) => Promise<unknown>)(...args);

  it('runs the action with a well-formed id, state and form', async () => {
    const { fn, wrapped } = byId();
    const form = new FormData();
    expect(await call(wrapped, 'r1', null, form)).toBe(done);
    expect(fn).toHaveBeenCalledWith('r1', null, form);
    expect(await call(wrapped, 'x'.repeat(200), null, form)).toBe(done); // the longest id taken
  });

  it('refuses a wrong number of values, naming both counts', async () => {
    const { fn, wrapped } = byId();
    expect(await call(wrapped, 'r1', null)).toStrictEqual({
      ok: false,
      status: 400,
      error: 'This form was sent with 2 values instead of 3. Reload the page and try again.',
      fieldErrors: {},
    });
    expect(fn).not.toHaveBeenCalled();
  });

  it('refuses an id that is not a string, is empty or is over 200 characters', async () => {
    const { fn, wrapped } = byId();
    const form = new FormData();
    const refused = {
      ok: false,
      status: 400,
      error: 'This form names something that does not exist. Reload the page and try again.',
      fieldErrors: {},
    };
    for (const id of [42, null, '', 'x'.repeat(201)]) expect(await call(wrapped, id, null, form), String(id).slice(0, 10)).toStrictEqual(refused);
    expect(fn).not.toHaveBeenCalled();
  });

  it('refuses a form that is not FormData', async () => {
    const { fn, wrapped } = byId();
    expect(await call(wrapped, 'r1', null, { name: 'x' })).toStrictEqual({
      ok: false,
      status: 400,
      error: 'This form was sent without its fields. Reload the page and try again.',
      fieldErrors: {},
    });
    expect(fn).not.toHaveBeenCalled();
  });

  it('lets Next’s redirect pass through and turns an AppError into its failure state', async () => {
    const redirecting = H.action(['state'], async () => redirect('/railways'));
    await expect(redirecting(null)).rejects.toThrow(/NEXT_REDIRECT/);
    const refusing = H.action(['state'], async () => {
      throw E.forbidden('edit members');
    });
    expect(await refusing(null)).toMatchObject({ ok: false, status: 403, error: 'Your role on this railway does not allow you to edit members.' });
  });
});
