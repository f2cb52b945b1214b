import 'server-only';
import { and, asc, eq, inArray } from 'drizzle-orm';
import { getDb, type Db, writeTransaction } from '@/db';
import { runs, runSteps } from '@/db/schema';

/** A step as stored; fromEnd/toEnd: the direction of travel, when the route finder recorded it. */
export type StepValues = { blockId: string; enterS: number; exitS: number; fromEnd?: 'a' | 'b'; toEnd?: 'a' | 'b' };

/** A run as stored: its row (without the session it belongs to) and its steps in order. */
export type StoredRun = Omit<typeof runs.$inferSelect, 'sessionId'> & { steps: StepValues[] };

export type RunValues = Omit<StoredRun, 'id' | 'version'> & { id?: string };

/**
 * What every versioned write answers: done, or the runs as they are now when a version named was
 * stale (nothing changed), or the ids that are not this session's runs.
 */
export type VersionedWrite<T> = { done: T } | { stale: StoredRun[] } | { missing: string[] };

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

const STEP_CHUNK = 1000;

function writeSteps(tx: Tx, runId: string, steps: readonly StepValues[]) {
  for (let i = 0; i < steps.length; i += STEP_CHUNK) {
    tx.insert(runSteps)
      .values(
        steps
          .slice(i, i + STEP_CHUNK)
          .map((s, j) => ({ runId, position: i + j, blockId: s.blockId, enterS: s.enterS, exitS: s.exitS, fromEnd: s.fromEnd ?? null, toEnd: s.toEnd ?? null })),
      )
      .run();
  }
}

function readRun(tx: Tx | Db, sessionId: string, runId: string): StoredRun | undefined {
  const row = tx
    .select()
    .from(runs)
    .where(and(eq(runs.id, runId), eq(runs.sessionId, sessionId)))
    .get();
  if (!row) return undefined;
  const steps = tx
    .select({ blockId: runSteps.blockId, enterS: runSteps.enterS, exitS: runSteps.exitS, fromEnd: runSteps.fromEnd, toEnd: runSteps.toEnd })
    .from(runSteps)
    .where(eq(runSteps.runId, runId))
    .orderBy(asc(runSteps.position))
    .all()
    .map(({ fromEnd, toEnd, ...step }): StepValues => ({ ...step, ...(fromEnd ? { fromEnd } : {}), ...(toEnd ? { toEnd } : {}) }));
  const { sessionId: _s, ...rest } = row;
  return { ...rest, steps };
}

/** One run of a session with its steps, or undefined (also when it belongs to another session). */
export function getRun(sessionId: string, runId: string): StoredRun | undefined {
  return readRun(getDb(), sessionId, runId);
}

/** Writes one run and its steps inside a transaction (the seed uses it too); returns its id. */
export function writeRun(tx: Tx, sessionId: string, values: RunValues): string {
  const { steps, ...row } = values;
  const id = tx.insert(runs).values({ ...row, sessionId }).returning({ id: runs.id }).get().id;
  writeSteps(tx, id, steps);
  return id;
}

/** Inserts runs with their steps in one transaction; returns their ids in order. */
export function insertRuns(sessionId: string, values: readonly RunValues[]): string[] {
  return writeTransaction((tx) => values.map((v) => writeRun(tx, sessionId, v)));
}

export type RunPatch = Partial<Omit<StoredRun, 'id' | 'version' | 'steps'>> & { steps?: StepValues[] };

/**
 * Applies a patch to a run if it is still at `version` (steps are replaced when given), raising its
 * version. `stale` carries the current run for the 409 answer.
 */
export function updateRun(
  sessionId: string,
  runId: string,
  version: number,
  patch: RunPatch,
): VersionedWrite<StoredRun> {
  return writeTransaction((tx) => {
    const current = readRun(tx, sessionId, runId);
    if (!current) return { missing: [runId] };
    if (current.version !== version) return { stale: [current] };
    const { steps, ...row } = patch;
    tx.update(runs)
      .set({ ...row, version: current.version + 1 })
      .where(eq(runs.id, runId))
      .run();
    if (steps) {
      tx.delete(runSteps).where(eq(runSteps.runId, runId)).run();
      writeSteps(tx, runId, steps);
    }
    return { done: readRun(tx, sessionId, runId)! };
  });
}

/** Deletes a run if it is still at `version`; returns what was deleted (for undo). */
export function deleteRun(
  sessionId: string,
  runId: string,
  version: number,
): VersionedWrite<StoredRun> {
  return writeTransaction((tx) => {
    const current = readRun(tx, sessionId, runId);
    if (!current) return { missing: [runId] };
    if (current.version !== version) return { stale: [current] };
    tx.delete(runs).where(eq(runs.id, runId)).run();
    return { done: current };
  });
}

/**
 * Shifts runs (departure, arrival and every step) by their delay in one transaction, if every one
 * is still at the version named; otherwise nothing changes and the stale runs come back.
 */
export function shiftRuns(
  sessionId: string,
  moves: readonly { runId: string; version: number; delayS: number }[],
): VersionedWrite<StoredRun[]> {
  return writeTransaction((tx) => {
    const ids = moves.map((m) => m.runId);
    const rows = tx
      .select()
      .from(runs)
      .where(and(eq(runs.sessionId, sessionId), inArray(runs.id, ids)))
      .all();
    const byId = new Map(rows.map((r) => [r.id, r]));
    const missing = ids.filter((runId) => !byId.has(runId));
    if (missing.length) return { missing };
    const stale = moves.filter((m) => byId.get(m.runId)!.version !== m.version).map((m) => readRun(tx, sessionId, m.runId)!);
    if (stale.length) return { stale };
    const shifted: StoredRun[] = [];
    for (const move of moves) {
      const row = byId.get(move.runId)!;
      const current = readRun(tx, sessionId, move.runId)!;
      tx.update(runs)
        .set({ departS: row.departS + move.delayS, arriveS: row.arriveS + move.delayS, version: row.version + 1 })
        .where(eq(runs.id, move.runId))
        .run();
      tx.delete(runSteps).where(eq(runSteps.runId, move.runId)).run();
      writeSteps(
        tx,
        move.runId,
        current.steps.map((s) => ({ blockId: s.blockId, enterS: s.enterS + move.delayS, exitS: s.exitS + move.delayS })),
      );
      shifted.push(readRun(tx, sessionId, move.runId)!);
    }
    return { done: shifted };
  });
}

/**
 * Replaces every run of a session in one transaction. A run keeps its id when it is already this
 * session's (so a plan read and posted back leaves the session as it was); the server mints the rest.
 */
export function replaceSessionRuns(sessionId: string, values: readonly RunValues[]): number {
  return writeTransaction((tx) => {
    const own = new Set(tx.select({ id: runs.id }).from(runs).where(eq(runs.sessionId, sessionId)).all().map((r) => r.id));
    tx.delete(runs).where(eq(runs.sessionId, sessionId)).run();
    const used = new Set<string>();
    for (const v of values) {
      const { id, ...fields } = v;
      const keep = id && own.has(id) && !used.has(id) ? id : undefined;
      if (keep) used.add(keep);
      writeRun(tx, sessionId, { ...fields, ...(keep ? { id: keep } : {}) });
    }
    return values.length;
  });
}
