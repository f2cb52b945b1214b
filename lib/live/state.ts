import 'server-only';
import { lastLiveSeq, listClockEvents, listRepairs, listReports } from '@/db/queries/live';
import { applyRetime, checkPlan, propagateDelays, suggestRetime, type Finding, type Plan } from '@/lib/planning';
import { foldReports, type KnownRun } from '@/lib/live/actuals';
import { clockView } from '@/lib/live/clock';
import type { LiveFinding, LiveState } from '@/lib/live/types';
import { loadSessionPlan, type SessionRows } from '@/lib/sessions/timetable';

/** Clashes a delay can create: blocks, cabs, operators and trains booked twice. */
const CLASH_KINDS = new Set<Finding['kind']>(['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked']);
const clashKey = (f: Finding) => `${f.kind}|${[...f.ids].sort().join('|')}`;
const round3 = (v: number) => Math.round(v * 1000) / 1000;

/** The timetable in force: the planned one with the host's repairs added (planned times are never changed). */
export function timetableInForce(plan: Plan, repairByRun: ReadonlyMap<string, number>): Plan {
  return applyRetime(plan, [...repairByRun].filter(([, d]) => d !== 0).map(([runId, delayS]) => ({ runId, delayS })));
}

export function repairTotals(sessionId: string): Map<string, number> {
  const totals = new Map<string, number>();
  for (const r of listRepairs(sessionId)) totals.set(r.runId, (totals.get(r.runId) ?? 0) + r.delayS);
  return totals;
}

export function knownRuns(sessionId: string): Map<string, KnownRun> {
  return foldReports(listReports(sessionId));
}

/**
 * The session day as it stands: the shared clock, every run planned / in force / predicted /
 * actual side by side, the clashes delays have created, and the engine's repair for the runs not
 * yet departed.
 */
export function buildLiveState(sessionId: string, nowMs = Date.now(), loaded?: { rows: SessionRows; plan: Plan }): LiveState {
  const seq = lastLiveSeq(sessionId);
  const { rows, plan } = loaded ?? loadSessionPlan(sessionId);
  const session = rows.session;
  const clock = clockView(session, listClockEvents(sessionId), nowMs);
  const repairs = repairTotals(sessionId);
  const known = knownRuns(sessionId);
  const inForce = timetableInForce(plan, repairs);
  const { runs: predictedRuns, predicted } = propagateDelays({
    plan: inForce,
    actuals: known,
    nowS: clock.state === 'not-started' ? null : clock.sessionS,
    standS: session.standS,
  });

  const before = new Set(checkPlan(inForce).findings.filter((f) => CLASH_KINDS.has(f.kind)).map(clashKey));
  const newFindings: LiveFinding[] = checkPlan(predicted)
    .findings.filter((f) => CLASH_KINDS.has(f.kind) && !before.has(clashKey(f)))
    .map((f) => ({ kind: f.kind, severity: f.severity, ids: f.ids, fromS: round3(f.fromS), toS: round3(f.toS), message: f.message }));

  // The repair: the engine's retime on the predicted timetable with every run that has left kept
  // where it is, written as moves on the timetable in force.
  const fixed = new Set(predictedRuns.filter((r) => r.status === 'running' || r.status === 'stopped' || r.status === 'arrived').map((r) => r.runId));
  const retime = new Map(suggestRetime(predicted, { fixed }).map((m) => [m.runId, m.delayS]));
  const inForceOf = new Map(inForce.runs.map((r) => [r.id, r]));
  const repair: LiveState['repair'] = [];
  for (const p of predictedRuns) {
    if (fixed.has(p.runId)) continue;
    const newDepartS = p.departS + (retime.get(p.runId) ?? 0);
    const delayS = newDepartS - inForceOf.get(p.runId)!.departS;
    if (delayS > 0.5) repair.push({ runId: p.runId, delayS: round3(delayS), newDepartS: round3(newDepartS) });
  }

  const predictedOf = new Map(predicted.runs.map((r) => [r.id, r]));
  const runRow = new Map(plan.runs.map((r) => [r.id, r]));
  return {
    seq,
    session: { id: session.id, railwayId: session.railwayId, title: session.title, status: session.status, standS: session.standS, punctualFastMin: session.punctualFastMin },
    clock,
    names: {
      blocks: rows.blocks.map((b) => ({ id: b.id, name: b.name })),
      cabs: rows.cabs.map((c) => ({ id: c.id, name: c.name })),
      trains: rows.trains.map((t) => ({ id: t.id, name: t.name })),
      operators: rows.operators.map((o) => ({ id: o.id, name: o.name })),
    },
    runs: predictedRuns
      .map((p) => {
        const run = runRow.get(p.runId)!;
        const k = known.get(p.runId);
        const openStop = k?.stops.at(-1)?.toS === null ? k.stops.at(-1)! : null;
        return {
          id: run.id,
          trainId: run.trainId,
          cabId: run.cabId,
          operatorId: run.operatorId,
          plannedDepartS: round3(run.departS),
          plannedArriveS: round3(run.arriveS),
          repairS: round3(repairs.get(run.id) ?? 0),
          departS: round3(p.departS),
          arriveS: round3(p.arriveS),
          departDelayS: round3(p.departDelayS),
          arriveDelayS: round3(p.arriveDelayS),
          status: p.status,
          heldBy: p.heldBy,
          actual: {
            departS: k?.departS ?? null,
            arriveS: k?.arriveS ?? null,
            stop: openStop ? { fromS: openStop.fromS, reason: openStop.reason } : null,
          },
          steps: predictedOf.get(run.id)!.steps.map((s) => ({ blockId: s.blockId, enterS: round3(s.enterS), exitS: round3(s.exitS) })),
        };
      })
      .sort((a, b) => a.plannedDepartS - b.plannedDepartS || a.id.localeCompare(b.id)),
    newFindings,
    repair,
  };
}

const globalForCache = globalThis as unknown as { fishplateLiveCache?: Map<string, { seq: number; atMs: number; json: string }> };
const cache = (globalForCache.fishplateLiveCache ??= new Map());
/** How long one built state serves every screen that asks (the clock is read on each screen anyway). */
const CACHE_MS = 1000;

/** The live state as JSON, built at most once a second per session while nothing changes. */
export function liveStateJson(sessionId: string, nowMs = Date.now()): string {
  const hit = cache.get(sessionId);
  const seq = lastLiveSeq(sessionId);
  if (hit && hit.seq === seq && nowMs - hit.atMs < CACHE_MS) return hit.json;
  const json = JSON.stringify(buildLiveState(sessionId, nowMs));
  cache.set(sessionId, { seq, atMs: nowMs, json });
  if (cache.size > 200) cache.delete(cache.keys().next().value!);
  return json;
}
