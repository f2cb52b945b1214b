import { describe, expect, it } from 'vitest';
import { checkInterlocks, compareEntries, compileSchedule, pwmAt, type ControlEntry, type ControlFinding } from '@/lib/control';
import { plan, wiring } from './worked-example-plan';

type Speed = Extract<ControlEntry, { kind: 'speed' }>;

/*
 * The interlocks the schedule replays, one broken at a time on the worked example's schedule (which has
 * none: its runs ramp to PWM 0, wait the dead time, and only then change direction or switch a relay).
 * The rules are common practice for cab control with H-bridge drivers and block relays:
 * - an H-bridge changes direction only after its PWM has been 0 for the dead time (the motor's current
 *   must decay first, or the bridge shorts the supply through the freewheeling current);
 * - a relay switches a block only with no current through it (a contact opening under load arcs), and
 *   connects a block only a break time after it was released (break before make);
 * - a block is never fed by two cabs at once (two drivers' outputs shorted together).
 * Timing of the worked example (wiring.timing): dead time 300 ms, break 50 ms; the schedule's origin is
 * session second -1, so an entry at atMs is at session second atMs / 1000 − 1.
 */
const thePlan = plan();
// Compiled inside each test (a mutant is switched on only while the tests run, not while they are collected).
const schedule = () => compileSchedule({ plan: thePlan, wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
const atS = (ms: number) => ms / 1000 + schedule().originS;

function withEntries(change: (entries: ControlEntry[]) => ControlEntry[]): ControlFinding[] {
  const compiled = schedule();
  const entries = change(compiled.entries.map((e) => ({ ...e }))).sort(compareEntries);
  return checkInterlocks({ ...compiled, entries }, thePlan);
}
const finding = (kind: ControlFinding['kind'], ids: string[], atMs: number, message: string): ControlFinding => ({
  kind,
  severity: 'error',
  ids,
  fromS: atS(atMs),
  toS: atS(atMs),
  message,
});
/** The out run's last ramp down: 113 → 0 from 32 380 ms over 3 000 ms, so PWM is 0 from 35 380 ms. */
const outStop = () => schedule().entries.find((e): e is Speed => e.kind === 'speed' && e.to === 0)!;
const outOff = (entries: ControlEntry[]) => entries.find((e) => e.kind === 'direction' && e.direction === 'off')!;

describe('checkInterlocks on the worked example (common practice for H-bridge cab control with block relays)', () => {
  it('the schedule as compiled breaks none, and its timings are the ones these tests move', () => {
    expect(checkInterlocks(schedule(), thePlan)).toEqual([]);
    expect(schedule().originS).toBe(-1);
    expect(outStop()).toMatchObject({ atMs: 32_380, rampMs: 3000 });
    expect(outOff(schedule().entries).atMs).toBe(35_680); // exactly the 300 ms dead time after PWM reaches 0
  });

  it('a direction change 1 ms inside the dead time is refused; exactly at its end it is not', () => {
    const early = withEntries((entries) => {
      outOff(entries).atMs = 35_679;
      return entries;
    });
    expect(early).toEqual([finding('interlock-dead-time', ['c1'], 35_679, 'cab c1 changes direction without 300 ms at PWM 0 first')]);
    expect(early[0]!.fromS).toBeCloseTo(34.679, 9);
  });

  it('a direction change while the cab still drives is refused', () => {
    const driving = withEntries((entries) => [...entries, { atMs: 20_000, kind: 'direction', cabId: 'c1', direction: 'forward' }]);
    expect(driving).toEqual([finding('interlock-dead-time', ['c1'], 20_000, 'cab c1 changes direction without 300 ms at PWM 0 first')]);
  });

  it('holding PWM at 0 again does not restart the dead time', () => {
    const held = withEntries((entries) => [...entries, { atMs: 35_600, kind: 'speed', cabId: 'c1', from: 0, to: 0, rampMs: 0 }]);
    expect(held).toEqual([]);
    // A ramp that ends at 0 restarts it: it reaches 0 at 35 500 + 100 ms, 80 ms before the direction change.
    const ramped = withEntries((entries) => [...entries, { atMs: 35_500, kind: 'speed', cabId: 'c1', from: 20, to: 0, rampMs: 100 }]);
    expect(ramped).toEqual([finding('interlock-dead-time', ['c1'], 35_680, 'cab c1 changes direction without 300 ms at PWM 0 first')]);
  });

  it('a block released while its train is in it and the cab drives is refused (break before make)', () => {
    // b1 is occupied from session second 10 to 19.13 (atMs 11 000 to 20 127); at 15 000 the cab gives PWM 113.
    const released = withEntries((entries) => [...entries.filter((e) => !(e.kind === 'feed' && e.blockId === 'b1' && e.atMs === 20_627)), { atMs: 15_000, kind: 'feed', blockId: 'b1', cabId: null }]);
    expect(released).toEqual([finding('interlock-break-before-make', ['b1'], 15_000, 'block b1 switches while current flows through it')]);
  });

  it('a block connected only after its train entered, while the cab drives, is refused (break before make)', () => {
    // b2 should be connected at 18 127 ms, a lead second before the train enters at 19 127 ms; at 20 000 ms PWM is 113.
    const late = withEntries((entries) => entries.map((e) => (e.kind === 'feed' && e.blockId === 'b2' && e.atMs === 18_127 ? { ...e, atMs: 20_000 } : e)));
    expect(late).toEqual([finding('interlock-break-before-make', ['b2'], 20_000, 'block b2 switches while current flows through it')]);
  });

  it('a polarity relay switched under current in an occupied block is refused; in an empty unfed block it is not', () => {
    const loaded = withEntries((entries) => [...entries, { atMs: 22_000, kind: 'polarity', blockId: 'b2', polarity: 'swapped' }]);
    expect(loaded).toEqual([finding('interlock-break-before-make', ['b2'], 22_000, 'block b2 switches while current flows through it')]);
    const empty = withEntries((entries) => [...entries, { atMs: 22_000, kind: 'polarity', blockId: 'b3', polarity: 'swapped' }]);
    expect(empty).toEqual([]);
  });

  it('a block already fed by one cab is refused a second cab', () => {
    // b2 is fed by c1 from 18 127 ms; its train enters only at 19 127 ms, so no current flows through it yet.
    const twice = withEntries((entries) => [...entries, { atMs: 18_500, kind: 'feed', blockId: 'b2', cabId: 'c2' }]);
    expect(twice).toEqual([finding('interlock-two-cabs', ['b2', 'c1', 'c2'], 18_500, 'block b2 would be fed by c1 and c2 at once')]);
  });

  it('a block connected again 49 ms after its release is refused; 50 ms after, it is not', () => {
    // b1 is released at 20 627 ms (its train left at 20 127 ms); connected and released again before its next run.
    const again = (atMs: number) => withEntries((entries) => [...entries, { atMs, kind: 'feed', blockId: 'b1', cabId: 'c1' }, { atMs: 21_000, kind: 'feed', blockId: 'b1', cabId: null }]);
    expect(again(20_676)).toEqual([finding('interlock-break-before-make', ['b1'], 20_676, 'block b1 connects within 50 ms of its last release')]);
    expect(again(20_677)).toEqual([]);
  });
});

describe('checkInterlocks at the edges of occupancy and of the dead time (common practice, as above)', () => {
  it('a train is in a block from the moment its head enters to the moment its tail clears: switching at either instant under current is refused', () => {
    // The out run with its b2 entry at session second 18.125 and its b1 exit at 19.125 (binary-exact, so the
    // instants are exact milliseconds: 19 125 and 20 125 ms); PWM 113 then.
    const exact = plan();
    const out = exact.runs[0]!;
    out.steps = out.steps.map((st) => (st.blockId === 'b2' ? { ...st, enterS: 18.125 } : st.blockId === 'b1' ? { ...st, exitS: 19.125 } : st));
    const check = (change: (entries: ControlEntry[]) => ControlEntry[]) => checkInterlocks({ ...schedule(), entries: change(schedule().entries).sort(compareEntries) }, exact);
    expect(check((entries) => entries)).toEqual([]);
    const atEntry = check((entries) => entries.map((e) => (e.kind === 'feed' && e.blockId === 'b2' && e.atMs === 18_127 ? { ...e, atMs: 19_125 } : e)));
    expect(atEntry).toEqual([finding('interlock-break-before-make', ['b2'], 19_125, 'block b2 switches while current flows through it')]);
    const atExit = check((entries) => [...entries.filter((e) => !(e.kind === 'feed' && e.blockId === 'b1' && e.atMs === 20_627)), { atMs: 20_125, kind: 'feed', blockId: 'b1', cabId: null }]);
    expect(atExit).toEqual([finding('interlock-break-before-make', ['b1'], 20_125, 'block b1 switches while current flows through it')]);
    // On the compiled plan, a release 600 ms before the tail clears b1 (at 20 127 ms) is refused too.
    const early = withEntries((entries) => [...entries.filter((e) => !(e.kind === 'feed' && e.blockId === 'b1' && e.atMs === 20_627)), { atMs: 19_500, kind: 'feed', blockId: 'b1', cabId: null }]);
    expect(early).toEqual([finding('interlock-break-before-make', ['b1'], 19_500, 'block b1 switches while current flows through it')]);
  });

  it('releasing a released block again is harmless (only a connect waits for the break time)', () => {
    expect(withEntries((entries) => [...entries, { atMs: 20_637, kind: 'feed', blockId: 'b1', cabId: null }])).toEqual([]);
  });

  it('a cab never driven is at PWM 0 from the start: holding it at 0 and setting its direction at once is safe', () => {
    const fresh = withEntries((entries) => [
      ...entries,
      { atMs: 5000, kind: 'speed', cabId: 'c2', from: 0, to: 0, rampMs: 0 },
      { atMs: 5001, kind: 'direction', cabId: 'c2', direction: 'forward' },
    ]);
    expect(fresh).toEqual([]);
  });

  it('a cut to PWM 0 (a 0 → 0 setting while the cab drives or ramps down) starts the dead time at the cut', () => {
    // While driving at 113: cut at 20 000 ms, direction off exactly 300 ms later.
    const cut = withEntries((entries) => [
      ...entries,
      { atMs: 20_000, kind: 'speed', cabId: 'c1', from: 0, to: 0, rampMs: 0 },
      { atMs: 20_300, kind: 'direction', cabId: 'c1', direction: 'off' },
    ]);
    expect(cut).toEqual([]);
    // During the ramp down (PWM 0 only at 35 380 ms): cut at 35 000, direction off at 35 300.
    const early = withEntries((entries) => [
      ...entries.map((e) => (e.kind === 'direction' && e.direction === 'off' && e.atMs === 35_680 ? { ...e, atMs: 35_300 } : e)),
      { atMs: 35_000, kind: 'speed', cabId: 'c1', from: 0, to: 0, rampMs: 0 },
    ]);
    expect(early).toEqual([]);
    // A 0 → 0 ramp starting the moment PWM reached 0 keeps the dead time running from then.
    const held = withEntries((entries) => [...entries, { atMs: 35_380, kind: 'speed', cabId: 'c1', from: 0, to: 0, rampMs: 100 }]);
    expect(held).toEqual([]);
  });
});

describe('pwmAt: a ramp entry gives PWM linearly from `from` to `to` over rampMs (the schedule format)', () => {
  const up: Speed = { atMs: 1000, kind: 'speed', cabId: 'c', from: 0, to: 100, rampMs: 1000 };
  it('is 0 before any speed entry and `to` at once for a ramp of 0 ms', () => {
    expect(pwmAt(undefined, 5000)).toBe(0);
    expect(pwmAt({ ...up, rampMs: 0 }, 1000)).toBe(100);
  });
  it('interpolates inside the ramp, rounding to the 8-bit value, and holds `to` from its end on', () => {
    expect(pwmAt(up, 1000)).toBe(0);
    expect(pwmAt(up, 1250)).toBe(25);
    expect(pwmAt(up, 1999)).toBe(100); // 99.9 rounds to 100
    expect(pwmAt(up, 2000)).toBe(100);
    expect(pwmAt(up, 9000)).toBe(100);
    const down: Speed = { ...up, from: 113, to: 0 };
    expect(pwmAt(down, 1500)).toBe(57); // 113 − 56.5 = 56.5 rounds up
    expect(pwmAt(down, 1750)).toBe(28); // 113 × 0.25 = 28.25
    expect(pwmAt({ ...up, from: 40, to: 200 }, 1500)).toBe(120);
  });
  it('gives `from` for a moment before the ramp starts', () => {
    expect(pwmAt({ ...up, from: 30 }, 500)).toBe(30);
  });
});
