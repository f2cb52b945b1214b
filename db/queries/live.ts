import 'server-only';
import { and, asc, eq, gt, sql } from 'drizzle-orm';
import { getDb, writeTransaction, type Db } from '@/db';
import {
  clockEvents,
  liveEvents,
  runRepairs,
  runReports,
  type ClockAction,
  type ClockEvent,
  type LiveEvent,
  type ReportKind,
  type RunRepair,
  type RunReport,
  type StopReason,
  users,
} from '@/db/schema';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** A session's clock actions in the order they were made. */
export function listClockEvents(sessionId: string, tx: Tx | Db = getDb()): ClockEvent[] {
  return tx.select().from(clockEvents).where(eq(clockEvents.sessionId, sessionId)).orderBy(asc(clockEvents.at), sql`rowid`).all();
}

/** A session's reports in the order they were made (corrections and withdrawals included). */
export function listReports(sessionId: string, tx: Tx | Db = getDb()): RunReport[] {
  return tx.select().from(runReports).where(eq(runReports.sessionId, sessionId)).orderBy(asc(runReports.reportedAt), sql`rowid`).all();
}

/** The repairs applied during a session, oldest first. */
export function listRepairs(sessionId: string, tx: Tx | Db = getDb()): RunRepair[] {
  return tx.select().from(runRepairs).where(eq(runRepairs.sessionId, sessionId)).orderBy(asc(runRepairs.appliedAt), sql`rowid`).all();
}

/** The session's live events after `afterSeq`, oldest first, at most `limit`. */
export function liveEventsAfter(sessionId: string, afterSeq: number, limit: number): LiveEvent[] {
  return getDb()
    .select()
    .from(liveEvents)
    .where(and(eq(liveEvents.sessionId, sessionId), gt(liveEvents.seq, afterSeq)))
    .orderBy(asc(liveEvents.seq))
    .limit(limit)
    .all();
}

/** The session's last live event number (0 before the first). */
export function lastLiveSeq(sessionId: string, tx: Tx | Db = getDb()): number {
  const row = tx.select({ seq: sql<number>`coalesce(max(${liveEvents.seq}), 0)` }).from(liveEvents).where(eq(liveEvents.sessionId, sessionId)).get();
  return row?.seq ?? 0;
}

function appendLiveEvent(tx: Tx, sessionId: string, type: string, summary: string, at: Date): LiveEvent {
  const seq = lastLiveSeq(sessionId, tx) + 1;
  return tx.insert(liveEvents).values({ sessionId, seq, type, summary, at }).returning().get();
}

export type ClockEventValues = { action: ClockAction; sessionS: number | null; byUserId: string };

/**
 * Adds a clock action and its numbered live event in one write transaction. `decide` sees the
 * actions stored so far (read inside the transaction, so two hosts pressing at once queue) and
 * answers what to store, or throws to store nothing.
 */
export function addClockEvent(
  sessionId: string,
  at: Date,
  decide: (stored: ClockEvent[]) => { values: ClockEventValues; summary: string },
): { event: ClockEvent; live: LiveEvent } {
  return writeTransaction((tx) => {
    const { values, summary } = decide(listClockEvents(sessionId, tx));
    const event = tx.insert(clockEvents).values({ ...values, sessionId, at }).returning().get();
    return { event, live: appendLiveEvent(tx, sessionId, 'clock', summary, at) };
  });
}

export type ReportValues = {
  runId: string;
  kind: ReportKind;
  reason: StopReason | null;
  sessionS: number;
  correction: boolean;
  withdrawn: boolean;
  byUserId: string;
};

/**
 * Stores a report and its numbered live event in one write transaction. `check` sees the session's
 * reports so far (read inside the transaction, so two presses at once queue) and throws to store nothing.
 */
export function addReport(
  sessionId: string,
  at: Date,
  values: ReportValues,
  summary: string,
  check: (stored: RunReport[]) => void,
): { report: RunReport; live: LiveEvent } {
  return writeTransaction((tx) => {
    check(listReports(sessionId, tx));
    const report = tx.insert(runReports).values({ ...values, sessionId, reportedAt: at }).returning().get();
    return { report, live: appendLiveEvent(tx, sessionId, 'report', summary, at) };
  });
}

/**
 * Stores repair delays and one numbered live event in one write transaction, only if the session's
 * last event is still `expectSeq` (the state the repair was worked out from); else undefined.
 */
export function addRepairs(
  sessionId: string,
  expectSeq: number,
  at: Date,
  byUserId: string,
  moves: readonly { runId: string; delayS: number }[],
  summary: string,
): LiveEvent | undefined {
  return writeTransaction((tx) => {
    if (lastLiveSeq(sessionId, tx) !== expectSeq) return undefined;
    for (const move of moves) tx.insert(runRepairs).values({ sessionId, runId: move.runId, delayS: move.delayS, appliedAt: at, byUserId }).run();
    return appendLiveEvent(tx, sessionId, 'repair', summary, at);
  });
}

/** One run's reports in the order they were made, with who made each (the audit of corrections), at most `limit`. */
export function listRunReportsWithReporter(sessionId: string, runId: string, limit: number) {
  return getDb()
    .select({
      id: runReports.id,
      kind: runReports.kind,
      reason: runReports.reason,
      sessionS: runReports.sessionS,
      reportedAt: runReports.reportedAt,
      correction: runReports.correction,
      withdrawn: runReports.withdrawn,
      by: users.name,
    })
    .from(runReports)
    .leftJoin(users, eq(users.id, runReports.byUserId))
    .where(and(eq(runReports.sessionId, sessionId), eq(runReports.runId, runId)))
    .orderBy(asc(runReports.reportedAt), sql`"run_reports".rowid`)
    .limit(limit)
    .all();
}
