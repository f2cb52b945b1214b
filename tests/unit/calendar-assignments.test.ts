import { describe, expect, it } from 'vitest';
import type { loadSessionRows } from '@/db/queries/plan-data';
import { describeRuns, formatStand, runsAssignedTo } from '@/lib/invitations/assignments';

type Rows = NonNullable<ReturnType<typeof loadSessionRows>>;

// Only the fields describeRuns reads; the rest of a session's rows do not matter here.
function rows(startsAt: Date, timeZone: string): Rows {
  const run = (id: string, cabId: string, operatorId: string | null, departS: number, arriveS: number) => ({ id, sessionId: 's', trainId: cabId === 'c1' ? 't1' : 't2', cabId, operatorId, departS, arriveS, speedKmh: null, note: '', version: 1 });
  const steps = (runId: string, departS: number, arriveS: number, standBefore: number, standAfter: number) => [
    { id: `${runId}-0`, runId, position: 0, blockId: 'b1', enterS: departS - standBefore, exitS: departS + 10 },
    { id: `${runId}-1`, runId, position: 1, blockId: 'b2', enterS: departS + 5, exitS: arriveS - 5 },
    { id: `${runId}-2`, runId, position: 2, blockId: 'b3', enterS: arriveS - 10, exitS: arriveS + standAfter },
  ];
  return {
    session: { startsAt, timeZone, clockRatio: 4, fastStart: '06:00' },
    blocks: [
      { id: 'b1', name: 'Yard' },
      { id: 'b2', name: 'Main' },
      { id: 'b3', name: 'Terminus' },
    ],
    cabs: [
      { id: 'c1', name: 'Cab 1' },
      { id: 'c2', name: 'Cab 2' },
    ],
    trains: [
      { id: 't1', name: 'Stopper' },
      { id: 't2', name: 'Goods' },
    ],
    operators: [
      { id: 'u1', name: 'Ada' },
      { id: 'u2', name: 'Ben' },
    ],
    // Deliberately out of order: the description sorts by departure.
    runs: [run('r3', 'c1', 'u1', 1500, 1560), run('r1', 'c1', 'u1', 300, 360), run('r2', 'c1', 'u2', 900, 960), run('r4', 'c2', null, 600, 700)],
    steps: [...steps('r1', 300, 360, 120, 180), ...steps('r2', 900, 960, 60, 60), ...steps('r3', 1500, 1560, 0, 240), ...steps('r4', 600, 700, 30, 30)],
  } as unknown as Rows;
}

describe('a person’s runs, as the e-mail, My runs and the calendar describe them', () => {
  const winter = rows(new Date('2026-12-05T18:30:00Z'), 'Europe/London');

  it('gives fast and real departure times', () => {
    const [first] = runsAssignedTo(winter, 'u1');
    // Fast clock 4:1 from 06:00: 300 real s × 4 = 1200 fast s = 20 min, so 06:20 (derived; DOMAIN.md fast clock).
    expect(first!.fastDepart).toBe('06:20');
    // 360 s × 4 = 24 min → 06:24.
    expect(first!.fastArrive).toBe('06:24');
    // London keeps UTC in December (GMT): 18:30 + 5 min = 18:35 (IANA tz database, common practice).
    expect(first!.realDepart).toBe('18:35');
    expect(first!.departAt.toISOString()).toBe('2026-12-05T18:35:00.000Z');
  });

  it('in British Summer Time the same run reads an hour later on the clock', () => {
    const summer = rows(new Date('2026-07-04T17:30:00Z'), 'Europe/London');
    expect(runsAssignedTo(summer, 'u1')[0]!.realDepart).toBe('18:35'); // UTC+1 in summer (IANA tz database)
  });

  it('lists the route in block order and the stand times from the first and last steps', () => {
    const [first, second] = runsAssignedTo(winter, 'u1');
    expect(first!.route).toEqual(['Yard', 'Main', 'Terminus']);
    expect(first!.standBeforeS).toBe(120); // departS − first step's enterS
    expect(first!.standAfterS).toBe(180); // last step's exitS − arriveS
    expect(second!.standBeforeS).toBe(0);
    // Stand times are real seconds (the engine's steps are on the real clock), and say so.
    expect(formatStand(120)).toBe('2 min real');
    expect(formatStand(90)).toBe('1 min 30 s real');
    expect(formatStand(45)).toBe('45 s real');
  });

  it('names who runs before and after on the same cab, by departure, and ignores other cabs', () => {
    const mine = runsAssignedTo(winter, 'u1');
    expect(mine.map((r) => r.runId)).toEqual(['r1', 'r3']);
    expect(mine[0]!.before).toBeNull();
    expect(mine[0]!.after).toMatchObject({ runId: 'r2', operatorName: 'Ben', trainName: 'Stopper', fastDepart: '07:00' });
    expect(mine[1]!.before).toMatchObject({ runId: 'r2', operatorName: 'Ben' });
    expect(mine[1]!.after).toBeNull();
    const everything = describeRuns(winter);
    expect(everything.map((r) => r.runId)).toEqual(['r1', 'r4', 'r2', 'r3']);
    expect(everything.find((r) => r.runId === 'r4')).toMatchObject({ cabName: 'Cab 2', before: null, after: null, operatorName: null });
  });
});

describe('rows the description cannot fully resolve', () => {
  it('takes steps by their position, a run without steps as standing nowhere, and names what it cannot find by a placeholder', () => {
    const base = rows(new Date('2026-12-05T18:30:00Z'), 'Europe/London');
    const odd = {
      ...base,
      // Steps in reverse order, and none for r3.
      steps: [...base.steps].reverse().filter((s) => s.runId !== 'r3'),
      trains: [],
      cabs: base.cabs.filter((c) => c.id !== 'c2'),
      blocks: base.blocks.filter((b) => b.id !== 'b2'),
      operators: base.operators.filter((o) => o.id !== 'u2'),
    } as Rows;
    const byId = new Map(describeRuns(odd).map((r) => [r.runId, r]));
    expect(byId.get('r1')).toMatchObject({ route: ['Yard', '?', 'Terminus'], trainName: 'Unknown train', cabName: 'Cab 1', standBeforeS: 120, standAfterS: 180 });
    expect(byId.get('r1')!.after).toEqual({ runId: 'r2', operatorId: 'u2', operatorName: null, trainName: 'Unknown train', fastDepart: '07:00', realDepart: '18:45' });
    expect(byId.get('r2')).toMatchObject({ operatorId: 'u2', operatorName: null });
    expect(byId.get('r3')).toMatchObject({ route: [], standBeforeS: 0, standAfterS: 0 });
    expect(byId.get('r4')).toMatchObject({ cabName: 'Unknown cab', operatorId: null, operatorName: null });
  });
});
