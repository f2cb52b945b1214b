import { BOARDS, findPin, type BoardKind, type BoardPin } from './boards';
import type { ControlEntry, ControlSchedule } from './schedule';
import type { BoardWiring, WiringSheet } from './wiring';

/** Most entries one generated program carries; a longer session is split (or given a bigger board). */
export const MAX_PROGRAM_ENTRIES = 6000;

export interface ProgramCab {
  cabId: string;
  name: string;
  forward: BoardPin;
  reverse: BoardPin;
  pwm: BoardPin;
}

export interface ProgramBlock {
  blockId: string;
  name: string;
  /** Relay per cab that may feed the block, in wiring order. */
  feeds: { cabId: string; pin: BoardPin }[];
  polarity: BoardPin | null;
}

/** One timed setting with local indices into the program's cab and block tables. */
export type ProgramEntry =
  | { atMs: number; kind: 'direction'; cab: number; direction: 0 | 1 | 2 }
  | { atMs: number; kind: 'speed'; cab: number; from: number; to: number; rampMs: number }
  | { atMs: number; kind: 'feed'; block: number; relay: number | null }
  | { atMs: number; kind: 'polarity'; block: number; swapped: boolean };

/** What one board runs: its own cabs, blocks and the schedule's entries that touch them. */
export interface BoardProgram {
  board: BoardWiring;
  kind: BoardKind;
  title: string;
  cabs: ProgramCab[];
  blocks: ProgramBlock[];
  emergencyStop: BoardPin;
  start: BoardPin | null;
  entries: ProgramEntry[];
  endMs: number;
  originS: number;
  clock: ControlSchedule['clock'];
  deadTimeMs: number;
  breakMs: number;
}

export const DIRECTION_CODE = { off: 0, forward: 1, reverse: 2 } as const;

/**
 * The part of a schedule one board of the wiring runs. Throws RangeError for a board the sheet does
 * not have; a sheet that passed `wiringSheetSchema` has every pin.
 */
export function boardProgram(schedule: ControlSchedule, wiring: WiringSheet, boardId: string): BoardProgram {
  const board = wiring.boards.find((b) => b.id === boardId);
  if (!board) throw new RangeError(`the wiring sheet has no board "${boardId}"`);
  const pin = (name: string) => {
    const found = findPin(board.kind, name);
    if (!found) throw new RangeError(`${BOARDS[board.kind].title} has no pin "${name}"`);
    return found;
  };
  const cabName = new Map(schedule.cabs.map((c) => [c.cabId, c.name]));
  const blockName = new Map(schedule.blocks.map((b) => [b.blockId, b.name]));
  const cabs: ProgramCab[] = wiring.cabs
    .filter((c) => c.boardId === boardId && cabName.has(c.cabId))
    .map((c) => ({ cabId: c.cabId, name: cabName.get(c.cabId)!, forward: pin(c.forwardPin), reverse: pin(c.reversePin), pwm: pin(c.pwmPin) }));
  const blocks: ProgramBlock[] = wiring.blocks
    .filter((b) => b.boardId === boardId && blockName.has(b.blockId))
    .map((b) => ({
      blockId: b.blockId,
      name: blockName.get(b.blockId)!,
      feeds: b.feeds.map((f) => ({ cabId: f.cabId, pin: pin(f.pin) })),
      polarity: b.polarityPin === null ? null : pin(b.polarityPin),
    }));
  const cabIndex = new Map(cabs.map((c, i) => [c.cabId, i]));
  const blockIndex = new Map(blocks.map((b, i) => [b.blockId, i]));
  const entries: ProgramEntry[] = [];
  for (const e of schedule.entries as ControlEntry[]) {
    if (e.kind === 'direction' || e.kind === 'speed') {
      const cab = cabIndex.get(e.cabId);
      if (cab === undefined) continue;
      if (e.kind === 'direction') entries.push({ atMs: e.atMs, kind: 'direction', cab, direction: DIRECTION_CODE[e.direction] });
      else entries.push({ atMs: e.atMs, kind: 'speed', cab, from: e.from, to: e.to, rampMs: e.rampMs });
    } else {
      const block = blockIndex.get(e.blockId);
      if (block === undefined) continue;
      if (e.kind === 'feed') {
        const relay = e.cabId === null ? null : blocks[block]!.feeds.findIndex((f) => f.cabId === e.cabId);
        entries.push({ atMs: e.atMs, kind: 'feed', block, relay });
      } else {
        entries.push({ atMs: e.atMs, kind: 'polarity', block, swapped: e.polarity === 'swapped' });
      }
    }
  }
  if (entries.length > MAX_PROGRAM_ENTRIES) {
    throw new RangeError(`${entries.length} settings for ${board.name}: at most ${MAX_PROGRAM_ENTRIES} fit one program; split the session`);
  }
  return {
    board,
    kind: board.kind,
    title: BOARDS[board.kind].title,
    cabs,
    blocks,
    emergencyStop: pin(board.emergencyStopPin),
    start: board.startPin === null ? null : pin(board.startPin),
    entries,
    endMs: entries.reduce((max, e) => Math.max(max, e.atMs + (e.kind === 'speed' ? e.rampMs : 0)), 0),
    originS: schedule.originS,
    clock: schedule.clock,
    deadTimeMs: schedule.timing.deadTimeMs,
    breakMs: schedule.timing.breakMs,
  };
}

/** Printable ASCII only, without quotes or backslashes: safe inside a C or Python string literal and a status line. */
export function plainName(name: string, max = 24): string {
  const cleaned = name.replace(/[^\x20-\x7e]/g, '?').replace(/["'\\]/g, '?').trim();
  return (cleaned === '' ? '?' : cleaned).slice(0, max);
}
