import { describe, expect, it } from 'vitest';
import { checkPlan, fastTimeToReal, type Plan } from '@/lib/planning';
import { planNames, withNoun } from '@/lib/planning/names';
import { clashingRuns, highlightOf } from '@/lib/sessions/highlight';
import { fastLabelSeconds, fastMinutes, spanLabel } from '@/lib/sessions/time-labels';
import { floatingIso, utcToZoned, zonedToUtc } from '@/lib/time-zone';

describe('wall clock in a zone ⇄ UTC', () => {
  it('reads London winter time as UTC and summer time as UTC+1 (IANA tz database, Europe/London)', () => {
    expect(zonedToUtc('2031-01-15', '18:30', 'Europe/London')?.toISOString()).toBe('2031-01-15T18:30:00.000Z');
    expect(zonedToUtc('2031-07-15', '18:30', 'Europe/London')?.toISOString()).toBe('2031-07-15T17:30:00.000Z');
    // New York in winter is UTC−5 (EST), Sydney in January UTC+11 (AEDT) — IANA tz database.
    expect(zonedToUtc('2031-01-15', '09:00', 'America/New_York')?.toISOString()).toBe('2031-01-15T14:00:00.000Z');
    expect(zonedToUtc('2031-01-15', '09:00', 'Australia/Sydney')?.toISOString()).toBe('2031-01-14T22:00:00.000Z');
  });

  it('has no instant for the hour skipped when clocks go forward, and takes the first of a repeated hour', () => {
    // Europe/London: 30 March 2031 01:00 GMT jumps to 02:00 BST; 26 October 2031 02:00 BST falls back to 01:00 GMT.
    expect(zonedToUtc('2031-03-30', '01:30', 'Europe/London')).toBeNull();
    expect(zonedToUtc('2031-10-26', '01:30', 'Europe/London')?.toISOString()).toBe('2031-10-26T00:30:00.000Z');
  });

  it('goes back the same way, and gives floating times for the calendar', () => {
    const at = new Date('2031-07-15T17:30:00Z');
    expect(utcToZoned(at, 'Europe/London')).toEqual({ date: '2031-07-15', time: '18:30' });
    expect(utcToZoned(new Date('2031-01-14T22:00:00Z'), 'Australia/Sydney')).toEqual({ date: '2031-01-15', time: '09:00' });
    expect(floatingIso(at.getTime() + 45_000, 'Europe/London')).toBe('2031-07-15T18:30:45');
  });
});

describe('fast clock text', () => {
  const clock = { ratio: 4, fastStart: '06:00' };
  it('turns a fast time into real session seconds: (fast − start) ÷ ratio (common practice for fast clocks)', () => {
    expect(fastTimeToReal('09:00', clock)).toBe(2700);
    expect(fastTimeToReal('06:00:20', clock)).toBe(5);
    // Before the fast start reads as after fast midnight.
    expect(fastTimeToReal('01:00', clock)).toBe(((25 - 6) * 3600) / 4);
    expect(fastTimeToReal('9:00', clock)).toBeNull();
    expect(fastTimeToReal('06:00:75', clock)).toBeNull();
    // Near a real time, the nearest fast day wins: one fast minute before the start is 15 real s before it at 4:1.
    expect(fastTimeToReal('05:59', clock, 0)).toBe(-15);
  });

  it('writes seconds and spans in fast and real time', () => {
    expect(fastLabelSeconds(5, clock)).toBe('06:00:20');
    const session = { ...clock, startsAtMs: Date.parse('2031-01-15T18:30:00Z'), timeZone: 'Europe/London' };
    expect(spanLabel(0, 900, session)).toBe('06:00–07:00 fast · 18:30–18:45 real');
    expect(spanLabel(0, 10, session)).toBe('06:00 fast · 18:30 real');
  });
});

function plan(): Plan {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 4, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Bench', volts: 14.6, amps: 3 }],
    drivers: [{ id: 'd1', name: 'Board', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 2.6 }],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'North', driverId: 'd1', channel: 2 },
    ],
    blocks: [
      { id: 'A', name: 'Yard', lengthMm: 1000 },
      { id: 'B', name: 'Main', lengthMm: 1000 },
    ],
    links: [{ a: 'A', b: 'B' }],
    locomotives: [{ id: 'l1', name: 'Tank', runningAmps: 0.6, stallAmps: 1.2, ratedVolts: 12 }],
    trains: [
      { id: 't1', name: 'Stopper', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 500 },
      { id: 't2', name: '', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 500 },
    ],
    operators: [{ id: 'o1', name: 'Ada' }],
    runs: [
      { id: 'r1', trainId: 't1', cabId: 'c2', operatorId: 'o1', departS: 0, arriveS: 60, steps: [{ blockId: 'A', enterS: 0, exitS: 30 }, { blockId: 'B', enterS: 20, exitS: 60 }] },
      { id: 'r2', trainId: 't2', cabId: 'c2', operatorId: null, departS: 40, arriveS: 90, steps: [{ blockId: 'B', enterS: 40, exitS: 90 }, { blockId: 'A', enterS: 70, exitS: 90 }] },
    ],
  };
}

describe('finding messages name things and say times on the fast clock', () => {
  it('uses names, adds the noun only when the name lacks it, and falls back to a quoted id', () => {
    const names = planNames(plan());
    expect(names.run('r1')).toBe('Stopper (06:00 departure)');
    // t2 has no name: its id stands in.
    expect(names.run('r2')).toBe('"t2" (06:02 departure)');
    expect(withNoun('cab', 'Cab 1')).toBe('Cab 1');
    expect(withNoun('cab', 'North')).toBe('cab North');
    expect(names.span(0, 10)).toBe('at 06:00 fast');
    expect(names.span(0, 60)).toBe('from 06:00 to 06:04 fast');
  });

  it('checkPlan words its findings with them and keeps the ids in ids', () => {
    const { findings } = checkPlan(plan());
    const cab = findings.find((f) => f.kind === 'cab-double-booked')!;
    expect(cab.ids).toEqual(['c2', 'r1', 'r2']);
    // Sentence case: the message starts with a capital even when it starts with a name's noun.
    expect(cab.message).toBe('Cab North is booked for Stopper (06:00 departure) and "t2" (06:02 departure) at once, from 06:02 to 06:04 fast');
    const block = findings.find((f) => f.kind === 'block-overlap' && f.ids[0] === 'B')!;
    expect(block.message).toContain('block Main');
    // 0.6 A + 0.6 A = 1.2 A running on a 1 A channel while both move.
    const power = findings.find((f) => f.kind === 'channel-overload')!;
    expect(power.message).toContain('Cab North draws up to 1.2 A running');
    for (const f of findings) expect(f.message.charAt(0)).toBe(f.message.charAt(0).toUpperCase());
    for (const f of findings) expect(f.message).not.toMatch(/"r[12]"|"c[12]"|"[AB]"/);
  });
});

describe('highlights', () => {
  it('marks what each finding names on every view, and the runs drawing current for power findings', () => {
    const p = plan();
    const layout = { cabs: p.cabs, drivers: p.drivers };
    const { findings } = checkPlan(p);
    const block = findings.find((f) => f.kind === 'block-overlap')!;
    const h = highlightOf(block, p.runs, layout);
    expect([...h.runIds].sort()).toEqual(['r1', 'r2']);
    expect(h.blockIds.has(block.ids[0]!)).toBe(true);
    const power = findings.find((f) => f.kind === 'channel-overload')!;
    const hp = highlightOf(power, p.runs, layout);
    expect([...hp.cabIds]).toEqual(['c2']);
    expect([...hp.runIds].sort()).toEqual(['r1', 'r2']);
    expect([...clashingRuns(findings, p.runs, layout)].sort()).toEqual(['r1', 'r2']);
    expect(clashingRuns(findings.filter((f) => f.severity === 'warning'), p.runs, layout).size).toBe(0);
  });
});

describe('fastMinutes', () => {
  it('scales a real duration by the clock ratio and rounds to the places asked for', () => {
    // Common practice: a fast clock at r:1 shows r fast seconds for each real second.
    expect(fastMinutes(46, { ratio: 4 }, 1)).toBe(3.1);
    expect(fastMinutes(46, { ratio: 4 })).toBe(3);
    expect(fastMinutes(60, { ratio: 6 })).toBe(6);
    expect(fastMinutes(7, { ratio: 4 })).toBe(0);
    expect(fastMinutes(8, { ratio: 4 })).toBe(1);
    expect(fastMinutes(-46, { ratio: 4 }, 1)).toBe(-3.1);
  });
});
