import { createSessionSchema, duplicateSessionSchema, sessionStatusSchema, updateSessionSchema } from '@/lib/validations/session';
import { actionStatus, type World } from '../authz/shared';
import { makeSessionWorld } from '../authz/sessions';
import { formData } from '../world';
import { SESSION_SETTINGS_BOUNDS, withinBounds } from '../../shared/expected-bounds';
import { perWorld, refused, worst, type HostileTarget } from './shared';

// The session, its layout and runs are real (authz/sessions.ts's published session with two
// runs); the hostile input is the body or the form. Where the generated fields could by chance
// make a valid request, `refused` checks the action's own schema and pins one field it refuses.

const SESSIONS = 'app/(app)/railways/[railwayId]/sessions/actions.ts';
const world = perWorld((w: World) => makeSessionWorld(w));
const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const post = (path: string, body: string, method = 'POST') =>
  new Request(url(path), { method, body, headers: { 'content-type': 'application/json' } });

const SETTINGS = ['title', 'place', 'description', 'date', 'startTime', 'endTime', 'clockRatio', 'fastStart', 'headwayS', 'surgeS', 'deratePercent'];
// Limits from the tests' own table: a schema loosened by mistake no longer decides what counts as valid here.
const accepts = (schema: { safeParse: (v: unknown) => { success: boolean } }) => (f: Record<string, string>) =>
  schema.safeParse(f).success && withinBounds(f, SESSION_SETTINGS_BOUNDS);

/** A JSON route handler of the session (and run), fed the raw hostile body. */
function sessionJson(target: string, call: (s: ReturnType<typeof world>, body: string) => Promise<Response>): HostileTarget {
  return { target, kind: 'json', setup: world, send: async (w, body) => (await call(world(w), body)).status };
}

export const SESSION_HOSTILE: HostileTarget[] = [
  sessionJson('app/api/sessions/[sessionId]/plan/route.ts#POST', async ({ session }, body) => {
    const { POST } = await import('@/app/api/sessions/[sessionId]/plan/route');
    return POST(post(`/api/sessions/${session.id}/plan`, body), ctx({ sessionId: session.id }));
  }),
  sessionJson('app/api/sessions/[sessionId]/runs/route.ts#POST', async ({ session }, body) => {
    const { POST } = await import('@/app/api/sessions/[sessionId]/runs/route');
    return POST(post(`/api/sessions/${session.id}/runs`, body), ctx({ sessionId: session.id }));
  }),
  sessionJson('app/api/sessions/[sessionId]/runs/[runId]/route.ts#PATCH', async ({ session, runIds }, body) => {
    const { PATCH } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/route');
    return PATCH(post(`/api/sessions/${session.id}/runs/${runIds[0]}`, body, 'PATCH'), ctx({ sessionId: session.id, runId: runIds[0] }));
  }),
  {
    // No body: the hostile strings are the run id in the path and the `?version=` seen, each with
    // the other real. The run's current version with its real id would delete it: pinned.
    target: 'app/api/sessions/[sessionId]/runs/[runId]/route.ts#DELETE',
    kind: 'action',
    fields: ['runId', 'version'],
    setup: world,
    send: async (w, f) => {
      const { DELETE } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/route');
      const { deleteRunQuerySchema } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/schema');
      const { session, runIds } = world(w);
      const { version } = refused(f, (v) => deleteRunQuerySchema.safeParse(v).data?.version === 1, { version: '' });
      const remove = async (runId: string, v: string) =>
        (await DELETE(new Request(url(`/api/sessions/${session.id}/runs/x?${new URLSearchParams({ version: v })}`), { method: 'DELETE' }), ctx({ sessionId: session.id, runId }))).status;
      return worst([await remove(runIds[1], version!), await remove(f.runId!, '1')]);
    },
  },
  sessionJson('app/api/sessions/[sessionId]/runs/[runId]/series/route.ts#POST', async ({ session, runIds }, body) => {
    const { POST } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/series/route');
    return POST(post(`/api/sessions/${session.id}/runs/${runIds[0]}/series`, body), ctx({ sessionId: session.id, runId: runIds[0] }));
  }),
  sessionJson('app/api/sessions/[sessionId]/retime/route.ts#POST', async ({ session }, body) => {
    const { POST } = await import('@/app/api/sessions/[sessionId]/retime/route');
    return POST(post(`/api/sessions/${session.id}/retime`, body), ctx({ sessionId: session.id }));
  }),
  sessionJson('app/api/sessions/[sessionId]/retime/undo/route.ts#POST', async ({ session }, body) => {
    const { POST } = await import('@/app/api/sessions/[sessionId]/retime/undo/route');
    return POST(post(`/api/sessions/${session.id}/retime/undo`, body), ctx({ sessionId: session.id }));
  }),
  {
    // Stores nothing even when valid; malformed plans must still be a 400, not a 500.
    target: 'app/api/plans/check/route.ts#POST',
    kind: 'json',
    send: async (_w, body) => {
      const { POST } = await import('@/app/api/plans/check/route');
      return (await POST(post('/api/plans/check', body), ctx({}))).status;
    },
  },
  {
    // The layout is a real one of the railway; the settings are hostile, the title pinned blank
    // if the schema would take them.
    target: `${SESSIONS}#createSession`,
    kind: 'action',
    fields: SETTINGS,
    setup: world,
    send: async (w, f) => {
      const { createSession } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      const fields = refused({ ...f, layoutId: world(w).layout.layoutId }, accepts(createSessionSchema), { title: '' });
      return actionStatus(() => createSession(w.railway.id, null, formData(fields)));
    },
  },
  {
    target: `${SESSIONS}#updateSession`,
    kind: 'action',
    fields: [...SETTINGS, 'version'],
    setup: world,
    send: async (w, f) => {
      const { updateSession } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      const fields = refused({ ...f, sessionId: world(w).session.id }, accepts(updateSessionSchema), { title: '' });
      return actionStatus(() => updateSession(w.railway.id, null, formData(fields)));
    },
  },
  {
    target: `${SESSIONS}#setSessionStatus`,
    kind: 'action',
    fields: ['version', 'status'],
    setup: world,
    send: async (w, f) => {
      const { setSessionStatus } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      const fields = refused({ ...f, sessionId: world(w).session.id }, accepts(sessionStatusSchema), { status: '' });
      return actionStatus(() => setSessionStatus(w.railway.id, null, formData(fields)));
    },
  },
  {
    target: `${SESSIONS}#duplicateSession`,
    kind: 'action',
    fields: ['date', 'title'],
    setup: world,
    send: async (w, f) => {
      const { duplicateSession } = await import('@/app/(app)/railways/[railwayId]/sessions/actions');
      // As the action reads them: an empty title means "keep the source's".
      const accepted = (v: Record<string, string>) => duplicateSessionSchema.safeParse({ ...v, title: v.title || undefined }).success;
      const fields = refused({ ...f, sessionId: world(w).session.id }, accepted, { date: '' });
      return actionStatus(() => duplicateSession(w.railway.id, null, formData(fields)));
    },
  },
];
