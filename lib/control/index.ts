export { BOARDS, BOARD_KINDS, findPin, pinTitle } from './boards';
export type { BoardKind, BoardPin, BoardSpec, AvrPwm } from './boards';
export {
  wiringSheetSchema,
  boardWiringSchema,
  cabWiringSchema,
  blockWiringSchema,
  controlTimingSchema,
  canonicalPin,
  DEFAULT_TIMING,
} from './wiring';
export type { WiringSheet, BoardWiring, CabWiring, BlockWiring, ControlTiming } from './wiring';
export {
  compileSchedule,
  checkInterlocks,
  compareEntries,
  pwmAt,
  cabDirections,
  travelDirections,
  SCHEDULE_FORMAT,
  SCHEDULE_VERSION,
} from './schedule';
export type {
  ControlSchedule,
  ControlEntry,
  ControlFinding,
  ControlFindingKind,
  ControlInput,
  Direction,
  Polarity,
  ScheduledRun,
} from './schedule';
export { boardProgram, plainName, MAX_PROGRAM_ENTRIES } from './board-program';
export type { BoardProgram, ProgramEntry, ProgramCab, ProgramBlock } from './board-program';
export { generateAvrFirmware, estimateFirmwareSize } from './firmware-avr';
export type { FirmwareFile, SizeEstimate } from './firmware-avr';
export { generatePythonController } from './controller-py';
