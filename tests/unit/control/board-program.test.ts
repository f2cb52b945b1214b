import { describe, expect, it } from 'vitest';
import { boardProgram, compileSchedule, MAX_PROGRAM_ENTRIES, plainName, type ControlEntry } from '@/lib/control';
import { entries, schedule, twoBoards } from './two-boards';
import { plan, wiring } from './worked-example-plan';

/*
 * boardProgram splits a schedule by board: each board gets its own cabs and blocks (in wiring order),
 * the entries that touch them with indices into its own tables, and its pins resolved on its published
 * pinout (ATmega328P datasheet 1.1 and the common board's header labels: label 6 is PD6, A0 is PC0;
 * ATmega2560 datasheet with its common board's labels: 22 is PA0; the 40-pin header's pinout: pin 12 is GPIO18).
 */
describe('boardProgram: one board of the wiring sheet, its pins from the published pinouts', () => {
  const u = () => boardProgram(schedule(entries), twoBoards, 'u');
  const v = () => boardProgram(schedule(entries), twoBoards, 'v');

  it('takes the board, its kind and title, the schedule clock, origin and the sheet timing', () => {
    expect(u().board).toBe(twoBoards.boards[0]);
    expect([u().kind, u().title, v().kind, v().title]).toEqual(['atmega328p', 'ATmega328P board', 'atmega2560', 'ATmega2560 board']);
    expect([u().originS, u().clock, u().deadTimeMs, u().breakMs]).toEqual([-7, { ratio: 4, fastStart: '06:30' }, 300, 50]);
  });

  it('resolves pins written by name or by header label (ATmega328P: 4 is PD4, 8 is PB0, 6 is PD6 with OC0A; ATmega2560: 22 is PA0, 46 is PL3 with OC5A)', () => {
    expect(u().emergencyStop.name).toBe('PD2');
    expect(u().start?.name).toBe('PD4');
    expect(v().emergencyStop.name).toBe('PA0');
    expect(v().start).toBeNull();
    expect(u().cabs.map((c) => [c.cabId, c.name, c.forward.name, c.reverse.name, c.pwm.name])).toEqual([['c1', 'Cab one', 'PD7', 'PB0', 'PD6']]);
    expect(u().cabs[0]!.pwm.pwm).toEqual({ timer: 0, channel: 'A', ocrAddress: 0x47 }); // ATmega328P register summary: OCR0A 0x47
    expect(v().cabs.map((c) => [c.cabId, c.pwm.name, c.pwm.pwm?.timer, c.pwm.pwm?.channel])).toEqual([['c2', 'PL3', 5, 'A']]);
  });

  it('keeps only the blocks of this board that the schedule has, with every relay of the sheet in its order', () => {
    // b9 is on the sheet but not in the schedule; b2 is on the other board.
    expect(u().blocks).toEqual([
      {
        blockId: 'b1',
        name: 'Yard',
        feeds: [
          { cabId: 'c0', pin: expect.objectContaining({ name: 'PC1', label: 'A1' }) },
          { cabId: 'c1', pin: expect.objectContaining({ name: 'PC0', label: 'A0' }) },
        ],
        polarity: null,
      },
    ]);
    expect(v().blocks.map((b) => [b.blockId, b.feeds.map((f) => f.pin.name), b.polarity?.name])).toEqual([['b2', ['PA1', 'PA2'], 'PA3']]);
  });

  it('carries only the entries touching its own cabs and blocks, with local indices, relay within the block and direction codes', () => {
    expect(u().entries).toEqual([
      { atMs: 0, kind: 'feed', block: 0, relay: 1 },
      { atMs: 0, kind: 'direction', cab: 0, direction: 2 },
      { atMs: 1000, kind: 'speed', cab: 0, from: 0, to: 90, rampMs: 2000 },
      { atMs: 4000, kind: 'feed', block: 0, relay: null },
      { atMs: 4500, kind: 'speed', cab: 0, from: 90, to: 0, rampMs: 300 },
      { atMs: 5000, kind: 'direction', cab: 0, direction: 0 },
    ]);
    expect(v().entries).toEqual([
      { atMs: 10, kind: 'feed', block: 0, relay: 1 },
      { atMs: 10, kind: 'polarity', block: 0, swapped: true },
      { atMs: 20, kind: 'direction', cab: 0, direction: 1 },
      { atMs: 1500, kind: 'speed', cab: 0, from: 0, to: 50, rampMs: 0 },
      { atMs: 4000, kind: 'polarity', block: 0, swapped: false },
    ]);
  });

  it('ends when its last setting ends, a ramp included', () => {
    expect(u().endMs).toBe(5000);
    expect(v().endMs).toBe(4000);
    // Without the final direction change the board's last setting is the ramp down, which ends at 4 500 + 300 ms.
    expect(boardProgram(schedule(entries.slice(0, -1)), twoBoards, 'u').endMs).toBe(4800);
    expect(boardProgram(schedule([]), twoBoards, 'u').endMs).toBe(0);
  });

  it('refuses a board the sheet does not have, and a pin the board does not have', () => {
    expect(() => boardProgram(schedule(entries), twoBoards, 'w')).toThrow(new RangeError('the wiring sheet has no board "w"'));
    const badPin = { ...twoBoards, cabs: twoBoards.cabs.map((c) => (c.cabId === 'c1' ? { ...c, pwmPin: 'PE3' } : c)) };
    // PE3 is an ATmega2560 pin; the ATmega328P has no port E.
    expect(() => boardProgram(schedule(entries), badPin, 'u')).toThrow(new RangeError('ATmega328P board has no pin "PE3"'));
  });

  it(`takes at most ${MAX_PROGRAM_ENTRIES} settings per board and says to split the session beyond`, () => {
    const many = (n: number): ControlEntry[] => Array.from({ length: n }, (_, i) => ({ atMs: i, kind: 'polarity', blockId: 'b2', polarity: 'normal' }));
    expect(boardProgram(schedule(many(MAX_PROGRAM_ENTRIES)), twoBoards, 'v').entries).toHaveLength(MAX_PROGRAM_ENTRIES);
    expect(() => boardProgram(schedule(many(MAX_PROGRAM_ENTRIES + 1)), twoBoards, 'v')).toThrow(
      new RangeError(`${MAX_PROGRAM_ENTRIES + 1} settings for Line board: at most ${MAX_PROGRAM_ENTRIES} fit one program; split the session`),
    );
    // Entries of other boards do not count.
    expect(boardProgram(schedule(many(MAX_PROGRAM_ENTRIES + 1)), twoBoards, 'u').entries).toEqual([]);
  });

  it('on the worked example: the one 40-pin-header board runs every entry of the schedule', () => {
    const compiled = compileSchedule({ plan: plan(), wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
    const program = boardProgram(compiled, wiring, 'u');
    expect(program.entries).toHaveLength(compiled.entries.length);
    expect(program.endMs).toBe(compiled.endMs);
    expect(program.originS).toBe(-1);
    // GPIO17, 27 and 18 are physical pins 11, 13 and 12 of the 40-pin header (its published pinout).
    expect(program.cabs.map((c) => [c.forward.label, c.reverse.label, c.pwm.label])).toEqual([['pin 11', 'pin 13', 'pin 12']]);
  });
});

describe('plainName: a name made safe inside a C string literal (C11 6.4.5) and a Python one', () => {
  it('replaces quotes, backslashes and anything outside printable ASCII, trims, and never gives an empty name', () => {
    expect(plainName('Cab "one"')).toBe('Cab ?one?');
    expect(plainName("O'Neil\\yard")).toBe('O?Neil?yard');
    expect(plainName('Süd\tline\n')).toBe('S?d?line?');
    expect(plainName('  Yard  ')).toBe('Yard');
    expect(plainName('   ')).toBe('?');
    expect(plainName('')).toBe('?');
    expect(plainName('~ and space: printable')).toBe('~ and space: printable');
  });
  it('cuts to 24 characters unless told otherwise', () => {
    expect(plainName('a'.repeat(30))).toBe('a'.repeat(24));
    expect(plainName('a'.repeat(30), 60)).toBe('a'.repeat(30));
    expect(plainName(`  ${'b'.repeat(24)}c`)).toBe('b'.repeat(24));
  });
});
