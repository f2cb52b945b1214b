// lib/auth-options.ts: the three ways in (password, sign-in link, finishing a sign-up) and the JWT
// session callbacks. The database queries and the one-time token checks are stand-ins here (they have
// their own tests: tests/integration/accounts.test.ts, session-end.test.ts, tests/unit/tokens.test.ts),
// so each case can say exactly which rows would be written.
import bcrypt from 'bcryptjs';
import type { JWT } from 'next-auth/jwt';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

const db = vi.hoisted(() => ({
  getUserByEmail: vi.fn(),
  getUserById: vi.fn(),
  markEmailVerified: vi.fn(),
  completeSignUp: vi.fn(),
  endSession: vi.fn(),
  spendAuthToken: vi.fn(),
  spendSignUpToken: vi.fn(),
}));

vi.mock('@/db/queries/users', () => ({
  getUserByEmail: db.getUserByEmail,
  getUserById: db.getUserById,
  markEmailVerified: db.markEmailVerified,
  completeSignUp: db.completeSignUp,
  endSession: db.endSession,
}));
vi.mock('@/lib/tokens', () => ({ spendAuthToken: db.spendAuthToken, spendSignUpToken: db.spendSignUpToken }));
vi.mock('@/lib/client-key', () => ({ clientAddress: async () => '192.0.2.44' }));

const { authOptions } = await import('@/lib/auth-options');
const { resetRateLimits } = await import('@/lib/rate-limit');

type Authorize = (credentials: Record<string, string> | undefined) => Promise<unknown>;
function authorizeOf(id: string): Authorize {
  // CredentialsProvider keeps the options it was given (our id and authorize) under `options`.
  const providers = authOptions.providers as unknown as { options: { id: string; authorize: Authorize } }[];
  return providers.find((p) => p.options.id === id)!.options.authorize;
}

const PASSWORD = 'a long enough password';
const ada = { id: 'u-ada', email: 'ada@fishplate.example', name: 'Ada', sessionVersion: 3, passwordHash: bcrypt.hashSync(PASSWORD, 4) };
const adaSession = { id: 'u-ada', email: 'ada@fishplate.example', name: 'Ada', sessionVersion: 3 };

beforeEach(() => {
  for (const f of Object.values(db)) f.mockReset();
  resetRateLimits();
});

afterEach(() => {
  vi.useRealTimers();
});

describe('password sign-in', () => {
  it('answers the session user for the right password, and null for a wrong one', async () => {
    db.getUserByEmail.mockReturnValue(ada);
    const authorize = authorizeOf('password');
    expect(await authorize({ email: 'Ada@Fishplate.example', password: PASSWORD })).toStrictEqual(adaSession);
    expect(db.getUserByEmail).toHaveBeenCalledWith('ada@fishplate.example');
    expect(await authorize({ email: ada.email, password: 'not the password' })).toBeNull();
  });

  it('refuses credentials that do not parse without looking anyone up', async () => {
    const authorize = authorizeOf('password');
    expect(await authorize({ email: 'not an address', password: PASSWORD })).toBeNull();
    expect(await authorize(undefined)).toBeNull();
    expect(db.getUserByEmail).not.toHaveBeenCalled();
  });

  it('refuses an unknown address and an account without a password', async () => {
    const authorize = authorizeOf('password');
    expect(await authorize({ email: 'nobody@fishplate.example', password: PASSWORD })).toBeNull();
    db.getUserByEmail.mockReturnValue({ ...ada, passwordHash: null });
    expect(await authorize({ email: ada.email, password: PASSWORD })).toBeNull();
  });
});

describe('sign-in link and sign-up link', () => {
  it('a spent sign-in link signs its user in and marks the address verified', async () => {
    db.spendAuthToken.mockReturnValue('u-ada');
    db.getUserById.mockReturnValue(ada);
    expect(await authorizeOf('link')({ token: 'T'.repeat(43) })).toStrictEqual(adaSession);
    expect(db.spendAuthToken).toHaveBeenCalledWith('T'.repeat(43), 'sign-in');
    expect(db.markEmailVerified).toHaveBeenCalledWith('u-ada');
  });

  it('an unknown or used link signs nobody in and verifies nothing', async () => {
    db.spendAuthToken.mockReturnValue(null);
    expect(await authorizeOf('link')({ token: 'T'.repeat(43) })).toBeNull();
    expect(await authorizeOf('link')(undefined)).toBeNull();
    expect(db.spendAuthToken).toHaveBeenLastCalledWith('', 'sign-in');
    expect(db.markEmailVerified).not.toHaveBeenCalled();
    expect(db.getUserById).not.toHaveBeenCalled();
  });

  it('a spent sign-up link completes the account with the pending password and name', async () => {
    db.spendSignUpToken.mockReturnValue({ userId: 'u-ada', passwordHash: 'hash', name: 'Ada' });
    db.getUserById.mockReturnValue(ada);
    expect(await authorizeOf('sign-up')({ token: 'S'.repeat(43) })).toStrictEqual(adaSession);
    expect(db.completeSignUp).toHaveBeenCalledWith('u-ada', 'hash', 'Ada');
  });

  it('an unknown sign-up link completes nothing', async () => {
    db.spendSignUpToken.mockReturnValue(null);
    expect(await authorizeOf('sign-up')({ token: 'S'.repeat(43) })).toBeNull();
    expect(db.completeSignUp).not.toHaveBeenCalled();
  });
});

describe('JWT and session callbacks', () => {
  const jwt = (args: { token: JWT; user?: unknown }) => (authOptions.callbacks!.jwt as unknown as (a: typeof args) => JWT)(args);
  const session = (args: { session: { user?: Record<string, unknown>; expires: string }; token: JWT }) =>
    (authOptions.callbacks!.session as unknown as (a: typeof args) => typeof args.session)(args);

  it('stamps a new session with the user, their session version and a fresh session id (RFC 9562 UUID)', () => {
    const token = jwt({ token: { name: 'Ada' }, user: { id: 'u-ada', sessionVersion: 3 } });
    expect(token).toMatchObject({ name: 'Ada', sub: 'u-ada', sv: 3 });
    expect(token.sid).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(jwt({ token: {}, user: { id: 'u-bo' } }).sv).toBe(0);
  });

  it('leaves a renewed token as it was', () => {
    const token = { sub: 'u-ada', sv: 3, sid: 'sid-1' };
    expect(jwt({ token: { ...token } })).toStrictEqual(token);
  });

  it('copies the token’s user, version and session id into the session', () => {
    const s = session({ session: { user: { name: 'Ada' }, expires: 'x' }, token: { sub: 'u-ada', sv: 3, sid: 'sid-1' } });
    expect(s.user).toStrictEqual({ name: 'Ada', id: 'u-ada', sessionVersion: 3, sessionId: 'sid-1' });
  });

  it('adds nothing to a session without a user or a token without one', () => {
    expect(session({ session: { expires: 'x' }, token: { sub: 'u-ada' } })).toStrictEqual({ expires: 'x' });
    expect(session({ session: { user: { name: 'Ada' }, expires: 'x' }, token: {} })).toStrictEqual({ user: { name: 'Ada' }, expires: 'x' });
  });
});

describe('sign-out records the ended session until its cookie would have expired', () => {
  const signOut = (token: JWT | null) => (authOptions.events!.signOut as unknown as (a: { token: JWT | null }) => void)({ token });

  it('keeps it until the token’s own expiry (JWT "exp" is in seconds, RFC 7519 §4.1.4)', () => {
    signOut({ sub: 'u-ada', sid: 'sid-1', exp: 1_800_000_000 });
    expect(db.endSession).toHaveBeenCalledWith('sid-1', 'u-ada', new Date(1_800_000_000_000));
  });

  it('keeps it a full session lifetime (7 days) when the token has no expiry', () => {
    vi.useFakeTimers({ now: new Date('2026-12-03T18:00:00Z') });
    signOut({ sub: 'u-ada', sid: 'sid-1' });
    expect(db.endSession).toHaveBeenCalledWith('sid-1', 'u-ada', new Date('2026-12-10T18:00:00Z'));
  });

  it('records nothing without a token, a session id or a user', () => {
    signOut(null);
    signOut({ sub: 'u-ada' });
    signOut({ sid: 'sid-1' });
    expect(db.endSession).not.toHaveBeenCalled();
  });
});
