import { describe, expect, it } from 'vitest';
import type { Plan } from '@/lib/planning';
import { cabDirections, compareEntries, compileSchedule, travelDirections, type ControlEntry, type ControlFinding, type WiringSheet } from '@/lib/control';
import { plan, T, wiring } from './worked-example-plan';

/*
 * compileSchedule case by case on the worked example (tests/unit/control/worked-example-plan.ts: H0,
 * 60 km/h over two 2 m blocks in T = 24.38 s, ramps 4 s up and 3 s down, PWM 113, lead 1 s, release
 * 0.5 s, dead time 300 ms, break 50 ms; the schedule's origin is session second −1 unless a setting
 * comes earlier). Each run the schedule cannot drive safely is left out with a finding that says why;
 * the rules are the common practice of cab control with block relays (DOMAIN.md: one cab per block,
 * dead time before a direction change, a reversing section flips only with the train wholly inside it).
 */
type Input = { plan: Plan; wiring: WiringSheet; speeds?: Record<string, number | null>; tops?: Record<string, number> };
const compile = ({ plan: p, wiring: w, speeds, tops }: Input) =>
  compileSchedule({ plan: p, wiring: w, runSpeedKmh: speeds ?? Object.fromEntries(p.runs.map((r) => [r.id, null])), locomotiveTopSpeedKmh: tops ?? { l: 120 } });
const outOnly = () => {
  const p = plan();
  p.runs = [p.runs[0]!];
  return p;
};
/** The finding for the worked example's out run (departs 07:00 fast time at session second 10). */
const leftOut = (why: string, ids: string[] = [], run = 'out', fromS = 10, toS = 10 + T): ControlFinding => ({
  kind: 'control-left-out',
  severity: 'error',
  ids: [run, ...ids],
  fromS,
  toS,
  message: `Goods (07:00 departure) is left out of the control schedule: ${why}`,
});
const withBlock = (w: WiringSheet, blockId: string, change: Partial<WiringSheet['blocks'][number]>): WiringSheet => ({
  ...w,
  blocks: w.blocks.map((b) => (b.blockId === blockId ? { ...b, ...change } : b)),
});
type Plain = { at: number } & Record<string, unknown>;
/** Entries with session seconds (origin added back) instead of atMs, for comparing with the hand-worked times. */
const plain = (entries: ControlEntry[], originS: number): Plain[] =>
  entries.map(({ atMs, ...rest }) => ({ at: Math.round((atMs / 1000 + originS) * 1000) / 1000, ...rest }));

describe('compileSchedule leaves out, with a finding, every run it cannot drive safely', () => {
  it('a run whose cab is not on the wiring sheet', () => {
    const s = compile({ plan: outOnly(), wiring: { ...wiring, cabs: [] } });
    expect(s.findings).toEqual([leftOut('Cab 1 is not on the wiring sheet')]);
    expect([s.runs, s.entries, s.endMs, s.cabs]).toEqual([[], [], 0, []]);
  });

  it('a run through a block with no relay to its cab, naming the block', () => {
    const s = compile({ plan: outOnly(), wiring: withBlock(wiring, 'b2', { feeds: [] }) });
    expect(s.findings).toEqual([leftOut('B2 has no relay to Cab 1', ['b2'])]);
  });

  it('names a cab or block the plan does not know by its id', () => {
    const p = outOnly();
    p.runs[0] = { ...p.runs[0]!, cabId: 'c9' };
    expect(compile({ plan: p, wiring }).findings).toEqual([leftOut('c9 is not on the wiring sheet')]);
    const q = outOnly();
    q.runs[0]!.steps[1] = { ...q.runs[0]!.steps[1]!, blockId: 'b9' };
    expect(compile({ plan: q, wiring }).findings).toEqual([leftOut('b9 has no relay to Cab 1', ['b9'])]);
  });

  it('a run that stays in one block', () => {
    const p = outOnly();
    p.runs[0]!.steps = [{ blockId: 'b1', enterS: 10, exitS: 10 + T }];
    expect(compile({ plan: p, wiring }).findings).toEqual([leftOut('it does not leave its block')]);
  });

  it('a run with a step wholly before its departure or after its arrival', () => {
    for (const step of [
      { blockId: 'b1', enterS: 5, exitS: 10 },
      { blockId: 'b1', enterS: 10 + T, exitS: 40 },
    ]) {
      const p = outOnly();
      p.runs[0]!.steps = [step, ...p.runs[0]!.steps.slice(1)];
      expect(compile({ plan: p, wiring }).findings).toEqual([leftOut('a step lies wholly before its departure or after its arrival')]);
    }
    // A step that only touches the departure from inside is fine.
    const p = outOnly();
    p.runs[0]!.steps[0] = { blockId: 'b1', enterS: 5, exitS: 10.5 };
    expect(compile({ plan: p, wiring }).findings).toEqual([]);
  });

  it('a run that enters a block and leaves it by the same end (the engine\'s ends): it would have to stop and reverse there', () => {
    const p = outOnly();
    // b1 → b2 → b1: into b2 by its a end and out again by its a end.
    p.runs[0]!.steps = [
      { blockId: 'b1', enterS: 10, exitS: 19 },
      { blockId: 'b2', enterS: 18, exitS: 27 },
      { blockId: 'b1', enterS: 26, exitS: 10 + T },
    ];
    expect(compile({ plan: p, wiring }).findings).toEqual([leftOut('it changes direction in B2: the cab would have to stop and reverse there; make it two runs', ['b2'])]);
  });

  it('a run across blocks wired for opposite directions with no reversing section between (NEM 631 2.3: the train would short the gap)', () => {
    const p = outOnly();
    p.blocks = p.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b));
    expect(compile({ plan: p, wiring }).findings).toEqual([
      leftOut('the cab would have to drive B2 and B3 in opposite directions with no reversing section between: the train would short the gap'),
    ]);
    // The first block differs from the rest: the gap between it and the second.
    const q = outOnly();
    q.blocks = q.blocks.map((b) => (b.id === 'b1' ? { ...b, positiveRail: 'right' } : b));
    expect(compile({ plan: q, wiring }).findings).toEqual([
      leftOut('the cab would have to drive B1 and B2 in opposite directions with no reversing section between: the train would short the gap'),
    ]);
  });

  it('a first block the layout calls a reversing section, with no polarity relay on the sheet, is named as such', () => {
    // b1 wired + on the right: heading for b it needs forward, b2 and b3 reverse (NEM 631 2.3).
    const p = outOnly();
    p.blocks = p.blocks.map((b) => (b.id === 'b1' ? { ...b, positiveRail: 'right', reversingSection: true } : b));
    expect(compile({ plan: p, wiring }).findings).toEqual([leftOut('B1 is a reversing section on the layout but the wiring sheet gives it no polarity relay')]);
    // With its relay the run starts in the section, swapped, and the cab drives what b2 and b3 need throughout.
    const s = compile({ plan: p, wiring: withBlock(wiring, 'b1', { polarityPin: 'GPIO19' }) });
    expect(s.findings).toEqual([]);
    expect(s.runs[0]!.directions).toEqual(['reverse', 'reverse', 'reverse']);
    expect(plain(s.entries, s.originS).filter((e) => e.kind === 'polarity')).toEqual([{ at: 9, kind: 'polarity', blockId: 'b1', polarity: 'swapped' }]);
  });

  it('a run whose train the plan does not have', () => {
    const p = outOnly();
    p.runs[0] = { ...p.runs[0]!, trainId: 't9' };
    expect(compile({ plan: p, wiring }).findings).toEqual([
      { ...leftOut('its train t9 is not in the plan'), message: 't9 (07:00 departure) is left out of the control schedule: its train t9 is not in the plan' },
    ]);
  });

  it('a run through a block with relays to other cabs only', () => {
    const w = withBlock(wiring, 'b2', { feeds: [{ cabId: 'c2', pin: 'GPIO6' }] });
    expect(compile({ plan: outOnly(), wiring: w }).findings).toEqual([leftOut('B2 has no relay to Cab 1', ['b2'])]);
  });

  it('a run through a block wired on the sheet but not on the layout: its length, and so its speed, is unknown', () => {
    const p = outOnly();
    // Every block wired the same way round (no positive rail recorded), so the directions agree.
    p.blocks = p.blocks.map(({ positiveRail: _, ...b }) => b);
    p.runs[0]!.steps[1] = { ...p.runs[0]!.steps[1]!, blockId: 'b9' };
    const w = { ...wiring, blocks: [...wiring.blocks, { blockId: 'b9', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'GPIO26' }], polarityPin: null, forwardTowards: [] }] };
    expect(compile({ plan: p, wiring: w }).findings).toEqual([leftOut('the length of its route is unknown (a block is not on the layout), so its speed is too')]);
  });

  it('a broken direction is reported before a missing locomotive figure', () => {
    const p = outOnly();
    p.blocks = p.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b));
    expect(compile({ plan: p, wiring, tops: {} }).findings).toEqual([
      leftOut('the cab would have to drive B2 and B3 in opposite directions with no reversing section between: the train would short the gap'),
    ]);
  });

  it('a run whose cab, driver, supply or one of its locomotives the plan does not have', () => {
    const missing = leftOut('its locomotives, driver or supply are missing');
    // A cab on the sheet (c9, fed everywhere) that the plan does not have: no driver.
    const p = outOnly();
    p.runs[0] = { ...p.runs[0]!, cabId: 'c9' };
    const w: WiringSheet = {
      ...wiring,
      cabs: [...wiring.cabs, { cabId: 'c9', boardId: 'u', forwardPin: 'GPIO22', reversePin: 'GPIO23', pwmPin: 'GPIO12', bothHighBrakes: false }],
      blocks: wiring.blocks.map((b, i) => ({ ...b, feeds: [...b.feeds, { cabId: 'c9', pin: `GPIO${[24, 25, 16][i]}` }] })),
    };
    expect(compile({ plan: p, wiring: w }).findings).toEqual([missing]);
    // A driver whose supply is not in the plan.
    const q = outOnly();
    q.drivers = q.drivers.map((d) => ({ ...d, supplyId: 'nowhere' }));
    expect(compile({ plan: q, wiring }).findings).toEqual([missing]);
    // A second locomotive the plan does not have.
    const r = outOnly();
    r.trains = r.trains.map((t) => ({ ...t, locomotiveIds: ['l', 'l9'] }));
    expect(compile({ plan: r, wiring, tops: { l: 120, l9: 120 } }).findings).toEqual([missing]);
  });

  it('a MOSFET bridge drops 0.5 Ω × the train\'s running current (DOMAIN.md, dual low-voltage MOSFET class): 0.15 V at 0.3 A, so 6 V of 14.85 V × 255 = 103', () => {
    const p = outOnly();
    const line = { fixedVolts: 0, ohms: 0.5 };
    p.drivers = p.drivers.map((d) => ({ ...d, dropVolts: undefined, drop: { min: line, max: line } }));
    expect(compile({ plan: p, wiring }).runs.map((r) => r.pwm)).toEqual([103]);
  });

  it('a locomotive that needs 2.1 V to start gets the PWM dutyFor gives it: (2.1 + 9.9 × 60 ÷ 120) V of 13.5 V × 255 = 133', () => {
    const p = outOnly();
    p.locomotives = p.locomotives.map((l) => ({ ...l, startVolts: 2.1 }));
    expect(compile({ plan: p, wiring }).runs.map((r) => r.pwm)).toEqual([133]);
  });

  it('a run whose locomotive top speed, driver or supply is missing', () => {
    expect(compile({ plan: outOnly(), wiring, tops: {} }).findings).toEqual([leftOut('its locomotives, driver or supply are missing')]);
    const p = outOnly();
    p.cabs = p.cabs.map((c) => ({ ...c, driverId: 'nobody' }));
    expect(compile({ plan: p, wiring }).findings).toEqual([leftOut('its locomotives, driver or supply are missing')]);
  });

  it('a run faster than the cab can drive its locomotive (dutyFor\'s reason), and one so slow its PWM rounds to 0', () => {
    // 150 km/h from a 120 km/h locomotive needs 15 V of the rails' 13.5 V.
    const fast = compile({ plan: outOnly(), wiring, speeds: { out: 150 } });
    expect(fast.findings).toHaveLength(1);
    expect(fast.findings[0]!.message).toMatch(/^Goods \(07:00 departure\) is left out of the control schedule: Loco: \S/);
    expect(fast.runs).toEqual([]);
    // 0.2 km/h: 12 V × 0.2 ÷ 120 = 0.02 V of 13.5 V, × 255 = 0.38 → PWM 0.
    expect(compile({ plan: outOnly(), wiring, speeds: { out: 0.2 } }).findings).toEqual([leftOut('its speed gives a PWM value of 0')]);
    // 0.3 km/h: × 255 = 0.57 → PWM 1, the least that moves.
    expect(compile({ plan: outOnly(), wiring, speeds: { out: 0.3 } }).runs.map((r) => r.pwm)).toEqual([1]);
  });

  it('a run on a cab still busy with an earlier run, and of two departing together the one with the later id', () => {
    const p = plan();
    p.runs[1] = { ...p.runs[1]!, departS: 30, arriveS: 30 + T, steps: p.runs[1]!.steps.map((s) => ({ ...s, enterS: s.enterS - 70, exitS: s.exitS - 70 })) };
    const s = compile({ plan: p, wiring });
    expect(s.findings).toEqual([leftOut('Cab 1 is still driving another run', ['out'], 'back', 30, 30 + T)]);
    // Listed in the plan in the other order, departing together: "back" sorts before "out".
    const q = plan();
    q.runs = [q.runs[0]!, { ...q.runs[0]!, id: 'back' }];
    for (const runs of [q.runs, [...q.runs].reverse()]) {
      const t = compile({ plan: { ...q, runs }, wiring });
      expect(t.runs.map((r) => r.runId)).toEqual(['back']);
      expect(t.findings.map((f) => f.ids)).toEqual([['out', 'back']]);
    }
  });

  it('a cab is busy from a lead second before departure until the dead time after arrival (its direction off), or its last release if later', () => {
    // Release 0.1 s, shorter than the 0.3 s dead time: the out run holds c1 until 34.38 + 0.3 s.
    const quick = { ...wiring, timing: { ...wiring.timing, releaseS: 0.1 } };
    const second = (departS: number) => {
      const p = plan();
      const back = p.runs[1]!;
      p.runs[1] = { ...back, departS, arriveS: departS + T, steps: back.steps.map((st) => ({ ...st, enterS: st.enterS - 100 + departS, exitS: st.exitS - 100 + departS })) };
      return compile({ plan: p, wiring: quick });
    };
    // The back run's window opens a lead second (1 s) before its departure.
    expect(second(10 + T + 0.3 + 1 + 0.01).findings).toEqual([]);
    expect(second(10 + T + 0.3 + 1 - 0.01).findings.map((f) => f.message)).toEqual(['Goods (07:00 departure) is left out of the control schedule: Cab 1 is still driving another run']);
    // A run ending just as the out run's window opens (9 s) is clear of it; one a moment later is not.
    const before = (arriveS: number) => {
      const p = plan();
      const back = p.runs[1]!;
      const departS = arriveS - T;
      p.runs[1] = { ...back, departS, arriveS, steps: back.steps.map((st) => ({ ...st, enterS: st.enterS - 100 + departS, exitS: st.exitS - 100 + departS })) };
      return compile({ plan: p, wiring: quick });
    };
    expect(before(-100).runs.map((r) => r.runId)).toEqual(['back', 'out']);
    expect(before(9 - 0.3 - 0.01).runs.map((r) => r.runId)).toEqual(['back', 'out']);
    expect(before(9 - 0.3 + 0.01).runs.map((r) => r.runId)).toEqual(['back']);
  });

  it('runs in departure order whatever the plan\'s order', () => {
    const p = plan();
    p.runs = [p.runs[1]!, p.runs[0]!];
    expect(compile({ plan: p, wiring }).runs.map((r) => r.runId)).toEqual(['out', 'back']);
  });
});

describe('compileSchedule: a block held for one cab is not given to another within the break time', () => {
  // A second cab on a second driver channel, fed to every block.
  const twoCabs = (): { plan: Plan; wiring: WiringSheet } => {
    const p = plan();
    p.drivers = p.drivers.map((d) => ({ ...d, channels: 2 }));
    p.cabs = [...p.cabs, { id: 'c2', name: 'Cab 2', driverId: 'd', channel: 2 }];
    p.trains = [...p.trains, { ...p.trains[0]!, id: 't2', name: 'Mixed' }];
    const w: WiringSheet = {
      ...wiring,
      cabs: [...wiring.cabs, { cabId: 'c2', boardId: 'u', forwardPin: 'GPIO22', reversePin: 'GPIO23', pwmPin: 'GPIO12', bothHighBrakes: false }],
      blocks: wiring.blocks.map((b, i) => ({ ...b, feeds: [...b.feeds, { cabId: 'c2', pin: `GPIO${[24, 25, 16][i]}` }] })),
    };
    return { plan: p, wiring: w };
  };
  /**
   * The out run holds b3 until its arrival + release: 34.38 + 0.5 = 34.88 s. A c2 run from b3 back to b1
   * whose b3 window opens `gapS` after that: its feed opens a lead second (1 s) before its departure.
   */
  const after = (gapS: number) => {
    const { plan: p, wiring: w } = twoCabs();
    const depart = 10 + T + 0.5 + gapS + 1;
    const back = p.runs[1]!;
    p.runs[1] = { ...back, trainId: 't2', cabId: 'c2', departS: depart, arriveS: depart + T, steps: back.steps.map((s) => ({ ...s, enterS: s.enterS - 100 + depart, exitS: s.exitS - 100 + depart })) };
    return compile({ plan: p, wiring: w });
  };

  it('49 ms after the release is refused, naming the block and the run holding it; 51 ms after is not', () => {
    const early = after(0.049);
    expect(early.findings.map((f) => [f.ids, f.message])).toEqual([
      [['back', 'b3', 'out'], 'Mixed (07:00 departure) is left out of the control schedule: B3 is still fed for another run'],
    ]);
    const late = after(0.051);
    expect(late.findings).toEqual([]);
    expect(late.runs.map((r) => r.runId)).toEqual(['out', 'back']);
  });
});

describe('compileSchedule: the settings of the worked example, worked by hand', () => {
  it('one run: connect each block a lead second before the train enters, release it half a second after it leaves, ramps at the train\'s rates', () => {
    const s = compile({ plan: outOnly(), wiring });
    expect(s.originS).toBe(-1);
    // Steps: b1 10–19.127, b2 18.127–27.253, b3 26.253–34.38 (T / 3 = 8.127 apart, each held 1 s more).
    expect(plain(s.entries, s.originS)).toEqual([
      { at: 9, kind: 'feed', blockId: 'b1', cabId: 'c1' },
      { at: 9, kind: 'direction', cabId: 'c1', direction: 'reverse' },
      { at: 10, kind: 'speed', cabId: 'c1', from: 0, to: 113, rampMs: 4000 },
      { at: 17.127, kind: 'feed', blockId: 'b2', cabId: 'c1' },
      { at: 19.627, kind: 'feed', blockId: 'b1', cabId: null },
      { at: 25.253, kind: 'feed', blockId: 'b3', cabId: 'c1' },
      { at: 27.753, kind: 'feed', blockId: 'b2', cabId: null },
      { at: 31.38, kind: 'speed', cabId: 'c1', from: 113, to: 0, rampMs: 3000 },
      { at: 34.68, kind: 'direction', cabId: 'c1', direction: 'off' },
      { at: 34.88, kind: 'feed', blockId: 'b3', cabId: null },
    ]);
    expect(s.endMs).toBe(35_880);
    expect(s.runs).toEqual([{ runId: 'out', trainId: 't', cabId: 'c1', departS: 10, arriveS: 10 + T, pwm: 113, speedKmh: expect.closeTo(60, 6), directions: ['reverse', 'reverse', 'reverse'] }]);
    expect(s.cabs).toEqual([{ cabId: 'c1', name: 'Cab 1' }]);
    expect(s.blocks).toEqual(['b1', 'b2', 'b3'].map((id) => ({ blockId: id, name: id.toUpperCase(), reversing: false })));
  });

  it('shortens both ramps in proportion when the run is too short for them: 5.6 s for 4 + 3 s of ramps gives 3.2 s and 2.4 s', () => {
    const p = outOnly();
    p.runs[0] = { ...p.runs[0]!, arriveS: 15.6, steps: [{ blockId: 'b1', enterS: 10, exitS: 13 }, { blockId: 'b2', enterS: 12, exitS: 15.6 }] };
    const s = compile({ plan: p, wiring, speeds: { out: 60 } });
    expect(plain(s.entries, s.originS).filter((e) => e.kind === 'speed')).toEqual([
      { at: 10, kind: 'speed', cabId: 'c1', from: 0, to: 113, rampMs: 3200 },
      { at: 13.2, kind: 'speed', cabId: 'c1', from: 113, to: 0, rampMs: 2400 },
    ]);
  });

  it('an origin before the first setting: a run departing at session second 0 connects at −1, so the origin is −2', () => {
    const p = outOnly();
    const shift = (x: number) => x - 10;
    p.runs[0] = { ...p.runs[0]!, departS: 0, arriveS: T, steps: p.runs[0]!.steps.map((st) => ({ ...st, enterS: shift(st.enterS), exitS: shift(st.exitS) })) };
    const s = compile({ plan: p, wiring });
    expect(s.originS).toBe(-2);
    expect(s.entries[0]).toEqual({ atMs: 1000, kind: 'feed', blockId: 'b1', cabId: 'c1' });
    // Half a second earlier: −1.5 s rounds down to −2, one second before that is the origin.
    const q = outOnly();
    q.runs[0] = { ...p.runs[0]!, departS: -0.5, steps: p.runs[0]!.steps.map((st, i) => (i === 0 ? { ...st, enterS: -0.5 } : st)) };
    expect(compile({ plan: q, wiring }).originS).toBe(-3);
  });

  it('a reversing section: the train stops wholly inside it, waits the dead time, and leaves with the cab reversed and the section swapped', () => {
    // b3 wired + on the right (NEM 631 2.3: heading for b it needs forward); b2 the reversing section with its relay.
    const loop = outOnly();
    loop.blocks = loop.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b.id === 'b2' ? { ...b, reversingSection: true } : b));
    const relay = withBlock(wiring, 'b2', { polarityPin: 'GPIO19' });
    const s = compile({ plan: loop, wiring: relay });
    // Wholly inside b2 once the tail leaves b1 at 19.127; braking takes 3 s, then the 0.3 s dead time: flip at 22.427,
    // before the head reaches b3 at 26.253. Then up to speed again and down to arrive at 34.38.
    expect(plain(s.entries, s.originS)).toEqual([
      { at: 9, kind: 'feed', blockId: 'b1', cabId: 'c1' },
      { at: 9, kind: 'direction', cabId: 'c1', direction: 'reverse' },
      { at: 10, kind: 'speed', cabId: 'c1', from: 0, to: 113, rampMs: 4000 },
      { at: 17.127, kind: 'feed', blockId: 'b2', cabId: 'c1' },
      { at: 17.127, kind: 'polarity', blockId: 'b2', polarity: 'normal' },
      { at: 19.127, kind: 'speed', cabId: 'c1', from: 113, to: 0, rampMs: 3000 },
      { at: 19.627, kind: 'feed', blockId: 'b1', cabId: null },
      { at: 22.427, kind: 'polarity', blockId: 'b2', polarity: 'swapped' },
      { at: 22.427, kind: 'direction', cabId: 'c1', direction: 'forward' },
      { at: 22.427, kind: 'speed', cabId: 'c1', from: 0, to: 113, rampMs: 4000 },
      { at: 25.253, kind: 'feed', blockId: 'b3', cabId: 'c1' },
      { at: 27.753, kind: 'feed', blockId: 'b2', cabId: null },
      { at: 31.38, kind: 'speed', cabId: 'c1', from: 113, to: 0, rampMs: 3000 },
      { at: 34.68, kind: 'direction', cabId: 'c1', direction: 'off' },
      { at: 34.88, kind: 'feed', blockId: 'b3', cabId: null },
    ]);
    expect(s.findings).toEqual([
      {
        kind: 'control-reversing-stop',
        severity: 'warning',
        ids: ['out', 'b2'],
        fromS: 10 + T / 3 + 1,
        toS: expect.closeTo(10 + T / 3 + 1 + 3.3, 9),
        message: 'Goods (07:00 departure) stops in the reversing section B2 for 3.3 s while its direction and the section\'s polarity change: add the time to the run',
      },
    ]);
    expect(s.blocks.map((b) => b.reversing)).toEqual([false, true, false]);
  });

  it('a reversing section entered swapped and left normal: b2 and b3 wired + on the right, b1 on the left (NEM 631 2.3)', () => {
    const loop = outOnly();
    loop.blocks = loop.blocks.map((b) => (b.id === 'b1' ? b : { ...b, positiveRail: 'right', reversingSection: b.id === 'b2' }));
    const s = compile({ plan: loop, wiring: withBlock(wiring, 'b2', { polarityPin: 'GPIO19' }) });
    expect(s.runs[0]!.directions).toEqual(['reverse', 'forward', 'forward']);
    expect(plain(s.entries, s.originS).filter((e) => e.kind === 'polarity')).toEqual([
      { at: 17.127, kind: 'polarity', blockId: 'b2', polarity: 'swapped' },
      { at: 22.427, kind: 'polarity', blockId: 'b2', polarity: 'normal' },
    ]);
  });

  it('a reversing section the train starts in and needs no flip in is set normal', () => {
    const s = compile({ plan: outOnly(), wiring: withBlock(wiring, 'b1', { polarityPin: 'GPIO19' }) });
    expect(s.findings).toEqual([]);
    expect(plain(s.entries, s.originS).filter((e) => e.kind === 'polarity')).toEqual([{ at: 9, kind: 'polarity', blockId: 'b1', polarity: 'normal' }]);
  });

  it('a block the train stands in before departure or after arrival is fed only from a lead second before departure to the release after arrival', () => {
    const p = outOnly();
    const steps = p.runs[0]!.steps;
    p.runs[0]!.steps = [{ ...steps[0]!, enterS: 2 }, steps[1]!, { ...steps[2]!, exitS: 50 }];
    const s = compile({ plan: p, wiring });
    expect(plain(s.entries, s.originS).filter((e) => e.kind === 'feed' && (e.blockId === 'b1' || e.blockId === 'b3'))).toEqual([
      { at: 9, kind: 'feed', blockId: 'b1', cabId: 'c1' },
      { at: 19.627, kind: 'feed', blockId: 'b1', cabId: null },
      { at: 25.253, kind: 'feed', blockId: 'b3', cabId: 'c1' },
      { at: 34.88, kind: 'feed', blockId: 'b3', cabId: null },
    ]);
  });

  it('lists only the cabs and blocks of the sheet that the plan has, with the plan\'s names', () => {
    const w: WiringSheet = {
      ...wiring,
      cabs: [...wiring.cabs, { cabId: 'c9', boardId: 'u', forwardPin: 'GPIO22', reversePin: 'GPIO23', pwmPin: 'GPIO12', bothHighBrakes: false }],
      blocks: [...wiring.blocks, { blockId: 'b9', boardId: 'u', feeds: [], polarityPin: null, forwardTowards: [] }],
    };
    const s = compile({ plan: outOnly(), wiring: w });
    expect(s.cabs).toEqual([{ cabId: 'c1', name: 'Cab 1' }]);
    expect(s.blocks.map((b) => b.blockId)).toEqual(['b1', 'b2', 'b3']);
  });

  it('a reversing section too short to stop in and reverse is left out, naming the braking time', () => {
    const loop = outOnly();
    loop.blocks = loop.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b.id === 'b2' ? { ...b, reversingSection: true } : b));
    // The head reaches b3 at 22 s: 2.873 s after the tail cleared b1, less than 3 s braking + 0.3 s dead time.
    loop.runs[0]!.steps[2] = { ...loop.runs[0]!.steps[2]!, enterS: 22 };
    const s = compile({ plan: loop, wiring: withBlock(wiring, 'b2', { polarityPin: 'GPIO19' }) });
    expect(s.findings).toEqual([leftOut('the train is not wholly inside the reversing section B2 long enough to stop (3 s) and change direction')]);
  });
});

describe('compareEntries and travelDirections', () => {
  it('at the same millisecond: releases, then connects, polarity, direction, speed (break before make; PWM last)', () => {
    const at = 5;
    const list: ControlEntry[] = [
      { atMs: at, kind: 'speed', cabId: 'c', from: 0, to: 1, rampMs: 0 },
      { atMs: at, kind: 'direction', cabId: 'c', direction: 'forward' },
      { atMs: at, kind: 'polarity', blockId: 'b', polarity: 'normal' },
      { atMs: at, kind: 'feed', blockId: 'b', cabId: 'c' },
      { atMs: at, kind: 'feed', blockId: 'b', cabId: null },
      { atMs: at - 1, kind: 'speed', cabId: 'c', from: 0, to: 1, rampMs: 0 },
    ];
    expect([...list].sort(compareEntries).map((e) => `${e.atMs} ${e.kind}${e.kind === 'feed' ? (e.cabId === null ? ' release' : ' connect') : ''}`)).toEqual([
      '4 speed',
      '5 feed release',
      '5 feed connect',
      '5 polarity',
      '5 direction',
      '5 speed',
    ]);
    expect(compareEntries(list[0]!, list[5]!)).toBe(1);
    // Both ways round, pair by pair (a sort may compare either way).
    const order = [list[5]!, list[4]!, list[3]!, list[2]!, list[1]!, list[0]!];
    order.forEach((x, i) =>
      order.forEach((y, j) => {
        expect(Math.sign(compareEntries(x, y)), `${i} vs ${j}`).toBe(Math.sign(i - j));
      }),
    );
  });

  it('cabDirections takes an old sheet\'s directions when it is given them, whatever the ends say', () => {
    const travel = { fromEnd: [undefined, 'a' as const], toEnd: ['b' as const, undefined] };
    expect(cabDirections(['b1', 'b2'], travel as never, () => 'left', () => ['off', 'forward'])).toEqual(['off', 'forward']);
  });

  it('an old sheet\'s forwardTowards: forward towards a block it names, reverse otherwise; the last block by where the train came from', () => {
    const sheet: Record<string, string[]> = { b1: ['b2'], b2: ['b1'], b3: [] };
    const wiringOf = (id: string) => (id in sheet ? { blockId: id, boardId: 'u', feeds: [], polarityPin: null, forwardTowards: sheet[id]! } : undefined);
    expect(travelDirections(['b1', 'b2', 'b3'], wiringOf)).toEqual(['forward', 'reverse', 'forward']);
    expect(travelDirections(['b3', 'b2', 'b1'], wiringOf)).toEqual(['reverse', 'forward', 'reverse']);
    expect(travelDirections(['b1'], wiringOf)).toEqual(['off']);
    expect(travelDirections(['b9', 'b1'], wiringOf)).toEqual(['reverse', 'forward']);
  });
});
