import { describe, expect, it } from 'vitest';
import { createSession, duplicateSession, setSessionStatus, updateSession } from '@/app/(app)/railways/[railwayId]/sessions/actions';
import { POST as checkPosted } from '@/app/api/plans/check/route';
import { GET as listSessions } from '@/app/api/sessions/route';
import { GET as getCheck } from '@/app/api/sessions/[sessionId]/check/route';
import { GET as getPlan, POST as postPlan } from '@/app/api/sessions/[sessionId]/plan/route';
import { getDb } from '@/db';
import { addMember } from '@/db/queries/memberships';
import { insertRailway } from '@/db/queries/railways';
import { getSessionById } from '@/db/queries/session-records';
import { blocks, drivers, runs, sessions } from '@/db/schema';
import { resetRateLimits } from '@/lib/rate-limit';
import { checkCounts } from '@/lib/sessions/error-counts';
import { eq } from 'drizzle-orm';
import { makeLayout, makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (method: string, path: string, body: unknown) =>
  new Request(url(path), { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

const settings = (extra: Record<string, string> = {}) =>
  formData({
    title: 'Spring running day',
    date: '2031-04-12',
    startTime: '10:00',
    endTime: '16:00',
    clockRatio: '5',
    fastStart: '07:30',
    headwayS: '20',
    surgeS: '2',
    deratePercent: '80',
    ...extra,
  });

async function redirectTarget(run: () => Promise<unknown>): Promise<string> {
  try {
    await run();
  } catch (error) {
    const digest = String((error as { digest?: string }).digest ?? '');
    if (digest.startsWith('NEXT_REDIRECT')) return digest.split(';')[2]!;
    throw error;
  }
  throw new Error('expected a redirect');
}

describe('sessions', () => {
  it('creates a draft with start and end read in the railway’s zone, and opens its builder', async () => {
    const w = makeWorld();
    const railway = insertRailway({ name: 'London club', timeZone: 'Europe/London', hostUserId: w.host.id });
    addMember(railway.id, w.planner.id, 'planner');
    const layout = makeLayout(railway.id);
    signInAs(w.planner);
    const target = await redirectTarget(() => createSession(railway.id, null, settings({ layoutId: layout.layoutId, endTime: '01:00' })));
    const id = target.split('/').pop()!;
    expect(target).toBe(`/railways/${railway.id}/sessions/${id}`);
    const row = getSessionById(id)!;
    // 12 April 2031 is summer time in London, UTC+1 (IANA tz database, Europe/London rule: last
    // Sunday in March to last Sunday in October), so 10:00 local is 09:00 UTC.
    expect(row.startsAt.toISOString()).toBe('2031-04-12T09:00:00.000Z');
    // An end before the start is the next morning: 01:00 on the 13th, 00:00 UTC.
    expect(row.endsAt.toISOString()).toBe('2031-04-13T00:00:00.000Z');
    expect(row).toMatchObject({ status: 'draft', sequence: 0, timeZone: 'Europe/London', clockRatio: 5, fastStart: '07:30', headwayS: 20, derate: 0.8 });
  });

  it('refuses bad settings field by field and writes nothing; a time the clocks skip is refused', async () => {
    const w = makeWorld();
    const railway = insertRailway({ name: 'London club', timeZone: 'Europe/London', hostUserId: w.host.id });
    const layout = makeLayout(railway.id);
    signInAs(w.host);
    const count = () => getDb().select().from(sessions).where(eq(sessions.railwayId, railway.id)).all().length;
    const state = await createSession(railway.id, null, settings({ layoutId: layout.layoutId, title: '', clockRatio: '0', fastStart: '25:00', deratePercent: '' }));
    expect(state).toMatchObject({ ok: false, status: 400 });
    if (state && !state.ok) {
      expect(Object.keys(state.fieldErrors ?? {}).sort()).toEqual(['clockRatio', 'deratePercent', 'fastStart', 'title']);
      expect(state.fieldErrors?.deratePercent).toBe('Enter the supply load limit in percent.');
    }
    // 30 March 2031 is the last Sunday of March: London skips 01:00–02:00 (IANA tz database).
    const skipped = await createSession(railway.id, null, settings({ layoutId: layout.layoutId, date: '2031-03-30', startTime: '01:30' }));
    expect(skipped).toMatchObject({ ok: false, status: 400, fieldErrors: { startTime: expect.stringContaining('does not exist') } });
    // Another railway's layout.
    const theirs = makeLayout(w.otherRailway.id);
    expect(await createSession(railway.id, null, settings({ layoutId: theirs.layoutId }))).toMatchObject({ ok: false, status: 400, fieldErrors: { layoutId: expect.any(String) } });
    expect(count()).toBe(0);
  });

  it('raises SEQUENCE when the date, times or status change, not for the title (RFC 5546 2.1.4); stale versions get 409', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w, { status: 'draft' });
    signInAs(w.planner);
    const base = { sessionId: session.id, date: session.startsAt.toISOString().slice(0, 10), startTime: session.startsAt.toISOString().slice(11, 16), endTime: session.endsAt.toISOString().slice(11, 16) };
    expect(await updateSession(w.railway.id, null, settings({ ...base, version: '1', title: 'Renamed evening' }))).toMatchObject({ ok: true });
    expect(getSessionById(session.id)).toMatchObject({ title: 'Renamed evening', sequence: 0, version: 2 });
    expect(await updateSession(w.railway.id, null, settings({ ...base, version: '2', startTime: '05:00' }))).toMatchObject({ ok: true });
    expect(getSessionById(session.id)).toMatchObject({ sequence: 1, version: 3 });
    expect(await updateSession(w.railway.id, null, settings({ ...base, version: '2', title: 'Late edit' }))).toMatchObject({ ok: false, status: 409 });
    expect(getSessionById(session.id)!.title).toBe('Spring running day');

    // The two runs meet head-on in blocks B and C, so publishing asks for the errors to be acknowledged.
    const { errors } = checkCounts(session.id);
    expect(errors).toBeGreaterThan(0);
    expect(await setSessionStatus(w.railway.id, null, formData({ sessionId: session.id, version: '3', status: 'published' }))).toMatchObject({
      ok: false,
      status: 400,
      fieldErrors: { acknowledgedErrors: expect.stringContaining(`${errors} error`) },
    });
    expect(
      await setSessionStatus(w.railway.id, null, formData({ sessionId: session.id, version: '3', status: 'published', acknowledgedErrors: String(errors - 1) })),
    ).toMatchObject({ ok: false, status: 400 });
    expect(getSessionById(session.id)).toMatchObject({ status: 'draft', version: 3 });
    expect(
      await setSessionStatus(w.railway.id, null, formData({ sessionId: session.id, version: '3', status: 'published', acknowledgedErrors: String(errors) })),
    ).toMatchObject({ ok: true });
    expect(getSessionById(session.id)).toMatchObject({ status: 'published', sequence: 2 });
    // RFC 5546 3.2.5: a cancel raises SEQUENCE too.
    expect(await setSessionStatus(w.railway.id, null, formData({ sessionId: session.id, version: '4', status: 'cancelled' }))).toMatchObject({ ok: true });
    expect(getSessionById(session.id)).toMatchObject({ status: 'cancelled', sequence: 3 });
    expect(await setSessionStatus(w.railway.id, null, formData({ sessionId: session.id, version: '5', status: 'published' }))).toMatchObject({ ok: false, status: 400 });
  });

  it('saves the session-day settings (least stand, punctuality margin) for planners, keeps them when a form leaves them out, refuses out-of-range values and operators', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w, { status: 'draft' });
    const base = { sessionId: session.id, date: session.startsAt.toISOString().slice(0, 10), startTime: session.startsAt.toISOString().slice(11, 16), endTime: session.endsAt.toISOString().slice(11, 16) };
    expect(getSessionById(session.id)).toMatchObject({ standS: 60, punctualFastMin: 3 });
    signInAs(w.operator);
    expect(await updateSession(w.railway.id, null, settings({ ...base, version: '1', standS: '90' }))).toMatchObject({ ok: false, status: 403 });
    signInAs(w.planner);
    const refused = await updateSession(w.railway.id, null, settings({ ...base, version: '1', standS: '3601', punctualFastMin: '-1' }));
    expect(refused).toMatchObject({ ok: false, status: 400, fieldErrors: { standS: 'Use 0 to 3600.', punctualFastMin: 'Use 0 to 120.' } });
    expect(getSessionById(session.id)).toMatchObject({ standS: 60, punctualFastMin: 3, version: 1 });
    expect(await updateSession(w.railway.id, null, settings({ ...base, version: '1', standS: '90', punctualFastMin: '5' }))).toMatchObject({ ok: true });
    expect(getSessionById(session.id)).toMatchObject({ standS: 90, punctualFastMin: 5, version: 2 });
    // A form (or tool) without the two fields keeps what is stored.
    expect(await updateSession(w.railway.id, null, settings({ ...base, version: '2', title: 'Renamed' }))).toMatchObject({ ok: true });
    expect(getSessionById(session.id)).toMatchObject({ title: 'Renamed', standS: 90, punctualFastMin: 5 });
  });

  it('duplicates a session to a new date as a draft with the same runs', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    signInAs(w.host);
    const target = await redirectTarget(() => duplicateSession(w.railway.id, null, formData({ sessionId: session.id, date: '2032-01-15' })));
    const copy = getSessionById(target.split('/').pop()!)!;
    expect(copy).toMatchObject({ status: 'draft', sequence: 0, title: session.title, layoutId: session.layoutId });
    expect(copy.startsAt.toISOString()).toBe(`2032-01-15T${session.startsAt.toISOString().slice(11)}`);
    const runsOf = (id: string) => getDb().select().from(runs).where(eq(runs.sessionId, id)).all().map((r) => [r.trainId, r.departS, r.arriveS]);
    expect(runsOf(copy.id)).toEqual(runsOf(session.id));
    expect(await duplicateSession(w.railway.id, null, formData({ sessionId: makeSessionWorld(w).otherSession.id, date: '2032-01-15' }))).toMatchObject({ ok: false, status: 404 });
  });

  it('GET /api/sessions lists what the caller may see across railways, soonest first', async () => {
    const w = makeWorld();
    const draft = makeSessionWorld(w, { status: 'draft' });
    const published = makeSessionWorld(w);
    getDb().update(sessions).set({ startsAt: new Date(Date.now() + 86_400_000) }).where(eq(sessions.id, published.session.id)).run();
    signInAs(w.planner);
    const mine = (await (await listSessions(new Request(url('/api/sessions')), ctx({}))).json()).sessions;
    expect(mine.map((s: { id: string }) => s.id)).toEqual([published.session.id, draft.session.id]);
    expect(mine[0]).toMatchObject({ railway: { id: w.railway.id, name: 'Test railway' }, title: 'Test evening', status: 'published' });
    signInAs(w.operator);
    const theirs = (await (await listSessions(new Request(url('/api/sessions')), ctx({}))).json()).sessions;
    expect(theirs.map((s: { id: string }) => s.id)).toEqual([published.session.id]);
    expect((await listSessions(new Request(url('/api/sessions?upcoming=maybe')), ctx({}))).status).toBe(400);
  });

  it('plan round trip: GET then POST leaves the session unchanged', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    signInAs(w.planner);
    const read = async () => (await getPlan(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).json();
    const before = await read();
    expect(before.version).toBe(2); // every export writes version 2
    const res = await postPlan(json('POST', `/api/sessions/${session.id}/plan`, before), ctx({ sessionId: session.id }));
    expect(res.status).toBe(200);
    expect(await read()).toEqual(before);
  });

  it('POST plan refuses bad plans with the zod issues and half-writes nothing', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    const other = makeSessionWorld({ ...w, railway: w.otherRailway });
    signInAs(w.planner);
    const plan = await (await getPlan(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).json();
    const post = (body: unknown) => postPlan(json('POST', `/api/sessions/${session.id}/plan`, body), ctx({ sessionId: session.id }));
    const broken = { ...plan, runs: [plan.runs[0], { ...plan.runs[1], cabId: 'no-such-cab' }] };
    const res = await post(broken);
    expect(res.status).toBe(400);
    expect((await res.json()).issues).toEqual([{ path: 'runs[1].cabId', message: 'unknown cab "no-such-cab"' }]);
    // Valid on its own, but the train belongs to another railway's layout.
    const foreign = {
      ...plan,
      trains: [...plan.trains, { id: other.layout.trains.t1, name: 'X', locomotiveIds: [plan.locomotives[0].id], lightingAmps: 0, lengthMm: 500, accelKmhPerS: 15, brakingKmhPerS: 20 }],
      runs: [{ ...plan.runs[0], trainId: other.layout.trains.t1 }],
    };
    const res2 = await post(foreign);
    expect(res2.status).toBe(400);
    expect((await res2.json()).issues[0].path).toBe('trainId');
    expect((await post({ version: 2 })).status).toBe(400);
    const after = await (await getPlan(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).json();
    expect(after).toEqual(plan);
  });

  it('GET check answers the findings and load of the stored session', async () => {
    const w = makeWorld();
    const { session, layout } = makeSessionWorld(w);
    signInAs(w.operator);
    const res = await getCheck(new Request(url(`/api/sessions/${session.id}/check`)), ctx({ sessionId: session.id }));
    const body = await res.json();
    expect(body.runCount).toBe(2);
    expect(body.errors).toBeGreaterThan(0);
    const overlap = body.findings.find((f: { kind: string; ids: string[] }) => f.kind === 'block-overlap' && f.ids[0] === layout.blocks.B);
    expect(overlap.message).toContain('Block B');
    expect(overlap.message).toMatch(/Morning stopper \(06:\d\d departure\)/);
    expect(overlap.message).toMatch(/Evening goods \(06:\d\d departure\)/);
    expect(body.load.cabs.map((c: { name: string }) => c.name)).toEqual(['Cab 1', 'Cab 2']);
  });

  it('GET /check answers with the plan state as ETag and 304 while it holds; a run or layout change gives a new one (RFC 9110 8.8.3, 13.1.2)', async () => {
    const w = makeWorld();
    const { session, layout } = makeSessionWorld(w);
    signInAs(w.planner);
    const get = (etag?: string) =>
      getCheck(new Request(url(`/api/sessions/${session.id}/check`), { headers: etag ? { 'If-None-Match': etag } : {} }), ctx({ sessionId: session.id }));
    const first = await get();
    const etag = first.headers.get('etag')!;
    expect(etag).toMatch(/^"[\w-]{20,}"$/);
    const again = await get(etag);
    expect(again.status).toBe(304);
    expect(await again.text()).toBe('');
    expect((await get(`"other", W/${etag}`)).status).toBe(304);
    expect((await get('"something-else"')).status).toBe(200);

    const [run] = getDb().select().from(runs).where(eq(runs.sessionId, session.id)).all();
    getDb().update(runs).set({ departS: run!.departS + 1 }).where(eq(runs.id, run!.id)).run();
    const afterRun = await get(etag);
    expect(afterRun.status).toBe(200);
    const runTag = afterRun.headers.get('etag')!;
    expect(runTag).not.toBe(etag);

    getDb().update(blocks).set({ lengthMm: 4321 }).where(eq(blocks.id, layout.blocks.B!)).run();
    const afterBlock = await get(runTag);
    expect(afterBlock.status).toBe(200);
    expect(afterBlock.headers.get('etag')).not.toBe(runTag);
  });

  it('GET /check?only=load answers the load profile alone, by id, with its own ETag; an unknown part is 400 (RFC 9110 8.8.3)', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    signInAs(w.operator);
    const get = (query: string, etag?: string) =>
      getCheck(new Request(url(`/api/sessions/${session.id}/check${query}`), { headers: etag ? { 'If-None-Match': etag } : {} }), ctx({ sessionId: session.id }));
    const whole = await get('');
    const wholeBody = await whole.json();
    const part = await get('?only=load');
    expect(part.status).toBe(200);
    const body = await part.json();
    expect(Object.keys(body).sort()).toEqual(['load', 'sessionId']);
    // The same series as the whole answer's, in the same order, without the names (the builder has them in its layout).
    for (const group of ['cabs', 'drivers', 'supplies'] as const) {
      expect(body.load[group]).toEqual(wholeBody.load[group].map(({ name: _name, ...rest }: { name: string }) => rest));
    }
    expect(body.load.cabs).toHaveLength(2);
    const partTag = part.headers.get('etag')!;
    expect(partTag).not.toBe(whole.headers.get('etag'));
    expect((await get('?only=load', partTag)).status).toBe(304);
    // A representation's tag does not validate the other one.
    expect((await get('', partTag)).status).toBe(200);
    const bad = await get('?only=findings');
    expect(bad.status).toBe(400);
    expect((await get('?only=load&extra=1')).status).toBe(400);
  });

  it('the load charts’ data carries the driver’s heat against its package rating, and the findings say when it is over', async () => {
    const w = makeWorld();
    const { session, layout } = makeSessionWorld(w);
    getDb().update(drivers).set({ packageWatts: 1.5 }).where(eq(drivers.layoutId, layout.layoutId)).run();
    signInAs(w.operator);
    const get = async (query: string) => (await getCheck(new Request(url(`/api/sessions/${session.id}/check${query}`)), ctx({ sessionId: session.id }))).json();
    const heat = (await get('?only=load')).load.drivers[0].heat;
    expect(heat.limitWatts).toBe(1.5);
    // The two trains run at once for a while, one on each channel, 0.3 A each through the board's
    // fixed 2.6 V drop: dissipation is drop × current summed over channels, 2 × 2.6 V × 0.3 A = 1.56 W.
    expect(heat.maxHighWatts).toBeCloseTo(1.56, 4);
    expect(heat.maxLowWatts).toBeCloseTo(1.56, 4);
    const over = (await get('')).findings.filter((f: { kind: string }) => f.kind === 'driver-heat');
    expect(over.map((f: { ids: string[] }) => f.ids)).toEqual([[getDb().select().from(drivers).where(eq(drivers.layoutId, layout.layoutId)).get()!.id]]);
    expect(over[0].message).toMatch(/1\.56 W/);
  });

  it('POST /api/plans/check checks a posted plan for planners, refuses bad ones, and is rate-limited', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    signInAs(w.planner);
    resetRateLimits();
    const plan = await (await getPlan(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).json();
    const res = await checkPosted(json('POST', '/api/plans/check', plan), ctx({}));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.findings.some((f: { kind: string }) => f.kind === 'block-overlap')).toBe(true);
    const bad = await checkPosted(json('POST', '/api/plans/check', { ...plan, clock: { ratio: 0, fastStart: '6am' } }), ctx({}));
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues.map((i: { path: string }) => i.path)).toEqual(['clock.ratio', 'clock.fastStart']);
    let last = 200;
    for (let i = 0; i < 40 && last !== 429; i++) last = (await checkPosted(json('POST', '/api/plans/check', plan), ctx({}))).status;
    expect(last).toBe(429);
    resetRateLimits();
  });

  it('POST /api/plans/check takes version 1 too, upgraded with the scale’s common-practice ramps', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    signInAs(w.planner);
    resetRateLimits();
    const v2 = await (await getPlan(new Request(url(`/api/sessions/${session.id}/plan`)), ctx({ sessionId: session.id }))).json();
    const { locomotives, trains, ...rest } = v2;
    const v1 = {
      ...rest,
      version: 1,
      locos: locomotives,
      trains: trains.map(({ locomotiveIds, accelKmhPerS: _a, brakingKmhPerS: _b, ...train }: { locomotiveIds: string[]; accelKmhPerS: number; brakingKmhPerS: number }) => ({ ...train, locoIds: locomotiveIds })),
    };
    const [a, b] = await Promise.all([v2, v1].map(async (plan) => (await checkPosted(json('POST', '/api/plans/check', plan), ctx({}))).json()));
    expect(b.errors).toBe(a.errors);
    expect(b.findings.map((f: { kind: string }) => f.kind)).toEqual(a.findings.map((f: { kind: string }) => f.kind));
    // The stored trains have no ramps of their own, so both read as H0's 15 up and 20 down.
    expect(trains[0]).toMatchObject({ accelKmhPerS: 15, brakingKmhPerS: 20 });
    expect((await checkPosted(json('POST', '/api/plans/check', { ...v1, version: 3 }), ctx({}))).status).toBe(400);
    resetRateLimits();
  });
});
