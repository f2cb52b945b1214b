import 'server-only';
import Papa from 'papaparse';
import { listReports } from '@/db/queries/live';
import { formatFast, propagateDelays, type Plan } from '@/lib/planning';
import { foldReports } from '@/lib/live/actuals';
import { blockAtTime } from '@/lib/live/blocks';
import { buildLiveState, repairTotals, timetableInForce } from '@/lib/live/state';
import type { LiveState } from '@/lib/live/types';
import { loadSessionPlan } from '@/lib/sessions/timetable';

export type ReportRun = {
  runId: string;
  train: string;
  cab: string;
  operator: string | null;
  plannedDepart: string;
  actualDepart: string | null;
  departDelayFastMin: number | null;
  plannedArrive: string;
  actualArrive: string | null;
  arriveDelayFastMin: number | null;
  stops: number;
  stoppedFastMin: number;
  punctual: boolean | null;
  /** Fast minutes of delay that began with this run (not handed on by an earlier one). */
  delayBeganFastMin: number;
};

type Tally = { name: string; delayFastMin: number; runs: number };

export type SessionReport = {
  session: { id: string; title: string; ratio: number; fastStart: string };
  punctualWithinFastMin: number;
  runs: ReportRun[];
  punctuality: { departed: number; punctual: number; share: number | null; notRun: number };
  delayByTrain: Tally[];
  delayByOperator: Tally[];
  delayByBlock: Tally[];
  /** Blocks where delays began (a late start not caused by an earlier run, or a stop), most first. */
  delaysBeganIn: Tally[];
  /** Per train, for the next session: a longer stand before its runs where they were regularly late. */
  suggestedStands: { train: string; lateRuns: number; runs: number; standS: number; suggestedStandS: number }[];
  /** For the graph: planned and actual steps per run (session seconds). */
  graph: { runId: string; train: string; planned: { blockId: string; enterS: number; exitS: number }[]; actual: { blockId: string; enterS: number; exitS: number }[] | null }[];
  blocks: { id: string; name: string; positionMm: number; lengthMm: number }[];
};

const fastMin = (realS: number, ratio: number) => Math.round(((realS * ratio) / 60) * 10) / 10;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/**
 * The report after a session: every run planned against actual, punctuality (departing within N
 * fast minutes of plan), delay minutes per train, operator and block, where delays began, and
 * suggested stand times for the next session built from this one.
 */
export function buildSessionReport(sessionId: string, punctualWithinFastMin?: number): SessionReport {
  const loaded = loadSessionPlan(sessionId);
  const { rows, plan } = loaded;
  const session = rows.session;
  const ratio = session.clockRatio;
  const clock = { ratio, fastStart: session.fastStart };
  const within = punctualWithinFastMin ?? session.punctualFastMin;
  const state: LiveState = buildLiveState(sessionId, Date.now(), loaded);
  const known = foldReports(listReports(sessionId));
  const inForce = timetableInForce(plan, repairTotals(sessionId));
  const name = (list: { id: string; name: string }[]) => new Map(list.map((x) => [x.id, x.name]));
  const trains = name(rows.trains);
  const cabs = name(rows.cabs);
  const operators = name(rows.operators);
  const blocks = name(rows.blocks);
  const planOf = new Map(plan.runs.map((r) => [r.id, r]));

  const began = primaryDelays(inForce, known);
  const runs: ReportRun[] = [];
  const byTrain = new Map<string, Tally>();
  const byOperator = new Map<string, Tally>();
  const byBlock = new Map<string, Tally>();
  const beganIn = new Map<string, Tally>();
  const add = (map: Map<string, Tally>, key: string, label: string, minutes: number) => {
    const t = map.get(key) ?? { name: label, delayFastMin: 0, runs: 0 };
    t.delayFastMin = Math.round((t.delayFastMin + minutes) * 10) / 10;
    t.runs += 1;
    map.set(key, t);
  };

  for (const live of state.runs) {
    const run = planOf.get(live.id)!;
    const k = known.get(live.id);
    const departed = k?.departS !== undefined;
    const arrived = k?.arriveS !== undefined;
    const departDelay = departed ? k.departS! - run.departS : null;
    const arriveDelay = arrived ? k.arriveS! - run.arriveS : null;
    const stoppedS = (k?.stops ?? []).reduce((sum, s) => sum + Math.max(0, (s.toS ?? s.fromS) - s.fromS), 0);
    const train = trains.get(run.trainId) ?? 'Train';
    const lateMin = departDelay !== null ? Math.max(0, fastMin(departDelay, ratio)) : 0;
    const beganS = began.get(run.id) ?? 0;
    runs.push({
      runId: run.id,
      train,
      cab: cabs.get(run.cabId) ?? 'Cab',
      operator: run.operatorId ? (operators.get(run.operatorId) ?? null) : null,
      plannedDepart: formatFast(run.departS, clock),
      actualDepart: departed ? formatFast(k.departS!, clock) : null,
      departDelayFastMin: departDelay === null ? null : fastMin(departDelay, ratio),
      plannedArrive: formatFast(run.arriveS, clock),
      actualArrive: arrived ? formatFast(k.arriveS!, clock) : null,
      arriveDelayFastMin: arriveDelay === null ? null : fastMin(arriveDelay, ratio),
      stops: k?.stops.length ?? 0,
      stoppedFastMin: fastMin(stoppedS, ratio),
      punctual: departDelay === null ? null : Math.abs(departDelay * ratio) / 60 <= within,
      delayBeganFastMin: fastMin(beganS, ratio),
    });
    if (!departed) continue;
    const delayMin = Math.max(lateMin, arriveDelay !== null ? Math.max(0, fastMin(arriveDelay, ratio)) : 0);
    add(byTrain, run.trainId, train, delayMin);
    if (run.operatorId) add(byOperator, run.operatorId, operators.get(run.operatorId) ?? 'Operator', delayMin);
    // A late start counts against the block it left from; a stop against the block it stood in.
    const startBlock = run.steps[0]!.blockId;
    add(byBlock, startBlock, blocks.get(startBlock) ?? 'Block', lateMin);
    if (beganS > 0) add(beganIn, startBlock, blocks.get(startBlock) ?? 'Block', fastMin(beganS, ratio));
    for (const stop of k.stops) {
      const stoodS = Math.max(0, (stop.toS ?? stop.fromS) - stop.fromS);
      const at = blockAtTime(live.steps, stop.fromS) ?? startBlock;
      add(byBlock, at, blocks.get(at) ?? 'Block', fastMin(stoodS, ratio));
      add(beganIn, at, blocks.get(at) ?? 'Block', fastMin(stoodS, ratio));
    }
  }

  const departed = runs.filter((r) => r.punctual !== null);
  const sortTally = (map: Map<string, Tally>) => [...map.values()].sort((a, b) => b.delayFastMin - a.delayFastMin || a.name.localeCompare(b.name));

  // A train is regularly late when at least half of its departed runs (two or more) missed the
  // punctuality margin; the suggestion adds the median late arrival of its runs to the stand time.
  const suggestedStands: SessionReport['suggestedStands'] = [];
  for (const train of rows.trains) {
    const own = runs.filter((r) => r.train === train.name && r.punctual !== null);
    const late = own.filter((r) => r.punctual === false && (r.departDelayFastMin ?? 0) > 0);
    if (own.length < 2 || late.length * 2 < own.length) continue;
    const lateArrivalsS = own.map((r) => Math.max(0, ((r.arriveDelayFastMin ?? r.departDelayFastMin ?? 0) * 60) / ratio));
    suggestedStands.push({
      train: train.name,
      lateRuns: late.length,
      runs: own.length,
      standS: session.standS,
      suggestedStandS: Math.ceil((session.standS + median(lateArrivalsS)) / 15) * 15,
    });
  }

  return {
    session: { id: session.id, title: session.title, ratio, fastStart: session.fastStart },
    punctualWithinFastMin: within,
    runs,
    punctuality: {
      departed: departed.length,
      punctual: departed.filter((r) => r.punctual).length,
      share: departed.length ? Math.round((departed.filter((r) => r.punctual).length / departed.length) * 1000) / 1000 : null,
      notRun: runs.length - departed.length,
    },
    delayByTrain: sortTally(byTrain),
    delayByOperator: sortTally(byOperator),
    delayByBlock: sortTally(byBlock).filter((t) => t.delayFastMin > 0),
    delaysBeganIn: sortTally(beganIn).filter((t) => t.delayFastMin > 0),
    suggestedStands,
    graph: state.runs.map((live) => ({
      runId: live.id,
      train: trains.get(live.trainId) ?? 'Train',
      planned: planOf.get(live.id)!.steps,
      actual: known.get(live.id)?.departS !== undefined ? live.steps : null,
    })),
    blocks: rows.blocks.map((b) => ({ id: b.id, name: b.name, positionMm: b.positionMm, lengthMm: b.lengthMm })),
  };
}

/**
 * Delay that began with each run: its late departure less what earlier runs handed on (the
 * departure propagateDelays predicts for it from everything else reported, with no clock).
 */
function primaryDelays(plan: Plan, known: ReturnType<typeof foldReports>): Map<string, number> {
  const out = new Map<string, number>();
  for (const run of plan.runs) {
    const own = known.get(run.id);
    if (own?.departS === undefined || own.departS <= run.departS) continue;
    const others = new Map([...known].filter(([id]) => id !== run.id));
    const handedOn = propagateDelays({ plan, actuals: others, nowS: null, standS: 0 }).runs.find((r) => r.runId === run.id)!.departS;
    out.set(run.id, Math.max(0, own.departS - Math.max(run.departS, handedOn)));
  }
  return out;
}

const CSV_COLUMNS = [
  'runId', 'train', 'cab', 'operator', 'plannedDepart', 'actualDepart', 'departDelayFastMin', 'plannedArrive', 'actualArrive', 'arriveDelayFastMin', 'stops', 'stoppedFastMin', 'punctual', 'delayBeganFastMin',
] as const;

/** A cell a spreadsheet would run as a formula gets a leading apostrophe (OWASP "CSV injection"). */
const safeCell = (v: unknown) => {
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  const text = v === null || v === undefined ? '' : String(v);
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
};

/** The report's run table as CSV (RFC 4180, CRLF line ends). */
export function reportCsv(report: SessionReport): string {
  return Papa.unparse({ fields: [...CSV_COLUMNS], data: report.runs.map((r) => CSV_COLUMNS.map((c) => safeCell(r[c]))) }, { newline: '\r\n' });
}
