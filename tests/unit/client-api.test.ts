import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ApiError, apiCall, errorMessage, OFFLINE_MESSAGE } from '@/lib/client/api';

// The browser's calls to the route handlers, against a real HTTP server on a loopback port: what it
// receives (method, content type, body, extra headers) and how its answers come back. Node's fetch
// follows the WHATWG Fetch Standard, as the browser's does.

type Seen = { method: string; url: string; headers: http.IncomingHttpHeaders; body: string };
const seen: Seen[] = [];
// The next answer: status, content type, body.
let answer: { status: number; type: string; body: string } = { status: 200, type: 'application/json', body: '{}' };

const server = http.createServer((req, res) => {
  let body = '';
  req.setEncoding('utf8');
  req.on('data', (chunk: string) => (body += chunk));
  req.on('end', () => {
    seen.push({ method: req.method ?? '', url: req.url ?? '', headers: req.headers, body });
    res.writeHead(answer.status, { 'content-type': answer.type });
    res.end(answer.body);
  });
});
let base = '';

beforeAll(async () => {
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

const lastSeen = () => seen.at(-1)!;

describe('apiCall: what the route handler receives', () => {
  it('a JSON body is sent serialised with content-type application/json (RFC 8259 §11)', async () => {
    answer = { status: 200, type: 'application/json', body: '{"ok":true,"id":7}' };
    const out = await apiCall<{ ok: boolean; id: number }>('POST', `${base}/api/runs`, { body: { json: { name: 'Down goods', minutes: 12 } } });
    expect(out).toEqual({ ok: true, id: 7 });
    expect(lastSeen().method).toBe('POST');
    expect(lastSeen().url).toBe('/api/runs');
    expect(lastSeen().headers['content-type']).toBe('application/json');
    expect(JSON.parse(lastSeen().body)).toEqual({ name: 'Down goods', minutes: 12 });
  });

  it('a form body goes as multipart/form-data with the boundary fetch chooses (RFC 7578 §4.1)', async () => {
    const form = new FormData();
    form.set('label', 'Yard throat');
    await apiCall('PUT', `${base}/api/layouts/1/image`, { body: { form } });
    const type = lastSeen().headers['content-type'] ?? '';
    expect(type).toMatch(/^multipart\/form-data; boundary=/);
    const boundary = type.split('boundary=')[1];
    expect(lastSeen().body).toContain(`--${boundary}`);
    expect(lastSeen().body).toContain('name="label"');
    expect(lastSeen().body).toContain('Yard throat');
  });

  it('a text body goes as typed, unchanged, and extra headers are added to it', async () => {
    const csv = 'id,name\nB1,"Shed road"\n';
    await apiCall('POST', `${base}/api/layouts/1/rows`, { body: { text: csv, contentType: 'text/csv' }, headers: { 'if-match': '"v3"' } });
    expect(lastSeen().headers['content-type']).toBe('text/csv');
    expect(lastSeen().headers['if-match']).toBe('"v3"');
    expect(lastSeen().body).toBe(csv);
  });

  it('no body: no content type, an empty body; the method is the one given', async () => {
    await apiCall('DELETE', `${base}/api/runs/4`);
    expect(lastSeen().method).toBe('DELETE');
    expect(lastSeen().headers['content-type']).toBeUndefined();
    expect(lastSeen().body).toBe('');
  });

  it("asks for no cached answer unless told ('no-store'; 'no-cache' revalidates, Fetch Standard §5.3 cache mode)", async () => {
    const spy = vi.spyOn(globalThis, 'fetch');
    try {
      await apiCall('GET', `${base}/api/sessions`);
      await apiCall('GET', `${base}/api/sessions/2/check`, { cache: 'no-cache' });
      expect(spy.mock.calls[0]?.[1]?.cache).toBe('no-store');
      expect(spy.mock.calls[1]?.[1]?.cache).toBe('no-cache');
    } finally {
      spy.mockRestore();
    }
  });
});

describe('apiCall: refusals and lost connections', () => {
  it("a refusal throws ApiError with the status and the handler's JSON answer (lib/errors.ts toResponse)", async () => {
    const refusal = { error: 'Run 4 was changed by someone else.', code: 'conflict', current: { version: 3 } };
    answer = { status: 409, type: 'application/json', body: JSON.stringify(refusal) };
    const error = await apiCall('PATCH', `${base}/api/runs/4`, { body: { json: {} } }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(409);
    expect((error as ApiError).body).toEqual(refusal);
    expect((error as ApiError).message).toBe(refusal.error);
    expect(errorMessage(error)).toBe(refusal.error);
  });

  it('an answer that is not the error JSON (a proxy page, a JSON without a text error) gets "The server answered N."', async () => {
    for (const [type, body] of [
      ['text/html', '<h1>Bad gateway</h1>'],
      ['application/json', '{"error":{"nested":true}}'],
      ['application/json', 'null'],
    ] as const) {
      answer = { status: 502, type, body };
      const error = (await apiCall('GET', `${base}/api/sessions`).catch((e: unknown) => e)) as ApiError;
      expect(error, body).toBeInstanceOf(ApiError);
      expect(error.status).toBe(502);
      expect(error.body).toEqual({ error: 'The server answered 502.' });
    }
  });

  it('a success with no JSON answers undefined instead of throwing (204 No Content, RFC 9110 §15.3.5)', async () => {
    answer = { status: 204, type: 'application/json', body: '' };
    await expect(apiCall('DELETE', `${base}/api/runs/5`)).resolves.toBeUndefined();
  });

  it('no connection at all rejects with fetch\'s TypeError, which errorMessage words as offline', async () => {
    const closed = http.createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const port = (closed.address() as AddressInfo).port;
    await new Promise<void>((resolve) => closed.close(() => resolve()));
    const error = await apiCall('GET', `http://127.0.0.1:${port}/api/sessions`).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TypeError);
    expect(errorMessage(error)).toBe(OFFLINE_MESSAGE);
    expect(errorMessage(error, 'Saved on this phone; sent when the connection is back.')).toBe('Saved on this phone; sent when the connection is back.');
    expect(errorMessage(new Error('anything else'))).toBe(OFFLINE_MESSAGE);
  });
});
