import { describe, expect, it } from 'vitest';
import { changeMemberRole, inviteMember, removeMember } from '@/app/(app)/railways/[railwayId]/members/actions';
import { getDb } from '@/db';
import { listMemberInvitations } from '@/db/queries/member-invitations';
import { getMembership, listMembers } from '@/db/queries/memberships';
import { auditLog, outbox } from '@/db/schema';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

describe('members', () => {
  it('a host invites a member by e-mail: an offer, an audit entry and a message with no sign-in link (issue 10, finding 1)', async () => {
    const w = makeWorld();
    signInAs(w.host);
    const state = await inviteMember(w.railway.id, null, formData({ email: 'Newcomer@Test.Example', role: 'planner' }));
    expect(state).toMatchObject({ ok: true });
    // Nothing attaches until they accept (tests/integration/account-hardening.test.ts).
    expect(listMembers(w.railway.id).find((m) => m.email === 'newcomer@test.example')).toBeUndefined();
    expect(listMemberInvitations(w.railway.id)).toMatchObject([{ email: 'newcomer@test.example', role: 'planner' }]);
    const mail = getDb().select().from(outbox).all().filter((m) => m.toAddress === 'newcomer@test.example');
    expect(mail).toHaveLength(1);
    expect(mail[0]!.railwayId).toBe(w.railway.id);
    expect(mail[0]!.text).toContain('/sign-up');
    expect(mail[0]!.text).not.toContain('token=');
    expect(getDb().select().from(auditLog).all().some((a) => a.action === 'offer' && a.railwayId === w.railway.id)).toBe(true);
  });

  it('bad input gets a field message and changes nothing', async () => {
    const w = makeWorld();
    signInAs(w.host);
    const before = listMembers(w.railway.id).length;
    const state = await inviteMember(w.railway.id, null, formData({ email: 'nope', role: 'admiral' }));
    expect(state).toMatchObject({ ok: false, status: 400 });
    if (state && !state.ok) {
      expect(state.fieldErrors?.email).toMatch(/valid e-mail/);
      expect(state.fieldErrors?.role).toBe('Choose host, planner or operator.');
    }
    expect(listMembers(w.railway.id).length).toBe(before);
  });

  it('adding an existing member is refused with 409', async () => {
    const w = makeWorld();
    signInAs(w.host);
    expect(await inviteMember(w.railway.id, null, formData({ email: w.operator.email, role: 'planner' }))).toMatchObject({ ok: false, status: 409 });
    expect(getMembership(w.railway.id, w.operator.id)?.role).toBe('operator');
  });

  it('the last host can neither step down nor be removed', async () => {
    const w = makeWorld();
    signInAs(w.host);
    expect(await changeMemberRole(w.railway.id, null, formData({ userId: w.host.id, role: 'operator' }))).toMatchObject({ ok: false, status: 400 });
    expect(await removeMember(w.railway.id, null, formData({ userId: w.host.id }))).toMatchObject({ ok: false, status: 400 });
    expect(getMembership(w.railway.id, w.host.id)?.role).toBe('host');
    // With a second host, the first may step down.
    await changeMemberRole(w.railway.id, null, formData({ userId: w.planner.id, role: 'host' }));
    expect(await changeMemberRole(w.railway.id, null, formData({ userId: w.host.id, role: 'planner' }))).toMatchObject({ ok: true });
  });

  it('an id from another railway answers 404 and changes nothing there', async () => {
    const w = makeWorld();
    signInAs(w.host);
    expect(await removeMember(w.railway.id, null, formData({ userId: w.outsider.id }))).toMatchObject({ ok: false, status: 404 });
    expect(getMembership(w.otherRailway.id, w.outsider.id)?.role).toBe('host');
    // A host of our railway cannot act on the other railway even with a valid user id there.
    expect(await removeMember(w.otherRailway.id, null, formData({ userId: w.outsider.id }))).toMatchObject({ ok: false, status: 404 });
  });
});
