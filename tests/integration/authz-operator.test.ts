import { afterEach, describe, expect, it } from 'vitest';
import { AUTHZ_CASES } from './authz';
import { sessionWorldDefaults } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld, ROLE_KEYS } from './world';

// The matrix runs every row on a published session the operator is invited to. An operator may see
// a session only when both hold (README, Roles: "published ones they are invited to"), so every row
// an operator passes there is run again on a draft, a cancelled and an uninvited session: the
// operator gets 404 (not told the session exists), every other role what the matrix expects.
// The calendar download's row builds its session in authz/invitations.ts, not with makeSessionWorld;
// tests/integration/calendar.test.ts covers who may download it.
const ownWorld = new Set(['app/api/sessions/[sessionId]/calendar.ics/route.ts#GET']);
const operatorRows = AUTHZ_CASES.filter((c) => c.expect.operator === 200 && c.target.includes('[sessionId]') && !ownWorld.has(c.target));

// Route handlers that name a session without its railway and refuse an operator with 403 on their own
// published session (they may see it, not change it): on a session they may not see, the refusal is a
// 404, so a change request does not tell them the session exists (lib/auth/sessions.ts requireSession).
// The invitation actions are left out on purpose: they refuse by railway role before reading the session
// id, so their 403 is the same whether the session exists or not.
const operatorRefusedRows = AUTHZ_CASES.filter((c) => c.expect.operator === 403 && c.target.startsWith('app/api/sessions/[sessionId]/') && !ownWorld.has(c.target));

const variants = [
  { name: 'a draft session they are invited to', status: 'draft', inviteOperator: true },
  { name: 'a cancelled session they are invited to', status: 'cancelled', inviteOperator: true },
  { name: 'a published session they are not invited to', status: 'published', inviteOperator: false },
] as const;

afterEach(() => Object.assign(sessionWorldDefaults, { status: 'published', inviteOperator: true }));

describe('authorization matrix: what an operator may not see', () => {
  it('has session rows an operator passes on their published session', () => {
    expect(operatorRows.map((c) => c.target)).toEqual(expect.arrayContaining(['app/api/sessions/[sessionId]/plan/route.ts#GET']));
  });

  it('has session rows an operator is refused on their published session', () => {
    expect(operatorRefusedRows.length).toBeGreaterThan(0);
  });

  for (const variant of variants) {
    for (const testCase of operatorRefusedRows) {
      it(`${testCase.target} on ${variant.name} as operator → 404, not 403`, async () => {
        Object.assign(sessionWorldDefaults, { status: variant.status, inviteOperator: variant.inviteOperator });
        const world = makeWorld();
        signInAs(world.users.operator);
        expect(await testCase.call(world)).toBe(404);
      });
    }
  }

  for (const variant of variants) {
    for (const testCase of operatorRows) {
      for (const role of ROLE_KEYS) {
        const expected = role === 'operator' ? 404 : testCase.expect[role];
        it(`${testCase.target} on ${variant.name} as ${role} → ${expected}`, async () => {
          Object.assign(sessionWorldDefaults, { status: variant.status, inviteOperator: variant.inviteOperator });
          const world = makeWorld();
          signInAs(world.users[role]);
          expect(await testCase.call(world)).toBe(expected);
        });
      }
    }
  }
});
