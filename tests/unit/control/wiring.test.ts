import { describe, expect, it } from 'vitest';
import { BOARDS, findPin, wiringSheetSchema, DEFAULT_TIMING, type WiringSheet } from '@/lib/control';

const sheet = (over: Partial<WiringSheet> = {}): WiringSheet => ({
  version: 1,
  boards: [{ id: 'u', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PD2', startPin: 'PD4' }],
  cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: 'PB0', pwmPin: 'PD6', bothHighBrakes: false }],
  blocks: [{ blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'PC0' }], polarityPin: null, forwardTowards: [] }],
  timing: DEFAULT_TIMING,
  ...over,
});
const messages = (value: unknown) => {
  const result = wiringSheetSchema.safeParse(value);
  return result.success ? [] : result.error.issues.map((i) => i.message);
};

describe('board catalogue against the published pinouts', () => {
  it('ATmega328P board: six hardware PWM pins, OC0A/OC0B PD6/PD5, OC1A/OC1B PB1/PB2, OC2A/OC2B PB3/PD3', () => {
    // ATmega328P datasheet, 1.1 pin configurations and 14.3 alternate port functions; labels 6, 5, 9, 10, 11, 3.
    const pwm = BOARDS.atmega328p.pins.filter((p) => p.pwm).map((p) => `${p.name}:${p.label}:OC${p.pwm!.timer}${p.pwm!.channel}`);
    expect(pwm.sort()).toEqual(['PB1:9:OC1A', 'PB2:10:OC1B', 'PB3:11:OC2A', 'PD3:3:OC2B', 'PD5:5:OC0B', 'PD6:6:OC0A'].sort());
    // PD0/PD1 are the serial port (labels 0 and 1).
    expect(BOARDS.atmega328p.pins.filter((p) => p.serial).map((p) => p.label)).toEqual(['0', '1']);
    // 32 KB flash less the 0.5 KB boot loader, 2 KB SRAM (datasheet).
    expect([BOARDS.atmega328p.flashBytes, BOARDS.atmega328p.ramBytes]).toEqual([32256, 2048]);
  });

  it('ATmega2560 board: PWM on labels 2–13 and 44–46; 0 and 1 serial; 248 KB flash for programs, 8 KB RAM', () => {
    // ATmega2560 datasheet and the common board's header labels.
    const labels = BOARDS.atmega2560.pins.filter((p) => p.pwm).map((p) => Number(p.label)).sort((a, b) => a - b);
    expect(labels).toEqual([2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 44, 45, 46]);
    expect(BOARDS.atmega2560.pins.filter((p) => p.serial).map((p) => p.label)).toEqual(['0', '1']);
    expect([BOARDS.atmega2560.flashBytes, BOARDS.atmega2560.ramBytes]).toEqual([253952, 8192]);
    expect(findPin('atmega2560', '13')?.name).toBe('PB7');
  });

  it('40-pin header: hardware PWM on GPIO 12, 13, 18, 19; GPIO 14/15 serial; physical pin 12 is GPIO18', () => {
    // The header's published GPIO pinout; gpiozero documentation.
    expect(BOARDS.header40.pins.filter((p) => p.hardwarePwm).map((p) => p.name).sort()).toEqual(['GPIO12', 'GPIO13', 'GPIO18', 'GPIO19']);
    expect(BOARDS.header40.pins.filter((p) => p.serial).map((p) => p.name)).toEqual(['GPIO14', 'GPIO15']);
    expect(findPin('header40', 'pin 12')?.name).toBe('GPIO18');
  });
});

describe('wiring sheet validation', () => {
  it('accepts a sheet within the rules', () => {
    expect(messages(sheet())).toEqual([]);
  });

  it('refuses a pin used twice (also when once by name and once by header label)', () => {
    const m = messages(sheet({ cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: '7', pwmPin: 'PD6', bothHighBrakes: false }] }));
    expect(m.join('\n')).toMatch(/PD7 \(7\) on Cab board is already the forward input/);
  });

  it('refuses PWM on a pin without a timer output, the serial pins, and pins the board does not have', () => {
    expect(messages(sheet({ cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: 'PB0', pwmPin: 'PD4', bothHighBrakes: false }] })).join()).toMatch(/no hardware PWM/);
    expect(messages(sheet({ boards: [{ id: 'u', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PD0', startPin: null }] })).join()).toMatch(/serial port/);
    expect(messages(sheet({ boards: [{ id: 'u', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PE0', startPin: null }] })).join()).toMatch(/has no pin "PE0"/);
    expect(messages(sheet({ boards: [{ id: 'u', kind: 'header40', name: 'Linux', emergencyStopPin: 'GPIO14', startPin: null }] })).join()).toMatch(/serial port/);
  });

  it('refuses unknown boards and cabs, and times out of range', () => {
    const m = messages(sheet({ blocks: [{ blockId: 'b1', boardId: 'zz', feeds: [], polarityPin: null, forwardTowards: ['b9'] }], timing: { ...DEFAULT_TIMING, deadTimeMs: 5 } }));
    expect(m.join('\n')).toMatch(/unknown board "zz"/);
    expect(m.join('\n')).toMatch(/block "b9" is not on the wiring sheet/);
    expect(m.join('\n')).toMatch(/50 ms or more/);
  });
});
