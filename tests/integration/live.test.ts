import { describe, expect, it } from 'vitest';
import { POST as clockAction } from '@/app/api/sessions/[sessionId]/clock/route';
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
