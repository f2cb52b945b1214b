import { z } from 'zod';
import { BOARD_KINDS, BOARDS, findPin, type BoardKind } from './boards';

const id = z.string().min(1, 'must not be empty').max(100, 'must be 100 characters or fewer');
const pinName = z.string().min(1, 'must name a pin').max(16, 'must be 16 characters or fewer');

export const boardWiringSchema = z.object({
  id,
  kind: z.enum(BOARD_KINDS as [BoardKind, ...BoardKind[]]),
  name: z.string().min(1, 'must not be empty').max(60, 'must be 60 characters or fewer'),
  /** A normally closed emergency-stop contact to ground: open (pressed, or a broken wire) stops everything. */
  emergencyStopPin: pinName,
  /** A push button to ground that starts the session; null: start with a `start` line on the serial port only. */
  startPin: pinName.nullable(),
});

export const cabWiringSchema = z.object({
  cabId: id,
  boardId: id,
  /** The H-bridge input that drives forward when high. */
  forwardPin: pinName,
  /** The H-bridge input that drives reverse when high. */
  reversePin: pinName,
  pwmPin: pinName,
  /**
   * Only an integrated bridge driver whose truth table brakes with both inputs high may be driven so;
   * a bridge of discrete transistors shorts the supply (shoot-through). Fishplate never sets both
   * high; the flag is recorded on the printed sheet.
   */
  bothHighBrakes: z.boolean(),
});

export const blockWiringSchema = z.object({
  blockId: id,
  boardId: id,
  /** One relay output per cab that may feed the block. */
  feeds: z.array(z.object({ cabId: id, pin: pinName })).max(16, 'at most 16 cabs per block'),
  /** The polarity relay of a reversing section; null for an ordinary block. */
  polarityPin: pinName.nullable(),
  /**
   * The neighbouring blocks a train reaches when its cab drives forward through this block (right-hand
   * rail positive in the direction of travel, NEM 631 2.3, with the cab's positive output wired as drawn).
   */
  forwardTowards: z.array(id).max(16, 'at most 16 neighbours'),
});

export const controlTimingSchema = z.object({
  /** A block is switched to the run's cab this long before the head enters it, s. */
  leadS: z.number().min(0.1, 'must be 0.1 s or more').max(60, 'must be 60 s or less'),
  /** …and released this long after the tail clears it, s. */
  releaseS: z.number().min(0.1, 'must be 0.1 s or more').max(60, 'must be 60 s or less'),
  /** PWM held at 0 this long before the direction inputs change, ms. */
  deadTimeMs: z.number().int('must be whole milliseconds').min(50, 'must be 50 ms or more').max(5000, 'must be 5000 ms or less'),
  /** Between one cab's relay opening and another's closing on the same block, ms. */
  breakMs: z.number().int('must be whole milliseconds').min(10, 'must be 10 ms or more').max(2000, 'must be 2000 ms or less'),
  /** Momentum: PWM ramps from 0 to the running value over this long, s. */
  accelerateS: z.number().min(0, 'must be 0 or more').max(60, 'must be 60 s or less'),
  /** …and back to 0 over this long before the train stops, s. */
  brakeS: z.number().min(0, 'must be 0 or more').max(60, 'must be 60 s or less'),
});

const wiringShape = z.object({
  version: z.literal(1),
  boards: z.array(boardWiringSchema).min(1, 'a wiring sheet needs a board').max(8, 'at most 8 boards'),
  cabs: z.array(cabWiringSchema).max(64, 'at most 64 cabs'),
  blocks: z.array(blockWiringSchema).max(256, 'at most 256 blocks'),
  timing: controlTimingSchema,
});

export type WiringSheet = z.infer<typeof wiringShape>;
export type BoardWiring = WiringSheet['boards'][number];
export type CabWiring = WiringSheet['cabs'][number];
export type BlockWiring = WiringSheet['blocks'][number];
export type ControlTiming = WiringSheet['timing'];

export const DEFAULT_TIMING: ControlTiming = {
  leadS: 2,
  releaseS: 1,
  deadTimeMs: 300,
  breakMs: 50,
  accelerateS: 3,
  brakeS: 3,
};

type Report = (path: (string | number)[], message: string) => void;

/**
 * The wiring sheet, version 1: the fields on their own, then the rules that need the whole sheet —
 * pins that exist on their board (its published pinout), no pin used twice, PWM only on PWM-capable
 * pins, the serial pins left free, and ids that resolve.
 */
export const wiringSheetSchema = wiringShape.superRefine((sheet, ctx) => {
  const report: Report = (path, message) => ctx.addIssue({ code: 'custom', path, message });
  checkWiring(sheet, report);
});

function checkWiring(sheet: WiringSheet, report: Report): void {
  const boards = new Map<string, BoardWiring>();
  sheet.boards.forEach((board, i) => {
    if (boards.has(board.id)) report(['boards', i, 'id'], `duplicate board id "${board.id}"`);
    boards.set(board.id, board);
  });
  // Per board: canonical pin name → where it is used.
  const used = new Map<string, string>();
  const claim = (boardId: string, pin: string, path: (string | number)[], what: string, needsPwm = false) => {
    const board = boards.get(boardId);
    if (!board) return;
    const spec = BOARDS[board.kind];
    const found = findPin(board.kind, pin);
    if (!found) {
      report(path, `${spec.title} has no pin "${pin}" (source: ${spec.source})`);
      return;
    }
    if (found.serial) {
      report(path, `${found.name} (${found.label}) is the serial port of the ${spec.title}; leave it free`);
      return;
    }
    if (needsPwm && !spec.pwmCapable(found)) {
      report(path, `${found.name} (${found.label}) has no hardware PWM on the ${spec.title} (source: ${spec.source})`);
      return;
    }
    const key = `${boardId}\u0000${found.name}`;
    const holder = used.get(key);
    if (holder !== undefined) report(path, `${found.name} (${found.label}) on ${board.name} is already ${holder}`);
    else used.set(key, what);
  };

  sheet.boards.forEach((board, i) => {
    claim(board.id, board.emergencyStopPin, ['boards', i, 'emergencyStopPin'], 'the emergency stop');
    if (board.startPin !== null) claim(board.id, board.startPin, ['boards', i, 'startPin'], 'the start button');
  });

  const cabs = new Set<string>();
  sheet.cabs.forEach((cab, i) => {
    if (cabs.has(cab.cabId)) report(['cabs', i, 'cabId'], `cab "${cab.cabId}" is wired twice`);
    cabs.add(cab.cabId);
    if (!boards.has(cab.boardId)) {
      report(['cabs', i, 'boardId'], `unknown board "${cab.boardId}"`);
      return;
    }
    claim(cab.boardId, cab.forwardPin, ['cabs', i, 'forwardPin'], `the forward input of cab "${cab.cabId}"`);
    claim(cab.boardId, cab.reversePin, ['cabs', i, 'reversePin'], `the reverse input of cab "${cab.cabId}"`);
    claim(cab.boardId, cab.pwmPin, ['cabs', i, 'pwmPin'], `the PWM output of cab "${cab.cabId}"`, true);
  });

  const blocks = new Set<string>();
  sheet.blocks.forEach((block, i) => {
    if (blocks.has(block.blockId)) report(['blocks', i, 'blockId'], `block "${block.blockId}" is wired twice`);
    blocks.add(block.blockId);
    if (!boards.has(block.boardId)) {
      report(['blocks', i, 'boardId'], `unknown board "${block.boardId}"`);
      return;
    }
    const fedBy = new Set<string>();
    block.feeds.forEach((feed, j) => {
      if (!cabs.has(feed.cabId)) report(['blocks', i, 'feeds', j, 'cabId'], `cab "${feed.cabId}" is not wired`);
      if (fedBy.has(feed.cabId)) report(['blocks', i, 'feeds', j, 'cabId'], `cab "${feed.cabId}" already has a relay on this block`);
      fedBy.add(feed.cabId);
      claim(block.boardId, feed.pin, ['blocks', i, 'feeds', j, 'pin'], `the relay of block "${block.blockId}" to cab "${feed.cabId}"`);
    });
    if (block.polarityPin !== null) {
      claim(block.boardId, block.polarityPin, ['blocks', i, 'polarityPin'], `the polarity relay of block "${block.blockId}"`);
    }
  });
  sheet.blocks.forEach((block, i) => {
    block.forwardTowards.forEach((towards, j) => {
      if (!blocks.has(towards)) report(['blocks', i, 'forwardTowards', j], `block "${towards}" is not on the wiring sheet`);
    });
  });
}

/** The board entry's pin by its canonical name ("PD6", "GPIO18"), whichever way the sheet wrote it. */
export function canonicalPin(kind: BoardKind, pin: string): string {
  return findPin(kind, pin)?.name ?? pin;
}
