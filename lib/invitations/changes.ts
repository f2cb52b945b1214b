import { z } from 'zod';
import type { RunAssignment } from '@/lib/invitations/assignments';
import { sessionSpan } from '@/lib/invitations/message';
import type { CalendarSession } from '@/lib/calendar/ics';

/**
 * What one invitee was told in their last invitation or update: the session's when and where, and
 * their own runs as the e-mail listed them. Stored with the invitation (JSON) so that the tracker
 * can say what changed for that person since, and the update can say it in its body.
 */
const runToldSchema = z.object({
  runId: z.string().max(100),
  trainName: z.string().max(500),
  cabName: z.string().max(500),
  departS: z.number(),
  arriveS: z.number(),
  fastDepart: z.string().max(20),
  fastArrive: z.string().max(20),
  realDepart: z.string().max(20),
  realArrive: z.string().max(20),
  route: z.array(z.string().max(500)).max(500),
});
export const toldSchema = z.object({
  v: z.literal(1),
  session: z.object({
    title: z.string().max(1000),
    place: z.string().max(1000),
    startsAt: z.number(),
    endsAt: z.number(),
    timeZone: z.string().max(100),
  }),
  runs: z.array(runToldSchema).max(10_000),
});
export type Told = z.infer<typeof toldSchema>;
type RunTold = z.infer<typeof runToldSchema>;

type SessionTold = Pick<CalendarSession, 'title' | 'place' | 'startsAt' | 'endsAt' | 'timeZone'>;

/** What an invitation tells a person now: the session and their runs (their runs only). */
export function toldOf(session: SessionTold, runs: RunAssignment[]): Told {
  return {
    v: 1,
    session: {
      title: session.title,
      place: session.place,
      startsAt: session.startsAt.getTime(),
      endsAt: session.endsAt.getTime(),
      timeZone: session.timeZone,
    },
    runs: runs.map((r) => ({
      runId: r.runId,
      trainName: r.trainName,
      cabName: r.cabName,
      departS: r.departS,
      arriveS: r.arriveS,
      fastDepart: r.fastDepart,
      fastArrive: r.fastArrive,
      realDepart: r.realDepart,
      realArrive: r.realArrive,
      route: r.route,
    })),
  };
}

/** Reads a stored snapshot; a missing or unreadable one is null (the invitation predates snapshots). */
export function parseTold(json: string | null): Told | null {
  if (!json) return null;
  try {
    const parsed = toldSchema.safeParse(JSON.parse(json));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

export type Change =
  | { kind: 'session-time'; before: string; after: string }
  | { kind: 'session-place'; before: string; after: string }
  | { kind: 'session-title'; before: string; after: string }
  | { kind: 'run-added'; run: RunTold }
  | { kind: 'run-removed'; run: RunTold }
  | { kind: 'run-changed'; before: RunTold; after: RunTold; moved: boolean; cab: boolean; train: boolean; route: boolean };

// Times compare to the half second: the builder stores seconds with fractions, people read minutes.
const TIME_TOLERANCE_S = 0.5;

/**
 * What changed for one person between what they were told and what they would be told now: the
 * session's time, place or title; runs added to them, taken from them, moved (their fast or
 * session-relative times), put on another cab or train, or routed another way. A change of the
 * session's start alone moves every real time, and is said once, as the session's time.
 */
export function changesBetween(before: Told, now: Told): Change[] {
  const changes: Change[] = [];
  const span = (s: Told['session']) =>
    sessionSpan({ startsAt: new Date(s.startsAt), endsAt: new Date(s.endsAt), timeZone: s.timeZone });
  if (before.session.startsAt !== now.session.startsAt || before.session.endsAt !== now.session.endsAt || before.session.timeZone !== now.session.timeZone) {
    changes.push({ kind: 'session-time', before: span(before.session), after: span(now.session) });
  }
  if (before.session.place !== now.session.place) changes.push({ kind: 'session-place', before: before.session.place, after: now.session.place });
  if (before.session.title !== now.session.title) changes.push({ kind: 'session-title', before: before.session.title, after: now.session.title });

  const old = new Map(before.runs.map((r) => [r.runId, r]));
  const current = new Set(now.runs.map((r) => r.runId));
  for (const run of now.runs) {
    const was = old.get(run.runId);
    if (!was) {
      changes.push({ kind: 'run-added', run });
      continue;
    }
    const moved =
      Math.abs(was.departS - run.departS) >= TIME_TOLERANCE_S ||
      Math.abs(was.arriveS - run.arriveS) >= TIME_TOLERANCE_S ||
      was.fastDepart !== run.fastDepart ||
      was.fastArrive !== run.fastArrive;
    const cab = was.cabName !== run.cabName;
    const train = was.trainName !== run.trainName;
    const route = was.route.join('\n') !== run.route.join('\n');
    if (moved || cab || train || route) changes.push({ kind: 'run-changed', before: was, after: run, moved, cab, train, route });
  }
  for (const run of before.runs) if (!current.has(run.runId)) changes.push({ kind: 'run-removed', run });
  return changes;
}

const runText = (r: RunTold) => `${r.trainName} on ${r.cabName}, ${r.fastDepart}–${r.fastArrive} fast (${r.realDepart}–${r.realArrive} real)`;

/** One line per change, for the update's body and the host's preview. */
export function describeChange(change: Change): string {
  switch (change.kind) {
    case 'session-time':
      return `The session's time changed: now ${change.after}; it was ${change.before}.`;
    case 'session-place':
      return `The place changed: now ${change.after || 'not given'}; it was ${change.before || 'not given'}.`;
    case 'session-title':
      return `The session is now called “${change.after}” (was “${change.before}”).`;
    case 'run-added':
      return `New run for you: ${runText(change.run)}.`;
    case 'run-removed':
      return `No longer yours: ${runText(change.run)}.`;
    case 'run-changed': {
      const { before: b, after: a } = change;
      const parts: string[] = [];
      if (change.moved) parts.push(`now ${a.fastDepart}–${a.fastArrive} fast (${a.realDepart}–${a.realArrive} real), was ${b.fastDepart}–${b.fastArrive} fast`);
      if (change.train) parts.push(`train now ${a.trainName} (was ${b.trainName})`);
      if (change.cab) parts.push(`cab now ${a.cabName} (was ${b.cabName})`);
      if (change.route) parts.push(`route now ${a.route.join(' → ')} (was ${b.route.join(' → ')})`);
      return `Your run with ${b.trainName} at ${b.fastDepart} fast: ${parts.join('; ')}.`;
    }
  }
}

/** A short tag per change for the tracker's table ("2 runs moved, cab changed, 1 run added"). */
export function summariseChanges(changes: Change[]): string {
  const count = { time: 0, place: 0, title: 0, added: 0, removed: 0, moved: 0, cab: 0, train: 0, route: 0 };
  for (const c of changes) {
    if (c.kind === 'session-time') count.time += 1;
    else if (c.kind === 'session-place') count.place += 1;
    else if (c.kind === 'session-title') count.title += 1;
    else if (c.kind === 'run-added') count.added += 1;
    else if (c.kind === 'run-removed') count.removed += 1;
    else {
      if (c.moved) count.moved += 1;
      if (c.cab) count.cab += 1;
      if (c.train) count.train += 1;
      if (c.route) count.route += 1;
    }
  }
  const runs = (n: number) => `${n} run${n === 1 ? '' : 's'}`;
  const parts: string[] = [];
  if (count.time) parts.push('session time changed');
  if (count.place) parts.push('place changed');
  if (count.title) parts.push('title changed');
  if (count.moved) parts.push(`${runs(count.moved)} moved`);
  if (count.cab) parts.push(`cab changed on ${runs(count.cab)}`);
  if (count.train) parts.push(`train changed on ${runs(count.train)}`);
  if (count.route) parts.push(`route changed on ${runs(count.route)}`);
  if (count.added) parts.push(`${runs(count.added)} added`);
  if (count.removed) parts.push(`${runs(count.removed)} removed`);
  return parts.join(', ');
}
