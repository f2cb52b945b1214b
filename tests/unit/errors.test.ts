// lib/errors.ts: the one error type, its JSON answer and action state, and the body readers that
// refuse wrong media types (415) and bodies over their limit (413) as they stream in.
// The module is loaded again before each test (vi.resetModules, then import): its status table and
// its small error makers are built when the module is evaluated, and a module imported at the top of
// this file would be built before a mutation test run switches a change on.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';

type Errors = typeof import('@/lib/errors');
let E: Errors;

beforeEach(async () => {
  vi.resetModules();
  E = await import('@/lib/errors');
});

afterEach(() => {
  vi.restoreAllMocks();
});

const URL_ = 'http://fishplate.test/api/x';

/** A POST whose body arrives as the given chunks; `pulls` counts how often the body was read. */
function streamed(chunks: Uint8Array[], headers: Record<string, string> = { 'content-type': 'application/json' }) {
  const state = { pulls: 0, cancelled: false };
  let i = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      state.pulls += 1;
      if (i < chunks.length) controller.enqueue(chunks[i++]!);
      else controller.close();
    },
    cancel() {
      state.cancelled = true;
    },
  }, { highWaterMark: 0 });
  const request = new Request(URL_, { method: 'POST', headers, body, duplex: 'half' } as RequestInit);
  return { request, state };
}

const bytes = (n: number, fill = 0x61) => new Uint8Array(n).fill(fill);
const tooLarge = () => new E.AppError('too_large', 'too big');

async function thrown(p: Promise<unknown> | (() => unknown)): Promise<InstanceType<Errors['AppError']>> {
  try {
    if (typeof p === 'function') p();
    else await p;
  } catch (error) {
    expect(error).toBeInstanceOf(E.AppError);
    return error as InstanceType<Errors['AppError']>;
  }
  throw new Error('expected a throw');
}

describe('AppError and its makers: status codes (RFC 9110 §15) and messages meant for people', () => {
  it('maps every code to its RFC 9110 status (429: RFC 6585 §4)', () => {
    const expected = {
      bad_request: 400, // RFC 9110 §15.5.1
      unauthorized: 401, // §15.5.2
      forbidden: 403, // §15.5.4
      not_found: 404, // §15.5.5
      conflict: 409, // §15.5.10
      too_large: 413, // §15.5.14
      unsupported_media_type: 415, // §15.5.16
      rate_limited: 429, // RFC 6585 §4
    } as const;
    for (const [code, status] of Object.entries(expected)) {
      expect(new E.AppError(code as keyof typeof expected, 'x').status, code).toBe(status);
    }
  });

  it('writes the makers’ messages in full', () => {
    expect(E.unauthorized()).toMatchObject({ code: 'unauthorized', status: 401, message: 'Sign in to continue.' });
    expect(E.forbidden()).toMatchObject({ status: 403, message: 'Your role on this railway does not allow you to do that.' });
    expect(E.forbidden('delete runs').message).toBe('Your role on this railway does not allow you to delete runs.');
    expect(E.notFound()).toMatchObject({ status: 404, message: 'That was not found.' });
    expect(E.notFound('The session').message).toBe('The session was not found.');
    const c = E.conflict({ version: 3 });
    expect(c).toMatchObject({ status: 409, message: 'Someone else changed this since you opened it. Reload to see their version, then edit again.' });
    expect(c.extra.current).toEqual({ version: 3 });
  });

  it('badRequest names the first field as "path: message", and says "Invalid input." with no issue', () => {
    const schema = z.object({ runs: z.array(z.object({ cabId: z.string() })) });
    const r = schema.safeParse({ runs: [{ cabId: 'c' }, { cabId: 7 }] });
    const e = E.badRequest(r.error!);
    expect(e.status).toBe(400);
    expect(e.message).toBe(`runs[1].cabId: ${r.error!.issues[0]!.message}`);
    expect(e.extra.issues).toEqual([{ path: 'runs[1].cabId', message: r.error!.issues[0]!.message }]);
    const top = E.badRequest(z.string().safeParse(5).error!);
    expect(top.message).toBe(top.extra.issues![0]!.message);
    expect(E.badRequest(new z.ZodError([])).message).toBe('Invalid input.');
    expect(E.badRequest('Pick a cab.')).toMatchObject({ status: 400, message: 'Pick a cab.' });
  });
});

describe('toResponse: the JSON answer { error, code, issues? } with its status', () => {
  it('answers an AppError with its status, code and message, and no Retry-After unless asked', async () => {
    const res = E.toResponse(E.notFound('The layout'));
    expect(res.status).toBe(404);
    expect(res.headers.get('Retry-After')).toBeNull();
    expect(await res.json()).toStrictEqual({ error: 'The layout was not found.', code: 'not_found' });
  });

  it('sends Retry-After in seconds with a 429 (RFC 9110 §10.2.3, RFC 6585 §4)', async () => {
    const res = E.toResponse(new E.AppError('rate_limited', 'Slow down.', { retryAfterS: 0 }));
    expect(res.status).toBe(429);
    expect(res.headers.get('Retry-After')).toBe('0');
  });

  it('adds the issues and the current version when the error carries them', async () => {
    const issues = [{ path: 'name', message: 'Too short.' }];
    expect(await E.toResponse(new E.AppError('bad_request', 'name: Too short.', { issues })).json()).toStrictEqual({
      error: 'name: Too short.',
      code: 'bad_request',
      issues,
    });
    expect(await E.toResponse(E.conflict(null)).json()).toMatchObject({ code: 'conflict', current: null });
  });

  it('answers anything else with a logged 500 that gives nothing away', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const res = E.toResponse(new Error('SQLITE_BUSY: secret detail'));
    expect(res.status).toBe(500);
    expect(await res.json()).toStrictEqual({ error: 'Something went wrong on our side. Please try again.' });
    expect(log).toHaveBeenCalledTimes(1);
  });
});

describe('toActionState: the failure state a server action returns', () => {
  it('keeps the first message of each field', () => {
    const issues = [
      { path: 'name', message: 'first' },
      { path: 'name', message: 'second' },
      { path: 'cab', message: 'cab message' },
    ];
    expect(E.toActionState(new E.AppError('bad_request', 'name: first', { issues }))).toStrictEqual({
      ok: false,
      status: 400,
      error: 'name: first',
      fieldErrors: { name: 'first', cab: 'cab message' },
    });
  });

  it('has no field errors for an error without issues', () => {
    expect(E.toActionState(E.forbidden())).toStrictEqual({
      ok: false,
      status: 403,
      error: 'Your role on this railway does not allow you to do that.',
      fieldErrors: {},
    });
  });

  it('turns anything else into a logged 500', () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    expect(E.toActionState(new TypeError('x is undefined'))).toStrictEqual({
      ok: false,
      status: 500,
      error: 'Something went wrong on our side. Please try again.',
    });
    expect(log).toHaveBeenCalledTimes(1);
  });
});

describe('requireMediaType: Content-Type checks (RFC 9110 §8.3, structured +json suffix RFC 6839 §3.1)', () => {
  const withType = (type: string | null) => new Request(URL_, { method: 'POST', headers: type === null ? {} : { 'content-type': type } });
  const accepts = (type: string | null, accepted: string[]) => {
    try {
      E.requireMediaType(withType(type), accepted, 'wrong type');
      return true;
    } catch (error) {
      expect(error).toMatchObject({ status: 415, message: 'wrong type' });
      return false;
    }
  };

  it('reads the media type case-insensitively, without parameters or the spaces around ";" (RFC 9110 §8.3.1, §5.6.6)', () => {
    expect(accepts('application/json', ['application/json'])).toBe(true);
    expect(accepts('Application/JSON; charset=utf-8', ['application/json'])).toBe(true);
    expect(accepts('application/json ; charset=utf-8', ['application/json'])).toBe(true);
    expect(accepts(null, ['application/json'])).toBe(false);
    expect(accepts('text/plain', ['application/json'])).toBe(false);
  });

  it('takes any one of several accepted types', () => {
    expect(accepts('text/plain', ['text/csv', 'text/plain'])).toBe(true);
    expect(accepts('text/csv', ['text/csv', 'text/plain'])).toBe(true);
    expect(accepts('text/html', ['text/csv', 'text/plain'])).toBe(false);
  });

  it('counts an application/…+json type as JSON (RFC 6839 §3.1), and only where JSON is accepted', () => {
    expect(accepts('application/vnd.fishplate.plan+json', ['application/json'])).toBe(true);
    expect(accepts('application/merge-patch+json', ['application/json'])).toBe(true);
    expect(accepts('text/x+json', ['application/json'])).toBe(false);
    expect(accepts('application/json-seq', ['application/json'])).toBe(false);
    expect(accepts('application/xml', ['application/json'])).toBe(false);
    expect(accepts('application/vnd.fishplate.plan+json', ['text/csv'])).toBe(false);
  });
});

describe('readBytes: a body counted as it streams in, stopped at its limit', () => {
  it('refuses a declared Content-Length over the limit before reading a byte (RFC 9110 §8.6)', async () => {
    const { request, state } = streamed([bytes(10)], { 'content-type': 'application/json', 'content-length': '1001' });
    const e = await thrown(E.readBytes(request, 1000, tooLarge));
    expect(e.message).toBe('too big');
    expect(state.pulls).toBe(0);
  });

  it('reads a body of exactly the limit, declared or not, and refuses one byte more as it arrives', async () => {
    const declared = streamed([bytes(600), bytes(400)], { 'content-length': '1000' });
    expect((await E.readBytes(declared.request, 1000, tooLarge)).byteLength).toBe(1000);
    const exact = streamed([bytes(600), bytes(400)]);
    const got = await E.readBytes(exact.request, 1000, tooLarge);
    expect(got).toEqual(new Uint8Array([...bytes(600), ...bytes(400)]));
    const over = streamed([bytes(600), bytes(401), bytes(5)]);
    expect((await thrown(E.readBytes(over.request, 1000, tooLarge))).message).toBe('too big');
    expect(over.state.cancelled).toBe(true);
  });

  it('keeps the chunks in order', async () => {
    const { request } = streamed([new Uint8Array([1, 2]), new Uint8Array([3]), new Uint8Array([4, 5, 6])]);
    expect([...(await E.readBytes(request, 100, tooLarge))]).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it('gives an empty body for a request without one', async () => {
    expect((await E.readBytes(new Request(URL_), 10, tooLarge)).byteLength).toBe(0);
  });

  it('answers 400 when the body breaks off', async () => {
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        controller.error(new Error('socket hang up'));
      },
    });
    const request = new Request(URL_, { method: 'POST', body, duplex: 'half' } as RequestInit);
    const e = await thrown(E.readBytes(request, 10, tooLarge));
    expect(e).toMatchObject({ status: 400, message: 'The request body could not be read to its end.' });
  });
});

describe('readJson and readText', () => {
  const enc = (s: string) => new TextEncoder().encode(s);

  it('parses a JSON body, and says which limit a large one broke', async () => {
    expect(await E.readJson(streamed([enc('{"a":[1,2]}')]).request)).toEqual({ a: [1, 2] });
    const e = await thrown(E.readJson(streamed([bytes(11)]).request, 10));
    expect(e).toMatchObject({ status: 413, message: 'The request body is over 10 bytes.' });
    const d = await thrown(E.readJson(streamed([bytes(1_000_001)]).request));
    expect(d.message).toBe('The request body is over 1000000 bytes.');
  });

  it('refuses another media type (415) and a body that is not JSON (400), with their messages', async () => {
    const text = await thrown(E.readJson(streamed([enc('{}')], { 'content-type': 'text/plain' }).request));
    expect(text).toMatchObject({ status: 415, message: 'Send the body as JSON (Content-Type: application/json).' });
    const bad = await thrown(E.readJson(streamed([enc('{"a":')]).request));
    expect(bad).toMatchObject({ status: 400, message: 'The request body is not valid JSON.' });
  });

  it('readText decodes UTF-8 and checks its own types and limit', async () => {
    const options = { maxBytes: 20, accepted: ['text/csv'], wrongType: 'Send CSV.', tooLarge };
    expect(await E.readText(streamed([enc('a,b\n'), enc('Zürich,1')], { 'content-type': 'text/csv' }).request, options)).toBe('a,b\nZürich,1');
    expect(await thrown(E.readText(streamed([enc('x')], { 'content-type': 'text/html' }).request, options))).toMatchObject({ status: 415, message: 'Send CSV.' });
  });
});
