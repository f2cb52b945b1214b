import { and, eq } from 'drizzle-orm';
import { describe, expect, it, vi } from 'vitest';
import { getDb } from '@/db';
import { listClockEvents, listReports } from '@/db/queries/live';
import * as t from '@/db/schema';
import type { Member } from '@/lib/auth';
import { AppError } from '@/lib/errors';
import { applyClockAction, clockView, MAX_CLOCK_ACTIONS, readClockNow } from '@/lib/live/clock';
import { CATCH_UP_LIMIT, catchUpFrames, eventFrame, liveSubscriberCount, publishLive, subscribeLive } from '@/lib/live/hub';
import { buildSessionReport, reportCsv } from '@/lib/live/report';
import { makeReport, MAX_REPORTS, runReportHistory } from '@/lib/live/reports';
import { lastEventIdOf, livePoll, liveStream, MAX_STREAMS } from '@/lib/live/stream';
import { applyRepair, assertHost } from '@/lib/live/repair';
import { buildLiveState, liveStateJson } from '@/lib/live/state';
import { insertRuns } from '@/db/queries/runs';
import { getSessionById } from '@/db/queries/session-records';
import { followingSession, sessionWithRuns } from './authz/live';
import { makeSessionWorld, timedSteps } from './authz/sessions';
import { makeWorld } from './world';

// The session world (tests/integration/authz/sessions.ts): a 4:1 fast clock from 06:00; run 0 of
// "Morning stopper" (the world's operator's) leaves at 60 s, run 1 of "Evening goods" (no operator)
// at 65 s. Times are injected (nowMs), never waited for.
const T0 = Date.UTC(2031, 3, 12, 18, 0, 0);
const at = (realS: number) => T0 + realS * 1000;

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  const as = (user: Member['user'], role: Member['role']): Member => ({ user, railwayId: w.railway.id, role });
  return { w, s, session: s.session, sid: s.session.id, host: as(w.host, 'host'), planner: as(w.planner, 'planner'), operator: as(w.operator, 'operator') };
}

/** The AppError a call throws (fails the test when it throws nothing or something else). */
function refusal(call: () => unknown): AppError {
  try {
    call();
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error('expected a refusal');
}

describe('the shared fast clock (lib/live/clock.ts)', () => {
  it('words each action with the fast time it happened at and who did it; pause and resume store no time', () => {
    const { sid, session, planner, host } = setup();
    // Fast clock ratio arithmetic (common practice): at 4:1, 60 real s are 240 fast s = 4 fast min.
    const started = applyClockAction(session, planner, { action: 'start' }, at(0));
    expect(started.live).toMatchObject({ seq: 1, type: 'clock', summary: `Clock started at 06:00 by ${planner.user.name}` });
    expect(started.event).toMatchObject({ action: 'start', sessionS: 0, byUserId: planner.user.id });
    expect(started.event.at.getTime()).toBe(at(0));
    const paused = applyClockAction(session, host, { action: 'pause' }, at(60));
    expect(paused.live.summary).toBe(`Clock paused at 06:04 by ${host.user.name}`);
    expect(paused.event.sessionS).toBeNull();
    // Paused for a minute: it still reads 06:04.
    expect(applyClockAction(session, host, { action: 'resume' }, at(120)).live.summary).toBe(`Clock resumed at 06:04 by ${host.user.name}`);
    const set = applyClockAction(session, host, { action: 'set', fast: '07:00' }, at(150));
    // 07:00 is 3600 fast s after 06:00 = 900 real s at 4:1.
    expect(set.event.sessionS).toBe(900);
    expect(set.live).toMatchObject({ seq: 4, summary: `Clock set to 07:00 by ${host.user.name}` });

    // 30 real s after the set: 930 s, 06:00 + 3720 fast s = 07:02.
    const view = clockView(session, listClockEvents(sid), at(180));
    expect(view).toEqual({
      records: [
        { action: 'start', atMs: at(0), sessionS: 0 },
        { action: 'pause', atMs: at(60), sessionS: null },
        { action: 'resume', atMs: at(120), sessionS: null },
        { action: 'set', atMs: at(150), sessionS: 900 },
      ],
      clock: { ratio: 4, fastStart: '06:00' },
      serverMs: at(180),
      state: 'running',
      sessionS: 930,
      fast: '07:02',
    });
    expect(readClockNow(session, at(180))).toMatchObject({ state: 'running', sessionS: 930 });
  });

  it('a start at a typed time starts there; a refused action names the field and stores nothing', () => {
    const { sid, session, host } = setup();
    // 06:30 is 1800 fast s = 450 real s at 4:1.
    expect(applyClockAction(session, host, { action: 'start', fast: '06:30' }, at(0)).live.summary).toBe(`Clock started at 06:30 by ${host.user.name}`);
    const error = refusal(() => applyClockAction(session, host, { action: 'resume' }, at(10)));
    expect(error.code).toBe('bad_request');
    expect(error.message).toBe('The clock is already running.');
    expect(error.extra.issues).toEqual([{ path: 'action', message: 'The clock is already running.' }]);
    expect(listClockEvents(sid)).toHaveLength(1);
    expect(readClockNow(session, at(10)).sessionS).toBe(460);
  });

  it(`takes ${MAX_CLOCK_ACTIONS} actions and refuses the one after`, () => {
    const { sid, session, host } = setup();
    const rows = Array.from({ length: MAX_CLOCK_ACTIONS - 1 }, (_, i) => ({ sessionId: sid, action: 'set' as const, at: new Date(at(i)), sessionS: i, byUserId: host.user.id }));
    for (let i = 0; i < rows.length; i += 100) getDb().insert(t.clockEvents).values(rows.slice(i, i + 100)).run();
    expect(applyClockAction(session, host, { action: 'set', fast: '08:00' }, at(1000)).live.seq).toBe(1);
    const error = refusal(() => applyClockAction(session, host, { action: 'set', fast: '09:00' }, at(1001)));
    expect(error.message).toBe(`This session's clock has had ${MAX_CLOCK_ACTIONS} actions; no more can be stored.`);
    expect(listClockEvents(sid)).toHaveLength(MAX_CLOCK_ACTIONS);
  });
});

describe('reports from operators (lib/live/reports.ts)', () => {
  it('refuses every report before the clock starts, and a run the session does not have', () => {
    const { session, s, operator, host } = setup();
    const error = refusal(() => makeReport(session, operator, s.runIds[0], { kind: 'departed' }, at(0)));
    expect([error.code, error.message]).toEqual(['bad_request', 'The session’s clock has not started yet.']);
    applyClockAction(session, host, { action: 'start' }, at(0));
    expect(refusal(() => makeReport(session, host, 'no-such-run', { kind: 'departed' }, at(1))).code).toBe('not_found');
    expect(listReports(session.id)).toEqual([]);
  });

  it('says how late or early a departure is in whole fast minutes (rounded) against the timetable in force', () => {
    // Fast clock ratio arithmetic (common practice): at 4:1 a real second is 4 fast seconds; the run is planned at 60 s.
    const cases: [number, string][] = [
      [60, ', on time'],
      [67, ', on time'], // 28 fast s
      [68, ', 1 fast min late'], // 32 fast s rounds up
      [150, ', 6 fast min late'], // 90 s late = 6 fast min
      [30, ', 2 fast min early'], // 30 s early = 2 fast min
    ];
    for (const [realS, lateness] of cases) {
      const { session, s, operator } = setup();
      applyClockAction(session, operator, { action: 'start' }, at(0));
      const { live, report } = makeReport(session, operator, s.runIds[0], { kind: 'departed' }, at(realS));
      const fast = new Date((6 * 3600 + realS * 4) * 1000).toISOString().slice(11, 16);
      expect(live.summary).toBe(`Morning stopper departed at ${fast}${lateness}`);
      expect(report).toMatchObject({ kind: 'departed', sessionS: realS, reason: null, correction: false, withdrawn: false, byUserId: operator.user.id });
      expect(report.reportedAt.getTime()).toBe(at(realS));
    }
    // A repair of 90 s moved the run to 150 s: leaving then is on time.
    const { session, s, operator, host } = setup();
    getDb().insert(t.runRepairs).values({ sessionId: session.id, runId: s.runIds[0], delayS: 90, appliedAt: new Date(at(0)), byUserId: host.user.id }).run();
    applyClockAction(session, operator, { action: 'start' }, at(0));
    expect(makeReport(session, operator, s.runIds[0], { kind: 'departed' }, at(150)).live.summary).toBe('Morning stopper departed at 06:10, on time');
  });

  it('words stops, arrivals, corrections and withdrawals, and keeps an audit of corrections', () => {
    const { session, s, operator, host, w } = setup();
    const mine = s.runIds[0];
    applyClockAction(session, host, { action: 'start' }, at(0));
    makeReport(session, operator, mine, { kind: 'departed' }, at(60));
    expect(makeReport(session, operator, mine, { kind: 'stopped' }, at(75)).live.summary).toBe('Morning stopper stopped — needs help at 06:05');
    expect(makeReport(session, operator, mine, { kind: 'departed' }, at(90)).live.summary).toBe('Morning stopper departed at 06:06, 2 fast min late');
    const stopped = makeReport(session, operator, mine, { kind: 'stopped', reason: 'derailed' }, at(120));
    expect(stopped.live.summary).toBe('Morning stopper stopped — derailed at 06:08');
    expect(stopped.report.reason).toBe('derailed');
    expect(makeReport(session, operator, mine, { kind: 'arrived' }, at(240)).live.summary).toBe('Morning stopper arrived at 06:16');

    // The run's operator corrects the departure to 06:05 (75 s: 15 s = 1 fast min late).
    const corrected = makeReport(session, operator, mine, { kind: 'departed', fast: '06:05' }, at(250));
    expect(corrected.live.summary).toBe(`Morning stopper departed at 06:05, 1 fast min late (corrected by ${operator.user.name})`);
    expect(corrected.report).toMatchObject({ sessionS: 75, correction: true, withdrawn: false });
    // The host withdraws the arrival.
    const withdrawn = makeReport(session, host, mine, { kind: 'arrived', withdraw: true }, at(260));
    expect(withdrawn.live.summary).toBe(`Morning stopper: “arrived” withdrawn by ${host.user.name}`);
    expect(withdrawn.report).toMatchObject({ kind: 'arrived', correction: true, withdrawn: true, sessionS: 260 });
    // A withdrawal of what is not there is refused, naming the field.
    const error = refusal(() => makeReport(session, host, mine, { kind: 'arrived', withdraw: true }, at(270)));
    expect(error.message).toBe('There is no “arrived” report to withdraw.');
    expect(error.extra.issues).toEqual([{ path: 'kind', message: 'There is no “arrived” report to withdraw.' }]);
    // A typed stop time corrects the latest stop (the one the withdrawn arrival had ended).
    expect(makeReport(session, host, mine, { kind: 'stopped', fast: '06:07' }, at(280)).report.correction).toBe(true);

    const audit = getDb().select().from(t.auditLog).where(eq(t.auditLog.entityId, mine)).all();
    expect(audit.map((a) => [a.action, a.userId, a.entity, a.railwayId])).toEqual([
      ['report-correct', operator.user.id, 'run', w.railway.id],
      ['report-withdraw', host.user.id, 'run', w.railway.id],
      ['report-correct', host.user.id, 'run', w.railway.id],
    ]);
    const detail = (i: number) => audit[i]!.detail;
    expect(detail(0)).toEqual({ sessionId: session.id, kind: 'departed', fast: '06:05', reportId: corrected.report.id });
    expect(detail(1)).toEqual({ sessionId: session.id, kind: 'arrived', reportId: withdrawn.report.id });
  });

  it('lets the run’s operator, a planner or the host report; only the operator or the host correct', () => {
    const { session, s, operator, planner, host } = setup();
    applyClockAction(session, host, { action: 'start' }, at(0));
    const notYours = refusal(() => makeReport(session, operator, s.runIds[1], { kind: 'departed' }, at(65)));
    expect([notYours.code, notYours.message]).toEqual(['forbidden', 'Your role on this railway does not allow you to report for a run that is not yours.']);
    expect(makeReport(session, planner, s.runIds[1], { kind: 'departed' }, at(65)).live.summary).toBe('Evening goods departed at 06:04, on time');
    expect(refusal(() => makeReport(session, planner, s.runIds[1], { kind: 'departed', fast: '06:05' }, at(70))).message).toBe(
      'Your role on this railway does not allow you to correct a report (the run’s operator or the host can).',
    );
    expect(refusal(() => makeReport(session, planner, s.runIds[1], { kind: 'departed', withdraw: true }, at(70))).code).toBe('forbidden');
    expect(makeReport(session, host, s.runIds[1], { kind: 'departed', withdraw: true }, at(70)).report.withdrawn).toBe(true);
    // No audit row for a plain report.
    expect(getDb().select().from(t.auditLog).where(eq(t.auditLog.entityId, s.runIds[1])).all().map((a) => a.action)).toEqual(['report-withdraw']);
  });

  it(`keeps ${MAX_REPORTS} reports a session and refuses the one after`, () => {
    const { session, s, host } = setup();
    applyClockAction(session, host, { action: 'start' }, at(0));
    // Reports of the other run, so that run 0 may still depart.
    const rows = Array.from({ length: MAX_REPORTS - 1 }, (_, i) => ({
      sessionId: session.id,
      runId: s.runIds[1],
      kind: 'departed' as const,
      sessionS: i,
      reportedAt: new Date(at(0)),
      byUserId: host.user.id,
    }));
    for (let i = 0; i < rows.length; i += 500) getDb().insert(t.runReports).values(rows.slice(i, i + 500)).run();
    makeReport(session, host, s.runIds[0], { kind: 'departed' }, at(60));
    const error = refusal(() => makeReport(session, host, s.runIds[0], { kind: 'arrived' }, at(61)));
    expect(error.message).toBe(`This session already has ${MAX_REPORTS} reports.`);
  });

  it('a run’s history names who reported what (a former member when the account is gone); an operator reads only their own runs', () => {
    const { session, s, operator, planner, host } = setup();
    applyClockAction(session, host, { action: 'start' }, at(0));
    makeReport(session, planner, s.runIds[0], { kind: 'departed' }, at(64));
    makeReport(session, operator, s.runIds[0], { kind: 'stopped', reason: 'blocked' }, at(80));
    getDb().delete(t.users).where(eq(t.users.id, planner.user.id)).run();
    const history = runReportHistory(session, operator, s.runIds[0]);
    expect(history).toEqual({
      runId: s.runIds[0],
      reports: [
        { id: expect.any(String), kind: 'departed', reason: null, fast: '06:04', reportedAt: new Date(at(64)).toISOString(), by: 'a former member', correction: false, withdrawn: false },
        { id: expect.any(String), kind: 'stopped', reason: 'blocked', fast: '06:05', reportedAt: new Date(at(80)).toISOString(), by: operator.user.name, correction: false, withdrawn: false },
      ],
    });
    expect(refusal(() => runReportHistory(session, operator, s.runIds[1])).message).toBe('Your role on this railway does not allow you to read the reports of a run that is not yours.');
    expect(runReportHistory(session, host, s.runIds[1]).reports).toEqual([]);
    expect(refusal(() => runReportHistory(session, host, 'no-such-run')).code).toBe('not_found');
  });
});

// The event stream: WHATWG HTML Living Standard §9.2 "Server-sent events" (event stream
// interpretation: `id:`, `event:`, `data:` fields, a blank line dispatches the event; `retry:` sets
// the reconnection time; a line starting with a colon is a comment; the Last-Event-ID header on
// reconnection).
describe('the event stream hub (lib/live/hub.ts)', () => {
  const addEvents = (sessionId: string, from: number, to: number) => {
    const rows = [];
    for (let seq = from; seq <= to; seq++) rows.push({ sessionId, seq, type: 'report', summary: `event ${seq}`, at: new Date(at(seq)) });
    for (let i = 0; i < rows.length; i += 200) getDb().insert(t.liveEvents).values(rows.slice(i, i + 200)).run();
  };

  it('writes one event as id, event and data lines ended by a blank line, the state inside the data when given', () => {
    const event = { seq: 7, type: 'report', summary: 'Morning stopper departed', at: new Date(at(5)) };
    expect(eventFrame(event, null)).toBe(`id: 7\nevent: live\ndata: {"seq":7,"type":"report","summary":"Morning stopper departed","at":${at(5)}}\n\n`);
    expect(eventFrame(event, '{"seq":7}')).toBe(`id: 7\nevent: live\ndata: {"seq":7,"type":"report","summary":"Morning stopper departed","at":${at(5)},"state":{"seq":7}}\n\n`);
  });

  it('catches a client up on what it missed, the state on the last frame only; beyond the limit it is first told to reload', () => {
    const { sid } = setup();
    addEvents(sid, 1, 3);
    const frames = (text: string) => text.split('\n\n').filter(Boolean);
    const caught = catchUpFrames(sid, 1, '{"now":1}');
    expect(caught.lastSeq).toBe(3);
    expect(frames(caught.frames)).toEqual([
      `id: 2\nevent: live\ndata: {"seq":2,"type":"report","summary":"event 2","at":${at(2)}}`,
      `id: 3\nevent: live\ndata: {"seq":3,"type":"report","summary":"event 3","at":${at(3)},"state":{"now":1}}`,
    ]);
    expect(catchUpFrames(sid, 3, '{}')).toEqual({ frames: '', lastSeq: 3 });

    // Exactly CATCH_UP_LIMIT missed: all of them, no reload.
    addEvents(sid, 4, CATCH_UP_LIMIT + 3);
    const all = frames(catchUpFrames(sid, 3, '{}').frames);
    expect(all).toHaveLength(CATCH_UP_LIMIT);
    expect(all[0]).toMatch(/^id: 4\n/);
    // One more: the reload event first, then the last CATCH_UP_LIMIT.
    const over = catchUpFrames(sid, 2, '{"now":2}');
    const list = frames(over.frames);
    expect(list).toHaveLength(CATCH_UP_LIMIT + 1);
    expect(list[0]).toBe('event: reload\ndata: {}');
    expect(list[1]).toMatch(/^id: 4\n/);
    expect(list.at(-1)).toMatch(new RegExp(`^id: ${CATCH_UP_LIMIT + 3}\\n.*"state":\\{"now":2\\}\\}$`, 's'));
    expect(over.lastSeq).toBe(CATCH_UP_LIMIT + 3);
  });

  it('publishes each change once to every open stream behind it, several changes of a tick together; counts and forgets subscribers', async () => {
    const { sid, session, host } = setup();
    const before = liveSubscriberCount();
    const behind: string[] = [];
    const current: string[] = [];
    const broken = { lastSeq: 0, write: () => { throw new Error('closed'); } };
    const a = { lastSeq: 0, write: (chunk: string) => void behind.push(chunk) };
    const b = { lastSeq: 0, write: (chunk: string) => void current.push(chunk) };
    const off = [subscribeLive(sid, broken), subscribeLive(sid, a), subscribeLive(sid, b)];
    expect(liveSubscriberCount()).toBe(before + 3);

    applyClockAction(session, host, { action: 'start' }, Date.now());
    b.lastSeq = 1; // b has read event 1 already
    publishLive(sid);
    applyClockAction(session, host, { action: 'pause' }, Date.now());
    publishLive(sid);
    await new Promise((resolve) => setImmediate(resolve));
    // One write to each, with both events for a and the second for b; the state on the last frame.
    expect(behind).toHaveLength(1);
    expect(behind[0]).toMatch(/^id: 1\nevent: live\ndata: \{"seq":1,"type":"clock","summary":"Clock started at 06:00 by [^"]+","at":\d+\}\n\nid: 2\n.*"state":\{"seq":2,/s);
    expect(current).toHaveLength(1);
    expect(current[0]).toMatch(/^id: 2\nevent: live\ndata: \{"seq":2,"type":"clock","summary":"Clock paused at/);
    expect([a.lastSeq, b.lastSeq, broken.lastSeq]).toEqual([2, 2, 2]);

    // Nothing new: nothing written.
    publishLive(sid);
    await new Promise((resolve) => setImmediate(resolve));
    expect([behind.length, current.length]).toEqual([1, 1]);

    for (const unsubscribe of off) unsubscribe();
    off[0]!();
    expect(liveSubscriberCount()).toBe(before);
    // No stream open: publishing does nothing (not even build the state).
    applyClockAction(session, host, { action: 'resume' }, Date.now());
    publishLive(sid);
    await new Promise((resolve) => setImmediate(resolve));
    expect(behind).toHaveLength(1);
  });

  it('keeps publishing to the streams still open when one closes, and does nothing when the last closed before the change went out', async () => {
    const { sid, session, host } = setup();
    const kept: string[] = [];
    const closing = subscribeLive(sid, { lastSeq: 0, write: () => {} });
    const off = subscribeLive(sid, { lastSeq: 0, write: (chunk) => void kept.push(chunk) });
    closing();
    applyClockAction(session, host, { action: 'start' }, Date.now());
    publishLive(sid);
    await new Promise((resolve) => setImmediate(resolve));
    expect(kept).toHaveLength(1);
    expect(kept[0]).toMatch(/^id: 1\n/);

    const logged = vi.spyOn(console, 'error').mockImplementation(() => {});
    applyClockAction(session, host, { action: 'pause' }, Date.now());
    publishLive(sid);
    off();
    await new Promise((resolve) => setImmediate(resolve));
    expect(logged).not.toHaveBeenCalled();
    logged.mockRestore();
    expect(kept).toHaveLength(1);
  });

  it('logs a change it could not publish and goes on', async () => {
    const { sid, session, host } = setup();
    const written: string[] = [];
    const off = subscribeLive(sid, { lastSeq: 0, write: (chunk) => void written.push(chunk) });
    applyClockAction(session, host, { action: 'start' }, Date.now());
    // The session is gone by the time the change is published: its state cannot be built.
    getDb().delete(t.sessions).where(eq(t.sessions.id, sid)).run();
    const logged = vi.spyOn(console, 'error').mockImplementation(() => {});
    publishLive(sid);
    await new Promise((resolve) => setImmediate(resolve));
    expect(logged).toHaveBeenCalledWith('live: could not publish', expect.any(Error));
    logged.mockRestore();
    expect(written).toEqual([]);
    off();
  });
});

describe('the stream and the poll (lib/live/stream.ts)', () => {
  const request = (headers: Record<string, string> = {}, query = '', signal?: AbortSignal) => new Request(`http://127.0.0.1:3999/api/sessions/x/live${query}`, { headers, signal });

  it('reads the last event id from the Last-Event-ID header, else from ?after=, as up to 15 digits', () => {
    expect(lastEventIdOf(request({ 'last-event-id': '12' }, '?after=3'))).toBe(12);
    expect(lastEventIdOf(request({ 'last-event-id': ' 7 ' }))).toBe(7);
    expect(lastEventIdOf(request({}, '?after=3'))).toBe(3);
    expect(lastEventIdOf(request({}, '?after=%203%20'))).toBe(3);
    expect(lastEventIdOf(request())).toBeNull();
    expect(lastEventIdOf(request({ 'last-event-id': '' }))).toBeNull();
    expect(lastEventIdOf(request({ 'last-event-id': 'x12' }))).toBeNull();
    expect(lastEventIdOf(request({ 'last-event-id': '12x' }))).toBeNull();
    expect(lastEventIdOf(request({ 'last-event-id': '-1' }))).toBeNull();
    expect(lastEventIdOf(request({ 'last-event-id': '123456789012345' }))).toBe(123456789012345);
    expect(lastEventIdOf(request({ 'last-event-id': '1234567890123456' }))).toBeNull();
  });

  it('greets a new client with the state as a hello numbered with the last event, then streams; pings an idle stream; stops on abort', async () => {
    const { sid, session, host } = setup();
    applyClockAction(session, host, { action: 'start' }, Date.now());
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    try {
      const abort = new AbortController();
      const before = liveSubscriberCount();
      // A client that has read everything (after = last) is greeted the same way.
      const res = liveStream(sid, request({ 'last-event-id': '1' }, '', abort.signal));
      expect(Object.fromEntries(res.headers)).toEqual({
        'content-type': 'text/event-stream; charset=utf-8',
        'cache-control': 'no-cache, no-transform',
        connection: 'keep-alive',
        'x-accel-buffering': 'no',
      });
      const reader = res.body!.getReader();
      const decoder = new TextDecoder();
      const next = async () => decoder.decode((await reader.read()).value);
      const hello = await next();
      expect(hello).toMatch(/^retry: 2000\n\nid: 1\nevent: live\ndata: \{"seq":1,"type":"hello","summary":"","at":\d+,"state":\{"seq":1,/);
      expect(hello.endsWith('}\n\n')).toBe(true);
      expect(liveSubscriberCount()).toBe(before + 1);

      vi.advanceTimersByTime(15_000);
      expect(await next()).toBe(': ping\n\n');

      applyClockAction(session, host, { action: 'pause' }, Date.now());
      publishLive(sid);
      expect(await next()).toMatch(/^id: 2\nevent: live\ndata: \{"seq":2,"type":"clock"/);

      abort.abort();
      expect(await reader.read()).toEqual({ done: true, value: undefined });
      expect(liveSubscriberCount()).toBe(before);
      // The heartbeat stopped with it.
      expect(vi.getTimerCount()).toBe(0);
    } finally {
      vi.useRealTimers();
    }
  });

  it('a reconnecting client gets what it missed instead of a hello; a cancelled stream is forgotten', async () => {
    const { sid, session, host } = setup();
    applyClockAction(session, host, { action: 'start' }, Date.now());
    applyClockAction(session, host, { action: 'pause' }, Date.now());
    const before = liveSubscriberCount();
    const res = liveStream(sid, request({}, '?after=1'));
    const reader = res.body!.getReader();
    const text = new TextDecoder().decode((await reader.read()).value);
    expect(text).toMatch(/^retry: 2000\n\nid: 2\nevent: live\ndata: \{"seq":2,"type":"clock","summary":"Clock paused at [^"]+","at":\d+,"state":\{"seq":2,/);
    expect(text).not.toMatch(/hello/);
    expect(liveSubscriberCount()).toBe(before + 1);
    await reader.cancel();
    expect(liveSubscriberCount()).toBe(before);
  });

  it(`serves at most ${MAX_STREAMS} streams; the one after is told to poll`, () => {
    const { sid } = setup();
    const off: (() => void)[] = [];
    try {
      while (liveSubscriberCount() < MAX_STREAMS - 1) off.push(subscribeLive('elsewhere', { lastSeq: 0, write: () => {} }));
      const res = liveStream(sid, request());
      void res.body!.cancel();
      off.push(subscribeLive('elsewhere', { lastSeq: 0, write: () => {} }));
      const error = refusal(() => liveStream(sid, request()));
      expect([error.code, error.message, error.extra.retryAfterS]).toEqual(['rate_limited', 'Too many open live screens; the page will poll instead.', 5]);
    } finally {
      for (const unsubscribe of off) unsubscribe();
    }
  });

  it('answers a poll with the events after the number asked for and the state, never cached', async () => {
    const { sid, session, host } = setup();
    applyClockAction(session, host, { action: 'start' }, at(0));
    applyClockAction(session, host, { action: 'pause' }, at(60));
    const res = livePoll(sid, 1);
    expect(res.headers.get('content-type')).toBe('application/json');
    expect(res.headers.get('cache-control')).toBe('no-store');
    const body = await res.json();
    expect(body.seq).toBe(2);
    expect(body.events).toEqual([{ seq: 2, type: 'clock', summary: `Clock paused at 06:04 by ${host.user.name}`, at: at(60) }]);
    expect(body.state).toMatchObject({ seq: 2, session: { id: sid } });
    expect((await livePoll(sid, 0).json()).events.map((e: { seq: number }) => e.seq)).toEqual([1, 2]);
  });
});

describe('the live state (lib/live/state.ts)', () => {
  it('shows each run planned, in force (planned + the repairs so far), predicted and actual, with the open stop', () => {
    const { sid, session, s, host, operator } = setup();
    const [mine, other] = s.runIds;
    // Two repairs of the other run add up.
    for (const delayS of [30, 15]) getDb().insert(t.runRepairs).values({ sessionId: sid, runId: other, delayS, appliedAt: new Date(at(0)), byUserId: host.user.id }).run();
    applyClockAction(session, host, { action: 'start' }, at(0));
    makeReport(session, operator, mine, { kind: 'departed' }, at(62));
    makeReport(session, operator, mine, { kind: 'stopped', reason: 'stalled' }, at(64));
    const state = buildLiveState(sid, at(64));
    expect(state.seq).toBe(3);
    expect(state.session).toEqual({ id: sid, railwayId: session.railwayId, title: 'Test evening', status: 'published', standS: 60, punctualFastMin: 3 });
    expect(state.clock).toMatchObject({ state: 'running', sessionS: 64, serverMs: at(64) });
    expect(state.names.trains.map((x) => x.name).sort()).toEqual(['Evening goods', 'Morning stopper']);
    expect(state.names.cabs.map((x) => x.name)).toEqual(['Cab 1', 'Cab 2']);
    expect(state.names.blocks.map((x) => x.name)).toEqual(['Block A', 'Block B', 'Block C', 'Block D']);
    expect(state.names.operators.map((x) => x.id)).toContain(operator.user.id);
    const [first, second] = state.runs;
    expect(first).toMatchObject({ id: mine, trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, operatorId: operator.user.id, plannedDepartS: 60, repairS: 0, departS: 62, departDelayS: 2, status: 'stopped' });
    expect(first!.actual).toEqual({ departS: 62, arriveS: null, stop: { fromS: 64, reason: 'stalled' } });
    // The predicted steps, to the millisecond (shifted by the 2 s late start at least).
    expect(first!.steps[0]!.blockId).toBe(s.layout.blocks.A);
    expect(first!.steps.every((step) => step.enterS === Math.round(step.enterS * 1000) / 1000)).toBe(true);
    expect(second).toMatchObject({ id: other, plannedDepartS: 65, repairS: 45, departS: 110, status: 'waiting', actual: { departS: null, arriveS: null, stop: null } });
    // Its delay is against the timetable in force, which already has the repairs.
    expect(second!.departDelayS).toBe(0);
    // Moving again, the stop is closed: no open stop on the board.
    makeReport(session, operator, mine, { kind: 'departed' }, at(70));
    expect(buildLiveState(sid, at(70)).runs[0]!.actual.stop).toBeNull();
  });

  it('lists runs by planned departure, ties by id', () => {
    const { sid, s } = setup();
    const steps = timedSteps(s.layout, ['A', 'B'], 500);
    const ids = insertRuns(sid, [
      { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, operatorId: null, speedKmh: 60, note: '', ...steps },
      { trainId: s.layout.trains.t2, cabId: s.layout.cabs.c2, operatorId: null, speedKmh: 60, note: '', ...steps },
    ]);
    const order = buildLiveState(sid, at(0)).runs.map((r) => r.id);
    expect(order.slice(0, 2)).toEqual(s.runIds);
    expect(order.slice(2)).toEqual([...ids].sort((a, b) => a.localeCompare(b)));
  });

  it('names only the clashes a delay created, and proposes moving the runs not yet departed (common practice: keep what has left)', () => {
    const { w } = setup();
    const f = followingSession(w);
    const session = getSessionById(f.sid)!;
    const host: Member = { user: w.host, railwayId: w.railway.id, role: 'host' };
    applyClockAction(session, host, { action: 'start' }, at(0));
    // No delay, no clash: nothing to repair.
    const calm = buildLiveState(f.sid, at(10));
    expect([calm.newFindings, calm.repair]).toEqual([[], []]);
    // The leader leaves 90 s late: it runs into the follower's path.
    makeReport(session, host, f.leader, { kind: 'departed' }, at(150));
    const late = buildLiveState(f.sid, at(150));
    expect(late.newFindings.length).toBeGreaterThan(0);
    for (const finding of late.newFindings) {
      expect(finding).toEqual({ kind: expect.any(String), severity: 'error', ids: expect.arrayContaining([f.leader, f.follower]), fromS: expect.any(Number), toS: expect.any(Number), message: expect.any(String) });
      expect(finding.fromS).toBe(Math.round(finding.fromS * 1000) / 1000);
      expect(finding.toS).toBeGreaterThan(finding.fromS);
    }
    expect(late.repair).toHaveLength(1);
    const [move] = late.repair;
    expect(move!.runId).toBe(f.follower);
    expect(move!.newDepartS).toBeCloseTo(f.second.departS + move!.delayS, 3);
    expect(move!.delayS).toBe(Math.round(move!.delayS * 1000) / 1000);
    // Once the follower has left too, it is kept where it is: nothing left to propose.
    makeReport(session, host, f.follower, { kind: 'departed' }, at(151));
    expect(buildLiveState(f.sid, at(151)).repair).toEqual([]);
  });

  it('serves the same JSON for a second while nothing changes', () => {
    const { sid, session, host } = setup();
    const first = liveStateJson(sid, at(0));
    expect(JSON.parse(first)).toMatchObject({ seq: 0, clock: { serverMs: at(0) } });
    expect(liveStateJson(sid, at(0.999))).toBe(first);
    expect(JSON.parse(liveStateJson(sid, at(1))).clock.serverMs).toBe(at(1));
    applyClockAction(session, host, { action: 'start' }, at(1.5));
    expect(JSON.parse(liveStateJson(sid, at(1.5)))).toMatchObject({ seq: 1, clock: { state: 'running' } });
  });
});

describe('the host’s repair (lib/live/repair.ts)', () => {
  it('is the host’s alone', () => {
    const { session, planner, operator } = setup();
    for (const member of [planner, operator]) expect(refusal(() => applyRepair(session, member, { moves: [{ runId: 'x', delayS: 1 }] }, at(0))).code).toBe('forbidden');
    expect(() => assertHost(planner)).toThrow('Your role on this railway does not allow you to repair the running session (the host does).');
  });

  it('applies the repair it was shown (each move within 90 s of the current one), storing the current moves; planned times stay', () => {
    const { sid, session, s, host } = setup();
    // The world's two runs meet in block B as planned: the repair moves the later one.
    const proposed = buildLiveState(sid, at(0)).repair;
    expect(proposed.map((m) => m.runId)).toEqual([s.runIds[1]]);
    const delayS = proposed[0]!.delayS;
    const conflictOf = (moves: { runId: string; delayS: number }[]) => {
      const error = refusal(() => applyRepair(session, host, { moves }, at(0)));
      expect(error.code).toBe('conflict');
      expect(error.extra.current).toEqual({ repair: proposed });
    };
    conflictOf([{ runId: s.runIds[1], delayS: delayS + 91 }]);
    conflictOf([{ runId: s.runIds[1], delayS: delayS - 91 }]);
    conflictOf([{ runId: s.runIds[0], delayS }]);
    conflictOf([{ runId: s.runIds[1], delayS }, { runId: s.runIds[1], delayS }]);
    conflictOf([{ runId: s.runIds[1], delayS }, { runId: s.runIds[0], delayS: 10 }]);
    expect(getDb().select().from(t.runRepairs).where(eq(t.runRepairs.sessionId, sid)).all()).toEqual([]);

    const live = applyRepair(session, host, { moves: [{ runId: s.runIds[1], delayS: delayS + 90 }] }, at(5));
    expect(live).toMatchObject({ seq: 1, type: 'repair', summary: `${host.user.name} repaired the timetable: 1 run of 1 train moved` });
    expect(live.at.getTime()).toBe(at(5));
    const stored = getDb().select().from(t.runRepairs).where(eq(t.runRepairs.sessionId, sid)).all();
    expect(stored.map((r) => [r.runId, r.delayS, r.byUserId, r.appliedAt.getTime()])).toEqual([[s.runIds[1], delayS, host.user.id, at(5)]]);
    expect(buildLiveState(sid, at(6)).repair).toEqual([]);
  });

  it('counts the runs and trains it moved', () => {
    const { sid, session, s, host } = setup();
    // A second meeting in block B later on, the other way round: Evening goods first, then Morning stopper.
    insertRuns(sid, [
      { trainId: s.layout.trains.t2, cabId: s.layout.cabs.c2, operatorId: null, speedKmh: 60, note: '', ...timedSteps(s.layout, ['D', 'C', 'B'], 600) },
      { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, operatorId: null, speedKmh: 60, note: '', ...timedSteps(s.layout, ['A', 'B', 'C'], 605) },
    ]);
    const moves = buildLiveState(sid, at(0)).repair.map((m) => ({ runId: m.runId, delayS: m.delayS }));
    expect(moves).toHaveLength(2);
    expect(applyRepair(session, host, { moves }, at(0)).summary).toBe(`${host.user.name} repaired the timetable: 2 runs of 2 trains moved`);
  });
});

/** One run along the test line at 60 km/h (timed by timeRun, tests/integration/authz/sessions.ts). */
const runOn = (layout: Parameters<typeof timedSteps>[0], who: { trainId: string; cabId: string; operatorId: string | null }, keys: string[], departS: number) => ({
  ...who,
  speedKmh: 60,
  note: '',
  ...timedSteps(layout, keys, departS),
});

/** Starts the session's clock at T0 as the host and answers a reporter: report(runId, kind, realS, reason?). */
function hostReporting(w: ReturnType<typeof makeWorld>, session: Parameters<typeof makeReport>[0]) {
  const host: Member = { user: w.host, railwayId: w.railway.id, role: 'host' };
  applyClockAction(session, host, { action: 'start' }, at(0));
  return (runId: string, kind: 'departed' | 'arrived' | 'stopped', realS: number, reason?: 'stalled' | 'blocked') =>
    makeReport(session, host, runId, { kind, ...(reason ? { reason } : {}) }, at(realS));
}

describe('the report after the session (lib/live/report.ts)', () => {
  // Seven runs on the test layout at 4:1, far enough apart not to meet; the punctuality margin is
  // the session's 3 fast minutes (45 real s). Fast clock ratio arithmetic and the tallies are common
  // practice: fast min = real s × 4 / 60, one decimal; a median of an even count is the mean of the middle two.
  function reportWorld() {
    const w = makeWorld();
    let nightMail = '';
    const { session, runIds, layout } = sessionWithRuns(
      w,
      (l) => {
        const db = getDb();
        // A third train whose name a spreadsheet would read as a formula.
        nightMail = db.insert(t.trains).values({ layoutId: l.layoutId, name: '=Night mail', lightingAmps: 0, lengthMm: 500 }).returning().get().id;
        const loco = db.select().from(t.trainLocomotives).where(eq(t.trainLocomotives.trainId, l.trains.t1)).get()!.locomotiveId;
        db.insert(t.trainLocomotives).values({ trainId: nightMail, locomotiveId: loco, position: 0 }).run();
        const run = (trainId: string, cabId: string, operatorId: string | null, keys: string[], departS: number) => runOn(l, { trainId, cabId, operatorId }, keys, departS);
        return [
          run(l.trains.t1, l.cabs.c1, w.planner.id, ['A', 'B', 'C'], 100),
          run(l.trains.t1, l.cabs.c1, w.planner.id, ['C', 'B', 'A'], 400),
          run(l.trains.t2, l.cabs.c2, w.operator.id, ['D', 'C', 'B'], 700),
          run(l.trains.t2, l.cabs.c2, null, ['B', 'C', 'D'], 1000),
          run(l.trains.t2, l.cabs.c2, null, ['D', 'C', 'B'], 1300),
          run(l.trains.t2, l.cabs.c2, null, ['B', 'C', 'D'], 1600),
          run(nightMail, l.cabs.c1, null, ['A', 'B', 'C'], 1900),
        ];
      },
      'Report evening',
    );
    const [r1, r2, r3, r4, r5, r6, r7] = runIds as [string, string, string, string, string, string, string];
    const say = hostReporting(w, session);
    say(r1, 'departed', 160); // 60 s = 4 fast min late
    say(r1, 'arrived', 180); // planned 110.44: 69.56 s = 4.6 fast min late
    say(r2, 'departed', 340); // 60 s early
    say(r2, 'stopped', 342, 'stalled'); // in block B (entered at 340, C left at 342.61)
    say(r2, 'departed', 350); // stood 8 s = 0.5 fast min
    say(r2, 'arrived', 380); // 30.44 s early = 2.0 fast min
    say(r3, 'departed', 760);
    say(r3, 'arrived', 780);
    say(r4, 'departed', 1045); // 45 s = exactly the 3 fast min margin: punctual
    say(r4, 'arrived', 1055.44);
    say(r5, 'departed', 1400); // 100 s = 6.7 fast min late
    say(r5, 'arrived', 1420); // 109.56 s = 7.3 fast min late
    say(r7, 'departed', 1850); // 50 s = 3.3 fast min early: not punctual either
    say(r7, 'stopped', 1853, 'blocked'); // still standing
    return { w, session, layout, ids: { r1, r2, r3, r4, r5, r6, r7 } };
  }

  it('puts every run planned against actual, counts punctuality within the margin, and tallies delay by train, operator and block', () => {
    const { w, session, layout, ids } = reportWorld();
    const report = buildSessionReport(session.id);
    expect(report.session).toEqual({ id: session.id, title: 'Report evening', ratio: 4, fastStart: '06:00' });
    expect(report.punctualWithinFastMin).toBe(3);
    const row = (runId: string) => report.runs.find((r) => r.runId === runId);
    expect(row(ids.r1)).toEqual({
      runId: ids.r1, train: 'Morning stopper', cab: 'Cab 1', operator: w.planner.name,
      plannedDepart: '06:06', actualDepart: '06:10', departDelayFastMin: 4, plannedArrive: '06:07', actualArrive: '06:12', arriveDelayFastMin: 4.6,
      stops: 0, stoppedFastMin: 0, punctual: false, delayBeganFastMin: 4,
    });
    expect(row(ids.r2)).toMatchObject({ actualDepart: '06:22', departDelayFastMin: -4, arriveDelayFastMin: -2, stops: 1, stoppedFastMin: 0.5, punctual: false, delayBeganFastMin: 0 });
    expect(row(ids.r3)).toMatchObject({ operator: w.operator.name, departDelayFastMin: 4, arriveDelayFastMin: 4.6, punctual: false });
    expect(row(ids.r4)).toMatchObject({ operator: null, departDelayFastMin: 3, arriveDelayFastMin: 3, punctual: true, delayBeganFastMin: 3 });
    expect(row(ids.r5)).toMatchObject({ departDelayFastMin: 6.7, arriveDelayFastMin: 7.3, punctual: false, delayBeganFastMin: 6.7 });
    expect(row(ids.r6)).toEqual({
      runId: ids.r6, train: 'Evening goods', cab: 'Cab 2', operator: null,
      plannedDepart: '07:46', actualDepart: null, departDelayFastMin: null, plannedArrive: '07:47', actualArrive: null, arriveDelayFastMin: null,
      stops: 0, stoppedFastMin: 0, punctual: null, delayBeganFastMin: 0,
    });
    // An open stop has lasted nothing yet.
    expect(row(ids.r7)).toMatchObject({ train: '=Night mail', departDelayFastMin: -3.3, actualArrive: null, arriveDelayFastMin: null, stops: 1, stoppedFastMin: 0, punctual: false, delayBeganFastMin: 0 });
    expect(report.runs.map((r) => r.runId)).toEqual([ids.r1, ids.r2, ids.r3, ids.r4, ids.r5, ids.r6, ids.r7]);

    // Six departed, one punctual (the one exactly at the margin): 1/6 to three places.
    expect(report.punctuality).toEqual({ departed: 6, punctual: 1, share: 0.167, notRun: 1 });
    // A run's delay is the larger of its late start and its late arrival; early counts as none.
    expect(report.delayByTrain).toEqual([
      { name: 'Evening goods', delayFastMin: 14.9, runs: 3 },
      { name: 'Morning stopper', delayFastMin: 4.6, runs: 2 },
      { name: '=Night mail', delayFastMin: 0, runs: 1 },
    ]);
    // A tie is broken by name (the planner's runs were tallied first).
    expect(report.delayByOperator).toEqual([
      { name: w.operator.name, delayFastMin: 4.6, runs: 1 },
      { name: w.planner.name, delayFastMin: 4.6, runs: 2 },
    ]);
    // Late starts count against the block left from, stops against the block stood in; blocks with none are left out.
    expect(report.delayByBlock).toEqual([
      { name: 'Block D', delayFastMin: 10.7, runs: 2 },
      { name: 'Block A', delayFastMin: 4, runs: 2 },
      { name: 'Block B', delayFastMin: 3.5, runs: 3 },
    ]);
    expect(report.delaysBeganIn).toEqual([
      { name: 'Block D', delayFastMin: 10.7, runs: 2 },
      { name: 'Block A', delayFastMin: 4, runs: 1 },
      { name: 'Block B', delayFastMin: 3.5, runs: 3 },
    ]);
    // Evening goods: 2 of 3 late; late arrivals 69, 45 and 109.5 real s, median 69: 60 + 69 up to the next 15 s = 135.
    // Morning stopper: 1 of 2 late (the early one is not late); 69 and 0 s, median 34.5: 60 + 34.5 → 105.
    // Night mail ran once: no suggestion.
    expect(report.suggestedStands).toEqual([
      { train: 'Evening goods', lateRuns: 2, runs: 3, standS: 60, suggestedStandS: 135 },
      { train: 'Morning stopper', lateRuns: 1, runs: 2, standS: 60, suggestedStandS: 105 },
    ]);
    const graph = new Map(report.graph.map((g) => [g.runId, g]));
    expect(graph.get(ids.r6)).toMatchObject({ train: 'Evening goods', actual: null });
    expect(graph.get(ids.r1)!.planned[0]).toMatchObject({ blockId: layout.blocks.A, enterS: 70 });
    expect(graph.get(ids.r1)!.actual![0]).toMatchObject({ blockId: layout.blocks.A, enterS: 130 });
    expect(report.blocks).toEqual(['A', 'B', 'C', 'D'].map((k, i) => ({ id: layout.blocks[k], name: `Block ${k}`, positionMm: i * 1000, lengthMm: 1000 })));
  });

  it('names an operator who has left the railway as no one on the run and "Operator" in the tally', () => {
    const { w, session, ids } = reportWorld();
    getDb().delete(t.memberships).where(and(eq(t.memberships.userId, w.operator.id), eq(t.memberships.railwayId, w.railway.id))).run();
    const report = buildSessionReport(session.id);
    expect(report.runs.find((r) => r.runId === ids.r3)!.operator).toBeNull();
    expect(report.delayByOperator).toEqual([
      { name: 'Operator', delayFastMin: 4.6, runs: 1 },
      { name: w.planner.name, delayFastMin: 4.6, runs: 2 },
    ]);
  });

  it('takes another margin when asked', () => {
    const { session } = reportWorld();
    const report = buildSessionReport(session.id, 5);
    expect(report.punctualWithinFastMin).toBe(5);
    // Within 5 fast min: all but the 6.7 min late one.
    expect(report.punctuality).toEqual({ departed: 6, punctual: 5, share: 0.833, notRun: 1 });
  });

  it('writes the run table as CSV with CRLF line ends, a formula-like cell quoted with an apostrophe (OWASP "CSV injection")', () => {
    const { session, ids } = reportWorld();
    const lines = reportCsv(buildSessionReport(session.id)).split('\r\n');
    expect(lines[0]).toBe('runId,train,cab,operator,plannedDepart,actualDepart,departDelayFastMin,plannedArrive,actualArrive,arriveDelayFastMin,stops,stoppedFastMin,punctual,delayBeganFastMin');
    expect(lines).toHaveLength(8);
    // RFC 4180: numbers, booleans and empty cells as they are; a negative number is not a formula.
    expect(lines[6]).toBe(`${ids.r6},Evening goods,Cab 2,,07:46,,,07:47,,,0,0,,0`);
    expect(lines[7]).toBe(`${ids.r7},'=Night mail,Cab 1,,08:06,08:03,-3.3,08:07,,,1,0,false,0`);
    expect(lines[4]).toBe(`${ids.r4},Evening goods,Cab 2,,07:06,07:09,3,07:07,07:10,3,0,0,true,3`);
  });

  it('counts as begun with a run only the delay an earlier run did not hand on', () => {
    const w = makeWorld();
    // The same train and cab: A→C at 60 s, back C→A at 200 s.
    const { session, runIds } = sessionWithRuns(w, (l) => [
      runOn(l, { trainId: l.trains.t1, cabId: l.cabs.c1, operatorId: null }, ['A', 'B', 'C'], 60),
      runOn(l, { trainId: l.trains.t1, cabId: l.cabs.c1, operatorId: null }, ['C', 'B', 'A'], 200),
    ]);
    const [out, back] = runIds as [string, string];
    const say = hostReporting(w, session);
    say(out, 'departed', 150);
    say(out, 'arrived', 250);
    // The train is back at 250 s, 50 s after the return was due: of its 80 s late start only 30 s
    // (2.0 fast min) began with the return.
    say(back, 'departed', 280);
    const rows = buildSessionReport(session.id).runs;
    expect(rows.find((r) => r.runId === back)).toMatchObject({ departDelayFastMin: 5.3, delayBeganFastMin: 2 });
    expect(rows.find((r) => r.runId === out)).toMatchObject({ departDelayFastMin: 6, delayBeganFastMin: 6 });
  });
});

describe('the live state: clock, clashes and what is kept (lib/live/state.ts)', () => {
  it('a run not reported by its time is predicted to leave now once the clock runs, not before it starts', () => {
    const { sid, session, s, host } = setup();
    // A run due at the session's first second: before the clock starts nothing is due, not even it.
    const [dawn] = insertRuns(sid, [{ trainId: s.layout.trains.t2, cabId: s.layout.cabs.c2, operatorId: null, speedKmh: 60, note: '', departS: 0, arriveS: 10, steps: [{ blockId: s.layout.blocks.D!, enterS: 0, exitS: 10 }] }]);
    expect(buildLiveState(sid, at(0)).runs.find((r) => r.id === dawn)!.status).toBe('waiting');
    // The world's two runs meet in block B as planned: that clash is not new.
    expect(buildLiveState(sid, at(200)).newFindings).toEqual([]);
    expect(buildLiveState(sid, at(200)).runs.find((r) => r.id === s.runIds[0])).toMatchObject({ departS: 60, status: 'waiting' });
    applyClockAction(session, host, { action: 'start' }, at(0));
    expect(buildLiveState(sid, at(0)).runs.find((r) => r.id === dawn)!.status).toBe('due');
    const late = buildLiveState(sid, at(200)).runs.find((r) => r.id === s.runIds[0])!;
    expect(late.departS).toBe(200);
    expect(late.status).not.toBe('waiting');
  });

  it('names new block, cab, operator and train clashes, and keeps a run that has left where it is, stopped or arrived', async () => {
    const { w } = setup();
    const { session, runIds } = sessionWithRuns(w, (l) => [
      runOn(l, { trainId: l.trains.t1, cabId: l.cabs.c1, operatorId: w.operator.id }, ['A', 'B', 'C'], 60),
      runOn(l, { trainId: l.trains.t1, cabId: l.cabs.c1, operatorId: w.operator.id }, ['A', 'B', 'C'], 140),
      // Meets the first in block B as planned: a clash the timetable in force already has.
      runOn(l, { trainId: l.trains.t2, cabId: l.cabs.c2, operatorId: null }, ['D', 'C', 'B'], 65),
    ]);
    const [first, second] = runIds as [string, string];
    const say = hostReporting(w, session);
    say(first, 'departed', 150);
    say(second, 'departed', 151);
    // Loaded afresh, so that its list of clash kinds is read in this test.
    vi.resetModules();
    const fresh = await import('@/lib/live/state');
    const state = fresh.buildLiveState(session.id, at(152));
    // The two runs of one train, cab and operator both under way: three clashes of the pair; and the
    // third run, now due at 152 s, meets the first in block B later than planned.
    const pair = state.newFindings.filter((f) => f.ids.includes(first) && f.ids.includes(second)).map((f) => f.kind);
    expect(pair.sort()).toEqual(['cab-double-booked', 'operator-double-booked', 'train-double-booked']);
    expect(state.newFindings.map((f) => f.kind).sort()).toEqual(['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked']);
    expect(state.newFindings.find((f) => f.kind === 'cab-double-booked')).toMatchObject({ fromS: 151, toS: 160.44 });
    expect(state.repair.map((m) => m.runId)).not.toContain(second);
    say(second, 'stopped', 153);
    expect(buildLiveState(session.id, at(154)).repair.map((m) => m.runId)).not.toContain(second);
    say(second, 'arrived', 160);
    expect(buildLiveState(session.id, at(161)).repair.map((m) => m.runId)).not.toContain(second);
  });
});
