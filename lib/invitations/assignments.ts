import type { loadSessionRows } from '@/db/queries/plan-data';
import { formatFast } from '@/lib/planning';
import { formatTimeInZone } from '@/lib/time-zone';

type SessionRows = NonNullable<ReturnType<typeof loadSessionRows>>;

/** A neighbouring run on the same cab: who hands the cab over, or takes it next. */
export type CabNeighbour = { runId: string; operatorId: string | null; operatorName: string | null; trainName: string; fastDepart: string; realDepart: string };

/** One run as a person reads it on their phone or crew card. */
export type RunAssignment = {
  runId: string;
  operatorId: string | null;
  operatorName: string | null;
  trainName: string;
  cabName: string;
  /** Block names in the order the train passes them. */
  route: string[];
  departS: number;
  arriveS: number;
  /** Real times: the session's start plus the run's seconds. */
  departAt: Date;
  arriveAt: Date;
  realDepart: string;
  realArrive: string;
  fastDepart: string;
  fastArrive: string;
  /** Seconds the train stands in its first block before leaving, and in its last after arriving. */
  standBeforeS: number;
  standAfterS: number;
  before: CabNeighbour | null;
  after: CabNeighbour | null;
  note: string;
};

/** Every run of a session, described for people, in departure order. */
export function describeRuns(rows: SessionRows): RunAssignment[] {
  const { session } = rows;
  const clock = { ratio: session.clockRatio, fastStart: session.fastStart };
  const blockName = new Map(rows.blocks.map((b) => [b.id, b.name]));
  const cabName = new Map(rows.cabs.map((c) => [c.id, c.name]));
  const trainName = new Map(rows.trains.map((t) => [t.id, t.name]));
  const operatorName = new Map(rows.operators.map((o) => [o.id, o.name]));
  const stepsOf = new Map<string, SessionRows['steps']>();
  for (const step of rows.steps) stepsOf.set(step.runId, [...(stepsOf.get(step.runId) ?? []), step]);
  const at = (s: number) => new Date(session.startsAt.getTime() + Math.round(s * 1000));
  const real = (s: number) => formatTimeInZone(at(s), session.timeZone);
  const ordered = [...rows.runs].sort((a, b) => a.departS - b.departS || a.id.localeCompare(b.id));

  const neighbour = (run: (typeof ordered)[number] | undefined): CabNeighbour | null =>
    run
      ? {
          runId: run.id,
          operatorId: run.operatorId,
          operatorName: run.operatorId ? (operatorName.get(run.operatorId) ?? null) : null,
          trainName: trainName.get(run.trainId) ?? 'Unknown train',
          fastDepart: formatFast(run.departS, clock),
          realDepart: real(run.departS),
        }
      : null;
  const byCab = new Map<string, typeof ordered>();
  for (const run of ordered) byCab.set(run.cabId, [...(byCab.get(run.cabId) ?? []), run]);

  return ordered.map((run) => {
    const steps = [...(stepsOf.get(run.id) ?? [])].sort((a, b) => a.position - b.position);
    const first = steps[0];
    const last = steps[steps.length - 1];
    const onCab = byCab.get(run.cabId) ?? [];
    const i = onCab.indexOf(run);
    return {
      runId: run.id,
      operatorId: run.operatorId,
      operatorName: run.operatorId ? (operatorName.get(run.operatorId) ?? null) : null,
      trainName: trainName.get(run.trainId) ?? 'Unknown train',
      cabName: cabName.get(run.cabId) ?? 'Unknown cab',
      route: steps.map((s) => blockName.get(s.blockId) ?? '?'),
      departS: run.departS,
      arriveS: run.arriveS,
      departAt: at(run.departS),
      arriveAt: at(run.arriveS),
      realDepart: real(run.departS),
      realArrive: real(run.arriveS),
      fastDepart: formatFast(run.departS, clock),
      fastArrive: formatFast(run.arriveS, clock),
      standBeforeS: first ? Math.max(0, run.departS - first.enterS) : 0,
      standAfterS: last ? Math.max(0, last.exitS - run.arriveS) : 0,
      before: neighbour(onCab[i - 1]),
      after: neighbour(onCab[i + 1]),
      note: run.note,
    };
  });
}

/** The runs one person drives, in order. */
export function runsAssignedTo(rows: SessionRows, userId: string): RunAssignment[] {
  return describeRuns(rows).filter((r) => r.operatorId === userId);
}

/** "2 min real", "45 s real", "1 min 30 s real": stand times for people, on the real clock (not the fast one). */
export function formatStand(seconds: number): string {
  const s = Math.round(seconds);
  if (s < 60) return `${s} s real`;
  const m = Math.floor(s / 60);
  const rest = s % 60;
  return rest ? `${m} min ${rest} s real` : `${m} min real`;
}
