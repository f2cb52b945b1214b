import { describe, expect, it } from 'vitest';
import { POST as clockAction } from '@/app/api/sessions/[sessionId]/clock/route';
import { GET as reportHistory, POST as reportAction } from '@/app/api/sessions/[sessionId]/runs/[runId]/reports/route';
import { listReports } from '@/db/queries/live';
import type { LiveState } from '@/lib/live/types';
import { closeDb } from '@/db';
import { readClockNow } from '@/lib/live/clock';
import { getSessionById } from '@/db/queries/session-records';
import { GET as liveRoute } from '@/app/api/sessions/[sessionId]/live/route';
import { GET as reportRoute } from '@/app/api/sessions/[sessionId]/report/route';
import Papa from 'papaparse';
import { GET as proposeRepair, POST as repairAction } from '@/app/api/sessions/[sessionId]/repair/route';
import { getDb } from '@/db';
import * as t from '@/db/schema';
import { followingSession } from './authz/live';
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

describe('correcting reports', () => {
  it('the host corrects a time and withdraws a report; the run’s history names who did what; the railway’s audit keeps each correction', async () => {
    const { w, s, sid } = setup();
    const [mine, other] = s.runIds;
    const history = async (runId: string) => reportHistory(new Request(url(`/api/sessions/${sid}/runs/${runId}/reports`)), ctx({ sessionId: sid, runId }));
    signInAs(w.host);
    await clock(sid, { action: 'set', fast: '06:10' });
    signInAs(w.operator);
    expect((await report(sid, mine, { kind: 'departed' })).status).toBe(201);
    signInAs(w.host);
    // 06:04 at 4:1 from 06:00 is 240 fast s = 60 real s: the planned departure, so no delay.
    const corrected: { state: LiveState } = await (await report(sid, mine, { kind: 'departed', fast: '06:04' })).json();
    expect(corrected.state.runs.find((r) => r.id === mine)).toMatchObject({ departS: 60, departDelayS: 0, actual: { departS: 60 } });
    const withdrawn: { state: LiveState } = await (await report(sid, mine, { kind: 'departed', withdraw: true })).json();
    expect(withdrawn.state.runs.find((r) => r.id === mine)!.actual.departS).toBeNull();

    signInAs(w.operator);
    const answer = await history(mine);
    expect(answer.status).toBe(200);
    const body: { reports: { kind: string; fast: string; by: string; correction: boolean; withdrawn: boolean }[] } = await answer.json();
    expect(body.reports.map((r) => [r.kind, r.fast, r.by, r.correction, r.withdrawn])).toEqual([
      ['departed', '06:10', w.operator.name, false, false],
      ['departed', '06:04', w.host.name, true, false],
      ['departed', '06:10', w.host.name, true, true],
    ]);
    // Another operator's run: refused.
    expect((await history(other)).status).toBe(403);
    const audit = getDb().select().from(t.auditLog).all().filter((a) => a.entityId === mine);
    expect(audit.map((a) => [a.action, a.userId])).toEqual([
      ['report-correct', w.host.id],
      ['report-withdraw', w.host.id],
    ]);
  });
});

async function readUntil(reader: ReadableStreamDefaultReader<Uint8Array>, pattern: RegExp): Promise<string> {
  const decoder = new TextDecoder();
  let text = '';
  while (!pattern.test(text)) {
    const { value, done } = await reader.read();
    if (done) break;
    text += decoder.decode(value);
  }
  return text;
}

describe('live updates and the host’s repair', () => {
  it('a late departure creates a block clash; the host repairs the runs not yet departed; planned times stay', async () => {
    const { w } = setup();
    const f = followingSession(w);
    signInAs(w.host);
    // Clock at 06:10 (150 real s at 4:1), paused: the leader leaves 90 s late.
    await clock(f.sid, { action: 'set', fast: '06:10' });
    signInAs(w.operator);
    const late: { state: LiveState } = await (await report(f.sid, f.leader, { kind: 'departed' })).json();
    expect(late.state.newFindings.map((x) => x.kind)).toContain('block-overlap');
    const follower = late.state.runs.find((r) => r.id === f.follower)!;
    expect(late.state.repair.map((m) => m.runId)).toEqual([f.follower]);

    // Operators may not repair; the planner may not either (the host does).
    const body = { moves: late.state.repair.map((m) => ({ runId: m.runId, delayS: m.delayS })) };
    const post = (b: unknown) => repairAction(json(`/api/sessions/${f.sid}/repair`, b), ctx({ sessionId: f.sid }));
    signInAs(w.planner);
    expect((await post(body)).status).toBe(403);
    signInAs(w.host);
    expect((await post({ moves: [{ runId: f.follower, delayS: 99_999 }] })).status).toBe(400);
    expect((await post({ moves: [{ runId: f.leader, delayS: 10 }] })).status).toBe(409);
    const proposed = await (await proposeRepair(new Request(url(`/api/sessions/${f.sid}/repair`)), ctx({ sessionId: f.sid }))).json();
    expect(proposed.moves).toEqual(late.state.repair);

    const repaired: { state: LiveState } = await (await post(body)).json();
    expect(repaired.state.newFindings).toEqual([]);
    expect(repaired.state.repair).toEqual([]);
    const moved = repaired.state.runs.find((r) => r.id === f.follower)!;
    expect(moved.repairS).toBeGreaterThan(0);
    expect(moved.plannedDepartS).toBe(follower.plannedDepartS);
    expect(moved.departS).toBeCloseTo(follower.plannedDepartS + moved.repairS, 3);
    // The leader, under way, did not move.
    expect(repaired.state.runs.find((r) => r.id === f.leader)!.repairS).toBe(0);
    // The stored timetable is untouched.
    expect(getDb().select().from(t.runs).all().find((r) => r.id === f.follower)!.departS).toBe(f.second.departS);
  });

  it('streams events to an open stream, catches up from Last-Event-ID, and answers polls; operators only where invited', async () => {
    const { w, s, sid } = setup();
    signInAs(w.host);
    await clock(sid, { action: 'set', fast: '06:10' });

    signInAs(w.operator);
    const abort = new AbortController();
    const res = await liveRoute(new Request(url(`/api/sessions/${sid}/live`), { headers: { accept: 'text/event-stream' }, signal: abort.signal }), ctx({ sessionId: sid }));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/text\/event-stream/);
    const reader = res.body!.getReader();
    const hello = await readUntil(reader, /"type":"hello"[\s\S]*\n\n/);
    expect(hello).toMatch(/^retry: 2000/);
    expect(hello).toMatch(/id: 1\nevent: live\ndata: /);

    await report(sid, s.runIds[0], { kind: 'departed' });
    const next = await readUntil(reader, /id: 2\n[\s\S]*\n\n/);
    const data = JSON.parse(next.split('\n').find((l) => l.startsWith('data: '))!.slice(6));
    expect(data).toMatchObject({ seq: 2, type: 'report' });
    expect(data.summary).toMatch(/departed at 06:10, 6 fast min late/);
    expect(data.state.runs.find((r: { id: string }) => r.id === s.runIds[0]).status).toBe('running');
    abort.abort();

    // Reconnecting after event 1: gets event 2 (missed), then the state.
    const again = await liveRoute(
      new Request(url(`/api/sessions/${sid}/live`), { headers: { accept: 'text/event-stream', 'last-event-id': '1' }, signal: new AbortController().signal }),
      ctx({ sessionId: sid }),
    );
    const caught = await readUntil(again.body!.getReader(), /id: 2\n[\s\S]*\n\n/);
    expect(caught).not.toMatch(/"type":"hello"/);
    expect(caught).toMatch(/"seq":2,"type":"report"/);

    const poll = await (await liveRoute(new Request(url(`/api/sessions/${sid}/live?after=1`)), ctx({ sessionId: sid }))).json();
    expect(poll.seq).toBe(2);
    expect(poll.events.map((e: { seq: number }) => e.seq)).toEqual([2]);
    expect(poll.state.clock.fast).toBe('06:10');
    expect((await liveRoute(new Request(url(`/api/sessions/${sid}/live?after=-3`)), ctx({ sessionId: sid }))).status).toBe(400);

    // Someone not invited to a published session of their railway sees nothing of it.
    const stranger = w.makeUser('stranger');
    const { addMember } = await import('@/db/queries/memberships');
    addMember(w.railway.id, stranger.id, 'operator');
    signInAs(stranger);
    expect((await liveRoute(new Request(url(`/api/sessions/${sid}/live`)), ctx({ sessionId: sid }))).status).toBe(404);
  });
});

describe('the report after the session', () => {
  it('puts planned against actual, counts punctuality, and says where the delay began', async () => {
    const { w } = setup();
    const f = followingSession(w);
    signInAs(w.host);
    await clock(f.sid, { action: 'set', fast: '06:10' });
    // The leader leaves 90 s (6 fast min at 4:1) late and arrives; the follower, held by it, leaves
    // when it can (its own lateness handed on), and arrives.
    await report(f.sid, f.leader, { kind: 'departed' });
    await report(f.sid, f.leader, { kind: 'arrived', fast: '06:20' });
    await report(f.sid, f.follower, { kind: 'departed', fast: '06:22' });

    const res = await reportRoute(new Request(url(`/api/sessions/${f.sid}/report?punctualMin=3`)), ctx({ sessionId: f.sid }));
    expect(res.status).toBe(200);
    const body = await res.json();
    const leader = body.runs.find((r: { runId: string }) => r.runId === f.leader);
    expect(leader).toMatchObject({ actualDepart: '06:10', departDelayFastMin: 6, actualArrive: '06:20', punctual: false, delayBeganFastMin: 6 });
    expect(body.punctuality).toMatchObject({ departed: 2 });
    // The delay began in block A, where the leader started (a stop-free late start).
    expect(body.delaysBeganIn[0]).toMatchObject({ name: 'Block A' });
    expect(body.delayByTrain.map((t: { name: string }) => t.name)).toContain('Morning stopper');
    const graphLeader = body.graph.find((g: { runId: string }) => g.runId === f.leader);
    expect(graphLeader.actual[0].enterS - graphLeader.planned[0].enterS).toBeCloseTo(90, 3);

    const csv = await reportRoute(new Request(url(`/api/sessions/${f.sid}/report?format=csv`)), ctx({ sessionId: f.sid }));
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/);
    const parsed = Papa.parse<Record<string, string>>(await csv.text(), { header: true, skipEmptyLines: true });
    expect(parsed.data).toHaveLength(2);
    expect(parsed.data.find((r) => r.runId === f.leader)).toMatchObject({ actualDepart: '06:10', departDelayFastMin: '6', punctual: 'false' });
    expect((await reportRoute(new Request(url(`/api/sessions/${f.sid}/report?format=xml`)), ctx({ sessionId: f.sid }))).status).toBe(400);
  });
});
