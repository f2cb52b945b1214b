import { describe, expect, it } from 'vitest';
import { PATCH } from '@/app/api/sessions/[sessionId]/runs/[runId]/route';
import { getRun } from '@/db/queries/runs';
import { makeSessionWorld } from './authz/sessions';
import { signInAs } from './caller';
import { makeWorld } from './world';

const patch = (sid: string, runId: string, body: unknown) =>
  PATCH(
    new Request(`http://127.0.0.1:3999/api/sessions/${sid}/runs/${runId}`, {
      method: 'PATCH',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(body),
    }),
    { params: Promise.resolve({ sessionId: sid, runId }) },
  );

describe('two planners edit the same run at once', () => {
  it('one wins, the other gets 409 with the winner’s version, and no update is lost', async () => {
    const w = makeWorld();
    const s = makeSessionWorld(w);
    signInAs(w.planner);
    const sid = s.session.id;
    const runId = s.runIds[0]!;
    const before = getRun(sid, runId)!;
    // Both saw version 1; their edits arrive together.
    const [a, b] = await Promise.all([
      patch(sid, runId, { version: before.version, departS: before.departS + 300 }),
      patch(sid, runId, { version: before.version, departS: before.departS + 900 }),
    ]);
    const statuses = [a.status, b.status].sort();
    expect(statuses).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    const winnerShift = a.status === 200 ? 300 : 900;
    const after = getRun(sid, runId)!;
    expect(after.version).toBe(before.version + 1);
    expect(after.departS).toBe(before.departS + winnerShift);
    expect((await loser.json()).current).toMatchObject({ id: runId, version: after.version, departS: after.departS });
    // The loser retries on the current version and its edit lands on top of the winner's.
    const retry = await patch(sid, runId, { version: after.version, departS: before.departS + 1200 });
    expect(retry.status).toBe(200);
    expect(getRun(sid, runId)!.version).toBe(before.version + 2);
  });
});
