import { describe, expect, it } from 'vitest';
import { DELETE, PATCH } from '@/app/api/sessions/[sessionId]/runs/[runId]/route';
import { POST as postSeries } from '@/app/api/sessions/[sessionId]/runs/[runId]/series/route';
import { GET as listRuns, POST as createRun } from '@/app/api/sessions/[sessionId]/runs/route';
import { GET as suggest, POST as applyRetime } from '@/app/api/sessions/[sessionId]/retime/route';
import { POST as undoRetime } from '@/app/api/sessions/[sessionId]/retime/undo/route';
import { eq } from 'drizzle-orm';
import { getDb } from '@/db';
import { getRun } from '@/db/queries/runs';
import * as t from '@/db/schema';
import type { TimetableChange, TimetableSnapshot, RetimeSuggestion } from '@/lib/sessions/types';
import { makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (method: string, path: string, body: unknown) =>
  new Request(url(path), { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

const TIMING_KINDS = ['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked'];

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  signInAs(w.planner);
  const sid = s.session.id;
  return { w, s, sid };
}

async function snapshot(sid: string): Promise<TimetableSnapshot> {
  const res = await listRuns(new Request(url(`/api/sessions/${sid}/runs`)), ctx({ sessionId: sid }));
  expect(res.status).toBe(200);
  return res.json();
}

describe('runs', () => {
  it('adds a run from its first and last block: findRoute fills the route, timeRun times it, the answer is re-checked', async () => {
    const { s, sid } = setup();
    const body = { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '09:00', waypoints: [s.layout.blocks.A, s.layout.blocks.D], speedKmh: 60, standBeforeS: 30, standAfterS: 30 };
    const res = await createRun(json('POST', `/api/sessions/${sid}/runs`, body), ctx({ sessionId: sid }));
    expect(res.status).toBe(201);
    const answer: TimetableChange = await res.json();
    // 09:00 fast with the clock starting at 06:00 and running 4:1 is 3 h × 3600 / 4 = 2700 s real.
    expect(answer.run?.departS).toBe(2700);
    expect(answer.run?.steps.map((st) => st.blockId)).toEqual(['A', 'B', 'C', 'D'].map((k) => s.layout.blocks[k]));
    // 60 km/h in H0: 60 / 3.6 / 87 × 1000 = 191.57 mm/s. The train has no ramps of its own, so it
    // takes H0's common-practice 15 km/h per second (47.89 mm/s²): 60 / 15 = 4 s to reach speed over
    // v² / 2a = 383.1 mm, then (500 − 383.1) / 191.57 = 0.61 s until the 500 mm train clears block A.
    const v = (60 / 3.6 / 87) * 1000;
    const a = (15 / 3.6 / 87) * 1000;
    expect(answer.run!.steps[0]!.exitS).toBeCloseTo(2700 + v / a + (500 - (v * v) / (2 * a)) / v, 3);
    expect(answer.run!.steps[0]!.exitS).toBeCloseTo(2704.61, 2);
    expect(answer.runs).toHaveLength(3);
    expect(answer.findings.some((f) => f.kind === 'block-overlap')).toBe(true);
  });

  it('times a run with the train’s own ramps when it has them', async () => {
    const { s, sid } = setup();
    getDb().update(t.trains).set({ accelKmhPerS: 30 }).where(eq(t.trains.id, s.layout.trains.t1)).run();
    const body = { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '09:00', waypoints: [s.layout.blocks.A, s.layout.blocks.D], speedKmh: 60, standBeforeS: 30, standAfterS: 30 };
    const answer: TimetableChange = await (await createRun(json('POST', `/api/sessions/${sid}/runs`, body), ctx({ sessionId: sid }))).json();
    // 30 km/h per second (95.79 mm/s²): 2 s to 60 km/h over 191.6 mm, then (500 − 191.6) / 191.57 = 1.61 s.
    const v = (60 / 3.6 / 87) * 1000;
    const a = (30 / 3.6 / 87) * 1000;
    expect(answer.run!.steps[0]!.exitS).toBeCloseTo(2700 + v / a + (500 - (v * v) / (2 * a)) / v, 3);
    expect(answer.run!.steps[0]!.exitS).toBeCloseTo(2703.61, 2);
  });

  it('refuses a bad run with 400 naming the field and adds nothing', async () => {
    const { w, s, sid } = setup();
    const other = makeSessionWorld({ ...w, railway: w.otherRailway });
    const cases = [
      { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '9 o’clock', waypoints: [s.layout.blocks.A, s.layout.blocks.D], speedKmh: 60 },
      { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '09:00', waypoints: [s.layout.blocks.A, s.layout.blocks.D], speedKmh: 0 },
      { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '09:00', waypoints: [s.layout.blocks.A, s.layout.blocks.A], speedKmh: 60 },
      // Another layout's cab and block.
      { trainId: s.layout.trains.t1, cabId: other.layout.cabs.c1, depart: '09:00', waypoints: [s.layout.blocks.A, s.layout.blocks.D], speedKmh: 60 },
      { trainId: s.layout.trains.t1, cabId: s.layout.cabs.c1, depart: '09:00', waypoints: [s.layout.blocks.A, other.layout.blocks.D], speedKmh: 60 },
    ];
    for (const body of cases) {
      const res = await createRun(json('POST', `/api/sessions/${sid}/runs`, body), ctx({ sessionId: sid }));
      expect(res.status).toBe(400);
      const error = await res.json();
      expect(error.code).toBe('bad_request');
      expect(error.issues.length).toBeGreaterThan(0);
    }
    expect((await snapshot(sid)).runs).toHaveLength(2);
  });

  it('moves a run to a new departure; a stale version answers 409 with the current run and changes nothing', async () => {
    const { s, sid } = setup();
    const runId = s.runIds[0];
    const before = getRun(sid, runId)!;
    const path = `/api/sessions/${sid}/runs/${runId}`;
    const res = await PATCH(json('PATCH', path, { version: 1, departS: before.departS + 600 }), ctx({ sessionId: sid, runId }));
    expect(res.status).toBe(200);
    const moved = getRun(sid, runId)!;
    expect(moved.version).toBe(2);
    expect(moved.departS).toBe(before.departS + 600);
    expect(moved.steps.map((st) => st.enterS)).toEqual(before.steps.map((st) => st.enterS + 600));

    const stale = await PATCH(json('PATCH', path, { version: 1, depart: '10:00' }), ctx({ sessionId: sid, runId }));
    expect(stale.status).toBe(409);
    expect((await stale.json()).current).toMatchObject({ id: runId, version: 2 });
    expect(getRun(sid, runId)).toEqual(moved);
  });

  it('takes step times given by hand, and refuses steps out of order', async () => {
    const { s, sid } = setup();
    const runId = s.runIds[0];
    const run = getRun(sid, runId)!;
    const path = `/api/sessions/${sid}/runs/${runId}`;
    const steps = run.steps.map((st, i) => (i === 1 ? { ...st, exitS: st.exitS + 20 } : st));
    const ok = await PATCH(json('PATCH', path, { version: 1, steps: { departS: run.departS, arriveS: run.arriveS, steps } }), ctx({ sessionId: sid, runId }));
    expect(ok.status).toBe(200);
    expect(getRun(sid, runId)!.steps[1]!.exitS).toBe(run.steps[1]!.exitS + 20);
    const reversed = [...steps].reverse();
    const bad = await PATCH(json('PATCH', path, { version: 2, steps: { departS: run.departS, arriveS: run.arriveS, steps: reversed } }), ctx({ sessionId: sid, runId }));
    expect(bad.status).toBe(400);
    expect(getRun(sid, runId)!.version).toBe(2);
  });

  it('changes the cab, and the findings that come back say so with names', async () => {
    const { s, sid } = setup();
    const runId = s.runIds[1];
    const path = `/api/sessions/${sid}/runs/${runId}`;
    // Both runs on Cab 1 at overlapping times: a double-booked cab.
    const res = await PATCH(json('PATCH', path, { version: 1, cabId: s.layout.cabs.c1 }), ctx({ sessionId: sid, runId }));
    const answer: TimetableChange = await res.json();
    const cab = answer.findings.find((f) => f.kind === 'cab-double-booked');
    expect(cab?.ids[0]).toBe(s.layout.cabs.c1);
    expect(cab?.message).toContain('Cab 1 is booked for');
    expect(cab?.message).toContain('Evening goods');
    expect(cab?.message).not.toContain(runId);
  });

  it('deletes at the version seen, and the deleted run can be put back as it was', async () => {
    const { s, sid } = setup();
    const runId = s.runIds[1];
    const stale = await DELETE(new Request(url(`/api/sessions/${sid}/runs/${runId}?version=7`), { method: 'DELETE' }), ctx({ sessionId: sid, runId }));
    expect(stale.status).toBe(409);
    const res = await DELETE(new Request(url(`/api/sessions/${sid}/runs/${runId}?version=1`), { method: 'DELETE' }), ctx({ sessionId: sid, runId }));
    expect(res.status).toBe(200);
    const answer: TimetableChange = await res.json();
    expect(answer.runs).toHaveLength(1);
    expect(answer.findings.some((f) => f.kind === 'block-overlap')).toBe(false);
    const { deleted } = answer;
    const put = await createRun(
      json('POST', `/api/sessions/${sid}/runs`, {
        trainId: deleted!.trainId, cabId: deleted!.cabId, operatorId: deleted!.operatorId, departS: deleted!.departS,
        arriveS: deleted!.arriveS, speedKmh: deleted!.speedKmh, note: deleted!.note, steps: deleted!.steps,
      }),
      ctx({ sessionId: sid }),
    );
    expect(put.status).toBe(201);
    const back: TimetableChange = await put.json();
    expect(back.run?.steps).toEqual(deleted!.steps);
    expect(back.findings.some((f) => f.kind === 'block-overlap')).toBe(true);
  });

  it('duplicates a run as a series every N fast minutes', async () => {
    const { s, sid } = setup();
    const runId = s.runIds[0];
    const source = getRun(sid, runId)!;
    const res = await postSeries(json('POST', `/api/sessions/${sid}/runs/${runId}/series`, { everyFastMin: 40, count: 3 }), ctx({ sessionId: sid, runId }));
    expect(res.status).toBe(201);
    const answer: TimetableChange = await res.json();
    expect(answer.createdIds).toHaveLength(3);
    // 40 fast minutes at 4:1 are 600 real seconds.
    const departures = answer.createdIds!.map((id) => answer.runs.find((r) => r.id === id)!.departS);
    expect(departures).toEqual([600, 1200, 1800].map((d) => source.departS + d));
    const bad = await postSeries(json('POST', `/api/sessions/${sid}/runs/${runId}/series`, { everyFastMin: 0, count: 99 }), ctx({ sessionId: sid, runId }));
    expect(bad.status).toBe(400);
    expect((await snapshot(sid)).runs).toHaveLength(5);
  });

  it('repair timing: the suggested delays leave no timing clash, and undo puts every departure back', async () => {
    const { s, sid } = setup();
    // Add a double-booked cab on top of the block clash.
    await PATCH(json('PATCH', `/api/sessions/${sid}/runs/${s.runIds[1]}`, { version: 1, cabId: s.layout.cabs.c1 }), ctx({ sessionId: sid, runId: s.runIds[1] }));
    const before = await snapshot(sid);
    expect(before.findings.filter((f) => TIMING_KINDS.includes(f.kind)).length).toBeGreaterThanOrEqual(2);
    const res = await suggest(new Request(url(`/api/sessions/${sid}/retime`)), ctx({ sessionId: sid }));
    const { moves }: { moves: RetimeSuggestion[] } = await res.json();
    expect(moves.length).toBeGreaterThan(0);
    for (const m of moves) expect(m.newDepartS).toBe(m.oldDepartS + m.delayS);

    const applied = await applyRetime(
      json('POST', `/api/sessions/${sid}/retime`, { moves: moves.map(({ runId, version, delayS }) => ({ runId, version, delayS })) }),
      ctx({ sessionId: sid }),
    );
    expect(applied.status).toBe(200);
    const after: TimetableChange = await applied.json();
    expect(after.findings.filter((f) => TIMING_KINDS.includes(f.kind))).toEqual([]);

    // The same moves again are stale: all or nothing.
    const again = await applyRetime(
      json('POST', `/api/sessions/${sid}/retime`, { moves: moves.map(({ runId, version, delayS }) => ({ runId, version, delayS })) }),
      ctx({ sessionId: sid }),
    );
    expect(again.status).toBe(409);

    const undone = await undoRetime(json('POST', `/api/sessions/${sid}/retime/undo`, { moves: after.undo }), ctx({ sessionId: sid }));
    expect(undone.status).toBe(200);
    const restored: TimetableChange = await undone.json();
    // Shifting by d and then by −d is exact up to floating-point rounding (well below a millisecond).
    for (const run of before.runs) {
      const back = restored.runs.find((r) => r.id === run.id)!;
      expect(back.departS).toBeCloseTo(run.departS, 6);
      back.steps.forEach((st, i) => expect(st.enterS).toBeCloseTo(run.steps[i]!.enterS, 6));
    }
    expect(restored.findings.map((f) => f.kind)).toEqual(before.findings.map((f) => f.kind));
  });

  it('an operator may read a published session they are invited to but not change it; others get 404', async () => {
    const { w, s, sid } = setup();
    signInAs(w.operator);
    expect((await listRuns(new Request(url(`/api/sessions/${sid}/runs`)), ctx({ sessionId: sid }))).status).toBe(200);
    const runId = s.runIds[0];
    expect((await PATCH(json('PATCH', `/api/sessions/${sid}/runs/${runId}`, { version: 1, depart: '07:00' }), ctx({ sessionId: sid, runId }))).status).toBe(403);
    const draft = makeSessionWorld(w, { status: 'draft' });
    expect((await listRuns(new Request(url(`/api/sessions/${draft.session.id}/runs`)), ctx({ sessionId: draft.session.id }))).status).toBe(404);
    signInAs(w.planner);
    // A run id of another session, reached through ours, is not found.
    const foreign = draft.runIds[0];
    expect((await PATCH(json('PATCH', `/api/sessions/${sid}/runs/${foreign}`, { version: 1, depart: '07:00' }), ctx({ sessionId: sid, runId: foreign }))).status).toBe(404);
    // Another railway's session is 404 for our planner.
    const theirs = s.otherSession.id;
    expect((await listRuns(new Request(url(`/api/sessions/${theirs}/runs`)), ctx({ sessionId: theirs }))).status).toBe(404);
  });
});

describe('runs on the engine’s model of issue 12', () => {
  const body = (s: ReturnType<typeof setup>['s'], depart: string, waypoints: string[]) => ({
    trainId: s.layout.trains.t1,
    cabId: s.layout.cabs.c1,
    depart,
    waypoints,
    speedKmh: 60,
  });

  it('the route finder follows the track’s ends: each stored step keeps its direction, and a reversal at a junction is refused naming it unless the block is a reversing place', async () => {
    const { s, sid } = setup();
    const db = getDb();
    const { A, B, C } = s.layout.blocks as Record<'A' | 'B' | 'C', string>;
    // A siding leaves Block B's b end beside Block C: a facing turnout for trains from A, a trailing
    // one for trains from C (common practice).
    const siding = db.insert(t.blocks).values({ layoutId: s.layout.layoutId, name: 'Siding', lengthMm: 1000, positionMm: 1500 }).returning().get().id;
    db.insert(t.links).values({ layoutId: s.layout.layoutId, blockAId: B, blockBId: siding, blockAEnd: 'b', blockBEnd: 'a' }).run();
    const post = (depart: string, waypoints: string[]) => createRun(json('POST', `/api/sessions/${sid}/runs`, body(s, depart, waypoints)), ctx({ sessionId: sid }));

    // From C the siding is reached only by running into B and reversing there.
    const refused = await post('09:00', [C, siding]);
    expect(refused.status).toBe(400);
    expect((await refused.json()).issues).toEqual([{ path: 'waypoints', message: expect.stringMatching(/^Every way from Block C to Siding needs the train to reverse \(at Block B\)/) }]);
    expect((await snapshot(sid)).runs).toHaveLength(2);

    // From A it runs in through the facing turnout; each step records the ends it enters and leaves by.
    const straight = await post('09:00', [A, siding]);
    expect(straight.status).toBe(201);
    const first: TimetableChange = await straight.json();
    const ends = (runId: string) => getRun(sid, runId)!.steps.map((st) => [st.blockId, st.fromEnd, st.toEnd]);
    expect(ends(first.run!.id)).toEqual([
      [A, 'a', 'b'],
      [B, 'a', 'b'],
      [siding, 'a', 'b'],
    ]);

    // Marked as a reversing place, B lets the train from C turn there: in at its b end and out by it again.
    db.update(t.blocks).set({ reversingPlace: true }).where(eq(t.blocks.id, B)).run();
    const turned = await post('10:00', [C, siding]);
    expect(turned.status).toBe(201);
    expect(ends(((await turned.json()) as TimetableChange).run!.id)).toEqual([
      [C, 'b', 'a'],
      [B, 'b', 'b'],
      [siding, 'a', 'b'],
    ]);
  });

  it('a turnaround shorter than the default stands plus the headway (60 + 120 + 30 = 210 s) is no clash, and the repair moves nothing', async () => {
    const { s, sid } = setup();
    // Only this train's two runs on the timetable.
    getDb().delete(t.runs).where(eq(t.runs.sessionId, sid)).run();
    const { A, D } = s.layout.blocks as Record<'A' | 'D', string>;
    const post = async (depart: string, waypoints: string[]) => {
      const res = await createRun(json('POST', `/api/sessions/${sid}/runs`, body(s, depart, waypoints)), ctx({ sessionId: sid }));
      expect(res.status).toBe(201);
      return (await res.json()) as TimetableChange;
    };
    // No stand times given: the builder's defaults, 60 s before departure and 120 s after arrival.
    const out = await post('09:00', [A, D]);
    const arriveS = out.run!.arriveS;
    // Back 100 s after arriving. The clock runs 4:1 from 06:00, so 100 real seconds are 400 fast ones.
    const fast = 6 * 3600 + Math.ceil((arriveS + 100) * 4);
    const hhmmss = [Math.floor(fast / 3600), Math.floor(fast / 60) % 60, fast % 60].map((n) => String(n).padStart(2, '0')).join(':');
    const back = await post(hhmmss, [D, A]);
    const gap = back.run!.departS - arriveS;
    expect(gap).toBeGreaterThanOrEqual(100);
    expect(gap).toBeLessThan(101);
    // Both stands are in D and overlap: the first run holds it until 120 s after arriving, the next from 60 s before leaving.
    expect(out.run!.steps.at(-1)!.blockId).toBe(D);
    expect(back.run!.steps[0]!.blockId).toBe(D);
    expect(out.run!.steps.at(-1)!.exitS).toBeGreaterThan(back.run!.steps[0]!.enterS + 30);
    // One train's consecutive runs never clash with each other (the engine before issue 12 called this
    // "Morning stopper and Morning stopper … apart" and the repair delayed the second run).
    expect(back.findings.filter((f) => f.severity === 'error')).toEqual([]);
    const res = await suggest(new Request(url(`/api/sessions/${sid}/retime`)), ctx({ sessionId: sid }));
    expect(((await res.json()) as { moves: RetimeSuggestion[] }).moves).toEqual([]);
  });
});
