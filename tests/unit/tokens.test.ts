// lib/tokens.ts: one-time tokens for sign-in, reset and sign-up links. Only a SHA-256 hash is stored;
// the queries are stand-ins here that record what would be stored and answer what a row would hold.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

const q = vi.hoisted(() => ({ insertAuthToken: vi.fn(), consumeAuthToken: vi.fn(), consumeAuthTokenRow: vi.fn() }));
vi.mock('@/db/queries/users', () => q);

const { issueAuthToken, issueSignUpToken, spendAuthToken, spendSignUpToken } = await import('@/lib/tokens');

/** SHA-256 as lower-case hex (FIPS 180-4), computed through WebCrypto rather than node:crypto's createHash. */
async function sha256Hex(text: string): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', new TextEncoder().encode(text));
  return Buffer.from(digest).toString('hex');
}

const BASE64URL_32_BYTES = /^[A-Za-z0-9_-]{43}$/; // RFC 4648 §5, 256 bits → 43 characters, no padding

beforeEach(() => {
  for (const f of Object.values(q)) f.mockReset();
});

afterEach(() => {
  vi.useRealTimers();
});

describe('issuing', () => {
  it('gives a 256-bit base64url token and stores only its SHA-256 hash, expiring by purpose', async () => {
    vi.useFakeTimers({ now: new Date('2026-12-03T18:00:00Z') });
    const link = issueAuthToken('u1', 'sign-in');
    const reset = issueAuthToken('u1', 'reset-password');
    const signUp = issueSignUpToken('u2', 'bcrypt-hash', 'Bo');
    for (const t of [link, reset, signUp]) expect(t).toMatch(BASE64URL_32_BYTES);
    expect(new Set([link, reset, signUp]).size).toBe(3);
    expect(q.insertAuthToken.mock.calls.map((c) => c[0])).toStrictEqual([
      { userId: 'u1', purpose: 'sign-in', tokenHash: await sha256Hex(link), expiresAt: new Date('2026-12-03T18:15:00Z') },
      { userId: 'u1', purpose: 'reset-password', tokenHash: await sha256Hex(reset), expiresAt: new Date('2026-12-03T19:00:00Z') },
      {
        userId: 'u2',
        purpose: 'sign-up',
        tokenHash: await sha256Hex(signUp),
        expiresAt: new Date('2026-12-04T18:00:00Z'),
        pendingPasswordHash: 'bcrypt-hash',
        pendingName: 'Bo',
      },
    ]);
  });
});

describe('spending', () => {
  const well = 'A'.repeat(43);

  it('looks a well-formed token up by its hash and purpose', async () => {
    q.consumeAuthToken.mockReturnValue('u1');
    expect(spendAuthToken(well, 'reset-password')).toBe('u1');
    expect(q.consumeAuthToken).toHaveBeenCalledWith(await sha256Hex(well), 'reset-password');
  });

  it('takes 20 to 100 base64url characters and refuses anything else without a database read', () => {
    q.consumeAuthToken.mockReturnValue('u1');
    expect(spendAuthToken('a'.repeat(20), 'sign-in')).toBe('u1');
    expect(spendAuthToken('-_'.repeat(50), 'sign-in')).toBe('u1');
    q.consumeAuthToken.mockClear();
    for (const bad of ['a'.repeat(19), 'a'.repeat(101), `${well}=`, `=${well}`, `${well.slice(1)}+`, '/' + well, '', `${well} `]) {
      expect(spendAuthToken(bad, 'sign-in'), bad).toBeNull();
      expect(spendSignUpToken(bad), bad).toBeNull();
    }
    expect(q.consumeAuthToken).not.toHaveBeenCalled();
    expect(q.consumeAuthTokenRow).not.toHaveBeenCalled();
  });

  it('a sign-up token gives the user with the pending password hash and name', async () => {
    q.consumeAuthTokenRow.mockReturnValue({ userId: 'u2', pendingPasswordHash: 'h', pendingName: 'Bo' });
    expect(spendSignUpToken(well)).toStrictEqual({ userId: 'u2', passwordHash: 'h', name: 'Bo' });
    expect(q.consumeAuthTokenRow).toHaveBeenCalledWith(await sha256Hex(well), 'sign-up');
  });

  it('a sign-up token that is unknown, or whose row lacks the password or the name, gives null', () => {
    for (const row of [undefined, null, { userId: 'u2', pendingPasswordHash: null, pendingName: 'Bo' }, { userId: 'u2', pendingPasswordHash: 'h', pendingName: '' }]) {
      q.consumeAuthTokenRow.mockReturnValue(row);
      expect(spendSignUpToken(well), JSON.stringify(row)).toBeNull();
    }
  });
});
