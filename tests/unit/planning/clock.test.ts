import { describe, expect, it } from 'vitest';
import { fastTimeToReal, formatSessionTime } from '@/lib/planning';

// Fast clock by its ratio definition (common practice): fast = fastStart + real × ratio, so
// real = (fast − fastStart) ÷ ratio. Here 4:1 from 06:00 (21 600 fast s after fast midnight);
// one fast day is 86 400 fast s = 21 600 real s. Every figure below is worked by hand.
const clock = { ratio: 4, fastStart: '06:00' };

describe('fastTimeToReal: which fast day a typed time means', () => {
  it('reads the fast start itself as the session start, not as the next fast day', () => {
    // 06:00 = 21 600 fast s = the start: (21 600 − 21 600) ÷ 4 = 0.
    expect(fastTimeToReal('06:00', clock)).toBe(0);
    // One fast second before it is the next fast day: (21 599 + 86 400 − 21 600) ÷ 4 = 21 599.75.
    expect(fastTimeToReal('05:59:59', clock)).toBe(21_599.75);
  });

  it('near a real time inside the same fast day, keeps the plain reading', () => {
    // Near real 0 (fast 06:00): 07:00 is one fast hour ahead, so (25 200 − 21 600) ÷ 4 = 900.
    expect(fastTimeToReal('07:00', clock, 0)).toBe(900);
  });

  it('near a real time one or two fast days on, moves the typed time forward by whole fast days', () => {
    // Real 21 600 = fast 06:00 the next day (108 000). 07:00 read plainly is 25 200, 23 fast hours
    // before that; the next day's 07:00 (111 600) is one hour after: (111 600 − 21 600) ÷ 4 = 22 500.
    expect(fastTimeToReal('07:00', clock, 21_600)).toBe(22_500);
    // Real 43 200 = fast 06:00 two days on (194 400); 07:00 that day is 198 000: (198 000 − 21 600) ÷ 4 = 44 100.
    expect(fastTimeToReal('07:00', clock, 43_200)).toBe(44_100);
    // Moving back works the same way: near real 0, 23:00 the day before the start (−3 600 fast s) is
    // nearer than 23:00 of the start day (82 800): (−3 600 − 21 600) ÷ 4 = −6 300.
    expect(fastTimeToReal('23:00', clock, 0)).toBe(-6_300);
  });

  it('on an exact tie (half a fast day either way) moves the typed time by the fewest fast days', () => {
    // Near real 0 (fast 06:00), 18:00 is 12 fast hours ahead and 12 behind: the plain reading, this
    // evening, is kept: (64 800 − 21 600) ÷ 4 = 10 800.
    expect(fastTimeToReal('18:00', clock, 0)).toBe(10_800);
    // Near real 43 200 (fast 06:00 two days on, 194 400), 18:00 read plainly (64 800) is 1.5 fast days
    // behind; one day forward (151 200, 12 h before) ties with two (237 600, 12 h after): one day is
    // moved, (151 200 − 21 600) ÷ 4 = 32 400.
    expect(fastTimeToReal('18:00', clock, 43_200)).toBe(32_400);
  });
});

describe('formatSessionTime: real session time for messages', () => {
  // h:mm:ss with minutes and seconds two digits wide (ISO 8601 extended time of day, hours left
  // unpadded since a session time counts up from 0), tenths only when there are some; worked by hand.
  it('writes hours, minutes and seconds', () => {
    expect(formatSessionTime(0)).toBe('0:00:00');
    // 3 725 s = 1 h, 2 min (120 s), 5 s; the .4 s stays as tenths.
    expect(formatSessionTime(3725.4)).toBe('1:02:05.4');
    expect(formatSessionTime(36_000)).toBe('10:00:00');
  });

  it('rounds to tenths first, and signs a time before the session start', () => {
    // 59.96 s rounds to 60.0 s = 1 min; before the start it carries a minus sign.
    expect(formatSessionTime(-59.96)).toBe('-0:01:00');
    expect(formatSessionTime(-7.5)).toBe('-0:00:07.5');
  });
});
