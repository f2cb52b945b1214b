import 'server-only';
import { loadSessionRows } from '@/db/queries/plan-data';
import { rsvpByUser } from '@/db/queries/session-records';
import type { StoredRun } from '@/db/queries/runs';
import type { Session } from '@/db/schema';
import { AppError, notFound, type Issue } from '@/lib/errors';
import {
  fastToReal,
  formatIssuePath,
  parseFastTime,
  planSchema,
  routeThrough,
  timeRun,
  type FastClock,
  type LoadPoint,
  type LoadProfile,
  type HeatPoint,
  type LoadSeries,
  type Plan,
  type TimedRun,
} from '@/lib/planning';
import { planBlockOf, planLinkOf } from '@/lib/layouts/track-rows';
import { compactSnapshot, type CompactSnapshot } from '@/lib/sessions/compact';
import { storedCheck } from '@/lib/sessions/stored-check';
import { sessionToPlan, trainRamps } from '@/lib/sessions/to-plan';
import type { BuilderLayout, BuilderRun, BuilderSession, BuilderSnapshot } from '@/lib/sessions/types';

export type SessionRows = NonNullable<ReturnType<typeof loadSessionRows>>;

/** A stored session's rows and its plan interchange. */
export function loadSessionPlan(sessionId: string): { rows: SessionRows; plan: Plan } {
  const rows = loadSessionRows(sessionId);
  if (!rows) throw notFound('That session');
  return { rows, plan: sessionToPlan(rows) };
}

export function sessionView(session: Session): BuilderSession {
  return {
    id: session.id,
    railwayId: session.railwayId,
    title: session.title,
    status: session.status,
    version: session.version,
    sequence: session.sequence,
    startsAtMs: session.startsAt.getTime(),
    endsAtMs: session.endsAt.getTime(),
    timeZone: session.timeZone,
    clockRatio: session.clockRatio,
    fastStart: session.fastStart,
    headwayS: session.headwayS,
    surgeS: session.surgeS,
    derate: session.derate,
  };
}

const round = (value: number, places: number) => {
  const f = 10 ** places;
  return Math.round(value * f) / f;
};

/** The runs of the loaded rows with their steps, in departure order (times to the millisecond). */
export function runsOf(rows: SessionRows): BuilderRun[] {
  const stepsOf = new Map<string, BuilderRun['steps']>();
  for (const s of rows.steps) {
    const list = stepsOf.get(s.runId) ?? [];
    // Milliseconds are plenty for the builder's views, and the answer is a third smaller.
    list.push({ blockId: s.blockId, enterS: round(s.enterS, 3), exitS: round(s.exitS, 3) });
    stepsOf.set(s.runId, list);
  }
  return rows.runs.map((r) => ({
    id: r.id,
    version: r.version,
    trainId: r.trainId,
    cabId: r.cabId,
    operatorId: r.operatorId,
    departS: round(r.departS, 3),
    arriveS: round(r.arriveS, 3),
    speedKmh: r.speedKmh,
    note: r.note,
    steps: stepsOf.get(r.id) ?? [],
  }));
}

/** The load profile for charts: milliseconds and tenths of a milliamp are plenty, and the answer is smaller. */
export function chartLoad(load: LoadProfile): LoadProfile {
  const series = (list: LoadSeries[]) =>
    list.map((s) => ({
      ...s,
      points: s.points.map(([t, running, peak]) => [round(t, 3), round(running, 4), round(peak, 4)] as LoadPoint),
      heat: s.heat && { ...s.heat, points: s.heat.points.map(([t, low, high]) => [round(t, 3), round(low, 4), round(high, 4)] as HeatPoint) },
    }));
  return { supplies: series(load.supplies), drivers: series(load.drivers), cabs: series(load.cabs) };
}

/**
 * The session as stored, checked now: what every builder handler answers with. The load profile is
 * not in it: the Load view asks `GET …/check?only=load` when it is opened.
 */
export function snapshotOf(sessionId: string, loaded?: { rows: SessionRows; plan: Plan }): BuilderSnapshot {
  const started = performance.now();
  const { rows, plan } = loaded ?? loadSessionPlan(sessionId);
  const { check } = storedCheck(plan);
  return {
    session: sessionView(rows.session),
    runs: runsOf(rows),
    findings: check.findings,
    counts: check.counts,
    totals: check.totals,
    truncated: check.truncated,
    checkMs: Math.round((performance.now() - started) * 10) / 10,
  };
}

/** The layout and crew the builder draws with. */
export function builderLayout(rows: SessionRows): BuilderLayout {
  const topSpeed = new Map(rows.locomotives.map((l) => [l.id, l.topSpeedKmh]));
  const consist = new Map<string, number[]>();
  for (const c of rows.consists) consist.set(c.trainId, [...(consist.get(c.trainId) ?? []), topSpeed.get(c.locomotiveId) ?? Infinity]);
  const rsvp = rsvpByUser(rows.session.id);
  return {
    scaleRatio: rows.layout?.scaleRatio ?? 87,
    blocks: rows.blocks.map((b) => ({ id: b.id, name: b.name, lengthMm: b.lengthMm, positionMm: b.positionMm, ...(b.reversingPlace ? { reversingPlace: true } : {}) })),
    links: rows.links.map((l) => ({ a: l.blockAId, b: l.blockBId, aEnd: l.blockAEnd, bEnd: l.blockBEnd })),
    cabs: rows.cabs.map((c) => ({ id: c.id, name: c.name, driverId: c.driverId, channel: c.channel })),
    drivers: rows.drivers.map((d) => ({ id: d.id, name: d.name, supplyId: d.supplyId })),
    supplies: rows.supplies.map((s) => ({ id: s.id, name: s.name })),
    trains: rows.trains.map((t) => {
      const speeds = consist.get(t.id) ?? [];
      const top = speeds.length ? Math.min(...speeds) : Infinity;
      return { id: t.id, name: t.name, lengthMm: t.lengthMm, topSpeedKmh: Number.isFinite(top) ? top : null };
    }),
    operators: rows.operators.map((o) => ({ id: o.id, name: o.name, rsvp: rsvp.get(o.id) ?? null })),
  };
}

/**
 * What the builder page hands the builder: the layout and crew, and the session's runs and findings
 * compact (runs refer to the layout's lists by place), so the page's payload carries them once and small.
 */
export function builderPageProps(sessionId: string, loaded: { rows: SessionRows; plan: Plan }): { initial: CompactSnapshot; layout: BuilderLayout } {
  const layout = builderLayout(loaded.rows);
  return { layout, initial: compactSnapshot(snapshotOf(sessionId, loaded), layout) };
}

/**
 * Real session seconds for a fast-clock time of day (`HH:MM` or `HH:MM:SS`). A time before the
 * fast start is read as the next fast day, so a session that runs past fast midnight can be typed.
 */
export function departureFromFastTime(text: string, clock: FastClock): number {
  const [h, m, s] = text.split(':').map(Number);
  const fastS = (h ?? 0) * 3600 + (m ?? 0) * 60 + (s ?? 0);
  const startS = parseFastTime(clock.fastStart) ?? 0;
  const realS = fastToReal(fastS < startS ? fastS + 86_400 : fastS, clock);
  return Math.round(realS * 1000) / 1000;
}

/**
 * Times a run with timeRun over the shortest route through the waypoints that a train can take
 * without reversing (routeThrough), and records the direction of travel on each step. Bad
 * references, and waypoints no such route joins, answer 400 naming the field.
 */
export function timeFromWaypoints(
  rows: SessionRows,
  input: { trainId: string; waypoints: string[]; speedKmh: number; standBeforeS: number; standAfterS: number; departS: number },
): TimedRun & { steps: { fromEnd?: 'a' | 'b'; toEnd?: 'a' | 'b' }[] } {
  const train = rows.trains.find((t) => t.id === input.trainId);
  if (!train) throw fieldError('trainId', 'That train is not on this session’s layout.');
  const blockName = new Map(rows.blocks.map((b) => [b.id, b.name]));
  input.waypoints.forEach((blockId, i) => {
    if (!blockName.has(blockId)) throw fieldError(`waypoints[${i}]`, 'That block is not on this session’s layout.');
  });
  const track = { blocks: rows.blocks.map((b) => ({ ...planBlockOf(b), name: b.name })), links: rows.links.map(planLinkOf) };
  const picked = input.waypoints.filter((id, i) => i === 0 || id !== input.waypoints[i - 1]);
  const found = routeThrough(track, picked);
  if (!found.ok) {
    const message = found.reason.charAt(0).toUpperCase() + found.reason.slice(1);
    throw fieldError('waypoints', `${message}.`);
  }
  const route = found.steps.map((s) => s.blockId);
  if (route.length < 2) throw fieldError('waypoints', 'Pick two different blocks: a run has to go somewhere.');
  const timed = timeRun({
    blocks: rows.blocks,
    scaleRatio: rows.layout?.scaleRatio ?? 87,
    trainLengthMm: train.lengthMm,
    route,
    departS: input.departS,
    speedKmh: input.speedKmh,
    standBeforeS: input.standBeforeS,
    standAfterS: input.standAfterS,
    ...trainRamps(train, rows.layout?.scaleRatio ?? 87),
  });
  // One step per block of the route: each keeps the direction the route finder found.
  if (timed.steps.length !== found.steps.length) return timed;
  return { ...timed, steps: timed.steps.map((step, i) => ({ ...step, fromEnd: found.steps[i]!.fromEnd, toEnd: found.steps[i]!.toEnd })) };
}

function fieldError(path: string, message: string): AppError {
  return new AppError('bad_request', message, { issues: [{ path, message }] });
}

/** How long the session lasts in real seconds: every time of its runs lies in [0, this]. */
export function sessionLengthS(session: Pick<Session, 'startsAt' | 'endsAt'>): number {
  return Math.max(0, (session.endsAt.getTime() - session.startsAt.getTime()) / 1000);
}

/** Times of one run outside the session's window (a stored run far outside it once took the server down). */
function outsideWindow(run: Plan['runs'][number], lengthS: number): Issue[] {
  const within = (t: unknown) => typeof t === 'number' && t >= 0 && t <= lengthS;
  const message = `must lie within the session, 0 to ${lengthS} s after its start`;
  const issues: Issue[] = [];
  if (!within(run.departS)) issues.push({ path: 'departS', message });
  if (!within(run.arriveS)) issues.push({ path: 'arriveS', message });
  const step = run.steps.findIndex((s) => !within(s.enterS) || !within(s.exitS));
  if (step >= 0) issues.push({ path: `steps[${step}]`, message });
  return issues;
}

/**
 * Refuses (400) a plan whose named runs the plan interchange would not accept: unknown trains,
 * cabs, operators or blocks, steps out of order, a departure outside the first step, any time
 * outside the session's window. Issues elsewhere in the plan are not the caller's doing and do not
 * block their edit.
 */
export function assertRunsValid(plan: Plan, runIds: ReadonlySet<string>, session: Pick<Session, 'startsAt' | 'endsAt'>): void {
  const lengthS = sessionLengthS(session);
  const named = plan.runs.filter((r) => runIds.has(r.id));
  const outside = named.flatMap((r) => outsideWindow(r, lengthS));
  if (outside.length) throw new AppError('bad_request', `${outside[0]!.path}: ${outside[0]!.message}`, { issues: outside });
  const result = planSchema.safeParse(plan);
  if (result.success) return;
  const issues: Issue[] = [];
  for (const issue of result.error.issues) {
    const [list, index, ...rest] = issue.path;
    if (list !== 'runs' || typeof index !== 'number') continue;
    const run = plan.runs[index];
    if (!run || !runIds.has(run.id)) continue;
    issues.push({ path: formatIssuePath(rest) || 'run', message: issue.message });
  }
  if (issues.length) {
    const first = issues[0]!;
    throw new AppError('bad_request', `${first.path}: ${first.message}`, { issues });
  }
}

/** A stored run as the plan interchange's run. */
export function planRun(run: StoredRun | (Omit<StoredRun, 'id' | 'version'> & { id: string })): Plan['runs'][number] {
  return {
    id: run.id,
    trainId: run.trainId,
    cabId: run.cabId,
    operatorId: run.operatorId,
    departS: run.departS,
    arriveS: run.arriveS,
    steps: run.steps.map((s) => ({ blockId: s.blockId, enterS: s.enterS, exitS: s.exitS })),
  };
}
