// Editing a run through its route handler: a new departure moves the whole run, a new timing keeps
// the stored train when the edit does not name one, and a run that is not there answers 404.
import { describe, expect, it } from 'vitest';
import { PATCH } from '@/app/api/sessions/[sessionId]/runs/[runId]/route';
import { GET as listRuns } from '@/app/api/sessions/[sessionId]/runs/route';
import type { TimetableChange, TimetableSnapshot } from '@/lib/sessions/types';
import { makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const patch = (sid: string, runId: string, body: unknown) =>
  PATCH(new Request(url(`/api/sessions/${sid}/runs/${runId}`), { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }), ctx({ sessionId: sid, runId }));

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  signInAs(w.planner);
  return { s, sid: s.session.id };
}

async function runOf(sid: string, runId: string) {
  const res = await listRuns(new Request(url(`/api/sessions/${sid}/runs`)), ctx({ sessionId: sid }));
  expect(res.status).toBe(200);
  return ((await res.json()) as TimetableSnapshot).runs.find((r) => r.id === runId)!;
}

describe('editing a run', () => {
  it('a new departure in real seconds moves the whole run by the difference', async () => {
    const { s, sid } = setup();
    const before = await runOf(sid, s.runIds[0]);
    const res = await patch(sid, before.id, { version: before.version, departS: before.departS + 60 });
    expect(res.status).toBe(200);
    const after = ((await res.json()) as TimetableChange).run!;
    expect(after.departS).toBe(before.departS + 60);
    expect(after.arriveS).toBeCloseTo(before.arriveS + 60, 9);
    after.steps.forEach((st, i) => {
      expect(st.enterS).toBeCloseTo(before.steps[i]!.enterS + 60, 9);
      expect(st.exitS).toBeCloseTo(before.steps[i]!.exitS + 60, 9);
    });
  });

  it('a new timing without a train times the stored train over the route, from the stored departure', async () => {
    const { s, sid } = setup();
    const before = await runOf(sid, s.runIds[0]);
    const { A, D } = s.layout.blocks as Record<'A' | 'D', string>;
    const res = await patch(sid, before.id, { version: before.version, timing: { waypoints: [A, D], speedKmh: 40 } });
    expect(res.status).toBe(200);
    const after = ((await res.json()) as TimetableChange).run!;
    expect(after.trainId).toBe(before.trainId);
    expect(after.speedKmh).toBe(40);
    expect(after.departS).toBe(before.departS);
    expect(after.steps.map((st) => st.blockId)).toEqual(['A', 'B', 'C', 'D'].map((k) => s.layout.blocks[k]));
  });

  it('answers 404 for a run that is not in the session', async () => {
    const { sid } = setup();
    const res = await patch(sid, 'no-such-run', { version: 1, note: 'x' });
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ error: 'That run was not found.' });
  });
});
