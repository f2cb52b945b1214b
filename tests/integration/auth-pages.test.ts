import { afterEach, describe, expect, it } from 'vitest';
import type { Role } from '@/db/schema';
import type { Member } from '@/lib/auth';
import { memberForPage, sessionForPage } from '@/lib/auth/pages';
import { canEdit } from '@/lib/auth/sessions';
import { HIDDEN_FROM_OPERATOR, makeSessionWorld } from './authz/sessions';
import { caller, signInAs } from './caller';
import { NOT_FOUND, thrownDigest } from './page-digest';
import { makeWorld, type RoleKey } from './world';

// The page gates (lib/auth/pages.ts) answer by digest (./page-digest).

afterEach(() => {
  // The "foreign error" tests below replace the caller with a getter that throws.
  Object.defineProperty(caller, 'user', { value: null, writable: true, configurable: true, enumerable: true });
});

describe('memberForPage: the gate of a railway page', () => {
  it('sends a visitor with no session to sign-in, coming back to the page they asked for', async () => {
    const world = makeWorld();
    signInAs(null);
    const back = `/railways/${world.railway.id}/sessions?view=week&day=2031-04-12`;
    // The return path is one query value, so it is percent-encoded (RFC 3986 3.4, 2.1): its own ? & = do
    // not become the sign-in page's parameters.
    expect(await thrownDigest(() => memberForPage(world.railway.id, 'operator', back))).toBe(
      `NEXT_REDIRECT;replace;/sign-in?callbackUrl=${encodeURIComponent(back)};307;`,
    );
    expect(encodeURIComponent(back)).toContain('%3Fview%3Dweek%26day%3D');
  });

  it('shows another railway as a 404 page, so its ids reveal nothing (common practice)', async () => {
    const world = makeWorld();
    signInAs(world.outsider);
    expect(await thrownDigest(() => memberForPage(world.railway.id, 'operator', '/'))).toBe(NOT_FOUND);
    // An id that names no railway at all looks the same.
    signInAs(world.host);
    expect(await thrownDigest(() => memberForPage('no-such-railway', 'operator', '/'))).toBe(NOT_FOUND);
  });

  it('lets a member below the page’s role in as `denied`, so the page can say what the role allows', async () => {
    const world = makeWorld();
    signInAs(world.operator);
    expect(await memberForPage(world.railway.id, 'planner', '/')).toEqual({ denied: true });
    signInAs(world.planner);
    expect(await memberForPage(world.railway.id, 'host', '/')).toEqual({ denied: true });
  });

  it('gives a member at or above the role their membership (roles: operator < planner < host)', async () => {
    const world = makeWorld();
    const cases: [RoleKey, Role, Role][] = [
      ['operator', 'operator', 'operator'],
      ['planner', 'operator', 'planner'],
      ['planner', 'planner', 'planner'],
      ['host', 'planner', 'host'],
      ['host', 'host', 'host'],
    ];
    for (const [who, minimum, role] of cases) {
      const user = world.users[who]!;
      signInAs(user);
      expect(await memberForPage(world.railway.id, minimum, '/')).toEqual({ member: { user, railwayId: world.railway.id, role } });
    }
  });

  it('lets any other error through unchanged, even one that carries an HTTP-like status', async () => {
    // Only the app's own access errors (lib/errors.ts AppError) become a page answer; anything else (a
    // failing database, a library error with its own `status`) must reach the error page, not be
    // mistaken for "sign in", "denied" or "not found" (common practice: fail closed).
    const world = makeWorld();
    for (const status of [401, 403, 404, undefined]) {
      const failure = Object.assign(new Error(`user lookup failed (${status})`), { status });
      Object.defineProperty(caller, 'user', {
        get() {
          throw failure;
        },
        configurable: true,
      });
      await expect(memberForPage(world.railway.id, 'operator', '/')).rejects.toBe(failure);
    }
  });
});

describe('sessionForPage: the session a page shows', () => {
  const memberOf = (world: ReturnType<typeof makeWorld>, who: 'operator' | 'planner' | 'host'): Member => ({
    user: world.users[who]!,
    railwayId: world.railway.id,
    role: who,
  });

  it('gives planners and hosts every session of their railway, drafts too', () => {
    for (const status of ['draft', 'published', 'cancelled'] as const) {
      const world = makeWorld();
      const { session } = makeSessionWorld(world, { status, inviteOperator: false });
      for (const who of ['planner', 'host'] as const) {
        expect(sessionForPage(memberOf(world, who), session.id)).toEqual(session);
      }
    }
  });

  it('is a 404 page for an unknown id and for another railway’s session, whatever the role', async () => {
    const world = makeWorld();
    const { otherSession } = makeSessionWorld(world, { status: 'published', inviteOperator: true });
    for (const who of ['operator', 'planner', 'host'] as const) {
      expect(await thrownDigest(() => sessionForPage(memberOf(world, who), 'no-such-session'))).toBe(NOT_FOUND);
      expect(await thrownDigest(() => sessionForPage(memberOf(world, who), otherSession.id))).toBe(NOT_FOUND);
    }
  });

  it('shows an operator only a published session they are invited to; any other is a 404 page (README, Roles)', async () => {
    const world = makeWorld();
    const seen = makeSessionWorld(world, { status: 'published', inviteOperator: true }).session;
    expect(sessionForPage(memberOf(world, 'operator'), seen.id)).toEqual(seen);
    for (const hidden of HIDDEN_FROM_OPERATOR) {
      const { session } = makeSessionWorld(world, hidden);
      expect(await thrownDigest(() => sessionForPage(memberOf(world, 'operator'), session.id))).toBe(NOT_FOUND);
      // The same session is there for the planner: the 404 is the operator's rule, not a missing row.
      expect(sessionForPage(memberOf(world, 'planner'), session.id)).toEqual(session);
    }
  });
});

describe('canEdit: who may change a session’s timetable and settings', () => {
  it('is planners and hosts, not operators (README, Roles)', () => {
    const world = makeWorld();
    const member = (role: Role): Member => ({ user: world.host, railwayId: world.railway.id, role });
    expect(canEdit(member('operator'))).toBe(false);
    expect(canEdit(member('planner'))).toBe(true);
    expect(canEdit(member('host'))).toBe(true);
  });
});
