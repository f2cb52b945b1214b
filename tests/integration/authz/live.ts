import { makeSessionWorld } from './sessions';
import { anyMember, plannerUp, type AuthzCase, type AuthzExemption, type Expect, type World } from './shared';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (path: string, body: unknown) =>
  new Request(url(path), { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

/** The session world with its clock started (by the planner, straight through the store). */
export async function startedSessionWorld(w: World) {
  const world = makeSessionWorld(w);
  const { applyClockAction } = await import('@/lib/live/clock');
  applyClockAction(world.session, { user: w.planner, railwayId: w.railway.id, role: 'planner' }, { action: 'start' });
  return world;
}

export const LIVE_CASES: AuthzCase[] = [
  {
    target: 'app/api/sessions/[sessionId]/clock/route.ts#POST',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { POST } = await import('@/app/api/sessions/[sessionId]/clock/route');
      return (await POST(json(`/api/sessions/${session.id}/clock`, { action: 'start' }), ctx({ sessionId: session.id }))).status;
    },
    expect: plannerUp,
  },
];

const reported: Expect = { anon: 401, outsider: 404, operator: 201, planner: 201, host: 201 };

LIVE_CASES.push({
  // runIds[0] is the world's operator's run, so the operator may report it.
  target: 'app/api/sessions/[sessionId]/runs/[runId]/reports/route.ts#POST',
  call: async (w) => {
    const { session, runIds } = await startedSessionWorld(w);
    const { POST } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/reports/route');
    const path = `/api/sessions/${session.id}/runs/${runIds[0]}/reports`;
    return (await POST(json(path, { kind: 'departed' }), ctx({ sessionId: session.id, runId: runIds[0] }))).status;
  },
  expect: reported,
});

export const LIVE_EXEMPTIONS: AuthzExemption[] = [];

export { anyMember };
