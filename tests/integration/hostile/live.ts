import type { World } from '../authz/shared';
import { makeSessionWorld } from '../authz/sessions';
import { applyClockAction } from '@/lib/live/clock';
import { perWorld, type HostileTarget } from './shared';

// The session is real (authz/sessions.ts's published session with two runs); the body is hostile.
const world = perWorld((w: World) => makeSessionWorld(w));
// Reports need a running clock; started once per world before the first checksum.
const started = perWorld((w: World) => {
  const s = world(w);
  applyClockAction(s.session, { user: w.planner, railwayId: w.railway.id, role: 'planner' }, { action: 'start' });
  return s;
});
const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const post = (path: string, body: string) =>
  new Request(`http://127.0.0.1:3999${path}`, { method: 'POST', body, headers: { 'content-type': 'application/json' } });

export const LIVE_HOSTILE: HostileTarget[] = [
  {
    target: 'app/api/sessions/[sessionId]/clock/route.ts#POST',
    kind: 'json',
    setup: world,
    send: async (w, body) => {
      const { POST } = await import('@/app/api/sessions/[sessionId]/clock/route');
      const { session } = world(w);
      return (await POST(post(`/api/sessions/${session.id}/clock`, body), ctx({ sessionId: session.id }))).status;
    },
  },
  {
    target: 'app/api/sessions/[sessionId]/runs/[runId]/reports/route.ts#POST',
    kind: 'json',
    setup: started,
    send: async (w, body) => {
      const { POST } = await import('@/app/api/sessions/[sessionId]/runs/[runId]/reports/route');
      const { session, runIds } = started(w);
      return (await POST(post(`/api/sessions/${session.id}/runs/${runIds[0]}/reports`, body), ctx({ sessionId: session.id, runId: runIds[0] }))).status;
    },
  },
  {
    target: 'app/api/sessions/[sessionId]/repair/route.ts#POST',
    kind: 'json',
    setup: world,
    send: async (w, body) => {
      const { POST } = await import('@/app/api/sessions/[sessionId]/repair/route');
      const { session } = world(w);
      return (await POST(post(`/api/sessions/${session.id}/repair`, body), ctx({ sessionId: session.id }))).status;
    },
  },
];
