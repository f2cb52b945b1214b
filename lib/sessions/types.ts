// Shapes the timetable's route handlers answer with and its client components read. Plain types
// only, so client code can import them without pulling in anything from the server.
import type { Finding, FindingKind } from '@/lib/planning';
import type { SessionStatus } from '@/db/enums';
import type { Move, Run } from '@/lib/runs/schema';

export type { SessionStatus };

export type TimetableSession = {
  id: string;
  railwayId: string;
  title: string;
  status: SessionStatus;
  version: number;
  sequence: number;
  startsAtMs: number;
  endsAtMs: number;
  timeZone: string;
  clockRatio: number;
  fastStart: string;
  headwayS: number;
  surgeS: number;
  derate: number;
};

/** The session as stored, with the engine's findings for it (its load profile: `GET …/check?only=load`). */
export type TimetableSnapshot = {
  session: TimetableSession;
  runs: Run[];
  /** The findings listed (capped: see `counts`). */
  findings: Finding[];
  /** How many findings of each kind there are, listed or not. */
  counts: Record<FindingKind, number>;
  /** Errors and warnings among all of them. */
  totals: { errors: number; warnings: number };
  /** Some findings are not listed (more than the engine's caps). */
  truncated: boolean;
  /** How long the server took to load and check the plan, ms. */
  checkMs: number;
};

/** What a change answers: the new snapshot, and what to send to take the change back. */
export type TimetableChange = TimetableSnapshot & {
  run?: Run;
  runs: Run[];
  /** Runs created by the change (a series). */
  createdIds?: string[];
  /** A deleted run, as the body that puts it back. */
  deleted?: Run;
  /** Moves that undo a retime. */
  undo?: Move[];
};

/** The layout and crew the timetable draws with; loaded once with the page. */
export type TimetableLayout = {
  scaleRatio: number;
  blocks: { id: string; name: string; lengthMm: number; positionMm: number; reversingPlace?: boolean; reversingSection?: boolean }[];
  /** Rail joints: end aEnd of block a meets end bEnd of block b. */
  links: { a: string; b: string; aEnd: 'a' | 'b'; bEnd: 'a' | 'b' }[];
  cabs: { id: string; name: string; driverId: string; channel: number }[];
  drivers: { id: string; name: string; supplyId: string }[];
  supplies: { id: string; name: string }[];
  trains: { id: string; name: string; lengthMm: number; topSpeedKmh: number | null }[];
  operators: { id: string; name: string; reply: string | null }[];
};

export type RetimeSuggestion = {
  runId: string;
  version: number;
  delayS: number;
  oldDepartS: number;
  newDepartS: number;
};
