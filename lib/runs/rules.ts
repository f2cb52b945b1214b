import 'server-only';
import type { Session } from '@/db/schema';
import { AppError, type Issue } from '@/lib/errors';
import { formatIssuePath, planSchema, routeThrough, timeRun, toPlanJson, type Plan, type TimedRun } from '@/lib/planning';
import { planBlockOf, planLinkOf } from '@/lib/layouts/track-rows';
import { sessionLengthS, type SessionRows } from '@/lib/sessions/timetable';
import { trainRamps } from '@/lib/sessions/to-plan';

// The rules a run must keep to be written: references that resolve on the session's layout, times
// inside the session, the plan interchange's own checks.

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
  // The schema reads the interchange, so the model is written as it first (the run paths are the same).
  const result = planSchema.safeParse(toPlanJson(plan));
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

