import http from 'node:http';
import bcrypt from 'bcryptjs';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { requestPasswordReset } from '@/app/(auth)/reset-password/actions';
import { requestSignInLink } from '@/app/(auth)/sign-in/actions';
import { signUp } from '@/app/(auth)/sign-up/actions';
import { authOptions } from '@/lib/auth-options';
import { AppError, toResponse } from '@/lib/errors';
import { clientAddress } from '@/lib/client-key';
import { resetEnvCache } from '@/lib/env';
import { installPeerAddressHeader, PEER_HEADER } from '@/lib/peer-address';
import { limiterSize, MAX_KEYS_PER_KIND, rateLimit } from '@/lib/rate-limit';
import { formData, makeWorld } from './world';

// The request's headers, as next/headers would give them; null: outside a request.
const request: { headers: Headers | null } = { headers: null };
vi.mock('next/headers', () => ({
  headers: async () => {
    if (!request.headers) throw new Error('outside a request');
    return request.headers;
  },
}));

/** Runs the next calls as a request from `peer` (the socket's address) with these headers. */
function fromPeer(peer: string, extra: Record<string, string> = {}) {
  request.headers = new Headers({ [PEER_HEADER]: peer, ...extra });
}

afterEach(() => {
  request.headers = null;
  delete process.env.TRUSTED_PROXIES;
  resetEnvCache();
  vi.useRealTimers();
  vi.restoreAllMocks();
});

type Authorize = (c: Record<string, string>) => Promise<unknown>;
function passwordSignIn(): Authorize {
  const providers = authOptions.providers as unknown as { options: { id: string; authorize: Authorize } }[];
  return providers.find((p) => p.options.id === 'password')!.options.authorize;
}

async function withPassword(user: { id: string }, password: string) {
  const { getDb } = await import('@/db');
  const { users } = await import('@/db/schema');
  const { eq } = await import('drizzle-orm');
  getDb().update(users).set({ passwordHash: await bcrypt.hash(password, 4) }).where(eq(users.id, user.id)).run();
}


describe('abuse limits', () => {
  it('the sign-in link form answers 429 after five requests for one address', async () => {
    const { host } = makeWorld();
    for (let i = 0; i < 5; i++) expect(await requestSignInLink(null, formData({ email: host.email }))).toMatchObject({ ok: true });
    const sixth = await requestSignInLink(null, formData({ email: host.email }));
    expect(sixth).toMatchObject({ ok: false, status: 429 });
    if (sixth && !sixth.ok) expect(sixth.error).toMatch(/Try again in \d+ s/);
  });

  it('password reset requests are limited per address', async () => {
    const { planner } = makeWorld();
    for (let i = 0; i < 5; i++) await requestPasswordReset(null, formData({ email: planner.email }));
    expect(await requestPasswordReset(null, formData({ email: planner.email }))).toMatchObject({ ok: false, status: 429 });
  });

  it('sign-ups are limited per address of the caller', async () => {
    let last;
    for (let i = 0; i < 11; i++) {
      last = await signUp(null, formData({ name: 'Many', email: `many-${i}-${Date.now()}@test.example`, password: 'long enough pass' }));
    }
    expect(last).toMatchObject({ ok: false, status: 429 });
  });

  it('password sign-in makes a client wait after five failures on one address (was: ten tries of any kind)', async () => {
    const { operator } = makeWorld();
    const authorize = passwordSignIn();
    for (let i = 0; i < 5; i++) expect(await authorize({ email: operator.email, password: 'guess-number-' + i })).toBeNull();
    await expect(authorize({ email: operator.email, password: 'guess-six' })).rejects.toThrow(/Too many attempts/);
  });

  it('a limited call answers 429 with Retry-After (RFC 6585 §4; RFC 9110 §10.2.3)', async () => {
    const now = 1_000_000;
    rateLimit('unit', 1, 60_000, now);
    try {
      rateLimit('unit', 1, 60_000, now + 15_000);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(AppError);
      const response = toResponse(error);
      expect(response.status).toBe(429);
      expect(response.headers.get('Retry-After')).toBe('45');
    }
    // A new window starts after the old one ends.
    expect(() => rateLimit('unit', 1, 60_000, now + 60_001)).not.toThrow();
  });
});

describe('finding 9: sign-in limits', () => {
  it('finding 9: successes do not count, and failures from another client do not lock the owner out', async () => {
    const { operator } = makeWorld();
    await withPassword(operator, 'the right password');
    const authorize = passwordSignIn();
    fromPeer('192.0.2.10');
    for (let i = 0; i < 15; i++) expect(await authorize({ email: operator.email, password: 'the right password' })).toMatchObject({ id: operator.id });
    fromPeer('198.51.100.66'); // someone else guessing
    for (let i = 0; i < 5; i++) expect(await authorize({ email: operator.email, password: `guess ${i}` })).toBeNull();
    await expect(authorize({ email: operator.email, password: 'guess 6' })).rejects.toThrow(/Too many attempts/);
    fromPeer('192.0.2.10'); // the owner, on their own device
    expect(await authorize({ email: operator.email, password: 'the right password' })).toMatchObject({ id: operator.id });
  });

  it('finding 9: one client spraying a password across many accounts is stopped', async () => {
    const w = makeWorld();
    const authorize = passwordSignIn();
    fromPeer('198.51.100.77');
    for (let i = 0; i < 20; i++) expect(await authorize({ email: `account-${i}@test.example`, password: 'Summer2026!' })).toBeNull();
    await expect(authorize({ email: w.host.email, password: 'Summer2026!' })).rejects.toThrow(/Too many attempts/);
  });

  it('finding 9: the wait doubles with each further failure (backoff), and ends', async () => {
    const { planner } = makeWorld();
    await withPassword(planner, 'planner password');
    const authorize = passwordSignIn();
    vi.useFakeTimers({ toFake: ['Date'] });
    const start = new Date('2030-01-01T00:00:00Z').getTime();
    vi.setSystemTime(start);
    fromPeer('192.0.2.20');
    for (let i = 0; i < 5; i++) await authorize({ email: planner.email, password: `wrong ${i}` });
    await expect(authorize({ email: planner.email, password: 'planner password' })).rejects.toThrow(/Try again in 1 s/);
    vi.setSystemTime(start + 1_000);
    expect(await authorize({ email: planner.email, password: 'wrong 6' })).toBeNull();
    await expect(authorize({ email: planner.email, password: 'planner password' })).rejects.toThrow(/Try again in 2 s/);
    vi.setSystemTime(start + 3_000);
    expect(await authorize({ email: planner.email, password: 'wrong 7' })).toBeNull();
    await expect(authorize({ email: planner.email, password: 'planner password' })).rejects.toThrow(/Try again in 4 s/);
    vi.setSystemTime(start + 7_000);
    expect(await authorize({ email: planner.email, password: 'planner password' })).toMatchObject({ id: planner.id });
  });

  it('finding 9: an unknown address is compared against a dummy hash, like a known one', async () => {
    const { host } = makeWorld();
    await withPassword(host, 'host password');
    const compare = vi.spyOn(bcrypt, 'compare');
    const authorize = passwordSignIn();
    expect(await authorize({ email: 'nobody-here@test.example', password: 'whatever it is' })).toBeNull();
    expect(await authorize({ email: host.email, password: 'not it at all' })).toBeNull();
    expect(compare).toHaveBeenCalledTimes(2);
    // bcrypt's modular crypt format: $2b$, cost 10, as real hashes (bcryptjs README).
    expect(String(compare.mock.calls[0]![1])).toMatch(/^\$2[aby]\$10\$/);
  });

  it('finding 9: the sign-in endpoint answers 429 with Retry-After when limited', async () => {
    const { operator } = makeWorld();
    const authorize = passwordSignIn();
    fromPeer('198.51.100.88');
    for (let i = 0; i < 5; i++) await authorize({ email: operator.email, password: `wrong ${i}` });
    const { POST } = await import('@/app/api/auth/[...nextauth]/route');
    const body = new URLSearchParams({ email: operator.email, password: 'another guess', csrfToken: 'x', json: 'true' });
    const answer = await POST(
      new Request('http://127.0.0.1:3999/api/auth/callback/password', { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body }),
      { params: Promise.resolve({ nextauth: ['callback', 'password'] }) },
    );
    expect(answer.status).toBe(429); // RFC 6585 §4
    expect(Number(answer.headers.get('Retry-After'))).toBeGreaterThanOrEqual(1); // RFC 9110 §10.2.3
    const json = (await answer.json()) as { url: string };
    expect(new URL(json.url).searchParams.get('error')).toMatch(/Too many attempts/);
  });
});

describe('finding 10: forwarded-for trusted', () => {
  it('finding 10: made-up X-Forwarded-For values do not make new clients unless the peer is a configured proxy', async () => {
    const { host } = makeWorld();
    fromPeer('203.0.113.5', { 'x-forwarded-for': '10.1.2.3', 'x-real-ip': '10.9.9.9' });
    expect(await clientAddress()).toBe('203.0.113.5');
    // Twenty-one link requests from one peer, each claiming another forwarded address: the 21st is limited.
    let last;
    for (let i = 0; i < 21; i++) {
      fromPeer('203.0.113.5', { 'x-forwarded-for': `10.0.${i}.1` });
      last = await requestSignInLink(null, formData({ email: `spread-${i}@test.example` }));
    }
    expect(last).toMatchObject({ ok: false, status: 429 });
    void host;
  });

  it('finding 10: behind a configured proxy, the client is the rightmost address the proxy did not add', async () => {
    process.env.TRUSTED_PROXIES = '192.0.2.1, ::1';
    resetEnvCache();
    fromPeer('192.0.2.1', { 'x-forwarded-for': 'spoofed-by-client, 198.51.100.9' });
    expect(await clientAddress()).toBe('198.51.100.9');
    fromPeer('::ffff:192.0.2.1', { 'x-forwarded-for': '198.51.100.10, 192.0.2.1' });
    expect(await clientAddress()).toBe('198.51.100.10');
    // Not from the proxy: the header is ignored.
    fromPeer('203.0.113.6', { 'x-forwarded-for': '198.51.100.11' });
    expect(await clientAddress()).toBe('203.0.113.6');
  });

  it('finding 10: a bad TRUSTED_PROXIES stops the start with the variable named', async () => {
    process.env.TRUSTED_PROXIES = 'proxy.example';
    resetEnvCache();
    const { env } = await import('@/lib/env');
    expect(() => env()).toThrow(/TRUSTED_PROXIES/);
  });

  it("finding 10: the server stamps each request with its socket's peer, replacing a client's own value", async () => {
    installPeerAddressHeader();
    const server = http.createServer((req, res) => res.end(String(req.headers[PEER_HEADER])));
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const port = (server.address() as { port: number }).port;
    const seen = await (await fetch(`http://127.0.0.1:${port}/`, { headers: { [PEER_HEADER]: '198.51.100.1' } })).text();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    expect(seen).toBe('127.0.0.1');
  });

  it("finding 10: the limiter's memory is bounded however many addresses are tried", () => {
    for (let i = 0; i < MAX_KEYS_PER_KIND + 5_000; i++) {
      try {
        rateLimit(`flood:${i}`, 1, 60_000);
      } catch {
        // not limited: each key is new
      }
    }
    rateLimit('other-kind:one', 5, 60_000);
    expect(limiterSize()).toBeLessThanOrEqual(MAX_KEYS_PER_KIND + 1);
  });
});
