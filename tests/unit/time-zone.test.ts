// lib/time-zone.ts: wall clock in an IANA zone ⇄ UTC with nothing but Intl. Expected instants are
// from the IANA tz database (Europe/London: GMT/BST, changes at 01:00 UTC on the last Sundays of
// March and October; Pacific/Auckland: NZST +12 / NZDT +13). The module is loaded again before each
// test (vi.resetModules, then import): its padding helper and its formatter cache are module-level
// values, which a mutation test run switches only in a module evaluated after its beforeAll.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

let Z: typeof import('@/lib/time-zone');

beforeEach(async () => {
  vi.resetModules();
  Z = await import('@/lib/time-zone');
});

const RealDateTimeFormat = Intl.DateTimeFormat;
afterEach(() => {
  Intl.DateTimeFormat = RealDateTimeFormat;
});

/** Counts the Intl.DateTimeFormat objects built from now on. */
function countBuilt(): { calls: number } {
  const built = { calls: 0 };
  Intl.DateTimeFormat = class extends RealDateTimeFormat {
    constructor(...args: ConstructorParameters<typeof RealDateTimeFormat>) {
      super(...args);
      built.calls += 1;
    }
  } as typeof Intl.DateTimeFormat;
  return built;
}

const iso = (d: Date | null) => d?.toISOString() ?? null;

describe('zonedToUtc', () => {
  it('takes only YYYY-MM-DD and HH:MM, whole (common practice: the HTML date and time inputs give exactly these)', () => {
    expect(iso(Z.zonedToUtc('2031-01-15', '18:30', 'Europe/London'))).toBe('2031-01-15T18:30:00.000Z');
    for (const [date, time] of [
      ['2031-01-15x', '18:30'],
      ['x2031-01-15', '18:30'],
      ['12031-01-15', '18:30'],
      ['2031-01-15', '18:300'],
      ['2031-01-15', '118:30'],
      ['2031-01-15', '18:30:00'],
      ['15/01/2031', '18:30'],
      ['2031-01-15', '6pm'],
      ['', ''],
    ] as const) {
      expect(Z.zonedToUtc(date, time, 'Europe/London'), `${date} ${time}`).toBeNull();
    }
  });

  it('finds the instant in the hours just after clocks go forward, where the offset before the change no longer holds', () => {
    // London, 30 March 2031: 01:00 GMT becomes 02:00 BST, so 02:30 is BST (UTC+1).
    expect(iso(Z.zonedToUtc('2031-03-30', '02:30', 'Europe/London'))).toBe('2031-03-30T01:30:00.000Z');
    expect(iso(Z.zonedToUtc('2031-03-30', '11:00', 'Europe/London'))).toBe('2031-03-30T10:00:00.000Z');
    // Auckland, 28 September 2031: 02:00 NZST becomes 03:00 NZDT, so 03:30 is UTC+13.
    expect(iso(Z.zonedToUtc('2031-09-28', '03:30', 'Pacific/Auckland'))).toBe('2031-09-27T14:30:00.000Z');
    expect(Z.zonedToUtc('2031-09-28', '02:30', 'Pacific/Auckland')).toBeNull();
  });

  it('finds the instant in the hours just before clocks go back, where the offset after the change does not hold yet', () => {
    // London, 26 October 2031: 02:00 BST becomes 01:00 GMT; 00:30 is still BST.
    expect(iso(Z.zonedToUtc('2031-10-25', '23:30', 'Europe/London'))).toBe('2031-10-25T22:30:00.000Z');
    expect(iso(Z.zonedToUtc('2031-10-26', '02:30', 'Europe/London'))).toBe('2031-10-26T02:30:00.000Z');
  });

  it('takes the first of the repeated hour in zones more than 12 h ahead of UTC too (a bug found here, fixed)', () => {
    // Auckland, 6 April 2031: 03:00 NZDT (+13) becomes 02:00 NZST (+12); 02:30 happens at 13:30 and 14:30 UTC.
    expect(iso(Z.zonedToUtc('2031-04-06', '02:30', 'Pacific/Auckland'))).toBe('2031-04-05T13:30:00.000Z');
    expect(iso(Z.zonedToUtc('2031-04-06', '01:59', 'Pacific/Auckland'))).toBe('2031-04-05T12:59:00.000Z');
    expect(iso(Z.zonedToUtc('2031-04-06', '03:00', 'Pacific/Auckland'))).toBe('2031-04-05T15:00:00.000Z');
    // Chatham, the same day: 03:45 +13:45 becomes 02:45 +12:45; 02:45 happens at 13:00 and 14:00 UTC.
    expect(iso(Z.zonedToUtc('2031-04-06', '02:45', 'Pacific/Chatham'))).toBe('2031-04-05T13:00:00.000Z');
    // Kiritimati, +14 all year: nothing repeats, nothing is skipped.
    expect(iso(Z.zonedToUtc('2031-04-06', '02:30', 'Pacific/Kiritimati'))).toBe('2031-04-05T12:30:00.000Z');
  });
});

describe('wallClockParts', () => {
  it('reads the wall clock with one formatter per zone, built once (building one costs far more than using it)', () => {
    const built = countBuilt();
    expect(Z.wallClockParts(Date.parse('2031-07-15T17:30:00Z'), 'Europe/London')).toStrictEqual({ year: 2031, month: 7, day: 15, hour: 18, minute: 30, second: 0 });
    expect(Z.wallClockParts(Date.parse('2031-01-15T00:00:00Z'), 'Europe/London').hour).toBe(0); // h23: midnight is 0, never 24
    expect(Z.zoneOffsetMs(Date.parse('2031-01-15T00:00:00Z'), 'Pacific/Auckland')).toBe(13 * 3_600_000);
    expect(built.calls).toBe(2);
  });
});

describe('utcToZoned and floatingIso write zero-padded fields', () => {
  it('pads month, day, hour, minute and second to two digits and the year to four', () => {
    expect(Z.utcToZoned(new Date('0999-01-02T03:04:05Z'), 'UTC')).toStrictEqual({ date: '0999-01-02', time: '03:04' });
    expect(Z.utcToZoned(new Date('2031-03-30T01:30:00Z'), 'Europe/London')).toStrictEqual({ date: '2031-03-30', time: '02:30' });
    expect(Z.floatingIso(Date.parse('2031-01-02T03:04:05Z'), 'Pacific/Auckland')).toBe('2031-01-02T16:04:05');
  });
});

describe('formatting for people (en-GB, 24-hour, CLDR through ICU)', () => {
  const when = new Date('2026-12-12T14:00:00Z');

  it('writes the date, the date and time, and the time in the session’s zone', () => {
    expect(Z.formatDateInZone(when, 'Europe/London')).toBe('Sat, 12 Dec 2026');
    expect(Z.formatDateInZone(when, 'Pacific/Auckland')).toBe('Sun, 13 Dec 2026');
    expect(Z.formatInZone(when, 'Europe/London')).toBe('Sat, 12 Dec 2026, 14:00');
    expect(Z.formatTimeInZone(when, 'Pacific/Auckland')).toBe('03:00');
  });

  it('builds one formatter per zone and options, keeps up to 256, and starts again when a 257th is needed', () => {
    const built = countBuilt();
    const zones = Intl.supportedValuesOf('timeZone').slice(0, 257);
    expect(zones).toHaveLength(257);
    Z.formatTimeInZone(when, zones[0]!);
    Z.formatTimeInZone(when, zones[0]!);
    expect(built.calls).toBe(1);
    for (const zone of zones.slice(1, 256)) Z.formatTimeInZone(when, zone);
    expect(built.calls).toBe(256);
    Z.formatTimeInZone(when, zones[0]!); // 256 kept: still there
    expect(built.calls).toBe(256);
    Z.formatTimeInZone(when, zones[256]!); // the 257th: the cache starts again with it alone
    expect(built.calls).toBe(257);
    Z.formatTimeInZone(when, zones[256]!);
    expect(built.calls).toBe(257);
    Z.formatTimeInZone(when, zones[0]!);
    expect(built.calls).toBe(258);
  });
});
