import { describe, expect, it } from 'vitest';
import { boardProgram, generatePythonController } from '@/lib/control';
import { entries, oneLinuxBoard, schedule, twoBoards } from './two-boards';

/*
 * The generated Python program's tables, by GPIO number as gpiozero numbers pins (gpiozero documentation,
 * "Pin numbering": BCM numbering by default) from the 40-pin header's published pinout (physical pin 36
 * is GPIO16, pin 32 is GPIO12). The program itself runs under gpiozero's mock pins in
 * tests/integration/control-toolchain.test.ts.
 */
const meta = { title: 'Evening "special"', generatedAt: '2026-12-03T12:00:00Z' };
const lines = (text: string) => text.split('\n');

describe('generatePythonController: the board\'s pins and its part of the session as Python tables', () => {
  const withNames = { ...schedule(entries), cabs: schedule(entries).cabs.map((c) => (c.cabId === 'c2' ? { ...c, name: 'Cab "two"' } : c)) };
  const text = () => generatePythonController(boardProgram(withNames, oneLinuxBoard, 'p'), meta);

  it('names the board and the session in its header, names made plain', () => {
    expect(lines(text()).slice(0, 3)).toEqual([
      '#!/usr/bin/env python3',
      '# Fishplate controller for Linux board (40-pin-header Linux board), on gpiozero.',
      '# Session: Evening ?special?. Generated 2026-12-03T12:00:00Z.',
    ]);
  });

  it('the session constants: fast clock 06:30 = 23 400 s, ratio 4, origin −7 s, dead time, break, the stop contact on GPIO4 and start on pin 36 = GPIO16', () => {
    expect(lines(text())).toEqual(
      expect.arrayContaining(['FAST_START_S = 23400', 'CLOCK_RATIO = 4', 'ORIGIN_S = -7', 'DEAD_MS = 300', 'BREAK_MS = 50', 'ESTOP_GPIO = 4', 'START_GPIO = 16']),
    );
    const noStart = { ...oneLinuxBoard, boards: oneLinuxBoard.boards.map((b) => ({ ...b, startPin: null })) };
    expect(lines(generatePythonController(boardProgram(schedule(entries), noStart, 'p'), meta))).toContain('START_GPIO = None');
  });

  it('lists each cab (forward, reverse, PWM) and block (relays in sheet order, polarity relay or None) by GPIO number', () => {
    const t = lines(text());
    expect(t.slice(t.indexOf('CABS = [') + 1, t.indexOf('CABS = [') + 4)).toEqual(['    ("Cab one", 17, 27, 18),', '    ("Cab ?two?", 22, 23, 12),', ']']);
    expect(t.slice(t.indexOf('BLOCKS = [') + 1, t.indexOf('BLOCKS = [') + 4)).toEqual(['    ("Yard", [5, 6], None),', '    ("Loop", [13, 19], 26),', ']']);
  });

  it('writes every entry as (ms, kind, cab or block, a, b, ramp ms): relay -1 for a release, polarity 1 for swapped', () => {
    const t = lines(text());
    const at = t.indexOf('ENTRIES = [');
    expect(t.slice(at + 1, at + 13)).toEqual([
      '    (0, FEED, 0, 1, 0, 0),',
      '    (0, DIRECTION, 0, 2, 0, 0),',
      '    (10, FEED, 1, 1, 0, 0),',
      '    (10, POLARITY, 1, 1, 0, 0),',
      '    (20, DIRECTION, 1, 1, 0, 0),',
      '    (1000, SPEED, 0, 0, 90, 2000),',
      '    (1500, SPEED, 1, 0, 50, 0),',
      '    (4000, FEED, 0, -1, 0, 0),',
      '    (4000, POLARITY, 1, 0, 0, 0),',
      '    (4500, SPEED, 0, 90, 0, 300),',
      '    (5000, DIRECTION, 0, 0, 0, 0),',
      ']',
    ]);
  });

  it('an empty board gives empty tables', () => {
    const t = lines(generatePythonController(boardProgram(schedule([]), { ...oneLinuxBoard, cabs: [], blocks: [] }, 'p'), meta));
    for (const table of ['CABS = [', 'BLOCKS = [', 'ENTRIES = [']) expect(t.slice(t.indexOf(table), t.indexOf(table) + 3)).toEqual([table, '', ']']);
  });

  it('runs only on the 40-pin-header board', () => {
    expect(() => generatePythonController(boardProgram(schedule(entries), twoBoards, 'u'), meta)).toThrow(new RangeError('ATmega328P board does not run the Python program'));
  });
});
