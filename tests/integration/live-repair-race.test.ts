import { eq } from 'drizzle-orm';
import { describe, expect, it, vi } from 'vitest';
import { getDb } from '@/db';
import * as t from '@/db/schema';
import type { Member } from '@/lib/auth';
import { AppError } from '@/lib/errors';
import { applyRepair } from '@/lib/live/repair';
import { buildLiveState } from '@/lib/live/state';
import { makeSessionWorld } from './authz/sessions';
import { makeWorld } from './world';

// Another change lands between the host's look and the repair's write (two screens at once): the
// store is the real one, with a live event written just before it is asked to store the repair.
vi.mock('@/db/queries/live', async (importOriginal) => {
  const real = await importOriginal<typeof import('@/db/queries/live')>();
  return {
    ...real,
    addRepairs: (...args: Parameters<typeof real.addRepairs>) => {
      const [sessionId, expectSeq, at] = args;
      getDb().insert(t.liveEvents).values({ sessionId, seq: expectSeq + 1, type: 'report', summary: 'a report from another screen', at }).run();
      return real.addRepairs(...args);
    },
  };
});

describe('the host’s repair when something happened meanwhile (lib/live/repair.ts)', () => {
  it('stores nothing and answers 409 with the repair as it stands now', () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    const host: Member = { user: w.host, railwayId: w.railway.id, role: 'host' };
    const moves = buildLiveState(session.id).repair.map((m) => ({ runId: m.runId, delayS: m.delayS }));
    expect(moves).toHaveLength(1);
    let error: unknown;
    try {
      applyRepair(session, host, { moves });
    } catch (thrown) {
      error = thrown;
    }
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe('conflict');
    expect((error as AppError).extra.current).toEqual({ repair: buildLiveState(session.id).repair });
    expect(getDb().select().from(t.runRepairs).where(eq(t.runRepairs.sessionId, session.id)).all()).toEqual([]);
  });
});
