import { describe, expect, it } from 'vitest';
import { POST as clockAction } from '@/app/api/sessions/[sessionId]/clock/route';
import { POST as reportAction } from '@/app/api/sessions/[sessionId]/runs/[runId]/reports/route';
import { listReports } from '@/db/queries/live';
import type { LiveState } from '@/lib/live/types';
import { closeDb } from '@/db';
import { readClockNow } from '@/lib/live/clock';
import { getSessionById } from '@/db/queries/session-records';
import { makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (path: string, body: unknown) =>
  new Request(url(path), { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  return { w, s, sid: s.session.id };
}
const clock = (sid: string, body: unknown) => clockAction(json(`/api/sessions/${sid}/clock`, body), ctx({ sessionId: sid }));

describe('the shared fast clock route', () => {
  it('starts from a fast time, refuses a second start, pauses, resumes and sets; the record outlives the database handle', async () => {
    const { w, sid } = setup();
    signInAs(w.host);
    const started = await clock(sid, { action: 'start', fast: '06:30' });
    expect(started.status).toBe(200);
    const body = await started.json();
    // 06:30 at 4:1 from 06:00: 30 fast minutes = 7.5 real minutes = 450 s of session time.
    expect(body.clock).toMatchObject({ state: 'running', fast: '06:30' });
    expect(body.clock.records[0]).toMatchObject({ action: 'start', sessionS: 450 });
    expect(body.seq).toBe(1);

    const again = await clock(sid, { action: 'start' });
    expect(again.status).toBe(400);
    expect((await again.json()).error).toMatch(/already been started/);

    expect((await clock(sid, { action: 'pause' })).status).toBe(200);
    expect((await clock(sid, { action: 'pause' })).status).toBe(400);
    signInAs(w.planner);
    expect((await clock(sid, { action: 'resume' })).status).toBe(200);
    const set = await (await clock(sid, { action: 'set', fast: '08:00' })).json();
    expect(set.clock).toMatchObject({ state: 'running', fast: '08:00' });
    expect(set.seq).toBe(4);

    // A server restart: the next handle reads the same record.
    closeDb();
    const reading = readClockNow(getSessionById(sid)!);
    expect(reading.state).toBe('running');
    // 08:00 is 2 fast hours = 1800 real seconds at 4:1; a moment has passed since.
    expect(reading.sessionS).toBeGreaterThanOrEqual(1800);
    expect(reading.sessionS).toBeLessThan(1800 + 60);
  });

  it('refuses a set without a time and a pause with one, changing nothing', async () => {
    const { w, sid } = setup();
    signInAs(w.host);
    expect((await clock(sid, { action: 'set' })).status).toBe(400);
    expect((await clock(sid, { action: 'pause', fast: '07:00' })).status).toBe(400);
    expect((await clock(sid, { action: 'start', fast: '25:00' })).status).toBe(400);
    expect(readClockNow(getSessionById(sid)!).state).toBe('not-started');
  });
});

const report = (sid: string, runId: string, body: unknown) =>
  reportAction(json(`/api/sessions/${sid}/runs/${runId}/reports`, body), ctx({ sessionId: sid, runId }));

describe('reports from the session', () => {
  it('needs a started clock; stores fast and real time; the operator reports their own run, corrects it; the state shows the delay', async () => {
    const { w, s, sid } = setup();
    const [mine, other] = s.runIds;
    signInAs(w.operator);
    expect((await report(sid, mine, { kind: 'departed' })).status).toBe(400);

    signInAs(w.host);
    // 06:10 at 4:1 is 600 fast s = 150 real s into the session; the run is planned to leave at 60 s.
    // Set before a start, the clock waits (paused) at that time: reports are then made exactly at it.
    await clock(sid, { action: 'set', fast: '06:10' });

    signInAs(w.operator);
    const before = Date.now();
    const departed = await report(sid, mine, { kind: 'departed' });
    expect(departed.status).toBe(201);
    const body: { seq: number; state: LiveState } = await departed.json();
    expect(body.seq).toBe(2);
    const run = body.state.runs.find((r) => r.id === mine)!;
    expect(run).toMatchObject({ status: 'running', departS: 150, departDelayS: 90, plannedDepartS: 60 });
    const [stored] = listReports(sid);
    expect(stored).toMatchObject({ kind: 'departed', sessionS: 150, byUserId: w.operator.id, correction: false });
    expect(stored!.reportedAt.getTime()).toBeGreaterThanOrEqual(before);

    // Not theirs: 403. A planner may report but not correct.
    expect((await report(sid, other, { kind: 'departed' })).status).toBe(403);
    signInAs(w.planner);
    expect((await report(sid, mine, { kind: 'departed', fast: '06:05' })).status).toBe(403);
    // A double press is refused and changes nothing.
    expect((await report(sid, mine, { kind: 'departed' })).status).toBe(400);

    signInAs(w.operator);
    const corrected: { state: LiveState } = await (await report(sid, mine, { kind: 'departed', fast: '06:06' })).json();
    // 06:06 = 360 fast s = 90 real s: 30 s late.
    expect(corrected.state.runs.find((r) => r.id === mine)).toMatchObject({ departS: 90, departDelayS: 30 });

    expect((await report(sid, mine, { kind: 'stopped' })).status).toBe(400);
    const stopped: { state: LiveState } = await (await report(sid, mine, { kind: 'stopped', reason: 'derailed' })).json();
    expect(stopped.state.runs.find((r) => r.id === mine)).toMatchObject({ status: 'stopped', actual: { stop: { reason: 'derailed', fromS: 150 } } });
    expect((await report(sid, mine, { kind: 'departed' })).status).toBe(201);
    const arrived: { state: LiveState } = await (await report(sid, mine, { kind: 'arrived' })).json();
    expect(arrived.state.runs.find((r) => r.id === mine)).toMatchObject({ status: 'arrived', actual: { arriveS: 150 } });
    expect((await report(sid, mine, { kind: 'stopped', reason: 'stalled' })).status).toBe(400);

    // The host withdraws the arrival.
    signInAs(w.host);
    const withdrawn: { state: LiveState } = await (await report(sid, mine, { kind: 'arrived', withdraw: true })).json();
    expect(withdrawn.state.runs.find((r) => r.id === mine)!.actual.arriveS).toBeNull();
  });
});
