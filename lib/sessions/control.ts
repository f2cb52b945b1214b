import 'server-only';
import { zipSync, strToU8 } from 'fflate';
import { getWiringSheetRow } from '@/db/queries/wiring-sheets';
import type { Session } from '@/db/schema';
import {
  BOARDS,
  boardProgram,
  compileSchedule,
  estimateFirmwareSize,
  generateAvrFirmware,
  generatePythonController,
  wiringSheetSchema,
  type ControlSchedule,
  type SizeEstimate,
  type WiringSheet,
} from '@/lib/control';
import { AppError, badRequest } from '@/lib/errors';
import type { Plan } from '@/lib/planning';
import { loadSessionPlan } from './timetable';

export interface SessionControl {
  plan: Plan;
  wiring: WiringSheet;
  schedule: ControlSchedule;
  /** Per board of the wiring: what it is and, for the AVR boards, whether its firmware fits. */
  boards: { id: string; name: string; kind: WiringSheet['boards'][number]['kind']; title: string; size: SizeEstimate | null; entries: number }[];
}

/** The layout's wiring sheet, checked; null when the layout has none. A stored sheet that no longer passes answers 409. */
export function layoutWiringSheet(layoutId: string): { sheet: WiringSheet; version: number } | null {
  const row = getWiringSheetRow(layoutId);
  if (!row) return null;
  const parsed = wiringSheetSchema.safeParse(JSON.parse(row.sheet));
  if (!parsed.success) throw new AppError('conflict', 'The layout\'s wiring sheet no longer passes its checks; open it in the layout workspace and save it again.');
  return { sheet: parsed.data, version: row.version };
}

/**
 * The control schedule of a session the caller may edit (the caller checks access first): the plan,
 * the layout's wiring and each run's speed and each locomotive's top speed go into compileSchedule.
 */
export function sessionControl(session: Session): SessionControl {
  const { plan, wiring, schedule } = scheduleOf(session);
  const boards = wiring.boards.map((b) => {
    const program = boardProgram(schedule, wiring, b.id);
    return {
      id: b.id,
      name: b.name,
      kind: b.kind,
      title: BOARDS[b.kind].title,
      size: b.kind === 'header40' ? null : estimateFirmwareSize(program),
      entries: program.entries.length,
    };
  });
  return { plan, wiring, schedule, boards };
}

function scheduleOf(session: Session): { plan: Plan; wiring: WiringSheet; schedule: ControlSchedule } {
  const { rows, plan } = loadSessionPlan(session.id);
  const stored = layoutWiringSheet(session.layoutId);
  if (!stored) throw new AppError('conflict', 'This layout has no wiring sheet yet: add one in the layout workspace.');
  const wiring = stored.sheet;
  const schedule = compileSchedule({
    plan,
    wiring,
    runSpeedKmh: Object.fromEntries(rows.runs.map((r) => [r.id, r.speedKmh])),
    locomotiveTopSpeedKmh: Object.fromEntries(rows.locomotives.map((l) => [l.id, l.topSpeedKmh])),
  });
  return { plan, wiring, schedule };
}

export type ControlFindingsAnswer =
  | { wired: false; message: string }
  | { wired: true; findings: ControlSchedule['findings']; errors: number; warnings: number };

/**
 * The control schedule's findings only (interlocks, runs left out), for the timetable's findings
 * panel: no programs are generated. A layout without a wiring sheet answers `wired: false`.
 */
export function sessionControlFindings(session: Session): ControlFindingsAnswer {
  let compiled;
  try {
    compiled = scheduleOf(session);
  } catch (error) {
    if (error instanceof AppError && error.status === 409) return { wired: false, message: error.message };
    throw error;
  }
  const { findings } = compiled.schedule;
  return { wired: true, findings, errors: findings.filter((f) => f.severity === 'error').length, warnings: findings.filter((f) => f.severity === 'warning').length };
}

/** The board a download is for: the `board` parameter, or the only board of the right kind. */
export function pickBoard(control: SessionControl, boardId: string | undefined, want: 'avr' | 'linux') {
  const fits = control.wiring.boards.filter((b) => (want === 'linux' ? b.kind === 'header40' : b.kind !== 'header40'));
  if (boardId !== undefined) {
    const board = fits.find((b) => b.id === boardId);
    if (!board) throw badRequest(`board: the wiring sheet has no ${want === 'linux' ? '40-pin-header Linux' : 'AVR'} board "${boardId}"`);
    return board;
  }
  if (fits.length === 1) return fits[0]!;
  if (fits.length === 0) throw badRequest(`board: the wiring sheet has no ${want === 'linux' ? '40-pin-header Linux' : 'AVR'} board`);
  throw badRequest(`board: name one of ${fits.map((b) => b.id).join(', ')}`);
}

const stampNow = () => new Date().toISOString().slice(0, 16).replace('T', ' ') + ' UTC';

/** The firmware of one AVR board as a zip: schedule.h, main.c, Makefile, README.txt. */
export function firmwareZip(session: Session, control: SessionControl, boardId: string | undefined): { bytes: Uint8Array; fileName: string } {
  const board = pickBoard(control, boardId, 'avr');
  const files = generateAvrFirmware(boardProgram(control.schedule, control.wiring, board.id), { title: session.title, generatedAt: stampNow() });
  const folder = `fishplate-${board.id}`;
  const bytes = zipSync(Object.fromEntries(files.map((f) => [`${folder}/${f.name}`, strToU8(f.text)])), { level: 6, mtime: new Date('2020-01-01T00:00:00Z') });
  return { bytes, fileName: `${folder}.zip` };
}

/** The Python program of one 40-pin-header Linux board. */
export function controllerPy(session: Session, control: SessionControl, boardId: string | undefined): { text: string; fileName: string } {
  const board = pickBoard(control, boardId, 'linux');
  const text = generatePythonController(boardProgram(control.schedule, control.wiring, board.id), { title: session.title, generatedAt: stampNow() });
  return { text, fileName: `fishplate-${board.id}.py` };
}
