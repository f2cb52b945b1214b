import { beforeEach, describe, expect, it, vi } from 'vitest';
import { FINDING_KINDS, type Finding, type FindingKind } from '@/lib/planning';
import { clashingRuns, FINDING_LABELS, highlightOf, TIMING_KINDS } from '@/lib/sessions/highlight';

// What each view marks for a finding: the runs, blocks and cabs it names, read in the order the engine
// writes a finding's ids (lib/planning/check.ts, polarity.ts, voltage.ts, load.ts: a block clash is
// [block, run, run], a locomotive in two trains [locomotive, train, train], a route gap [run, block,
// block], a power finding [cab | driver | supply]). A power finding marks the runs moving on that cab,
// driver or supply while it lasts; an interval touching the finding's ends counts (common practice: a
// train that starts at the instant of a surge draws the surge).

const runs = [
  { id: 'r1', cabId: 'c1', departS: 0, arriveS: 100, trainId: 't1' },
  { id: 'r2', cabId: 'c2', departS: 50, arriveS: 150, trainId: 't2' },
  { id: 'r3', cabId: 'c1', departS: 200, arriveS: 300, trainId: 't1' },
  { id: 'r4', cabId: 'c3', departS: 0, arriveS: 300, trainId: 't3' },
];
// Cabs c1 and c2 on driver d1 (supply s1), c3 on driver d2 (supply s2).
const layout = {
  cabs: [
    { id: 'c1', driverId: 'd1' },
    { id: 'c2', driverId: 'd1' },
    { id: 'c3', driverId: 'd2' },
  ],
  drivers: [
    { id: 'd1', supplyId: 's1' },
    { id: 'd2', supplyId: 's2' },
  ],
};

const finding = (kind: FindingKind, ids: string[], fromS = 0, toS = 1000, severity: Finding['severity'] = 'error'): Finding =>
  ({ kind, severity, ids, fromS, toS, message: kind }) as Finding;
const marks = (f: Finding) => {
  const h = highlightOf(f, runs, layout);
  return { runs: [...h.runIds].sort(), blocks: [...h.blockIds].sort(), cabs: [...h.cabIds].sort(), fromS: h.fromS, toS: h.toS };
};

describe('highlightOf: each kind marks what its ids name', () => {
  const cases: [FindingKind, string[], { runs?: string[]; blocks?: string[]; cabs?: string[] }][] = [
    ['block-overlap', ['B1', 'r1', 'r2'], { runs: ['r1', 'r2'], blocks: ['B1'] }],
    ['block-occupied', ['B2', 'r3', 'r4'], { runs: ['r3', 'r4'], blocks: ['B2'] }],
    ['cab-double-booked', ['c1', 'r1', 'r3'], { runs: ['r1', 'r3'], cabs: ['c1'] }],
    ['operator-double-booked', ['op1', 'r1', 'r2'], { runs: ['r1', 'r2'] }],
    ['train-double-booked', ['t1', 'r1', 'r3'], { runs: ['r1', 'r3'] }],
    ['train-continuity', ['t1', 'r1', 'r3'], { runs: ['r1', 'r3'] }],
    // Every run of either train: the locomotive is in both.
    ['locomotive-in-two-trains', ['L1', 't1', 't3'], { runs: ['r1', 'r3', 'r4'] }],
    ['route-gap', ['r2', 'B1', 'B3'], { runs: ['r2'], blocks: ['B1', 'B3'] }],
    ['step-gap', ['r2', 'B1', 'B3'], { runs: ['r2'], blocks: ['B1', 'B3'] }],
    ['joint-short', ['r4', 'B2', 'B5'], { runs: ['r4'], blocks: ['B2', 'B5'] }],
    ['train-too-long', ['r1', 'B4'], { runs: ['r1'], blocks: ['B4'] }],
    ['route-reversal', ['r3', 'B4'], { runs: ['r3'], blocks: ['B4'] }],
    ['reversing-section-short', ['r4', 'B6'], { runs: ['r4'], blocks: ['B6'] }],
    ['reversing-loop', ['B1', 'B2', 'B3', 'B4'], { blocks: ['B1', 'B2', 'B3', 'B4'] }],
    ['joint-wiring', ['B5', 'B6'], { blocks: ['B5', 'B6'] }],
    ['speed-not-reachable', ['r2', 'L2'], { runs: ['r2'] }],
    // Power: the cab, and the runs on it while the finding lasts.
    ['channel-overload', ['c1'], { runs: ['r1', 'r3'], cabs: ['c1'] }],
    ['channel-peak-overload', ['c2'], { runs: ['r2'], cabs: ['c2'] }],
    ['track-voltage-low', ['c3', 'L1'], { runs: ['r4'], cabs: ['c3'] }],
    ['track-voltage-high', ['c1'], { runs: ['r1', 'r3'], cabs: ['c1'] }],
    // A driver: every cab it feeds; a supply: every cab of every driver on it.
    ['driver-overload', ['d1'], { runs: ['r1', 'r2', 'r3'], cabs: ['c1', 'c2'] }],
    ['driver-heat', ['d2'], { runs: ['r4'], cabs: ['c3'] }],
    ['supply-overload', ['s1'], { runs: ['r1', 'r2', 'r3'], cabs: ['c1', 'c2'] }],
    ['supply-derate', ['s2'], { runs: ['r4'], cabs: ['c3'] }],
  ];

  it('covers every kind the engine reports', () => {
    expect(new Set(cases.map(([kind]) => kind))).toEqual(new Set(FINDING_KINDS));
    expect(Object.keys(FINDING_LABELS).sort()).toEqual([...FINDING_KINDS].sort());
  });

  for (const [kind, ids, want] of cases) {
    it(`${kind} [${ids.join(', ')}]`, () => {
      expect(marks(finding(kind, ids, 0, 1000))).toEqual({ runs: want.runs ?? [], blocks: want.blocks ?? [], cabs: want.cabs ?? [], fromS: 0, toS: 1000 });
    });
  }

  it('missing ids mark nothing (no undefined or empty name in any set)', () => {
    for (const [kind] of cases) {
      const h = marks(finding(kind, []));
      expect({ runs: h.runs, blocks: h.blocks, cabs: h.cabs }, kind).toEqual({ runs: [], blocks: [], cabs: [] });
    }
    // A two-run finding with one run named marks that one.
    expect(marks(finding('block-overlap', ['B1', 'r1'])).runs).toEqual(['r1']);
    expect(marks(finding('cab-double-booked', ['c1', '', 'r3']))).toMatchObject({ runs: ['r3'], cabs: ['c1'] });
    expect(marks(finding('route-gap', ['r2', '', 'B3'])).blocks).toEqual(['B3']);
    expect(marks(finding('train-too-long', ['', 'B4']))).toMatchObject({ runs: [], blocks: ['B4'] });
  });
});

describe('highlightOf: the runs a power finding names are the ones moving while it lasts', () => {
  it('an interval inside one run marks that run only', () => {
    expect(marks(finding('channel-overload', ['c1'], 210, 250)).runs).toEqual(['r3']);
    expect(marks(finding('supply-overload', ['s1'], 120, 140)).runs).toEqual(['r2']);
  });

  it('touching ends count: a run arriving at the start, or departing at the end, was drawing current then', () => {
    expect(marks(finding('channel-overload', ['c1'], 100, 200)).runs).toEqual(['r1', 'r3']);
    expect(marks(finding('driver-overload', ['d1'], 150, 160)).runs).toEqual(['r2']);
  });

  it('a zero-length interval (a start-up surge) still marks the runs moving at that instant', () => {
    expect(marks(finding('channel-peak-overload', ['c1'], 200, 200)).runs).toEqual(['r3']);
    expect(marks(finding('channel-peak-overload', ['c1'], 150, 150)).runs).toEqual([]);
    expect(marks(finding('driver-heat', ['d1'], 50, 50)).runs).toEqual(['r1', 'r2']);
  });

  it('a gap between runs marks the cab and no run', () => {
    expect(marks(finding('track-voltage-high', ['c1'], 101, 199))).toMatchObject({ runs: [], cabs: ['c1'] });
    expect(marks(finding('supply-derate', ['s1'], 151, 199))).toMatchObject({ runs: [], cabs: ['c1', 'c2'] });
  });

  it('keeps the finding’s interval', () => {
    expect(marks(finding('driver-overload', ['d1'], 12.5, 80))).toMatchObject({ fromS: 12.5, toS: 80 });
  });
});

describe('clashingRuns and TIMING_KINDS', () => {
  it('marks the runs of error findings only', () => {
    const errors = [finding('block-overlap', ['B1', 'r1', 'r2']), finding('channel-overload', ['c1'], 250, 260)];
    const warnings = [finding('driver-heat', ['d2'], 0, 300, 'warning'), finding('speed-not-reachable', ['r4', 'L1'], 0, 0, 'warning')];
    expect([...clashingRuns([...errors, ...warnings], runs, layout)].sort()).toEqual(['r1', 'r2', 'r3']);
    expect(clashingRuns(warnings, runs, layout).size).toBe(0);
    expect(clashingRuns([], runs, layout).size).toBe(0);
  });

  it('a retime can clear block clashes and double bookings, not a standing train, power or wiring', () => {
    expect([...TIMING_KINDS].sort()).toEqual(['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked']);
    for (const kind of ['block-occupied', 'channel-overload', 'joint-wiring', 'route-gap'] as const) expect(TIMING_KINDS.has(kind)).toBe(false);
  });
});

// The labels and the retime kinds are built when the module is imported; Stryker's Vitest runner switches
// a mutant on in a beforeAll hook, after this file's own imports, so these checks load a fresh copy.
describe('FINDING_LABELS and TIMING_KINDS as loaded', () => {
  let fresh: typeof import('@/lib/sessions/highlight');
  beforeEach(async () => {
    vi.resetModules();
    fresh = await import('@/lib/sessions/highlight');
  });

  it('every kind has its own label: a short phrase starting with a capital, none shared (common practice for list headings)', () => {
    const labels = FINDING_KINDS.map((kind) => fresh.FINDING_LABELS[kind]);
    for (const [i, label] of labels.entries()) expect(label, FINDING_KINDS[i]).toMatch(/^[A-Z][a-z-]*( [A-Za-z-]+){1,6}$/);
    expect(new Set(labels).size).toBe(FINDING_KINDS.length);
  });

  it('a label names what its kind is about', () => {
    const about: Record<FindingKind, RegExp> = {
      'block-overlap': /block/i, 'block-occupied': /block/i, 'cab-double-booked': /cab/i, 'operator-double-booked': /operator/i,
      'train-double-booked': /train/i, 'locomotive-in-two-trains': /locomotive/i, 'train-continuity': /train/i, 'route-gap': /route/i,
      'step-gap': /steps/i, 'train-too-long': /long/i, 'route-reversal': /revers/i, 'reversing-loop': /loop/i, 'joint-wiring': /joint/i,
      'joint-short': /short/i, 'reversing-section-short': /reversing section/i, 'channel-overload': /channel/i,
      'channel-peak-overload': /surge/i, 'driver-overload': /driver/i, 'driver-heat': /hot/i, 'supply-overload': /supply/i,
      'supply-derate': /supply/i, 'track-voltage-high': /voltage high/i, 'track-voltage-low': /voltage low/i, 'speed-not-reachable': /speed/i,
    };
    for (const kind of FINDING_KINDS) expect(fresh.FINDING_LABELS[kind], kind).toMatch(about[kind]);
  });

  it('the retime kinds are the four clashes of timing', () => {
    expect([...fresh.TIMING_KINDS].sort()).toEqual(['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked']);
  });
});
