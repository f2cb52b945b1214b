import { DEFAULT_TIMING, type WiringSheet } from '@/lib/control';

type CabKey = 'cab1' | 'cab2' | 'cab3' | 'cab4';

// Which cabs may feed each block of the indoor branch, and the blocks ahead of it towards the terminus
// (the branch's forward direction: right-hand rail positive running towards Fernwick, NEM 631 2.3).
const YARD_BOARD_BLOCKS: [string, CabKey[], string[]][] = [
  ['Y1', ['cab1', 'cab3'], ['YL']],
  ['Y2', ['cab1', 'cab2', 'cab3'], ['YL']],
  ['YL', ['cab1', 'cab2', 'cab3'], ['M1']],
  ['M5', ['cab1', 'cab2', 'cab3', 'cab4'], ['T1', 'T2']],
  ['T1', ['cab1', 'cab3', 'cab4'], []],
  ['T2', ['cab2', 'cab3'], []],
];
const LINE_BOARD_BLOCKS: [string, CabKey[], string[]][] = [
  ['M1', ['cab1', 'cab2', 'cab3', 'cab4'], ['M2']],
  ['M2', ['cab1', 'cab2', 'cab3', 'cab4'], ['L1', 'L2']],
  ['L1', ['cab1', 'cab2', 'cab3', 'cab4'], ['M3']],
  ['L2', ['cab1', 'cab2', 'cab3', 'cab4'], ['M3']],
  ['M3', ['cab1', 'cab2', 'cab3', 'cab4'], ['M4']],
  ['M4', ['cab1', 'cab2', 'cab3', 'cab4'], ['M5']],
  // Yard road 3 was added later and wired to the main line board's spare outputs.
  ['Y3', ['cab1', 'cab3'], ['YL']],
];
// Free GPIOs of the 40-pin header after the stop (GPIO4) and start (GPIO17) inputs, serial 14/15 left free.
const YARD_GPIO = [2, 3, 5, 6, 7, 8, 9, 10, 11, 12, 13, 16, 18, 19, 20, 21, 22, 23, 24, 25, 26, 27];

/**
 * The demo branch's wiring sheet: an ATmega328P board drives the four cabs (H-bridge inputs and PWM),
 * a 40-pin-header Linux board switches the yard and terminus blocks, an ATmega2560 board the main line.
 * Every board has its own stop input; the stop contacts are wired in series with one another.
 */
export function demoWiringSheet(blockId: (key: string) => string, cabId: (key: CabKey) => string): WiringSheet {
  let gpio = 0;
  let megaLabel = 24;
  return {
    version: 1,
    boards: [
      { id: 'cab-board', kind: 'atmega328p', name: 'Cab board', emergencyStopPin: 'PD2', startPin: 'PC4' },
      { id: 'yard-board', kind: 'header40', name: 'Yard and terminus board', emergencyStopPin: 'GPIO4', startPin: 'GPIO17' },
      { id: 'line-board', kind: 'atmega2560', name: 'Main line board', emergencyStopPin: '22', startPin: '23' },
    ],
    cabs: [
      { cabId: cabId('cab1'), boardId: 'cab-board', forwardPin: 'PD7', reversePin: 'PB0', pwmPin: 'PD6', bothHighBrakes: false },
      { cabId: cabId('cab2'), boardId: 'cab-board', forwardPin: 'PD4', reversePin: 'PB4', pwmPin: 'PD5', bothHighBrakes: false },
      { cabId: cabId('cab3'), boardId: 'cab-board', forwardPin: 'PC0', reversePin: 'PC1', pwmPin: 'PB1', bothHighBrakes: false },
      { cabId: cabId('cab4'), boardId: 'cab-board', forwardPin: 'PC2', reversePin: 'PC3', pwmPin: 'PB2', bothHighBrakes: false },
    ],
    blocks: [
      ...YARD_BOARD_BLOCKS.map(([key, cabs, ahead]) => ({
        blockId: blockId(key),
        boardId: 'yard-board',
        feeds: cabs.map((cab) => ({ cabId: cabId(cab), pin: `GPIO${YARD_GPIO[gpio++]}` })),
        polarityPin: null,
        forwardTowards: ahead.map(blockId),
      })),
      ...LINE_BOARD_BLOCKS.map(([key, cabs, ahead]) => ({
        blockId: blockId(key),
        boardId: 'line-board',
        feeds: cabs.map((cab) => ({ cabId: cabId(cab), pin: String(megaLabel++) })),
        polarityPin: null,
        forwardTowards: ahead.map(blockId),
      })),
    ],
    timing: DEFAULT_TIMING,
  };
}
