// Retiming through the route handlers: the session's window for each move (both ends included,
// common practice: a run may leave at the first second and arrive at the last), one move per run,
// and the undo each answer carries. Times are computed from the stored runs, not from the code.
import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { GET as listRuns } from '@/app/api/sessions/[sessionId]/runs/route';
import { GET as suggest, POST as applyRetime } from '@/app/api/sessions/[sessionId]/retime/route';
import { getDb } from '@/db';
import * as t from '@/db/schema';
import type { RetimeSuggestion, TimetableChange, TimetableSnapshot } from '@/lib/sessions/types';
import { makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const post = (sid: string, moves: unknown) =>
  applyRetime(new Request(url(`/api/sessions/${sid}/retime`), { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ moves }) }), ctx({ sessionId: sid }));

function setup() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  signInAs(w.planner);
  const sid = s.session.id;
  const row = getDb().select().from(t.sessions).where(eq(t.sessions.id, sid)).get()!;
  const lengthS = (row.endsAt.getTime() - row.startsAt.getTime()) / 1000;
  return { s, sid, lengthS };
}

async function snapshot(sid: string): Promise<TimetableSnapshot> {
  const res = await listRuns(new Request(url(`/api/sessions/${sid}/runs`)), ctx({ sessionId: sid }));
  expect(res.status).toBe(200);
  return res.json();
}

const timesOf = (run: TimetableSnapshot['runs'][number]) => [run.departS, run.arriveS, ...run.steps.flatMap((st) => [st.enterS, st.exitS])];

describe('retime moves and the session window', () => {
  it('takes a move that brings a run’s earliest time to second 0, refuses one a second further, naming the move', async () => {
    const { s, sid, lengthS } = setup();
    const run = (await snapshot(sid)).runs.find((r) => r.id === s.runIds[0])!;
    const earliest = Math.min(...timesOf(run));
    expect(earliest).toBeGreaterThan(1);
    const message = `this move takes the run outside the session, 0 to ${lengthS} s after its start`;
    const tooEarly = await post(sid, [{ runId: run.id, version: run.version, delayS: -earliest - 1 }]);
    expect(tooEarly.status).toBe(400);
    expect(await tooEarly.json()).toMatchObject({ error: `moves[0].delayS: ${message}`, issues: [{ path: 'moves[0].delayS', message }] });
    expect((await snapshot(sid)).runs.find((r) => r.id === run.id)!.departS).toBe(run.departS);

    const ok = await post(sid, [{ runId: run.id, version: run.version, delayS: -earliest }]);
    expect(ok.status).toBe(200);
    const answer: TimetableChange = await ok.json();
    // The undo shifts it back by the same amount, at the version the move wrote.
    expect(answer.undo).toEqual([{ runId: run.id, version: run.version + 1, delayS: earliest }]);
    expect(Math.min(...timesOf(answer.runs.find((r) => r.id === run.id)!))).toBeCloseTo(0, 9);
  });

  it('takes a move that brings a run’s latest time to the session’s end, refuses one a second further', async () => {
    const { s, sid, lengthS } = setup();
    const runs = (await snapshot(sid)).runs;
    const run = runs.find((r) => r.id === s.runIds[1])!;
    const room = lengthS - Math.max(...timesOf(run));
    expect(room).toBeGreaterThan(1);
    // The second move is the one out of bounds: the issue names its index.
    const other = runs.find((r) => r.id === s.runIds[0])!;
    const tooLate = await post(sid, [
      { runId: other.id, version: other.version, delayS: 1 },
      { runId: run.id, version: run.version, delayS: room + 1 },
    ]);
    expect(tooLate.status).toBe(400);
    expect(await tooLate.json()).toMatchObject({ issues: [{ path: 'moves[1].delayS' }] });
    expect((await snapshot(sid)).runs.map((r) => r.version)).toEqual(runs.map((r) => r.version));
    const ok = await post(sid, [{ runId: run.id, version: run.version, delayS: room }]);
    expect(ok.status).toBe(200);
  });

  it('refuses the same run twice in one request and changes nothing', async () => {
    const { s, sid } = setup();
    const before = await snapshot(sid);
    const run = before.runs.find((r) => r.id === s.runIds[0])!;
    const res = await post(sid, [
      { runId: run.id, version: run.version, delayS: 10 },
      { runId: run.id, version: run.version, delayS: 20 },
    ]);
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({ error: 'Each run may be moved once per request.' });
    expect((await snapshot(sid)).runs).toEqual(before.runs);
  });

  it('answers each run’s undo with its own delay, and suggestions in order of departure with the stored versions', async () => {
    const { s, sid } = setup();
    const before = await snapshot(sid);
    const [a, b] = s.runIds.map((id) => before.runs.find((r) => r.id === id)!);
    const res = await post(sid, [
      { runId: a!.id, version: a!.version, delayS: 5 },
      { runId: b!.id, version: b!.version, delayS: -3 },
    ]);
    expect(res.status).toBe(200);
    const answer: TimetableChange = await res.json();
    expect([...answer.undo!].sort((x, y) => x.runId.localeCompare(y.runId))).toEqual(
      [
        { runId: a!.id, version: a!.version + 1, delayS: -5 },
        { runId: b!.id, version: b!.version + 1, delayS: 3 },
      ].sort((x, y) => x.runId.localeCompare(y.runId)),
    );
    const list = await suggest(new Request(url(`/api/sessions/${sid}/retime`)), ctx({ sessionId: sid }));
    const { moves }: { moves: RetimeSuggestion[] } = await list.json();
    const now = await snapshot(sid);
    for (const m of moves) {
      const run = now.runs.find((r) => r.id === m.runId)!;
      expect(m).toEqual({ runId: run.id, version: run.version, delayS: m.delayS, oldDepartS: run.departS, newDepartS: run.departS + m.delayS });
    }
    const order = moves.map((m) => m.oldDepartS);
    expect(order).toEqual([...order].sort((x, y) => x - y));
  });

  it('answers a stale move with the run as it is now, and several stale moves with each run (409)', async () => {
    const { s, sid } = setup();
    const before = await snapshot(sid);
    const [a, b] = s.runIds.map((id) => before.runs.find((r) => r.id === id)!);
    const one = await post(sid, [{ runId: a!.id, version: a!.version + 5, delayS: 10 }]);
    expect(one.status).toBe(409);
    expect(((await one.json()) as { current: { id: string; version: number } }).current).toMatchObject({ id: a!.id, version: a!.version });
    const two = await post(sid, [
      { runId: a!.id, version: a!.version + 5, delayS: 10 },
      { runId: b!.id, version: b!.version + 5, delayS: 10 },
    ]);
    expect(two.status).toBe(409);
    const current = ((await two.json()) as { current: { id: string }[] }).current;
    expect(current.map((r) => r.id).sort()).toEqual([a!.id, b!.id].sort());
    expect((await snapshot(sid)).runs).toEqual(before.runs);
  });

  it('answers a move of a run not in the session with 404, naming it when there are several moves', async () => {
    const { s, sid } = setup();
    const before = await snapshot(sid);
    const a = before.runs.find((r) => r.id === s.runIds[0])!;
    const alone = await post(sid, [{ runId: 'no-such-run', version: 1, delayS: 10 }]);
    expect(alone.status).toBe(404);
    expect(await alone.json()).toMatchObject({ error: 'That run was not found.' });
    const among = await post(sid, [
      { runId: a.id, version: a.version, delayS: 10 },
      { runId: 'no-such-run', version: 1, delayS: 10 },
      { runId: 'nor-this-one', version: 1, delayS: 10 },
    ]);
    expect(among.status).toBe(404);
    expect(await among.json()).toMatchObject({ error: 'Run no-such-run was not found.' });
    expect((await snapshot(sid)).runs).toEqual(before.runs);
  });
});
