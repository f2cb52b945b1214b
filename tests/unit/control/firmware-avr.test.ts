import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { boardProgram, estimateFirmwareSize, generateAvrFirmware, wiringSheetSchema, type BoardProgram, type WiringSheet } from '@/lib/control';
import { entries, schedule, twoBoards } from './two-boards';
import { wiring as headerWiring } from './worked-example-plan';

/*
 * The generated AVR firmware's text against the datasheets' register descriptions. The programs are
 * also compiled and run in simavr by tests/integration/control-toolchain.test.ts; these checks name the
 * bits one by one, so they hold without the toolchain too.
 * ATmega328P datasheet (DS40002061): 14.4 port registers (PORTx data, DDRx direction, PINx input);
 * Timer/Counter0 and 2 (8 bit): WGMx1:0 = 3 with WGMx2 = 0 is fast PWM with TOP 0xFF, COMxA1/COMxB1 alone
 * is "clear on compare match" (non-inverting), CSx1 alone is clk/8; Timer/Counter1 (16 bit): WGM10 with
 * WGM12 is mode 5, fast PWM 8 bit (TOP 0x00FF). ATmega2560 datasheet: the same bits for timers 3, 4 and 5.
 */
const meta = { title: 'Evening "special"', generatedAt: '2026-12-03T12:00:00Z' };
const twoBoardsSource = "ATmega328P datasheet (pinout, alternate port functions, timers) and the common board's header labels";
const files = (program: BoardProgram) => Object.fromEntries(generateAvrFirmware(program, meta).map((f) => [f.name, f.text]));
const lines = (text: string) => text.split('\n');

// Cab c0 (PWM on PD3: OC2B, header 3) joins the schedule; block b9 too, and b1 gets a polarity relay on A3 (PC3).
const fuller: WiringSheet = {
  ...twoBoards,
  cabs: twoBoards.cabs.map((c) => (c.cabId === 'c0' ? { ...c, pwmPin: '3' } : c)),
  blocks: twoBoards.blocks.map((b) => (b.blockId === 'b1' ? { ...b, polarityPin: 'A3' } : b)),
};
const fullerSchedule = () => {
  const s = schedule(entries);
  return { ...s, cabs: [...s.cabs, { cabId: 'c0', name: 'Cab "zero"' }], blocks: [...s.blocks, { blockId: 'b9', name: 'Siding\\north', reversing: false }] };
};

/** c0's PWM on OC2B (PD3), c1's on OC1A (PB1, header 9): the cabs use timer 2, then timer 1. */
const timersOutOfOrder = () => boardProgram(fullerSchedule(), { ...fuller, cabs: fuller.cabs.map((c) => (c.cabId === 'c1' ? { ...c, pwmPin: '9' } : c)) }, 'u');

describe('generateAvrFirmware: schedule.h against the ATmega328P and ATmega2560 datasheets', () => {
  it('timers are set up in number order whatever order the cabs use them (here timer 2, then 1)', () => {
    const h = lines(files(timersOutOfOrder())['schedule.h']!).filter((l) => /^\s+TCCR\dA = /.test(l));
    expect(h.map((l) => l.trim().slice(0, 6))).toEqual(['TCCR0A', 'TCCR1A', 'TCCR2A']);
  });

  const u = () => files(boardProgram(schedule(entries), twoBoards, 'u'));
  const v = () => files(boardProgram(schedule(entries), twoBoards, 'v'));
  const full = () => files(boardProgram(fullerSchedule(), fuller, 'u'));

  it('the fixtures are valid wiring sheets', () => {
    expect(wiringSheetSchema.safeParse(twoBoards).success).toBe(true);
    expect(wiringSheetSchema.safeParse(fuller).success).toBe(true);
  });

  it('writes schedule.h, main.c, a Makefile and a README, and refuses the 40-pin-header board', () => {
    expect(generateAvrFirmware(boardProgram(schedule(entries), twoBoards, 'u'), meta).map((f) => f.name)).toEqual(['schedule.h', 'main.c', 'Makefile', 'README.txt']);
    expect(u()['main.c']).toContain('#include "schedule.h"');
    expect(() => generateAvrFirmware(boardProgram(schedule([]), headerWiring, 'u'), meta)).toThrow(new RangeError('40-pin-header Linux board is not an AVR board'));
  });

  it('the session constants: fast clock 06:30 = 23 400 s at ratio 4, origin −7 s, dead time and break from the sheet, the table sizes', () => {
    const h = lines(u()['schedule.h']!);
    for (const line of [
      '#define FP_FAST_START_S 23400L',
      '#define FP_CLOCK_RATIO_X100 400L',
      '#define FP_ORIGIN_S (-7L)',
      '#define FP_DEAD_MS 300UL',
      '#define FP_BREAK_MS 50UL',
      '#define FP_CAB_COUNT 1',
      '#define FP_BLOCK_COUNT 1',
      '#define FP_ENTRY_COUNT 6',
      '#define FP_RELAY_COUNT 2',
    ]) {
      expect(h).toContain(line);
    }
    expect(lines(full()['schedule.h']!)).toEqual(expect.arrayContaining(['#define FP_CAB_COUNT 2', '#define FP_BLOCK_COUNT 2', '#define FP_RELAY_COUNT 4']));
  });

  it('reads the stop contact and the start button through PINx with the pull-up in PORTx, bit by bit (datasheet 14.2.1)', () => {
    expect(lines(u()['schedule.h']!)).toEqual(
      expect.arrayContaining([
        '#define FP_ESTOP_PIN PIND',
        '#define FP_ESTOP_PORT PORTD',
        '#define FP_ESTOP_MASK _BV(2)',
        '#define FP_START_PIN PIND',
        '#define FP_START_PORT PORTD',
        '#define FP_START_MASK _BV(4)',
      ]),
    );
    // The ATmega2560 board's stop contact on label 22 is PA0; it has no start button.
    expect(lines(v()['schedule.h']!)).toEqual(expect.arrayContaining(['#define FP_ESTOP_PIN PINA', '#define FP_ESTOP_PORT PORTA', '#define FP_ESTOP_MASK _BV(0)']));
    expect(v()['schedule.h']).not.toContain('FP_START');
    expect(u()['schedule.h']).toContain('/* Start button: PD4 (header 4), to ground. */');
  });

  it('sets timer 0 (the clock) and each PWM timer to fast PWM with TOP 0xFF at clk/8, in timer order', () => {
    const timerLines = (text: string) => lines(text).filter((l) => /^\s+(TCCR|TIMSK)/.test(l)).map((l) => l.trim());
    expect(timerLines(u()['schedule.h']!)).toEqual(['TCCR0A = _BV(WGM00) | _BV(WGM01);', 'TCCR0B = _BV(CS01);', 'TIMSK0 = _BV(TOIE0);']);
    // c0 on OC2B: timer 2 is 8 bit like timer 0.
    expect(timerLines(full()['schedule.h']!).slice(0, 4)).toEqual(['TCCR0A = _BV(WGM00) | _BV(WGM01);', 'TCCR0B = _BV(CS01);', 'TCCR2A = _BV(WGM20) | _BV(WGM21);', 'TCCR2B = _BV(CS21);']);
    // Timer 5 of the ATmega2560 is 16 bit: mode 5 (WGM50 in A, WGM52 in B), fast PWM 8 bit.
    expect(timerLines(v()['schedule.h']!)).toEqual([
      'TCCR0A = _BV(WGM00) | _BV(WGM01);',
      'TCCR0B = _BV(CS01);',
      'TCCR5A = _BV(WGM50);',
      'TCCR5B = _BV(WGM52) | _BV(CS51);',
      'TIMSK0 = _BV(TOIE0);',
    ]);
    // Timer 1 of the ATmega328P (OC1A on PB1, header 9), listed after timer 0 whatever the cab order.
    const t1 = files(boardProgram(fullerSchedule(), { ...fuller, cabs: fuller.cabs.map((c) => (c.cabId === 'c0' ? { ...c, pwmPin: '9' } : c)) }, 'u'));
    expect(timerLines(t1['schedule.h']!).slice(0, 4)).toEqual(['TCCR0A = _BV(WGM00) | _BV(WGM01);', 'TCCR0B = _BV(CS01);', 'TCCR1A = _BV(WGM10);', 'TCCR1B = _BV(WGM12) | _BV(CS11);']);
  });

  it('fp_pwm_write: one case per cab, each ending in break (no fall-through into the next cab\'s timer), and a default', () => {
    const h = lines(full()['schedule.h']!).map((l) => l.trim());
    const body = h.slice(h.indexOf('switch (cab) {') + 1, h.indexOf('default: break;') + 1);
    expect(body.filter((l) => !l.startsWith('if (value)'))).toEqual(['case 0: /* PD3 (header 3) */', 'break;', 'case 1: /* PD6 (header 6) */', 'break;', 'default: break;']);
  });

  it('says in its comments what it is, how the stop contact is wired, the order of the pin table and where the pinout comes from', () => {
    const h = lines(u()['schedule.h']!);
    expect(h[0]).toBe('/* Generated by Fishplate: the pins of this board and its part of the session. */');
    expect(h).toContain('/* Emergency stop: PD2 (header 2), a normally closed contact to ground; open stops everything. */');
    expect(h).toContain('/* Per cab: forward input, reverse input, PWM output. */');
    expect(h.slice(-3)).toEqual([`/* ATmega328P board: ${twoBoardsSource}. */`, '#endif', '']);
    expect(lines(u()['Makefile']!)).toContain('# Opening the port resets the board into its boot loader; if the upload does not start, press reset as it begins.');
  });

  it('writes PWM through the compare register and connects the output (COMxy1) only for a value above 0', () => {
    const h = lines(u()['schedule.h']!).map((l) => l.trim());
    expect(h).toContain('case 0: /* PD6 (header 6) */');
    expect(h).toContain('if (value) { OCR0A = value; TCCR0A |= _BV(COM0A1); } else { TCCR0A &= (uint8_t)~_BV(COM0A1); OCR0A = 0; }');
    const f = lines(full()['schedule.h']!).map((l) => l.trim());
    // The program's cab order is the sheet's: c0 (OC2B on PD3) is cab 0, c1 cab 1.
    expect(f).toEqual(expect.arrayContaining(['case 0: /* PD3 (header 3) */', 'if (value) { OCR2B = value; TCCR2A |= _BV(COM2B1); } else { TCCR2A &= (uint8_t)~_BV(COM2B1); OCR2B = 0; }', 'case 1: /* PD6 (header 6) */']));
    expect(lines(v()['schedule.h']!).map((l) => l.trim())).toContain('if (value) { OCR5A = value; TCCR5A |= _BV(COM5A1); } else { TCCR5A &= (uint8_t)~_BV(COM5A1); OCR5A = 0; }');
  });

  it('lists each cab\'s forward, reverse and PWM pins and each relay by PORTx address and bit', () => {
    const h = lines(full()['schedule.h']!);
    expect(h).toContain('static const fp_pin fp_cab_pins[6] PROGMEM = {');
    expect(h).toContain('  { (uint16_t)&PORTB, _BV(4) }, { (uint16_t)&PORTB, _BV(5) }, { (uint16_t)&PORTD, _BV(3) }, /* PB4 (header 12), PB5 (header 13), PD3 (header 3) */');
    expect(h).toContain('  { (uint16_t)&PORTD, _BV(7) }, { (uint16_t)&PORTB, _BV(0) }, { (uint16_t)&PORTD, _BV(6) }, /* PD7 (header 7), PB0 (header 8), PD6 (header 6) */');
    // b1: relays to c0 (A1) and c1 (A0), then its polarity relay (A3); b9: its relay to c1 (A2).
    const relays = h.slice(h.indexOf('static const fp_pin fp_relay_pins[4] PROGMEM = {') + 1, h.indexOf('static const fp_pin fp_relay_pins[4] PROGMEM = {') + 5);
    expect(relays).toEqual([
      '  { (uint16_t)&PORTC, _BV(1) }, /* PC1 (header A1) */',
      '  { (uint16_t)&PORTC, _BV(0) }, /* PC0 (header A0) */',
      '  { (uint16_t)&PORTC, _BV(3) }, /* PC3 (header A3) */',
      '  { (uint16_t)&PORTC, _BV(2) }, /* PC2 (header A2) */',
    ]);
    expect(h).toEqual(
      expect.arrayContaining([
        'static const uint8_t fp_block_first_relay[2] PROGMEM = { 0, 3 };',
        'static const uint8_t fp_block_relay_count[2] PROGMEM = { 2, 1 };',
        'static const uint8_t fp_block_polarity_relay[2] PROGMEM = { 2, 255 };',
      ]),
    );
    expect(lines(v()['schedule.h']!)).toContain('static const uint8_t fp_block_polarity_relay[1] PROGMEM = { 2 };');
    expect(lines(u()['schedule.h']!)).toContain('static const uint8_t fp_block_polarity_relay[1] PROGMEM = { 255 };');
  });

  it('names cabs and blocks as plain C strings', () => {
    expect(lines(full()['schedule.h']!)).toEqual(
      expect.arrayContaining([
        'static const char fp_cab_name_0[] PROGMEM = "Cab ?zero?";',
        'static const char fp_cab_name_1[] PROGMEM = "Cab one";',
        'static PGM_P const fp_cab_names[2] PROGMEM = { fp_cab_name_0, fp_cab_name_1 };',
        'static const char fp_block_name_0[] PROGMEM = "Yard";',
        'static const char fp_block_name_1[] PROGMEM = "Siding?north";',
        'static PGM_P const fp_block_names[2] PROGMEM = { fp_block_name_0, fp_block_name_1 };',
      ]),
    );
  });

  it('writes every entry as { at_ms, ramp_ms, kind, target, a, b }', () => {
    const table = (text: string) => {
      const h = lines(text);
      const at = h.findIndex((l) => l.startsWith('static const fp_entry fp_entries['));
      return h.slice(at, h.indexOf('};', at) + 1);
    };
    expect(table(u()['schedule.h']!)).toEqual([
      'static const fp_entry fp_entries[6] PROGMEM = {',
      '  { 0UL, 0, FP_FEED, 0, 1, 0 },',
      '  { 0UL, 0, FP_DIRECTION, 0, 2, 0 },',
      '  { 1000UL, 2000, FP_SPEED, 0, 0, 90 },',
      '  { 4000UL, 0, FP_FEED, 0, 255, 0 },',
      '  { 4500UL, 300, FP_SPEED, 0, 90, 0 },',
      '  { 5000UL, 0, FP_DIRECTION, 0, 0, 0 },',
      '};',
    ]);
    expect(table(v()['schedule.h']!)).toEqual([
      'static const fp_entry fp_entries[5] PROGMEM = {',
      '  { 10UL, 0, FP_FEED, 0, 1, 0 },',
      '  { 10UL, 0, FP_POLARITY, 0, 1, 0 },',
      '  { 20UL, 0, FP_DIRECTION, 0, 1, 0 },',
      '  { 1500UL, 0, FP_SPEED, 0, 0, 50 },',
      '  { 4000UL, 0, FP_POLARITY, 0, 0, 0 },',
      '};',
    ]);
  });

  it('a board with nothing on it still has one-element tables (C has no empty arrays: C11 6.7.6.2)', () => {
    const empty = files(boardProgram(schedule([]), { ...twoBoards, cabs: [], blocks: [] }, 'v'));
    const h = lines(empty['schedule.h']!);
    expect(h).toEqual(
      expect.arrayContaining([
        '#define FP_CAB_COUNT 0',
        '#define FP_BLOCK_COUNT 0',
        '#define FP_ENTRY_COUNT 0',
        '#define FP_RELAY_COUNT 0',
        'static const fp_pin fp_cab_pins[3] PROGMEM = {',
        '  { 0, 0 }, { 0, 0 }, { 0, 0 }',
        'static const fp_pin fp_relay_pins[1] PROGMEM = {',
        '  { 0, 0 }',
        'static const uint8_t fp_block_first_relay[1] PROGMEM = { 0 };',
        'static const uint8_t fp_block_relay_count[1] PROGMEM = { 0 };',
        'static const uint8_t fp_block_polarity_relay[1] PROGMEM = { 0 };',
        'static PGM_P const fp_cab_names[1] PROGMEM = { 0 };',
        'static PGM_P const fp_block_names[1] PROGMEM = { 0 };',
        'static const fp_entry fp_entries[1] PROGMEM = {',
        '  { 0, 0, FP_FEED, 255, 255, 0 }',
      ]),
    );
    // Only timer 0, the clock.
    expect(h.filter((l) => l.includes('TCCR'))).toEqual(['  TCCR0A = _BV(WGM00) | _BV(WGM01);', '  TCCR0B = _BV(CS01);']);
    expect(h.filter((l) => l.includes('case '))).toEqual([]);
    // The stray placeholders appear only on an empty board.
    expect(u()['schedule.h']).not.toContain('{ 0, 0 }');
    expect(u()['schedule.h']).not.toContain('FP_FEED, 255, 255');
  });

  it('the Makefile builds for the board\'s part at 16 MHz and uploads with its boot loader\'s protocol (avrdude part names m328p, m2560)', () => {
    expect(lines(u()['Makefile']!)).toEqual(
      expect.arrayContaining([
        '# ATmega328P board: build with avr-gcc and avr-libc, upload with avrdude.',
        'MCU = atmega328p',
        'F_CPU = 16000000UL',
        '\tavrdude -p m328p -c stk500v1 -P $(PORT) -b 115200 -D -U flash:w:firmware.hex:i',
      ]),
    );
    expect(lines(v()['Makefile']!)).toEqual(expect.arrayContaining(['MCU = atmega2560', '\tavrdude -p m2560 -c stk500v2 -P $(PORT) -b 115200 -D -U flash:w:firmware.hex:i']));
  });

  it('the README names the board, the session, the size and every pin with its header label', () => {
    const r = lines(full()['README.txt']!);
    expect(r.slice(0, 3)).toEqual(['Fishplate firmware for Cab board (ATmega328P board)', 'Session: Evening ?special?. Generated 2026-12-03T12:00:00Z.', '']);
    const pins = r.slice(r.indexOf('Pins (port and bit, and the label beside the header):') + 1, r.indexOf('SAFETY') - 1);
    expect(pins).toEqual([
      '  Cab ?zero?: forward PB4 (header 12), reverse PB5 (header 13), PWM PD3 (header 3)',
      '  Cab one: forward PD7 (header 7), reverse PB0 (header 8), PWM PD6 (header 6)',
      '  Yard relay to cab c0: PC1 (header A1)',
      '  Yard relay to cab c1: PC0 (header A0)',
      '  Yard polarity relay: PC3 (header A3)',
      '  Siding?north relay to cab c1: PC2 (header A2)',
      '  emergency stop (normally closed to ground): PD2 (header 2)',
      '  start button (to ground): PD4 (header 4)',
    ]);
    expect(r[3]).toMatch(/^Size: fits the ATmega328P board: about \d+\.\d KB of 31\.5 KB flash, \d+ of 2048 bytes RAM\. Run "make"/);
    expect(v()['README.txt']).not.toContain('start button (to ground)');
    expect(v()['README.txt']).not.toContain('Yard');
    // The ATmega2560 board has no start button: its pin list ends with the stop contact.
    const rv = lines(v()['README.txt']!);
    expect(rv.slice(rv.indexOf('Pins (port and bit, and the label beside the header):') + 1, rv.indexOf('SAFETY') - 1)).toEqual([
      '  Cab two: forward PA4 (header 26), reverse PA5 (header 27), PWM PL3 (header 46)',
      '  Loop relay to cab c2: PA1 (header 23)',
      '  Loop relay to cab c1: PA2 (header 24)',
      '  Loop polarity relay: PA3 (header 25)',
      '  emergency stop (normally closed to ground): PA0 (header 22)',
    ]);
  });
});

describe('estimateFirmwareSize: the model measured with avr-gcc -Os (checked against avr-size by the toolchain test), against the datasheets', () => {
  const u = () => boardProgram(schedule(entries), twoBoards, 'u');

  it('worked example: code 3 700 + 6 entries × 10 + names ("Cab one" 8, "Yard" 5) + 1 cab × 60 + 2 relays × 15 bytes of flash; RAM 420 + 16 per cab + 6 per block', () => {
    // fp_entry is 4 + 2 + 4 × 1 = 10 bytes (avr-gcc lays structs out without padding on the 8-bit AVR).
    expect(estimateFirmwareSize(u())).toEqual({
      flashBytes: 3700 + 60 + 13 + 60 + 30,
      ramBytes: 420 + 16 + 6,
      flashLimit: 32256, // 32 KB less the 0.5 KB boot loader (ATmega328P datasheet)
      ramLimit: 2048,
      fits: true,
      advice: 'fits the ATmega328P board: about 3.8 KB of 31.5 KB flash, 442 of 2048 bytes RAM',
    });
    // A polarity relay counts as a relay.
    const withPolarity = { ...u(), blocks: u().blocks.map((b) => ({ ...b, polarity: u().emergencyStop })) };
    expect(estimateFirmwareSize(withPolarity).flashBytes).toBe(3863 + 15);
  });

  it('too much for the ATmega328P board: advice to take the ATmega2560 board or split the session', () => {
    // 3 000 entries × 10 bytes = 30 000 bytes of table alone, with the code more than 31.5 KB.
    const long = { ...u(), entries: Array.from({ length: 3000 }, () => u().entries[0]!) };
    const size = estimateFirmwareSize(long);
    expect(size.flashBytes).toBe(3863 + 2994 * 10);
    expect(size.fits).toBe(false);
    expect(size.advice).toBe('needs about 33.0 KB flash and 442 bytes RAM, more than the ATmega328P board\'s 31.5 KB and 2048 bytes: use an ATmega2560 board or split the session');
    // Up to the limit it fits: 3 803 + 10 × 2 845 = 32 253 bytes ≤ 32 256; one entry more does not.
    const edge = { ...u(), entries: Array.from({ length: 2845 }, () => u().entries[0]!) };
    expect(estimateFirmwareSize(edge).flashBytes).toBe(32253);
    expect(estimateFirmwareSize(edge).fits).toBe(true);
    expect(estimateFirmwareSize({ ...u(), entries: [...edge.entries, u().entries[0]!] }).fits).toBe(false);
  });

  it('RAM decides too: 2 048 bytes on the ATmega328P, 8 192 on the ATmega2560 (datasheets), with its own advice there', () => {
    // 420 + 16 + 6 × n ≤ 2048: n = 268 blocks fit, 269 do not.
    const blocks = (n: number) => ({ ...u(), blocks: Array.from({ length: n }, () => ({ ...u().blocks[0]!, feeds: [], name: '' })) });
    expect(estimateFirmwareSize(blocks(268)).ramBytes).toBe(2044);
    expect(estimateFirmwareSize(blocks(268)).fits).toBe(true);
    expect(estimateFirmwareSize(blocks(269)).fits).toBe(false);
    const v = boardProgram(schedule(entries), twoBoards, 'v');
    const big = { ...v, blocks: Array.from({ length: 1300 }, () => ({ ...v.blocks[0]!, feeds: [], polarity: null, name: 'x' })) };
    const size = estimateFirmwareSize(big);
    expect(size.ramBytes).toBe(420 + 16 + 1300 * 6);
    expect(size.advice).toBe(`needs about ${(size.flashBytes / 1024).toFixed(1)} KB flash and 8236 bytes RAM, more than the ATmega2560 board has: split the session`);
  });
});

const avrGcc = spawnSync('avr-gcc', ['--version']).status === 0 && spawnSync('make', ['--version']).status === 0;

/*
 * avr-gcc and GNU make themselves (Debian's gcc-avr and avr-libc, installed by .ci/run): each generated
 * program goes through its own Makefile with -fsyntax-only -Werror, so every line of schedule.h and main.c
 * must be C that avr-libc accepts for the board's part, warnings included. A check of the C, not of what it
 * does (tests/integration/control-toolchain.test.ts builds and runs it in simavr); it takes a tenth of a second.
 */
describe.skipIf(!avrGcc)('generateAvrFirmware: the files avr-gcc and make accept', () => {
  let dir: string;
  beforeAll(() => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'fishplate-fw-unit-'));
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
  const writeOut = (program: BoardProgram) => {
    const folder = fs.mkdtempSync(path.join(dir, `${program.kind}-`));
    for (const file of generateAvrFirmware(program, meta)) fs.writeFileSync(path.join(folder, file.name), file.text);
    return folder;
  };
  const make = (folder: string, ...args: string[]) => spawnSync('make', args, { cwd: folder, encoding: 'utf8' });

  it('compiles for both parts without a warning: two boards, a polarity relay, timers 0, 1, 2 and 5, and a board with nothing on it', () => {
    const programs = [
      boardProgram(schedule(entries), twoBoards, 'u'),
      boardProgram(schedule(entries), twoBoards, 'v'),
      boardProgram(fullerSchedule(), fuller, 'u'),
      timersOutOfOrder(),
      boardProgram(schedule([]), { ...twoBoards, cabs: [], blocks: [] }, 'v'),
    ];
    for (const program of programs) {
      const run = make(writeOut(program), '-s', 'firmware.elf', 'EXTRA_CFLAGS=-fsyntax-only -Werror');
      expect(run.status, `${program.board.name}: ${run.stderr}`).toBe(0);
    }
  });

  it('schedule.h stands on its own and may be included twice (its own includes and guard: C11 6.10.1, common practice)', () => {
    const folder = writeOut(boardProgram(schedule(entries), twoBoards, 'u'));
    fs.writeFileSync(path.join(folder, 'twice.c'), '#include "schedule.h"\n#include "schedule.h"\nint main(void) { fp_timers_init(); return 0; }\n');
    const run = spawnSync('avr-gcc', ['-std=gnu99', '-mmcu=atmega328p', '-Wall', '-Wno-unused', '-Werror', '-fsyntax-only', 'twice.c'], { cwd: folder, encoding: 'utf8' });
    expect(run.status, run.stderr).toBe(0);
  });

  it('make builds the hex file and the size by default, with the part and clock on the command line; upload, size and clean do what they say', () => {
    const folder = writeOut(boardProgram(schedule(entries), twoBoards, 'u'));
    const all = make(folder, '-n');
    expect(all.status, all.stderr).toBe(0);
    expect(all.stdout.split('\n')).toEqual([
      'avr-gcc -std=gnu99 -Os -Wall -Wextra -Wno-type-limits -mmcu=atmega328p -DF_CPU=16000000UL  -o firmware.elf main.c ',
      'avr-objcopy -O ihex -R .eeprom firmware.elf firmware.hex',
      'avr-size -A firmware.elf',
      '',
    ]);
    expect(make(folder, '-n', 'upload', 'PORT=/dev/ttyACM0').stdout).toContain('avrdude -p m328p -c stk500v1 -P /dev/ttyACM0 -b 115200 -D -U flash:w:firmware.hex:i');
    expect(make(folder, '-n', '-o', 'firmware.hex', 'upload').stdout.trim()).toBe('avrdude -p m328p -c stk500v1 -P /dev/ttyUSB0 -b 115200 -D -U flash:w:firmware.hex:i');
    expect(make(folder, '-n', '-o', 'firmware.elf', 'size').stdout.trim()).toBe('avr-size -A firmware.elf');
    // A file called "clean" does not stop the clean target: it is phony (GNU make manual 4.6).
    fs.writeFileSync(path.join(folder, 'clean'), '');
    expect(make(folder, '-n', 'clean').stdout.trim()).toBe('rm -f firmware.elf firmware.hex');
  });
});

describe('generateAvrFirmware: the README\'s instructions and safety cautions', () => {
  it('says how to start, stop and flash, at the firmware\'s 57 600 baud (UBRR 34 with U2X at 16 MHz, ATmega328P datasheet 24.11)', () => {
    const program = boardProgram(schedule(entries), twoBoards, 'u');
    const r = lines(files(program)['README.txt']!);
    expect(r.slice(3, 10)).toEqual([
      `Size: ${estimateFirmwareSize(program).advice}. Run "make" to build and see avr-size's figures; "make upload PORT=/dev/ttyUSB0" to flash.`,
      '',
      'Start: press the start button, or send the line "start" on the serial port (57600 baud, 8N1). The board',
      'then runs the session on its own clock and prints one line per change: fast-clock time and what changed.',
      'Emergency stop: opening the stop contact sets every PWM output to 0, clears every direction input and',
      'opens every relay at once; the board stays stopped until it is reset.',
      '',
    ]);
    expect(files(program)['main.c']).toContain('UBRR0 = 34;');
  });

  it('carries the safety cautions DOMAIN.md asks of every README (shoot-through, fuses, heat, mains, outdoors, planning aids), and the relay drive limits (ATmega328P datasheet: 40 mA absolute maximum per pin)', () => {
    const r = lines(files(boardProgram(schedule(entries), twoBoards, 'v'))['README.txt']!);
    expect(r.slice(r.indexOf('SAFETY'))).toEqual([
      'SAFETY',
      '- Never switch both transistors of one side of an H-bridge on together: it shorts the supply',
      '  (shoot-through). This firmware never drives both direction inputs high; prefer driver chips with',
      '  built-in protection.',
      '- Fuse or current-limit every supply output; an overloaded supply or driver overheats.',
      '- Driver heat sinks can reach burn temperatures; allow airflow.',
      '- Relays need a driver transistor and a flyback diode (or a relay module that has them); a board pin',
      '  sources only a few tens of mA (40 mA absolute maximum per pin, ATmega328P datasheet).',
      '- Mains-side work is hazardous: use enclosed, certified supplies; leave mains wiring to a qualified person.',
      '- Outdoor layouts: low voltage only on the track, weatherproof connections, residual-current protection.',
      '- These programs are planning aids, not a substitute for the manufacturer\'s ratings, local codes or a',
      '  licensed electrician. Try the session with the track power off first.',
      '',
    ]);
    expect(r[r.indexOf('SAFETY') - 1]).toBe('');
  });
});

describe('estimateFirmwareSize at the datasheets\' limits exactly', () => {
  it('a program using exactly the 32 256 bytes of flash and the 2 048 bytes of RAM of the ATmega328P board fits', () => {
    const u = boardProgram(schedule(entries), twoBoards, 'u');
    // Flash: 3 700 + 2 845 × 10 + 11 ("Cab one!!!") + 5 ("Yard") + 60 + 30 = 32 256.
    const flash = { ...u, cabs: u.cabs.map((c) => ({ ...c, name: 'Cab one!!!' })), entries: Array.from({ length: 2845 }, () => u.entries[0]!) };
    expect(estimateFirmwareSize(flash)).toMatchObject({ flashBytes: 32256, fits: true });
    // RAM: 420 + 2 cabs × 16 + 266 blocks × 6 = 2 048.
    const ram = { ...u, cabs: [u.cabs[0]!, u.cabs[0]!], blocks: Array.from({ length: 266 }, () => ({ ...u.blocks[0]!, feeds: [], name: '' })) };
    expect(estimateFirmwareSize(ram)).toMatchObject({ ramBytes: 2048, fits: true });
  });
});
