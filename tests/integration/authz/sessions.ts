import { getDb } from '@/db';
import { insertRuns } from '@/db/queries/runs';
import * as t from '@/db/schema';
import { DEFAULT_TIMING, type WiringSheet } from '@/lib/control';
import { timeRun, toPlanJson } from '@/lib/planning';
import { formData } from '../world';
import { actionStatus, anyMember, plannerUp, type AuthzCase, type AuthzExemption, type Expect, type World } from './shared';

/**
 * A small layout on a railway: four blocks in a line (A–B–C–D, 1 m each), one 14.6 V supply, a
 * 1 A-class driver with 2.6 V drop (so exactly 12 V at the rails, NMRA S-9 I.A), two cabs, two
 * locomotives and two trains. Returns ids by key.
 */
export function makeLayout(railwayId: string) {
  const db = getDb();
  const layoutId = db.insert(t.layouts).values({ railwayId, name: 'Test line', scaleName: 'H0', scaleRatio: 87 }).returning().get().id;
  const blocks: Record<string, string> = {};
  ['A', 'B', 'C', 'D'].forEach((key, i) => {
    blocks[key] = db.insert(t.blocks).values({ layoutId, name: `Block ${key}`, lengthMm: 1000, positionMm: i * 1000 }).returning().get().id;
  });
  for (const [a, b] of [['A', 'B'], ['B', 'C'], ['C', 'D']] as const) {
    db.insert(t.links).values({ layoutId, blockAId: blocks[a]!, blockBId: blocks[b]! }).run();
  }
  const supplyId = db.insert(t.supplies).values({ layoutId, name: 'Bench supply', volts: 14.6, amps: 3 }).returning().get().id;
  const driverId = db
    .insert(t.drivers)
    .values({ layoutId, supplyId, name: 'Board', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 2.6 })
    .returning()
    .get().id;
  const cabs = {
    c1: db.insert(t.cabs).values({ layoutId, driverId, name: 'Cab 1', channel: 1 }).returning().get().id,
    c2: db.insert(t.cabs).values({ layoutId, driverId, name: 'Cab 2', channel: 2 }).returning().get().id,
  };
  const locomotive = (name: string) =>
    db.insert(t.locomotives).values({ layoutId, name, runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 100 }).returning().get().id;
  const train = (name: string, locomotiveId: string) => {
    const id = db.insert(t.trains).values({ layoutId, name, lightingAmps: 0, lengthMm: 500 }).returning().get().id;
    db.insert(t.trainLocomotives).values({ trainId: id, locomotiveId: locomotiveId, position: 0 }).run();
    return id;
  };
  const trains = { t1: train('Morning stopper', locomotive('Tank one')), t2: train('Evening goods', locomotive('Diesel two')) };
  // A wiring sheet on one 40-pin-header board, so the control routes have something to compile.
  const keys = ['A', 'B', 'C', 'D'];
  const sheet: WiringSheet = {
    version: 1,
    boards: [{ id: 'pi', kind: 'header40', name: 'Test board', emergencyStopPin: 'GPIO4', startPin: null }],
    cabs: [
      { cabId: cabs.c1, boardId: 'pi', forwardPin: 'GPIO5', reversePin: 'GPIO6', pwmPin: 'GPIO12', bothHighBrakes: false },
      { cabId: cabs.c2, boardId: 'pi', forwardPin: 'GPIO16', reversePin: 'GPIO20', pwmPin: 'GPIO13', bothHighBrakes: false },
    ],
    blocks: keys.map((k, i) => ({
      blockId: blocks[k]!,
      boardId: 'pi',
      feeds: [{ cabId: cabs.c1, pin: `GPIO${[17, 27, 22, 23][i]}` }, { cabId: cabs.c2, pin: `GPIO${[24, 25, 26, 21][i]}` }],
      polarityPin: null,
      forwardTowards: i < 3 ? [blocks[keys[i + 1]!]!] : [],
    })),
    timing: DEFAULT_TIMING,
  };
  db.insert(t.wiringSheets).values({ layoutId, sheet: JSON.stringify(sheet) }).run();
  return { layoutId, blocks, cabs, trains };
}

/** Steps for a run along the test line, timed by timeRun at 60 km/h (H0). */
export function timedSteps(layout: ReturnType<typeof makeLayout>, keys: string[], departS: number) {
  const route = keys.map((k) => layout.blocks[k]!);
  return timeRun({
    blocks: route.map((id) => ({ id, lengthMm: 1000 })),
    scaleRatio: 87,
    trainLengthMm: 500,
    route,
    departS,
    speedKmh: 60,
    standBeforeS: 30,
    standAfterS: 30,
  });
}

/** What makeSessionWorld makes when not told: tests/integration/authz-operator.test.ts re-runs the matrix's rows with others. */
export const sessionWorldDefaults: { status: t.SessionStatus; inviteOperator: boolean } = { status: 'published', inviteOperator: true };

/** The sessions an operator of the railway may not see (README, Roles: only published ones they are invited to). */
export const HIDDEN_FROM_OPERATOR = [
  { status: 'draft', inviteOperator: true },
  { status: 'cancelled', inviteOperator: true },
  { status: 'published', inviteOperator: false },
] as const;

/**
 * A published session on a fresh test layout, with the world's operator invited and two runs that
 * meet in block B (a block clash) — and a session of the other railway.
 */
export function makeSessionWorld(w: World, options: { status?: t.SessionStatus; inviteOperator?: boolean } = {}) {
  const db = getDb();
  const layout = makeLayout(w.railway.id);
  // Whole minutes, as the session form writes them.
  const startsAt = new Date(Math.floor((Date.now() + 7 * 86_400_000) / 60_000) * 60_000);
  const session = db
    .insert(t.sessions)
    .values({
      railwayId: w.railway.id,
      layoutId: layout.layoutId,
      title: 'Test evening',
      startsAt,
      endsAt: new Date(startsAt.getTime() + 3 * 3600_000),
      timeZone: 'UTC',
      clockRatio: 4,
      fastStart: '06:00',
      headwayS: 30,
      surgeS: 2,
      derate: 0.8,
      status: options.status ?? sessionWorldDefaults.status,
    })
    .returning()
    .get();
  if (options.inviteOperator ?? sessionWorldDefaults.inviteOperator) {
    db.insert(t.invitations).values({ sessionId: session.id, userId: w.operator.id, email: w.operator.email }).run();
  }
  const first = timedSteps(layout, ['A', 'B', 'C'], 60);
  const second = timedSteps(layout, ['D', 'C', 'B'], 65);
  const runIds = insertRuns(session.id, [
    { trainId: layout.trains.t1, cabId: layout.cabs.c1, operatorId: w.operator.id, speedKmh: 60, note: '', ...first },
    { trainId: layout.trains.t2, cabId: layout.cabs.c2, operatorId: null, speedKmh: 60, note: '', ...second },
  ]);
  const otherLayout = makeLayout(w.otherRailway.id);
  const other = db
    .insert(t.sessions)
    .values({
      railwayId: w.otherRailway.id,
      layoutId: otherLayout.layoutId,
      title: 'Their evening',
      startsAt,
      endsAt: new Date(startsAt.getTime() + 3600_000),
      timeZone: 'UTC',
      clockRatio: 4,
      fastStart: '06:00',
      headwayS: 30,
      surgeS: 2,
      derate: 0.8,
      status: 'published',
    })
    .returning()
    .get();
  return { layout, session, runIds: runIds as [string, string], otherSession: other };
}

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (method: string, path: string, body: unknown) =>
  new Request(url(path), { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

const created: Expect = { anon: 401, outsider: 404, operator: 403, planner: 201, host: 201 };
const plannerRedirect: Expect = { anon: 401, outsider: 404, operator: 403, planner: 303, host: 303 };
const signedInOk: Expect = { anon: 401, outsider: 200, operator: 200, planner: 200, host: 200 };
// The outsider is a host of another railway, so a planner somewhere: outside tools work for them.
const plannerAnywhere: Expect = { anon: 401, outsider: 200, operator: 403, planner: 200, host: 200 };

const SESSIONS = 'app/(app)/railways/[railwayId]/sessions/actions.ts';
const settingsForm = (extra: Record<string, string>) =>
  formData({
    title: 'Spring running day',
    date: '2031-04-12',
    startTime: '10:00',
    endTime: '16:00',
    clockRatio: '4',
    fastStart: '06:00',
    headwayS: '30',
    surgeS: '2',
    deratePercent: '80',
    ...extra,
  });

export const SESSION_CASES: AuthzCase[] = [
  {
    target: 'app/api/sessions/route.ts#GET',
    call: async () => (await (await import('@/app/api/sessions/route')).GET(new Request(url('/api/sessions')), ctx({}))).status,
    expect: signedInOk,
  },
  {
    target: 'app/api/sessions/[sessionId]/plan/route.ts#GET',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { GET } = await import('@/app/api/sessions/[sessionId]/plan/route');
      return (await GET(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/sessions/[sessionId]/plan/route.ts#POST',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { loadSessionPlan } = await import('@/lib/sessions/timetable');
      const { POST } = await import('@/app/api/sessions/[sessionId]/plan/route');
      const body = toPlanJson(loadSessionPlan(session.id).plan);
      return (await POST(json('POST', `/api/sessions/${session.id}/plan`, body), ctx({ sessionId: session.id }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/sessions/[sessionId]/check/route.ts#GET',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { GET } = await import('@/app/api/sessions/[sessionId]/check/route');
      return (await GET(new Request(url(`/api/sessions/${session.id}/check`)), ctx({ sessionId: session.id }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/sessions/[sessionId]/runs/route.ts#GET',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { GET } = await import('@/app/api/sessions/[sessionId]/runs/route');
      return (await GET(new Request(url(`/api/sessions/${session.id}/runs`)), ctx({ sessionId: session.id }))).status;
    },
    expect: anyMember,
  },
  {
    target: 'app/api/sessions/[sessionId]/runs/route.ts#POST',
    call: async (w) => {
      const { session, layout } = makeSessionWorld(w);
      const { POST } = await import('@/app/api/sessions/[sessionId]/runs/route');
      const body = { trainId: layout.trains.t1, cabId: layout.cabs.c1, depart: '09:00', waypoints: [layout.blocks.A, layout.blocks.D], speedKmh: 60 };
      return (await POST(json('POST', `/api/sessions/${session.id}/runs`, body), ctx({ sessionId: session.id }))).status;
    },
    expect: created,
  },
  {
    target: 'app/api/sessions/[sessionId]/runs/[runId]/route.ts#PATCH',
    call: async (w) => {
      const { session, runIds } = makeSessionWorld(w);
      const { PATCH } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/route');
      const path = `/api/sessions/${session.id}/runs/${runIds[0]}`;
      return (await PATCH(json('PATCH', path, { version: 1, depart: '08:00' }), ctx({ sessionId: session.id, runId: runIds[0] }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/sessions/[sessionId]/runs/[runId]/route.ts#DELETE',
    call: async (w) => {
      const { session, runIds } = makeSessionWorld(w);
      const { DELETE } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/route');
      const path = `/api/sessions/${session.id}/runs/${runIds[1]}?version=1`;
      return (await DELETE(new Request(url(path), { method: 'DELETE' }), ctx({ sessionId: session.id, runId: runIds[1] }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/sessions/[sessionId]/runs/[runId]/series/route.ts#POST',
    call: async (w) => {
      const { session, runIds } = makeSessionWorld(w);
      const { POST } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/series/route');
      const path = `/api/sessions/${session.id}/runs/${runIds[0]}/series`;
      return (await POST(json('POST', path, { everyFastMin: 30, count: 2 }), ctx({ sessionId: session.id, runId: runIds[0] }))).status;
    },
    expect: created,
  },
  {
    target: 'app/api/sessions/[sessionId]/retime/route.ts#GET',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { GET } = await import('@/app/api/sessions/[sessionId]/retime/route');
      return (await GET(new Request(url(`/api/sessions/${session.id}/retime`)), ctx({ sessionId: session.id }))).status;
    },
    expect: plannerUp,
  },
  ...(['control', 'control/findings', 'control/firmware.zip', 'control/controller.py'] as const).map(
    (sub): AuthzCase => ({
      target: `app/api/sessions/[sessionId]/${sub}/route.ts#GET`,
      call: async (w) => {
        const { session } = makeSessionWorld(w);
        const mod =
          sub === 'control'
            ? await import('@/app/api/sessions/[sessionId]/control/route')
            : sub === 'control/findings'
              ? await import('@/app/api/sessions/[sessionId]/control/findings/route')
              : sub === 'control/firmware.zip'
                ? await import('@/app/api/sessions/[sessionId]/control/firmware.zip/route')
                : await import('@/app/api/sessions/[sessionId]/control/controller.py/route');
        // The test layout's only board is a 40-pin-header one: the firmware route answers 400 for it,
        // which still shows the caller got past the access check.
        const status = (await mod.GET(new Request(url(`/api/sessions/${session.id}/${sub}`)), ctx({ sessionId: session.id }))).status;
        return sub === 'control/firmware.zip' && status === 400 ? 200 : status;
      },
      expect: plannerUp,
    }),
  ),
  {
    target: 'app/api/sessions/[sessionId]/retime/route.ts#POST',
    call: async (w) => {
      const { session, runIds } = makeSessionWorld(w);
      const { POST } = await import('@/app/api/sessions/[sessionId]/retime/route');
      const body = { moves: [{ runId: runIds[1], version: 1, delayS: 120 }] };
      return (await POST(json('POST', `/api/sessions/${session.id}/retime`, body), ctx({ sessionId: session.id }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/sessions/[sessionId]/retime/undo/route.ts#POST',
    call: async (w) => {
      const { session, runIds } = makeSessionWorld(w);
      const { POST } = await import('@/app/api/sessions/[sessionId]/retime/undo/route');
      const body = { moves: [{ runId: runIds[1], version: 1, delayS: -10 }] };
      return (await POST(json('POST', `/api/sessions/${session.id}/retime/undo`, body), ctx({ sessionId: session.id }))).status;
    },
    expect: plannerUp,
  },
  {
    target: 'app/api/plans/check/route.ts#POST',
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { loadSessionPlan } = await import('@/lib/sessions/timetable');
      const { resetRateLimits } = await import('@/lib/rate-limit');
      resetRateLimits();
      const { POST } = await import('@/app/api/plans/check/route');
      return (await POST(json('POST', '/api/plans/check', toPlanJson(loadSessionPlan(session.id).plan)), ctx({}))).status;
    },
    expect: plannerAnywhere,
  },
  {
    target: `${SESSIONS}#createSession`,
    call: async (w) => {
      const { layout } = makeSessionWorld(w);
      const { createSession } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      return actionStatus(() => createSession(w.railway.id, null, settingsForm({ layoutId: layout.layoutId })));
    },
    expect: plannerRedirect,
  },
  {
    target: `${SESSIONS}#updateSession`,
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { updateSession } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      return actionStatus(() => updateSession(w.railway.id, null, settingsForm({ sessionId: session.id, version: '1' })));
    },
    expect: plannerUp,
  },
  {
    target: `${SESSIONS}#setSessionStatus`,
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { setSessionStatus } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      return actionStatus(() => setSessionStatus(w.railway.id, null, formData({ sessionId: session.id, version: '1', status: 'cancelled' })));
    },
    expect: plannerUp,
  },
  {
    target: `${SESSIONS}#duplicateSession`,
    call: async (w) => {
      const { session } = makeSessionWorld(w);
      const { duplicateSession } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      return actionStatus(() => duplicateSession(w.railway.id, null, formData({ sessionId: session.id, date: '2031-05-01' })));
    },
    expect: plannerRedirect,
  },
];

export const SESSION_EXEMPTIONS: AuthzExemption[] = [];
