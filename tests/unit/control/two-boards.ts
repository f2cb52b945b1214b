import { SCHEDULE_FORMAT, SCHEDULE_VERSION, type ControlEntry, type ControlSchedule, type WiringSheet } from '@/lib/control';

/*
 * Two AVR boards and a schedule written by hand (the format of lib/control/schedule.ts), so every entry
 * of each board's program is known. Pins by name or by header label: ATmega328P datasheet 1.1 with the
 * common board's labels (6 is PD6, 8 is PB0, A0 is PC0); ATmega2560 datasheet with its common board's
 * labels (22 is PA0, 46 is PL3).
 */
export const timing = { leadS: 1, releaseS: 0.5, deadTimeMs: 300, breakMs: 50, accelerateS: 2, brakeS: 2 };

export const twoBoards: WiringSheet = {
  version: 1,
  boards: [
    { id: 'u', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PD2', startPin: '4' },
    { id: 'v', kind: 'atmega2560', name: 'Line board', emergencyStopPin: '22', startPin: null },
  ],
  cabs: [
    // c0 is on the sheet but not in the schedule: it has no place in the program's cab table.
    { cabId: 'c0', boardId: 'u', forwardPin: 'PB4', reversePin: 'PB5', pwmPin: 'PB1', bothHighBrakes: false },
    { cabId: 'c1', boardId: 'u', forwardPin: 'PD7', reversePin: '8', pwmPin: '6', bothHighBrakes: false },
    { cabId: 'c2', boardId: 'v', forwardPin: 'PA4', reversePin: 'PA5', pwmPin: '46', bothHighBrakes: true },
  ],
  blocks: [
    { blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c0', pin: 'A1' }, { cabId: 'c1', pin: 'A0' }], polarityPin: null, forwardTowards: [] },
    { blockId: 'b9', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'A2' }], polarityPin: null, forwardTowards: [] },
    { blockId: 'b2', boardId: 'v', feeds: [{ cabId: 'c2', pin: 'PA1' }, { cabId: 'c1', pin: 'PA2' }], polarityPin: 'PA3', forwardTowards: [] },
  ],
  timing,
};

export function schedule(entries: ControlEntry[]): ControlSchedule {
  return {
    format: SCHEDULE_FORMAT,
    version: SCHEDULE_VERSION,
    originS: -7,
    clock: { ratio: 4, fastStart: '06:30' },
    timing,
    cabs: [
      { cabId: 'c1', name: 'Cab one' },
      { cabId: 'c2', name: 'Cab two' },
    ],
    blocks: [
      { blockId: 'b1', name: 'Yard', reversing: false },
      { blockId: 'b2', name: 'Loop', reversing: true },
    ],
    runs: [],
    entries,
    endMs: 0,
    findings: [],
  };
}

export const entries: ControlEntry[] = [
  { atMs: 0, kind: 'feed', blockId: 'b1', cabId: 'c1' },
  { atMs: 0, kind: 'direction', cabId: 'c1', direction: 'reverse' },
  { atMs: 10, kind: 'feed', blockId: 'b2', cabId: 'c1' },
  { atMs: 10, kind: 'polarity', blockId: 'b2', polarity: 'swapped' },
  { atMs: 20, kind: 'direction', cabId: 'c2', direction: 'forward' },
  { atMs: 1000, kind: 'speed', cabId: 'c1', from: 0, to: 90, rampMs: 2000 },
  { atMs: 1500, kind: 'speed', cabId: 'c2', from: 0, to: 50, rampMs: 0 },
  { atMs: 4000, kind: 'feed', blockId: 'b1', cabId: null },
  { atMs: 4000, kind: 'polarity', blockId: 'b2', polarity: 'normal' },
  { atMs: 4500, kind: 'speed', cabId: 'c1', from: 90, to: 0, rampMs: 300 },
  { atMs: 5000, kind: 'direction', cabId: 'c1', direction: 'off' },
];

/** The same cabs and blocks on one 40-pin-header Linux board (its published pinout: GPIO numbers). */
export const oneLinuxBoard: WiringSheet = {
  version: 1,
  boards: [{ id: 'p', kind: 'header40', name: 'Linux board', emergencyStopPin: 'GPIO4', startPin: 'pin 36' }],
  cabs: [
    { cabId: 'c1', boardId: 'p', forwardPin: 'GPIO17', reversePin: 'GPIO27', pwmPin: 'GPIO18', bothHighBrakes: false },
    { cabId: 'c2', boardId: 'p', forwardPin: 'GPIO22', reversePin: 'GPIO23', pwmPin: 'pin 32', bothHighBrakes: false },
  ],
  blocks: [
    { blockId: 'b1', boardId: 'p', feeds: [{ cabId: 'c2', pin: 'GPIO5' }, { cabId: 'c1', pin: 'GPIO6' }], polarityPin: null, forwardTowards: [] },
    { blockId: 'b2', boardId: 'p', feeds: [{ cabId: 'c2', pin: 'GPIO13' }, { cabId: 'c1', pin: 'GPIO19' }], polarityPin: 'GPIO26', forwardTowards: [] },
  ],
  timing,
};
