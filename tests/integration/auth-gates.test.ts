import { describe, expect, it } from 'vitest';
import { requireMember } from '@/lib/auth';
import { requireLayout, requireLayoutById } from '@/lib/auth/layouts';
import { requireSession } from '@/lib/auth/sessions';
import { AppError } from '@/lib/errors';
import { HIDDEN_FROM_OPERATOR, makeLayout, makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

// The access gates route handlers and actions call (lib/auth), read for what the caller is told: the status
// and the message (route handlers answer `{ error: message }`, lib/errors.ts). A refusal must not tell an
// outsider more than an unknown id would (common practice: answer 404 alike for "does not exist" and "not
// yours", so ids cannot be probed; README, Roles: another railway's data is a 404).

async function refusal(run: () => Promise<unknown>) {
  try {
    await run();
  } catch (error) {
    expect(error).toBeInstanceOf(AppError);
    return { status: (error as AppError).status, message: (error as AppError).message };
  }
  throw new Error('expected a refusal');
}

const SIGN_IN = { status: 401, message: 'Sign in to continue.' };

describe('requireMember', () => {
  it('401 without a session; 404 for a railway the caller is not in, alike to an unknown id', async () => {
    const world = makeWorld();
    signInAs(null);
    expect(await refusal(() => requireMember(world.railway.id, 'operator'))).toEqual(SIGN_IN);
    signInAs(world.outsider);
    const unknown = await refusal(() => requireMember('no-such-railway', 'operator'));
    expect(unknown).toEqual({ status: 404, message: 'That railway was not found.' });
    expect(await refusal(() => requireMember(world.railway.id, 'operator'))).toEqual(unknown);
  });

  it('403 below the role, saying what the role does not allow', async () => {
    const world = makeWorld();
    signInAs(world.operator);
    expect(await refusal(() => requireMember(world.railway.id, 'planner', 'edit the layout'))).toEqual({
      status: 403,
      message: 'Your role on this railway does not allow you to edit the layout.',
    });
    expect((await refusal(() => requireMember(world.railway.id, 'planner'))).message).toBe('Your role on this railway does not allow you to do that.');
  });
});

describe('requireSession', () => {
  it('401 without a session, whether or not the id exists', async () => {
    const world = makeWorld();
    const { session } = makeSessionWorld(world);
    signInAs(null);
    expect(await refusal(() => requireSession('no-such-session', 'view'))).toEqual(SIGN_IN);
    expect(await refusal(() => requireSession(session.id, 'edit'))).toEqual(SIGN_IN);
  });

  it('tells an outsider about another railway’s session exactly what it tells them about an unknown id', async () => {
    const world = makeWorld();
    const { session } = makeSessionWorld(world);
    signInAs(world.outsider);
    for (const need of ['view', 'edit'] as const) {
      const unknown = await refusal(() => requireSession('no-such-session', need));
      expect(unknown).toEqual({ status: 404, message: 'That session was not found.' });
      expect(await refusal(() => requireSession(session.id, need))).toEqual(unknown);
    }
  });

  it('lets an operator read their published session but not edit it (403), and hides every other (README, Roles)', async () => {
    const world = makeWorld();
    const own = makeSessionWorld(world, { status: 'published', inviteOperator: true }).session;
    signInAs(world.operator);
    expect(await requireSession(own.id, 'view')).toEqual({
      member: { user: world.operator, railwayId: world.railway.id, role: 'operator' },
      session: own,
    });
    expect(await refusal(() => requireSession(own.id, 'edit'))).toEqual({
      status: 403,
      message: 'Your role on this railway does not allow you to change this timetable.',
    });
    const unknown = await refusal(() => requireSession('no-such-session', 'view'));
    for (const hidden of HIDDEN_FROM_OPERATOR) {
      const { session } = makeSessionWorld(world, hidden);
      expect(await refusal(() => requireSession(session.id, 'view'))).toEqual(unknown);
      expect(await refusal(() => requireSession(session.id, 'edit'))).toEqual(unknown);
    }
  });

  it('lets planners and hosts view and edit every session of their railway, drafts too', async () => {
    const world = makeWorld();
    const { session } = makeSessionWorld(world, { status: 'draft', inviteOperator: false });
    for (const who of ['planner', 'host'] as const) {
      signInAs(world[who]);
      for (const need of ['view', 'edit'] as const) {
        expect(await requireSession(session.id, need)).toEqual({ member: { user: world[who], railwayId: world.railway.id, role: who }, session });
      }
    }
  });
});

describe('requireLayout and requireLayoutById', () => {
  it('404 for another railway’s layout named under ours; the layout and the member for one of ours', async () => {
    const world = makeWorld();
    const ours = makeLayout(world.railway.id);
    const theirs = makeLayout(world.otherRailway.id);
    signInAs(world.planner);
    expect(await refusal(() => requireLayout(world.railway.id, theirs.layoutId, 'operator'))).toEqual({ status: 404, message: 'That layout was not found.' });
    const context = await requireLayout(world.railway.id, ours.layoutId, 'planner');
    expect(context.member).toEqual({ user: world.planner, railwayId: world.railway.id, role: 'planner' });
    expect(context.layout).toMatchObject({ id: ours.layoutId, railwayId: world.railway.id, name: 'Test line' });
    signInAs(world.operator);
    expect(await refusal(() => requireLayout(world.railway.id, ours.layoutId, 'planner', 'change the track'))).toEqual({
      status: 403,
      message: 'Your role on this railway does not allow you to change the track.',
    });
  });

  it('bounds the ids it is given: empty or over 100 characters is a 400 (input validated at the boundary)', async () => {
    const world = makeWorld();
    const ours = makeLayout(world.railway.id);
    signInAs(world.planner);
    expect((await refusal(() => requireLayout('', ours.layoutId, 'operator'))).status).toBe(400);
    expect((await refusal(() => requireLayout(world.railway.id, 'x'.repeat(101), 'operator'))).status).toBe(400);
    expect((await refusal(() => requireLayoutById('x'.repeat(101), 'operator'))).status).toBe(400);
    expect((await refusal(() => requireLayoutById('', 'operator'))).status).toBe(400);
  });

  it('by id alone: 401 first, then the same 404 for an unknown id and for another railway’s layout', async () => {
    const world = makeWorld();
    const ours = makeLayout(world.railway.id);
    signInAs(null);
    expect(await refusal(() => requireLayoutById('no-such-layout', 'operator'))).toEqual(SIGN_IN);
    expect(await refusal(() => requireLayoutById(ours.layoutId, 'operator'))).toEqual(SIGN_IN);
    signInAs(world.outsider);
    const unknown = await refusal(() => requireLayoutById('no-such-layout', 'operator'));
    expect(unknown).toEqual({ status: 404, message: 'That layout was not found.' });
    expect(await refusal(() => requireLayoutById(ours.layoutId, 'operator'))).toEqual(unknown);
  });

  it('by id alone: 403 below the role with what it does not allow, the layout at or above it', async () => {
    const world = makeWorld();
    const ours = makeLayout(world.railway.id);
    signInAs(world.operator);
    expect(await refusal(() => requireLayoutById(ours.layoutId, 'planner', 'upload a track plan'))).toEqual({
      status: 403,
      message: 'Your role on this railway does not allow you to upload a track plan.',
    });
    expect((await requireLayoutById(ours.layoutId, 'operator')).layout.id).toBe(ours.layoutId);
    signInAs(world.host);
    expect(await requireLayoutById(ours.layoutId, 'host')).toMatchObject({ member: { role: 'host', railwayId: world.railway.id }, layout: { id: ours.layoutId } });
  });
});
