import 'server-only';
import { loadSessionRows } from '@/db/queries/plan-data';
import { replyByUser } from '@/db/queries/session-records';
import type { Session } from '@/db/schema';
import { AppError, notFound } from '@/lib/errors';
import {
  fastTimeToReal,
  type FastClock,
  type LoadPoint,
  type LoadProfile,
  type HeatPoint,
  type LoadSeries,
  type Plan,
} from '@/lib/planning';
import { compactSnapshot, type CompactSnapshot } from '@/lib/sessions/compact';
import { storedCheck } from '@/lib/sessions/stored-check';
import { sessionToPlan } from '@/lib/sessions/to-plan';
import type { TimetableLayout, TimetableSession, TimetableSnapshot } from '@/lib/sessions/types';
import type { Run, Step } from '@/lib/runs/schema';

export type SessionRows = NonNullable<ReturnType<typeof loadSessionRows>>;

/** A stored session's rows and its plan interchange. */
export function loadSessionPlan(sessionId: string): { rows: SessionRows; plan: Plan } {
  const rows = loadSessionRows(sessionId);
  if (!rows) throw notFound('That session');
  return { rows, plan: sessionToPlan(rows) };
}

export function sessionView(session: Session): TimetableSession {
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
export function runsOf(rows: SessionRows): Run[] {
  const stepsOf = new Map<string, Step[]>();
  for (const s of rows.steps) {
    const list = stepsOf.get(s.runId) ?? [];
    // Milliseconds are plenty for the timetable's views, and the answer is a third smaller.
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
 * The session as stored, checked now: what every timetable handler answers with. The load profile is
 * not in it: the Load view asks `GET …/check?only=load` when it is opened.
 */
export function snapshotOf(sessionId: string, loaded?: { rows: SessionRows; plan: Plan }): TimetableSnapshot {
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

/** The layout and crew the timetable draws with. */
export function timetableLayout(rows: SessionRows): TimetableLayout {
  const topSpeed = new Map(rows.locomotives.map((l) => [l.id, l.topSpeedKmh]));
  const consist = new Map<string, number[]>();
  for (const c of rows.consists) consist.set(c.trainId, [...(consist.get(c.trainId) ?? []), topSpeed.get(c.locomotiveId) ?? Infinity]);
  const reply = replyByUser(rows.session.id);
  return {
    scaleRatio: rows.layout?.scaleRatio ?? 87,
    blocks: rows.blocks.map((b) => ({ id: b.id, name: b.name, lengthMm: b.lengthMm, positionMm: b.positionMm, ...(b.reversingPlace ? { reversingPlace: true } : {}), ...(b.reversingSection ? { reversingSection: true } : {}) })),
    links: rows.links.map((l) => ({ a: l.blockAId, b: l.blockBId, aEnd: l.blockAEnd, bEnd: l.blockBEnd })),
    cabs: rows.cabs.map((c) => ({ id: c.id, name: c.name, driverId: c.driverId, channel: c.channel })),
    drivers: rows.drivers.map((d) => ({ id: d.id, name: d.name, supplyId: d.supplyId })),
    supplies: rows.supplies.map((s) => ({ id: s.id, name: s.name })),
    trains: rows.trains.map((t) => {
      const speeds = consist.get(t.id) ?? [];
      const top = speeds.length ? Math.min(...speeds) : Infinity;
      return { id: t.id, name: t.name, lengthMm: t.lengthMm, topSpeedKmh: Number.isFinite(top) ? top : null };
    }),
    operators: rows.operators.map((o) => ({ id: o.id, name: o.name, reply: reply.get(o.id) ?? null })),
  };
}

/**
 * What the timetable page hands the timetable screen: the layout and crew, and the session's runs and findings
 * compact (runs refer to the layout's lists by place), so the page's payload carries them once and small.
 */
export function timetablePageProps(sessionId: string, loaded: { rows: SessionRows; plan: Plan }): { initial: CompactSnapshot; layout: TimetableLayout } {
  const layout = timetableLayout(loaded.rows);
  return { layout, initial: compactSnapshot(snapshotOf(sessionId, loaded), layout) };
}

/**
 * Real session seconds for a fast-clock time of day a request schema has already checked
 * (`fastTimeToReal`: a time before the fast start is the next fast day); a 400 should it not read.
 */
export function departureFromFastTime(text: string, clock: FastClock): number {
  const realS = fastTimeToReal(text, clock);
  if (realS === null) throw new AppError('bad_request', 'Enter the fast-clock time as HH:MM or HH:MM:SS.');
  return realS;
}

/** How long the session lasts in real seconds: every time of its runs lies in [0, this]. */
export function sessionLengthS(session: Pick<Session, 'startsAt' | 'endsAt'>): number {
  return Math.max(0, (session.endsAt.getTime() - session.startsAt.getTime()) / 1000);
}
