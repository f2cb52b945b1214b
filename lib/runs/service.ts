import 'server-only';
import { deleteRun, getRun, insertRuns, replaceSessionRuns, updateRun, type RunPatch, type RunValues, type StoredRun, type VersionedWrite } from '@/db/queries/runs';
import type { Session } from '@/db/schema';
import type { Member } from '@/lib/auth';
import { AppError, conflict, notFound } from '@/lib/errors';
import { toPlanJson } from '@/lib/planning';
import { assertRunsValid, timeFromWaypoints } from '@/lib/runs/rules';
import {
  RUN_FIELDS_OUTSIDE_PLAN,
  runFieldsOf,
  runFieldsSchema,
  shiftTiming,
  toPlanRun,
  type CreateRunInput,
  type PostedPlan,
  type Run,
  type RunFields,
  type SeriesBody,
  type UpdateRunInput,
} from '@/lib/runs/schema';
import { requireSession } from '@/lib/auth/sessions';
import { departureFromFastTime, loadSessionPlan } from '@/lib/sessions/timetable';
import { assertTimetableEditable, auditRunChange, changeAnswer } from '@/lib/sessions/changes';
import type { TimetableChange } from '@/lib/sessions/types';

// Every write to a session's runs: who may (planner or host of the session's railway, a timetable
// that is not cancelled), the rules (lib/runs/rules.ts), one transaction, an audit line, and one
// answer, the re-checked session (TimetableChange). Route handlers parse and call these, nothing more.

// The schema and the table hold the same fields: a field added to one and not the other fails here.
type OnlyIn<A, B> = Exclude<keyof A, keyof B>;
type SameFields = [OnlyIn<Run, StoredRun>, OnlyIn<StoredRun, Run>] extends [never, never] ? true : { onlyInSchema: OnlyIn<Run, StoredRun>; onlyInTable: OnlyIn<StoredRun, Run> };
const schemaMatchesTable: SameFields = true;
void schemaMatchesTable;
const asStored = (run: RunFields): RunValues => run;
void asStored;

/** A versioned write's result, or the 404 / 409 it calls for (409 carries the run or runs as they are now). */
export function settle<T>(result: VersionedWrite<T>, what = 'That run'): T {
  if ('missing' in result) throw notFound(result.missing.length === 1 ? what : `Run ${result.missing[0]}`);
  if ('stale' in result) throw conflict(result.stale.length === 1 ? result.stale[0] : result.stale);
  return result.done;
}

/** The session, if the caller may change its timetable. */
export async function editableTimetable(sessionId: string): Promise<{ session: Session; member: Member }> {
  const access = await requireSession(sessionId, 'edit');
  assertTimetableEditable(access.session);
  return access;
}

function storedRun(sessionId: string, runId: string): Run {
  const run = getRun(sessionId, runId);
  if (!run) throw notFound('That run');
  return run;
}

/** Adds a run, timed from a fast-clock departure and a route, or given whole. Answers with the new run. */
export async function addRun(sessionId: string, input: CreateRunInput): Promise<TimetableChange> {
  const { session, member } = await editableTimetable(sessionId);
  const { rows, plan } = loadSessionPlan(session.id);
  let values: RunFields;
  if ('steps' in input) {
    values = input;
  } else {
    const { depart, waypoints, speedKmh, standBeforeS, standAfterS, ...attributes } = input;
    const departS = departureFromFastTime(depart, plan.clock);
    const timed = timeFromWaypoints(rows, { trainId: attributes.trainId, waypoints, speedKmh, standBeforeS, standAfterS, departS });
    values = { ...attributes, speedKmh, departS: timed.departS, arriveS: timed.arriveS, steps: timed.steps };
  }
  // Database ids are UUIDs, which never hold a dot: a draft id cannot name a stored run.
  const draftId = 'draft.new-run';
  assertRunsValid({ ...plan, runs: [...plan.runs, toPlanRun({ ...values, id: draftId })] }, new Set([draftId]), session);
  const [id] = insertRuns(session.id, [values]);
  if (!id) throw new AppError('bad_request', 'The run could not be added.');
  auditRunChange(member, 'create', id, { sessionId: session.id });
  return changeAnswer(session.id, { runId: id });
}

/**
 * Edits a run at the version the caller saw: any attributes, and one of a new departure (the whole
 * run moves), a new timing from route and speed, or the timing given whole.
 */
export async function editRun(sessionId: string, runId: string, input: UpdateRunInput): Promise<TimetableChange> {
  const { session, member } = await editableTimetable(sessionId);
  const { rows, plan } = loadSessionPlan(session.id);
  const current = storedRun(session.id, runId);
  if (current.version !== input.version) throw conflict(current);
  const { version, depart, departS, timing, steps, ...attributes } = input;
  const patch: RunPatch = Object.fromEntries(Object.entries(attributes).filter(([, v]) => v !== undefined));
  const newDepartS = depart !== undefined ? departureFromFastTime(depart, plan.clock) : departS;
  if (newDepartS !== undefined) {
    Object.assign(patch, shiftTiming(current, newDepartS - current.departS));
  } else if (timing) {
    const timed = timeFromWaypoints(rows, { ...timing, trainId: patch.trainId ?? current.trainId, departS: current.departS });
    Object.assign(patch, { departS: timed.departS, arriveS: timed.arriveS, steps: timed.steps, speedKmh: timing.speedKmh });
  } else if (steps) {
    Object.assign(patch, steps);
  }
  const edited = toPlanRun({ ...current, ...patch });
  assertRunsValid({ ...plan, runs: plan.runs.map((r) => (r.id === runId ? edited : r)) }, new Set([runId]), session);
  settle(updateRun(session.id, runId, version, patch));
  auditRunChange(member, 'update', runId, { sessionId: session.id, fields: Object.keys(patch) });
  return changeAnswer(session.id, { runId });
}

/** Deletes a run at the version the caller saw; the answer carries it, so it can be put back. */
export async function removeRun(sessionId: string, runId: string, version: number): Promise<TimetableChange> {
  const { session, member } = await editableTimetable(sessionId);
  const deleted = settle(deleteRun(session.id, runId, version));
  auditRunChange(member, 'delete', runId, { sessionId: session.id });
  return changeAnswer(session.id, { deleted });
}

/** Copies a run `count` times, each `everyFastMin` fast minutes after the one before, in one transaction. */
export async function copyRunAsSeries(sessionId: string, runId: string, input: SeriesBody): Promise<TimetableChange> {
  const { session, member } = await editableTimetable(sessionId);
  const { plan } = loadSessionPlan(session.id);
  const source = storedRun(session.id, runId);
  // A fast minute lasts 60 / ratio real seconds.
  const everyS = (input.everyFastMin * 60) / plan.clock.ratio;
  const copies: RunFields[] = Array.from({ length: input.count }, (_, i) => ({ ...runFieldsOf(source), ...shiftTiming(source, everyS * (i + 1)) }));
  const draftIds = copies.map((_, i) => `draft.copy-${i}`);
  assertRunsValid({ ...plan, runs: [...plan.runs, ...copies.map((c, i) => toPlanRun({ ...c, id: draftIds[i]! }))] }, new Set(draftIds), session);
  const createdIds = insertRuns(session.id, copies);
  auditRunChange(member, 'create-series', runId, { sessionId: session.id, copies: createdIds.length, everyFastMin: input.everyFastMin });
  return changeAnswer(session.id, { createdIds });
}

type OutsidePlan = Pick<RunFields, (typeof RUN_FIELDS_OUTSIDE_PLAN)[number]>;

/** A run's fields the plan does not carry: from the posted run when it has them, else the stored run of that id, else the default. */
function fieldsOutsidePlan(posted: Partial<OutsidePlan>, stored: OutsidePlan | undefined): OutsidePlan {
  const pick = <K extends keyof OutsidePlan>(key: K): OutsidePlan[K] =>
    posted[key] !== undefined ? posted[key] : stored ? stored[key] : (runFieldsSchema.shape[key].parse(undefined) as OutsidePlan[K]);
  return Object.fromEntries(RUN_FIELDS_OUTSIDE_PLAN.map((key) => [key, pick(key)])) as OutsidePlan;
}

/**
 * Replaces the session's runs with the runs of a posted plan, in one transaction. Its runs must
 * name this session's layout and the railway's members; its clock and rules are not taken over
 * (the session settings hold those). A run keeps what the plan does not carry (speed, note) from
 * the posted run, or else from the stored run of the same id.
 */
export async function replaceRunsFromPlan(sessionId: string, posted: PostedPlan): Promise<TimetableChange> {
  const { session, member } = await editableTimetable(sessionId);
  const { rows, plan } = loadSessionPlan(session.id);
  const runs = posted.runs.map((r) => toPlanRun(r));
  assertRunsValid({ ...plan, runs }, new Set(runs.map((r) => r.id)), session);
  const storedById = new Map(rows.runs.map((r) => [r.id, r]));
  const values: RunValues[] = posted.runs.map((r, i) => ({ ...runs[i]!, ...fieldsOutsidePlan(r, storedById.get(r.id)) }));
  replaceSessionRuns(session.id, values);
  auditRunChange(member, 'replace-runs', null, { sessionId: session.id, runs: values.length });
  return changeAnswer(session.id);
}

/** The session as the plan interchange, each run with the fields the plan does not carry beside it (a plan posted back keeps them). */
export async function exportSessionPlan(sessionId: string) {
  const { session } = await requireSession(sessionId, 'view');
  const { rows, plan } = loadSessionPlan(session.id);
  const rowOf = new Map(rows.runs.map((r) => [r.id, r]));
  const runs = plan.runs.map((r) => {
    const row = rowOf.get(r.id);
    return { ...r, ...(row ? Object.fromEntries(RUN_FIELDS_OUTSIDE_PLAN.map((key) => [key, row[key]])) : {}) };
  });
  // Every export writes interchange version 2 (POST takes version 1 too).
  return { session, plan: { ...toPlanJson(plan), runs } };
}
