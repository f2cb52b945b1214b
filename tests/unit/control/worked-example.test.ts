import { describe, expect, it } from 'vitest';
import { compileSchedule, type ControlEntry } from '@/lib/control';
import { plan, T, wiring } from './worked-example-plan';

type Speed = Extract<ControlEntry, { kind: 'speed' }>;

describe('control schedule worked example (H0, common-practice ramps, NEM 631 2.3)', () => {
  // Compiled inside each test (a mutant is switched on only while the tests run, not while they are collected).
  const schedule = () => compileSchedule({ plan: plan(), wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
  const atS = (ms: number) => ms / 1000 + schedule().originS;

  it('schedules both runs at the speed the engine planned (plannedSpeedKmh) and its dutyFor value', () => {
    expect(schedule().findings).toEqual([]);
    expect(schedule().runs.map((r) => r.runId)).toEqual(['out', 'back']);
    for (const run of schedule().runs) {
      expect(run.speedKmh).toBeCloseTo(60, 6); // T was built from 60 km/h
      expect(run.pwm).toBe(113); // 6 V ÷ 13.5 V × 255 = 113.3
    }
  });

  it('ramps up over 60 ÷ 15 = 4 s from departure and down over 60 ÷ 20 = 3 s ending at arrival (common practice rates)', () => {
    const speeds = schedule().entries.filter((e): e is Speed => e.kind === 'speed');
    expect(speeds).toHaveLength(4);
    const [up, down] = speeds;
    expect(up).toMatchObject({ from: 0, to: 113, rampMs: 4000 });
    expect(atS(up!.atMs)).toBeCloseTo(10, 3);
    expect(down).toMatchObject({ from: 113, to: 0, rampMs: 3000 });
    // Braking starts 3 s before arrival so the train stands at 10 + 24.38 s.
    expect(atS(down!.atMs + down!.rampMs)).toBeCloseTo(10 + T, 2);
    expect(T).toBeCloseTo(24.38, 2);
  });

  it('drives reverse heading for b and forward heading for a on blocks wired + on the left (NEM 631 2.3), whatever forwardTowards says', () => {
    const byRun = new Map(schedule().runs.map((r) => [r.runId, r.directions]));
    expect(byRun.get('out')).toEqual(['reverse', 'reverse', 'reverse']);
    expect(byRun.get('back')).toEqual(['forward', 'forward', 'forward']);
    const directions = schedule().entries.filter((e) => e.kind === 'direction').map((e) => (e.kind === 'direction' ? e.direction : ''));
    expect(directions).toEqual(['reverse', 'off', 'forward', 'off']);
  });

  it('reads forwardTowards only for a layout without ends (an old sheet)', () => {
    const old = plan();
    old.links = old.links.map(({ a, b }) => ({ a, b }));
    old.blocks = old.blocks.map(({ positiveRail: _, ...b }) => b);
    const legacy = compileSchedule({ plan: old, wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
    // The sheet says forward towards b2 and b3: out is forward, back is reverse.
    expect(legacy.runs.map((r) => r.directions[0])).toEqual(['forward', 'reverse']);
  });

  it('a layout without ends is read by forwardTowards only when the sheet names a block ahead somewhere', () => {
    const old = plan();
    old.links = old.links.map(({ a, b }) => ({ a, b }));
    const compile = (w: typeof wiring) => compileSchedule({ plan: old, wiring: w, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
    // Nothing named ahead: the blocks' wiring decides (NEM 631 2.3, + on the left), both runs go.
    const none = compile({ ...wiring, blocks: wiring.blocks.map((b) => ({ ...b, forwardTowards: [] })) });
    expect(none.runs.map((r) => r.directions)).toEqual([
      ['reverse', 'reverse', 'reverse'],
      ['forward', 'forward', 'forward'],
    ]);
    // Only b3 names b2 ahead: the sheet decides, and the back run would drive b3 forward and b2 reverse across a gap.
    const one = compile({ ...wiring, blocks: wiring.blocks.map((b) => ({ ...b, forwardTowards: b.blockId === 'b3' ? ['b2'] : [] })) });
    expect(one.runs.map((r) => r.directions)).toEqual([['reverse', 'reverse', 'reverse']]);
    expect(one.findings.map((f) => f.message)).toEqual([
      'Goods (07:01 departure) is left out of the control schedule: the cab would have to drive B3 and B2 in opposite directions with no reversing section between: the train would short the gap',
    ]);
  });

  it('a layout that records any end at all (one end of one link, or of one step of one run) is read by its ends, not by forwardTowards', () => {
    const withoutEnds = () => {
      const p = plan();
      p.links = p.links.map(({ a, b }) => ({ a, b }));
      return p;
    };
    const variants: ((p: ReturnType<typeof plan>) => void)[] = [
      (p) => (p.links[0] = { ...p.links[0]!, bEnd: 'a' }),
      (p) => (p.links[1] = { ...p.links[1]!, aEnd: 'b' }),
      (p) => (p.runs[0]!.steps[0] = { ...p.runs[0]!.steps[0]!, toEnd: 'b' }),
      (p) => (p.runs[1]!.steps[1] = { ...p.runs[1]!.steps[1]!, fromEnd: 'b' }),
    ];
    for (const change of variants) {
      const p = withoutEnds();
      change(p);
      const compiled = compileSchedule({ plan: p, wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
      // NEM 631 2.3 with + on the left rail: reverse heading for b, forward heading back (the sheet would say the opposite).
      expect(compiled.runs.map((r) => r.directions)).toEqual([
        ['reverse', 'reverse', 'reverse'],
        ['forward', 'forward', 'forward'],
      ]);
    }
  });

  it('flips a reversing section with the engine: polarity normal while the cab drives what the section needs, swapped after the cab reverses', () => {
    // b3 wired the other way (+ on the right looking to b): heading for b it needs forward, b1 and b2 reverse
    // (NEM 631 2.3), so the cab must change direction while the train is wholly inside b2.
    const loop = plan();
    loop.blocks = loop.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b.id === 'b2' ? { ...b, reversingSection: true } : b));
    loop.runs = [loop.runs[0]!];
    const noRelay = compileSchedule({ plan: loop, wiring, runSpeedKmh: { out: null }, locomotiveTopSpeedKmh: { l: 120 } });
    expect(noRelay.findings.map((f) => f.message)).toEqual([expect.stringContaining('B2 is a reversing section on the layout but the wiring sheet gives it no polarity relay')]);
    const relay = { ...wiring, blocks: wiring.blocks.map((b) => (b.blockId === 'b2' ? { ...b, polarityPin: 'GPIO19' } : b)) };
    const flipped = compileSchedule({ plan: loop, wiring: relay, runSpeedKmh: { out: null }, locomotiveTopSpeedKmh: { l: 120 } });
    expect(flipped.runs[0]!.directions).toEqual(['reverse', 'forward', 'forward']);
    const polarity = flipped.entries.filter((e) => e.kind === 'polarity').map((e) => (e.kind === 'polarity' ? e.polarity : ''));
    // b2 needs reverse heading for b: the cab gives reverse on entry (normal), forward after the flip (swapped).
    expect(polarity).toEqual(['normal', 'swapped']);
    expect(flipped.findings.map((f) => f.kind)).toEqual(['control-reversing-stop']);
  });
});
