'use server';

import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { getRailway, recordAudit } from '@/db/queries/railways';
import {
  copySession,
  getRailwayLayout,
  getSessionById,
  insertSession,
  updateSessionSettings,
  updateSessionStatus,
  type SessionValues,
} from '@/db/queries/session-records';
import { requireMember } from '@/lib/auth';
import { checkCounts } from '@/lib/sessions/error-counts';
import { AppError, conflict, notFound, parseOrThrow, type ActionState } from '@/lib/errors';
import { action } from '@/lib/http';
import { utcToZoned, zonedToUtc } from '@/lib/time-zone';
import {
  createSessionSchema,
  duplicateSessionSchema,
  sessionStatusSchema,
  STATUS_MOVES,
  updateSessionSchema,
  type SessionSettingsInput,
} from '@/lib/validations/session';

const railwayIdSchema = z.string().min(1).max(100);

const fields = (formData: FormData, names: readonly string[]) =>
  Object.fromEntries(names.map((n) => [n, formData.get(n) ?? undefined]));

const SETTINGS_FIELDS = [
  'title', 'place', 'description', 'date', 'startTime', 'endTime', 'clockRatio', 'fastStart', 'headwayS', 'surgeS', 'deratePercent', 'standS', 'punctualFastMin',
] as const;

function fieldError(path: string, message: string): AppError {
  return new AppError('bad_request', message, { issues: [{ path, message }] });
}

/** Form values as stored: wall-clock times in the zone become instants; an end before the start is the next day. */
function settingsValues(input: SessionSettingsInput, timeZone: string): SessionValues {
  const startsAt = zonedToUtc(input.date, input.startTime, timeZone);
  if (!startsAt) throw fieldError('startTime', `${input.startTime} does not exist on ${input.date} in ${timeZone} (the clocks go forward then).`);
  let endsAt = zonedToUtc(input.date, input.endTime, timeZone);
  if (endsAt && endsAt <= startsAt) {
    const next = new Date(`${input.date}T12:00:00Z`);
    next.setUTCDate(next.getUTCDate() + 1);
    endsAt = zonedToUtc(next.toISOString().slice(0, 10), input.endTime, timeZone);
  }
  if (!endsAt) throw fieldError('endTime', `${input.endTime} does not exist on that day in ${timeZone} (the clocks go forward then).`);
  if (endsAt.getTime() - startsAt.getTime() > 24 * 3600_000) throw fieldError('endTime', 'A session lasts at most 24 hours.');
  return {
    title: input.title,
    place: input.place,
    description: input.description,
    startsAt,
    endsAt,
    clockRatio: input.clockRatio,
    fastStart: input.fastStart,
    headwayS: input.headwayS,
    surgeS: input.surgeS,
    derate: input.deratePercent / 100,
    ...(input.standS === undefined ? {} : { standS: input.standS }),
    ...(input.punctualFastMin === undefined ? {} : { punctualFastMin: input.punctualFastMin }),
  };
}

/** Planners and hosts: a new draft session on one of the railway's layouts; opens its builder. */
export const createSession = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const member = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'planner', 'create sessions');
  const input = parseOrThrow(createSessionSchema, fields(formData, [...SETTINGS_FIELDS, 'layoutId']));
  const railway = getRailway(member.railwayId);
  if (!railway) throw notFound('That railway');
  const layout = getRailwayLayout(member.railwayId, input.layoutId);
  if (!layout) throw fieldError('layoutId', 'Choose one of this railway’s layouts.');
  const session = insertSession(member.railwayId, layout.id, railway.timeZone, settingsValues(input, railway.timeZone));
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'create', entity: 'session', entityId: session.id });
  revalidatePath(`/railways/${member.railwayId}`);
  redirect(`/railways/${member.railwayId}/sessions/${session.id}`);
});

/** Planners and hosts: saves a session's settings at the version they saw (409 when stale). */
export const updateSession = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const member = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'planner', 'change sessions');
  const input = parseOrThrow(updateSessionSchema, fields(formData, [...SETTINGS_FIELDS, 'sessionId', 'version']));
  const session = getSessionById(input.sessionId);
  if (!session || session.railwayId !== member.railwayId) throw notFound('That session');
  const saved = updateSessionSettings(member.railwayId, session.id, input.version, settingsValues(input, session.timeZone));
  if (!saved) throw conflict(getSessionById(session.id));
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'update', entity: 'session', entityId: session.id, detail: { sequence: saved.sequence } });
  revalidatePath(`/railways/${member.railwayId}/sessions/${session.id}`);
  return { ok: true, message: saved.sequence !== session.sequence ? 'Saved. The date or times changed, so invitations can be sent again as an update.' : 'Saved.' };
});

/** Planners and hosts: draft → published → cancelled (a cancelled session may be reopened as a draft). */
export const setSessionStatus = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const member = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'planner', 'publish or cancel sessions');
  const input = parseOrThrow(sessionStatusSchema, fields(formData, ['sessionId', 'version', 'status', 'acknowledgedErrors']));
  const session = getSessionById(input.sessionId);
  if (!session || session.railwayId !== member.railwayId) throw notFound('That session');
  if (!STATUS_MOVES[session.status].includes(input.status)) {
    throw fieldError('status', `A ${session.status} session cannot become ${input.status}.`);
  }
  if (input.status === 'published') {
    const { errors } = checkCounts(session.id);
    if (errors > (input.acknowledgedErrors ?? 0)) {
      throw fieldError(
        'acknowledgedErrors',
        `The timetable has ${errors} error${errors === 1 ? '' : 's'}. Fix ${errors === 1 ? 'it' : 'them'} first, or confirm publishing with ${errors === 1 ? 'it' : 'them'}.`,
      );
    }
  }
  const saved = updateSessionStatus(member.railwayId, session.id, input.version, input.status);
  if (!saved) throw conflict(getSessionById(session.id));
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: `status-${input.status}`, entity: 'session', entityId: session.id, detail: { sequence: saved.sequence } });
  revalidatePath(`/railways/${member.railwayId}/sessions/${session.id}`);
  revalidatePath(`/railways/${member.railwayId}/sessions`);
  const said = { draft: 'Reopened as a draft.', published: 'Published: invited operators can now see it.', cancelled: 'Cancelled.' } as const;
  return { ok: true, message: said[input.status] };
});

/** Planners and hosts: copies a session (settings, runs and steps) to a new date as a draft, and opens it. */
export const duplicateSession = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const member = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'planner', 'duplicate sessions');
  const input = parseOrThrow(duplicateSessionSchema, {
    sessionId: formData.get('sessionId') ?? undefined,
    date: formData.get('date') ?? undefined,
    title: formData.get('title') || undefined,
  });
  const source = getSessionById(input.sessionId);
  if (!source || source.railwayId !== member.railwayId) throw notFound('That session');
  const { time } = utcToZoned(source.startsAt, source.timeZone);
  const newStart = zonedToUtc(input.date, time, source.timeZone);
  if (!newStart) throw fieldError('date', `${time} does not exist on ${input.date} in ${source.timeZone}.`);
  const copy = copySession(source, newStart.getTime() - source.startsAt.getTime(), input.title ?? source.title);
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'duplicate', entity: 'session', entityId: copy.id, detail: { from: source.id } });
  revalidatePath(`/railways/${member.railwayId}/sessions`);
  redirect(`/railways/${member.railwayId}/sessions/${copy.id}`);
});
