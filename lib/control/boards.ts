/**
 * The controller boards Fishplate can generate programs for, with their pins as the published
 * pinouts give them. A pin is named by its port and bit on the AVR boards ("PD6") and by its GPIO
 * number on the 40-pin header ("GPIO18"); `label` is what is printed beside the header.
 *
 * Sources: ATmega328P datasheet (Microchip DS40002061, 1.1 "Pin configurations", 14.3 "Alternate
 * port functions", 19 "Timer/Counter0 with PWM"); ATmega2560 datasheet (Microchip DS2549, 1.1 pinout,
 * 13.3 alternate port functions) with the common ATmega2560 board's header labels; the 40-pin-header
 * Linux board's published GPIO pinout and gpiozero's pin numbering documentation.
 */

export type BoardKind = 'atmega328p' | 'atmega2560' | 'header40';

/** A timer compare output that gives hardware PWM on an AVR pin. */
export interface AvrPwm {
  timer: number;
  channel: 'A' | 'B' | 'C';
  /** Data-space address of the compare register (its low byte on 16-bit timers), from the datasheet's register summary. */
  ocrAddress: number;
}

export interface BoardPin {
  name: string;
  label: string;
  /** AVR: hardware PWM from a timer. 40-pin header: null (software PWM works on any GPIO; see `hardwarePwm`). */
  pwm: AvrPwm | null;
  /** 40-pin header: one of the four hardware-PWM GPIOs. */
  hardwarePwm: boolean;
  serial: boolean;
}

export interface BoardSpec {
  kind: BoardKind;
  /** How the product names the board: by chip and header, never by a maker. */
  title: string;
  source: string;
  /** Flash the program may use (total less the boot loader), bytes. Null for the Linux board. */
  flashBytes: number | null;
  ramBytes: number | null;
  /** avr-gcc's -mmcu and avrdude's -p part names. */
  mcu: string | null;
  avrdudePart: string | null;
  /**
   * avrdude programmer (the protocol the usual serial boot loader speaks: STK500 version 1 on the ATmega328P board,
   * version 2 on the ATmega2560 board: common practice) and its baud rate.
   */
  avrdudeProgrammer: string | null;
  avrdudeBaud: number | null;
  cpuHz: number | null;
  /** Every pin a program may drive on this board (serial pins included, marked). */
  pins: BoardPin[];
  /** Whether a pin can carry a cab's PWM output. */
  pwmCapable: (pin: BoardPin) => boolean;
}

const pwm = (timer: number, channel: AvrPwm['channel'], ocrAddress: number): AvrPwm => ({ timer, channel, ocrAddress });

function avrPin(name: string, label: string, pwmOut: AvrPwm | null = null, serial = false): BoardPin {
  return { name, label, pwm: pwmOut, hardwarePwm: pwmOut !== null, serial };
}

// ATmega328P datasheet: OCR0A 0x47, OCR0B 0x48, OCR1AL 0x88, OCR1BL 0x8A, OCR2A 0xB3, OCR2B 0xB4 (register summary).
const ATMEGA328P_PINS: BoardPin[] = [
  avrPin('PD0', '0', null, true),
  avrPin('PD1', '1', null, true),
  avrPin('PD2', '2'),
  avrPin('PD3', '3', pwm(2, 'B', 0xb4)),
  avrPin('PD4', '4'),
  avrPin('PD5', '5', pwm(0, 'B', 0x48)),
  avrPin('PD6', '6', pwm(0, 'A', 0x47)),
  avrPin('PD7', '7'),
  avrPin('PB0', '8'),
  avrPin('PB1', '9', pwm(1, 'A', 0x88)),
  avrPin('PB2', '10', pwm(1, 'B', 0x8a)),
  avrPin('PB3', '11', pwm(2, 'A', 0xb3)),
  avrPin('PB4', '12'),
  avrPin('PB5', '13'),
  avrPin('PC0', 'A0'),
  avrPin('PC1', 'A1'),
  avrPin('PC2', 'A2'),
  avrPin('PC3', 'A3'),
  avrPin('PC4', 'A4'),
  avrPin('PC5', 'A5'),
];

// ATmega2560 datasheet register summary: OCR0A 0x47, OCR0B 0x48, OCR1AL 0x88, OCR1BL 0x8A, OCR2A 0xB3,
// OCR2B 0xB4, OCR3AL 0x98, OCR3BL 0x9A, OCR3CL 0x9C, OCR4AL 0xA8, OCR4BL 0xAA, OCR4CL 0xAC, OCR5AL 0x128,
// OCR5BL 0x12A, OCR5CL 0x12C. Label 13 (PB7) is both OC0A and OC1C; timer 0 drives it here.
const MEGA_LABELS: [string, string, AvrPwm | null][] = [
  ['PE0', '0', null], ['PE1', '1', null], ['PE4', '2', pwm(3, 'B', 0x9a)], ['PE5', '3', pwm(3, 'C', 0x9c)],
  ['PG5', '4', pwm(0, 'B', 0x48)], ['PE3', '5', pwm(3, 'A', 0x98)], ['PH3', '6', pwm(4, 'A', 0xa8)],
  ['PH4', '7', pwm(4, 'B', 0xaa)], ['PH5', '8', pwm(4, 'C', 0xac)], ['PH6', '9', pwm(2, 'B', 0xb4)],
  ['PB4', '10', pwm(2, 'A', 0xb3)], ['PB5', '11', pwm(1, 'A', 0x88)], ['PB6', '12', pwm(1, 'B', 0x8a)],
  ['PB7', '13', pwm(0, 'A', 0x47)], ['PJ1', '14', null], ['PJ0', '15', null], ['PH1', '16', null], ['PH0', '17', null],
  ['PD3', '18', null], ['PD2', '19', null], ['PD1', '20', null], ['PD0', '21', null],
  ['PA0', '22', null], ['PA1', '23', null], ['PA2', '24', null], ['PA3', '25', null], ['PA4', '26', null],
  ['PA5', '27', null], ['PA6', '28', null], ['PA7', '29', null], ['PC7', '30', null], ['PC6', '31', null],
  ['PC5', '32', null], ['PC4', '33', null], ['PC3', '34', null], ['PC2', '35', null], ['PC1', '36', null],
  ['PC0', '37', null], ['PD7', '38', null], ['PG2', '39', null], ['PG1', '40', null], ['PG0', '41', null],
  ['PL7', '42', null], ['PL6', '43', null], ['PL5', '44', pwm(5, 'C', 0x12c)], ['PL4', '45', pwm(5, 'B', 0x12a)],
  ['PL3', '46', pwm(5, 'A', 0x128)], ['PL2', '47', null], ['PL1', '48', null], ['PL0', '49', null],
  ['PB3', '50', null], ['PB2', '51', null], ['PB1', '52', null], ['PB0', '53', null],
  ...Array.from({ length: 8 }, (_, i): [string, string, null] => [`PF${i}`, `A${i}`, null]),
  ...Array.from({ length: 8 }, (_, i): [string, string, null] => [`PK${i}`, `A${i + 8}`, null]),
];
const ATMEGA2560_PINS: BoardPin[] = MEGA_LABELS.map(([name, label, p]) => avrPin(name, label, p, name === 'PE0' || name === 'PE1'));

// The 40-pin header: physical pin → GPIO. GPIO 0 and 1 (pins 27, 28) are kept for the add-on board
// ID EEPROM and are left out. Hardware PWM on GPIO 12, 13, 18, 19; GPIO 14/15 are the serial port.
const HEADER40: [number, number][] = [
  [3, 2], [5, 3], [7, 4], [8, 14], [10, 15], [11, 17], [12, 18], [13, 27], [15, 22], [16, 23], [18, 24],
  [19, 10], [21, 9], [22, 25], [23, 11], [24, 8], [26, 7], [29, 5], [31, 6], [32, 12], [33, 13], [35, 19],
  [36, 16], [37, 26], [38, 20], [40, 21],
];
const HEADER40_PINS: BoardPin[] = HEADER40.map(([physical, gpio]) => ({
  name: `GPIO${gpio}`,
  label: `pin ${physical}`,
  pwm: null,
  hardwarePwm: [12, 13, 18, 19].includes(gpio),
  serial: gpio === 14 || gpio === 15,
}));

export const BOARDS: Record<BoardKind, BoardSpec> = {
  atmega328p: {
    kind: 'atmega328p',
    title: 'ATmega328P board',
    source: 'ATmega328P datasheet (pinout, alternate port functions, timers) and the common board\'s header labels',
    // 32 KB flash less the 0.5 KB boot loader; 2 KB SRAM (ATmega328P datasheet).
    flashBytes: 32 * 1024 - 512,
    ramBytes: 2 * 1024,
    mcu: 'atmega328p',
    avrdudePart: 'm328p',
    avrdudeProgrammer: 'stk500v1',
    avrdudeBaud: 115200,
    cpuHz: 16_000_000,
    pins: ATMEGA328P_PINS,
    pwmCapable: (pin) => pin.pwm !== null,
  },
  atmega2560: {
    kind: 'atmega2560',
    title: 'ATmega2560 board',
    source: 'ATmega2560 datasheet (pinout, alternate port functions, timers) and the common board\'s header labels',
    // 256 KB flash less the 8 KB boot loader; 8 KB SRAM (ATmega2560 datasheet).
    flashBytes: 256 * 1024 - 8 * 1024,
    ramBytes: 8 * 1024,
    mcu: 'atmega2560',
    avrdudePart: 'm2560',
    avrdudeProgrammer: 'stk500v2',
    avrdudeBaud: 115200,
    cpuHz: 16_000_000,
    pins: ATMEGA2560_PINS,
    pwmCapable: (pin) => pin.pwm !== null,
  },
  header40: {
    kind: 'header40',
    title: '40-pin-header Linux board',
    source: 'the 40-pin header\'s published GPIO pinout; gpiozero documentation (pin numbering, PWMOutputDevice)',
    flashBytes: null,
    ramBytes: null,
    mcu: null,
    avrdudePart: null,
    avrdudeProgrammer: null,
    avrdudeBaud: null,
    cpuHz: null,
    pins: HEADER40_PINS,
    // gpiozero drives PWM in software on any GPIO; the four hardware-PWM GPIOs are marked.
    pwmCapable: () => true,
  },
};

export const BOARD_KINDS = Object.keys(BOARDS) as BoardKind[];

/** The pin of a board by name ("PD6", "GPIO18") or by its header label ("6", "pin 12"); undefined when it has none. */
export function findPin(kind: BoardKind, nameOrLabel: string): BoardPin | undefined {
  const pins = BOARDS[kind].pins;
  return pins.find((p) => p.name === nameOrLabel) ?? pins.find((p) => p.label === nameOrLabel);
}

/** "PD6 (6)" or "GPIO18 (pin 12)": the pin by port and bit and by the label beside the header. */
export function pinTitle(kind: BoardKind, name: string): string {
  const pin = findPin(kind, name);
  return pin ? `${pin.name} (${pin.label})` : name;
}
