// Shapes the live board, My runs and the live route share. Plain types only (client-safe).
import type { ClockRecord, FastClock, FindingKind, PredictedRun } from '@/lib/planning';
import type { StopReason } from '@/db/enums';

export type LiveClock = {
  records: ClockRecord[];
  clock: FastClock;
  /** Server wall time the state was built at; a client reads the clock at its own time plus the difference. */
  serverMs: number;
  state: 'not-started' | 'running' | 'paused';
  sessionS: number;
  fast: string;
};

/** A run planned, in force, predicted (PredictedRun's times) and actual, side by side. */
export type LiveRun = Omit<PredictedRun, 'runId'> & {
  id: string;
  trainId: string;
  cabId: string;
  operatorId: string | null;
  /** The host's repairs so far: the timetable now in force is planned + this. */
  repairS: number;
  actual: { departS: number | null; arriveS: number | null; stop: { fromS: number; reason: StopReason | null } | null };
  /** Predicted steps: which block the train is expected in, when. */
  steps: { blockId: string; enterS: number; exitS: number }[];
};

export type LiveFinding = { kind: FindingKind; severity: 'error' | 'warning'; ids: string[]; fromS: number; toS: number; message: string };

export type LiveState = {
  seq: number;
  session: { id: string; railwayId: string; title: string; status: string; standS: number; punctualFastMin: number };
  clock: LiveClock;
  names: { blocks: { id: string; name: string }[]; cabs: { id: string; name: string }[]; trains: { id: string; name: string }[]; operators: { id: string; name: string }[] };
  runs: LiveRun[];
  /** Block and cab clashes in the predicted timetable that the timetable in force does not have. */
  newFindings: LiveFinding[];
  /** The engine's retime of the runs not yet departed, as moves on the timetable in force (host). */
  repair: { runId: string; delayS: number; newDepartS: number }[];
};

/** One run's reports with who made each (`GET /api/sessions/{id}/runs/{runId}/reports`). */
export type RunReportHistory = {
  runId: string;
  reports: { id: string; kind: string; reason: string | null; fast: string; reportedAt: string; by: string; correction: boolean; withdrawn: boolean }[];
};

export type LiveMessage = { seq: number; type: string; summary: string; at: number; state?: LiveState };

export type { Session } from '@/db/schema';
