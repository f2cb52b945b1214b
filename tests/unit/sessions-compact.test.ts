import { describe, expect, it } from 'vitest';
import type { LoadProfile } from '@/lib/planning';
import { compactFindings, compactLoad, compactSnapshot, expandFindings, expandLoad, expandSnapshot, knownIds } from '@/lib/sessions/compact';
import type { Finding } from '@/lib/planning';
import type { TimetableLayout, TimetableSnapshot } from '@/lib/sessions/types';

// The builder page's compact props must decode to exactly what the server computed (common practice:
// an encoding is checked by its round trip), and must actually be smaller than the plain JSON.
const layout: TimetableLayout = {
  scaleRatio: 87,
  blocks: [
    { id: 'block-aaaaaaaa-1', name: 'Yard', lengthMm: 1200, positionMm: 0 },
    { id: 'block-aaaaaaaa-2', name: 'Main', lengthMm: 2400, positionMm: 1200 },
  ],
  links: [{ a: 'block-aaaaaaaa-1', b: 'block-aaaaaaaa-2', aEnd: 'b', bEnd: 'a' }],
  cabs: [{ id: 'cab-1', name: 'Cab 1', driverId: 'drv-1', channel: 0 }],
  drivers: [{ id: 'drv-1', name: 'Driver A', supplyId: 'sup-1' }],
  supplies: [{ id: 'sup-1', name: 'Bench supply' }],
  trains: [{ id: 'train-1', name: 'Stopper', lengthMm: 600, topSpeedKmh: 80 }],
  operators: [{ id: 'op-1', name: 'Ann', reply: null }],
};

const snapshot: TimetableSnapshot = {
  session: {
    id: 's1', railwayId: 'r1', title: 'Evening', status: 'draft', version: 3, sequence: 0, startsAtMs: 0, endsAtMs: 3_600_000,
    timeZone: 'UTC', clockRatio: 4, fastStart: '06:00', headwayS: 30, surgeS: 2, derate: 0.8,
  },
  runs: [
    {
      id: 'run-1', version: 2, trainId: 'train-1', cabId: 'cab-1', operatorId: 'op-1', departS: 10.5, arriveS: 70.25, speedKmh: 40, note: 'first',
      // The travel direction the route finder recorded (either end, or only one of them) comes back too.
      steps: [
        { blockId: 'block-aaaaaaaa-1', enterS: 10.5, exitS: 40, fromEnd: 'a', toEnd: 'b' },
        { blockId: 'block-aaaaaaaa-2', enterS: 40, exitS: 70.25, toEnd: 'a' },
      ],
    },
    // An operator no longer in the crew list and a block the layout lost keep their ids.
    {
      id: 'run-2', version: 1, trainId: 'train-1', cabId: 'cab-1', operatorId: 'op-gone', departS: 100, arriveS: 130, speedKmh: null, note: '',
      steps: [{ blockId: 'block-gone', enterS: 100, exitS: 130 }],
    },
    { id: 'run-3', version: 1, trainId: 'train-1', cabId: 'cab-1', operatorId: null, departS: 200, arriveS: 230, speedKmh: null, note: '', steps: [] },
  ],
  findings: [{ kind: 'block-overlap', severity: 'error', ids: ['block-aaaaaaaa-1', 'run-1', 'run-2'], fromS: 10, toS: 20, message: 'Two runs share Yard.' }],
  counts: {} as TimetableSnapshot['counts'],
  totals: { errors: 1, warnings: 0 },
  truncated: false,
  checkMs: 1.5,
};

describe('compact builder props', () => {
  it('decode to the snapshot the server computed, references outside the layout included', () => {
    const compact = compactSnapshot(snapshot, layout);
    expect(expandSnapshot(compact, layout)).toEqual(snapshot);
    // Survives the trip through JSON (the page's payload) as well.
    expect(expandSnapshot(JSON.parse(JSON.stringify(compact)), layout)).toEqual(snapshot);
    expect(compact.runs[0]![2]).toBe(0);
    expect(compact.runs[1]![4]).toBe('op-gone');
    expect(compact.runs[2]![4]).toBeNull();
    // Steps are flat, four cells each: block, enterS, exitS, fromEnd × 3 + toEnd (0 none, 1 a, 2 b).
    expect(compact.runs[0]![9]).toEqual([0, 10.5, 40, 1 * 3 + 2, 1, 40, 70.25, 0 * 3 + 1]);
    expect(compact.runs[1]![9]).toEqual(['block-gone', 100, 130, 0]);
  });

  it('are smaller than the plain runs', () => {
    const plain = JSON.stringify(snapshot.runs).length;
    const compact = JSON.stringify(compactSnapshot(snapshot, layout).runs).length;
    expect(compact).toBeLessThan(plain * 0.7);
  });

  it('load series travel by id and get their names back from the layout', () => {
    const series = { limitAmps: 2, runningLimitAmps: 2, peakLimitAmps: 3, surgeJudgedContinuous: false, points: [[0, 0.5, 0.9]] as [number, number, number][], maxRunningAmps: 0.5, maxPeakAmps: 0.9, heat: null };
    const load: LoadProfile = {
      cabs: [{ id: 'cab-1', name: 'Cab 1', ...series }],
      drivers: [{ id: 'drv-1', name: 'Driver A', ...series }],
      supplies: [{ id: 'sup-1', name: 'Bench supply', ...series }, { id: 'sup-x', name: 'Gone', ...series }],
    };
    const wire = compactLoad(load);
    expect(JSON.stringify(wire)).not.toContain('Bench supply');
    expect(expandLoad(wire, layout)).toEqual({ ...load, supplies: [load.supplies[0], { ...load.supplies[1], name: 'Unnamed' }] });
  });

  it('findings name each id and each message piece once and decode to what the engine said', () => {
    const findings: Finding[] = [
      { kind: 'cab-double-booked', severity: 'error', ids: ['cab-1', 'run-1', 'run-2'], fromS: 10.5, toS: 20, message: 'Cab 1 is booked for Stopper (06:00 departure) and Stopper (06:08 departure) at once, from 06:01 to 06:02 fast' },
      { kind: 'channel-peak-overload', severity: 'warning', ids: ['cab-1'], fromS: 30, toS: 31, message: 'Cab 1 draws up to 1.6 A while trains start at 06:02 fast; keep it short (NEM 630 Table 2)', peakAmps: 1.6, limitAmps: 1.2 },
      { kind: 'driver-heat', severity: 'warning', ids: ['drv-1'], fromS: 40, toS: 50, message: 'Driver A dissipates 2.1 W; keep it short (NEM 630 Table 2)', peakWatts: 2.1, limitWatts: 2 },
      // An id nobody holds (a locomotive) travels in the findings' own list.
      { kind: 'train-too-long', severity: 'error', ids: ['loco-9', 'loco-9'], fromS: 0, toS: 0, message: '' },
    ];
    const known = knownIds(snapshot.runs, layout);
    const wire = compactFindings(findings, known);
    expect(expandFindings(JSON.parse(JSON.stringify(wire)), known)).toEqual(findings);
    expect(wire.ids).toEqual(['loco-9']);
    expect(wire.list[3]![2]).toEqual([known.length, known.length]);
    expect(wire.list[0]![2]).toEqual([known.indexOf('cab-1'), 0, 1]);
    // A repeated aside is sent once.
    expect(wire.phrases.filter((p) => p.includes('NEM 630'))).toHaveLength(1);
    expect(wire.list[0]![0]).not.toBe(wire.list[1]![0]);
    // Without known ids (an answer read by an outside tool) every id is in the list.
    expect(expandFindings(compactFindings(findings), [])).toEqual(findings);
    expect(compactFindings(findings).ids).toEqual(['cab-1', 'run-1', 'run-2', 'drv-1', 'loco-9']);
    expect(JSON.stringify(wire).length).toBeLessThan(JSON.stringify(findings).length * 0.7);
  });
});
