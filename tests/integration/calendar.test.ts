import { and, eq } from 'drizzle-orm';
import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { resetCalendarFeed } from '@/app/(app)/my-runs/actions';
import { GET as getFeed } from '@/app/api/calendar/[token]/route';
import { GET as getSessionIcs } from '@/app/api/sessions/[sessionId]/calendar.ics/route';
import { getDb } from '@/db';
import { getCalendarToken } from '@/db/queries/calendar-feed';
import * as t from '@/db/schema';
import { sessionUid } from '@/lib/calendar/ics';
import { makeSessionWorld } from './authz/invitations';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

async function download(sessionId: string) {
  return getSessionIcs(new Request('http://test/api'), { params: Promise.resolve({ sessionId }) });
}
async function feed(token: string) {
  return getFeed(new Request('http://test/api'), { params: Promise.resolve({ token }) });
}
function events(text: string) {
  const root = new ICAL.Component(ICAL.parse(text));
  return root.getAllSubcomponents('vevent').map((e) => ({
    uid: String(e.getFirstPropertyValue('uid')),
    summary: String(e.getFirstPropertyValue('summary')),
    status: e.getFirstPropertyValue('status'),
    start: (e.getFirstPropertyValue('dtstart') as ICAL.Time).toJSDate(),
    end: (e.getFirstPropertyValue('dtend') as ICAL.Time).toJSDate(),
  }));
}

describe('GET /api/sessions/{id}/calendar.ics', () => {
  it('hosts and planners get the session and every run; an invited operator the session and their own runs', async () => {
    const w = makeWorld();
    const { session, runs } = makeSessionWorld(w);
    for (const [user, count] of [[w.host, 1 + runs.length], [w.planner, 1 + runs.length], [w.operator, 1 + 2]] as const) {
      signInAs(user);
      const response = await download(session.id);
      expect(response.status).toBe(200);
      expect(response.headers.get('content-type')).toBe('text/calendar; charset=utf-8');
      expect(response.headers.get('content-disposition')).toBe('attachment; filename="test-running-evening.ics"');
      const list = events(await response.text());
      expect(list).toHaveLength(count);
      expect(list[0]!.uid).toBe(sessionUid(session.id)); // the same UID as the invitations (RFC 5545 3.8.4.7)
    }
    signInAs(w.operator);
    const own = events(await (await download(session.id)).text());
    // The operator's runs depart 300 s and 1500 s after the start, standing 120 s before (first block entered
    // at departure − 120 s) and 180 s after the 60 s move: each event covers the time at the cab,
    // 120 + 60 + 180 = 360 s, not only the move (DTEND is exclusive, RFC 5545 3.6.1).
    expect(own.slice(1).map((e) => e.start.getTime() - session.startsAt.getTime())).toEqual([180_000, 1_380_000]);
    expect(own.slice(1).map((e) => e.end.getTime() - e.start.getTime())).toEqual([360_000, 360_000]);
    expect(own[1]!.summary).toBe('Local on Cab A — Test running evening');
  });

  it('an operator not invited, or invited to a draft, gets 404; so does another railway and an unknown id', async () => {
    const w = makeWorld();
    const { session, invitation } = makeSessionWorld(w);
    getDb().delete(t.invitations).where(eq(t.invitations.id, invitation.id)).run();
    signInAs(w.operator);
    expect((await download(session.id)).status).toBe(404);
    const draft = makeSessionWorld(w, { status: 'draft' });
    expect((await download(draft.session.id)).status).toBe(404);
    signInAs(w.outsider);
    expect((await download(session.id)).status).toBe(404);
    signInAs(w.host);
    expect((await download(crypto.randomUUID())).status).toBe(404);
    expect((await download(draft.session.id)).status).toBe(200);
    signInAs(null);
    const anon = await download(session.id);
    expect(anon.status).toBe(401);
    expect(await anon.json()).toMatchObject({ code: 'unauthorized' });
  });
});

describe('the personal calendar feed', () => {
  it('lists my invited sessions with my runs, cancelled ones as CANCELLED, and not drafts or other people’s', async () => {
    const w = makeWorld();
    const live = makeSessionWorld(w, { title: 'Live evening' });
    const cancelled = makeSessionWorld(w, { title: 'Called-off evening' });
    getDb().update(t.sessions).set({ status: 'cancelled', sequence: 1 }).where(eq(t.sessions.id, cancelled.session.id)).run();
    makeSessionWorld(w, { title: 'Draft evening', status: 'draft' });
    const response = await feed(getCalendarToken(w.operator.id)!);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/calendar; charset=utf-8');
    const list = events(await response.text());
    expect(list.filter((e) => e.uid.startsWith('session-')).map((e) => [e.summary, e.status])).toEqual([
      ['Live evening', 'CONFIRMED'],
      ['Called-off evening', 'CANCELLED'], // RFC 5545 3.8.1.11
    ]);
    expect(list.filter((e) => e.uid.startsWith('run-'))).toHaveLength(2); // only the live session's runs of mine
    expect(list.some((e) => e.uid === sessionUid(live.session.id))).toBe(true);
    // The planner is not invited to anything: an empty calendar.
    expect(events(await (await feed(getCalendarToken(w.planner.id)!)).text())).toHaveLength(0);
    // Accepts the ".ics" some calendar apps append.
    expect((await feed(`${getCalendarToken(w.operator.id)!}.ics`)).status).toBe(200);
  });

  it('a reset stops the old URL at once and the new one works', async () => {
    const w = makeWorld();
    makeSessionWorld(w);
    const old = getCalendarToken(w.operator.id)!;
    signInAs(w.operator);
    expect(await resetCalendarFeed(null, formData({}))).toMatchObject({ ok: true });
    const fresh = getCalendarToken(w.operator.id)!;
    expect(fresh).not.toBe(old);
    expect((await feed(old)).status).toBe(404);
    expect((await feed(fresh)).status).toBe(200);
  });

  it('a member removed from the railway no longer sees its sessions; a malformed token is a 400', async () => {
    const w = makeWorld();
    makeSessionWorld(w);
    getDb().delete(t.memberships).where(and(eq(t.memberships.userId, w.operator.id), eq(t.memberships.railwayId, w.railway.id))).run();
    expect(events(await (await feed(getCalendarToken(w.operator.id)!)).text())).toHaveLength(0);
    expect((await feed('short')).status).toBe(400);
  });
});
