// lib/current-user.ts: who is asking, read again from the user row on every request. next-auth's
// session reader and the user queries are stand-ins here, so each case says which rows are read.
import { beforeEach, describe, expect, it, vi } from 'vitest';

const s = vi.hoisted(() => ({ getServerSession: vi.fn(), getUserById: vi.fn(), isSessionEnded: vi.fn() }));
vi.mock('next-auth', () => ({ getServerSession: s.getServerSession }));
vi.mock('@/db/queries/users', () => ({ getUserById: s.getUserById, isSessionEnded: s.isSessionEnded }));
vi.mock('@/lib/auth-options', () => ({ authOptions: {} }));

const { currentUser } = await import('@/lib/current-user');

const ada = { id: 'u-ada', email: 'ada@fishplate.example', name: 'Ada', sessionVersion: 2 };

beforeEach(() => {
  for (const f of Object.values(s)) f.mockReset();
  s.getUserById.mockReturnValue(ada);
  s.isSessionEnded.mockReturnValue(false);
});

describe('currentUser', () => {
  it('answers the signed-in user from their row', async () => {
    s.getServerSession.mockResolvedValue({ user: { id: 'u-ada', sessionVersion: 2, sessionId: 'sid-1' } });
    expect(await currentUser()).toStrictEqual({ id: 'u-ada', email: 'ada@fishplate.example', name: 'Ada' });
    expect(s.isSessionEnded).toHaveBeenCalledWith('sid-1');
  });

  it('is null with no session, a session without a user, or a user without an id, without reading any row', async () => {
    for (const session of [null, { expires: 'x' }, { user: {}, expires: 'x' }]) {
      s.getServerSession.mockResolvedValue(session);
      expect(await currentUser(), JSON.stringify(session)).toBeNull();
    }
    expect(s.getUserById).not.toHaveBeenCalled();
  });

  it('is null for a deleted account, an older session version, a session with no id or an ended one', async () => {
    s.getServerSession.mockResolvedValue({ user: { id: 'u-ada', sessionVersion: 1, sessionId: 'sid-1' } });
    expect(await currentUser()).toBeNull();
    s.getServerSession.mockResolvedValue({ user: { id: 'u-ada', sessionVersion: 2 } });
    expect(await currentUser()).toBeNull();
    s.getServerSession.mockResolvedValue({ user: { id: 'u-ada', sessionVersion: 2, sessionId: 'sid-1' } });
    s.isSessionEnded.mockReturnValue(true);
    expect(await currentUser()).toBeNull();
    s.getUserById.mockReturnValue(undefined);
    expect(await currentUser()).toBeNull();
  });
});
