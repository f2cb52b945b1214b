import { describe, expect, it } from 'vitest';
import { clockActionRefusal, formatTimeOfDay, readSessionClock, type ClockRecord } from '@/lib/planning';

// Fast clock at 6:1: 10 real minutes per fast hour (DOMAIN.md, fast clock, common practice).
const clock = { ratio: 6, fastStart: '06:00' };
const T0 = Date.UTC(2031, 3, 12, 18, 0, 0);
const at = (realS: number) => T0 + realS * 1000;
const face = (records: ClockRecord[], realS: number) => formatTimeOfDay(readSessionClock(records, at(realS), clock).fastS);

describe('the shared fast clock, read from its stored actions', () => {
  it('stands at the fast start until it is started', () => {
    expect(readSessionClock([], at(500), clock)).toEqual({ state: 'not-started', sessionS: 0, fastS: 6 * 3600 });
  });

  it('runs at the ratio from its start: 10 real minutes are one fast hour at 6:1', () => {
    const records: ClockRecord[] = [{ action: 'start', atMs: at(0), sessionS: 0 }];
    expect(face(records, 600)).toBe('07:00');
    expect(readSessionClock(records, at(600), clock).sessionS).toBe(600);
  });

  it('does not count a pause; resumes from where it stood', () => {
    const records: ClockRecord[] = [
      { action: 'start', atMs: at(0), sessionS: 0 },
      { action: 'pause', atMs: at(300), sessionS: null },
      { action: 'resume', atMs: at(1200), sessionS: null },
    ];
    // 300 s running, 900 s paused, then 300 s more: 600 s of session time = 1 fast hour.
    expect(face(records, 1000)).toBe('06:30');
    expect(readSessionClock(records, at(1000), clock).state).toBe('paused');
    expect(face(records, 1500)).toBe('07:00');
  });

  it('a set moves a running clock and it keeps running; before a start it waits at the new time', () => {
    const running: ClockRecord[] = [
      { action: 'start', atMs: at(0), sessionS: 0 },
      { action: 'set', atMs: at(100), sessionS: 1800 },
    ];
    // 1800 s × 6 = 3 fast hours after 06:00, plus 60 s × 6 = 6 fast minutes.
    expect(face(running, 160)).toBe('09:06');
    const waiting: ClockRecord[] = [{ action: 'set', atMs: at(0), sessionS: 300 }];
    expect(readSessionClock(waiting, at(900), clock)).toMatchObject({ state: 'paused', sessionS: 300 });
  });

  it('read at an earlier moment, it reads as it was then (the report uses this)', () => {
    const records: ClockRecord[] = [
      { action: 'start', atMs: at(100), sessionS: 240 },
      { action: 'pause', atMs: at(400), sessionS: null },
    ];
    expect(readSessionClock(records, at(99), clock).state).toBe('not-started');
    expect(readSessionClock(records, at(200), clock)).toMatchObject({ state: 'running', sessionS: 340 });
  });

  it('refuses actions that do not fit the state', () => {
    expect(clockActionRefusal('not-started', 'start')).toBeNull();
    expect(clockActionRefusal('running', 'start')).toMatch(/already been started/);
    expect(clockActionRefusal('paused', 'pause')).toMatch(/not running/);
    expect(clockActionRefusal('running', 'resume')).toMatch(/already running/);
    expect(clockActionRefusal('not-started', 'resume')).toMatch(/Start the clock/);
    expect(clockActionRefusal('paused', 'set')).toBeNull();
  });
});
