import { describe, expect, it } from 'vitest';
import { BOARDS, canonicalPin, findPin, pinTitle, wiringSheetSchema, DEFAULT_TIMING, type WiringSheet } from '@/lib/control';

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

/** Every issue as "path: message", the way the wiring form shows it beside its field. */
const issues = (value: unknown) => {
  const result = wiringSheetSchema.safeParse(value);
  return result.success ? [] : result.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
};
const atmega328p = 'ATmega328P datasheet (pinout, alternate port functions, timers) and the common board\'s header labels';

describe('wiring sheet validation: each rule with the field it names', () => {
  it('names the board, cab and block ids given twice', () => {
    const twice = sheet({
      boards: [sheet().boards[0]!, { id: 'u', kind: 'atmega328p', name: 'Second', emergencyStopPin: 'PD3', startPin: null }],
      cabs: [sheet().cabs[0]!, { cabId: 'c1', boardId: 'u', forwardPin: 'PB1', reversePin: 'PB2', pwmPin: 'PD5', bothHighBrakes: false }],
      blocks: [sheet().blocks[0]!, { blockId: 'b1', boardId: 'u', feeds: [], polarityPin: null, forwardTowards: [] }],
    });
    expect(issues(twice)).toEqual([
      'boards.1.id: duplicate board id "u"',
      'cabs.1.cabId: cab "c1" is wired twice',
      'blocks.1.blockId: block "b1" is wired twice',
    ]);
  });

  it('names a pin the board does not have, with the source of its pinout', () => {
    // ATmega328P datasheet 1.1: ports B, C and D only; PC6 is the reset pin and not on the header.
    expect(issues(sheet({ boards: [{ id: 'u', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PC6', startPin: 'PE1' }] }))).toEqual([
      `boards.0.emergencyStopPin: ATmega328P board has no pin "PC6" (source: ${atmega328p})`,
      `boards.0.startPin: ATmega328P board has no pin "PE1" (source: ${atmega328p})`,
    ]);
  });

  it('keeps the serial pins free on every board (ATmega328P PD0/PD1, ATmega2560 PE0/PE1 = labels 0 and 1, 40-pin header GPIO14/15)', () => {
    expect(issues(sheet({ cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: '1', reversePin: 'PB0', pwmPin: 'PD6', bothHighBrakes: false }] }))).toEqual([
      'cabs.0.forwardPin: PD1 (1) is the serial port of the ATmega328P board; leave it free',
    ]);
    const mega = sheet({
      boards: [{ id: 'u', kind: 'atmega2560', name: 'Line board', emergencyStopPin: 'PE0', startPin: '22' }],
      cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: '23', reversePin: '24', pwmPin: '44', bothHighBrakes: false }],
      blocks: [{ blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'PE1' }], polarityPin: '25', forwardTowards: [] }],
    });
    expect(issues(mega)).toEqual([
      'boards.0.emergencyStopPin: PE0 (0) is the serial port of the ATmega2560 board; leave it free',
      'blocks.0.feeds.0.pin: PE1 (1) is the serial port of the ATmega2560 board; leave it free',
    ]);
    const linux = sheet({
      boards: [{ id: 'u', kind: 'header40', name: 'Linux', emergencyStopPin: 'GPIO4', startPin: 'pin 10' }],
      cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'GPIO17', reversePin: 'GPIO27', pwmPin: 'GPIO22', bothHighBrakes: false }],
      blocks: [{ blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'GPIO5' }], polarityPin: null, forwardTowards: [] }],
    });
    // Physical pin 10 is GPIO15 (RXD); gpiozero's software PWM works on GPIO22, which has no hardware PWM.
    expect(issues(linux)).toEqual(['boards.0.startPin: GPIO15 (pin 10) is the serial port of the 40-pin-header Linux board; leave it free']);
  });

  it('puts PWM only on a timer compare output of an AVR board (ATmega328P: PD4 has none; ATmega2560: label 44 is OC5C)', () => {
    expect(issues(sheet({ cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: 'PB0', pwmPin: '4', bothHighBrakes: false }] }))).toEqual([
      `cabs.0.pwmPin: PD4 (4) has no hardware PWM on the ATmega328P board (source: ${atmega328p})`,
    ]);
    // Only the PWM output needs a timer: direction inputs and relays may sit on a PWM pin.
    expect(issues(sheet({ cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PB1', reversePin: 'PB2', pwmPin: 'PD6', bothHighBrakes: false }] }))).toEqual([]);
  });

  it('names the holder of a pin used twice, on the same board only', () => {
    const m = issues(
      sheet({
        boards: [
          { id: 'u', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PD2', startPin: 'PD4' },
          { id: 'w', kind: 'atmega328p', name: 'Other board', emergencyStopPin: 'PD2', startPin: 'PD4' },
        ],
        cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: 'PB0', pwmPin: 'PD6', bothHighBrakes: false }],
        blocks: [
          { blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: '2' }], polarityPin: 'PD7', forwardTowards: [] },
          { blockId: 'b2', boardId: 'w', feeds: [{ cabId: 'c1', pin: 'PD6' }], polarityPin: '7', forwardTowards: [] },
        ],
      }),
    );
    expect(m).toEqual([
      'blocks.0.feeds.0.pin: PD2 (2) on Cab board is already the emergency stop',
      'blocks.0.polarityPin: PD7 (7) on Cab board is already the forward input of cab "c1"',
    ]);
    const start = issues(sheet({ cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: 'PD4', pwmPin: 'PD6', bothHighBrakes: false }] }));
    expect(start).toEqual(['cabs.0.reversePin: PD4 (4) on Cab board is already the start button']);
    const pwm = issues(sheet({ blocks: [{ blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'PB0' }], polarityPin: '6', forwardTowards: [] }] }));
    expect(pwm).toEqual([
      'blocks.0.feeds.0.pin: PB0 (8) on Cab board is already the reverse input of cab "c1"',
      'blocks.0.polarityPin: PD6 (6) on Cab board is already the PWM output of cab "c1"',
    ]);
    const relay = issues(sheet({ blocks: [sheet().blocks[0]!, { blockId: 'b2', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'A0' }], polarityPin: null, forwardTowards: [] }] }));
    expect(relay).toEqual(['blocks.1.feeds.0.pin: PC0 (A0) on Cab board is already the relay of block "b1" to cab "c1"']);
    const polarity = issues(sheet({ blocks: [{ ...sheet().blocks[0]!, polarityPin: 'PC1' }, { blockId: 'b2', boardId: 'u', feeds: [], polarityPin: 'A1', forwardTowards: [] }] }));
    expect(polarity).toEqual(['blocks.1.polarityPin: PC1 (A1) on Cab board is already the polarity relay of block "b1"']);
  });

  it('names unknown boards of cabs and blocks (and checks no pin of theirs), a feed from a cab not wired or twice from one cab', () => {
    expect(
      issues(
        sheet({
          cabs: [{ cabId: 'c1', boardId: 'x', forwardPin: 'PD0', reversePin: 'PD0', pwmPin: 'PD0', bothHighBrakes: false }],
          blocks: [{ blockId: 'b1', boardId: 'y', feeds: [{ cabId: 'c1', pin: 'PD0' }], polarityPin: 'PD0', forwardTowards: [] }],
        }),
      ),
    ).toEqual(['cabs.0.boardId: unknown board "x"', 'blocks.0.boardId: unknown board "y"']);
    expect(
      issues(
        sheet({
          blocks: [
            { blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'PC0' }, { cabId: 'c9', pin: 'PC1' }, { cabId: 'c1', pin: 'PC2' }], polarityPin: null, forwardTowards: ['b1'] },
          ],
        }),
      ),
    ).toEqual(['blocks.0.feeds.1.cabId: cab "c9" is not wired', 'blocks.0.feeds.2.cabId: cab "c1" already has a relay on this block']);
  });

  it('resolves forwardTowards against every block of the sheet, also blocks listed after it', () => {
    const blocks = [
      { blockId: 'b1', boardId: 'u', feeds: [], polarityPin: null, forwardTowards: ['b2'] },
      { blockId: 'b2', boardId: 'u', feeds: [], polarityPin: null, forwardTowards: ['b1', 'b3'] },
    ];
    expect(issues(sheet({ blocks }))).toEqual(['blocks.1.forwardTowards.1: block "b3" is not on the wiring sheet']);
  });
});

describe('pins by name or by header label', () => {
  it('canonicalPin gives the port-and-bit name whichever way the sheet wrote it, and leaves an unknown pin as written', () => {
    // ATmega328P common board: label A5 is PC5, label 13 is PB5; 40-pin header: physical pin 40 is GPIO21.
    expect(canonicalPin('atmega328p', 'A5')).toBe('PC5');
    expect(canonicalPin('atmega328p', '13')).toBe('PB5');
    expect(canonicalPin('atmega328p', 'PB5')).toBe('PB5');
    expect(canonicalPin('header40', 'pin 40')).toBe('GPIO21');
    expect(canonicalPin('atmega328p', 'PE0')).toBe('PE0');
  });
  it('pinTitle shows both names (ATmega2560 common board: label A8 is PK0), an unknown one as written', () => {
    expect(pinTitle('atmega328p', '6')).toBe('PD6 (6)');
    expect(pinTitle('header40', 'GPIO18')).toBe('GPIO18 (pin 12)');
    expect(pinTitle('atmega2560', 'A8')).toBe('PK0 (A8)');
    expect(pinTitle('atmega2560', 'nope')).toBe('nope');
    expect(findPin('atmega2560', 'PA0')?.label).toBe('22');
  });
  it('the AVR boards take PWM only where a timer has a compare output; the 40-pin board anywhere (gpiozero software PWM)', () => {
    expect(BOARDS.atmega328p.pwmCapable(findPin('atmega328p', 'PD5')!)).toBe(true);
    expect(BOARDS.atmega328p.pwmCapable(findPin('atmega328p', 'PD4')!)).toBe(false);
    expect(BOARDS.atmega2560.pwmCapable(findPin('atmega2560', '45')!)).toBe(true); // PL4, OC5B
    expect(BOARDS.atmega2560.pwmCapable(findPin('atmega2560', '47')!)).toBe(false); // PL2
    expect(BOARDS.header40.pwmCapable(findPin('header40', 'GPIO22')!)).toBe(true);
  });
});
