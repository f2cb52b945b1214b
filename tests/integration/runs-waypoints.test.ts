// Timing a new run from its waypoints (timeFromWaypoints through the create route): each bad
// reference names its field, repeated waypoints count once, and a route needs two different blocks.
import { describe, expect, it } from 'vitest';
import { GET as listRuns, POST as createRun } from '@/app/api/sessions/[sessionId]/runs/route';
import type { TimetableChange, TimetableSnapshot } from '@/lib/sessions/types';
import { makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  signInAs(w.planner);
  const sid = s.session.id;
  const b = s.layout.blocks as Record<'A' | 'B' | 'D', string>;
  const create = (over: Record<string, unknown>) =>
    createRun(
      new Request(url(`/api/sessions/${sid}/runs`), {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '09:00', waypoints: [b.A, b.D], speedKmh: 60, ...over }),
      }),
      ctx({ sessionId: sid }),
    );
  const count = async () => ((await (await listRuns(new Request(url(`/api/sessions/${sid}/runs`)), ctx({ sessionId: sid }))).json()) as TimetableSnapshot).runs.length;
  return { s, b, create, count };
}

describe('timing a new run from waypoints', () => {
  it('refuses a train or a waypoint not on the layout, naming the field and its index; adds nothing', async () => {
    const { b, create, count } = setup();
    const before = await count();
    const train = await create({ trainId: 'no-such-train' });
    expect(train.status).toBe(400);
    expect(await train.json()).toMatchObject({ issues: [{ path: 'trainId', message: 'That train is not on this session’s layout.' }] });
    const block = await create({ waypoints: [b.A, 'no-such-block'] });
    expect(block.status).toBe(400);
    expect(await block.json()).toMatchObject({ issues: [{ path: 'waypoints[1]', message: 'That block is not on this session’s layout.' }] });
    expect(await count()).toBe(before);
  });

  it('counts a waypoint repeated in a row once, and refuses a route that goes nowhere', async () => {
    const { s, b, create } = setup();
    const res = await create({ waypoints: [b.A, b.A, b.D, b.D] });
    expect(res.status).toBe(201);
    expect(((await res.json()) as TimetableChange).run!.steps.map((st) => st.blockId)).toEqual(['A', 'B', 'C', 'D'].map((k) => s.layout.blocks[k]));
    const nowhere = await create({ waypoints: [b.A, b.A] });
    expect(nowhere.status).toBe(400);
    expect(await nowhere.json()).toMatchObject({ issues: [{ path: 'waypoints', message: 'Pick two different blocks: a run has to go somewhere.' }] });
  });

  it('takes a route of two neighbouring blocks', async () => {
    const { s, b, create } = setup();
    const res = await create({ waypoints: [b.A, b.B] });
    expect(res.status).toBe(201);
    const run = ((await res.json()) as TimetableChange).run!;
    expect(run.steps.map((st) => st.blockId)).toEqual([s.layout.blocks.A, s.layout.blocks.B]);
  });
});
