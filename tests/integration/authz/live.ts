import { getDb } from '@/db';
import { insertRuns, type RunValues } from '@/db/queries/runs';
import * as t from '@/db/schema';
import { makeSessionWorld, timedSteps } from './sessions';
import { anyMember, hostOnly, plannerUp, type AuthzCase, type AuthzExemption, type Expect, type World } from './shared';

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

type Layout = ReturnType<typeof makeSessionWorld>['layout'];

/** A second session on the session world's test layout (its session row copied, the operator invited) with the runs given. */
export function sessionWithRuns(w: World, runs: (layout: Layout) => RunValues[], title = 'Following trains') {
  const s = makeSessionWorld(w);
  const db = getDb();
  const { id: _id, createdAt: _c, ...rest } = s.session;
  const session = db.insert(t.sessions).values({ ...rest, title }).returning().get();
  db.insert(t.invitations).values({ sessionId: session.id, userId: w.operator.id, email: w.operator.email }).run();
  return { session, layout: s.layout, runIds: insertRuns(session.id, runs(s.layout)) };
}

/** A second session on the same test layout: train 1 runs A→C at 60 s, train 2 follows the same way 60 s after it arrives. */
export function followingSession(w: World) {
  let first!: ReturnType<typeof timedSteps>;
  let second!: ReturnType<typeof timedSteps>;
  const { session, runIds } = sessionWithRuns(w, (layout) => {
    first = timedSteps(layout, ['A', 'B', 'C'], 60);
    second = timedSteps(layout, ['A', 'B', 'C'], first.arriveS + 60);
    return [
      { trainId: layout.trains.t1, cabId: layout.cabs.c1, operatorId: w.operator.id, speedKmh: 60, note: '', ...first },
      { trainId: layout.trains.t2, cabId: layout.cabs.c2, operatorId: w.planner.id, speedKmh: 60, note: '', ...second },
    ];
  });
  const [leader, follower] = runIds as [string, string];
  return { sid: session.id, leader, follower, first, second };
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

LIVE_CASES.push({
  // A run's report history: runIds[0] is the world's operator's run (another's run: 403, live.test.ts).
  target: 'app/api/sessions/[sessionId]/runs/[runId]/reports/route.ts#GET',
  call: async (w) => {
    const { session, runIds } = await startedSessionWorld(w);
    const { GET } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/reports/route');
    return (await GET(new Request(url(`/api/sessions/${session.id}/runs/${runIds[0]}/reports`)), ctx({ sessionId: session.id, runId: runIds[0] }))).status;
  },
  expect: anyMember,
});

LIVE_CASES.push(
  {
    // The polling form; the stream form goes through the same gate (tests/integration/live.test.ts).
    target: 'app/api/sessions/[sessionId]/live/route.ts#GET',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { GET } = await import('@/app/api/sessions/[sessionId]/live/route');
      return (await GET(new Request(url(`/api/sessions/${session.id}/live?after=0`)), ctx({ sessionId: session.id }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/sessions/[sessionId]/repair/route.ts#GET',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { GET } = await import('@/app/api/sessions/[sessionId]/repair/route');
      return (await GET(new Request(url(`/api/sessions/${session.id}/repair`)), ctx({ sessionId: session.id }))).status;
    },
    expect: hostOnly,
  },
  {
    // The world's two runs clash as planned, so there is always a repair to apply: the caller
    // posts the one proposed to the host.
    target: 'app/api/sessions/[sessionId]/repair/route.ts#POST',
    call: async (w) => {
      const { session, runIds } = makeSessionWorld(w);
      const { buildLiveState } = await import('@/lib/live/state');
      const moves = buildLiveState(session.id).repair.map((m) => ({ runId: m.runId, delayS: m.delayS }));
      const { POST } = await import('@/app/api/sessions/[sessionId]/repair/route');
      const body = { moves: moves.length ? moves : [{ runId: runIds[1], delayS: 60 }] };
      return (await POST(json(`/api/sessions/${session.id}/repair`, body), ctx({ sessionId: session.id }))).status;
    },
    expect: hostOnly,
  },
);

LIVE_CASES.push({
  target: 'app/api/sessions/[sessionId]/report/route.ts#GET',
  call: async (w) => {
    const { session } = makeSessionWorld(w);
    const { GET } = await import('@/app/api/sessions/[sessionId]/report/route');
    return (await GET(new Request(url(`/api/sessions/${session.id}/report?format=csv`)), ctx({ sessionId: session.id }))).status;
  },
  expect: anyMember,
});

export const LIVE_EXEMPTIONS: AuthzExemption[] = [];
